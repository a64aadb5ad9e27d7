package forecast

import (
	"errors"
	"math"
	"sort"
)

// Spec says how to fit a baseline to one series. The zero value fits
// automatically (Auto), ranks candidates by backtest MAD, uses the
// frequency's usual season and divides the MSE by n-1.
type Spec struct {
	// Method to fit; MethodUnknown means Auto.
	Method Method
	// Config holds the method settings. A zero Season is replaced by the
	// series frequency's usual season length.
	Config Config
	// Metric ranks Auto's candidates by backtest error (default MAD).
	Metric Metric
	// Select switches Auto to the information criterion (SelectAICc).
	Select Selection
	// Holdout is the number of backtest origins; zero means DefaultHoldout.
	Holdout int
	// Refit refits the model at every backtest origin instead of rolling
	// the states of one fit forward.
	Refit bool
	// Divisor of the MSE: n-1 (the zero value) or n.
	Divisor Divisor
	// Horizon is the longest lead time the backtest scores; zero means one
	// season (at least 1).
	Horizon int
	// Candidates overrides Auto's candidate list; nil means every method
	// that suits the series (see AutoCandidates).
	Candidates []Method
}

// Candidate is one method Auto tried.
type Candidate struct {
	Method   Method
	Params   Params
	Describe string
	// Backtest holds the candidate's backtest accuracy (nil when it was
	// skipped or ranked by AICc alone).
	Backtest *Accuracy
	// AICc of the in-sample fit on all the data; NaN where the method has
	// no likelihood or AICc selection was not asked for.
	AICc float64
	// Chosen marks the winner.
	Chosen bool
	// Skipped says why a candidate was not scored ("" when it was).
	Skipped string
}

// Result is a baseline fitted to one series.
type Result struct {
	Series Series
	Method Method // the method fitted (the winner under Auto)
	Auto   bool   // whether Auto chose it
	Model  Model
	Config Config // settings used, Season resolved
	// SSE is the sum of squared one-step in-sample errors over every point
	// that has a prediction.
	SSE float64
	// Accuracy of the one-step in-sample predictions.
	Accuracy Accuracy
	// Bias tests whether the one-step in-sample errors average zero
	// (BiasOf). One-step errors do not overlap, so Accuracy's tracking
	// signal is kept beside it, but that signal is a description, not a
	// test: with unbiased errors it still grows like the square root of
	// the number of errors.
	Bias BiasTest
	// Backtest of the fitted method; nil when the series is too short.
	Backtest   *Backtest
	Metric     Metric
	Select     Selection
	Candidates []Candidate
}

// Residuals returns y minus the one-step in-sample predictions (NaN where
// the method has none).
func (r *Result) Residuals() []float64 {
	f := r.Model.Fitted()
	e := make([]float64, len(f))
	for i := range f {
		e[i] = r.Series.Values[i] - f[i]
	}
	return e
}

func (s Spec) resolve(ser Series) Spec {
	if s.Method == MethodUnknown {
		s.Method = Auto
	}
	if s.Config.Season == 0 {
		s.Config.Season = ser.Freq().SeasonLength()
	}
	if s.Config.Season < 1 {
		s.Config.Season = 1
	}
	if s.Horizon < 1 {
		s.Horizon = s.Config.Season
	}
	if s.Holdout < 1 {
		s.Holdout = DefaultHoldout(ser.Len())
	}
	return s
}

// Fit fits spec to the series. Errors: a *TooShortError (with Series set)
// when the series is too short for the method, or the method's own error.
func Fit(ser Series, spec Spec) (*Result, error) {
	spec = spec.resolve(ser)
	y := ser.Values
	res := &Result{Series: ser, Method: spec.Method, Config: spec.Config, Metric: spec.Metric, Select: spec.Select}
	if spec.Method == Auto {
		var err error
		res.Candidates, res.Method, err = selectMethod(y, spec)
		if err != nil {
			return nil, nameSeries(err, ser.Name)
		}
		res.Auto = true
		res.Config = candidateConfig(res.Method, spec.Config)
	}
	model, err := FitMethod(y, res.Method, res.Config)
	if err != nil {
		return nil, nameSeries(err, ser.Name)
	}
	res.Model = model
	fitted := model.Fitted()
	for i, f := range fitted {
		if e := y[i] - f; !math.IsNaN(e) {
			res.SSE += e * e
		}
	}
	res.Accuracy = Measure(y, fitted, MASEScale(y, spec.Config.Season), spec.Divisor)
	res.Bias = BiasOf(res.Residuals())
	if bt, err := RunBacktest(y, res.Method, res.Config, spec.Holdout, spec.Horizon, spec.Refit, spec.Divisor); err == nil {
		res.Backtest = bt
	}
	return res, nil
}

func nameSeries(err error, name string) error {
	var ts *TooShortError
	if errors.As(err, &ts) && ts.Series == "" {
		ts.Series = name
	}
	return err
}

// AutoCandidates returns the methods Auto tries on y with the given season:
// naive, moving-average, weighted-moving-average, ses, holt, damped-holt and
// linear-trend always; seasonal-naive and holt-winters-additive when
// season > 1; holt-winters-multiplicative when season > 1 and every value is
// positive; croston and sba when at least a quarter of the values are zero
// (intermittent demand).
func AutoCandidates(y []float64, season int) []Method {
	c := []Method{Naive, MovingAverage, WeightedMovingAverage, SES, Holt, DampedHolt, LinearTrend}
	positive, zeros := true, 0
	for _, v := range y {
		if v <= 0 {
			positive = false
		}
		if v == 0 {
			zeros++
		}
	}
	if season > 1 {
		c = append(c, SeasonalNaive, HoltWintersAdditive)
		if positive {
			c = append(c, HoltWintersMultiplicative)
		}
	}
	if len(y) > 0 && 4*zeros >= len(y) {
		c = append(c, Croston, SBA)
	}
	sort.Slice(c, func(i, j int) bool { return c[i] < c[j] })
	return c
}

// selectMethod scores every candidate and returns them with the winner.
// Ties go to the earlier (simpler) method in Method order.
func selectMethod(y []float64, spec Spec) ([]Candidate, Method, error) {
	methods := spec.Candidates
	if methods == nil {
		methods = AutoCandidates(y, spec.Config.Season)
	}
	cands := make([]Candidate, 0, len(methods))
	best, bestScore := -1, math.Inf(1)
	var firstErr error
	for _, m := range methods {
		c := Candidate{Method: m, AICc: math.NaN()}
		cfg := candidateConfig(m, spec.Config)
		var score float64
		if spec.Select == SelectAICc {
			if !hasLikelihood(m) {
				c.Skipped = "no likelihood"
				cands = append(cands, c)
				continue
			}
			model, err := FitMethod(y, m, cfg)
			if err != nil {
				c.Skipped = err.Error()
				firstErr = errors.Join(firstErr, err)
				cands = append(cands, c)
				continue
			}
			sse, n := 0.0, 0
			for i, f := range model.Fitted() {
				if e := y[i] - f; !math.IsNaN(e) {
					sse += e * e
					n++
				}
			}
			c.Params, c.Describe = model.Params(), model.Describe()
			c.AICc = AICc(sse, n, model.NumParams())
			score = c.AICc
		} else {
			bt, err := RunBacktest(y, m, cfg, spec.Holdout, spec.Horizon, spec.Refit, spec.Divisor)
			if err != nil {
				c.Skipped = err.Error()
				firstErr = errors.Join(firstErr, err)
				cands = append(cands, c)
				continue
			}
			acc := bt.Accuracy
			c.Backtest = &acc
			c.Params, c.Describe = bt.Model.Params(), bt.Model.Describe()
			score = acc.Of(spec.Metric)
		}
		if !math.IsNaN(score) && score < bestScore {
			best, bestScore = len(cands), score
		}
		cands = append(cands, c)
	}
	if best < 0 {
		if firstErr == nil {
			firstErr = errors.New("no candidate method could be scored")
		}
		var ts *TooShortError
		if errors.As(firstErr, &ts) {
			return cands, MethodUnknown, &TooShortError{Method: Auto, Need: MinPoints(Naive, spec.Config) + 1, Have: len(y)}
		}
		return cands, MethodUnknown, firstErr
	}
	cands[best].Chosen = true
	return cands, cands[best].Method, nil
}

// candidateConfig adapts the shared settings to candidate m under Auto:
// linear-trend gets seasonal dummies when the data have a season.
func candidateConfig(m Method, cfg Config) Config {
	if m == LinearTrend && cfg.Season > 1 {
		cfg.Dummies = true
	}
	return cfg
}
