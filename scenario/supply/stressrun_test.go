package supply

import (
	"errors"
	"fmt"
	"forelay/scenario/data"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"slices"
	"strings"
	"testing"
)

// TestStress checks that a stress run is CapacityRisk per scenario and,
// under frozen production, ProjectStock of the frozen plan with its
// overload warnings after the plan's own.
func TestStress(t *testing.T) {
	// The frozen plan of TestOverload: over capacity in 2026-02 and 2026-04.
	csv := "period,litres\n2026-01,650000\n2026-02,700000\n2026-03,690000\n2026-04,720000\n"
	p, err := buildWithFiles(t, overloadBody, testHistory(48), map[string]string{"prev.csv": csv})
	if err != nil {
		t.Fatal(err)
	}
	mc, err := sim.Simulate(p, sim.SimOptions{Paths: 500, Seed: 3})
	if err != nil {
		t.Fatal(err)
	}
	read, err := plan.ReadProduction(p)
	if err != nil {
		t.Fatal(err)
	}
	s := StressSettings{Breach: 0.2, Opening: 1000, Production: read}
	r, err := Stress(mc, s)
	if err != nil {
		t.Fatal(err)
	}
	if r.Plan != p || r.Sim != mc || r.Settings != s || len(r.Risks) != len(p.Scenarios) {
		t.Fatalf("run %+v", r)
	}
	capacity := CapacityPerPeriod(p)
	prod, src, err := FrozenProduction(p, read)
	if err != nil {
		t.Fatal(err)
	}
	if r.Source != src || len(r.Frozen) != len(p.Scenarios) {
		t.Fatalf("source %q, %d projections", r.Source, len(r.Frozen))
	}
	for k, ps := range mc.Scenarios {
		// fmt prints NaN as NaN, so equal prints are equal values.
		if got, want := fmt.Sprint(r.Risks[k]), fmt.Sprint(CapacityRisk(ps, capacity, 0.2)); got != want {
			t.Errorf("%s: risk\n got %s\nwant %s", ps.Name, got, want)
		}
		want := ProjectStock(prod, p.Scenarios[k].Adjusted, capacity, 1000, ps)
		if got := fmt.Sprint(r.Frozen[k]); got != fmt.Sprint(want) {
			t.Errorf("%s: projection\n got %s\nwant %s", ps.Name, got, fmt.Sprint(want))
		}
	}
	wantWarn := append(slices.Clone(p.Warnings), OverloadWarnings(p, prod, src)...)
	if !slices.Equal(r.Warnings, wantWarn) || len(wantWarn) < 2 {
		t.Errorf("warnings %q, want %q", r.Warnings, wantWarn)
	}
	if len(p.Warnings) > 0 && &r.Warnings[0] == &p.Warnings[0] {
		t.Error("the run's warnings share the plan's array")
	}
	if r.Notes != nil {
		t.Errorf("notes %q", r.Notes)
	}
}

// TestStressNotFrozen: without the frozen mode nothing is projected, and a
// production plan named all the same is not read, with a note.
func TestStressNotFrozen(t *testing.T) {
	for _, tc := range []struct {
		name, production string
		wantNote         bool
	}{
		{"no production", "", false},
		{"follow with a plan", "production: {plan: missing.csv}\n", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := buildTestPlan(t, capacityBody+tc.production, testHistory(48))
			mc, err := sim.Simulate(p, sim.SimOptions{Paths: 200, Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			r, err := Stress(mc, StressSettings{Breach: 0.1})
			if err != nil {
				t.Fatal(err)
			}
			if r.Frozen != nil || r.Source != "" {
				t.Errorf("projected %d scenarios from %q", len(r.Frozen), r.Source)
			}
			if got := len(r.Notes) == 1 && strings.Contains(r.Notes[0], "read only with production mode frozen"); got != tc.wantNote {
				t.Errorf("notes %q", r.Notes)
			}
		})
	}
}

// TestStressBadProduction: a production plan that cannot be read is the
// error of plan.ReadProduction, naming the CSV and its line, and a stress
// run of a frozen plan whose production plan was not read is refused,
// never run on the baseline instead.
func TestStressBadProduction(t *testing.T) {
	csv := "period,units\n2026-01,10\n2026-02,x\n2026-03,30\n"
	p, err := buildWithFiles(t, frozenBody, testHistory(48), map[string]string{"prev.csv": csv})
	if err != nil {
		t.Fatal(err)
	}
	prod, err := plan.ReadProduction(p)
	var pe *data.ParseError
	if prod != nil || !errors.As(err, &pe) || !strings.Contains(err.Error(), "prev.csv:3:9: units: ") {
		t.Errorf("production %v, error %v; want a ParseError at prev.csv:3:9", prod, err)
	}
	mc, err := sim.Simulate(p, sim.SimOptions{Paths: 200, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	r, err := Stress(mc, StressSettings{Breach: 0.1})
	if r != nil || !errors.As(err, &pe) || !strings.Contains(err.Error(), "production.plan: ") || !strings.Contains(err.Error(), "was not read") {
		t.Errorf("run %v, error %v; want the production.plan key refused as not read", r, err)
	}
}
