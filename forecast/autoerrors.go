package forecast

import (
	"math"
	"sort"
)

// selectionErrors returns the out-of-sample errors of the selection itself:
// for each backtest origin i after the first, the errors at every lead time
// of the forecast that auto (or, with onlyCombination, the combination)
// would have made at that origin had it chosen with only the errors known
// by then, those of earlier origins whose targets lie before origin i. At
// each origin the single methods are ranked by their known errors on the
// metric (times their FewOriginsFactor, as in selection), the best CombineK
// are averaged into a combination scored the same way, and the better of
// the best single method and that combination makes the forecast.
//
// The winner's own backtest errors are the errors of the method that did
// best over the whole backtest: chosen for being low, they understate the
// errors to come (the winner's curse). Calibrating auto's bands on them
// made bands too narrow out of sample; the errors of the selection itself
// carry the chance of choosing wrongly. It returns nil when the singles'
// backtests do not share their origins or fewer than two origins exist.
func selectionErrors(cands []Candidate, metric Metric, onlyCombination bool) [][]float64 {
	var singles []*Backtest
	for _, c := range cands {
		if c.bt != nil && c.Method != Combination {
			singles = append(singles, c.bt)
		}
	}
	if len(singles) == 0 {
		return nil
	}
	O := len(singles[0].Errors)
	for _, bt := range singles {
		if len(bt.Errors) != O || bt.Train != singles[0].Train {
			return nil
		}
	}
	if O < 2 {
		return nil
	}
	out := make([][]float64, 0, O-1)
	for i := 1; i < O; i++ {
		out = append(out, chooseAt(singles, i, metric, onlyCombination))
	}
	return out
}

// chooseAt returns the errors at origin i of the forecast chosen with the
// errors known at i (see selectionErrors).
func chooseAt(singles []*Backtest, i int, metric Metric, onlyCombination bool) []float64 {
	scores := make([]float64, len(singles))
	order := make([]int, 0, len(singles))
	for s, bt := range singles {
		scores[s] = knownScore(bt.Forecasts, bt.Errors, nil, i, metric) * FewOriginsFactor(bt.Origins)
		if !math.IsNaN(scores[s]) {
			order = append(order, s)
		}
	}
	if len(order) == 0 {
		return singles[0].Errors[i]
	}
	sort.SliceStable(order, func(a, b int) bool { return scores[order[a]] < scores[order[b]] })
	top := order[:min(CombineK, len(order))]
	combined := meanForecasts(singles, top)
	best := singles[order[0]]
	if !onlyCombination && len(top) > 1 {
		comb := knownScore(best.Forecasts, best.Errors, combined, i, metric)
		if !(comb < scores[order[0]]) {
			return best.Errors[i]
		}
	}
	if len(top) == 1 {
		return best.Errors[i]
	}
	// The combination's errors at origin i: actual minus its forecast,
	// the actual being the best single method's forecast plus its error.
	row := make([]float64, len(best.Errors[i]))
	for k := range row {
		row[k] = best.Forecasts[i][k] + best.Errors[i][k] - combined[i][k]
	}
	return row
}

// meanForecasts returns, origin by origin and lead by lead, the mean of
// the forecasts of the singles at the indices top.
func meanForecasts(singles []*Backtest, top []int) [][]float64 {
	first := singles[top[0]]
	out := make([][]float64, len(first.Forecasts))
	for j, row := range first.Forecasts {
		out[j] = make([]float64, len(row))
		for k := range row {
			sum := 0.0
			for _, s := range top {
				sum += singles[s].Forecasts[j][k]
			}
			out[j][k] = sum / float64(len(top))
		}
	}
	return out
}

// knownScore returns the metric over the errors known at origin i: those
// of origins j < i at lead times k+1 with j + k < i. With alt nil the
// errors are errs; otherwise they are the actuals (forecasts plus errors)
// minus alt's forecasts. MAD and MASE (a fixed scale apart) rank by the
// mean absolute error, MSE by the mean square and MAPE by the mean
// absolute percentage error (zero actuals left out). It returns NaN when
// no error is known.
func knownScore(fc, errs, alt [][]float64, i int, metric Metric) float64 {
	sum, n := 0.0, 0
	for j := 0; j < i; j++ {
		for k := 0; k < len(errs[j]) && j+k < i; k++ {
			e := errs[j][k]
			actual := fc[j][k] + e
			if alt != nil {
				e = actual - alt[j][k]
			}
			if math.IsNaN(e) {
				continue
			}
			switch metric {
			case MetricMSE:
				sum += e * e
			case MetricMAPE:
				if actual == 0 {
					continue
				}
				sum += math.Abs(e / actual)
			default:
				sum += math.Abs(e)
			}
			n++
		}
	}
	if n == 0 {
		return math.NaN()
	}
	return sum / float64(n)
}
