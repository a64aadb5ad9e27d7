package supply

import (
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"math"
	"testing"
)

const compareBody = `plan: cmp
horizon: 6
baseline: {method: linear-trend, dummies: true}
events:
  - id: win
    kind: step
    start: 2026-02
    effect: {units: 150}
    probability: 0.6
    range: {low: 100, high: 200}
  - id: outage
    kind: pulse
    start: 2026-05
    effect: {percent: -20}
    payback: {share: 1, periods: 1}
scenarios:
  - {name: base, events: []}
  - {name: both, events: [win, outage]}
capacity: {units: 1300}
`

func TestCompare(t *testing.T) {
	p := buildTestPlan(t, compareBody, testHistory(48))
	sim, err := sim.Simulate(p, sim.SimOptions{Paths: 2000, Seed: 4})
	if err != nil {
		t.Fatal(err)
	}
	cs := Compare(sim, 0.95)
	if len(cs) != 2 || cs[0].Name != "base" || cs[1].Name != "both" {
		t.Fatalf("comparisons %+v", cs)
	}
	capacity := CapacityPerPeriod(p)
	for s, c := range cs {
		// The contributions add up to the change against the baseline.
		sum := 0.0
		for _, k := range c.Contributions {
			sum += k.Total
		}
		plantest.Same(t, c.Name+": contributions", sum, c.Total-c.BaselineTotal, 1e-9)
		plantest.Same(t, c.Name+": total", c.Total, plan.Total(p.Scenarios[s].Adjusted), 0)
		// The breach probability and pre-build are those of CapacityRisk
		// and PlanBuffer on the same paths.
		plantest.Same(t, c.Name+": P(any breach)", c.PAnyBreach, CapacityRisk(sim.Scenarios[s], capacity, 0.1).PAnyBreach, 0)
		b := PlanBuffer(sim.Scenarios[s].QuantileDemand(0.95), capacity, 0)
		plantest.Same(t, c.Name+": prebuild", c.Prebuild, b.Prebuild, 0)
		_, v := plan.Peak(sim.Scenarios[s].QuantileDemand(0.9))
		plantest.Same(t, c.Name+": P90 peak", c.P90PeakValue, v, 1e-9)
	}
	if len(cs[0].Contributions) != 0 || len(cs[1].Contributions) != 2 {
		t.Errorf("contributions %v / %v", cs[0].Contributions, cs[1].Contributions)
	}
	// The outage (by hand): -20% of May's baseline, and a full payback of
	// one period in June that gives back the same units: -0.2 b_May +
	// 0.2 b_May = 0.
	out := cs[1].Contributions[1]
	plantest.Same(t, "outage total", out.Total, 0, 1e-6)
	p.File.Capacity = nil
	for _, c := range Compare(sim, 0.95) {
		if !math.IsNaN(c.PAnyBreach) || !math.IsNaN(c.Prebuild) || c.PrebuildAt != -1 {
			t.Errorf("without capacity: %+v", c)
		}
	}
}
