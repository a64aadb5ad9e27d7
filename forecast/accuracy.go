package forecast

import (
	"fmt"
	"math"
	"strings"
)

// Divisor chooses the denominator of the mean squared error.
type Divisor int

// The divisors of Measure's MSE. DivisorNMinus1 is the zero value and the
// default: SSE/(n-1), the usual sample estimate of the error variance.
// DivisorN gives the plain mean SSE/n.
const (
	DivisorNMinus1 Divisor = iota
	DivisorN
)

// String returns "n-1" or "n".
func (d Divisor) String() string {
	switch d {
	case DivisorNMinus1:
		return "n-1"
	case DivisorN:
		return "n"
	}
	return fmt.Sprintf("Divisor(%d)", int(d))
}

// MarshalText writes the divisor as String does.
func (d Divisor) MarshalText() ([]byte, error) { return []byte(d.String()), nil }

// ParseDivisor reads "n-1" or "n" (surrounding space ignored). The empty
// string gives the default, DivisorNMinus1. Anything else is an error.
func ParseDivisor(s string) (Divisor, error) {
	switch strings.TrimSpace(s) {
	case "", "n-1":
		return DivisorNMinus1, nil
	case "n":
		return DivisorN, nil
	}
	return DivisorNMinus1, fmt.Errorf("unknown MSE divisor %q (want n-1 or n)", s)
}

// Accuracy holds the error measures of a forecast against actuals, with
// errors e_t = actual_t - forecast_t (so a positive error means the
// forecast was too low).
type Accuracy struct {
	// N is the number of pairs used: pairs where either side is NaN are
	// skipped.
	N int
	// MAD is the mean absolute deviation (1/n) sum |e_t|.
	MAD float64
	// MSE is SSE/(n-1) or SSE/n, as Divisor says.
	MSE float64
	// RMSE is sqrt(MSE).
	RMSE float64
	// MAPE is the mean absolute percentage error, in percent, over the
	// pairs with a non-zero actual.
	MAPE float64
	// MASE is the mean absolute scaled error MAD / scale.
	MASE float64
	// Bias is the mean error (1/n) sum e_t.
	Bias float64
	// TrackingSignal is the sum of errors over MAD. It describes, it does
	// not test: with unbiased independent errors it still grows like the
	// square root of N, and with overlapping errors faster. BiasTest is
	// the test; backtests leave this NaN.
	TrackingSignal float64
	// MAPESkipped counts the pairs with actual == 0 left out of MAPE.
	MAPESkipped int
	// Divisor is the MSE divisor used.
	Divisor Divisor
}

// Measure compares actual with predicted, pair by pair, and returns the
// error measures. With e_t = actual_t - predicted_t over the n pairs where
// neither side is NaN,
//
//	MAD  = (1/n) sum |e_t|
//	MSE  = (1/(n-1)) sum e_t^2   (DivisorNMinus1)   or   (1/n) sum e_t^2   (DivisorN)
//	RMSE = sqrt(MSE)
//	MAPE = (100/n') sum_{actual_t != 0} |e_t / actual_t|   (n' = n - MAPESkipped)
//	MASE = MAD / scale                                     (Hyndman & Koehler 2006)
//	Bias = (1/n) sum e_t
//	TS   = (sum e_t) / MAD
//
// scale is the MASE denominator, normally MASEScale of the training data;
// a NaN or zero scale gives MASE = NaN. A measure without enough pairs is
// NaN: everything when n = 0, MSE and RMSE with DivisorNMinus1 when n = 1,
// MAPE when every actual is zero. The tracking signal is 0 when MAD is 0
// (all errors are zero). Infinite values are used as they are and give
// infinite or NaN measures.
//
// It panics if actual and predicted differ in length (a programmer error).
func Measure(actual, predicted []float64, scale float64, div Divisor) Accuracy {
	if len(actual) != len(predicted) {
		panic(fmt.Sprintf("forecast: Measure: %d actuals but %d predictions", len(actual), len(predicted)))
	}
	var s accuracySums
	for i, y := range actual {
		s.add(y, predicted[i])
	}
	return s.accuracy(scale, div)
}

// accuracySums accumulates the sums behind Measure pair by pair, so that a
// caller holding its pairs elsewhere (a backtest's forecasts) needs no
// copy of them: adding the pairs in Measure's order gives Measure's
// result, bit for bit.
type accuracySums struct {
	n, skipped                 int
	sumAbs, sumSq, sum, sumPct float64
}

// add takes in one pair; a pair where either side is NaN is skipped.
func (s *accuracySums) add(y, f float64) {
	if math.IsNaN(y) || math.IsNaN(f) {
		return
	}
	e := y - f
	s.n++
	s.sumAbs += math.Abs(e)
	s.sumSq += e * e
	s.sum += e
	if y == 0 {
		s.skipped++
	} else {
		s.sumPct += math.Abs(e / y)
	}
}

// accuracy returns the measures of the pairs taken in (see Measure).
func (s *accuracySums) accuracy(scale float64, div Divisor) Accuracy {
	a := Accuracy{Divisor: div, N: s.n, MAPESkipped: s.skipped}
	sumAbs, sumSq, sum, sumPct := s.sumAbs, s.sumSq, s.sum, s.sumPct
	nan := math.NaN()
	if a.N == 0 {
		a.MAD, a.MSE, a.RMSE, a.MAPE, a.MASE, a.Bias, a.TrackingSignal = nan, nan, nan, nan, nan, nan, nan
		return a
	}
	n := float64(a.N)
	a.MAD = sumAbs / n
	a.Bias = sum / n
	switch {
	case div == DivisorN:
		a.MSE = sumSq / n
	case a.N > 1:
		a.MSE = sumSq / (n - 1)
	default:
		a.MSE = nan
	}
	a.RMSE = math.Sqrt(a.MSE)
	if np := a.N - a.MAPESkipped; np > 0 {
		a.MAPE = 100 * sumPct / float64(np)
	} else {
		a.MAPE = nan
	}
	if math.IsNaN(scale) || scale == 0 {
		a.MASE = nan
	} else {
		a.MASE = a.MAD / scale
	}
	if a.MAD == 0 {
		a.TrackingSignal = 0
	} else {
		a.TrackingSignal = sum / a.MAD
	}
	return a
}

// MASEScale returns the in-sample mean absolute error of the seasonal
// naive forecast on train (Hyndman & Koehler 2006, "Another look at
// measures of forecast accuracy", IJF 22(4)), the denominator of MASE:
//
//	scale = (1/(n-m)) sum_{t=m+1..n} |y_t - y_{t-m}|
//
// with m = season, or m = 1 (the naive forecast) when season <= 1. Pairs
// with a NaN are skipped and the mean is over the pairs left. It returns
// NaN when no pair is left (n <= m, say); it is 0 for a series that repeats
// itself exactly, which Measure turns into MASE = NaN.
func MASEScale(train []float64, season int) float64 {
	m := max(season, 1)
	s, k := 0.0, 0
	for t := m; t < len(train); t++ {
		d := train[t] - train[t-m]
		if math.IsNaN(d) {
			continue
		}
		s += math.Abs(d)
		k++
	}
	if k == 0 {
		return math.NaN()
	}
	return s / float64(k)
}
