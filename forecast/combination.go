package forecast

import (
	"fmt"
	"strings"
)

// CombineK is the number of single methods the combination averages: the
// CombineK best by backtest, or every scored one when fewer were scored.
// Three is the size of the combination benchmark of Makridakis, Spiliotis
// & Assimakopoulos (2020, "The M4 Competition: 100,000 time series and 61
// forecasting methods", IJF 36(1)), the mean of simple, Holt and damped
// exponential smoothing, which most submissions did not beat (from memory).
const CombineK = 3

// combinationModel forecasts with the mean of its members' forecasts:
//
//	yhat_{t+h} = (1/k) sum_{j=1..k} yhat^{(j)}_{t+h}
//
// over k members fitted to the same data. Its one-step in-sample
// predictions are the same mean of the members' (NaN where a member has
// none), so its errors are the mean of the members' errors. The mean was
// kept over the median: with three members the median is the middle one,
// which throws away the other two, and on the open data sets of the README
// (statsmodels 0.13.5's monthly co2, elec_equip and elnino, quarterly
// macrodata and interest_inflation, 12 and 8 periods ahead from many
// origins) the mean of the best three had mean MASE 0.689 (monthly) and
// 1.008 (quarterly), the median 0.751 and 1.024.
//
// The one-step predictions are not stored: Fitted computes them from the
// members each time it is called (the same sums, so the same numbers), as
// a combination kept in a Result or a backtest is rarely asked for them.
type combinationModel struct {
	members []Model
}

// newCombination returns the combination of members, which are fitted to
// the same data. It panics on no members (a programmer error).
func newCombination(members []Model) *combinationModel {
	if len(members) == 0 {
		panic("forecast: a combination needs at least one member")
	}
	return &combinationModel{members: members}
}

// Members returns the members of a combination fitted by this package, best
// by backtest first, and nil for any other model.
func Members(md Model) []Model {
	c, ok := md.(*combinationModel)
	if !ok {
		return nil
	}
	return append([]Model(nil), c.members...)
}

// Method returns Combination.
func (c *combinationModel) Method() Method { return Combination }

// Params returns NaN for every parameter: each member has its own (see
// Members).
func (c *combinationModel) Params() Params { return simpleNoParams() }

// Describe lists the members, "mean of holt-winters-additive, damped-holt,
// linear-trend".
func (c *combinationModel) Describe() string {
	names := make([]string, len(c.members))
	for j, md := range c.members {
		names[j] = md.Method().String()
	}
	return "mean of " + strings.Join(names, ", ")
}

// NumParams is the sum of the members' estimated quantities.
func (c *combinationModel) NumParams() int {
	k := 0
	for _, md := range c.members {
		k += md.NumParams()
	}
	return k
}

// Fitted returns the mean of the members' one-step in-sample predictions.
func (c *combinationModel) Fitted() []float64 {
	rows := make([][]float64, len(c.members))
	for j, md := range c.members {
		rows[j] = md.Fitted()
	}
	return meanOfRows(rows)
}

// Forecast returns the mean of the members' forecasts.
func (c *combinationModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	rows := make([][]float64, len(c.members))
	for j, md := range c.members {
		rows[j] = md.Forecast(h)
	}
	return meanOfRows(rows)
}

// Extend extends every member over y and combines them again.
func (c *combinationModel) Extend(y []float64) Model {
	ext := make([]Model, len(c.members))
	for j, md := range c.members {
		ext[j] = md.Extend(y)
	}
	return newCombination(ext)
}

// VarianceFactors returns ok = false: the variance of a mean of forecasts
// depends on how the members' errors correlate, which no member's formula
// says, so bands come from the combination's own backtest errors.
func (c *combinationModel) VarianceFactors(h int) ([]float64, bool) { return nil, false }

// meanOfRows returns the mean of the rows, position by position, NaN where
// any row is NaN. The rows have the same length.
func meanOfRows(rows [][]float64) []float64 {
	out := make([]float64, len(rows[0]))
	for i := range out {
		s := 0.0
		for _, r := range rows {
			s += r[i]
		}
		out[i] = s / float64(len(rows))
	}
	return out
}

// combineBacktests returns the backtest of the combination of members,
// built from their backtests over the same origins without refitting
// anything: at origin Train+i the combination forecasts
//
//	F[i][k] = (1/K) sum_j F_j[i][k]
//
// for lead k+1, its error is y[Train+i+k] - F[i][k], and the error is
// scored as RunBacktest scores a single method's (per-lead MSE, pooled
// accuracy with the MASE scaled by the first training window, bias test of
// the one-step errors). Its Model is the combination of the members'
// models fitted on the first training window. It panics if the backtests
// do not share their origins and lead times (a programmer error).
func combineBacktests(y []float64, members []*Backtest, season int, div Divisor) *Backtest {
	first := members[0]
	for _, b := range members[1:] {
		if b.Train != first.Train || b.Origins != first.Origins || len(b.HorizonMSE) != len(first.HorizonMSE) {
			panic("forecast: combined backtests differ in their origins")
		}
	}
	models := make([]Model, len(members))
	for j, b := range members {
		models[j] = b.Model
	}
	bt := &Backtest{Train: first.Train, Origins: first.Origins, Model: newCombination(models)}
	rows := make([][]float64, len(members))
	for i := range first.Forecasts {
		for j, b := range members {
			rows[j] = b.Forecasts[i]
		}
		bt.Forecasts = append(bt.Forecasts, meanOfRows(rows))
	}
	scoreForecasts(bt, y, len(first.HorizonMSE), season, div)
	return bt
}

// fitCombination fits every member method to all of y with its candidate
// settings and combines them. from holds the members' models on the
// backtest's first training window, in the order of members, which their
// fits start from (see fitWarm); nil, or a shorter slice, leaves the rest
// to FitMethod's full fit.
func fitCombination(y []float64, members []Method, from []Model, cfg Config, seasonal bool) (Model, error) {
	if len(members) == 0 {
		return nil, fmt.Errorf("%s: no member method could be scored", Combination)
	}
	models := make([]Model, len(members))
	for j, m := range members {
		var start Model
		if j < len(from) {
			start = from[j]
		}
		md, err := fitWarm(y, m, candidateConfig(m, cfg, seasonal), start)
		if err != nil {
			return nil, fmt.Errorf("%s: member %s: %w", Combination, m, err)
		}
		models[j] = md
	}
	return newCombination(models), nil
}
