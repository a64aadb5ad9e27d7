package plan

import (
	"errors"
	"math"
	"strings"
	"testing"

	"forelay/scenario/internal/plantest"
)

// TestEffects checks what Build keeps of each future event and of the
// baseline's band. The naive baseline of the invented history forecasts
// its last value b in every period; a pulse of +100 a period over 2024-03
// and 2024-04 (the first two plan periods, the history ending 2024-02)
// with range 80 to 120 has share 1, 1, 0, contribution +100, +100, 0 and
// standard deviation 40 / (2 x 1.644854) = 12.159 (the range read as a
// 90% interval), in every scenario or none. The band is b -/+ z sqrt(var)
// with z = 2 (hand calculation).
func TestEffects(t *testing.T) {
	body := "plan: p\nhorizon: 3\nbaseline: {method: naive}\nbands: {z: 2}\nevents:\n" +
		"  - {id: promo, kind: pulse, start: 2024-03, periods: 2, effect: {units: 100}, range: {low: 80, high: 120}}\n" +
		"scenarios:\n  - {name: none, events: []}\n  - {name: promo, events: [promo]}\n"
	p := buildTestPlan(t, body, testHistory(26))
	eff, ok := p.Effects["promo"]
	if !ok {
		t.Fatalf("effects %v", p.Effects)
	}
	sd := 40 / (2 * 1.6448536269514722) // z of 95% (one-sided), standard normal table
	plantest.EqualSlices(t, "share", eff.Share, []float64{1, 1, 0}, 1e-12)
	plantest.EqualSlices(t, "contribution", eff.Contrib, []float64{100, 100, 0}, 1e-12)
	plantest.EqualSlices(t, "sigma", eff.Sigma, []float64{sd, sd, 0}, 1e-4)
	plantest.EqualSlices(t, "scenario promo's contribution", p.Line("promo", "demand").Contrib["promo"], eff.Contrib, 0)
	plantest.EqualSlices(t, "scenario none's contribution", p.Line("none", "demand").Contrib["promo"], []float64{0, 0, 0}, 0)
	for i := range p.Baseline {
		w := 2 * math.Sqrt(p.BaselineVar[i])
		plantest.Same(t, "lower", p.BaselineLower[i], p.Baseline[i]-w, 1e-12)
		plantest.Same(t, "upper", p.BaselineUpper[i], p.Baseline[i]+w, 1e-12)
	}
	if p.Line("promo", "other") != nil || p.Line("missing", "demand") != nil {
		t.Error("Line found a line the plan does not hold")
	}
	// The scenario's plan is its own copy: changing it leaves the effect.
	p.Scenarios[1].Contrib["promo"][0] = 0
	if eff.Contrib[0] != 100 {
		t.Error("a scenario's contribution shares the effect's values")
	}
}

// TestFutureEvent checks the lookup of a future event and its two errors.
func TestFutureEvent(t *testing.T) {
	body := "plan: p\nhorizon: 3\nbaseline: {method: naive}\nevents:\n" +
		"  - {id: old, kind: pulse, start: 2022-06, periods: 1}\n" +
		"  - {id: promo, kind: pulse, start: 2024-03, effect: {units: 100}}\n"
	p := buildTestPlan(t, body, testHistory(26))
	if e, err := p.FutureEvent("promo"); err != nil || e.ID != "promo" {
		t.Fatalf("promo: %v, %v", e, err)
	}
	for _, c := range []struct{ id, msg string }{
		{"old", "the event lies before the plan's first period 2024-03, so it is only cleaned out of the history"},
		{"nope", "has no such event (its future events: promo)"},
	} {
		_, err := p.FutureEvent(c.id)
		if !errors.Is(err, ErrNoFutureEvent) || !strings.Contains(err.Error(), c.msg) {
			t.Errorf("%s: error %v, want ErrNoFutureEvent with %q", c.id, err, c.msg)
		}
	}
}

// TestScenarioIndex: a name gives its index, no name the last scenario,
// and an unknown name an error that lists the scenarios.
func TestScenarioIndex(t *testing.T) {
	body := "plan: p\nhorizon: 2\nbaseline: {method: naive}\nscenarios:\n  - {name: low, events: []}\n  - {name: high, events: []}\n"
	p := buildTestPlan(t, body, testHistory(24))
	if i, err := p.ScenarioIndex("low"); i != 0 || err != nil {
		t.Errorf("low: %d, %v", i, err)
	}
	if i, err := p.ScenarioIndex(""); i != 1 || err != nil {
		t.Errorf("none: %d, %v", i, err)
	}
	if _, err := p.ScenarioIndex("mid"); err == nil || !strings.Contains(err.Error(), "has no such scenario (it has low, high)") {
		t.Errorf("mid: %v", err)
	}
}
