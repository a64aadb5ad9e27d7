package main

import (
	"encoding/json"
	"forelay/scenario/plan"
	"forelay/scenario/report"
)

// marshalIndent encodes v as indented JSON with a final newline.
func marshalIndent(v any) ([]byte, error) {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// planCSV renders plan.csv: one row per scenario and period with the
// columns scenario, period, baseline, adjusted, risk_weighted, lower, upper
// and then one column per future event holding its contribution.
func planCSV(p *plan.Plan) *report.Table {
	var rows [][]string
	head := []string{"scenario", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}
	for _, e := range p.Future {
		head = append(head, e.ID)
	}
	rows = append(rows, head)
	for _, sp := range p.Scenarios {
		for t, per := range p.Periods {
			row := []string{sp.Name, per.String(), report.CSV2(p.Baseline[t]), report.CSV2(sp.Adjusted[t]),
				report.CSV2(sp.RiskWeighted[t]), report.CSV2(sp.Lower[t]), report.CSV2(sp.Upper[t])}
			for i := range p.Future {
				row = append(row, report.CSV2(sp.Contrib[i][t]))
			}
			rows = append(rows, row)
		}
	}
	return csvTable(rows)
}
