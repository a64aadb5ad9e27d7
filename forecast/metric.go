package forecast

import (
	"fmt"
	"math"
	"strings"
)

// Metric is the accuracy measure that automatic selection minimises.
type Metric int

// The metrics. MetricMAD is the zero value and the default.
const (
	MetricMAD Metric = iota
	MetricMSE
	MetricMAPE
	MetricMASE
)

var metricNames = [...]string{"mad", "mse", "mape", "mase"}

// String returns mad, mse, mape or mase.
func (m Metric) String() string {
	if m < 0 || int(m) >= len(metricNames) {
		return fmt.Sprintf("Metric(%d)", int(m))
	}
	return metricNames[m]
}

// MarshalText writes the metric's name.
func (m Metric) MarshalText() ([]byte, error) { return []byte(m.String()), nil }

// ParseMetric reads a metric name; the empty string gives MetricMAD.
func ParseMetric(s string) (Metric, error) {
	s = strings.ToLower(strings.TrimSpace(s))
	if s == "" {
		return MetricMAD, nil
	}
	for i, n := range metricNames {
		if n == s {
			return Metric(i), nil
		}
	}
	return MetricMAD, fmt.Errorf("unknown metric %q (want mad, mse, mape or mase)", s)
}

// Of returns the value of metric m in a. A NaN value (MAPE with no
// non-zero actuals, say) sorts last in selection.
func (a Accuracy) Of(m Metric) float64 {
	switch m {
	case MetricMSE:
		return a.MSE
	case MetricMAPE:
		return a.MAPE
	case MetricMASE:
		return a.MASE
	}
	return a.MAD
}

// Selection is how automatic selection ranks its candidates.
type Selection int

// The selection rules. SelectBacktest is the zero value and the default.
const (
	// SelectBacktest ranks candidates by the rolling-origin backtest
	// error on the chosen Metric.
	SelectBacktest Selection = iota
	// SelectAICc ranks the candidates that have a Gaussian likelihood (the
	// exponential smoothing family and linear-trend) by the corrected
	// Akaike information criterion of their in-sample fit.
	SelectAICc
)

// String returns backtest or aicc.
func (s Selection) String() string {
	if s == SelectAICc {
		return "aicc"
	}
	return "backtest"
}

// ParseSelection reads backtest or aicc; the empty string gives
// SelectBacktest.
func ParseSelection(s string) (Selection, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "backtest":
		return SelectBacktest, nil
	case "aicc":
		return SelectAICc, nil
	}
	return SelectBacktest, fmt.Errorf("unknown selection %q (want backtest or aicc)", s)
}

// AICc returns the corrected Akaike information criterion of a fit with
// Gaussian errors, n one-step errors summing to sse in squares and k
// estimated parameters (the error variance not counted; AICc adds it):
//
//	K    = k + 1
//	AIC  = n ln(sse/n) + 2K
//	AICc = AIC + 2K(K+1)/(n-K-1)
//
// Constants common to all models are left out, so only differences between
// candidates fitted to the same data mean anything. It returns +Inf when
// n-K-1 <= 0 and NaN when sse is not positive.
func AICc(sse float64, n, k int) float64 {
	if !(sse > 0) {
		return math.NaN()
	}
	K := float64(k + 1)
	nf := float64(n)
	if nf-K-1 <= 0 {
		return math.Inf(1)
	}
	return nf*math.Log(sse/nf) + 2*K + 2*K*(K+1)/(nf-K-1)
}

// hasLikelihood reports whether AICc applies to method m.
func hasLikelihood(m Method) bool {
	switch m {
	case SES, Holt, DampedHolt, HoltWintersAdditive, HoltWintersMultiplicative, LinearTrend:
		return true
	}
	return false
}
