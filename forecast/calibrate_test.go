package forecast

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestIsotonic checks pool adjacent violators on worked examples: a
// violating pair is replaced by its weighted mean.
func TestIsotonic(t *testing.T) {
	for _, c := range []struct {
		y, w, want []float64
	}{
		{[]float64{1, 2, 3}, []float64{1, 1, 1}, []float64{1, 2, 3}},
		// 3 then 1 pool to (3+1)/2 = 2.
		{[]float64{3, 1, 4}, []float64{1, 1, 1}, []float64{2, 2, 4}},
		// weights 3 and 1: (3*3 + 1*1)/4 = 2.5.
		{[]float64{3, 1}, []float64{3, 1}, []float64{2.5, 2.5}},
		// 5, 1, 0 pool to 2 over all three.
		{[]float64{5, 1, 0, 7}, []float64{1, 1, 1, 1}, []float64{2, 2, 2, 7}},
	} {
		got := isotonic(c.y, c.w)
		for i := range got {
			if !scalar.EqualWithinAbs(got[i], c.want[i], 1e-12) {
				t.Errorf("isotonic(%v, %v) = %v, want %v", c.y, c.w, got, c.want)
				break
			}
		}
	}
}

// TestCalibrateVarianceByHand works the shrinkage through on a small case.
func TestCalibrateVarianceByHand(t *testing.T) {
	// Two origins: lead 1 errors 2 and -2 (n=2, m=4), lead 2 error 4
	// (n=1, m=16). Model shape 1, 2.
	errs := [][]float64{{2, 4}, {-2}}
	v, cal := CalibrateVariance(errs, []float64{1, 2})
	// K  = (2*4 + 1*16) / (2*1 + 1*2) = 24/4 = 6
	// K' = (3*6 + 4) / (3 + 4) = 22/7
	// k1 = (2*4/1 + 8*22/7) / (2 + 8) = (8 + 176/7)/10 = 232/70
	// k2 = (1*16/2 + 8*22/7) / (1 + 8) = (8 + 176/7)/9 = 232/63
	// v = 232/70 * 1, 232/63 * 2: already increasing.
	want := []float64{232.0 / 70, 2 * 232.0 / 63}
	for i := range want {
		if !scalar.EqualWithinAbs(v[i], want[i], 1e-12) {
			t.Errorf("v[%d] = %v, want %v", i, v[i], want[i])
		}
	}
	if cal.Errors != 3 || cal.Origins != 2 || cal.Leads != 2 || !scalar.EqualWithinAbs(cal.Ratio, 22.0/7, 1e-12) {
		t.Errorf("calibration %+v", cal)
	}
	// Beyond the last lead reached, k stays at k2.
	v, _ = CalibrateVariance(errs, []float64{1, 2, 3})
	if !scalar.EqualWithinAbs(v[2], 3*232.0/63, 1e-12) {
		t.Errorf("v[2] = %v, want %v", v[2], 3*232.0/63)
	}
	if v, _ := CalibrateVariance([][]float64{{math.NaN()}}, []float64{1}); v != nil {
		t.Errorf("no finite error: %v, want nil", v)
	}
}

// TestCalibrateVarianceKnown: errors drawn with a known standard deviation
// at each lead time, sigma_h = h (variance h^2), from many origins. Whatever
// the model's shape (here flat, as a model would be that thinks errors do
// not grow), the calibrated variance must find h^2: the standard error of
// a variance estimated from n normal draws is sigma^2 sqrt(2/n), 2.2 % for
// n = 4,000, so 8 % is over three standard errors.
func TestCalibrateVarianceKnown(t *testing.T) {
	const origins, H = 4000, 6
	r := rand.New(rand.NewPCG(3, 4))
	errs := make([][]float64, origins)
	for i := range errs {
		errs[i] = make([]float64, H)
		for k := range errs[i] {
			errs[i][k] = float64(k+1) * r.NormFloat64()
		}
	}
	for _, shape := range [][]float64{{1, 1, 1, 1, 1, 1}, {1, 4, 9, 16, 25, 36}, nil} {
		v, _ := CalibrateVariance(errs, shape)
		for k := range v {
			want := float64((k + 1) * (k + 1))
			if math.Abs(v[k]/want-1) > 0.08 {
				t.Errorf("shape %v: lead %d variance %.3f, want %.0f", shape, k+1, v[k], want)
			}
		}
	}
}

// TestCalibrateVarianceShortHistory: with a single error the calibrated
// variance stays close to the model's: K' = (1*K + 4)/5 and k_h leans on it.
func TestCalibrateVarianceShortHistory(t *testing.T) {
	// One lead-1 error of 10 against a model variance of 4: K = 25,
	// K' = (25 + 4)/5 = 5.8, k1 = (25 + 8*5.8)/9 = 71.4/9.
	v, _ := CalibrateVariance([][]float64{{10}}, []float64{4, 8})
	if want := 4 * 71.4 / 9; !scalar.EqualWithinAbs(v[0], want, 1e-9) {
		t.Errorf("v1 = %v, want %v", v[0], want)
	}
	if want := 8 * 71.4 / 9; !scalar.EqualWithinAbs(v[1], want, 1e-9) {
		t.Errorf("v2 = %v, want %v (the last ratio carried on)", v[1], want)
	}
}
