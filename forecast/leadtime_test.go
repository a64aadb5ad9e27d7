package forecast

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestCumulativeVariance works the lead-time variance through by hand.
func TestCumulativeVariance(t *testing.T) {
	for _, c := range []struct {
		name    string
		v, psi  []float64
		want    []float64
		comment string
	}{
		// Errors that do not carry over: the variances add up.
		{"white noise", []float64{1, 2, 3}, []float64{1, 0, 0}, []float64{1, 3, 6}, ""},
		// Naive forecast of a random walk with shock variance 1: v_h = h,
		// psi_j = 1, e_h = eps_1 + ... + eps_h, so
		// e_1 + e_2 = 2 eps_1 + eps_2: 4 + 1 = 5, and
		// e_1 + e_2 + e_3 = 3 eps_1 + 2 eps_2 + eps_3: 9 + 4 + 1 = 14.
		{"random walk", []float64{1, 2, 3}, []float64{1, 1, 1}, []float64{1, 5, 14}, ""},
		// Simple exponential smoothing, alpha 0.5, shock variance 4:
		// v_1 = 4, v_2 = 4 (1 + 0.25) = 5, psi = 1, 0.5; g = 2, 2;
		// e_1 + e_2 = 2 eps_1 + (2 eps_2 + 2*0.5 eps_1) = 3 eps_1 + 2 eps_2:
		// 9 + 4 = 13.
		{"ses", []float64{4, 5}, []float64{1, 0.5}, []float64{4, 13}, ""},
	} {
		got := cumulativeVariance(c.v, c.psi)
		for i := range c.want {
			if !scalar.EqualWithinAbs(got[i], c.want[i], 1e-12) {
				t.Errorf("%s: %v, want %v", c.name, got, c.want)
				break
			}
		}
	}
}

// TestLeadTimeVarianceNaive: the naive method's model variance is MSE*h
// with psi = 1 (FPP 3rd ed., table 5.2), so over a lead time of 3 the
// variance is MSE (9 + 4 + 1) = 14 MSE, and 2.5 lies half way between
// 5 MSE and 14 MSE.
func TestLeadTimeVarianceNaive(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	s := Series{Name: "a", Start: start, Values: []float64{10, 12, 11, 13, 12, 14, 13, 15, 14, 16}}
	r, err := Fit(s, Spec{Method: Naive, Config: Config{Season: 1}})
	if err != nil {
		t.Fatal(err)
	}
	mse := r.Accuracy.MSE // 3, see TestVarianceSources
	for _, c := range []struct{ L, want float64 }{{0, 0}, {1, mse}, {3, 14 * mse}, {2.5, 9.5 * mse}, {0.5, 0.5 * mse}} {
		if got := r.LeadTimeVariance(c.L, Widening, FromModel); !scalar.EqualWithinAbs(got, c.want, 1e-9) {
			t.Errorf("L = %v: %v, want %v", c.L, got, c.want)
		}
	}
	if !math.IsNaN(r.LeadTimeVariance(-1, Widening, FromModel)) {
		t.Error("L = -1 should be NaN")
	}
}
