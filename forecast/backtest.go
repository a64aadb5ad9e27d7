package forecast

import "math"

// Backtest is the result of a rolling-origin evaluation: the model is
// fitted on the first Train observations, then for each origin
// o = Train, ..., n-1 its states are rolled forward through y[:o] (or, with
// refit, it is fitted again on y[:o]) and it forecasts up to
// H = len(HorizonMSE) periods ahead; every forecast that has an actual is
// scored.
type Backtest struct {
	Train   int // observations in the first training window
	Origins int // forecast origins evaluated
	// Accuracy pools the errors of every origin and horizon. Its MASE is
	// scaled by the seasonal-naive error of the first training window.
	// Its TrackingSignal is NaN: summed over overlapping lead times it
	// grows with the number of errors and tests nothing; Bias does.
	Accuracy Accuracy
	// Bias tests whether the one-step errors, one per origin, average
	// zero (BiasOf: Newey-West standard error, rule-of-thumb lag, t with
	// Origins-1 degrees of freedom). One-step errors do not overlap.
	// The errors at longer lead times are left out: origins less than H
	// apart forecast the same periods, and over the 36 origins or fewer of
	// a backtest a Newey-West test of all the pooled errors with lag H-1
	// calls 33% to 72% of backtests of models that fit the data biased at
	// the 5% level (TestBiasFalseAlarmRate, monthly series of 96 and 180
	// points, H = 12). This test calls 7% to 13% of them biased for
	// simple smoothing and the naive method, and about 22% for
	// Holt-Winters and Holt fits whose level is nearly fixed: their states
	// are estimated once, on the training window, and every origin shares
	// that estimate's error. So a significant bias is a flag to look at,
	// not a proof.
	Bias BiasTest
	// HorizonMSE[h-1] is the mean squared h-step error (divided by the
	// number of h-step errors) and HorizonCount[h-1] that number.
	HorizonMSE   []float64
	HorizonCount []int
	// Forecasts[i][k] is the (k+1)-step forecast made at origin Train+i,
	// and Errors[i][k] the actual minus it; both rows are as long as the
	// lead times that origin reaches (at most len(HorizonMSE)), and an
	// error is NaN where the actual is missing.
	Forecasts, Errors [][]float64
	// Model is the model fitted on the first training window.
	Model Model
}

// DefaultHoldout returns the number of backtest origins used when a Spec
// does not set one: a fifth of the series, at least 1 and at most 36.
func DefaultHoldout(n int) int {
	h := n / 5
	if h < 1 {
		h = 1
	}
	if h > 36 {
		h = 36
	}
	return h
}

// RunBacktest evaluates method m with cfg on y over the last holdout
// origins, scoring forecasts up to maxH periods ahead. With refit the model
// is fitted again at every origin; otherwise it is fitted once on the first
// training window and its states are rolled forward: one observation at a
// time where the model can (see roller), with Model.Extend otherwise.
// It returns a *TooShortError when the training window is shorter than the
// method needs.
func RunBacktest(y []float64, m Method, cfg Config, holdout, maxH int, refit bool, div Divisor) (*Backtest, error) {
	return runBacktest(y, m, cfg, holdout, maxH, refit, div, FitMethod)
}

// runBacktest is RunBacktest with the fits done by fit (FitMethod, or
// auto's fitScoring).
func runBacktest(y []float64, m Method, cfg Config, holdout, maxH int, refit bool, div Divisor,
	fit func([]float64, Method, Config) (Model, error)) (*Backtest, error) {
	n := len(y)
	if holdout < 1 || holdout >= n {
		return nil, &TooShortError{Method: m, Need: MinPoints(m, cfg) + 1, Have: n}
	}
	if maxH < 1 {
		maxH = 1
	}
	train := n - holdout
	base, err := fit(y[:train], m, cfg)
	if err != nil {
		return nil, err
	}
	bt := &Backtest{Train: train, Origins: holdout, Model: base}
	var roll roller
	if r, ok := base.(rollable); ok && !refit {
		roll = r.roller(y[:train])
	}
	for o := train; o < n; o++ {
		var model interface{ Forecast(h int) []float64 } = base
		switch {
		case refit && o > train:
			if model, err = fit(y[:o], m, cfg); err != nil {
				return nil, err
			}
		case o > train && roll != nil:
			roll.rollOn(y[:o]) // as Extend(y[:o]) would, one step on
			model = roll
		case o > train:
			model = base.Extend(y[:o])
		}
		bt.Forecasts = append(bt.Forecasts, model.Forecast(min(maxH, n-o)))
	}
	scoreForecasts(bt, y, maxH, cfg.Season, div)
	return bt, nil
}

// scoreForecasts fills the errors and the scores of bt from its Forecasts,
// bt.Train and the actuals y, over lead times 1..maxH, the way RunBacktest
// scores them.
func scoreForecasts(bt *Backtest, y []float64, maxH, season int, div Divisor) {
	bt.HorizonMSE, bt.HorizonCount = make([]float64, maxH), make([]int, maxH)
	bt.Errors = make([][]float64, len(bt.Forecasts))
	total := 0
	for _, f := range bt.Forecasts {
		total += len(f)
	}
	// One backing array for the error rows; the accuracy is summed as the
	// pairs go (Measure's sums, in Measure's order).
	all := make([]float64, total)
	var sums accuracySums
	oneStep := make([]float64, 0, len(bt.Forecasts))
	for i, f := range bt.Forecasts {
		o := bt.Train + i
		errs := all[:len(f):len(f)]
		all = all[len(f):]
		for k := range f {
			e := y[o+k] - f[k]
			errs[k] = e
			if math.IsNaN(e) {
				continue
			}
			bt.HorizonMSE[k] += e * e
			bt.HorizonCount[k]++
			if k == 0 {
				oneStep = append(oneStep, e)
			}
			sums.add(y[o+k], f[k])
		}
		bt.Errors[i] = errs
	}
	for k := range bt.HorizonMSE {
		if bt.HorizonCount[k] > 0 {
			bt.HorizonMSE[k] /= float64(bt.HorizonCount[k])
		} else {
			bt.HorizonMSE[k] = math.NaN()
		}
	}
	bt.Accuracy = sums.accuracy(MASEScale(y[:bt.Train], season), div)
	bt.Accuracy.TrackingSignal = math.NaN()
	bt.Bias = BiasOf(oneStep)
}
