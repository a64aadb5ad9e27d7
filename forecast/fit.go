package forecast

import (
	"fmt"
	"math"
)

// FitMethod fits method m (not Auto, nor Combination, which Fit selects) to y. cfg.Season must be at least 1
// (Spec resolves it from the frequency). It returns a *TooShortError when y
// has fewer than MinPoints(m, cfg) values and an error for NaN values or
// settings the method cannot use. The model may keep y without copying it
// (an exponential smoothing model runs over it again for Fitted), so y must
// not change while the model is in use.
func FitMethod(y []float64, m Method, cfg Config) (Model, error) {
	if cfg.Season < 1 {
		cfg.Season = 1
	}
	if need := MinPoints(m, cfg); len(y) < need {
		return nil, &TooShortError{Method: m, Need: need, Have: len(y)}
	}
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("value %d is %v; the series must hold numbers only", i+1, v)
		}
	}
	switch m {
	case Naive:
		return fitNaive(y, cfg)
	case SeasonalNaive:
		return fitSeasonalNaive(y, cfg)
	case MovingAverage:
		return fitMovingAverage(y, cfg)
	case WeightedMovingAverage:
		return fitWeightedMovingAverage(y, cfg)
	case SES, Holt, DampedHolt, HoltWintersAdditive, HoltWintersMultiplicative:
		return fitETS(y, m, cfg)
	case LinearTrend:
		return fitLinearTrend(y, cfg)
	case Croston:
		return fitCroston(y, cfg, false)
	case SBA:
		return fitCroston(y, cfg, true)
	}
	return nil, fmt.Errorf("method %s cannot be fitted directly", m)
}

// MinPoints returns the fewest observations method m accepts with cfg.
// For Auto and Combination it is the fewest any candidate accepts (naive: 2).
func MinPoints(m Method, cfg Config) int {
	if cfg.Season < 1 {
		cfg.Season = 1
	}
	switch m {
	case SES, Holt, DampedHolt, HoltWintersAdditive, HoltWintersMultiplicative:
		return etsMinPoints(m, cfg.Season)
	case Auto, Combination:
		return simpleMinPoints(Naive, cfg)
	}
	return simpleMinPoints(m, cfg)
}
