package forecast

import (
	"errors"
	"fmt"
	"math"
	"strconv"
)

// Bounds of the fitted Croston smoothing constant. Low values are common
// practice for intermittent demand (from memory: Syntetos & Boylan 2005
// study 0.05 to 0.2), and the upper bound of 0.3 keeps a noisy in-sample
// fit from chasing single orders.
const (
	crostonAlphaMin = 0.05
	crostonAlphaMax = 0.3
)

// crostonModel is Croston's (1972) method for intermittent demand: the
// non-zero demand sizes and the intervals between them are smoothed
// separately with the same constant alpha. At a period t with demand
// y_t != 0 that came q periods after the previous demand,
//
//	z <- z + alpha (y_t - z)      (smoothed size)
//	p <- p + alpha (q - p)        (smoothed interval)
//
// and in a period without demand nothing changes. The forecast for every
// later period is the demand rate
//
//	yhat = z / p                  (Croston)
//	yhat = (1 - alpha/2) z / p    (SBA, Syntetos & Boylan 2005)
//
// the second removing the bias of the first. Initial state: z_0 = the first
// non-zero demand y_f and p_0 = its 1-based position f+1 (the first
// inter-demand interval, counted from one period before the series). The
// recursion starts from (z_0, p_0) before the first observation; its update
// at the first demand leaves that state unchanged, and the predictions for
// periods up to and including f are NaN, since the initial state is only
// known once the first demand has been seen.
type crostonModel struct {
	sba    bool
	alpha  float64
	fit    bool    // alpha estimated
	z0, p0 float64 // initial state
	first  int     // f, 0-based index of the first non-zero value of the fitting data
	z, p   float64 // state at the end of the data
	fitted []float64
}

// fitCroston fits Croston's method to y, or with sba set the
// Syntetos-Boylan approximation. Alpha is cfg.Fixed.Alpha when that is set
// (it must lie in (0, 1]); otherwise it minimises the in-sample squared
// one-step error
//
//	SSE(alpha) = sum_{t > f} (y_t - yhat_t)^2
//
// over [0.05, 0.3] globally: a grid of 51 points, both bounds included,
// finds the best point, then Brent's method refines it within one grid
// step on either side (to 1e-7). Ties go to the smaller alpha. Other Fixed
// fields are ignored.
//
// Zero values are the periods without demand; any other value, negative
// ones included, is a demand. It returns an error wrapping ErrBadNumber if
// y holds a NaN or an infinity, a *TooShortError if y has fewer than 2
// points, and an error if y holds no non-zero value or the fixed alpha is
// out of range.
func fitCroston(y []float64, cfg Config, sba bool) (Model, error) {
	meth := Croston
	if sba {
		meth = SBA
	}
	if a := cfg.Fixed.Alpha; a != nil && !(*a > 0 && *a <= 1) {
		return nil, fmt.Errorf("%v: alpha must be in (0, 1], got %v", meth, *a)
	}
	if err := simpleCheck(y, meth, simpleMinPoints(meth, cfg)); err != nil {
		return nil, err
	}
	first := -1
	for i, v := range y {
		if v != 0 {
			first = i
			break
		}
	}
	if first < 0 {
		return nil, errors.New(meth.String() + ": the series has no non-zero value, so there is no demand to forecast")
	}
	m := &crostonModel{sba: sba, z0: y[first], p0: float64(first + 1), first: first}
	if a := cfg.Fixed.Alpha; a != nil {
		m.alpha = *a
	} else {
		m.fit = true
		m.alpha = m.bestAlpha(y)
	}
	m.fitted, m.z, m.p = m.run(y, m.alpha)
	return m, nil
}

// run filters y with smoothing constant alpha from the held initial state
// and returns the one-step predictions (NaN up to and including m.first)
// and the final state.
func (m *crostonModel) run(y []float64, alpha float64) (pred []float64, z, p float64) {
	pred = make([]float64, len(y))
	z, p = m.z0, m.p0
	q := 0.0
	for t, v := range y {
		if t <= m.first {
			pred[t] = math.NaN()
		} else {
			pred[t] = m.rate(z, p, alpha)
		}
		q++
		if v != 0 {
			z += alpha * (v - z)
			p += alpha * (q - p)
			q = 0
		}
	}
	return pred, z, p
}

// rate returns the forecast demand per period for state (z, p).
func (m *crostonModel) rate(z, p, alpha float64) float64 {
	r := z / p
	if m.sba {
		r *= 1 - alpha/2
	}
	return r
}

// sse returns the in-sample one-step SSE for alpha, of the errors divided
// by c (a power of two from dataScale, so that the squares neither
// overflow nor underflow; the minimiser does not depend on c).
//
// It runs the recursion of run without storing the predictions, with the
// same arithmetic in the same order.
func (m *crostonModel) sse(y []float64, alpha, c float64) float64 {
	z, p := m.z0, m.p0
	q := 0.0
	s := 0.0
	for t, v := range y {
		if t > m.first {
			e := (v - m.rate(z, p, alpha)) / c
			s += e * e
		}
		q++
		if v != 0 {
			z += alpha * (v - z)
			p += alpha * (q - p)
			q = 0
		}
	}
	return s
}

// bestAlpha minimises sse over [crostonAlphaMin, crostonAlphaMax]
// globally (minimizeGlobal1D: a 51-point grid with both bounds, then
// Brent's method around the best point, to 1e-7).
func (m *crostonModel) bestAlpha(y []float64) float64 {
	c := dataScale(y)
	a, _ := minimizeGlobal1D(func(a float64) float64 { return m.sse(y, a, c) },
		crostonAlphaMin, crostonAlphaMax, 50, 1e-7)
	if math.IsNaN(a) {
		return crostonAlphaMin // no finite SSE; cannot happen for finite y
	}
	return a
}

func (m *crostonModel) Method() Method {
	if m.sba {
		return SBA
	}
	return Croston
}

// Params holds alpha; the other fields are NaN.
func (m *crostonModel) Params() Params {
	p := simpleNoParams()
	p.Alpha = m.alpha
	return p
}

// Describe gives the initial state, e.g. "initial size 5, interval 3".
func (m *crostonModel) Describe() string {
	return "initial size " + strconv.FormatFloat(m.z0, 'g', 4, 64) +
		", interval " + strconv.FormatFloat(m.p0, 'g', 4, 64)
}

// NumParams is 1 when alpha was fitted and 0 when it was fixed. The
// initial state is read off the data, not estimated, and is not counted.
func (m *crostonModel) NumParams() int {
	if m.fit {
		return 1
	}
	return 0
}

func (m *crostonModel) Fitted() []float64 { return append([]float64(nil), m.fitted...) }

// Forecast returns h copies of the demand rate at the end of the data.
func (m *crostonModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	f := make([]float64, h)
	r := m.rate(m.z, m.p, m.alpha)
	for i := range f {
		f[i] = r
	}
	return f
}

// Filter runs the recursion with the fitted alpha and initial state over
// y. Predictions up to and including the position of the first demand in
// the fitting data are NaN; demands in y before that position still update
// the state. It accepts any length.
func (m *crostonModel) Filter(y []float64) []float64 {
	pred, _, _ := m.run(y, m.alpha)
	return pred
}

// VarianceFactors returns ok = false: bands for intermittent demand come
// from backtest errors.
func (m *crostonModel) VarianceFactors(h int) ([]float64, bool) {
	simpleCheckHorizon(h)
	return nil, false
}
