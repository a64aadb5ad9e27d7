package forecast

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestVariancePartsAddUp checks that the parts of disjoint sets of series,
// added, give SumVariance of all the series: the same formula, summed in
// another order, so equal within 1e-12 relative (the rounding of a few
// hundred additions). The series start at different times and use methods
// that carry a surprise forward differently (naive, SES, Holt), so every
// term of the formula is used: shared periods, draws taken apart by
// number of errors, and several impulse weights.
func TestVariancePartsAddUp(t *testing.T) {
	start, _ := ParsePeriod("2018-01", Monthly)
	rng := rand.New(rand.NewPCG(7, 13))
	common := rollupNormals(rng, 72)
	methods := []Method{Naive, SES, Holt, Naive, SES, Holt, Naive}
	var results []*Result
	for i, m := range methods {
		steps := rollupNormals(rng, 72)
		for k := range steps {
			steps[k] = 3*steps[k] + 2*common[k] // correlated errors
		}
		skip := []int{0, 0, 12, 24, 24, 6, 40}[i]
		y := rollupWalk(steps)[skip:]
		r, err := Fit(Series{Name: string(rune('a' + i)), Start: start.Add(skip), Values: y}, Spec{Method: m, Config: Config{Season: 1}})
		if err != nil {
			t.Fatal(err)
		}
		results = append(results, r)
	}
	const h, span = 6, 80
	end := start.Add(72)
	want, err := SumVariance(results, h, Widening, Calibrated, span)
	if err != nil {
		t.Fatal(err)
	}
	for _, split := range [][]int{{0, 0, 0, 0, 0, 0, 0}, {0, 1, 0, 1, 0, 1, 0}, {2, 0, 1, 2, 0, 1, 2}} {
		shards := map[int][]*Result{}
		for i, s := range split {
			shards[s] = append(shards[s], results[i])
		}
		total := NewVarianceParts(h, span)
		for s := range 3 {
			p, err := SumVarianceParts(shards[s], h, span, end, Widening, Calibrated)
			if err != nil {
				t.Fatal(err)
			}
			if err := p.Check(); err != nil {
				t.Fatal(err)
			}
			if err := total.Add(p); err != nil {
				t.Fatal(err)
			}
		}
		got := total.Variance()
		for l := range h {
			if !scalar.EqualWithinRel(got[l], want[l], 1e-12) {
				t.Errorf("split %v, lead %d: parts give %v, SumVariance %v", split, l+1, got[l], want[l])
			}
		}
	}
	// A series that ends elsewhere is refused, and so are errors beyond the span.
	if _, err := SumVarianceParts(results[:1], h, span, end.Add(1), Widening, Calibrated); err == nil {
		t.Error("a series ending before the others was accepted")
	}
	if _, err := SumVarianceParts(results[:1], h, 10, end, Widening, Calibrated); err == nil {
		t.Error("errors beyond the span were accepted")
	}
}
