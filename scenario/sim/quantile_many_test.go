package sim

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"
)

// TestSelectAll checks the multiple selection against a sort (the
// reference: every wanted position holds the value a sort puts there)
// and the partition property around each wanted position, on random
// inputs with and without ties and on inputs that defeat simple pivots.
func TestSelectAll(t *testing.T) {
	const n = 3000
	r := rand.New(rand.NewPCG(5, 6))
	inputs := map[string]func(i int) float64{
		"random":     func(int) float64 { return r.NormFloat64() },
		"ties":       func(int) float64 { return float64(r.IntN(7)) },
		"sorted":     func(i int) float64 { return float64(i) },
		"reversed":   func(i int) float64 { return float64(n - i) },
		"equal":      func(int) float64 { return 7 },
		"organ pipe": func(i int) float64 { return float64(min(i, n-i)) },
	}
	for _, name := range []string{"random", "ties", "sorted", "reversed", "equal", "organ pipe"} {
		for _, ks := range [][]int{
			{0}, {n - 1}, {0, n - 1}, {0, 1, 2},
			{149, 150, 299, 300, 1499, 1500, 2699, 2700, 2849, 2850},
			{n - 3, n - 2, n - 1},
		} {
			x := make([]float64, n)
			for i := range x {
				x[i] = inputs[name](i)
			}
			sorted := slices.Clone(x)
			slices.Sort(sorted)
			selectAll(x, ks)
			for _, k := range ks {
				if x[k] != sorted[k] {
					t.Errorf("%s %v: x[%d] = %v, want %v", name, ks, k, x[k], sorted[k])
				}
				for i, v := range x {
					if (i < k && v > x[k]) || (i > k && v < x[k]) {
						t.Fatalf("%s %v: x[%d] = %v on the wrong side of x[%d] = %v", name, ks, i, v, k, x[k])
					}
				}
			}
		}
	}
	selectAll(nil, nil) // nothing to do
}

// TestLomutoPartition checks the partition's contract (x[lo:j+1] <=
// pivot, x[j+1:i] equal to it, x[i:hi+1] >= pivot, the values kept) on
// random ranges with and without ties, and that a NaN among the values
// does not stop a selection from finishing.
func TestLomutoPartition(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 9))
	for _, n := range []int{2, 3, 4, 17, 100, 1000} {
		for _, ties := range []int{0, 1, 3, 50} {
			x := make([]float64, n+4)
			for i := range x {
				x[i] = r.NormFloat64()
				if ties > 0 {
					x[i] = float64(r.IntN(ties))
				}
			}
			lo, hi := 2, n+1
			before := slices.Clone(x)
			i, j := lomutoPartition(x, lo, hi)
			if !(j < i) || j < lo-1 || i > hi+1 || i-j < 2 {
				t.Fatalf("n %d ties %d: i %d, j %d", n, ties, i, j)
			}
			pivot := x[j+1]
			for k := lo; k <= hi; k++ {
				v := x[k]
				if (k <= j && v > pivot) || (k > j && k < i && v != pivot) || (k >= i && v < pivot) {
					t.Fatalf("n %d ties %d: x[%d] = %v breaks the partition at pivot %v (i %d, j %d)", n, ties, k, v, pivot, i, j)
				}
			}
			a, b := slices.Clone(before), slices.Clone(x)
			slices.Sort(a)
			slices.Sort(b)
			if !slices.Equal(a, b) || before[0] != x[0] || before[n+3] != x[n+3] {
				t.Fatalf("n %d ties %d: values lost or moved outside the range", n, ties)
			}
		}
	}
	x := make([]float64, 500)
	for i := range x {
		x[i] = r.NormFloat64()
	}
	x[250] = math.NaN()
	_ = QuantileOf(x, 0.5) // must return
	selectAll(x, []int{10, 250, 490})
}
