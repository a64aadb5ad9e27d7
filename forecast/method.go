package forecast

import (
	"fmt"
	"strings"
)

// Method names a baseline forecasting method.
type Method int

// The baseline methods. Combination averages the forecasts of the best
// few single methods by backtest (see combination.go). Auto is not a model
// itself: it picks one of the others, the combination included, by
// backtest (see Spec).
const (
	MethodUnknown Method = iota
	Naive
	SeasonalNaive
	MovingAverage
	WeightedMovingAverage
	SES
	Holt
	DampedHolt
	HoltWintersAdditive
	HoltWintersMultiplicative
	LinearTrend
	Croston
	SBA
	Combination
	Auto
)

var methodNames = [...]string{
	"unknown", "naive", "seasonal-naive", "moving-average", "weighted-moving-average",
	"ses", "holt", "damped-holt", "holt-winters-additive", "holt-winters-multiplicative",
	"linear-trend", "croston", "sba", "combination", "auto",
}

// String returns the method's name as used on the command line and in files.
func (m Method) String() string {
	if m < 0 || int(m) >= len(methodNames) {
		return fmt.Sprintf("Method(%d)", int(m))
	}
	return methodNames[m]
}

// MarshalText writes the method's name.
func (m Method) MarshalText() ([]byte, error) { return []byte(m.String()), nil }

// Methods returns every method name, in a fixed order, for help texts.
func Methods() []string { return append([]string(nil), methodNames[1:]...) }

// ParseMethod reads a method name (case-insensitive).
func ParseMethod(s string) (Method, error) {
	s = strings.ToLower(strings.TrimSpace(s))
	for i, n := range methodNames {
		if i > 0 && n == s {
			return Method(i), nil
		}
	}
	return MethodUnknown, fmt.Errorf("unknown method %q (want one of %s)", s, strings.Join(Methods(), ", "))
}

// Config holds the settings of one method. The zero value of every field is
// a usable default, noted on the field.
type Config struct {
	// Season is the number of periods in a seasonal cycle, used by
	// seasonal-naive, holt-winters-*, linear-trend with Dummies and as the
	// MASE scaling lag. Zero means the frequency's usual length
	// (Frequency.SeasonLength); 1 means no season.
	Season int

	// Fixed pins smoothing parameters; nil fields are estimated.
	Fixed Fixed

	// Window is the moving-average window k; zero means 3. For
	// weighted-moving-average without Weights it is the number of weights
	// fitted.
	Window int

	// Weights are the weighted-moving-average weights, oldest first. They
	// are scaled to sum to one. Nil means the weights are fitted (non-negative,
	// summing to one, minimising the in-sample squared one-step error).
	Weights []float64

	// Dummies adds seasonal dummy variables to linear-trend.
	Dummies bool

	// DampedSeasonal, for holt-winters-multiplicative, damps the trend
	// (the additive damped trend, multiplicative season model).
	Damped bool
}

// Fixed holds smoothing parameters the caller wants held at a given value.
// A nil field is estimated.
type Fixed struct {
	Alpha, Beta, Gamma, Phi *float64
}

// Params are the smoothing parameters a fitted model uses. Fields that do
// not apply to the model are NaN and are left out of JSON.
type Params struct {
	Alpha, Beta, Gamma, Phi float64
}

// Model is a baseline model fitted to one series.
type Model interface {
	// Method returns the method the model was fitted with.
	Method() Method
	// Params returns the smoothing parameters (NaN where they do not apply).
	Params() Params
	// Describe returns a short human description of the model's settings,
	// such as "window 3" or "season 12, damped"; empty when there is nothing
	// to say beyond Params.
	Describe() string
	// NumParams is the number of estimated quantities (parameters plus
	// initial states) for information criteria.
	NumParams() int
	// Fitted returns the one-step-ahead in-sample predictions, one per
	// observation; NaN where the method has no prediction yet (the first
	// window of a moving average, say).
	Fitted() []float64
	// Forecast returns the point forecasts for the h periods after the
	// end of the data.
	Forecast(h int) []float64
	// Extend runs the model, with its fitted parameters and initial states
	// held, over y (which may be longer or shorter than the fitting data, or
	// hold other values) and returns the model positioned at the end of y:
	// its Fitted are the one-step predictions for y and its Forecast starts
	// after y. Backtests roll states forward with it, and cleaning past
	// events relies on it. The receiver is not changed.
	Extend(y []float64) Model
	// VarianceFactors returns c_1..c_h such that the variance of the
	// h-step forecast error is sigma^2 * c_h, where sigma^2 is the one-step
	// error variance, and ok = true when the method has an analytic form
	// (the exponential smoothing classes). Otherwise ok is false and bands
	// come from backtest errors.
	VarianceFactors(h int) (c []float64, ok bool)
}
