package forecast

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// fitMembers fits each method to y with cfg, failing the test on an error.
func fitMembers(t *testing.T, y []float64, cfg Config, ms ...Method) []Model {
	t.Helper()
	out := make([]Model, len(ms))
	for j, m := range ms {
		md, err := FitMethod(y, m, cfg)
		if err != nil {
			t.Fatal(err)
		}
		out[j] = md
	}
	return out
}

// closeTo reports whether got and want agree within tol, NaN matching NaN.
func closeTo(got, want, tol float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	return scalar.EqualWithinAbs(got, want, tol)
}

// TestCombinationByHand checks the combination's forecasts, fitted values,
// Extend and description on a series short enough to write out.
func TestCombinationByHand(t *testing.T) {
	y := []float64{10, 12, 11, 13, 12, 14}
	// Members, by hand (t = 1..6):
	//   naive: forecasts 14, 14; fitted[5] = y[4] = 12.
	//   moving-average, window 3: forecasts (13+12+14)/3 = 13;
	//     fitted[5] = (11+13+12)/3 = 12; fitted[2] = NaN (no full window).
	//   linear-trend (OLS): mean t 3.5, mean y 12, Sxy = 5+0+0.5+0.5+0+5 = 11,
	//     Sxx = 17.5, slope 11/17.5 = 0.628571; line 12 + 0.628571 (t - 3.5):
	//     t = 7: 14.2, t = 8: 14.828571, t = 6 (fitted[5]): 13.571429.
	// Mean: h = 1: (14 + 13 + 14.2)/3 = 13.733333;
	//       h = 2: (14 + 13 + 14.828571)/3 = 13.942857;
	//       fitted[5] = (12 + 12 + 13.571429)/3 = 12.523810.
	c := newCombination(fitMembers(t, y, Config{Season: 1}, Naive, MovingAverage, LinearTrend))
	f := c.Forecast(2)
	for i, want := range []float64{13.733333, 13.942857} {
		if !closeTo(f[i], want, 1e-6) {
			t.Errorf("forecast %d = %v, want %v", i+1, f[i], want)
		}
	}
	fit := c.Fitted()
	if !closeTo(fit[5], 12.523810, 1e-6) || !math.IsNaN(fit[2]) {
		t.Errorf("fitted[5] = %v (want 12.523810), fitted[2] = %v (want NaN)", fit[5], fit[2])
	}
	// Extend over y plus 15, parameters held: naive 15, moving average
	// (12+14+15)/3 = 13.666667, the line at t = 8: 14.828571; mean
	// 43.495238/3 = 14.498413.
	ext := c.Extend(append(append([]float64(nil), y...), 15))
	if got := ext.Forecast(1)[0]; !closeTo(got, 14.498413, 1e-6) {
		t.Errorf("extended forecast = %v, want 14.498413", got)
	}
	if got := c.Forecast(1)[0]; !closeTo(got, 13.733333, 1e-6) {
		t.Errorf("Extend changed the receiver: forecast %v", got)
	}
	// Two regression coefficients; the naive method and the fixed window
	// estimate nothing.
	if d, k := c.Describe(), c.NumParams(); d != "mean of naive, moving-average, linear-trend" || k != 2 {
		t.Errorf("Describe %q, NumParams %d", d, k)
	}
	if _, ok := c.VarianceFactors(3); ok {
		t.Error("a combination has no analytic variance")
	}
	if p := c.Params(); !math.IsNaN(p.Alpha) || c.Method() != Combination || len(Members(c)) != 3 || Members(c.members[0]) != nil {
		t.Errorf("Params %+v, Method %v, Members %d", p, c.Method(), len(Members(c)))
	}
}

// TestCombineBacktestsByHand builds a combination's backtest from its
// members' backtests and checks every number against a hand calculation,
// then checks that Fit with Combination reports the same backtest.
func TestCombineBacktestsByHand(t *testing.T) {
	y := []float64{10, 12, 11, 13, 12, 14, 13, 15}
	cfg := Config{Season: 1}
	// Holdout 3: training window y[:5], origins 5, 6, 7, leads up to 2.
	//   naive:        o=5 [12 12], o=6 [14 14], o=7 [13]
	//   moving avg 3: o=5 [(11+13+12)/3 = 12, 12], o=6 [(13+12+14)/3 = 13, 13], o=7 [(12+14+13)/3 = 13]
	//   mean:         o=5 [12 12], o=6 [13.5 13.5], o=7 [13]
	// Actuals y[5..7] = 14, 13, 15; errors:
	//   o=5 [14-12 = 2, 13-12 = 1], o=6 [13-13.5 = -0.5, 15-13.5 = 1.5], o=7 [15-13 = 2]
	wantF := [][]float64{{12, 12}, {13.5, 13.5}, {13}}
	wantE := [][]float64{{2, 1}, {-0.5, 1.5}, {2}}
	var members []*Backtest
	for _, m := range []Method{Naive, MovingAverage} {
		bt, err := RunBacktest(y, m, cfg, 3, 2, false, DivisorNMinus1)
		if err != nil {
			t.Fatal(err)
		}
		members = append(members, bt)
	}
	check := func(name string, bt *Backtest) {
		t.Helper()
		if bt.Train != 5 || bt.Origins != 3 || len(bt.Forecasts) != 3 {
			t.Fatalf("%s: train %d, origins %d, %d forecast rows", name, bt.Train, bt.Origins, len(bt.Forecasts))
		}
		for i := range wantF {
			for k := range wantF[i] {
				if !closeTo(bt.Forecasts[i][k], wantF[i][k], 1e-12) || !closeTo(bt.Errors[i][k], wantE[i][k], 1e-12) {
					t.Errorf("%s: origin %d lead %d: forecast %v error %v, want %v and %v",
						name, i, k+1, bt.Forecasts[i][k], bt.Errors[i][k], wantF[i][k], wantE[i][k])
				}
			}
		}
		a := bt.Accuracy
		for _, c := range []struct {
			what      string
			got, want float64
		}{
			{"lead-1 MSE", bt.HorizonMSE[0], (4 + 0.25 + 4) / 3.0}, // 2.75 over 3 errors
			{"lead-2 MSE", bt.HorizonMSE[1], (1 + 2.25) / 2.0},     // 1.625 over 2 errors
			{"MAD", a.MAD, 7 / 5.0},                                // |2|+|1|+|-0.5|+|1.5|+|2| = 7
			{"bias", a.Bias, 6 / 5.0},                              // 2+1-0.5+1.5+2 = 6
			{"MSE", a.MSE, 11.5 / 4},                               // 4+1+0.25+2.25+4 = 11.5, over n-1
			// MASE scale: naive MAD of y[:5], (2+1+2+1)/4 = 1.5; 1.4/1.5.
			{"MASE", a.MASE, 1.4 / 1.5},
			{"one-step bias", bt.Bias.Mean, (2 - 0.5 + 2) / 3.0},
		} {
			if !closeTo(c.got, c.want, 1e-12) {
				t.Errorf("%s: %s = %v, want %v", name, c.what, c.got, c.want)
			}
		}
		if bt.HorizonCount[0] != 3 || bt.HorizonCount[1] != 2 || a.N != 5 || !math.IsNaN(a.TrackingSignal) {
			t.Errorf("%s: counts %v, N %d, tracking signal %v", name, bt.HorizonCount, a.N, a.TrackingSignal)
		}
	}
	check("combineBacktests", combineBacktests(y, members, 1, DivisorNMinus1))

	start, _ := ParsePeriod("2020-01", Monthly)
	r, err := Fit(Series{Name: "s", Start: start, Values: y},
		Spec{Method: Combination, Config: cfg, Holdout: 3, Horizon: 2, Candidates: []Method{Naive, MovingAverage}})
	if err != nil {
		t.Fatal(err)
	}
	check("Fit", r.Backtest)
	if r.Auto || r.Method != Combination || r.Model.Describe() != "mean of naive, moving-average" && r.Model.Describe() != "mean of moving-average, naive" {
		t.Errorf("Fit: auto %v, method %v, %q", r.Auto, r.Method, r.Model.Describe())
	}
	// The final fit averages the members fitted on all of y: naive 15,
	// moving average (14+13+15)/3 = 14; mean 14.5.
	if f := r.Model.Forecast(1)[0]; !closeTo(f, 14.5, 1e-12) {
		t.Errorf("Fit: forecast %v, want 14.5", f)
	}
	if _, src := r.VarianceFrom(3, Widening, FromModel); src != VarBacktest {
		t.Errorf("Fit: model variance from %s, want the backtest", src)
	}
	if _, src := r.Variance(3, Widening); src != VarCalibrated {
		t.Errorf("Fit: variance from %s, want calibrated", src)
	}
}

// noisySeries returns n seeded values around a level with a little trend.
func noisySeries(n int, seed uint64) []float64 {
	rng := rand.New(rand.NewPCG(seed, 3))
	y := make([]float64, n)
	for i := range y {
		y[i] = 100 + 0.3*float64(i) + 8*math.Sin(2*math.Pi*float64(i)/12) + 5*rng.NormFloat64()
	}
	return y
}

// TestSelectionHoldout checks the widening rule against the formula on
// selectionHoldout, case by case.
func TestSelectionHoldout(t *testing.T) {
	for _, tc := range []struct {
		n, season, maxH, want int
	}{
		{120, 12, 12, 24},  // default 120/5 = 24 >= 12+12-1 = 23
		{60, 12, 12, 23},   // default 12 < 23; limit min(30, 60-24) = 30
		{48, 12, 12, 23},   // default 9; limit min(24, 24) = 24
		{36, 12, 12, 12},   // default 7; limit min(18, 36-24) = 12
		{28, 12, 12, 5},    // default 5; limit min(14, 4) = 4: not widened
		{20, 4, 4, 7},      // quarterly: default 4 < 4+4-1 = 7; limit min(10, 12)
		{40, 1, 1, 8},      // no season: 1+1-1 = 1 error asked, default 8 kept
		{40, 1, 12, 12},    // no season, 12 leads: 12 origins, limit 20
		{400, 52, 52, 103}, // weekly: default 36 < 52+52-1 = 103; limit min(200, 296)
	} {
		if got := selectionHoldout(tc.n, tc.season, tc.maxH); got != tc.want {
			t.Errorf("selectionHoldout(%d, %d, %d) = %d, want %d", tc.n, tc.season, tc.maxH, got, tc.want)
		}
	}
}

// TestSeasonalNeedsTwoSeasons checks that auto skips the seasonal methods,
// with the reason, when the first training window holds fewer than two
// full seasons, and that linear-trend then has no seasonal dummies.
func TestSeasonalNeedsTwoSeasons(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	for _, tc := range []struct {
		n        int
		seasonal bool
	}{
		{28, false}, // holdout 5 (see TestSelectionHoldout): 23 points < 24
		{36, true},  // holdout 12: 24 points, two seasons
	} {
		r, err := Fit(Series{Name: "s", Start: start, Values: noisySeries(tc.n, 1)}, Spec{})
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range r.Candidates {
			skipped := strings.Contains(c.Skipped, "needs two full seasons")
			if isSeasonal(c.Method) && skipped == tc.seasonal {
				t.Errorf("n %d: %s skipped %q", tc.n, c.Method, c.Skipped)
			}
			if c.Method == LinearTrend && strings.Contains(c.Describe, "dummies") != tc.seasonal {
				t.Errorf("n %d: linear-trend %q", tc.n, c.Describe)
			}
		}
	}
}

// TestFewErrorsPenalty checks the factor against its formula and that auto
// picks the lowest penalised score.
func TestFewErrorsPenalty(t *testing.T) {
	single := &Backtest{Model: &naiveModel{}}
	combo := &Backtest{Model: &combinationModel{}}
	for _, tc := range []struct {
		bt      *Backtest
		origins int
		want    float64
	}{
		{single, 12, 1.2},             // 1 + 0.1 (36/12 - 1)
		{single, 8, 1.35},             // 1 + 0.1 (36/8 - 1)
		{single, 36, 1},               // full weight
		{single, 40, 1},               // full weight
		{combo, 8, 1},                 // the combination is not penalised
		{single, 23, 1 + 0.1*13/23.0}, // 1 + 0.1 (36/23 - 1)
	} {
		tc.bt.Origins = tc.origins
		if got := fewErrorsPenalty(tc.bt); !closeTo(got, tc.want, 1e-12) {
			t.Errorf("%v, %d origins: %v, want %v", tc.bt.Model.Method(), tc.origins, got, tc.want)
		}
	}
	start, _ := ParsePeriod("2020-01", Monthly)
	for seed := uint64(1); seed <= 6; seed++ {
		r, err := Fit(Series{Name: "s", Start: start, Values: noisySeries(40, seed)}, Spec{})
		if err != nil {
			t.Fatal(err)
		}
		best, bestScore := Method(-1), math.Inf(1)
		for _, c := range r.Candidates {
			if c.Backtest == nil {
				continue
			}
			s := c.Backtest.MAD
			if c.Method != Combination {
				s *= FewOriginsFactor(r.Backtest.Origins)
			}
			if s < bestScore {
				best, bestScore = c.Method, s
			}
		}
		if best != r.Method {
			t.Errorf("seed %d: chose %v, lowest penalised MAD is %v", seed, r.Method, best)
		}
	}
}

// TestTiesGoToSimplerMethod checks that a combination that only equals the
// best single method does not win: moving-average with window 1 is the
// naive method, and so is their mean; with 36 origins nothing is
// penalised, so the three tie and naive, first in Method order, wins.
func TestTiesGoToSimplerMethod(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	r, err := Fit(Series{Name: "s", Start: start, Values: noisySeries(80, 2)},
		Spec{Config: Config{Season: 1, Window: 1}, Holdout: 36, Candidates: []Method{MovingAverage, Naive}})
	if err != nil {
		t.Fatal(err)
	}
	if r.Method != Naive || len(r.Candidates) != 3 || r.Candidates[2].Method != Combination {
		t.Fatalf("chose %v from %d candidates", r.Method, len(r.Candidates))
	}
	if a, b := r.Candidates[1].Backtest.MAD, r.Candidates[2].Backtest.MAD; a != b {
		t.Errorf("naive MAD %v, combination MAD %v: not a tie", a, b)
	}
}

// TestWinnerBacktestReused checks that auto reports the winning
// candidate's backtest rather than running it again.
func TestWinnerBacktestReused(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	r, err := Fit(Series{Name: "s", Start: start, Values: noisySeries(72, 4)}, Spec{})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range r.Candidates {
		if c.Chosen && c.bt != r.Backtest {
			t.Errorf("%v: the result's backtest is not the candidate's", c.Method)
		}
	}
	if r.Backtest == nil || len(r.Backtest.Errors) != r.Backtest.Origins {
		t.Errorf("backtest %+v", r.Backtest)
	}
}

// TestMethodRoundTrip checks that every method name parses back to its
// method, the combination included.
func TestMethodRoundTrip(t *testing.T) {
	for m := Naive; m <= Auto; m++ {
		got, err := ParseMethod(m.String())
		if err != nil || got != m {
			t.Errorf("%v: ParseMethod(%q) = %v, %v", int(m), m.String(), got, err)
		}
	}
	if m, err := ParseMethod(" Combination "); err != nil || m != Combination || m.String() != "combination" {
		t.Errorf("ParseMethod(combination) = %v, %v", m, err)
	}
}

// TestCombinationShockForm checks the combination's response form: the
// least common multiple of the members' seasons and the damping of its
// trend members, and that the response is the mean of the members'.
func TestCombinationShockForm(t *testing.T) {
	y := noisySeries(48, 5)
	hw := fitMembers(t, y, Config{Season: 12}, HoltWintersAdditive, Naive, SeasonalNaive)
	c := newCombination(hw)
	if m, phi, ok := ShockForm(c); m != 12 || phi != 1 || !ok {
		t.Errorf("ShockForm = %d, %v, %v; want 12, 1, true", m, phi, ok)
	}
	// The response: psi_j = change of forecast j when the next value is one
	// unit above its forecast, read off two runs of the model (as
	// scenario.ImpulseWeights does).
	psi := func(md Model, h int) []float64 {
		z := append(append([]float64(nil), y...), md.Forecast(1)[0])
		f0 := md.Extend(z).Forecast(h)
		z[len(y)]++
		f1 := md.Extend(z).Forecast(h)
		out := make([]float64, h)
		for j := range out {
			out[j] = f1[j] - f0[j]
		}
		return out
	}
	const h = 36
	got := psi(c, h)
	for j := range got {
		want := 0.0
		for _, md := range hw {
			want += psi(md, h)[j] / 3
		}
		if !closeTo(got[j], want, 1e-9) {
			t.Errorf("psi_%d = %v, want the members' mean %v", j+1, got[j], want)
		}
	}
	// With phi = 1 the form is affine in j within a residue class.
	for r := 1; r <= 12; r++ {
		if d := got[r-1+24] - 2*got[r-1+12] + got[r-1]; math.Abs(d) > 1e-9 {
			t.Errorf("class %d: second difference %v, want 0", r%12, d)
		}
	}
	damped := fitMembers(t, y, Config{Season: 12, Fixed: Fixed{Phi: ptr(0.9)}}, DampedHolt)[0]
	if _, _, ok := ShockForm(newCombination([]Model{damped, hw[0]})); ok {
		t.Error("trend members damped 0.9 and 1 share no form")
	}
	if m, phi, ok := ShockForm(newCombination([]Model{damped, hw[1]})); m != 1 || phi != 0.9 || !ok {
		t.Errorf("damped-holt with naive: %d, %v, %v; want 1, 0.9, true", m, phi, ok)
	}
}

func ptr(v float64) *float64 { return &v }

// TestInterventionsKeepMembers checks that cleaning past events keeps the
// members of the combination chosen in the first round: later rounds
// refit those only.
func TestInterventionsKeepMembers(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	y := noisySeries(60, 6)
	pulse := make([]float64, len(y))
	pulse[30] = 1
	y[30] += 40
	r, err := FitInterventions(Series{Name: "s", Start: start, Values: y}, Spec{Method: Combination},
		[]Intervention{{Name: "pulse", Shape: pulse}}, 0)
	if err != nil {
		t.Fatal(err)
	}
	var want []Method
	for _, c := range r.Fit.Candidates {
		if c.Chosen {
			want = c.Members
		}
	}
	got := Members(r.Fit.Model)
	if len(got) != len(want) || len(want) != CombineK {
		t.Fatalf("members %d, chosen candidate's %v", len(got), want)
	}
	// The same set; their order (best first) may change as the event
	// comes out.
	for _, m := range want {
		found := false
		for _, md := range got {
			found = found || md.Method() == m
		}
		if !found {
			t.Errorf("the first round chose %v, the final fit has %s", m, r.Fit.Model.Describe())
		}
	}
	// The pulse of 40 comes out within a few standard errors.
	if e, se := r.Effect[0], r.StdErr[0]; math.Abs(e-40) > 4*se {
		t.Errorf("effect %v +- %v, want about 40", e, se)
	}
}
