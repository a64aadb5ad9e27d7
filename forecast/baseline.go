package forecast

import (
	"errors"
	"fmt"
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
	// Holdout is the number of backtest origins; zero means
	// DefaultHoldout, widened for the longest lead time under Auto and
	// Combination (selectionHoldout).
	Holdout int
	// Refit refits the model at every backtest origin instead of rolling
	// the states of one fit forward.
	Refit bool
	// Divisor of the MSE: n-1 (the zero value) or n.
	Divisor Divisor
	// Horizon is the longest lead time the backtest scores; zero means one
	// season (at least 1).
	Horizon int
	// Candidates overrides the candidate list of Auto and Combination
	// (tried in Method order); nil means every method that suits the
	// series (see AutoCandidates).
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
	// Members lists, for the combination, the methods it averages, best
	// by backtest first; nil for a single method.
	Members []Method

	bt *Backtest // the whole backtest, reused when the candidate wins
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

	// selErrors are the errors of the selection itself under Auto (see
	// selectionErrors): the calibrated bands rest on them rather than on
	// the winner's backtest, whose errors chance has made low.
	selErrors [][]float64
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
		n := ser.Len()
		s.Holdout = selectionHoldout(n, s.Config.Season, s.Horizon)
		if s.Method != Auto && s.Method != Combination {
			// A single method keeps a first training window it can fit.
			if limit := n - MinPoints(s.Method, s.Config); s.Holdout > limit {
				s.Holdout = max(limit, min(DefaultHoldout(n), s.Holdout))
			}
		}
	}
	return s
}

// selectionHoldout returns the number of backtest origins a fit uses when
// the Spec sets none: DefaultHoldout(n), widened so that the longest lead
// time H is scored at a season's worth of origins where the series allows
// (for selection, and for the calibrated bands of every method).
// Origins n-o..n-1 reach lead H from o-H+1 of them, so the rule asks for
//
//	o >= H + m - 1   (m the season, at least 1)
//
// but widens no further than leaves the first training window half the
// series and, with a season, two full seasons (so that seasonal methods
// still take part; see seasonsEnough). A monthly series of 60 points with
// H = 12 gets 23 origins instead of 12 (one error at lead 12); one of 120
// keeps its 24.
func selectionHoldout(n, season, maxH int) int {
	o := DefaultHoldout(n)
	m := max(season, 1)
	limit := n / 2
	if m > 1 {
		limit = min(limit, n-2*m)
	}
	if want := maxH + m - 1; o < want {
		o = max(o, min(want, limit))
	}
	return o
}

// Fit fits spec to the series. Errors: a *TooShortError (with Series set)
// when the series is too short for the method, or the method's own error.
//
// Under Auto and Combination every candidate is backtested once (see
// selectMethod); the winner's backtest is that of its candidate, not run
// again, and a combination's comes from its members' backtests.
func Fit(ser Series, spec Spec) (*Result, error) {
	spec = spec.resolve(ser)
	y := ser.Values
	res := &Result{Series: ser, Method: spec.Method, Config: spec.Config, Metric: spec.Metric, Select: spec.Select}
	var model Model
	var err error
	switch spec.Method {
	case Auto, Combination:
		model, err = res.fitSelected(y, spec)
	default:
		model, err = FitMethod(y, res.Method, res.Config)
	}
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
	if res.Backtest == nil && res.Method != Combination {
		if bt, err := RunBacktest(y, res.Method, res.Config, spec.Holdout, spec.Horizon, spec.Refit, spec.Divisor); err == nil {
			res.Backtest = bt
		}
	}
	return res, nil
}

// fitSelected scores the candidates, records them in r with the winner's
// method, settings and backtest, and fits the winner to all of y. The
// final fit of an exponential smoothing method (the winner or a member of
// the winning combination) starts from its parameters on the backtest's
// first training window and runs one local descent (see fitWarm), rather
// than the full search again: on most of the same data the minimum is
// close to the one already found.
func (r *Result) fitSelected(y []float64, spec Spec) (Model, error) {
	cands, best, err := selectMethod(y, spec)
	r.Candidates = cands
	if err != nil {
		return nil, err
	}
	win := cands[best]
	r.Auto = spec.Method == Auto
	r.Method = win.Method
	r.Backtest = win.bt
	if spec.Select != SelectAICc || spec.Method == Combination {
		r.selErrors = selectionErrors(cands, spec.Metric, spec.Method == Combination)
	}
	for i := range r.Candidates {
		if i != best {
			r.Candidates[i].bt = nil // only the winner's backtest is kept: a result holds one
		}
	}
	seasonal := seasonsEnough(len(y), spec)
	var from Model
	if win.bt != nil {
		from = win.bt.Model
	}
	if win.Method == Combination {
		return fitCombination(y, win.Members, Members(from), spec.Config, seasonal)
	}
	r.Config = candidateConfig(win.Method, spec.Config, seasonal)
	return fitWarm(y, win.Method, r.Config, from)
}

// memberMethods returns the methods a chosen combination averages, nil
// for a single method.
func (r *Result) memberMethods() []Method {
	for _, c := range r.Candidates {
		if c.Chosen {
			return c.Members
		}
	}
	return nil
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

// isSeasonal reports whether method m uses the season (linear-trend
// through its seasonal dummies).
func isSeasonal(m Method) bool {
	switch m {
	case SeasonalNaive, HoltWintersAdditive, HoltWintersMultiplicative:
		return true
	}
	return false
}

// seasonWindow returns the data a candidate is fitted on before it is
// scored: the backtest's first training window, or all n points when the
// candidates are ranked by AICc.
func seasonWindow(n int, spec Spec) int {
	if spec.Select == SelectAICc && spec.Method == Auto {
		return n
	}
	return n - spec.Holdout
}

// seasonsEnough reports whether the seasonal methods may take part in a
// selection over n points: the season is longer than one period and the
// window the candidates are fitted on (seasonWindow) holds at least two
// full seasons. With fewer, a seasonal pattern is estimated from one cycle
// and its noise, and a seasonal method that wins the backtest has most
// often won by chance.
func seasonsEnough(n int, spec Spec) bool {
	m := spec.Config.Season
	return m > 1 && seasonWindow(n, spec) >= 2*m
}

// selectMethod scores every candidate, adds the combination of the best
// CombineK (see addCombination) and returns the candidates with the index
// of the winner: under Auto the lowest score, ties going to the earlier
// (simpler) method in Method order, so a combination must beat every
// single method; under Combination the combination.
//
// The score is the backtest error on spec.Metric, multiplied by
// fewErrorsPenalty (Auto with SelectBacktest, and Combination), or the
// AICc of the in-sample fit (Auto with SelectAICc; no combination then).
// Seasonal methods are skipped, with the reason, when seasonsEnough is
// false, and linear-trend then has no seasonal dummies.
func selectMethod(y []float64, spec Spec) ([]Candidate, int, error) {
	var methods []Method
	if spec.Candidates != nil {
		methods = append(methods, spec.Candidates...)
		sort.Slice(methods, func(i, j int) bool { return methods[i] < methods[j] })
	} else {
		methods = AutoCandidates(y, spec.Config.Season)
	}
	byAICc := spec.Select == SelectAICc && spec.Method == Auto
	seasonal := seasonsEnough(len(y), spec)
	cands := make([]Candidate, 0, len(methods)+1)
	scores := make([]float64, 0, len(methods)+1)
	var firstErr error
	for _, m := range methods {
		c := Candidate{Method: m, AICc: math.NaN()}
		score, err := math.NaN(), error(nil)
		switch {
		case m == Auto || m == Combination || m == MethodUnknown:
			c.Skipped = "not a single method"
		case isSeasonal(m) && !seasonal:
			c.Skipped = fmt.Sprintf("needs two full seasons (%d periods) to fit before scoring, has %d",
				2*max(spec.Config.Season, 1), seasonWindow(len(y), spec))
		case byAICc:
			score, err = scoreAICc(y, &c, candidateConfig(m, spec.Config, seasonal))
		default:
			score, err = scoreCandidate(y, &c, candidateConfig(m, spec.Config, seasonal), spec)
		}
		if err != nil {
			c.Skipped = err.Error()
			firstErr = errors.Join(firstErr, err)
		}
		cands, scores = append(cands, c), append(scores, score)
	}
	if !byAICc {
		if c, score, ok := addCombination(y, cands, scores, spec); ok {
			cands, scores = append(cands, c), append(scores, score)
		}
	}
	best, bestScore := -1, math.Inf(1)
	for i, sc := range scores {
		if spec.Method == Combination && cands[i].Method != Combination {
			continue
		}
		if !math.IsNaN(sc) && sc < bestScore {
			best, bestScore = i, sc
		}
	}
	if best < 0 {
		if firstErr == nil {
			firstErr = errors.New("no candidate method could be scored")
		}
		var ts *TooShortError
		if errors.As(firstErr, &ts) {
			return cands, -1, &TooShortError{Method: spec.Method, Need: MinPoints(Naive, spec.Config) + 1, Have: len(y)}
		}
		return cands, -1, firstErr
	}
	cands[best].Chosen = true
	return cands, best, nil
}

// scoreAICc fits c's method to all of y and returns the AICc of the fit,
// recording the parameters in c. A method without a likelihood is
// skipped (NaN score, no error).
func scoreAICc(y []float64, c *Candidate, cfg Config) (float64, error) {
	if !hasLikelihood(c.Method) {
		c.Skipped = "no likelihood"
		return math.NaN(), nil
	}
	model, err := FitMethod(y, c.Method, cfg)
	if err != nil {
		return math.NaN(), err
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
	return c.AICc, nil
}

// scoreCandidate backtests c's method on y, records the backtest in c and
// returns its penalised error on spec.Metric. The backtest's fits are
// fitScoring's: holt-winters-multiplicative runs one descent instead of
// three.
func scoreCandidate(y []float64, c *Candidate, cfg Config, spec Spec) (float64, error) {
	bt, err := runBacktest(y, c.Method, cfg, spec.Holdout, spec.Horizon, spec.Refit, spec.Divisor, fitScoring)
	if err != nil {
		return math.NaN(), err
	}
	acc := bt.Accuracy
	c.Backtest, c.bt = &acc, bt
	c.Params, c.Describe = bt.Model.Params(), bt.Model.Describe()
	return acc.Of(spec.Metric) * fewErrorsPenalty(bt), nil
}

// addCombination returns the combination of the best CombineK scored
// candidates (fewer when fewer were scored), best first, with its
// backtest built from theirs (combineBacktests) and its score. ok is false
// when no candidate was scored, and under Auto when only one was (the
// combination would be that method).
func addCombination(y []float64, cands []Candidate, scores []float64, spec Spec) (c Candidate, score float64, ok bool) {
	var idx []int
	for i, sc := range scores {
		if cands[i].bt != nil && !math.IsNaN(sc) {
			idx = append(idx, i)
		}
	}
	sort.SliceStable(idx, func(a, b int) bool { return scores[idx[a]] < scores[idx[b]] })
	idx = idx[:min(CombineK, len(idx))]
	if len(idx) == 0 || len(idx) == 1 && spec.Method == Auto {
		return c, 0, false
	}
	bts := make([]*Backtest, len(idx))
	c = Candidate{Method: Combination, AICc: math.NaN(), Params: simpleNoParams()}
	for j, i := range idx {
		bts[j] = cands[i].bt
		c.Members = append(c.Members, cands[i].Method)
	}
	bt := combineBacktests(y, bts, spec.Config.Season, spec.Divisor)
	acc := bt.Accuracy
	c.Backtest, c.bt, c.Describe = &acc, bt, bt.Model.Describe()
	return c, acc.Of(spec.Metric) * fewErrorsPenalty(bt), true
}

// Settings of FewOriginsFactor: full weight from penaltyOrigins one-step
// errors (the most DefaultHoldout gives), and the slope below.
const (
	penaltyOrigins = 36
	penaltySlope   = 0.1
)

// fewErrorsPenalty returns the factor a candidate's backtest error is
// multiplied by in selection: FewOriginsFactor of its origins for a single
// method, 1 for the combination.
func fewErrorsPenalty(bt *Backtest) float64 {
	if bt.Model.Method() == Combination {
		return 1
	}
	return FewOriginsFactor(bt.Origins)
}

// FewOriginsFactor returns the factor by which selection multiplies a
// single method's backtest error when the backtest has the given number
// of origins. A single method's backtest rests on its one-step errors, one
// per origin (errors at longer lead times from neighbouring origins
// overlap and add little evidence). Below 36 origins, the most
// DefaultHoldout gives, its ranking is partly chance, so the error counts
//
//	1 + 0.1 (36/N - 1)      (12 origins: 1.2; 23: 1.057; 36 or more: 1)
//
// times, and the combination's counts once: averaging the best few
// spreads the chance in their ranking (Kourentzes, Barrow & Petropoulos
// 2019, "Another look at forecast selection and combination: evidence
// from forecast pooling", IJPE 209). Single methods share their origins,
// so the factor leaves their order alone; it is the margin by which the
// best of them must beat the combination. The slope is the smaller of two
// tried (0.1, 0.2) on the open data sets of the README, which did about
// equally well; without the factor auto lost to the combination alone.
func FewOriginsFactor(origins int) float64 {
	if origins >= penaltyOrigins || origins < 1 {
		return 1
	}
	return 1 + penaltySlope*(float64(penaltyOrigins)/float64(origins)-1)
}

// candidateConfig adapts the shared settings to candidate m under Auto:
// linear-trend gets seasonal dummies when the data have a season and the
// seasonal methods take part (seasonal; see seasonsEnough).
func candidateConfig(m Method, cfg Config, seasonal bool) Config {
	if m == LinearTrend && cfg.Season > 1 && seasonal {
		cfg.Dummies = true
	}
	return cfg
}
