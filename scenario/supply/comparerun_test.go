package supply

import (
	"fmt"
	"forelay/scenario/sim"
	"testing"
)

// TestCompareScenarios: the run holds Compare's rows for the plan of the
// simulation and the service asked for.
func TestCompareScenarios(t *testing.T) {
	p := buildTestPlan(t, compareBody, testHistory(48))
	mc, err := sim.Simulate(p, sim.SimOptions{Paths: 500, Seed: 4})
	if err != nil {
		t.Fatal(err)
	}
	r := CompareScenarios(mc, 0.9)
	if r.Plan != p || r.Sim != mc || r.Service != 0.9 {
		t.Fatalf("run %+v", r)
	}
	if got, want := fmt.Sprint(r.Rows), fmt.Sprint(Compare(mc, 0.9)); got != want {
		t.Errorf("rows\n got %s\nwant %s", got, want)
	}
}
