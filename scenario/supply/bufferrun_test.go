package supply

import (
	"errors"
	"fmt"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/sim"
	"math"
	"strings"
	"testing"
)

const bufferBody = `plan: buf
horizon: 6
baseline: {method: seasonal-naive}
events:
  - id: rush
    kind: pulse
    start: 2026-04
    effect: {units: 400}
scenarios:
  - {name: base, events: []}
  - {name: rush, events: [rush]}
capacity: {units: 1150}
`

// TestSizeBuffer checks a buffer run against its parts: PlanBuffer of the
// demand at the service quantile (the bands' or the paths'), and the
// safety stock z × spread with the cycle service level it gives.
func TestSizeBuffer(t *testing.T) {
	p := buildTestPlan(t, bufferBody, testHistory(48))
	mc, err := sim.Simulate(p, sim.SimOptions{Paths: 500, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	capacity := CapacityPerPeriod(p)
	s := BufferSettings{Scenario: 1, Service: 0.95, LeadTime: 3, Opening: 200}
	for _, tc := range []struct {
		name   string
		mc     *sim.Simulation
		demand []float64
	}{
		{"bands", nil, BandDemand(p, 1, 0.95)},
		{"paths", mc, mc.Scenarios[1].QuantileDemand(0.95)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, err := SizeBuffer(p, tc.mc, s)
			if err != nil {
				t.Fatal(err)
			}
			if r.Plan != p || r.Sim != tc.mc || r.Settings != s {
				t.Fatalf("run %+v", r)
			}
			if got, want := fmt.Sprint(r.Buffer), fmt.Sprint(PlanBuffer(tc.demand, capacity, 200)); got != want {
				t.Errorf("buffer\n got %s\nwant %s", got, want)
			}
			// z(0.95) = 1.644854 from a standard normal table (one-sided).
			plantest.Same(t, "z", r.Z, 1.644854, 1e-6)
			plantest.Same(t, "sigma", r.Sigma, math.Sqrt(p.BaselineVar[0]), 1e-12)
			plantest.Same(t, "spread", r.Spread, math.Sqrt(p.Fit.LeadTimeVariance(3, p.Mode, p.From)), 1e-12)
			plantest.Same(t, "safety stock", r.Safety, 1.644854*r.Spread, 1e-6)
			// Φ(z(0.95)) = 0.95: the stock gives the service asked for.
			plantest.Same(t, "cycle service level", r.CSL, 0.95, 1e-9)
			// The summed errors of three periods spread at least as wide
			// as one period's.
			if r.Spread < r.Sigma {
				t.Errorf("spread %v below sigma %v", r.Spread, r.Sigma)
			}
		})
	}
}

// TestSizeBufferNoCapacity: without a capacity there is nothing to build
// ahead of; the error names the file and wraps ErrNoCapacity.
func TestSizeBufferNoCapacity(t *testing.T) {
	p := buildTestPlan(t, strings.Replace(bufferBody, "capacity: {units: 1150}\n", "", 1), testHistory(48))
	for _, err := range []error{
		func() error { _, err := BufferCapacity(p); return err }(),
		func() error { _, err := SizeBuffer(p, nil, BufferSettings{Service: 0.9, LeadTime: 1}); return err }(),
	} {
		if !errors.Is(err, ErrNoCapacity) || !strings.HasPrefix(err.Error(), p.File.Path+": capacity: ") {
			t.Errorf("error %v, want %s: %v", err, p.File.Path, ErrNoCapacity)
		}
	}
}
