package forecast

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
)

// ErrFewCommonPeriods is returned (wrapped) when the series to be summed
// share fewer than two periods with a one-step error.
var ErrFewCommonPeriods = errors.New("the series share fewer than 2 periods with a one-step error")

// CommonErrors holds the one-step in-sample errors of several series on
// the periods they all have one for: the joint behaviour of the series'
// errors, period by period.
type CommonErrors struct {
	// Periods lists, in order, the periods in which every series has a
	// finite one-step error.
	Periods []Period
	// Errors[i][t] is series i's error in Periods[t], less the mean of
	// series i's errors over Periods (centred, as the Monte Carlo's shock
	// pool is).
	Errors [][]float64
	// Skipped counts the periods left out because some series, but not
	// all, has an error in them (a series that starts later or ends
	// earlier, or whose method makes no prediction there).
	Skipped int
}

// AlignErrors lines up the one-step in-sample errors (Result.Residuals) of
// the results on their periods (Series.Start, Series.Period). A period is
// kept only when every series has a finite error in it; the others are
// counted in Skipped. It returns an error when the list is empty, when the
// frequencies differ, or (ErrFewCommonPeriods) when fewer than two periods
// are common to all.
func AlignErrors(results []*Result) (CommonErrors, error) {
	if len(results) == 0 {
		return CommonErrors{}, errors.New("no series to sum")
	}
	res, offset, span, err := errorSpan(results)
	if err != nil {
		return CommonErrors{}, err
	}
	count := make([]int, span)
	for i, e := range res {
		for k, x := range e {
			if isFinite(x) {
				count[offset[i]+k]++
			}
		}
	}
	var c CommonErrors
	var keep []int // positions in the span
	for pos, n := range count {
		switch {
		case n == len(res):
			keep = append(keep, pos)
		case n > 0:
			c.Skipped++
		}
	}
	if len(keep) < 2 {
		return CommonErrors{}, fmt.Errorf("%w (%d shared, %d with only some series)", ErrFewCommonPeriods, len(keep), c.Skipped)
	}
	first := results[0].Series.Start.Add(-offset[0])
	for _, pos := range keep {
		c.Periods = append(c.Periods, first.Add(pos))
	}
	c.Errors = make([][]float64, len(res))
	for i, e := range res {
		row := make([]float64, len(keep))
		for t, pos := range keep {
			row[t] = e[pos-offset[i]]
		}
		m := 0.0
		for _, x := range row {
			m += x
		}
		m /= float64(len(row))
		for t := range row {
			row[t] -= m
		}
		c.Errors[i] = row
	}
	return c, nil
}

// errorSpan returns every result's residuals, the offset of each series'
// start from the earliest start, and the number of periods from the
// earliest start to the latest end.
func errorSpan(results []*Result) (res [][]float64, offset []int, span int, err error) {
	freq := results[0].Series.Freq()
	first := results[0].Series.Start
	for _, r := range results {
		if f := r.Series.Freq(); f != freq {
			return nil, nil, 0, fmt.Errorf("series %q is %s and series %q is %s: only series of one frequency add up", results[0].Series.Name, freq, r.Series.Name, f)
		}
		if r.Series.Start.Before(first) {
			first = r.Series.Start
		}
	}
	res = make([][]float64, len(results))
	offset = make([]int, len(results))
	for i, r := range results {
		res[i] = r.Residuals()
		offset[i] = r.Series.Start.Sub(first)
		span = max(span, offset[i]+len(res[i]))
	}
	return res, offset, span, nil
}

func isFinite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// Draw picks one of the common periods at random (uniformly, with r) and
// writes every series' error in that period into dst (len(dst) must be the
// number of series; Draw panics otherwise). It returns the index of the
// period in Periods. Drawing whole periods this way keeps, on every path
// of a Monte Carlo, the errors of all the series from the same historical
// period, and with them the series' correlation: the residual bootstrap
// applied to whole vectors of residuals, one vector per period (common
// practice for several series at once). It panics on a zero CommonErrors.
func (c CommonErrors) Draw(r *rand.Rand, dst []float64) int {
	t := r.IntN(len(c.Periods))
	c.Row(t, dst)
	return t
}

// Row writes every series' error in Periods[t] into dst.
func (c CommonErrors) Row(t int, dst []float64) {
	if len(dst) != len(c.Errors) {
		panic("forecast: CommonErrors.Row with len(dst) != number of series")
	}
	for i, e := range c.Errors {
		dst[i] = e[t]
	}
}

// SumVariance returns the forecast error variance at lead times 1..h of
// the sum of the results' forecasts. The sum's band is not a sum of bands:
// its spread depends on how the series' errors move together.
//
// Each series i keeps its own error variance v_ih (VarianceFrom with mode
// and from, the variance behind its own bands) and its own way of carrying
// a surprise forward (ImpulseWeights psi_ij, psi_i0 = 1), the error model
// of the Monte Carlo and of LeadTimeVariance:
//
//	e_ih = k_ih sum_{j=0}^{h-1} psi_ij eps_i,h-j,
//	k_ih = sqrt(v_ih / (s_i² sum_{j<h} psi_ij²)).
//
// The shocks of one period come from one historical period drawn for all
// the series together, uniformly over N periods (span, or, when span is
// smaller, the periods from the first to the last with an error in any
// series); each series takes its own centred one-step error there, or,
// when it has none there (it starts later or ends earlier), the error at
// place floor(u n_i) of its own n_i errors counted back from its last, u
// a uniform number shared by all the series (the Monte Carlo of a
// portfolio, sim.SimulatePortfolio). s_i² is the mean square of series
// i's centred errors, and shocks of different periods are independent.
// With e_it series i's centred error in period t (0 where it has none),
// and r_ik its k-th error back from its last,
//
//	Var(sum_i e_ih) = sum_{j=0}^{h-1} [ (1/N) sum_t (sum_i c_ij e_it)²
//	        + sum_L ((N − L)/N) (1/L) sum_{k<L} (sum_{i: n_i = L} c_ij r_ik)² ],
//	c_ij = k_ih psi_ij:
//
// the variance of per-period sums of scaled one-step errors, which carries
// every covariance between the series over the periods they share without
// forming a matrix, plus the draws taken apart, where series with as many
// errors (n_i = L) take the same place and so keep their correlation.
// O(h² N m) operations for m series. (Series with different numbers of
// errors take places apart that are counted as independent.)
//
// When all the series have errors in the same periods and carry surprises
// alike (same psi) it is sum_i sum_j sqrt(v_ih v_jh) rho_ij with rho the
// correlation of the one-step errors: the bottom-up forecast of a
// hierarchy with the h-step error covariance taken proportional to the
// one-step covariance estimated from the residuals (W_h = k_h W_1, Hyndman
// & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., section
// 11.3; here with each series' own k_ih). Two series with identical errors
// give exactly twice the standard deviation of one, independent ones of
// equal variance sqrt(2) times, a series and its negative zero.
//
// A series without errors, or whose errors are all zero, tells nothing of
// the joint behaviour: its v_ih is added as if it were independent of the
// others. It returns an error when the list is empty, when the
// frequencies differ, when h < 1 or a series' variance is negative or not
// finite.
func SumVariance(results []*Result, h int, mode BandMode, from BandSource, span int) ([]float64, error) {
	if h < 1 {
		return nil, fmt.Errorf("lead time %d: want at least 1", h)
	}
	if len(results) == 0 {
		return nil, errors.New("no series to sum")
	}
	res, offset, total, err := errorSpan(results)
	if err != nil {
		return nil, err
	}
	first, last := total, -1
	for i, e := range res {
		for k, x := range e {
			if isFinite(x) {
				first, last = min(first, offset[i]+k), max(last, offset[i]+k)
			}
		}
	}
	n := max(span, last-first+1, 1)
	errs := make([][]float64, len(results))
	own := make([][]float64, len(results))
	for i, e := range res {
		errs[i] = make([]float64, max(last-first+1, 0))
		m, _ := finiteMean(e)
		for k := len(e) - 1; k >= 0; k-- {
			if x := e[k]; isFinite(x) {
				errs[i][offset[i]+k-first] = x - m
				own[i] = append(own[i], x-m)
			}
		}
	}
	v := make([][]float64, len(results))
	psi := make([][]float64, len(results))
	for i, r := range results {
		if v[i], err = usableVariance(r, h, mode, from); err != nil {
			return nil, err
		}
		psi[i] = append([]float64{1}, ImpulseWeights(r.Model, r.Series.Values, h)...)
	}
	return sumVariance(errs, own, n, v, psi), nil
}

// finiteMean returns the mean of the finite values of e and their count
// (0 and 0 when there is none).
func finiteMean(e []float64) (mean float64, count int) {
	for _, x := range e {
		if isFinite(x) {
			mean += x
			count++
		}
	}
	if count > 0 {
		mean /= float64(count)
	}
	return mean, count
}

// usableVariance returns r's error variance at lead times 1..h
// (VarianceFrom), or an error naming the series when one is negative or
// not finite.
func usableVariance(r *Result, h int, mode BandMode, from BandSource) ([]float64, error) {
	v, _ := r.VarianceFrom(h, mode, from)
	for l, x := range v {
		if !isFinite(x) || x < 0 {
			return nil, fmt.Errorf("series %q has no usable error variance at lead time %d (%v)", r.Series.Name, l+1, x)
		}
	}
	return v, nil
}

// sumVariance is SumVariance's formula on aligned centred errors
// errs[i][t] (0 where series i has none), each series' own errors counted
// back from its last, own[i], the number n of periods drawn over,
// variances v[i][l] (lead time l+1) and weights psi[i][j] (psi[i][0] = 1).
func sumVariance(errs, own [][]float64, n int, v, psi [][]float64) []float64 {
	m, h := len(errs), len(v[0])
	s2 := make([]float64, m)
	byLen := map[int][]int{} // series by their number of errors
	var lens []int
	for i, e := range own {
		for _, x := range e {
			s2[i] += x * x
		}
		if L := len(e); L > 0 {
			s2[i] /= float64(L)
			if L < n {
				if _, ok := byLen[L]; !ok {
					lens = append(lens, L)
				}
				byLen[L] = append(byLen[L], i)
			}
		}
	}
	out := make([]float64, h)
	coef := make([]float64, m)
	var z []float64
	if m > 0 {
		z = make([]float64, len(errs[0]))
	}
	for l := range out {
		k := errorScale(v, psi, s2, l)
		for i := range m {
			if k[i] == 0 && s2[i] == 0 {
				out[l] += v[i][l] // no joint behaviour to go on: independent
			}
		}
		for j := 0; j <= l; j++ {
			for i := range m {
				coef[i] = k[i] * psi[i][j]
			}
			out[l] += sumOfSquaredSums(errs, coef, z) / float64(n)
			for _, L := range lens {
				out[l] += float64(n-L) / float64(n) / float64(L) * sumOfSquaredSumsOf(own, byLen[L], coef, L)
			}
		}
	}
	return out
}

// sumOfSquaredSumsOf returns sum_{k<L} (sum_{i in members} coef_i own_ik)².
func sumOfSquaredSumsOf(own [][]float64, members []int, coef []float64, L int) float64 {
	s := 0.0
	for k := range L {
		z := 0.0
		for _, i := range members {
			z += coef[i] * own[i][k]
		}
		s += z * z
	}
	return s
}

// errorScale returns k_i at lead time l+1 for every series: 0 where v or
// s2 is 0.
func errorScale(v, psi [][]float64, s2 []float64, l int) []float64 {
	k := make([]float64, len(v))
	for i := range k {
		ss := 0.0
		for j := 0; j <= l; j++ {
			ss += psi[i][j] * psi[i][j]
		}
		if v[i][l] > 0 && s2[i] > 0 && ss > 0 {
			k[i] = math.Sqrt(v[i][l] / (s2[i] * ss))
		}
	}
	return k
}

// sumOfSquaredSums returns sum_t (sum_i coef_i errs_it)², using z (as
// many values as errs[i]) as scratch.
func sumOfSquaredSums(errs [][]float64, coef, z []float64) float64 {
	clear(z)
	for i, e := range errs {
		if coef[i] == 0 {
			continue
		}
		for t, x := range e {
			z[t] += coef[i] * x
		}
	}
	s := 0.0
	for _, x := range z {
		s += x * x
	}
	return s
}
