package forecast

import (
	"math"
	"slices"
	"testing"
)

// paramStub is a fitted model whose parameters a test sets.
type paramStub struct {
	Model
	p Params
}

func (s paramStub) Params() Params { return s.p }

// The bounds are those of ets_fit.go (alpha, beta, gamma in [0.0001,
// 0.9999], gamma at most 1 - alpha, phi in [0.8, 0.98]) and croston.go
// (alpha in [0.05, 0.3]); "at a bound" means within 1e-3 of it.
func TestFlags(t *testing.T) {
	nan := math.NaN()
	held := 0.0001
	sig := &Backtest{Bias: BiasTest{N: 19, Mean: 1234.4, SE: 398, T: 3.1, P: 0.002}}
	for _, tc := range []struct {
		name   string
		method Method
		p      Params
		fixed  Fixed
		bt     *Backtest
		want   []string
	}{
		{
			name: "level and season nearly fixed", method: HoltWintersAdditive,
			p: Params{Alpha: 0.0005, Beta: 0.5, Gamma: 0.0001, Phi: nan},
			want: []string{
				"alpha 0.0005 is at its lower bound (0.0001): level nearly fixed: the baseline barely follows recent demand; " +
					"if demand has shifted, fit a shorter history or add the shift as an event.",
				"gamma 0.0001 is at its lower bound (0.0001): season nearly fixed: the seasonal pattern of the first cycles is kept; " +
					"fine for a stable pattern; if it has changed, fit a shorter history.",
			},
		},
		{
			name: "close to naive, trend chasing, damped out", method: DampedHolt,
			p: Params{Alpha: 0.9995, Beta: 0.999, Gamma: nan, Phi: 0.8},
			want: []string{
				"alpha 0.9995 is at its upper bound (0.9999): level follows the last value: close to naive; " +
					"compare with naive, and clean outliers or add them as events.",
				"beta 0.9990 is at its upper bound (0.9999): trend follows the last change in level: the latest movement is extrapolated; " +
					"try damped-holt or a method without trend.",
				"phi 0.8000 is at its lower bound (0.8000): trend damped out quickly: the forecast flattens within a few periods; " +
					"if the trend is not real, try ses.",
			},
		},
		{
			// gamma's upper bound is 1 - alpha = 0.5; 0.4992 is 0.0008 below it.
			name: "season follows the last cycle, trend barely damped", method: HoltWintersMultiplicative,
			p: Params{Alpha: 0.5, Beta: 0.0012, Gamma: 0.4992, Phi: 0.98},
			want: []string{
				"gamma 0.4992 is at its upper bound (0.5000): season follows the last cycle: each seasonal state takes most of the latest error; " +
					"the season may be noise; try a method without season or a longer history.",
				"phi 0.9800 is at its upper bound (0.9800): trend barely damped: close to an undamped trend; " +
					"check that the long-range forecast is plausible, or compare with holt.",
			},
		},
		{
			// beta 0.0012 is 0.0011 above 0.0001: not at the bound.
			name: "held alpha is not flagged", method: Holt,
			p: Params{Alpha: 0.0001, Beta: 0.0012, Gamma: nan, Phi: nan}, fixed: Fixed{Alpha: &held},
		},
		{
			name: "croston at the lower end", method: Croston,
			p: Params{Alpha: 0.05, Beta: nan, Gamma: nan, Phi: nan},
			want: []string{"alpha 0.0500 is at its lower bound (0.0500): demand sizes and intervals nearly fixed: " +
				"the baseline barely follows recent demand; if demand has shifted, fit a shorter history."},
		},
		{
			name: "sba at the upper end", method: SBA,
			p: Params{Alpha: 0.2995, Beta: nan, Gamma: nan, Phi: nan},
			want: []string{"alpha 0.2995 is at its upper bound (0.3000): demand sizes and intervals follow the latest demands closely; " +
				"check the latest demands for outliers."},
		},
		{
			name: "significant backtest bias", method: Naive,
			p: Params{Alpha: nan, Beta: nan, Gamma: nan, Phi: nan}, bt: sig,
			want: []string{"one-step backtest errors average +1,234 per period (t = +3.10, p = 0.002): " +
				"the baseline runs low over the backtest; consider another method or check for an unmodelled step."},
		},
		{
			name: "negative bias", method: SES, p: Params{Alpha: 0.3, Beta: nan, Gamma: nan, Phi: nan},
			bt: &Backtest{Bias: BiasTest{N: 19, Mean: -56.78, T: -2.5, P: 0.0004}},
			want: []string{"one-step backtest errors average -56.8 per period (t = -2.50, p < 0.001): " +
				"the baseline runs high over the backtest; consider another method or check for an unmodelled step."},
		},
		{
			name: "bias that is not significant", method: SES, p: Params{Alpha: 0.3, Beta: nan, Gamma: nan, Phi: nan},
			bt: &Backtest{Bias: BiasTest{N: 19, Mean: 12, T: 1.5, P: 0.15}},
		},
	} {
		r := &Result{Method: tc.method, Model: paramStub{p: tc.p}, Config: Config{Fixed: tc.fixed}, Backtest: tc.bt}
		if got := r.Flags(); !slices.Equal(got, tc.want) {
			t.Errorf("%s:\n got %q\nwant %q", tc.name, got, tc.want)
		}
	}
}

func TestSignedGrouped(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		want string
	}{{1234.4, "+1,234"}, {-1234567.8, "-1,234,568"}, {-56.78, "-56.8"}, {0.4249, "+0.42"}, {100, "+100"}, {-0.001, "-0.00"}} {
		if got := signedGrouped(tc.v); got != tc.want {
			t.Errorf("signedGrouped(%v) = %q, want %q", tc.v, got, tc.want)
		}
	}
}
