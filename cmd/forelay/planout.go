package main

import (
	"encoding/json"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"strconv"
)

// marshalIndent encodes v as indented JSON with a final newline.
func marshalIndent(v any) ([]byte, error) {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// fmtCSV formats a value for CSV files: two decimals, fixed notation, so
// files are stable and easy to read in a spreadsheet.
func fmtCSV(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

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
			row := []string{sp.Name, per.String(), fmtCSV(p.Baseline[t]), fmtCSV(sp.Adjusted[t]),
				fmtCSV(sp.RiskWeighted[t]), fmtCSV(sp.Lower[t]), fmtCSV(sp.Upper[t])}
			for i := range p.Future {
				row = append(row, fmtCSV(sp.Contrib[i][t]))
			}
			rows = append(rows, row)
		}
	}
	return csvTable(rows)
}
