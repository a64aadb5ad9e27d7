package sim

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
)

// benchPortfolio builds an invented portfolio of n monthly series of 49
// points (noise around levels of 100 to 1,000), planned with the naive
// method over 12 months, with three scoped events.
func benchPortfolio(b *testing.B, n int) *plan.Portfolio {
	b.Helper()
	r := rand.New(rand.NewPCG(5, 8))
	names := make([]string, n)
	values := make([][]float64, n)
	for i := range n {
		names[i] = fmt.Sprintf("fam-%d/item-%04d", i%5, i)
		level := 100 + 900*r.Float64()
		values[i] = make([]float64, 49)
		for t := range values[i] {
			values[i][t] = math.Round(level + 0.1*level*r.NormFloat64())
		}
	}
	body := `events:
  - {id: fair, kind: pulse, start: 2026-04, periods: 1, effect: {percent: 12}, range: {low: 6, high: 18}, scope: [{series: "fam-0/*"}]}
  - {id: exit, kind: step, start: 2026-06, probability: 0.6, effect: {percent: -100}, scope: [{series: "fam-1/*"}]}
  - {id: deal, kind: step, start: 2026-03, probability: 0.7, effect: {units: 40000, split: baseline}, range: {low: 25000, high: 50000}, scope: [{series: "fam-2/*"}]}
`
	return testplan.Portfolio(b, names, values, body)
}

// BenchmarkSimulatePortfolio draws 1,000 paths of the total and two
// resource-like sums of 2,000 series over 12 months: the cost of the
// Monte Carlo of a portfolio per series and path.
func BenchmarkSimulatePortfolio(b *testing.B) {
	pf := benchPortfolio(b, 2000)
	sums := []Sum{TotalOf(pf)}
	for f := range 2 {
		s := Sum{Name: fmt.Sprintf("line-%d", f)}
		for i := range pf.Plans {
			if i%5 == f {
				s.Members, s.Weights = append(s.Members, i), append(s.Weights, 0.01)
			}
		}
		sums = append(sums, s)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := SimulatePortfolio(pf, sums, SimOptions{Paths: 1000, Seed: 1}); err != nil {
			b.Fatal(err)
		}
	}
}
