package shard

import (
	"bytes"
	"encoding/csv"

	"forelay/scenario/plan"
	"forelay/scenario/report"
)

// planHead is the head of plan.csv before the event columns.
var planHead = []string{"scenario", "series", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}

// PlanRows returns plan.csv of a shard: the rows of its own series as the
// whole portfolio's plan.csv has them (scenario, then series in order,
// then period), with a column for each event of the file, in file order
// (the merge drops those no shard plans).
func PlanRows(pf *plan.Portfolio) ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	head := append([]string(nil), planHead...)
	for _, e := range pf.File.Events {
		head = append(head, e.ID)
	}
	if err := w.Write(head); err != nil {
		return nil, err
	}
	for k := range pf.File.Cases() {
		for _, p := range pf.Plans {
			sp := p.Scenarios[k]
			for j, per := range p.Periods {
				row := []string{sp.Name, p.History.Name, per.String(), report.CSV2(p.Baseline[j]), report.CSV2(sp.Adjusted[j]),
					report.CSV2(sp.RiskWeighted[j]), report.CSV2(sp.Lower[j]), report.CSV2(sp.Upper[j])}
				for _, e := range pf.File.Events {
					c := 0.0
					if v, ok := sp.Contrib[e.ID]; ok {
						c = v[j]
					}
					row = append(row, report.CSV2(c))
				}
				if err := w.Write(row); err != nil {
					return nil, err
				}
			}
		}
	}
	w.Flush()
	return b.Bytes(), w.Error()
}
