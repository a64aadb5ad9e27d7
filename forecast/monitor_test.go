package forecast

import (
	"errors"
	"math"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// trackWant is the expected content of one TrackPoint.
type trackWant struct {
	cum, mad, ts, sigmas float64
	rules                []Rule
	verdict              Verdict
}

func checkTrack(t *testing.T, name string, got []TrackPoint, want []trackWant, tol float64) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %d points, want %d", name, len(got), len(want))
	}
	for i, w := range want {
		g := got[i]
		for _, c := range []struct {
			field     string
			got, want float64
		}{
			{"CumError", g.CumError, w.cum},
			{"MAD", g.MAD, w.mad},
			{"TrackingSignal", g.TrackingSignal, w.ts},
			{"Sigmas", g.Sigmas, w.sigmas},
		} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, tol, tol) {
				t.Errorf("%s: period %d: %s = %v, want %v", name, i+1, c.field, c.got, c.want)
			}
		}
		if !slices.Equal(g.Rules, w.rules) {
			t.Errorf("%s: period %d: rules %v, want %v", name, i+1, g.Rules, w.rules)
		}
		if g.Verdict != w.verdict {
			t.Errorf("%s: period %d: verdict %v, want %v", name, i+1, g.Verdict, w.verdict)
		}
	}
}

// The worked example: a plan of 100 a period and actuals giving errors
// 5, 12, 8, 15, 10, 20, 20, with MAD_0 = 10, MSE = 100 (sigma 10) and the
// default smoothing 0.1.
var (
	exActual = []float64{105, 112, 108, 115, 110, 120, 120}
	exPlan   = []float64{100, 100, 100, 100, 100, 100, 100}
)

func TestTrackCumulative(t *testing.T) {
	got, err := Track(exActual, exPlan, TrackConfig{InitialMAD: 10, MSE: 100})
	if err != nil {
		t.Fatal(err)
	}
	// By hand, MAD_t = 0.1|e_t| + 0.9 MAD_{t-1}, C_t = C_{t-1} + e_t,
	// TS_t = C_t/MAD_t, z_t = e_t/10; limit 4 (common practice):
	// t=1: e=5   MAD = 0.5 + 9        = 9.5        C=5   TS = 0.526316
	// t=2: e=12  MAD = 1.2 + 8.55     = 9.75       C=17  TS = 1.743590
	// t=3: e=8   MAD = 0.8 + 8.775    = 9.575      C=25  TS = 2.610966
	// t=4: e=15  MAD = 1.5 + 8.6175   = 10.1175    C=40  TS = 3.953546
	// t=5: e=10  MAD = 1.0 + 9.10575  = 10.10575   C=50  TS = 4.947678 > 4
	// t=6: e=20  MAD = 2.0 + 9.095175 = 11.095175  C=70  TS = 6.309052 > 4
	// t=7: e=20  MAD = 2.0 + 9.9856575= 11.9856575 C=90  TS = 7.508976 > 4
	// z = 0.5, 1.2, 0.8, 1.5, 1.0, 2.0, 2.0: never beyond 2 (strict), and
	// at most three of any five beyond 1, so no run rule fires.
	ts := []Rule{RuleTrackingSignal}
	want := []trackWant{
		{5, 9.5, 5 / 9.5, 0.5, nil, InControl},
		{17, 9.75, 17 / 9.75, 1.2, nil, InControl},
		{25, 9.575, 25 / 9.575, 0.8, nil, InControl},
		{40, 10.1175, 40 / 10.1175, 1.5, nil, InControl},
		{50, 10.10575, 50 / 10.10575, 1.0, ts, Bias},
		{70, 11.095175, 70 / 11.095175, 2.0, ts, Bias},
		{90, 11.9856575, 90 / 11.9856575, 2.0, ts, Bias},
	}
	checkTrack(t, "cumulative", got, want, 1e-12)
	for i, p := range got {
		if p.Actual != exActual[i] || p.Plan != exPlan[i] || p.Error != exActual[i]-exPlan[i] {
			t.Errorf("period %d: actual, plan, error = %v, %v, %v", i+1, p.Actual, p.Plan, p.Error)
		}
	}
}

func TestTrackSmoothed(t *testing.T) {
	got, err := Track(exActual, exPlan, TrackConfig{InitialMAD: 10, MSE: 100, Signal: SignalSmoothed})
	if err != nil {
		t.Fatal(err)
	}
	// MAD as in TestTrackCumulative; E_t = 0.1 e_t + 0.9 E_{t-1}, by hand:
	// t=1: E = 0.5                        T = 0.5/9.5          = 0.052632
	// t=2: E = 1.2 + 0.45     = 1.65      T = 1.65/9.75        = 0.169231
	// t=3: E = 0.8 + 1.485    = 2.285     T = 2.285/9.575      = 0.238642
	// t=4: E = 1.5 + 2.0565   = 3.5565    T = 3.5565/10.1175   = 0.351520
	// t=5: E = 1.0 + 3.20085  = 4.20085   T = 4.20085/10.10575 = 0.415689
	// t=6: E = 2.0 + 3.780765 = 5.780765  T = 5.780765/11.095175 = 0.521017
	// t=7: E = 2.0 + 5.2026885= 7.2026885 T = 7.2026885/11.9856575 = 0.600948
	// The default limit is TriggLimit(0.1, 0.95) = 0.5383 (table), so only
	// period 7 is beyond it.
	ts := []Rule{RuleTrackingSignal}
	want := []trackWant{
		{5, 9.5, 0.5 / 9.5, 0.5, nil, InControl},
		{17, 9.75, 1.65 / 9.75, 1.2, nil, InControl},
		{25, 9.575, 2.285 / 9.575, 0.8, nil, InControl},
		{40, 10.1175, 3.5565 / 10.1175, 1.5, nil, InControl},
		{50, 10.10575, 4.20085 / 10.10575, 1.0, nil, InControl},
		{70, 11.095175, 5.780765 / 11.095175, 2.0, nil, InControl},
		{90, 11.9856575, 7.2026885 / 11.9856575, 2.0, ts, Bias},
	}
	checkTrack(t, "smoothed", got, want, 1e-12)
	// TriggSignal gives the same signal.
	e := make([]float64, len(exActual))
	for i := range e {
		e[i] = exActual[i] - exPlan[i]
	}
	for i, v := range TriggSignal(e, 0.1, 10) {
		if !scalar.EqualWithinAbsOrRel(got[i].TrackingSignal, v, 1e-12, 1e-12) {
			t.Errorf("period %d: Track %v, TriggSignal %v", i+1, got[i].TrackingSignal, v)
		}
	}
}

func TestTrackVerdicts(t *testing.T) {
	plan := []float64{0, 0, 0}
	for _, tc := range []struct {
		name   string
		actual []float64
		cfg    TrackConfig
		want   []trackWant
		tol    float64
	}{
		{
			name:   "outlier alone",
			actual: []float64{0, 35, 0},
			cfg:    TrackConfig{InitialMAD: 10, MSE: 100},
			// t=1: e=0   MAD = 9              C=0   TS = 0
			// t=2: e=35  MAD = 3.5 + 8.1 = 11.6  C=35  TS = 3.017241 (< 4)
			//      z = 3.5 > 3: rule 1 only, so outlier.
			// t=3: e=0   MAD = 10.44           C=35  TS = 3.352490
			want: []trackWant{
				{0, 9, 0, 0, nil, InControl},
				{35, 11.6, 35 / 11.6, 3.5, []Rule{RuleBeyondLimit}, Outlier},
				{35, 10.44, 35 / 10.44, 0, nil, InControl},
			},
			tol: 1e-12,
		},
		{
			name:   "signal carried past its limit by the outlier",
			actual: []float64{20, 15, 35},
			cfg:    TrackConfig{InitialMAD: 10, MSE: 100},
			// t=1: e=20  MAD = 2 + 9 = 11           C=20  TS = 1.818182
			//      z = 2.0, not beyond 2 (strict).
			// t=2: e=15  MAD = 1.5 + 9.9 = 11.4     C=35  TS = 3.070175
			// t=3: e=35  MAD = 3.5 + 10.26 = 13.76  C=70  TS = 5.087209 > 4
			//      z = 3.5 > 3: rule 1; window 2.0, 1.5, 3.5 has one point
			//      beyond 2 and three beyond 1: no run rule. Without
			//      period 3 the signal is that of t=2, 3.070175 < 4: the
			//      outlier alone carries it past 4, so outlier.
			want: []trackWant{
				{20, 11, 20.0 / 11, 2, nil, InControl},
				{35, 11.4, 35 / 11.4, 1.5, nil, InControl},
				{70, 13.76, 70 / 13.76, 3.5, []Rule{RuleBeyondLimit, RuleTrackingSignal}, Outlier},
			},
			tol: 1e-12,
		},
		{
			name:   "bias wins over outlier: run rule",
			actual: []float64{32, 31, 0},
			cfg:    TrackConfig{InitialMAD: 10, MSE: 100, TSLimit: 6},
			// t=1: e=32  MAD = 3.2 + 9 = 12.2        C=32  TS = 2.622951
			//      z = 3.2 > 3: rule 1 alone, outlier.
			// t=2: e=31  MAD = 3.1 + 10.98 = 14.08   C=63  TS = 4.474432 (< 6)
			//      z = 3.1: rule 1, and 3.2, 3.1 are two beyond 2: rule 2.
			//      Bias, listing both.
			// t=3: e=0   MAD = 12.672                C=63  TS = 4.971591
			want: []trackWant{
				{32, 12.2, 32 / 12.2, 3.2, []Rule{RuleBeyondLimit}, Outlier},
				{63, 14.08, 63 / 14.08, 3.1, []Rule{RuleBeyondLimit, RuleTwoOfThree}, Bias},
				{63, 12.672, 63 / 12.672, 0, nil, InControl},
			},
			tol: 1e-12,
		},
		{
			name:   "negative errors and z 2",
			actual: []float64{-25, 0, 0},
			cfg:    TrackConfig{InitialMAD: 10, MSE: 100, Z: 2, MADSmoothing: 0.2},
			// t=1: e=-25  MAD = 5 + 8 = 13       C=-25  TS = -1.923077
			//      z = -2.5 beyond -2: rule 1 with the chart at 2 sigma.
			// t=2: e=0    MAD = 10.4             TS = -2.403846
			// t=3: e=0    MAD = 8.32             TS = -3.004808
			want: []trackWant{
				{-25, 13, -25.0 / 13, -2.5, []Rule{RuleBeyondLimit}, Outlier},
				{-25, 10.4, -25 / 10.4, 0, nil, InControl},
				{-25, 8.32, -25 / 8.32, 0, nil, InControl},
			},
			tol: 1e-12,
		},
	} {
		got, err := Track(tc.actual, plan, tc.cfg)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		checkTrack(t, tc.name, got, tc.want, tc.tol)
	}
}

// TestTrackOutlierIsNotBias checks the rule that a tracking signal pushed
// past its limit by errors beyond the control limits is an outlier, not a
// bias, while a steady drift stays a bias. Every sequence is tracked
// against a plan of 0 with MAD_0 = 8, MSE = 100 (sigma 10, limits +-30)
// and a = 0.1; TS' is the signal without the periods beyond the limits.
// By hand, MAD_t = 0.1|e_t| + 0.9 MAD_{t-1} and the same for MAD' over
// the periods left in.
func TestTrackOutlierIsNotBias(t *testing.T) {
	ts := []Rule{RuleTrackingSignal}
	both := []Rule{RuleBeyondLimit, RuleTrackingSignal}
	type point struct {
		ts, clean float64
		rules     []Rule
		verdict   Verdict
	}
	for _, tc := range []struct {
		name   string
		errors []float64
		cfg    TrackConfig
		want   []point
	}{
		{
			name:   "one spike",
			errors: []float64{2, -3, 60, 1, -2},
			cfg:    TrackConfig{InitialMAD: 8, MSE: 100},
			// t=1: MAD = 0.2 + 7.2 = 7.4           C=2   TS = 2/7.4
			// t=2: MAD = 0.3 + 6.66 = 6.96         C=-1  TS = -1/6.96
			// t=3: MAD = 6 + 6.264 = 12.264        C=59  TS = 4.810828 > 4
			//      z = 6 > 3: left out; MAD' = 6.96, C' = -1, TS' = -0.143678
			// t=4: MAD = 0.1 + 11.0376 = 11.1376   C=60  TS = 5.387158 > 4
			//      MAD' = 0.1 + 6.264 = 6.364, C' = 0, TS' = 0
			// t=5: MAD = 0.2 + 10.02384 = 10.22384 C=58  TS = 5.673015 > 4
			//      MAD' = 0.2 + 5.7276 = 5.9276, C' = -2, TS' = -0.337404
			// No run rule: z = 0.2, -0.3, 6, 0.1, -0.2 has one point beyond 1.
			// Before this rule periods 3 to 5 were judged bias.
			want: []point{
				{2 / 7.4, 2 / 7.4, nil, InControl},
				{-1 / 6.96, -1 / 6.96, nil, InControl},
				{59 / 12.264, -1 / 6.96, both, Outlier},
				{60 / 11.1376, 0, ts, Outlier},
				{58 / 10.22384, -2 / 5.9276, ts, Outlier},
			},
		},
		{
			name:   "steady drift, then a point beyond the limits",
			errors: []float64{6, 7, 8, 9, 10, 35},
			cfg:    TrackConfig{InitialMAD: 8, MSE: 100},
			// t=1: MAD = 0.6 + 7.2 = 7.8           C=6   TS = 0.769231
			// t=2: MAD = 0.7 + 7.02 = 7.72         C=13  TS = 1.683938
			// t=3: MAD = 0.8 + 6.948 = 7.748       C=21  TS = 2.710377
			// t=4: MAD = 0.9 + 6.9732 = 7.8732     C=30  TS = 3.810395
			// t=5: MAD = 1.0 + 7.08588 = 8.08588   C=40  TS = 4.946890 > 4
			//      no point beyond the limits: TS' = TS, bias.
			// t=6: MAD = 3.5 + 7.277292 = 10.777292 C=75 TS = 6.959093 > 4
			//      z = 3.5 > 3: left out; TS' = 40/8.08588 = 4.946890 > 4:
			//      the drift carries the signal, so bias. Rules 2 and 3 do
			//      not fire (z = 0.7 .. 1.0 and 3.5: one point beyond 2 and
			//      one beyond 1 in their windows).
			want: []point{
				{6 / 7.8, 6 / 7.8, nil, InControl},
				{13 / 7.72, 13 / 7.72, nil, InControl},
				{21 / 7.748, 21 / 7.748, nil, InControl},
				{30 / 7.8732, 30 / 7.8732, nil, InControl},
				{40 / 8.08588, 40 / 8.08588, ts, Bias},
				{75 / 10.777292, 40 / 8.08588, both, Bias},
			},
		},
		{
			name:   "two spikes, both left out",
			errors: []float64{50, 1, -1, 2, 45, -1},
			cfg:    TrackConfig{InitialMAD: 8, MSE: 100},
			// t=1: MAD = 5 + 7.2 = 12.2            C=50  TS = 4.098361 > 4
			//      z = 5: left out, nothing left in: TS' = 0
			// t=2: MAD = 0.1 + 10.98 = 11.08       C=51  TS = 4.602888
			//      MAD' = 0.1 + 7.2 = 7.3, C' = 1, TS' = 0.136986
			// t=3: MAD = 0.1 + 9.972 = 10.072      C=50  TS = 4.964257
			//      MAD' = 0.1 + 6.57 = 6.67, C' = 0, TS' = 0
			// t=4: MAD = 0.2 + 9.0648 = 9.2648     C=52  TS = 5.612641
			//      MAD' = 0.2 + 6.003 = 6.203, C' = 2, TS' = 0.322425
			// t=5: MAD = 4.5 + 8.33832 = 12.83832  C=97  TS = 7.555508
			//      z = 4.5: left out; TS' stays 2/6.203. Rule 2: the window
			//      -0.1, 0.2, 4.5 has one point beyond 2, no.
			// t=6: MAD = 0.1 + 11.554488 = 11.654488 C=96 TS = 8.237170
			//      MAD' = 0.1 + 5.5827 = 5.6827, C' = 1, TS' = 0.175973
			want: []point{
				{50 / 12.2, 0, both, Outlier},
				{51 / 11.08, 1 / 7.3, ts, Outlier},
				{50 / 10.072, 0, ts, Outlier},
				{52 / 9.2648, 2 / 6.203, ts, Outlier},
				{97 / 12.83832, 2 / 6.203, both, Outlier},
				{96 / 11.654488, 1 / 5.6827, ts, Outlier},
			},
		},
		{
			name:   "one spike, smoothed signal",
			errors: []float64{2, -3, 100, 1},
			// The limit 0.538 is TriggLimit(0.1, 0.95), given here so that
			// the case does not depend on the table.
			cfg: TrackConfig{InitialMAD: 8, MSE: 100, Signal: SignalSmoothed, TSLimit: 0.538},
			// E_t = 0.1 e_t + 0.9 E_{t-1}, T = E/MAD:
			// t=1: E = 0.2, MAD = 7.4                        T = 0.027027
			// t=2: E = -0.3 + 0.18 = -0.12, MAD = 6.96       T = -0.017241
			// t=3: E = 10 - 0.108 = 9.892, MAD = 10 + 6.264 = 16.264
			//      T = 0.608214 > 0.538; z = 10: left out, T' = -0.12/6.96
			// t=4: E = 0.1 + 8.9028 = 9.0028, MAD = 0.1 + 14.6376 = 14.7376
			//      T = 0.610873 > 0.538; E' = 0.1 - 0.108 = -0.008,
			//      MAD' = 0.1 + 6.264 = 6.364, T' = -0.001257
			want: []point{
				{0.2 / 7.4, 0.2 / 7.4, nil, InControl},
				{-0.12 / 6.96, -0.12 / 6.96, nil, InControl},
				{9.892 / 16.264, -0.12 / 6.96, both, Outlier},
				{9.0028 / 14.7376, -0.008 / 6.364, ts, Outlier},
			},
		},
	} {
		plan := make([]float64, len(tc.errors))
		got, err := Track(tc.errors, plan, tc.cfg)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		for i, w := range tc.want {
			g := got[i]
			const tol = 1e-12
			if !scalar.EqualWithinAbsOrRel(g.TrackingSignal, w.ts, tol, tol) ||
				!scalar.EqualWithinAbsOrRel(g.SignalWithoutOutliers, w.clean, tol, tol) {
				t.Errorf("%s: period %d: TS %v, TS' %v; want %v, %v", tc.name, i+1, g.TrackingSignal, g.SignalWithoutOutliers, w.ts, w.clean)
			}
			if !slices.Equal(g.Rules, w.rules) || g.Verdict != w.verdict {
				t.Errorf("%s: period %d: rules %v verdict %v; want %v %v", tc.name, i+1, g.Rules, g.Verdict, w.rules, w.verdict)
			}
		}
	}
}

func TestTrackErrors(t *testing.T) {
	ok := TrackConfig{InitialMAD: 10, MSE: 100}
	for _, tc := range []struct {
		name         string
		actual, plan []float64
		cfg          TrackConfig
		want         error
	}{
		{"lengths differ", []float64{1, 2}, []float64{1}, ok, ErrLengthMismatch},
		{"NaN actual", []float64{1, math.NaN()}, []float64{1, 2}, ok, ErrEmptyCell},
		{"infinite plan", []float64{1, 2}, []float64{math.Inf(1), 2}, ok, ErrEmptyCell},
		{"MAD zero", []float64{1}, []float64{1}, TrackConfig{MSE: 100}, ErrBadSetting},
		{"MSE negative", []float64{1}, []float64{1}, TrackConfig{InitialMAD: 10, MSE: -1}, ErrBadSetting},
		{"MSE NaN", []float64{1}, []float64{1}, TrackConfig{InitialMAD: 10, MSE: math.NaN()}, ErrBadSetting},
	} {
		_, err := Track(tc.actual, tc.plan, tc.cfg)
		if !errors.Is(err, tc.want) {
			t.Errorf("%s: error %v, want %v", tc.name, err, tc.want)
		}
	}
	got, err := Track(nil, nil, ok)
	if err != nil || len(got) != 0 {
		t.Errorf("empty input: %v, %v; want no points and no error", got, err)
	}
}

func TestTrackConfigResolved(t *testing.T) {
	base := TrackConfig{InitialMAD: 10, MSE: 100}
	trigg10, _ := TriggLimit(0.1, 0.95)
	for _, tc := range []struct {
		name    string
		cfg     TrackConfig
		want    TrackConfig
		wantErr bool
	}{
		{
			name: "cumulative defaults",
			cfg:  base,
			// Defaults: smoothing 0.1, limit 4, z 3 (common practice).
			want: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 0.1, TSLimit: 4, Z: 3},
		},
		{
			name: "smoothed defaults to Trigg's 95% limit",
			cfg:  TrackConfig{InitialMAD: 10, MSE: 100, Signal: SignalSmoothed},
			want: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 0.1, TSLimit: trigg10, Z: 3, Signal: SignalSmoothed},
		},
		{
			name: "given values kept",
			cfg:  TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 0.7, TSLimit: 0.95, Z: 2, Signal: SignalSmoothed},
			want: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 0.7, TSLimit: 0.95, Z: 2, Signal: SignalSmoothed},
		},
		{name: "smoothing above 1", cfg: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 1.5}, wantErr: true},
		{name: "negative smoothing", cfg: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: -0.1}, wantErr: true},
		{name: "negative z", cfg: TrackConfig{InitialMAD: 10, MSE: 100, Z: -3}, wantErr: true},
		{name: "negative limit", cfg: TrackConfig{InitialMAD: 10, MSE: 100, TSLimit: -4}, wantErr: true},
		{name: "smoothed limit of 1 never fires", cfg: TrackConfig{InitialMAD: 10, MSE: 100, TSLimit: 1, Signal: SignalSmoothed}, wantErr: true},
		{name: "smoothed, no table for 0.7", cfg: TrackConfig{InitialMAD: 10, MSE: 100, MADSmoothing: 0.7, Signal: SignalSmoothed}, wantErr: true},
		{name: "unknown signal", cfg: TrackConfig{InitialMAD: 10, MSE: 100, Signal: Signal(7)}, wantErr: true},
	} {
		got, err := tc.cfg.Resolved()
		if tc.wantErr {
			if !errors.Is(err, ErrBadSetting) {
				t.Errorf("%s: error %v, want ErrBadSetting", tc.name, err)
			}
			continue
		}
		if err != nil || got != tc.want {
			t.Errorf("%s: got %+v, %v; want %+v", tc.name, got, err, tc.want)
		}
	}
}

func TestForecastValueAdded(t *testing.T) {
	actual := []float64{100, 110, 120, 130}
	for _, tc := range []struct {
		name           string
		plan, baseline []float64
		want           ValueAdded
		tol            float64
	}{
		{
			name:     "adjustments help",
			plan:     []float64{98, 108, 125, 128},
			baseline: []float64{90, 95, 100, 105},
			// Plan errors 2, 2, -5, 2: MAD = 11/4 = 2.75, bias = 1/4 = 0.25.
			// Baseline errors 10, 15, 20, 25: MAD = bias = 70/4 = 17.5.
			// Improvement = 17.5 - 2.75 = 14.75 > 0; share 14.75/17.5
			// = 0.842857.
			want: ValueAdded{N: 4, PlanMAD: 2.75, BaselineMAD: 17.5, PlanBias: 0.25, BaselineBias: 17.5,
				Improvement: 14.75, ImprovementShare: 14.75 / 17.5},
			tol: 1e-12,
		},
		{
			name:     "adjustments hurt",
			plan:     []float64{120, 130, 140, 150},
			baseline: []float64{102, 108, 121, 129},
			// Plan errors -20 each: MAD 20, bias -20 (plan too high).
			// Baseline errors -2, 2, -1, 1: MAD 6/4 = 1.5, bias 0.
			// Improvement = 1.5 - 20 = -18.5 < 0; share -18.5/1.5
			// = -12.333333.
			want: ValueAdded{N: 4, PlanMAD: 20, BaselineMAD: 1.5, PlanBias: -20, BaselineBias: 0,
				Improvement: -18.5, ImprovementShare: -18.5 / 1.5},
			tol: 1e-12,
		},
	} {
		got, err := ForecastValueAdded(actual, tc.plan, tc.baseline)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if got.N != tc.want.N {
			t.Errorf("%s: N = %d, want %d", tc.name, got.N, tc.want.N)
		}
		for _, c := range []struct {
			field     string
			got, want float64
		}{
			{"PlanMAD", got.PlanMAD, tc.want.PlanMAD},
			{"BaselineMAD", got.BaselineMAD, tc.want.BaselineMAD},
			{"PlanBias", got.PlanBias, tc.want.PlanBias},
			{"BaselineBias", got.BaselineBias, tc.want.BaselineBias},
			{"Improvement", got.Improvement, tc.want.Improvement},
			{"ImprovementShare", got.ImprovementShare, tc.want.ImprovementShare},
		} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, tc.tol, tc.tol) {
				t.Errorf("%s: %s = %v, want %v", tc.name, c.field, c.got, c.want)
			}
		}
	}

	// A perfect baseline leaves no share to speak of.
	got, err := ForecastValueAdded(actual, []float64{101, 110, 120, 130}, actual)
	if err != nil || !math.IsNaN(got.ImprovementShare) || got.Improvement != -0.25 {
		t.Errorf("perfect baseline: %+v, %v; want Improvement -0.25, share NaN", got, err)
	}
}

func TestForecastValueAddedErrors(t *testing.T) {
	for _, tc := range []struct {
		name                   string
		actual, plan, baseline []float64
		want                   error
	}{
		{"plan shorter", []float64{1, 2}, []float64{1}, []float64{1, 2}, ErrLengthMismatch},
		{"baseline longer", []float64{1}, []float64{1}, []float64{1, 2}, ErrLengthMismatch},
		{"empty", nil, nil, nil, ErrTooShort},
		{"NaN actual", []float64{math.NaN()}, []float64{1}, []float64{1}, ErrEmptyCell},
		{"NaN baseline", []float64{1}, []float64{1}, []float64{math.NaN()}, ErrEmptyCell},
	} {
		_, err := ForecastValueAdded(tc.actual, tc.plan, tc.baseline)
		if !errors.Is(err, tc.want) {
			t.Errorf("%s: error %v, want %v", tc.name, err, tc.want)
		}
	}
}

func TestSignalAndVerdictNames(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Signal
		ok   bool
	}{
		{"cumulative", SignalCumulative, true},
		{" Smoothed ", SignalSmoothed, true},
		{"", SignalCumulative, false},
		{"trend", SignalCumulative, false},
	} {
		got, err := ParseSignal(tc.in)
		if (err == nil) != tc.ok || got != tc.want {
			t.Errorf("ParseSignal(%q) = %v, %v", tc.in, got, err)
		}
		if err != nil && !errors.Is(err, ErrBadSetting) {
			t.Errorf("ParseSignal(%q): error %v does not wrap ErrBadSetting", tc.in, err)
		}
		if tc.ok && got.String() != "cumulative" && got.String() != "smoothed" {
			t.Errorf("Signal %d String = %q", int(got), got)
		}
	}
	for _, tc := range []struct {
		v    Verdict
		want string
	}{
		{InControl, "in-control"},
		{Bias, "bias"},
		{Outlier, "outlier"},
		{Verdict(9), "Verdict(9)"},
	} {
		b, _ := tc.v.MarshalText()
		if tc.v.String() != tc.want || string(b) != tc.want {
			t.Errorf("Verdict %d: %q, %q; want %q", int(tc.v), tc.v.String(), b, tc.want)
		}
	}
}
