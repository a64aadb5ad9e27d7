package forecast

import (
	"fmt"
	"math"
	"strings"
)

// boundTol is how close to a bound an estimated parameter must be for
// Flags to call it at the bound.
const boundTol = 1e-3

// A paramBound is one end of the range of a smoothing parameter, with what
// a fit that stops there means and what to do about it.
type paramBound struct {
	name    string
	value   float64 // the fitted value
	bound   float64
	upper   bool
	meaning string
	fix     string
}

// Flags returns plain sentences about what may make the fitted baseline
// weak, each with what to do; nil when there is nothing to say. They are
// shown with the baseline; they are not warnings about the input (a model
// that fits the data well can stop at a bound, and about one backtest in
// ten or more of a sound model shows a significant bias), so a strict run
// does not stop on them. Two things are flagged:
//
//   - a smoothing parameter that the fit estimated (not one held by
//     Config.Fixed) within 1e-3 of a bound of its range, with what that
//     means: alpha near its lower bound "level nearly fixed: the baseline
//     barely follows recent demand", near its upper bound "level follows
//     the last value: close to naive"; beta near its lower bound "trend
//     nearly fixed", near its upper bound "trend follows the last change
//     in level"; gamma near its lower bound "season nearly fixed", near
//     its upper bound 1 - alpha "season follows the last cycle"; phi at
//     0.8 "trend damped out quickly", at 0.98 "trend barely damped";
//     Croston's alpha at 0.05 or 0.3, the ends of its search range;
//   - a significant backtest bias (Backtest.Bias at the 5% level), such as
//     "one-step backtest errors average +1,234 per period (t = +3.10,
//     p = 0.002): the baseline runs low over the backtest; consider
//     another method or check for an unmodelled step".
//
// The parameters are those of the final fit on the whole history; the
// bias is that of the backtest (see Backtest.Bias for how often a model
// that fits the data is called biased).
func (r *Result) Flags() []string {
	var w []string
	for _, b := range r.bounds() {
		if b.upper && b.value < b.bound-boundTol || !b.upper && b.value > b.bound+boundTol {
			continue
		}
		end := "lower"
		if b.upper {
			end = "upper"
		}
		w = append(w, fmt.Sprintf("%s %.4f is at its %s bound (%.4f): %s; %s.", b.name, b.value, end, b.bound, b.meaning, b.fix))
	}
	if bt := r.Backtest; bt != nil && bt.Bias.Significant() {
		b := bt.Bias
		runs := "low"
		if b.Mean < 0 {
			runs = "high"
		}
		w = append(w, fmt.Sprintf("one-step backtest errors average %s per period (t = %+.2f, %s): the baseline runs %s over the backtest; "+
			"consider another method or check for an unmodelled step.", signedGrouped(b.Mean), b.T, b.PText(), runs))
	}
	return w
}

// bounds lists both ends of every smoothing parameter the fit estimated,
// in the order alpha, beta, gamma, phi.
func (r *Result) bounds() []paramBound {
	p, fx := r.Model.Params(), r.Config.Fixed
	var out []paramBound
	add := func(name string, v float64, held *float64, lo, hi float64, loMeaning, loFix, hiMeaning, hiFix string) {
		if math.IsNaN(v) || held != nil {
			return
		}
		out = append(out, paramBound{name: name, value: v, bound: lo, meaning: loMeaning, fix: loFix})
		if hi > lo+2*boundTol { // else the range is a point: say it once
			out = append(out, paramBound{name: name, value: v, bound: hi, upper: true, meaning: hiMeaning, fix: hiFix})
		}
	}
	switch r.Method {
	case Croston, SBA:
		add("alpha", p.Alpha, fx.Alpha, crostonAlphaMin, crostonAlphaMax,
			"demand sizes and intervals nearly fixed: the baseline barely follows recent demand",
			"if demand has shifted, fit a shorter history",
			"demand sizes and intervals follow the latest demands closely",
			"check the latest demands for outliers")
	case SES, Holt, DampedHolt, HoltWintersAdditive, HoltWintersMultiplicative:
		alphaHi := etsParamHi
		if fx.Gamma != nil && !math.IsNaN(p.Gamma) {
			alphaHi = math.Min(alphaHi, 1-*fx.Gamma)
		}
		add("alpha", p.Alpha, fx.Alpha, etsParamLo, alphaHi,
			"level nearly fixed: the baseline barely follows recent demand",
			"if demand has shifted, fit a shorter history or add the shift as an event",
			"level follows the last value: close to naive",
			"compare with naive, and clean outliers or add them as events")
		add("beta", p.Beta, fx.Beta, etsParamLo, etsParamHi,
			"trend nearly fixed: the slope of the whole history is carried to its end",
			"check that the trend still holds, or try damped-holt",
			"trend follows the last change in level: the latest movement is extrapolated",
			"try damped-holt or a method without trend")
		add("gamma", p.Gamma, fx.Gamma, etsParamLo, math.Min(etsParamHi, 1-p.Alpha),
			"season nearly fixed: the seasonal pattern of the first cycles is kept",
			"fine for a stable pattern; if it has changed, fit a shorter history",
			"season follows the last cycle: each seasonal state takes most of the latest error",
			"the season may be noise; try a method without season or a longer history")
		add("phi", p.Phi, fx.Phi, etsPhiLo, etsPhiHi,
			"trend damped out quickly: the forecast flattens within a few periods",
			"if the trend is not real, try ses",
			"trend barely damped: close to an undamped trend",
			"check that the long-range forecast is plausible, or compare with holt")
	}
	return out
}

// signedGrouped formats v with a sign, thousands separators and the
// decimals SpreadDecimals gives its size: +1,234, -56.7, +0.42.
func signedGrouped(v float64) string {
	s := strings.TrimPrefix(FormatNumber(v, SpreadDecimals(v)), "-")
	if v < 0 {
		return "-" + s // the sign of a small mean error still says which way it leans
	}
	return "+" + s
}
