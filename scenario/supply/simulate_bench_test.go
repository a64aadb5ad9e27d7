package supply

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"runtime"
	"strings"
	"testing"
	"time"
)

// benchEvents writes the 10 uncertain events of the benchmarks (steps and
// pulses, units and percent, ramps and paybacks), one every 3 months from
// 2026-01.
func benchEvents(b *strings.Builder) {
	b.WriteString("events:\n")
	for k := 0; k < 10; k++ {
		month := 1 + 3*k
		start := fmt.Sprintf("%d-%02d", 2026+(month-1)/12, (month-1)%12+1)
		if k%2 == 0 {
			fmt.Fprintf(b, "  - {id: e%d, kind: step, start: %s, effect: {units: %d}, ramp: {periods: 3}, probability: 0.%d, range: {low: %d, high: %d}}\n",
				k, start, 20+k, 3+k/2, 10+k, 40+k)
		} else {
			fmt.Fprintf(b, "  - {id: e%d, kind: pulse, start: %s, periods: 2, effect: {percent: %d}, probability: 0.5, range: {low: %d, high: %d}, payback: {share: 0.5, periods: 2}}\n",
				k, start, -5-k, -15-k, 2)
		}
	}
}

// benchBody is a 36-month plan with 10 uncertain events in one scenario.
// The naive baseline has psi weights 1 at every lag.
func benchBody() string {
	var b strings.Builder
	b.WriteString("plan: bench\nhorizon: 36\nbaseline: {method: naive}\ncapacity: {units: 1500}\n")
	benchEvents(&b)
	return b.String()
}

// horizonBody is a plan of h months with the benchmark's 10 events and a
// damped additive Holt-Winters baseline (season 12): every psi weight is
// non-zero, and the error recursion carries a level, a damped trend and 12
// seasonal states.
func horizonBody(h int) string {
	var b strings.Builder
	fmt.Fprintf(&b, "plan: bench\nhorizon: %d\nbaseline: {method: holt-winters-additive, damped: true}\ncapacity: {units: 1500}\n", h)
	benchEvents(&b)
	return b.String()
}

// runSimBench draws 10,000 paths of plan p per iteration and sets them
// against capacity. Workers is left at zero, one per core: -cpu N runs
// the benchmarks on N workers (the results are the same for any N).
func runSimBench(b *testing.B, p *plan.Plan) {
	capacity := CapacityPerPeriod(p)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		s, err := sim.Simulate(p, sim.SimOptions{Paths: 10000, Seed: 1})
		if err != nil {
			b.Fatal(err)
		}
		CapacityRisk(s.Scenarios[0], capacity, 0.1)
	}
}

// BenchmarkSimulate10kPaths36Periods10Events draws 10,000 paths over 36
// periods with 10 events and summarises them (mean and quantiles per
// period) and sets them against capacity. Target: at most 150 ms per run
// on one core (go test -bench Simulate -cpu 1 ./scenario).
func BenchmarkSimulate10kPaths36Periods10Events(b *testing.B) {
	p := buildTestPlan(b, benchBody(), testHistory(48)) // to 2025-12: the plan runs 2026-01 to 2028-12
	if len(p.Periods) != 36 || len(p.Future) != 10 || len(p.Scenarios) != 1 {
		b.Fatalf("bench plan: %d periods, %d events, %d scenarios", len(p.Periods), len(p.Future), len(p.Scenarios))
	}
	runSimBench(b, p)
}

// benchHorizon runs the horizon benchmark for h periods.
func benchHorizon(b *testing.B, h int) {
	p := buildTestPlan(b, horizonBody(h), testHistory(48))
	if len(p.Periods) != h {
		b.Fatalf("bench plan: %d periods, want %d", len(p.Periods), h)
	}
	runSimBench(b, p)
}

// BenchmarkSimulateHorizon36, 360 and 3000 draw 10,000 paths of a damped
// Holt-Winters baseline with 10 events over 36, 360 and 3,000 months. The
// cost must grow linearly with the horizon: target, 360 periods at most
// 12 times 36 (BenchmarkSimulateHorizonRatio measures the ratio).
func BenchmarkSimulateHorizon36(b *testing.B)   { benchHorizon(b, 36) }
func BenchmarkSimulateHorizon360(b *testing.B)  { benchHorizon(b, 360) }
func BenchmarkSimulateHorizon3000(b *testing.B) { benchHorizon(b, 3000) }

// BenchmarkSimulateHorizonRatio times one simulation at 36 and at 360
// periods per iteration, in processor time (so that other work on the
// machine does not skew it), keeps the best of each over the iterations
// and reports their ratio as the metric "ratio-360/36". It fails above
// 12, the target: the cost grows linearly with the horizon.
func BenchmarkSimulateHorizonRatio(b *testing.B) {
	short := buildTestPlan(b, horizonBody(36), testHistory(48))
	long := buildTestPlan(b, horizonBody(360), testHistory(48))
	timeOne := func(p *plan.Plan) time.Duration {
		runtime.GC()
		t0 := cpuTime()
		if _, err := sim.Simulate(p, sim.SimOptions{Paths: 10000, Seed: 1}); err != nil {
			b.Fatal(err)
		}
		return cpuTime() - t0
	}
	best36, best360 := time.Duration(1<<62), time.Duration(1<<62)
	b.ResetTimer()
	for b.Loop() {
		best36 = min(best36, timeOne(short))
		best360 = min(best360, timeOne(long))
	}
	ratio := float64(best360) / float64(best36)
	b.ReportMetric(ratio, "ratio-360/36")
	if ratio > 12 {
		b.Errorf("horizon 360 costs %.1f times horizon 36 (%v against %v of processor time); the target is at most 12", ratio, best360, best36)
	}
}
