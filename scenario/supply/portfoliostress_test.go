package supply

import (
	"math"
	"strings"
	"testing"

	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// stressPortfolio simulates pf with the sums of res and sets them against
// their capacities.
func stressPortfolio(t *testing.T, pf *plan.Portfolio, res []Resource, paths int) *PortfolioStressRun {
	t.Helper()
	mc, err := sim.SimulatePortfolio(pf, PortfolioSums(pf, res), sim.SimOptions{Paths: paths, Seed: 21})
	if err != nil {
		t.Fatal(err)
	}
	run, err := PortfolioStress(mc, res, StressSettings{Breach: 0.2})
	if err != nil {
		t.Fatal(err)
	}
	return run
}

// TestPortfolioBreachAnalytic checks a resource's breach chance and
// expected shortfall against a case worked by hand. Two series with the
// same history (plantest.Walsh(10, 10, −10, −10)) have the same one-step
// errors, +10 or −10 with probability 1/2 each, and so the same paths; a
// line using 0.5 hour per unit of each carries exactly one series'
// demand. With the naive method (psi_1 = 1) and V_h the band variance:
//
//   - month 1: load = b_1 + s, s = ±sqrt(V_1) with probability 1/2 each;
//     with capacity b_1 + sqrt(V_1)/2, P(breach) = 1/2 and the expected
//     shortfall is 1/2 × sqrt(V_1)/2;
//   - month 2: load = b_2 + k_2 (e_2 + e_1), k_2 = sqrt(V_2 / (2 × 100)),
//     so b_2 − sqrt(2 V_2), b_2, b_2 + sqrt(2 V_2) with probabilities
//     1/4, 1/2, 1/4; with capacity b_2 + sqrt(2 V_2)/2, P(breach) = 1/4
//     and the expected shortfall 1/4 × sqrt(2 V_2)/2.
//
// With 20,000 paths the binomial standard error of a breach chance is at
// most sqrt(0.25/20000) = 0.0035: the tolerance is 0.015, and 6 % on the
// shortfall.
func TestPortfolioBreachAnalytic(t *testing.T) {
	h := plantest.Walsh(10, 10, -10, -10)
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{h, h}, "")
	a := pf.Plans[0]
	b1, s1 := a.Baseline[0], math.Sqrt(a.BaselineVar[0])
	b2, s2 := a.Baseline[1], math.Sqrt(2*a.BaselineVar[1])
	capacity := make([]float64, len(a.Periods))
	for t := range capacity {
		capacity[t] = math.Inf(1)
	}
	capacity[0], capacity[1] = b1+s1/2, b2+s2/2
	line := Resource{ID: "line-1", Units: "line-hours", Series: []string{"milk/a", "milk/b"}, PerUnit: 0.5, Capacity: capacity}
	run := stressPortfolio(t, pf, []Resource{line}, 20000)
	rk := run.Risks[0][0]
	for _, c := range []struct {
		t              int
		breach, expect float64
	}{
		{0, 0.5, 0.5 * s1 / 2},
		{1, 0.25, 0.25 * s2 / 2},
	} {
		got := rk.Periods[c.t]
		if math.Abs(got.PBreach-c.breach) > 0.015 {
			t.Errorf("month %d: P(breach) %.4f, want %.4f", c.t+1, got.PBreach, c.breach)
		}
		if math.Abs(got.ExpectedShortfall/c.expect-1) > 0.06 {
			t.Errorf("month %d: expected shortfall %.4f, want %.4f", c.t+1, got.ExpectedShortfall, c.expect)
		}
	}
	if rk.FirstBreach != 0 {
		t.Errorf("first breach %d, want month 1 (threshold 20 %%)", rk.FirstBreach)
	}
	// The total carries both series, 2 × one series, and the line
	// 0.5 × 2 × one series: the total is twice the line's load.
	if tot := run.Total[0].Periods[0].Mean; math.Abs(tot-2*rk.Periods[0].Mean) > 1e-9*tot {
		t.Errorf("total mean %v, want twice the line's load %v", tot, rk.Periods[0].Mean)
	}
}

// TestPortfolioFrozen checks that frozen production holds each resource at
// its baseline load, and that a production plan file is refused in a
// plan of several series, naming the key.
func TestPortfolioFrozen(t *testing.T) {
	h := plantest.Walsh(10, 10, -10, -10)
	body := "resources:\n  - {id: line-1, series: \"milk/*\", per-unit: 0.5, units: line-hours, capacity: {units: 1200}}\n"
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{h, h}, body+"production: {mode: frozen}\n")
	res := PortfolioResources(pf)
	run := stressPortfolio(t, pf, res, 500)
	if run.Frozen == nil {
		t.Fatal("production frozen: no stock projection")
	}
	a := pf.Plans[0]
	for tt, v := range run.Frozen[0][0].Production {
		if want := a.Baseline[tt]; math.Abs(v-want) > 1e-9*want {
			t.Fatalf("month %d: production %v, want the baseline load 0.5 × 2 × %v", tt+1, v, want)
		}
	}
	pf.File.Production.Plan = "previous.csv"
	mc, err := sim.SimulatePortfolio(pf, PortfolioSums(pf, res), sim.SimOptions{Paths: 500})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := PortfolioStress(mc, res, StressSettings{}); err == nil || !strings.Contains(err.Error(), "production.plan") {
		t.Errorf("production plan file in a portfolio: %v, want an error naming production.plan", err)
	}
}
