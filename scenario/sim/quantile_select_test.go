package sim

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestQuantileOfMatchesSort checks that selection gives the same
// quantiles as Quantile on a sorted copy (equal values; 0 and -0, equal
// in a sort, may trade places) (the reference:
// definition 7 as tested against numpy in quantile_test.go), on samples
// with and without ties, and on Spread's successive levels.
func TestQuantileOfMatchesSort(t *testing.T) {
	r := rand.New(rand.NewPCG(8, 8))
	for _, n := range []int{1, 2, 3, 5, 16, 17, 40, 1001, 10000} {
		for _, ties := range []bool{false, true} {
			x := make([]float64, n)
			for i := range x {
				x[i] = r.NormFloat64()
				if ties {
					x[i] = math.Round(3 * x[i])
				}
			}
			sorted := slices.Clone(x)
			slices.Sort(sorted)
			for _, p := range []float64{0, 0.05, 0.1, 0.25, 0.5, 0.9, 0.95, 0.999, 1} {
				got, want := QuantileOf(slices.Clone(x), p), Quantile(sorted, p)
				if got != want {
					t.Errorf("n %d ties %v p %v: %v, want %v", n, ties, p, got, want)
				}
			}
			s := spreadOf(slices.Clone(x))
			got := []float64{s.P5, s.P10, s.P50, s.P90, s.P95}
			for i, lv := range Levels {
				if want := Quantile(sorted, lv); got[i] != want {
					t.Errorf("n %d ties %v: spread P%g %v, want %v", n, ties, 100*lv, got[i], want)
				}
			}
		}
	}
	if !math.IsNaN(QuantileOf(nil, 0.5)) {
		t.Error("empty sample: not NaN")
	}
}

// TestSelectKWorstCases runs the selection on inputs that defeat simple
// pivots (sorted, reversed, all equal, organ pipe) and checks the
// partition property.
func TestSelectKWorstCases(t *testing.T) {
	const n = 3000
	inputs := map[string]func(i int) float64{
		"sorted":     func(i int) float64 { return float64(i) },
		"reversed":   func(i int) float64 { return float64(n - i) },
		"equal":      func(int) float64 { return 7 },
		"organ pipe": func(i int) float64 { return float64(min(i, n-i)) },
	}
	for _, name := range []string{"sorted", "reversed", "equal", "organ pipe"} {
		for _, k := range []int{0, 1, n / 20, n / 2, n - 2, n - 1} {
			x := make([]float64, n)
			for i := range x {
				x[i] = inputs[name](i)
			}
			sorted := slices.Clone(x)
			slices.Sort(sorted)
			selectK(x, k)
			if x[k] != sorted[k] {
				t.Errorf("%s k %d: %v, want %v", name, k, x[k], sorted[k])
			}
			for i, v := range x {
				if (i < k && v > x[k]) || (i > k && v < x[k]) {
					t.Fatalf("%s k %d: x[%d] = %v on the wrong side of %v", name, k, i, v, x[k])
				}
			}
		}
	}
}
