package forecast

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestZForCoverage(t *testing.T) {
	tests := []struct {
		coverage, z float64
	}{
		// Standard normal table: the two-sided 95% point is 1.959964,
		// 90% is 1.644854, 99% is 2.575829.
		{0.95, 1.959964},
		{0.90, 1.644854},
		{0.99, 2.575829},
	}
	for _, tc := range tests {
		z, err := ZForCoverage(tc.coverage)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbs(z, tc.z, 5e-7) {
			t.Errorf("ZForCoverage(%v) = %v, want %v", tc.coverage, z, tc.z)
		}
		if c := Coverage(tc.z); !scalar.EqualWithinAbs(c, tc.coverage, 1e-6) {
			t.Errorf("Coverage(%v) = %v, want %v", tc.z, c, tc.coverage)
		}
	}
	// Standard normal table: P(|Z| < 2) = 0.9545 (to 4 places).
	if c := Coverage(2); !scalar.EqualWithinAbs(c, 0.9545, 5e-5) {
		t.Errorf("Coverage(2) = %v, want 0.9545", c)
	}
	for _, bad := range []float64{0, 1, -0.5, 1.5, math.NaN()} {
		if _, err := ZForCoverage(bad); err == nil {
			t.Errorf("ZForCoverage(%v): no error", bad)
		}
	}
}

// TestAICc checks the formula on a hand calculation:
// n = 20, SSE = 50, k = 2 -> K = 3,
// AIC = 20 ln(50/20) + 6 = 20 * 0.916291 + 6 = 24.325815,
// AICc = AIC + 2*3*4/(20-3-1) = 24.325815 + 1.5 = 25.825815.
func TestAICc(t *testing.T) {
	if got := AICc(50, 20, 2); !scalar.EqualWithinAbs(got, 25.825815, 1e-6) {
		t.Errorf("AICc = %v, want 25.825815", got)
	}
	if got := AICc(50, 4, 2); !math.IsInf(got, 1) {
		t.Errorf("AICc with n-K-1 <= 0 = %v, want +Inf", got)
	}
}

// TestBacktestNaive checks the rolling-origin backtest on a hand example:
// y = 1, 2, 4, 7, 11 with the naive method, 2 origins, leads up to 2.
// Training y[:3]; origin 3 forecasts 4 for leads 1 and 2 (actuals 7, 11):
// errors 3 and 7; origin 4 (states rolled to y[:4]) forecasts 7 for lead 1
// (actual 11): error 4. Lead-1 MSE = (9 + 16)/2 = 12.5, lead-2 MSE = 49;
// pooled MAD = (3 + 7 + 4)/3 = 14/3.
func TestBacktestNaive(t *testing.T) {
	y := []float64{1, 2, 4, 7, 11}
	bt, err := RunBacktest(y, Naive, Config{Season: 1}, 2, 2, false, DivisorN)
	if err != nil {
		t.Fatal(err)
	}
	if bt.Train != 3 || bt.Origins != 2 {
		t.Errorf("train %d origins %d, want 3 and 2", bt.Train, bt.Origins)
	}
	want := []float64{12.5, 49}
	for h, w := range want {
		if !scalar.EqualWithinAbs(bt.HorizonMSE[h], w, 1e-12) {
			t.Errorf("lead %d MSE %v, want %v", h+1, bt.HorizonMSE[h], w)
		}
	}
	if !scalar.EqualWithinAbs(bt.Accuracy.MAD, 14.0/3, 1e-12) || bt.Accuracy.N != 3 {
		t.Errorf("pooled MAD %v over %d errors, want 14/3 over 3", bt.Accuracy.MAD, bt.Accuracy.N)
	}
	// With refit the naive method gives the same numbers (nothing to fit).
	bt2, err := RunBacktest(y, Naive, Config{Season: 1}, 2, 2, true, DivisorN)
	if err != nil {
		t.Fatal(err)
	}
	if bt2.Accuracy.MAD != bt.Accuracy.MAD {
		t.Errorf("refit MAD %v, want %v", bt2.Accuracy.MAD, bt.Accuracy.MAD)
	}
}

// TestVarianceSources checks the band variance of each model source on
// the naive method, whose h-step variance factor is h (random walk;
// Hyndman & Athanasopoulos, FPP 3rd ed., table 5.2): analytic = MSE * h;
// flat = MSE. These are the bands of "from: model".
func TestVarianceSources(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	s := Series{Name: "a", Start: start, Values: []float64{10, 12, 11, 13, 12, 14, 13, 15, 14, 16}}
	r, err := Fit(s, Spec{Method: Naive, Config: Config{Season: 1}})
	if err != nil {
		t.Fatal(err)
	}
	// One-step errors 2, -1, 2, -1, 2, -1, 2, -1, 2: SSE = 5*4 + 4*1 = 24,
	// MSE = 24/(9-1) = 3 (divisor n-1).
	if !scalar.EqualWithinAbs(r.Accuracy.MSE, 3, 1e-12) {
		t.Fatalf("MSE %v, want 3", r.Accuracy.MSE)
	}
	v, src := r.VarianceFrom(3, Widening, FromModel)
	if src != VarAnalytic || !scalar.EqualWithinAbs(v[2], 9, 1e-12) {
		t.Errorf("widening: %v from %s, want 9 (3 * 3) from analytic", v[2], src)
	}
	v, src = r.VarianceFrom(3, Flat, FromModel)
	if src != VarFlat || v[2] != 3 {
		t.Errorf("flat: %v from %s, want 3", v[2], src)
	}
	pts := r.ForecastFrom(1, 2, Flat, FromModel)
	// Naive forecast 16, band 16 -/+ 2 sqrt(3) = 16 -/+ 3.464102.
	if p := pts[0]; p.Value != 16 || !scalar.EqualWithinAbs(p.Upper, 19.464102, 1e-6) || p.Period.String() != "2020-11" {
		t.Errorf("forecast point %+v", p)
	}
}

// TestAutoPicksTrend checks that auto selection prefers a trend method, or
// a combination of trend methods, on a straight line (every method without
// a trend lags it) and reports every candidate with one marked chosen.
func TestAutoPicksTrend(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	y := make([]float64, 40)
	for i := range y {
		y[i] = 100 + 5*float64(i) + float64(i%3) // a line with a small wiggle
	}
	r, err := Fit(Series{Name: "line", Start: start, Values: y}, Spec{Config: Config{Season: 1}})
	if err != nil {
		t.Fatal(err)
	}
	picked := []Model{r.Model}
	if r.Method == Combination {
		picked = Members(r.Model)
	}
	for _, md := range picked {
		switch md.Method() {
		case Holt, DampedHolt, LinearTrend:
		default:
			t.Errorf("auto chose %v (%s) on a line", r.Method, r.Model.Describe())
		}
	}
	chosen := 0
	for _, c := range r.Candidates {
		if c.Chosen {
			chosen++
			if c.Method != r.Method {
				t.Errorf("chosen candidate %v, result %v", c.Method, r.Method)
			}
		}
	}
	if chosen != 1 || !r.Auto {
		t.Errorf("%d chosen candidates, auto %v", chosen, r.Auto)
	}
}
