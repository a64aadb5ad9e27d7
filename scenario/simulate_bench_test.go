package scenario

import (
	"fmt"
	"strings"
	"testing"
)

// benchBody is a 36-month plan with 10 uncertain events (steps and pulses,
// units and percent, ramps and paybacks) in one scenario. The naive
// baseline has psi weights 1 at every lag, the costliest error paths.
func benchBody() string {
	var b strings.Builder
	b.WriteString("plan: bench\nhorizon: 36\nbaseline: {method: naive}\ncapacity: {units: 1500}\nevents:\n")
	for k := 0; k < 10; k++ {
		month := 1 + 3*k
		start := fmt.Sprintf("%d-%02d", 2026+(month-1)/12, (month-1)%12+1)
		if k%2 == 0 {
			fmt.Fprintf(&b, "  - {id: e%d, kind: step, start: %s, effect: {units: %d}, ramp: {periods: 3}, probability: 0.%d, range: {low: %d, high: %d}}\n",
				k, start, 20+k, 3+k/2, 10+k, 40+k)
		} else {
			fmt.Fprintf(&b, "  - {id: e%d, kind: pulse, start: %s, periods: 2, effect: {percent: %d}, probability: 0.5, range: {low: %d, high: %d}, payback: {share: 0.5, periods: 2}}\n",
				k, start, -5-k, -15-k, 2)
		}
	}
	return b.String()
}

// BenchmarkSimulate10kPaths36Periods10Events draws 10,000 paths over 36
// periods with 10 events and summarises them (mean and quantiles per
// period) and sets them against capacity. Target: at most 150 ms per run
// on one core (go test -bench Simulate -cpu 1 ./scenario).
func BenchmarkSimulate10kPaths36Periods10Events(b *testing.B) {
	p := buildTestPlan(b, benchBody(), testHistory(48)) // to 2025-12: the plan runs 2026-01 to 2028-12
	capacity := p.CapacityPerPeriod()
	if len(p.Periods) != 36 || len(p.Future) != 10 || len(p.Scenarios) != 1 {
		b.Fatalf("bench plan: %d periods, %d events, %d scenarios", len(p.Periods), len(p.Future), len(p.Scenarios))
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		sim, err := Simulate(p, SimOptions{Paths: 10000, Seed: 1})
		if err != nil {
			b.Fatal(err)
		}
		CapacityRisk(sim.Scenarios[0], capacity, 0.1)
	}
}
