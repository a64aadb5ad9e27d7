package forecast

import (
	"fmt"
	"math"
	"strings"
)

// BandSource says what the variance of the error bands rests on.
type BandSource int

// The band sources. Calibrated is the zero value and the default.
const (
	// Calibrated measures the spread at each lead time on the errors of
	// forecasts made from earlier origins (the backtest), smoothed across
	// lead times and shrunk toward the model's own variance where those
	// errors are few (see CalibrateVariance).
	Calibrated BandSource = iota
	// FromModel takes the variance the model class implies from its
	// in-sample one-step errors (see Variance's analytic source).
	FromModel
)

// String returns calibrated or model, the words the scenario file uses.
func (b BandSource) String() string {
	if b == FromModel {
		return "model"
	}
	return "calibrated"
}

// ParseBandSource reads calibrated or model; "" gives Calibrated.
func ParseBandSource(s string) (BandSource, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "calibrated":
		return Calibrated, nil
	case "model":
		return FromModel, nil
	}
	return Calibrated, fmt.Errorf("unknown band source %q (want calibrated or model)", s)
}

// Shrinkage weights of CalibrateVariance, in errors: a lead time's own
// ratio counts as much as the pooled ratio once it rests on leadPrior
// errors, and the pooled ratio as much as the model's variance once it
// rests on poolPrior errors.
const (
	leadPrior = 8
	poolPrior = 4
)

// Calibration describes a calibrated variance: how many out-of-sample
// errors it rests on.
type Calibration struct {
	// Errors is the number of backtest errors used, Origins the number of
	// forecast origins they came from and Leads the longest lead time
	// with at least one error.
	Errors, Origins, Leads int
	// Shaped is true when the calibration leaned on the model's analytic
	// variance; without one the errors' own shape is used and Ratio is 1
	// by construction.
	Shaped bool
	// Selection is true when the errors are those of the selection itself
	// (auto and combination: see Result's calibrated bands), not of one
	// fixed method.
	Selection bool
	// DF is the degrees of freedom the variance rests on (set by
	// Result's calibrated bands: one per origin, plus poolPrior for the
	// model's variance it leans on).
	DF int
	// Ratio is the pooled ratio of the out-of-sample mean squared error to
	// the model's variance at the same lead times, after shrinkage: above
	// 1, the model's own bands were too narrow out of sample.
	Ratio float64
}

// CalibrateVariance returns the forecast error variance at lead times
// 1..len(shape) from rolling-origin errors, errs[i][k] being the (k+1)-step
// error of origin i (NaN where missing), in the manner of the empirical
// limits of Williams & Goodman (1971, "A simple method for the
// construction of empirical confidence limits for economic forecasts",
// JASA 66(336), 752-754): the spread at each lead time is how wrong
// earlier forecasts were at that lead time. shape is the model's variance
// at each lead time (its analytic variance, in the data's units), or nil
// for a model without one. With n_h errors of mean square m_h at lead h
// and s_h = shape_h:
//
//	K  = sum n_h m_h / sum n_h s_h                  pooled ratio
//	K' = (N K + poolPrior) / (N + poolPrior)        shrunk toward 1, N = sum n_h
//	k_h = (n_h m_h/s_h + leadPrior K') / (n_h + leadPrior)
//	v_h = k_h s_h,  then made non-decreasing in h
//
// so a lead time with many errors keeps its own spread, one with few
// leans on the pooled ratio times the model's shape, and a short history
// leans on the model. Beyond the longest lead time reached, k_h stays at
// the last one's value. The last step is the weighted isotonic (pool
// adjacent violators) fit, since the error of a forecast from one origin
// does not shrink as it reaches further ahead. Without a shape the
// isotonic fit of m_h is the shape (grown in proportion to h past the
// last lead reached) and K = 1. It returns nil when errs holds no finite
// error.
func CalibrateVariance(errs [][]float64, shape []float64) ([]float64, Calibration) {
	h := len(shape)
	if shape == nil {
		h = 0
		for _, row := range errs {
			h = max(h, len(row))
		}
	}
	n, m, cal := leadMoments(errs, h)
	if cal.Errors == 0 || h == 0 {
		return nil, cal
	}
	if shape == nil {
		shape = empiricalShape(n, m)
	}
	var num, den float64
	for k := range n {
		if n[k] > 0 && shape[k] > 0 {
			num += float64(n[k]) * m[k]
			den += float64(n[k]) * shape[k]
		}
	}
	K := 1.0
	if den > 0 {
		K = num / den
	}
	N := float64(cal.Errors)
	cal.Ratio = (N*K + poolPrior) / (N + poolPrior)
	v := make([]float64, len(shape))
	w := make([]float64, len(shape))
	ratio := cal.Ratio
	for k := range v {
		if k < len(n) && n[k] > 0 && shape[k] > 0 {
			nk := float64(n[k])
			ratio = (nk*m[k]/shape[k] + leadPrior*cal.Ratio) / (nk + leadPrior)
			w[k] = nk + leadPrior
		} else {
			w[k] = leadPrior
		}
		v[k] = ratio * shape[k]
	}
	return isotonic(v, w), cal
}

// leadMoments returns the count n[k] and mean square m[k] of the finite
// (k+1)-step errors, for k < h.
func leadMoments(errs [][]float64, h int) (n []int, m []float64, cal Calibration) {
	n, m = make([]int, h), make([]float64, h)
	for _, row := range errs {
		used := false
		for k, e := range row {
			if k >= h || math.IsNaN(e) || math.IsInf(e, 0) {
				continue
			}
			n[k]++
			m[k] += e * e
			cal.Errors++
			cal.Leads = max(cal.Leads, k+1)
			used = true
		}
		if used {
			cal.Origins++
		}
	}
	for k := range m {
		if n[k] > 0 {
			m[k] /= float64(n[k])
		}
	}
	return n, m, cal
}

// empiricalShape is the variance shape of a model without an analytic
// one: the isotonic fit of the mean squares m (weighted by their counts
// n) over the lead times reached, grown in proportion to the lead time
// past the last one reached.
func empiricalShape(n []int, m []float64) []float64 {
	var reached []int
	var vals, wts []float64
	for k := range n {
		if n[k] > 0 {
			reached = append(reached, k)
			vals = append(vals, m[k])
			wts = append(wts, float64(n[k]))
		}
	}
	fit := isotonic(vals, wts)
	shape := make([]float64, len(n))
	j := 0
	for k := range shape {
		for j+1 < len(reached) && reached[j+1] <= k {
			j++
		}
		switch {
		case k < reached[0]:
			shape[k] = fit[0]
		case k == reached[j]:
			shape[k] = fit[j]
		case j == len(reached)-1:
			shape[k] = fit[j] * float64(k+1) / float64(reached[j]+1)
		default: // between two reached leads
			shape[k] = fit[j]
		}
	}
	return shape
}

// isotonic returns the non-decreasing sequence closest to y in weighted
// least squares (weights w > 0), by pooling adjacent violators (Barlow,
// Bartholomew, Bremner & Brunk 1972, Statistical Inference under Order
// Restrictions, ch. 1).
func isotonic(y, w []float64) []float64 {
	type block struct {
		sum, wt float64
		n       int
	}
	var bs []block
	for i := range y {
		bs = append(bs, block{y[i] * w[i], w[i], 1})
		for len(bs) > 1 {
			a, b := bs[len(bs)-2], bs[len(bs)-1]
			if a.sum/a.wt <= b.sum/b.wt {
				break
			}
			bs = append(bs[:len(bs)-2], block{a.sum + b.sum, a.wt + b.wt, a.n + b.n})
		}
	}
	out := make([]float64, 0, len(y))
	for _, b := range bs {
		for range b.n {
			out = append(out, b.sum/b.wt)
		}
	}
	return out
}
