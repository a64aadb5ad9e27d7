package forecast

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestMinimizeGlobal1D checks the global search of one variable on
// functions whose minima are known by hand.
func TestMinimizeGlobal1D(t *testing.T) {
	tests := []struct {
		name   string
		f      func(float64) float64
		lo, hi float64
		wantX  float64 // hand calculation, see each case
		wantF  float64
		tol    float64
	}{
		// (x-0.3)² + 1: minimum 1 at x = 0.3.
		{"parabola", func(x float64) float64 { return (x-0.3)*(x-0.3) + 1 }, 0, 1, 0.3, 1, 1e-6},
		// A local minimum at 0.6 (value 0) and the global one on the lower
		// bound: f(0) = -0.1. Descending from the middle would stop at 0.6,
		// as SES stopped at a local alpha while the bound was lower.
		{"bound beats local", func(x float64) float64 {
			return math.Min((x-0.6)*(x-0.6), -0.1+x)
		}, 0.0001, 0.9999, 0.0001, -0.0999, 1e-12},
		// The same on the upper bound: f(0.9999) = -0.1 + 0.0001.
		{"upper bound", func(x float64) float64 {
			return math.Min((x-0.3)*(x-0.3), -0.1+(1-x))
		}, 0.0001, 0.9999, 0.9999, -0.0999, 1e-12},
		// Two wells, x = 0.2 (depth 0) and x = 0.8 (depth -0.01): the
		// deeper one wins.
		{"two wells", func(x float64) float64 {
			return math.Min(50*(x-0.2)*(x-0.2), 50*(x-0.8)*(x-0.8)-0.01)
		}, 0, 1, 0.8, -0.01, 1e-6},
		// NaN counts as +Inf: below 0.5 the function is undefined;
		// x² has its minimum 0.25 at the edge x = 0.5 of the valid part.
		{"nan half", func(x float64) float64 {
			if x < 0.5 {
				return math.NaN()
			}
			return x * x
		}, 0, 1, 0.5, 0.25, 1e-6},
		// One point.
		{"degenerate", func(x float64) float64 { return x }, 0.4, 0.4, 0.4, 0.4, 0},
	}
	for _, tc := range tests {
		x, fx := minimizeGlobal1D(tc.f, tc.lo, tc.hi, 48, 1e-9)
		if !scalar.EqualWithinAbs(x, tc.wantX, tc.tol) || !scalar.EqualWithinAbs(fx, tc.wantF, tc.tol) {
			t.Errorf("%s: minimum %v at %v, want %v at %v", tc.name, fx, x, tc.wantF, tc.wantX)
		}
	}
	// Nothing finite: NaN and +Inf.
	x, fx := minimizeGlobal1D(func(float64) float64 { return math.NaN() }, 0, 1, 8, 1e-6)
	if !math.IsNaN(x) || !math.IsInf(fx, 1) {
		t.Errorf("all NaN: got %v, %v", x, fx)
	}
}

// TestBrentMin checks Brent's method on cos, whose minimum in [2, 4] is
// -1 at π (from memory), and counts that it needs few evaluations there.
func TestBrentMin(t *testing.T) {
	n := 0
	f := func(x float64) float64 { n++; return math.Cos(x) }
	x, fx := brentMin(f, 2, 4, 2.5, math.Cos(2.5), 1e-8)
	if !scalar.EqualWithinAbs(x, math.Pi, 1e-7) || !scalar.EqualWithinAbs(fx, -1, 1e-14) {
		t.Errorf("minimum %v at %v, want -1 at π", fx, x)
	}
	if n > 30 {
		t.Errorf("%d evaluations; the parabolic steps should need far fewer", n)
	}
}
