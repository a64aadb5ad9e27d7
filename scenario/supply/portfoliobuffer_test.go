package supply

import (
	"errors"
	"math"
	"testing"

	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/sim"
)

// TestPortfolioBuffers checks a resource's buffer on the hand-worked case
// of TestPortfolioBreachAnalytic (the line carries one series' demand,
// b_h + k_h times the naive error path, shocks ±10): with k_1 =
// sqrt(V_1/100) and k_2 = sqrt(V_2/200),
//
//   - the 95 % load of month 1 is b_1 + sqrt(V_1) (the upper of two
//     equally likely loads), so against a capacity of b_1 + sqrt(V_1)/2 the
//     first month needs sqrt(V_1)/2 in stock at its start;
//   - the spread of month 1 is sqrt(V_1), and that of the load over a
//     lead time of 2 months, k_1 e_1 + k_2 (e_2 + e_1), is
//     10 sqrt((k_1 + k_2)² + k_2²);
//   - from the bands, the spread over 2 months is sqrt(V_1) sqrt(2).
//
// Tolerances: exact where no path is read (1e-9), 3 % for spreads from
// 20,000 paths.
func TestPortfolioBuffers(t *testing.T) {
	h := plantest.Walsh(10, 10, -10, -10)
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{h, h}, "")
	a := pf.Plans[0]
	v1, v2 := a.BaselineVar[0], a.BaselineVar[1]
	capacity := make([]float64, len(a.Periods))
	for i := range capacity {
		capacity[i] = 1e9
	}
	capacity[0] = a.Baseline[0] + math.Sqrt(v1)/2
	res := []Resource{
		{ID: "line-1", Series: []string{"milk/a", "milk/b"}, PerUnit: 0.5, Capacity: capacity},
		{ID: "store", Series: []string{"milk/a"}, PerUnit: 1},
	}
	settings := BufferSettings{Service: 0.95, LeadTime: 2}
	mc, err := sim.SimulatePortfolio(pf, PortfolioSums(pf, res), sim.SimOptions{Paths: 20000, Seed: 4})
	if err != nil {
		t.Fatal(err)
	}
	run, err := SizePortfolioBuffers(pf, res, mc, settings)
	if err != nil {
		t.Fatal(err)
	}
	if len(run.Resources) != 1 || len(run.Unlimited) != 1 || run.Unlimited[0] != "store" {
		t.Fatalf("buffers for %d resources, unlimited %v; want line-1 and store unlimited", len(run.Resources), run.Unlimited)
	}
	rb := run.Resources[0]
	plantest.Same(t, "pre-build", rb.Buffer.Prebuild, math.Sqrt(v1)/2, 1e-9)
	if rb.Buffer.PrebuildAt != 0 {
		t.Errorf("pre-build before month %d, want 1", rb.Buffer.PrebuildAt+1)
	}
	k1, k2 := math.Sqrt(v1/100), math.Sqrt(v2/200)
	plantest.Same(t, "sigma", rb.Sigma, math.Sqrt(v1), 0.03)
	plantest.Same(t, "spread over 2 months", rb.Spread, 10*math.Sqrt((k1+k2)*(k1+k2)+k2*k2), 0.03)
	plantest.Same(t, "safety stock", rb.Safety, ServiceZ(0.95)*rb.Spread, 1e-12)

	bands, err := SizePortfolioBuffers(pf, res, nil, settings)
	if err != nil {
		t.Fatal(err)
	}
	plantest.Same(t, "spread from the bands", bands.Resources[0].Spread, math.Sqrt(v1)*math.Sqrt(2), 1e-9)

	if _, err := SizePortfolioBuffers(pf, res[1:], nil, settings); !errors.Is(err, ErrNoCapacity) {
		t.Errorf("no resource with a capacity: %v, want ErrNoCapacity", err)
	}
}
