package forecast

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestMeanErrorTestGolden compares MeanErrorTest with statsmodels 0.13.5:
// OLS(e, ones).fit(cov_type="HAC", cov_kwds={"maxlags": L,
// "use_correction": True}, use_t=True), from
// testdata/reference/gen_bias.py (bias_golden.json).
func TestMeanErrorTestGolden(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("testdata", "reference", "bias_golden.json"))
	if err != nil {
		t.Fatal(err)
	}
	var g struct {
		Versions struct{ Statsmodels string }
		Cases    []struct {
			Name           string
			Errors         []float64
			Lag            int
			Mean, SE, T, P float64
		}
	}
	if err := json.Unmarshal(b, &g); err != nil {
		t.Fatal(err)
	}
	if len(g.Cases) != 6 || g.Versions.Statsmodels != "0.13.5+dfsg" {
		t.Fatalf("unexpected golden file: %d cases, statsmodels %q", len(g.Cases), g.Versions.Statsmodels)
	}
	const tol = 1e-10
	for _, c := range g.Cases {
		got := MeanErrorTest(c.Errors, c.Lag)
		if got.N != len(c.Errors) || got.Lag != c.Lag {
			t.Errorf("%s: N %d lag %d", c.Name, got.N, got.Lag)
		}
		for _, f := range []struct {
			name      string
			got, want float64
		}{{"mean", got.Mean, c.Mean}, {"se", got.SE, c.SE}, {"t", got.T, c.T}, {"p", got.P, c.P}} {
			if !scalar.EqualWithinAbsOrRel(f.got, f.want, tol, tol) {
				t.Errorf("%s: %s = %.15g, statsmodels %.15g", c.Name, f.name, f.got, f.want)
			}
		}
		if got.Significant() != (c.P < 0.05) {
			t.Errorf("%s: Significant() = %v with p %v", c.Name, got.Significant(), c.P)
		}
	}
}

func TestMeanErrorTestByHand(t *testing.T) {
	inf, nan := math.Inf(1), math.NaN()
	for _, tc := range []struct {
		name        string
		errs        []float64
		lag         int
		n           int
		mean, se, t float64
		p           float64
	}{
		{
			// u = -1, 1; NW = (1+1)/2 = 1; SE^2 = 1/(2-1) = 1; T = 2.
			// t with 1 df is Cauchy: P = 1 - 2 atan(2)/pi = 0.295167235.
			name: "two errors", errs: []float64{1, 3}, lag: 0, n: 2,
			mean: 2, se: 1, t: 2, p: 1 - 2*math.Atan(2)/math.Pi,
		},
		{
			name: "NaN left out", errs: []float64{nan, 1, nan, 3}, lag: 0, n: 2,
			mean: 2, se: 1, t: 2, p: 1 - 2*math.Atan(2)/math.Pi,
		},
		{
			// Lag 5 on two errors uses lag 1 only, weight 1 - 1/6:
			// NW = (2 + 2 (5/6)(-1)) / 2 = 1/6; SE = sqrt(1/6); T = 2 sqrt(6).
			// P = 1 - 2 atan(2 sqrt 6)/pi.
			name: "lag beyond the errors", errs: []float64{1, 3}, lag: 5, n: 2,
			mean: 2, se: math.Sqrt(1.0 / 6), t: 2 * math.Sqrt(6), p: 1 - 2*math.Atan(2*math.Sqrt(6))/math.Pi,
		},
		{name: "one error", errs: []float64{4}, n: 1, mean: 4, se: nan, t: nan, p: nan},
		{name: "no errors", errs: []float64{nan}, n: 0, mean: nan, se: nan, t: nan, p: nan},
		{name: "all equal", errs: []float64{2, 2, 2}, lag: 1, n: 3, mean: 2, se: 0, t: inf, p: 0},
		{name: "all equal, negative", errs: []float64{-2, -2}, n: 2, mean: -2, se: 0, t: -inf, p: 0},
		{name: "all zero", errs: []float64{0, 0, 0}, n: 3, mean: 0, se: 0, t: 0, p: 1},
	} {
		got := MeanErrorTest(tc.errs, tc.lag)
		if got.N != tc.n {
			t.Errorf("%s: N = %d, want %d", tc.name, got.N, tc.n)
		}
		for _, f := range []struct {
			name      string
			got, want float64
		}{{"mean", got.Mean, tc.mean}, {"se", got.SE, tc.se}, {"t", got.T, tc.t}, {"p", got.P, tc.p}} {
			same := math.IsNaN(f.got) && math.IsNaN(f.want) || f.got == f.want ||
				scalar.EqualWithinAbsOrRel(f.got, f.want, 1e-12, 1e-12)
			if !same {
				t.Errorf("%s: %s = %v, want %v", tc.name, f.name, f.got, f.want)
			}
		}
	}
}

func TestNeweyWestLag(t *testing.T) {
	// floor(4 (n/100)^(2/9)), by hand: (4/100)^(2/9) = exp(-0.715) = 0.489,
	// x4 = 1.96; (19/100)^(2/9) = 0.691, x4 = 2.77; (36/100)^(2/9) = 0.797,
	// x4 = 3.19; 1 at n = 100 gives 4; 1000: 10^(2/9) = 1.668, x4 = 6.67.
	for _, tc := range []struct{ n, want int }{{0, 0}, {4, 1}, {19, 2}, {36, 3}, {100, 4}, {1000, 6}} {
		if got := NeweyWestLag(tc.n); got != tc.want {
			t.Errorf("NeweyWestLag(%d) = %d, want %d", tc.n, got, tc.want)
		}
	}
}

// TestBacktestBias checks that a backtest tests its one-step errors, one
// per origin, and that a fit tests its in-sample residuals.
func TestBacktestBias(t *testing.T) {
	// Naive on 10 12 11 15 14 18 17 21 with 4 origins (o = 5..8, 1-based):
	// one-step errors 14-15 = -1, 18-14 = 4, 17-18 = -1, 21-17 = 4, by hand.
	// Mean 1.5, u = -2.5, 2.5, -2.5, 2.5; lag NeweyWestLag(4) = 1:
	// NW = (25 + 2 (1/2)(3)(-6.25)) / 4 = 6.25/4 = 1.5625,
	// SE^2 = 1.5625/3, T = 1.5/SE = sqrt(4.32) = 2.078461, so T/sqrt(3) = 1.2.
	// Student t with 3 df: F(T) = 1/2 + (1/pi)(1.2/(1+1.44) + atan(1.2)),
	// P = 2 (1 - F(T)) = 0.129200.
	y := []float64{10, 12, 11, 15, 14, 18, 17, 21}
	bt, err := RunBacktest(y, Naive, Config{Season: 1}, 4, 3, false, DivisorNMinus1)
	if err != nil {
		t.Fatal(err)
	}
	wantP := 2 * (0.5 - (1.2/2.44+math.Atan(1.2))/math.Pi)
	b := bt.Bias
	if b.N != 4 || b.Lag != 1 || !scalar.EqualWithinAbsOrRel(b.Mean, 1.5, 1e-12, 1e-12) ||
		!scalar.EqualWithinAbsOrRel(b.SE, math.Sqrt(1.5625/3), 1e-12, 1e-12) ||
		!scalar.EqualWithinAbsOrRel(b.T, math.Sqrt(4.32), 1e-12, 1e-12) ||
		!scalar.EqualWithinAbsOrRel(b.P, wantP, 1e-9, 1e-9) {
		t.Errorf("backtest bias %+v, want N 4 lag 1 mean 1.5 T %v P %v", b, math.Sqrt(4.32), wantP)
	}
	if b.Significant() {
		t.Error("p 0.129 is significant")
	}
	if !math.IsNaN(bt.Accuracy.TrackingSignal) {
		t.Errorf("backtest tracking signal %v, want NaN", bt.Accuracy.TrackingSignal)
	}

	r, err := Fit(Series{Name: "x", Start: mustPeriod(t, "2026-01", Monthly), Values: y}, Spec{Method: Naive, Holdout: 4})
	if err != nil {
		t.Fatal(err)
	}
	want := BiasOf(r.Residuals())
	if r.Bias != want && !(math.IsNaN(want.P) && r.Bias.N == want.N) {
		t.Errorf("fit bias %+v, want %+v", r.Bias, want)
	}
	// Residuals 2, -1, 4, -1, 4, -1, 4 (the first has no prediction).
	if r.Bias.N != 7 || !scalar.EqualWithinAbsOrRel(r.Bias.Mean, 11.0/7, 1e-12, 1e-12) {
		t.Errorf("fit bias N %d mean %v, want 7 and 11/7", r.Bias.N, r.Bias.Mean)
	}
}
