package scenario

import (
	"math"
	"slices"
)

// Quantile returns the p-quantile of the sample x, which must be sorted in
// increasing order, by definition 7 of Hyndman & Fan (1996, "Sample
// quantiles in statistical packages", The American Statistician 50(4),
// 361-365), the default of R's quantile and of numpy.quantile (method
// "linear"). With n values x_1 <= ... <= x_n (1-based),
//
//	h = (n − 1) p + 1
//	Q(p) = x_⌊h⌋ + (h − ⌊h⌋) (x_⌊h⌋+1 − x_⌊h⌋),
//
// so Q(0) is the smallest value, Q(1) the largest and Q(0.5) the usual
// median. The estimate is monotone in p and interpolates linearly between
// order statistics. It returns NaN for an empty x or a NaN p, and panics if
// p is outside [0, 1] (a programmer error: callers pass fixed levels).
func Quantile(x []float64, p float64) float64 {
	if p < 0 || p > 1 {
		panic("scenario: Quantile with p outside [0, 1]")
	}
	n := len(x)
	if n == 0 || math.IsNaN(p) {
		return math.NaN()
	}
	h := float64(n-1) * p // 0-based position
	lo := int(math.Floor(h))
	if lo >= n-1 {
		return x[n-1]
	}
	frac := h - float64(lo)
	if frac == 0 {
		return x[lo]
	}
	return x[lo] + frac*(x[lo+1]-x[lo])
}

// Quantiles returns the quantiles of x at each level of ps (see Quantile).
// x need not be sorted: Quantiles sorts a copy and leaves x as it is.
func Quantiles(x []float64, ps ...float64) []float64 {
	s := slices.Clone(x)
	slices.Sort(s)
	out := make([]float64, len(ps))
	for i, p := range ps {
		out[i] = Quantile(s, p)
	}
	return out
}

// Levels are the quantile levels reported for every simulated period.
var Levels = [5]float64{0.05, 0.10, 0.50, 0.90, 0.95}

// Spread summarises a simulated quantity in one period: its mean over the
// paths and its P5, P10, P50, P90 and P95 quantiles (Quantile, definition
// 7).
type Spread struct {
	// Mean is the arithmetic mean over the paths.
	Mean float64
	// P5, P10, P50, P90 and P95 are the quantiles at Levels.
	P5, P10, P50, P90, P95 float64
}

// spreadOf sorts col in place and returns its Spread. The mean is summed
// before sorting, in path order, so it does not depend on the sort.
func spreadOf(col []float64) Spread {
	s := Spread{Mean: mean(col)}
	slices.Sort(col)
	s.P5 = Quantile(col, Levels[0])
	s.P10 = Quantile(col, Levels[1])
	s.P50 = Quantile(col, Levels[2])
	s.P90 = Quantile(col, Levels[3])
	s.P95 = Quantile(col, Levels[4])
	return s
}

// mean returns the arithmetic mean of x, NaN when x is empty.
func mean(x []float64) float64 {
	if len(x) == 0 {
		return math.NaN()
	}
	return Total(x) / float64(len(x))
}
