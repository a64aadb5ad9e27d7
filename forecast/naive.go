package forecast

import (
	"fmt"
	"math"
)

// This file holds the two naive methods and the pieces every simple method
// (naive, seasonal naive, moving averages, linear trend, Croston) shares:
// the input check and simpleMinPoints.

// simpleMinPoints returns the fewest observations the simple method m
// accepts with cfg. The rule is the same for every method: enough data for
// the model's quantities to be computed from the data plus at least one
// in-sample one-step error, so that an error variance can be estimated.
//
//	naive                          2
//	seasonal-naive                 m + 1          (m = cfg.Season)
//	moving-average                 k + 1          (k = cfg.Window, 0 -> 3)
//	weighted-moving-average        k + 1 with cfg.Weights (k = len(Weights) when Window is 0),
//	                               2k when the k weights are fitted
//	                               (k - 1 free weights need k - 1 equations, plus one error)
//	linear-trend                   p + 1, p = 2 coefficients, or m + 1 with seasonal dummies
//	croston, sba                   2
//
// A Season below 1 counts as 1 and a Window below 1 as 1; the fit
// functions reject such settings with an error of their own. It panics if
// m is not one of the simple methods (a programmer error).
func simpleMinPoints(m Method, cfg Config) int {
	switch m {
	case Naive, Croston, SBA:
		return 2
	case SeasonalNaive:
		return simpleSeason(cfg) + 1
	case MovingAverage:
		return simpleWindow(cfg) + 1
	case WeightedMovingAverage:
		k := simpleWMAWindow(cfg)
		if len(cfg.Weights) > 0 {
			return k + 1
		}
		return 2 * k
	case LinearTrend:
		return linearTrendNumCoef(cfg) + 1
	}
	panic(fmt.Sprintf("forecast: simpleMinPoints called with %v, which is not a simple method", m))
}

// simpleSeason returns cfg.Season, with values below 1 counted as 1.
func simpleSeason(cfg Config) int {
	return max(cfg.Season, 1)
}

// simpleWindow returns the moving-average window: cfg.Window, 0 -> 3,
// negative counted as 1.
func simpleWindow(cfg Config) int {
	switch {
	case cfg.Window == 0:
		return 3
	case cfg.Window < 0:
		return 1
	}
	return cfg.Window
}

// simpleCheck returns an error if y holds a NaN or an infinity (wrapping
// ErrBadNumber) or has fewer than need points (a *TooShortError with Series
// left empty for the caller to fill).
func simpleCheck(y []float64, m Method, need int) error {
	for i, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%v: observation %d of %d is %v: %w", m, i+1, len(y), v, ErrBadNumber)
		}
	}
	if len(y) < need {
		return &TooShortError{Method: m, Need: need, Have: len(y)}
	}
	return nil
}

// simpleNoParams returns Params with every field NaN: none of the
// smoothing parameters applies.
func simpleNoParams() Params {
	return Params{Alpha: math.NaN(), Beta: math.NaN(), Gamma: math.NaN(), Phi: math.NaN()}
}

// simpleCheckHorizon panics on a negative horizon (a programmer error).
func simpleCheckHorizon(h int) {
	if h < 0 {
		panic(fmt.Sprintf("forecast: negative horizon %d", h))
	}
}

// naiveModel is the naive (random walk) forecast: each period is forecast
// by the last value seen,
//
//	yhat_{t+h|t} = y_t,
//
// and seasonal naive is the same with lag m (see seasonalNaiveModel).
type naiveModel struct {
	y      []float64
	fitted []float64
}

// fitNaive "fits" the naive method to y: there is nothing to estimate.
// Fitted[0] is NaN and Fitted[t] = y[t-1] after it.
//
// It returns an error wrapping ErrBadNumber if y holds a NaN or an infinity
// and a *TooShortError if y has fewer than 2 points.
func fitNaive(y []float64, cfg Config) (Model, error) {
	if err := simpleCheck(y, Naive, simpleMinPoints(Naive, cfg)); err != nil {
		return nil, err
	}
	m := &naiveModel{y: append([]float64(nil), y...)}
	m.fitted = m.Filter(m.y)
	return m, nil
}

func (m *naiveModel) Method() Method    { return Naive }
func (m *naiveModel) Params() Params    { return simpleNoParams() }
func (m *naiveModel) Describe() string  { return "" }
func (m *naiveModel) NumParams() int    { return 0 }
func (m *naiveModel) Fitted() []float64 { return append([]float64(nil), m.fitted...) }

// Forecast returns h copies of the last observation.
func (m *naiveModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	f := make([]float64, h)
	for i := range f {
		f[i] = m.y[len(m.y)-1]
	}
	return f
}

// Filter returns NaN followed by y[0..len(y)-2]. It accepts any length.
func (m *naiveModel) Filter(y []float64) []float64 {
	return seasonalNaiveFilter(y, 1)
}

// VarianceFactors returns c_h = h: the h-step error of a random walk is the
// sum of h independent one-step errors (Hyndman & Athanasopoulos,
// Forecasting: Principles and Practice, 3rd ed., section 5.5, Table 5.2:
// sigma_h = sigma sqrt(h)).
func (m *naiveModel) VarianceFactors(h int) ([]float64, bool) {
	simpleCheckHorizon(h)
	c := make([]float64, h)
	for i := range c {
		c[i] = float64(i + 1)
	}
	return c, true
}

// seasonalNaiveModel forecasts each period by the value one season
// earlier. With season m and k = floor((h-1)/m),
//
//	yhat_{t+h|t} = y_{t+h-m(k+1)},
//
// that is, the last observed season is repeated.
type seasonalNaiveModel struct {
	season int
	y      []float64
	fitted []float64
}

// fitSeasonalNaive "fits" the seasonal naive method with season
// m = cfg.Season to y. Fitted[t] is NaN for t < m and y[t-m] after.
//
// It returns an error if cfg.Season is below 1, an error wrapping
// ErrBadNumber if y holds a NaN or an infinity and a *TooShortError if y
// has fewer than m+1 points.
func fitSeasonalNaive(y []float64, cfg Config) (Model, error) {
	if cfg.Season < 1 {
		return nil, fmt.Errorf("%v: season must be at least 1, got %d", SeasonalNaive, cfg.Season)
	}
	if err := simpleCheck(y, SeasonalNaive, simpleMinPoints(SeasonalNaive, cfg)); err != nil {
		return nil, err
	}
	m := &seasonalNaiveModel{season: cfg.Season, y: append([]float64(nil), y...)}
	m.fitted = m.Filter(m.y)
	return m, nil
}

func (m *seasonalNaiveModel) Method() Method    { return SeasonalNaive }
func (m *seasonalNaiveModel) Params() Params    { return simpleNoParams() }
func (m *seasonalNaiveModel) Describe() string  { return fmt.Sprintf("season %d", m.season) }
func (m *seasonalNaiveModel) NumParams() int    { return 0 }
func (m *seasonalNaiveModel) Fitted() []float64 { return append([]float64(nil), m.fitted...) }

// Forecast repeats the last m observations: forecast h (1-based) is
// y[n-m+(h-1) mod m].
func (m *seasonalNaiveModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	n := len(m.y)
	f := make([]float64, h)
	for i := range f {
		f[i] = m.y[n-m.season+i%m.season]
	}
	return f
}

// Filter returns y lagged by the season, NaN for the first m positions. It
// accepts any length.
func (m *seasonalNaiveModel) Filter(y []float64) []float64 {
	return seasonalNaiveFilter(y, m.season)
}

// VarianceFactors returns c_h = floor((h-1)/m) + 1, the number of
// completed seasons the forecast reaches back (Hyndman & Athanasopoulos,
// Forecasting: Principles and Practice, 3rd ed., section 5.5, Table 5.2:
// sigma_h = sigma sqrt(k+1), k = floor((h-1)/m)).
func (m *seasonalNaiveModel) VarianceFactors(h int) ([]float64, bool) {
	simpleCheckHorizon(h)
	c := make([]float64, h)
	for i := range c {
		c[i] = float64(i/m.season + 1)
	}
	return c, true
}

// seasonalNaiveFilter returns p with p[t] = y[t-lag], NaN for t < lag.
func seasonalNaiveFilter(y []float64, lag int) []float64 {
	p := make([]float64, len(y))
	for t := range p {
		if t < lag {
			p[t] = math.NaN()
		} else {
			p[t] = y[t-lag]
		}
	}
	return p
}
