package report

import (
	"encoding/json"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"testing"
)

// The helpers of the stress, buffer and compare report tests.

// supplyPlan writes the invented monthly history (48 months, 2022-01 to
// 2025-12, so plans start in 2026-01), the scenario file body and the
// other files, and builds the plan.
func supplyPlan(t *testing.T, body string, files map[string]string) *plan.Plan {
	t.Helper()
	p, err := testplan.BuildWithFiles(t, body, plantest.History(48), files)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// production reads p's frozen production plan (plan.ReadProduction).
func production(t *testing.T, p *plan.Plan) *plan.Production {
	t.Helper()
	prod, err := plan.ReadProduction(p)
	if err != nil {
		t.Fatal(err)
	}
	return prod
}

// simulated draws a few hundred paths of p, seeded.
func simulated(t *testing.T, p *plan.Plan) *sim.Simulation {
	t.Helper()
	mc, err := sim.Simulate(p, sim.SimOptions{Paths: 300, Seed: 5})
	if err != nil {
		t.Fatal(err)
	}
	return mc
}

// docOf returns the JSON document of r as plain maps and lists.
func docOf(t *testing.T, r *Report) map[string]any {
	t.Helper()
	b, err := r.JSON()
	if err != nil {
		t.Fatal(err)
	}
	var doc map[string]any
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	return doc
}

// chartNames returns the base names of r's charts.
func chartNames(r *Report) []string {
	var names []string
	for _, c := range r.Charts {
		names = append(names, c.Name)
	}
	return names
}
