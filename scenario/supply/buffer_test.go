package supply

import (
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
	"math"
	"testing"
)

// The hand-worked example. Demand 60 80 90 150 160 70 against capacity
// 100 100 100 100 120 100. The backward pass, S_7 = 0 and
// S_t = max(0, d_t − c_t + S_{t+1}):
//
//	S_6 = max(0,  70 − 100 +  0) =  0
//	S_5 = max(0, 160 − 120 +  0) = 40
//	S_4 = max(0, 150 − 100 + 40) = 90
//	S_3 = max(0,  90 − 100 + 90) = 80
//	S_2 = max(0,  80 − 100 + 80) = 60
//	S_1 = max(0,  60 − 100 + 60) = 20
//
// The first period over capacity is period 4 (150 > 100): hold 90 at its
// start. From an opening stock of 60, making each period's demand and
// more only when the stock would fall short of the next S,
// build_t = min(c_t, max(d_t, d_t + S_{t+1} − s)):
//
//	t=1: min(100, max( 60,  60 + 60 − 60 =  60)) =  60, stock 60 +  60 −  60 = 60
//	t=2: min(100, max( 80,  80 + 80 − 60 = 100)) = 100, stock 60 + 100 −  80 = 80
//	t=3: min(100, max( 90,  90 + 90 − 80 = 100)) = 100, stock 80 + 100 −  90 = 90
//	t=4: min(100, max(150, 150 + 40 − 90 = 100)) = 100, stock 90 + 100 − 150 = 40
//	t=5: min(120, max(160, 160 +  0 − 40 = 120)) = 120, stock 40 + 120 − 160 =  0
//	t=6: min(100, max( 70,  70 +  0 −  0 =  70)) =  70, stock 0
//
// Period 2 is the first to make more than its demand (100 > 80): building
// ahead starts there. From an opening stock of 0 the plan is 20 short at
// the start (S_1 = 20): it builds at capacity from period 1
// (min(100, 60 + 60) = 100, stock 40; then 100, 100, 100 to stock 60, 70,
// 20) and still ends period 5 at 20 + 120 − 160 = −20 (20 units of demand
// unmet, as the gap says) before period 6 makes 70 + 20 = 90.
var (
	handDemand   = []float64{60, 80, 90, 150, 160, 70}
	handCapacity = []float64{100, 100, 100, 100, 120, 100}
)

func TestRequiredStock(t *testing.T) {
	plantest.EqualSlices(t, "S", RequiredStock(handDemand, handCapacity), []float64{20, 60, 80, 90, 40, 0}, 0)
	plantest.EqualSlices(t, "S (never short)", RequiredStock([]float64{1, 2}, []float64{5, 5}), []float64{0, 0}, 0)
}

func TestPlanBuffer(t *testing.T) {
	for _, tc := range []struct {
		name                  string
		opening               float64
		wantBuild, wantStock  []float64
		wantStart, wantPreAt  int
		wantPrebuild, wantGap float64
	}{
		{"opening 60", 60, []float64{60, 100, 100, 100, 120, 70}, []float64{60, 80, 90, 40, 0, 0}, 1, 3, 90, 0},
		{"opening 0", 0, []float64{100, 100, 100, 100, 120, 90}, []float64{40, 60, 70, 20, -20, 0}, 0, 3, 90, 20},
		// Opening 500, by hand: build_t = max(d_t, d_t + S_{t+1} − s) is
		// d_t while the stock covers the next S, capped at capacity in
		// periods 4 and 5, which draw the stock down by 50 and 40: stock
		// 500, 500, 500, 450, 410, 410. Nothing is made beyond a period's
		// demand, so there is no build start.
		{"opening 500", 500, []float64{60, 80, 90, 100, 120, 70}, []float64{500, 500, 500, 450, 410, 410}, -1, 3, 90, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b := PlanBuffer(handDemand, handCapacity, tc.opening)
			plantest.EqualSlices(t, "build", b.Build, tc.wantBuild, 1e-12)
			plantest.EqualSlices(t, "stock", b.Stock, tc.wantStock, 1e-12)
			if b.BuildStart != tc.wantStart || b.PrebuildAt != tc.wantPreAt {
				t.Errorf("build start %d, prebuild at %d; want %d, %d", b.BuildStart, b.PrebuildAt, tc.wantStart, tc.wantPreAt)
			}
			plantest.Same(t, "prebuild", b.Prebuild, tc.wantPrebuild, 0)
			plantest.Same(t, "gap", b.Gap, tc.wantGap, 0)
		})
	}
	b := PlanBuffer([]float64{1, 2}, []float64{5, 5}, 0)
	if b.PrebuildAt != -1 || b.Prebuild != 0 || b.BuildStart != -1 {
		t.Errorf("never over capacity: %+v", b)
	}
}

func TestSafetyStock(t *testing.T) {
	for _, tc := range []struct {
		service, sigma, lead float64
		// want: z sigma sqrt(L) with z from a standard normal table
		// (one-sided): z(0.95) = 1.644854, z(0.975) = 1.959964,
		// z(0.90) = 1.281552, z(0.99) = 2.326348, z(0.5) = 0.
		want float64
	}{
		{0.95, 100, 4, 1.644854 * 100 * 2},
		{0.975, 50, 1, 1.959964 * 50},
		{0.90, 10, 9, 1.281552 * 10 * 3},
		{0.99, 1, 2, 2.326348 * math.Sqrt2},
		{0.5, 100, 4, 0},
	} {
		got := SafetyStock(tc.service, tc.sigma, tc.lead)
		plantest.Same(t, "safety stock", got, tc.want, 1e-6)
		// The cycle service level of that stock is the service asked for.
		if tc.want != 0 {
			plantest.Same(t, "cycle service level", CycleServiceLevel(got, tc.sigma, tc.lead), tc.service, 1e-9)
		}
	}
	plantest.Same(t, "z(0.95)", ServiceZ(0.95), 1.644854, 1e-6)
	plantest.Same(t, "CSL of no stock", CycleServiceLevel(0, 10, 1), 0.5, 1e-12)
	plantest.Same(t, "CSL with no error", CycleServiceLevel(0, 0, 1), 1, 0)
	for _, s := range []float64{0, 1, -0.1, 1.5, math.NaN()} {
		if !math.IsNaN(SafetyStock(s, 1, 1)) {
			t.Errorf("service %v gave a safety stock", s)
		}
	}
}

func TestBandDemand(t *testing.T) {
	// Adjusted + z(0.95) sqrt(Var): with Var = 100, 1.644854 * 10 above.
	p := &plan.Plan{Scenarios: []plan.ScenarioPlan{{Adjusted: []float64{500, 600}, Var: []float64{100, 400}}}}
	plantest.EqualSlices(t, "demand", BandDemand(p, 0, 0.95), []float64{500 + 16.44854, 600 + 32.89707}, 1e-6)
}
