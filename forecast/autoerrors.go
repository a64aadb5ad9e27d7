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
	// The rows are copied into one backing array: a row taken as it is
	// would keep the whole backtest of its method alive in the Result.
	total := 0
	rows := make([][]float64, 0, O-1)
	scores := make([]float64, len(singles))
	order := make([]int, 0, len(singles))
	for i := 1; i < O; i++ {
		row := chooseAt(singles, i, metric, onlyCombination, scores, order)
		rows = append(rows, row)
		total += len(row)
	}
	all := make([]float64, 0, total)
	for j, row := range rows {
		start := len(all)
		all = append(all, row...)
		rows[j] = all[start:len(all):len(all)]
	}
	return rows
}

// chooseAt returns the errors at origin i of the forecast chosen with the
// errors known at i (see selectionErrors): a row of a single method's
// errors, or a new row for the combination. scores (as long as singles)
// and order (room for as many) are work space.
func chooseAt(singles []*Backtest, i int, metric Metric, onlyCombination bool, scores []float64, order []int) []float64 {
	order = order[:0]
	for s, bt := range singles {
		scores[s] = knownScore(bt.Forecasts, bt.Errors, nil, nil, i, metric) * FewOriginsFactor(bt.Origins)
		if !math.IsNaN(scores[s]) {
			order = append(order, s)
		}
	}
	if len(order) == 0 {
		return singles[0].Errors[i]
	}
	sort.SliceStable(order, func(a, b int) bool { return scores[order[a]] < scores[order[b]] })
	top := order[:min(CombineK, len(order))]
	best := singles[order[0]]
	if !onlyCombination && len(top) > 1 {
		comb := knownScore(best.Forecasts, best.Errors, singles, top, i, metric)
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
		row[k] = best.Forecasts[i][k] + best.Errors[i][k] - meanAt(singles, top, i, k)
	}
	return row
}

// meanAt returns the mean of the forecasts of the singles at the indices
// top, made at origin j for lead time k+1 (summed in the order of top).
func meanAt(singles []*Backtest, top []int, j, k int) float64 {
	sum := 0.0
	for _, s := range top {
		sum += singles[s].Forecasts[j][k]
	}
	return sum / float64(len(top))
}

// knownScore returns the metric over the errors known at origin i: those
// of origins j < i at lead times k+1 with j + k < i. With top nil the
// errors are errs; otherwise they are the actuals (forecasts plus errors)
// minus the mean forecasts of the singles at the indices top (meanAt). MAD and MASE (a fixed scale apart) rank by the
// mean absolute error, MSE by the mean square and MAPE by the mean
// absolute percentage error (zero actuals left out). It returns NaN when
// no error is known.
func knownScore(fc, errs [][]float64, singles []*Backtest, top []int, i int, metric Metric) float64 {
	sum, n := 0.0, 0
	for j := 0; j < i; j++ {
		for k := 0; k < len(errs[j]) && j+k < i; k++ {
			e := errs[j][k]
			actual := fc[j][k] + e
			if top != nil {
				e = actual - meanAt(singles, top, j, k)
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
