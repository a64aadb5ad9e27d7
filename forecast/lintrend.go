package forecast

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"gonum.org/v1/gonum/mat"
)

// linearTrendModel is an ordinary least squares regression of the series on
// time, optionally with seasonal dummy variables:
//
//	y_t = b_0 + b_1 t + sum_{s=2..m} d_s [season(t) = s] + e_t,   t = 1..n,
//
// where season(t) = ((t-1) mod m) + 1 counts from the first observation of
// the series (the first observation is in season 1, the baseline season
// with no dummy of its own), not from the calendar. Without dummies only
// b_0 and b_1 are estimated.
type linearTrendModel struct {
	season int       // dummies for a season of this length; 1 = no dummies
	coef   []float64 // b_0, b_1, d_2..d_m
	r      *mat.Dense
	n      int
}

// linearTrendNumCoef returns the number of regression coefficients p: 2,
// plus m-1 with seasonal dummies (m = cfg.Season, values below 1 counted as
// 1).
func linearTrendNumCoef(cfg Config) int {
	if cfg.Dummies {
		return simpleSeason(cfg) + 1
	}
	return 2
}

// fitLinearTrend fits the linear trend by ordinary least squares (through
// the QR decomposition of the design matrix X), with seasonal dummies for a
// season of cfg.Season periods when cfg.Dummies is set (none when the
// season is 1). Fitted values are the in-sample regression values X b,
// each computed with the coefficients estimated on all the data (as a
// regression's fitted values are), not true one-step predictions.
//
// It returns an error if cfg.Dummies is set and cfg.Season is below 1, an
// error wrapping ErrBadNumber if y holds a NaN or an infinity and a
// *TooShortError if y has fewer than p+1 points (p = 2, or m+1 with
// dummies).
func fitLinearTrend(y []float64, cfg Config) (Model, error) {
	if cfg.Dummies && cfg.Season < 1 {
		return nil, fmt.Errorf("%v: season must be at least 1, got %d", LinearTrend, cfg.Season)
	}
	if err := simpleCheck(y, LinearTrend, simpleMinPoints(LinearTrend, cfg)); err != nil {
		return nil, err
	}
	m := &linearTrendModel{season: 1, n: len(y)}
	if cfg.Dummies {
		m.season = cfg.Season
	}
	p := m.season + 1
	x := mat.NewDense(m.n, p, nil)
	for i := 0; i < m.n; i++ {
		m.rowTo(x.RawRowView(i), i)
	}
	var qr mat.QR
	qr.Factorize(x)
	m.r = mat.NewDense(p, p, nil)
	var rFull mat.Dense
	qr.RTo(&rFull)
	m.r.Copy(rFull.Slice(0, p, 0, p))
	// The design has full column rank whenever n >= p+1 (the time column is
	// not constant and every season occurs); check anyway.
	rmax := 0.0
	for i := 0; i < p; i++ {
		rmax = math.Max(rmax, math.Abs(m.r.At(i, i)))
	}
	for i := 0; i < p; i++ {
		if math.Abs(m.r.At(i, i)) <= 1e-12*rmax {
			return nil, errors.New("linear-trend: the regression design is singular")
		}
	}
	var b mat.VecDense
	var cond mat.Condition
	if err := qr.SolveVecTo(&b, false, mat.NewVecDense(m.n, append([]float64(nil), y...))); err != nil && !errors.As(err, &cond) {
		return nil, fmt.Errorf("linear-trend: %w", err)
	}
	m.coef = make([]float64, p)
	for i := range m.coef {
		m.coef[i] = b.AtVec(i)
	}
	return m, nil
}

// rowTo writes the regressors of observation i (0-based; t = i+1) into
// x, which holds season+1 values.
func (m *linearTrendModel) rowTo(x []float64, i int) {
	clear(x)
	x[0] = 1
	x[1] = float64(i + 1)
	if s := i % m.season; s > 0 {
		x[s+1] = 1
	}
}

// line returns the regression values for observations from..to-1
// (0-based; past n-1 they are forecasts). Each is the sum of coef[j]
// times regressor j in the order of j, zeros included, as a dot product
// with the row of rowTo would add them, without building the row.
func (m *linearTrendModel) line(from, to int) []float64 {
	v := make([]float64, to-from)
	for i := range v {
		t := from + i
		dummy := t%m.season + 1 // the regressor set to 1 (1: none, being the slope's)
		var s float64
		for j, c := range m.coef {
			switch {
			case j == 0:
				s += c
			case j == 1:
				s += c * float64(t+1)
			case j == dummy:
				s += c
			default:
				s += c * 0
			}
		}
		v[i] = s
	}
	return v
}

func (m *linearTrendModel) Method() Method    { return LinearTrend }
func (m *linearTrendModel) Params() Params    { return simpleNoParams() }
func (m *linearTrendModel) Fitted() []float64 { return m.line(0, m.n) }

// NumParams is the number of regression coefficients: 2, or m+1 with
// seasonal dummies.
func (m *linearTrendModel) NumParams() int { return len(m.coef) }

// Describe gives the slope, e.g. "slope 0.452 per period", and adds
// ", dummies for season 12" when there are seasonal dummies.
func (m *linearTrendModel) Describe() string {
	s := "slope " + strconv.FormatFloat(m.coef[1], 'g', 4, 64) + " per period"
	if m.season > 1 {
		s += fmt.Sprintf(", dummies for season %d", m.season)
	}
	return s
}

// Forecast extends the regression line (and the seasonal pattern of the
// dummies) to t = n+1..n+h.
func (m *linearTrendModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	return m.line(m.n, m.n+h)
}

// Filter returns the regression values for t = 1..len(y). They depend on
// time only, so the values of y are not used: with the coefficients held,
// the regression predicts the same line whatever the data. It accepts any
// length.
func (m *linearTrendModel) Filter(y []float64) []float64 {
	return m.line(0, len(y))
}

// VarianceFactors returns the OLS prediction variance factors
//
//	c_h = 1 + x_{n+h}' (X'X)^{-1} x_{n+h},
//
// where x_{n+h} is the regressor row of period n+h, so that the variance of
// the h-step error is sigma^2 c_h with sigma^2 = SSE/(n-p), the regression
// residual variance (any regression text, e.g. Montgomery, Peck & Vining,
// Introduction to Linear Regression Analysis, section on prediction of new
// observations). With X = QR, x'(X'X)^{-1}x = |R^{-T} x|^2, which is how it
// is computed.
func (m *linearTrendModel) VarianceFactors(h int) ([]float64, bool) {
	simpleCheckHorizon(h)
	p := len(m.coef)
	c := make([]float64, h)
	z := make([]float64, p)
	x := make([]float64, p)
	for k := range c {
		m.rowTo(x, m.n+k)
		// Forward substitution for R' z = x (R upper triangular).
		ss := 0.0
		for i := 0; i < p; i++ {
			s := x[i]
			for j := 0; j < i; j++ {
				s -= m.r.At(j, i) * z[j]
			}
			z[i] = s / m.r.At(i, i)
			ss += z[i] * z[i]
		}
		c[k] = 1 + ss
	}
	return c, true
}
