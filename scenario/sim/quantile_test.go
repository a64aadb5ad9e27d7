package sim

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestQuantileMatchesNumpy(t *testing.T) {
	levels := []float64{0, 0.05, 0.10, 0.25, 0.5, 0.9, 0.95, 1}
	for _, tc := range []struct {
		name string
		x    []float64
		// want: numpy.quantile(x, levels) with the default method
		// "linear" (Hyndman & Fan definition 7), numpy 1.24.2, printed by
		// testdata/quantile_ref.py run with /usr/bin/python3.
		want []float64
		tol  float64
	}{
		{"five", []float64{3.0, 1.0, 4.0, 1.0, 5.0}, []float64{1.0, 1.0, 1.0, 1.0, 3.0, 4.6, 4.8, 5.0}, 1e-12},
		{"ten", []float64{12.5, -3.0, 7.25, 7.25, 0.0, 99.0, 41.0, -17.5, 8.0, 2.0}, []float64{-17.5, -10.975, -4.449999999999999, 0.5, 7.25, 46.79999999999998, 72.89999999999993, 99.0}, 1e-12},
		{"two", []float64{10.0, 20.0}, []float64{10.0, 10.5, 11.0, 12.5, 15.0, 19.0, 19.5, 20.0}, 1e-12},
		{"one", []float64{42.0}, []float64{42.0, 42.0, 42.0, 42.0, 42.0, 42.0, 42.0, 42.0}, 1e-12},
	} {
		t.Run(tc.name, func(t *testing.T) {
			orig := append([]float64(nil), tc.x...)
			got := Quantiles(tc.x, levels...)
			for i, w := range tc.want {
				if !scalar.EqualWithinAbsOrRel(got[i], w, tc.tol, tc.tol) {
					t.Errorf("Q(%g) = %.15g, want %.15g", levels[i], got[i], w)
				}
			}
			for i := range orig {
				if tc.x[i] != orig[i] {
					t.Fatalf("Quantiles changed its input: %v", tc.x)
				}
			}
		})
	}
}

func TestQuantileByHand(t *testing.T) {
	// Sorted 1, 2, 4, 8: Q(0.9) has h = 3 * 0.9 = 2.7 (0-based), so
	// Q = x[2] + 0.7 (x[3] − x[2]) = 4 + 0.7 * 4 = 6.8.
	if got := Quantile([]float64{1, 2, 4, 8}, 0.9); !scalar.EqualWithinAbsOrRel(got, 6.8, 1e-12, 1e-12) {
		t.Errorf("Q(0.9) = %v, want 6.8", got)
	}
	if got := Quantile(nil, 0.5); !math.IsNaN(got) {
		t.Errorf("Q of nothing = %v, want NaN", got)
	}
	defer func() {
		if recover() == nil {
			t.Error("Quantile(p = 1.5) did not panic")
		}
	}()
	Quantile([]float64{1}, 1.5)
}

func TestSpreadOf(t *testing.T) {
	// Values 1..20 (given in reverse): mean 10.5; with h = 19p,
	// P5: h = 0.95 -> 1 + 0.95 = 1.95; P10: h = 1.9 -> 2.9;
	// P50: h = 9.5 -> 10.5; P90: h = 17.1 -> 18.1; P95: h = 18.05 -> 19.05.
	col := make([]float64, 20)
	for i := range col {
		col[i] = float64(20 - i)
	}
	s := spreadOf(col)
	got := []float64{s.Mean, s.P5, s.P10, s.P50, s.P90, s.P95}
	want := []float64{10.5, 1.95, 2.9, 10.5, 18.1, 19.05}
	for i := range want {
		if !scalar.EqualWithinAbsOrRel(got[i], want[i], 1e-12, 1e-12) {
			t.Errorf("spread[%d] = %v, want %v", i, got[i], want[i])
		}
	}
}
