package forecast

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// BiasLevel is the significance level of BiasTest.Significant: 5%.
const BiasLevel = 0.05

// A BiasTest says whether a sequence of forecast errors, e = actual -
// forecast in time order, averages zero: a positive mean means the
// forecasts ran low. See MeanErrorTest for the statistic.
type BiasTest struct {
	// N is the number of errors tested.
	N int
	// Mean is the mean error (1/N) sum e.
	Mean float64
	// SE is the Newey-West (1987) standard error of Mean, Bartlett kernel
	// with lag Lag, times sqrt(N/(N-1)).
	SE  float64
	Lag int
	// T is Mean / SE, and P its two-sided p-value from Student's t
	// distribution with N-1 degrees of freedom.
	T, P float64
}

// Significant reports whether the mean error differs from zero at the 5%
// level (P < BiasLevel). A test without a p-value (NaN) is not
// significant.
func (b BiasTest) Significant() bool { return b.P < BiasLevel }

// PText gives the p-value for reports: "p = 0.042", "p < 0.001" below a
// thousandth, or "p -" when there is none.
func (b BiasTest) PText() string {
	switch {
	case math.IsNaN(b.P):
		return "p -"
	case b.P < 0.001:
		return "p < 0.001"
	}
	return fmt.Sprintf("p = %.3f", b.P)
}

// NeweyWest returns the Newey-West (1987) estimate of the long-run
// variance of a series u that has mean zero (the caller removes it), with
// the Bartlett kernel and lag L:
//
//	S = (1/n) [ sum_t u_t^2 + 2 sum_{j=1..L} (1 - j/(L+1)) sum_{t=j+1..n} u_t u_{t-j} ]
//
// (W. K. Newey and K. D. West 1987, "A simple, positive semi-definite,
// heteroskedasticity and autocorrelation consistent covariance matrix",
// Econometrica 55(3) 703-708). The weights keep S non-negative. A lag of
// 0 gives the plain mean square; lags of n and more add nothing beyond
// lag n-1. It returns NaN for an empty u and panics if lag is negative.
func NeweyWest(u []float64, lag int) float64 {
	if lag < 0 {
		panic(fmt.Sprintf("forecast: NeweyWest: lag %d", lag))
	}
	n := len(u)
	if n == 0 {
		return math.NaN()
	}
	s := 0.0
	for _, v := range u {
		s += v * v
	}
	for j := 1; j <= lag && j < n; j++ {
		c := 0.0
		for t := j; t < n; t++ {
			c += u[t] * u[t-j]
		}
		s += 2 * (1 - float64(j)/float64(lag+1)) * c
	}
	return s / float64(n)
}

// NeweyWestLag returns the usual rule of thumb for the Bartlett lag of n
// observations, floor(4 (n/100)^(2/9)) (Newey & West 1994, "Automatic lag
// selection in covariance matrix estimation", Review of Economic Studies
// 61(4) 631-653; from memory): 2 for n = 19, 3 for n = 36, 4 for n = 100.
// It is 0 for n < 1.
func NeweyWestLag(n int) int {
	if n < 1 {
		return 0
	}
	return int(math.Floor(4 * math.Pow(float64(n)/100, 2.0/9)))
}

// MeanErrorTest tests whether errs, forecast errors in time order, average
// zero, allowing for serial correlation up to lag. NaN errors are left
// out. With the N errors left, u_t = e_t - Mean,
//
//	Mean = (1/N) sum e_t
//	SE^2 = NeweyWest(u, lag) / (N-1)
//	T    = Mean / SE,   P = 2 P(t_{N-1} > |T|)
//
// that is the Newey-West (1987) standard error of a mean with the small
// sample factor N/(N-1), and Student's t with N-1 degrees of freedom for
// the p-value, which errs less than the normal distribution with the few
// errors of a backtest. It matches statsmodels' OLS(e, ones) fitted with
// cov_type "HAC", use_correction and use_t (see
// testdata/reference/gen_bias.py). Diebold & Mariano (1995, "Comparing
// predictive accuracy", Journal of Business & Economic Statistics 13(3)
// 253-263) test mean forecast-error differences the same way.
//
// With fewer than 2 errors, SE, T and P are NaN (no test). An SE of 0
// (every error the same) gives T = 0 and P = 1 when Mean is 0, else an
// infinite T and P = 0. It panics if lag is negative.
func MeanErrorTest(errs []float64, lag int) BiasTest {
	if lag < 0 {
		panic(fmt.Sprintf("forecast: MeanErrorTest: lag %d", lag))
	}
	var e []float64
	for _, v := range errs {
		if !math.IsNaN(v) {
			e = append(e, v)
		}
	}
	nan := math.NaN()
	b := BiasTest{N: len(e), Lag: lag, Mean: nan, SE: nan, T: nan, P: nan}
	if b.N == 0 {
		return b
	}
	sum := 0.0
	for _, v := range e {
		sum += v
	}
	b.Mean = sum / float64(b.N)
	if b.N < 2 {
		return b
	}
	u := make([]float64, b.N)
	for i, v := range e {
		u[i] = v - b.Mean
	}
	b.SE = math.Sqrt(NeweyWest(u, lag) / float64(b.N-1))
	switch {
	case b.SE > 0:
		b.T = b.Mean / b.SE
	case b.Mean == 0:
		b.T = 0
	default:
		b.T = math.Copysign(math.Inf(1), b.Mean)
	}
	b.P = 2 * distuv.StudentsT{Mu: 0, Sigma: 1, Nu: float64(b.N - 1)}.Survival(math.Abs(b.T))
	return b
}

// BiasOf is MeanErrorTest with the lag NeweyWestLag(N), N the number of
// errors that are not NaN: the lag allows for the serial correlation that
// the one-step errors of a model that does not fit keep (those of a model
// that fits are uncorrelated).
func BiasOf(errs []float64) BiasTest {
	n := 0
	for _, v := range errs {
		if !math.IsNaN(v) {
			n++
		}
	}
	return MeanErrorTest(errs, NeweyWestLag(n))
}
