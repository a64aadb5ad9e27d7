package supply

import (
	"math"
	"testing"

	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/sim"
)

// TestComparePortfolio checks the figures of a portfolio's scenarios by
// hand: a step of 40 units a month from 2026-03 (the second of 12 plan
// months), split equally between two series, adds 40 × 11 = 440 to the
// total of the scenario that has it, and nothing to the other; the
// totals are the sums of the series' plans. The line has no capacity, so
// its breach chance and pre-build are NaN, as a single series' are.
func TestComparePortfolio(t *testing.T) {
	body := `events:
  - id: deal
    kind: step
    start: 2026-03
    effect: {units: 40, split: equal}
    scope: [{series: "milk/*"}]
scenarios:
  - {name: base, events: []}
  - {name: deal, events: [deal]}
`
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{plantest.Walsh(10, 10, -10, -10), plantest.Walsh(10, -10, -10, 10)}, body)
	res := []Resource{{ID: "line-1", Series: []string{"milk/a", "milk/b"}, PerUnit: 1}}
	mc, err := sim.SimulatePortfolio(pf, PortfolioSums(pf, res), sim.SimOptions{Paths: 500})
	if err != nil {
		t.Fatal(err)
	}
	r := ComparePortfolio(mc, res, 0.95)
	base := 0.0
	for _, p := range pf.Plans {
		for _, v := range p.Baseline {
			base += v
		}
	}
	plantest.Same(t, "baseline total", r.Rows[0].BaselineTotal, base, 1e-12)
	plantest.Same(t, "total without the deal", r.Rows[0].Total, base, 1e-12)
	plantest.Same(t, "total with the deal", r.Rows[1].Total, base+440, 1e-12)
	if c := r.Rows[1].Contributions; len(c) != 1 || c[0].ID != "deal" || math.Abs(c[0].Total-440) > 1e-9 {
		t.Errorf("contributions %+v, want deal +440", c)
	}
	if len(r.Rows[0].Contributions) != 0 || len(r.Rows[0].Events) != 0 {
		t.Errorf("the base scenario has contributions %+v", r.Rows[0].Contributions)
	}
	if f := r.Loads[1][0]; !math.IsNaN(f.PAnyBreach) || !math.IsNaN(f.Prebuild) || f.PrebuildAt != -1 {
		t.Errorf("line without capacity: %+v, want NaN, NaN, -1", f)
	}
}
