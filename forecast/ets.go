package forecast

import (
	"errors"
	"fmt"
	"math"
	"strconv"
)

// etsShape is the structure of an exponential smoothing model.
type etsShape struct {
	method Method
	trend  bool // additive trend
	damped bool // damped trend (phi estimated or held)
	season int  // season length m; 0 without a season
	mult   bool // multiplicative season
}

// etsShapeFor returns the structure of method m under cfg. Holt and SES
// ignore cfg.Damped and cfg.Season; Holt-Winters needs cfg.Season >= 2.
// It panics if m is not an exponential smoothing method.
func etsShapeFor(m Method, cfg Config) (etsShape, error) {
	sh := etsShape{method: m}
	switch m {
	case SES:
	case Holt:
		sh.trend = true
	case DampedHolt:
		sh.trend, sh.damped = true, true
	case HoltWintersAdditive, HoltWintersMultiplicative:
		sh.trend, sh.damped = true, cfg.Damped
		sh.season = cfg.Season
		sh.mult = m == HoltWintersMultiplicative
		if cfg.Season < 2 {
			return sh, fmt.Errorf("%s needs a season of at least 2 periods, not %d", m, cfg.Season)
		}
	default:
		panic("forecast: " + m.String() + " is not an exponential smoothing method")
	}
	return sh, nil
}

// etsParams are the smoothing parameters in component form. A model
// without a trend has beta = 0, without a season gamma = 0, and without
// damping phi = 1.
type etsParams struct {
	alpha, beta, gamma, phi float64
}

// etsStates are the states of a model at one time: the level, the trend
// and the m seasonal states, oldest first, so that season[j] is the one
// used j+1 steps later (nil without a season). Initial states are those
// at time 0, before the first observation: season[j] = s_{j+1-m}.
type etsStates struct {
	level, trend float64
	season       []float64
}

func (s etsStates) clone() etsStates {
	s.season = append([]float64(nil), s.season...)
	return s
}

// etsMinPoints returns the fewest observations fitETS accepts for method
// m with season length season (used by the Holt-Winters methods only):
//
//	ses                            3
//	holt                           5
//	damped-holt                    6
//	holt-winters-*                 max(2m, m+6)
//
// that is, one more than the number of estimated quantities (parameters
// plus free initial states, with the trend damped) and, for a seasonal
// model, two full seasons. It panics if m is not an exponential smoothing
// method.
func etsMinPoints(m Method, season int) int {
	switch m {
	case SES:
		return 3
	case Holt:
		return 5
	case DampedHolt:
		return 6
	case HoltWintersAdditive, HoltWintersMultiplicative:
		return max(2*season, season+6)
	}
	panic("forecast: " + m.String() + " is not an exponential smoothing method")
}

// fitETS fits SES, Holt, DampedHolt, HoltWintersAdditive or
// HoltWintersMultiplicative to y and returns the fitted Model.
//
// cfg.Season is the season length m (already resolved, >= 1; used by the
// Holt-Winters methods, which need m >= 2); cfg.Damped damps the trend of
// the Holt-Winters methods; non-nil fields of cfg.Fixed hold the
// parameters they point to (fields a method does not use are ignored).
// Everything else, parameters and initial states, is estimated by
// minimising the sum of squared one-step errors over all n observations
// (see etsFitter for the method and the bounds). The recursions are
// documented on etsModel.
//
// It returns an error, never a panic, for bad data: a *TooShortError (with
// Need = etsMinPoints and Series left empty for the caller to fill) when y
// is too short; an error wrapping ErrEmptyCell for a NaN and ErrBadNumber
// for an infinity; for the multiplicative season an error when a value is
// zero or negative; and an error when a held parameter is out of range
// (alpha, beta, gamma in [0, 1], phi in (0, 1]). Positions in messages are
// 1-based. A fit that fails (no parameters in the bounds give a finite
// SSE, or a parameter, state or prediction comes out non-finite) is an
// error too: the model returned always has fitted parameters. The
// estimation runs on y divided by a power of two near its mean absolute
// value (dataScale), so data near 1e160 or 1e-160 fit as well as data
// near 1; the model is in the units of y. It panics if m is not one of
// the five methods.
func fitETS(y []float64, m Method, cfg Config) (Model, error) {
	return fitETSFrom(y, m, cfg, nil, false)
}

// fitETSFrom is fitETS with the full search of the smoothing parameters
// (etsFitter.fit) when start is nil, and otherwise one local descent from
// the parameters *start (etsFitter.fitFrom). oneStart leaves out the full
// search's descents from further grid points (see fitScoring).
func fitETSFrom(y []float64, m Method, cfg Config, start *etsParams, oneStart bool) (Model, error) {
	sh, err := etsShapeFor(m, cfg)
	if err != nil {
		return nil, err
	}
	if need := etsMinPoints(m, sh.season); len(y) < need {
		return nil, &TooShortError{Method: m, Need: need, Have: len(y)}
	}
	for i, v := range y {
		switch {
		case math.IsNaN(v):
			return nil, fmt.Errorf("%s: the series has NaN at position %d: %w", m, i+1, ErrEmptyCell)
		case math.IsInf(v, 0):
			return nil, fmt.Errorf("%s: the series has %v at position %d: %w", m, v, i+1, ErrBadNumber)
		case sh.mult && v <= 0:
			return nil, fmt.Errorf("%s needs positive data; the series has %s at position %d",
				m, strconv.FormatFloat(v, 'g', -1, 64), i+1)
		}
	}
	fixed, err := etsCheckFixed(sh, cfg.Fixed)
	if err != nil {
		return nil, err
	}
	// Fit on y scaled to a mean absolute value near 1 (exactly: the scale
	// is a power of two), so that values near 1e160 or 1e-160 neither
	// overflow nor underflow in the sums of squares; the states go back
	// to the units of y.
	c := dataScale(y)
	f := newETSFitter(sh, scaleBy(y, c), fixed)
	var par etsParams
	var init etsStates
	var nEst int
	f.oneStart = oneStart
	if start != nil {
		par, init, nEst = f.fitFrom(*start)
	} else {
		par, init, nEst = f.fit()
	}
	ok := f.bestF < math.Inf(1)
	f.release()
	if !ok {
		return nil, fmt.Errorf("%s: the fit failed: no smoothing parameters in their bounds give a finite in-sample error", m)
	}
	init.level *= c
	init.trend *= c
	if !sh.mult {
		for j := range init.season {
			init.season[j] *= c
		}
	}
	md, fitted := runETSModel(sh, par, init, y)
	md.nEst = nEst
	if err := md.checkFinite(fitted); err != nil {
		return nil, fmt.Errorf("%s: the fit failed: %w", m, err)
	}
	return md, nil
}

// checkFinite returns an error if a parameter, a state or a fitted value
// (of fitted, the model's one-step predictions) is not finite.
func (md *etsModel) checkFinite(fitted []float64) error {
	bad := func(v float64) bool { return math.IsNaN(v) || math.IsInf(v, 0) }
	p := md.par
	if bad(p.alpha) || bad(p.beta) || bad(p.gamma) || bad(p.phi) {
		return fmt.Errorf("a smoothing parameter is not finite (%+v)", p)
	}
	for _, st := range []etsStates{md.init, md.last} {
		if bad(st.level) || bad(st.trend) {
			return errors.New("the level or trend is not finite")
		}
		for _, v := range st.season {
			if bad(v) {
				return errors.New("a seasonal state is not finite")
			}
		}
	}
	for i, v := range fitted {
		if bad(v) {
			return fmt.Errorf("the one-step prediction at position %d is %v", i+1, v)
		}
	}
	return nil
}

// etsCheckFixed validates the held parameters that apply to the shape and
// returns them, NaN where a parameter is to be estimated.
func etsCheckFixed(sh etsShape, fx Fixed) ([4]float64, error) {
	out := [4]float64{math.NaN(), math.NaN(), math.NaN(), math.NaN()}
	// check holds parameter i at *p if the model uses it, after checking
	// it is in [0, 1] (or (0, 1] when zeroOK is false).
	check := func(i int, name string, p *float64, use, zeroOK bool) error {
		if p == nil || !use {
			return nil
		}
		v := *p
		if math.IsNaN(v) || v < 0 || v > 1 || (!zeroOK && v == 0) {
			iv := "[0, 1]"
			if !zeroOK {
				iv = "(0, 1]"
			}
			return fmt.Errorf("%s: %s = %s is outside %s", sh.method, name, strconv.FormatFloat(v, 'g', -1, 64), iv)
		}
		out[i] = v
		return nil
	}
	if err := check(etsAlpha, "alpha", fx.Alpha, true, true); err != nil {
		return out, err
	}
	if err := check(etsBeta, "beta", fx.Beta, sh.trend, true); err != nil {
		return out, err
	}
	if err := check(etsGamma, "gamma", fx.Gamma, sh.season > 0, true); err != nil {
		return out, err
	}
	if err := check(etsPhi, "phi", fx.Phi, sh.damped, false); err != nil {
		return out, err
	}
	return out, nil
}

// etsModel is a fitted (or given) exponential smoothing model: simple
// exponential smoothing (SES), Holt's linear trend, Holt's damped trend or
// Holt-Winters with an additive or a multiplicative season. It implements
// Model. The models are written in the component form with the parameter
// names of statsmodels' ExponentialSmoothing (alpha = smoothing_level,
// beta = smoothing_trend, gamma = smoothing_seasonal, phi = damping_trend),
// so that runs with the same parameters and initial states give the same
// numbers.
//
// With data y_1..y_n, level l_t, trend b_t, season s_t of length m, and
// φ = 1 for an undamped trend, b = 0 without a trend, s = 0 (additive) or 1
// (multiplicative) without a season, the one-step prediction and the updates
// for an additive season are
//
//	ŷ_t = l_{t-1} + φ b_{t-1} + s_{t-m}
//	l_t = α (y_t - s_{t-m}) + (1-α)(l_{t-1} + φ b_{t-1})
//	b_t = β (l_t - l_{t-1}) + (1-β) φ b_{t-1}
//	s_t = γ (y_t - l_{t-1} - φ b_{t-1}) + (1-γ) s_{t-m}
//
// and for a multiplicative season
//
//	ŷ_t = (l_{t-1} + φ b_{t-1}) s_{t-m}
//	l_t = α y_t / s_{t-m} + (1-α)(l_{t-1} + φ b_{t-1})
//	b_t = β (l_t - l_{t-1}) + (1-β) φ b_{t-1}
//	s_t = γ y_t / (l_{t-1} + φ b_{t-1}) + (1-γ) s_{t-m}
//
// The season is updated from the prediction l_{t-1} + φ b_{t-1}, not from
// the new level l_t, as in statsmodels' ExponentialSmoothing. With the
// one-step error e_t = y_t - ŷ_t the same updates read (error-correction
// form, used by the code)
//
//	additive:        l_t = l_{t-1} + φ b_{t-1} + α e_t
//	                 b_t = φ b_{t-1} + α β e_t
//	                 s_t = s_{t-m} + γ e_t
//	multiplicative:  l_t = l_{t-1} + φ b_{t-1} + α e_t / s_{t-m}
//	                 b_t = φ b_{t-1} + α β e_t / s_{t-m}
//	                 s_t = s_{t-m} + γ e_t / (l_{t-1} + φ b_{t-1})
//
// so in the innovations form of Hyndman, Koehler, Ord & Snyder (2008),
// "Forecasting with Exponential Smoothing" (HKOS), the smoothing parameters
// are α, αβ (their β) and γ (their γ, unchanged because the season is
// updated from the prediction). The h-step forecast from the end of the data
// is
//
//	ŷ_{n+h} = l_n + φ_h b_n + s_{n+h-m(k+1)}      (or × s for multiplicative)
//	φ_h = φ + φ² + ... + φ^h  (= h undamped),     k = ⌊(h-1)/m⌋.
//
// (statsmodels' ExponentialSmoothing 0.13.5 forecasts at h = m, 2m, ...
// with the seasonal state from before the last update; these follow the
// recursion, as its ETSModel does.)
type etsModel struct {
	shape etsShape
	par   etsParams
	init  etsStates // states at time 0
	last  etsStates // states after the last observation
	// y is the data the model was run over, the caller's (not copied),
	// which must not change afterwards (as a Result's Series must not):
	// Fitted runs the model over it again rather than keeping n
	// predictions in every model a Result holds.
	y    []float64
	nEst int
	// relVar is the mean squared relative one-step error (e_t/ŷ_t)², the σ²
	// of the multiplicative-error reading used for the variance factors of
	// the multiplicative season model.
	relVar float64
}

// newETSModel returns the model with the given parameters and initial
// states run over y (final states; Fitted runs it again for the fitted
// values). It copies init, and keeps y. It panics if the shape and the
// states disagree (programmer error).
func newETSModel(sh etsShape, p etsParams, init etsStates, y []float64) *etsModel {
	md, _ := runETSModel(sh, p, init, y)
	return md
}

// runETSModel is newETSModel, returning also the one-step predictions of
// the run.
func runETSModel(sh etsShape, p etsParams, init etsStates, y []float64) (md *etsModel, fitted []float64) {
	if len(init.season) != sh.season {
		panic("forecast: seasonal states do not match the season length")
	}
	if !sh.trend {
		p.beta, p.phi, init.trend = 0, 1, 0
	}
	if !sh.damped {
		p.phi = 1
	}
	if sh.season == 0 {
		p.gamma = 0
	}
	md = &etsModel{shape: sh, par: p, init: init.clone(), y: y}
	fitted = make([]float64, len(y))
	md.last = init.clone()
	etsRun(sh, p, &md.last, y, fitted)
	if sh.mult {
		var s float64
		var k int
		for i, v := range y {
			if f := fitted[i]; !math.IsNaN(v) && f != 0 {
				r := (v - f) / f
				s += r * r
				k++
			}
		}
		if k > 0 {
			md.relVar = s / float64(k)
		}
	}
	return md, fitted
}

// Method returns the method the model was fitted with.
func (md *etsModel) Method() Method { return md.shape.method }

// Params returns alpha, and beta, gamma and phi where the model has them
// (NaN otherwise), in the component form documented on etsModel.
func (md *etsModel) Params() Params {
	p := Params{Alpha: md.par.alpha, Beta: math.NaN(), Gamma: math.NaN(), Phi: math.NaN()}
	if md.shape.trend {
		p.Beta = md.par.beta
	}
	if md.shape.season > 0 {
		p.Gamma = md.par.gamma
	}
	if md.shape.damped {
		p.Phi = md.par.phi
	}
	return p
}

// Describe returns "season m" for the Holt-Winters models, with ", damped"
// when the trend is damped, and "" for the others (whose settings the
// method name and Params already say).
func (md *etsModel) Describe() string {
	if md.shape.season == 0 {
		return ""
	}
	s := "season " + strconv.Itoa(md.shape.season)
	if md.shape.damped {
		s += ", damped"
	}
	return s
}

// NumParams returns the number of estimated quantities: the smoothing
// parameters that were not held plus the free initial states (level,
// trend, and m-1 seasonal states, the m-th following from the
// normalisation).
func (md *etsModel) NumParams() int { return md.nEst }

// Fitted returns the one-step predictions ŷ_1..ŷ_n, from a run of the
// model over its data (the run that fitted it, so the same numbers).
func (md *etsModel) Fitted() []float64 { return md.Filter(md.y) }

// Forecast returns ŷ_{n+1}..ŷ_{n+h} from the states after the last
// observation (formula on etsModel). It returns an empty slice
// for h = 0 and panics if h < 0.
func (md *etsModel) Forecast(h int) []float64 {
	if h < 0 {
		panic("forecast: negative horizon")
	}
	out := make([]float64, h)
	st, p := md.last, md.par
	m := len(st.season)
	phiH, pk := 0.0, 1.0
	for i := range out {
		pk *= p.phi
		phiH += pk
		mu := st.level + phiH*st.trend
		switch {
		case m == 0:
			out[i] = mu
		case md.shape.mult:
			out[i] = mu * st.season[i%m]
		default:
			out[i] = mu + st.season[i%m]
		}
	}
	return out
}

// Filter runs the model with its parameters and initial states held over
// y and returns the one-step predictions. y usually has the length of the
// fitting data but any length works. A NaN in y counts as a missing value:
// its prediction is given, and the states move on as if the value had
// equalled its prediction (zero error).
func (md *etsModel) Filter(y []float64) []float64 {
	out := make([]float64, len(y))
	st := md.init.clone()
	etsRun(md.shape, md.par, &st, y, out)
	return out
}

// Extend runs the model, parameters and initial states held, over y and
// returns it positioned at the end of y (see Model.Extend).
func (md *etsModel) Extend(y []float64) Model {
	c := newETSModel(md.shape, md.par, md.init, y)
	c.nEst = md.nEst
	return c
}
