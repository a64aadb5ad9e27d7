package evaluate

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sync"

	"forelay/forecast"
)

// ErrNoCases is returned by Run when it is given no case.
var ErrNoCases = errors.New("evaluate: no case to evaluate")

// Outcome codes of one held-out value against one band, and of one safety
// stock against the demand of one lead time.
const (
	inside  int8 = iota // the value lies within the band (bounds included)
	below               // the value lies under the lower bound
	above               // the value lies over the upper bound
	noBand              // the band or the point is not finite
	noValue             // the held-out value is missing (NaN)

	covered   int8 = 0 // demand <= forecast + stock
	uncovered int8 = 1 // demand > forecast + stock
	noStock   int8 = 2 // the stock or the forecast is not finite
	noLead    int8 = 3 // the lead time is longer than H, or an actual is missing
)

// trial is one method fitted at one origin.
type trial struct {
	err    string          // why the fit failed; empty when it worked
	chosen forecast.Method // the method auto chose
	band   [][]int8        // [coverage][lead time] outcome codes
	mase   float64         // MASE of the H-step forecasts (NaN if none)
	stock  []int8          // per safety stock lead time, outcome codes
}

// caseRun is everything measured on one case.
type caseRun struct {
	info   CaseInfo
	trials [][]trial // [origin][method]
}

// Run evaluates every method of cfg on every case (see the package
// documentation) and aggregates the results. A case too short for one
// origin is listed with no origin and adds nothing. A method that cannot
// be fitted at an origin is counted as failed there (see
// Results.Failures). Run returns ErrNoCases for an empty list, an error
// for a nominal coverage outside (0, 1), a service level outside (0, 1) or
// a lead time below 1, and an error wrapping forecast.ErrInternal if a fit
// panicked.
func Run(cases []Case, cfg Config) (*Results, error) {
	if len(cases) == 0 {
		return nil, ErrNoCases
	}
	cases = labelled(cases)
	cfg = cfg.resolve()
	zs, err := check(cfg)
	if err != nil {
		return nil, err
	}
	runs := make([]caseRun, len(cases))
	errs := make([]error, len(cases))
	next := make(chan int)
	var wg sync.WaitGroup
	for range min(cfg.Workers, len(cases)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				runs[i], errs[i] = safeCase(cases[i], cfg, zs)
			}
		}()
	}
	for i := range cases {
		next <- i
	}
	close(next)
	wg.Wait()
	if err := errors.Join(errs...); err != nil {
		return nil, err
	}
	return aggregate(cases, runs, cfg), nil
}

// labelled returns a copy of cases whose empty Group is the series name
// and whose empty Source is "unlabelled".
func labelled(cases []Case) []Case {
	out := slices.Clone(cases)
	for i := range out {
		if out[i].Group == "" {
			out[i].Group = out[i].Series.Name
		}
		if out[i].Source == "" {
			out[i].Source = "unlabelled"
		}
	}
	return out
}

// check validates the settings and returns the band multipliers.
func check(cfg Config) ([]float64, error) {
	zs := make([]float64, len(cfg.Coverages))
	for i, c := range cfg.Coverages {
		z, err := forecast.ZForCoverage(c)
		if err != nil {
			return nil, fmt.Errorf("evaluate: Config.Coverages: %w", err)
		}
		zs[i] = z
	}
	if !(cfg.Service > 0 && cfg.Service < 1) {
		return nil, fmt.Errorf("evaluate: Config.Service %v must lie strictly between 0 and 1", cfg.Service)
	}
	for _, l := range cfg.Leads {
		if l < 1 {
			return nil, fmt.Errorf("evaluate: Config.Leads: lead time %d must be at least 1", l)
		}
	}
	return zs, nil
}

// safeCase runs evalCase and turns a panic into an error.
func safeCase(c Case, cfg Config, zs []float64) (run caseRun, err error) {
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("%w: evaluating series %q: %v", forecast.ErrInternal, c.Series.Name, p)
		}
	}()
	return evalCase(c, cfg, zs), nil
}

// season returns the season length the fits of series s use.
func season(s forecast.Series, cfg Config) int {
	if m := cfg.Spec.Config.Season; m > 0 {
		return m
	}
	return s.Freq().SeasonLength()
}

// evalCase fits every method at every origin of one case.
func evalCase(c Case, cfg Config, zs []float64) caseRun {
	s := c.Series
	h := cfg.Horizon(s.Freq())
	step := cfg.Step
	if step < 1 {
		step = h
	}
	m := season(s, cfg)
	origins := Origins(s.Len(), m, h, step, cfg.MinSeasons, cfg.MaxOrigins)
	run := caseRun{info: CaseInfo{Name: s.Name, Source: c.Source, Group: c.Group,
		Freq: s.Freq().String(), Length: s.Len(), Horizon: h, Origins: []string{}}}
	for _, o := range origins {
		run.info.Origins = append(run.info.Origins, s.Period(o).String())
		train := forecast.Series{Name: s.Name, Start: s.Start, Values: s.Values[:o:o]}
		actual := s.Values[o : o+h]
		scale := forecast.MASEScale(train.Values, m)
		row := make([]trial, len(cfg.Methods))
		for k, meth := range cfg.Methods {
			row[k] = evalMethod(train, actual, meth, scale, cfg, zs)
		}
		run.trials = append(run.trials, row)
	}
	return run
}

// evalMethod fits one method on train and scores it against actual.
func evalMethod(train forecast.Series, actual []float64, m forecast.Method, scale float64, cfg Config, zs []float64) trial {
	spec := cfg.Spec
	spec.Method = m
	if spec.Horizon == 0 {
		spec.Horizon = len(actual) // the backtest reaches the lead times scored, as a plan's does
	}
	r, err := forecast.Fit(train, spec)
	if err != nil {
		return trial{err: err.Error()}
	}
	h := len(actual)
	t := trial{chosen: r.Method, band: make([][]int8, len(zs))}
	pts := r.ForecastFrom(h, 0, cfg.Bands, cfg.From) // the points, in case there is no band
	for i, z := range zs {
		pts = r.ForecastFrom(h, z, cfg.Bands, cfg.From)
		t.band[i] = make([]int8, h)
		for k, p := range pts {
			t.band[i][k] = classify(actual[k], p)
		}
	}
	point := make([]float64, h)
	for k, p := range pts {
		point[k] = p.Value
	}
	t.mase = forecast.Measure(actual, point, scale, forecast.DivisorN).MASE
	t.stock = make([]int8, len(cfg.Leads))
	for i, l := range cfg.Leads {
		t.stock[i] = stockOutcome(r, actual, point, l, cfg)
	}
	return t
}

// classify places one held-out value against its band.
func classify(y float64, p forecast.Point) int8 {
	switch {
	case math.IsNaN(y):
		return noValue
	case !finite(p.Value) || !finite(p.Lower) || !finite(p.Upper):
		return noBand
	case y < p.Lower:
		return below
	case y > p.Upper:
		return above
	}
	return inside
}

// stockOutcome says whether the safety stock for a lead time of l periods
// covered the demand of the first l held-out periods.
func stockOutcome(r *forecast.Result, actual, point []float64, l int, cfg Config) int8 {
	if l > len(actual) {
		return noLead
	}
	demand, fc := 0.0, 0.0
	for k := range l {
		demand += actual[k]
		fc += point[k]
	}
	if math.IsNaN(demand) {
		return noLead
	}
	ss := cfg.SafetyStock(r, l, cfg.Service)
	if !finite(ss) || !finite(fc) {
		return noStock
	}
	if demand <= fc+ss {
		return covered
	}
	return uncovered
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
