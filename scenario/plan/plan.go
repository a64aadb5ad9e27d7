package plan

import (
	"errors"
	"fmt"
	"forelay/scenario"
	"forelay/scenario/data"
	"maps"
	"math"
	"slices"
	"strings"

	"forelay/forecast"
)

// A Plan is the adjusted plan built from a scenario file: the baseline
// fitted to the cleaned history, and for each scenario the baseline plus
// its events, with bands.
type Plan struct {
	// File is the scenario the plan was built from.
	File *scenario.File
	// History is the series as read; Cleaned is it with the past events
	// taken out (what the baseline was fitted to).
	History forecast.Series
	Cleaned []float64
	// Filled lists the history cells filled under history.fill.
	Filled []data.Filled
	// Fit is the baseline fitted to the cleaned history; nil for a series
	// of a portfolio that a scope creates (new: true), whose History has
	// no values, starting at the first plan period, and whose baseline and
	// its variance are zero.
	Fit *forecast.Result
	// Cleaning holds one estimate per past event or past occurrence, in
	// file order.
	Cleaning []Estimate
	// Periods are the plan's periods, Horizon of them from the first
	// period after the history.
	Periods []forecast.Period
	// Baseline is the baseline forecast and BaselineVar its error variance
	// per period (from VarSource).
	Baseline    []float64
	BaselineVar []float64
	VarSource   forecast.VarianceSource
	// BaselineLower and BaselineUpper are the baseline's band,
	// Baseline -/+ Z sqrt(BaselineVar), not clipped at the floor.
	BaselineLower, BaselineUpper []float64
	// Z is the band half-width in standard errors, Mode how the baseline
	// variance grows, and Floor the least demand can be (nil: no floor):
	// each scenario's plans and bands are clipped at it.
	Z    float64
	Mode forecast.BandMode
	// From is what the baseline variance rests on (bands.from).
	From  forecast.BandSource
	Floor *float64
	// Scenarios are the plans of each scenario, in file order.
	Scenarios []ScenarioPlan
	// Future lists the events that act on the plan's periods, in file
	// order; past events (cleaned out of the history) are not in it. An
	// event whose effect is learnt from its past occurrences is a copy of
	// the file's event carrying the learnt effect and range; the file's
	// events are never changed. Scenarios match events by id.
	Future []*scenario.Event
	// Effects holds what each future event does to the plan's periods,
	// keyed by event id: computed once, for every future event whether
	// or not a scenario holds it.
	Effects map[string]EventEffect
	// Notes are plain-language remarks for the planner (prorated dates,
	// floored bands, filled history cells, learnt effects).
	Notes []string
	// Warnings are about input that is legal but almost certainly not
	// meant, each a full sentence ending with the fix: first those of
	// File.Lint (in file order of the events), then those of the floor
	// (the baseline below it, then each scenario's clips in scenario
	// order, events in file order within a scenario).
	Warnings []string
	// Digests are the SHA-256 digests of the input files, keyed by role:
	// "scenario" and "history".
	Digests map[string]string
}

// An Estimate is the size of a past event found while cleaning the history.
type Estimate struct {
	// ID is the event's id; When is the occurrence (the event's own start,
	// or one of its past dates).
	ID   string
	When string
	// Kind is the event's kind: for a pulse Effect is the effect per
	// period at full size, for a step the level shift.
	Kind   scenario.Kind
	Effect float64
	StdErr float64
}

// An EventEffect is what one future event does in each of the plan's
// periods, at full probability.
type EventEffect struct {
	// Share is the event's share of its full size (Event.Profile).
	Share []float64
	// Contrib is its contribution, the change of demand
	// (Event.Contribution on the baseline).
	Contrib []float64
	// Sigma is the standard deviation of the contribution, from the
	// event's range (Event.Sigma); zeros without a range.
	Sigma []float64
}

// ScenarioPlan is one scenario's adjusted plan.
type ScenarioPlan struct {
	// Name is the scenario's name and Series the series it plans: a plan
	// line is keyed by (scenario, series) (see Plan.Line).
	Name, Series string
	// Events are the scenario's future events, in file order.
	Events []*scenario.Event
	// Adjusted = baseline + sum of the included events' contributions;
	// RiskWeighted = baseline + sum of probability * contribution.
	Adjusted, RiskWeighted []float64
	// Var is the total variance per period (baseline plus events) and
	// Lower, Upper = Adjusted -/+ z sqrt(Var). With a floor, Adjusted,
	// RiskWeighted, Lower and Upper are then clipped at it, keeping
	// Lower <= Adjusted <= Upper (see Plan.Floor); Var is not changed.
	Var, Lower, Upper []float64
	// Contrib holds the contribution per period of each future event to
	// this series, keyed by event id; all zeros for an event that is not
	// in the scenario. Contributions are not clipped.
	Contrib map[string][]float64
	// Floored counts the periods where only the lower band was raised to
	// the floor (the plan itself above it, the usual case near zero).
	Floored int
	// Clipped counts the periods where the adjusted or the risk-weighted
	// plan was raised to the floor, and Clips names the events that
	// pushed it there, in file order.
	Clipped int
	Clips   []Clip
}

// Line returns the plan of scenario name for series, or nil when the plan
// has no such line. Today's plans hold one series, the history's.
func (p *Plan) Line(name, series string) *ScenarioPlan {
	for i := range p.Scenarios {
		if sp := &p.Scenarios[i]; sp.Name == name && sp.Series == series {
			return sp
		}
	}
	return nil
}

// ScenarioIndex returns the index of the scenario called name, or of the
// last scenario when name is empty. An unknown name is an error that lists
// the scenarios.
func (p *Plan) ScenarioIndex(name string) (int, error) {
	if name == "" {
		return len(p.Scenarios) - 1, nil
	}
	names := make([]string, len(p.Scenarios))
	for i, sp := range p.Scenarios {
		if sp.Name == name {
			return i, nil
		}
		names[i] = sp.Name
	}
	return 0, fmt.Errorf("%q: %s has no such scenario (it has %s)", name, p.File.Path, strings.Join(names, ", "))
}

// CaseIndex returns the index of the scenario called name in f's
// scenarios (what ScenarioIndex gives for a plan of several series, whose
// plans each hold every scenario once), the last one when name is empty,
// or an error naming the scenarios there are.
func CaseIndex(f *scenario.File, name string) (int, error) {
	cases := f.Cases()
	if name == "" {
		return len(cases) - 1, nil
	}
	names := make([]string, len(cases))
	for i, c := range cases {
		if c.Name == name {
			return i, nil
		}
		names[i] = c.Name
	}
	return 0, fmt.Errorf("%q: %s has no such scenario (it has %s)", name, f.Path, strings.Join(names, ", "))
}

// Total returns the sum of v.
func Total(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x
	}
	return s
}

// Peak returns the index and value of the largest element of v (the first
// when tied); -1 and NaN for an empty v.
func Peak(v []float64) (int, float64) {
	best, bv := -1, math.NaN()
	for i, x := range v {
		if best < 0 || x > bv {
			best, bv = i, x
		}
	}
	return best, bv
}

// Build fits the baseline to the history of in and lays the events of f
// on it. It reads no file, and changes neither f nor in: an effect learnt
// from the past is the plan's (see Plan.Future). It returns input errors
// (*data.ParseError, *forecast.TooShortError) for data the plan cannot be
// built from. Input that is legal but almost certainly not meant gives
// Plan.Warnings (File.Lint's, the fit's, then the floor's).
// Inputs selecting several series (Inputs.Selected) are an error at
// history.series (BuildPortfolio plans them). Events with a scope are
// planned as the one series sees them (File.ForSeries).
func Build(f *scenario.File, in *Inputs) (*Plan, error) {
	if err := in.one(f); err != nil {
		return nil, err
	}
	f, err := scoped(f, in)
	if err != nil {
		return nil, err
	}
	p, spec := newPlan(f, in)
	if err := p.clean(spec); err != nil {
		return nil, err
	}
	p.lay()
	return p, nil
}

// scoped returns f as the one series of in sees it (File.ForSeries) when
// an event of f has a scope, after checking the scopes against the series
// (File.CheckSeries); f itself otherwise. With one series, every split
// gives it the whole effect.
func scoped(f *scenario.File, in *Inputs) (*scenario.File, error) {
	if !slices.ContainsFunc(f.Events, func(e *scenario.Event) bool { return len(e.Scope) > 0 }) {
		return f, nil
	}
	name := in.Series.Name
	var all []string
	if in.History != nil {
		all = names(in.History)
	}
	if err := f.CheckSeries([]string{name}, all); err != nil {
		return nil, err
	}
	shares, err := f.SharesOf([]string{name}, func(*scenario.Event, string) float64 { return 1 }, nil)
	if err != nil {
		return nil, err
	}
	return f.ForSeries(name, shares[name]), nil
}

// newPlan starts the plan: settings, filled cells, input digests and
// File.Lint's warnings.
func newPlan(f *scenario.File, in *Inputs) (*Plan, forecast.Spec) {
	ser := in.Series
	p := &Plan{File: f, History: ser, Z: f.Bands.Z, Floor: f.Bands.Floor, Digests: maps.Clone(in.Digests), Warnings: f.Lint(ser)}
	p.Notes = inputNotes(f, in.History)
	for _, fl := range in.History.Filled {
		if fl.Series == ser.Name {
			p.Filled = append(p.Filled, fl)
			p.Notes = append(p.Notes, fmt.Sprintf("%s: no value for %s; filled with %s (history.fill %s)",
				f.History.File, fl.Period, forecast.FormatNumber(fl.Value, forecast.Decimals([]float64{fl.Value})), f.History.Fill))
		}
	}
	p.Mode, p.From = f.Bands.Widen, f.Bands.From
	return p, f.Spec()
}

// cleaning is what clean takes out of the history: the interventions,
// with the event and the occurrence's label of each, and the history with
// the planned effect of future events that start inside it taken out.
type cleaning struct {
	ivs   []forecast.Intervention
	event []*scenario.Event
	when  []string
	y     []float64
}

// interventions sorts the events into past and future (Plan.Future) and
// turns past events and past occurrences into interventions, leaving out
// those wholly before the history (they have nothing to clean); future
// events whose window reaches back into the history have their known
// effect taken out of it.
func (p *Plan) interventions() cleaning {
	ser := p.History
	first, n := ser.Next(), ser.Len()
	c := cleaning{y: append([]float64(nil), ser.Values...)}
	add := func(e *scenario.Event, when string, shape []float64) {
		if !nonZero(shape) {
			return // wholly before the history: File.Lint warns of it
		}
		c.ivs = append(c.ivs, forecast.Intervention{Name: e.ID, Shape: shape})
		c.event, c.when = append(c.event, e), append(c.when, when)
	}
	for _, e := range p.File.Events {
		if e.IsPast(first) {
			shape := e.Profile(ser.Start, n)
			if e.Kind == scenario.Step && !e.HasEnd {
				// An ongoing step is already in today's level: lift the
				// history before it instead of lowering the history after.
				last := shape[n-1]
				for t := range shape {
					shape[t] -= last
				}
			}
			add(e, e.Start.Label, shape)
		} else {
			p.Future = append(p.Future, e)
			if e.Start.From.Before(first.Start()) && !e.Effect.FromPast {
				contrib := e.Contribution(ser.Start, ser.Values)
				for t := range c.y {
					c.y[t] -= contrib[t]
				}
				p.Notes = append(p.Notes, fmt.Sprintf("event %q starts inside the history; its planned effect was taken out of the history before fitting", e.ID))
			}
		}
		for i, occ := range e.Occurrences() {
			add(e, e.Past[i].Label, occ.Profile(ser.Start, n))
		}
	}
	return c
}

// nonZero reports whether v holds a value other than 0.
func nonZero(v []float64) bool {
	for _, x := range v {
		if x != 0 {
			return true
		}
	}
	return false
}

// clean takes the events out of the history, fits the baseline to what is
// left and learns the effects to be learnt from the past.
func (p *Plan) clean(spec forecast.Spec) error {
	f, ser := p.File, p.History
	c := p.interventions()
	season := spec.Config.Season
	if season == 0 {
		season = ser.Freq().SeasonLength()
	}
	if e := seasonalConfounding(f, ser, season); e != nil {
		return f.ErrorAt(e.Pos, fmt.Sprintf("event %q: past", e.ID), fmt.Errorf(
			"every occurrence falls on the same %s of the season, in every cycle of the history, so the seasonal pattern already carries the event and its size cannot be told apart from it; leave out past (the baseline then plans it as part of the season) or list only some occurrences", ser.Freq()))
	}
	work := ser
	work.Values = c.y
	ifit, err := forecast.FitInterventions(work, spec, c.ivs, 0)
	if err != nil {
		var ts *forecast.TooShortError
		if errors.As(err, &ts) {
			ts.Series = ser.Name
			return &data.ParseError{File: f.History.File, Err: err}
		}
		return f.ErrorAt(scenario.Pos{}, "events", err)
	}
	p.Fit, p.Cleaned = ifit.Fit, ifit.Cleaned
	for j, e := range c.event {
		p.Cleaning = append(p.Cleaning, Estimate{ID: e.ID, When: c.when[j], Kind: e.Kind, Effect: ifit.Effect[j], StdErr: ifit.StdErr[j]})
	}
	learnFromPast(p)
	return nil
}

// lay forecasts the baseline and lays each scenario's events on it, with
// the notes and the floor's warnings.
func (p *Plan) lay() {
	first, hz := p.History.Next(), p.File.Horizon
	p.Periods = make([]forecast.Period, hz)
	for i := range p.Periods {
		p.Periods[i] = first.Add(i)
	}
	if p.Fit != nil {
		p.Baseline = p.Fit.Model.Forecast(hz)
		p.BaselineVar, p.VarSource = p.Fit.VarianceFrom(hz, p.Mode, p.From)
	} else { // a series without history (new: true): nothing but its events
		p.Baseline, p.BaselineVar = make([]float64, hz), make([]float64, hz)
	}
	p.BaselineLower, p.BaselineUpper = make([]float64, hz), make([]float64, hz)
	for t := range p.Baseline {
		w := p.Z * math.Sqrt(p.BaselineVar[t])
		p.BaselineLower[t], p.BaselineUpper[t] = p.Baseline[t]-w, p.Baseline[t]+w
	}
	p.Effects = make(map[string]EventEffect, len(p.Future))
	for _, e := range p.Future {
		p.Effects[e.ID] = EventEffect{Share: e.Profile(first, hz), Contrib: e.Contribution(first, p.Baseline), Sigma: e.Sigma(first, p.Baseline)}
		if e.Prorated(first) {
			p.Notes = append(p.Notes, fmt.Sprintf("event %q has dates finer than the %s periods; its effect is prorated by the share of days in each period", e.ID, first.Freq))
		}
	}
	for _, c := range p.File.Cases() {
		p.Scenarios = append(p.Scenarios, p.layer(c))
	}
	for _, sp := range p.Scenarios {
		if sp.Floored > 0 {
			p.Notes = append(p.Notes, fmt.Sprintf("scenario %q: the lower band was cut at the floor %s in %d period(s)", sp.Name, forecast.FormatNumber(*p.Floor, -1), sp.Floored))
		}
	}
	if p.Fit != nil {
		p.Warnings = append(p.Warnings, p.Fit.Warnings()...)
	}
	p.Warnings = append(p.Warnings, p.floorWarnings()...)
}

// layer adds the future events of case c to the baseline.
func (p *Plan) layer(c scenario.Case) ScenarioPlan {
	hz := len(p.Baseline)
	sp := ScenarioPlan{Name: c.Name, Series: p.History.Name,
		Adjusted: append([]float64(nil), p.Baseline...), RiskWeighted: append([]float64(nil), p.Baseline...),
		Var: append([]float64(nil), p.BaselineVar...), Lower: make([]float64, hz), Upper: make([]float64, hz),
		Contrib: make(map[string][]float64, len(p.Future))}
	in := map[string]bool{}
	for _, e := range c.Events {
		in[e.ID] = true
	}
	for _, e := range p.Future {
		if !in[e.ID] {
			sp.Contrib[e.ID] = make([]float64, hz)
			continue
		}
		sp.Events = append(sp.Events, e)
		eff := p.Effects[e.ID]
		contrib, sigma := slices.Clone(eff.Contrib), eff.Sigma
		for t := range contrib {
			sp.Adjusted[t] += contrib[t]
			sp.RiskWeighted[t] += e.Probability * contrib[t]
			sp.Var[t] += sigma[t] * sigma[t]
		}
		sp.Contrib[e.ID] = contrib
	}
	for t := range sp.Var {
		w := p.Z * math.Sqrt(sp.Var[t])
		sp.Lower[t], sp.Upper[t] = sp.Adjusted[t]-w, sp.Adjusted[t]+w
	}
	p.clip(&sp)
	return sp
}

// learnFromPast sets the effect of every future event marked
// effect: {from: past} to the mean of its past occurrences' estimates, and
// its range to a 90% interval around that mean: mean -/+ 1.645 s, where s is
// the standard deviation of the estimates when there are two or more and
// the standard error of the single estimate otherwise.
//
// The file's event is left as it is: the plan's Future holds a copy with
// the learnt effect and range.
func learnFromPast(p *Plan) {
	for i, e := range p.Future {
		if !e.Effect.FromPast {
			continue
		}
		var est, se []float64
		for _, c := range p.Cleaning {
			if c.ID == e.ID {
				est, se = append(est, c.Effect), append(se, c.StdErr)
			}
		}
		if len(est) == 0 {
			continue
		}
		mean := Total(est) / float64(len(est))
		s := se[0]
		if len(est) > 1 {
			ss := 0.0
			for _, v := range est {
				ss += (v - mean) * (v - mean)
			}
			s = math.Sqrt(ss / float64(len(est)-1))
		}
		learnt := *e
		learnt.Effect = scenario.Effect{Units: mean, FromPast: true}
		learnt.Range = &scenario.Range{Low: mean - 1.645*s, High: mean + 1.645*s}
		p.Future[i], e = &learnt, &learnt
		d := forecast.Decimals([]float64{mean, e.Range.Low, e.Range.High})
		p.Notes = append(p.Notes, fmt.Sprintf("event %q: effect learnt from %d past occurrence(s): %s per period, 90%% range %s to %s",
			e.ID, len(est), forecast.FormatNumber(mean, d), forecast.FormatNumber(e.Range.Low, d), forecast.FormatNumber(e.Range.High, d)))
	}
}

// seasonalConfounding returns the first event whose past occurrences fall
// on the same position of the season in every cycle of the history (so the
// seasonal pattern carries the event and its size cannot be estimated apart
// from it), or nil.
func seasonalConfounding(f *scenario.File, ser forecast.Series, m int) *scenario.Event {
	if m < 2 {
		return nil
	}
	n := ser.Len()
	for _, e := range f.Events {
		if len(e.Past) < 2 {
			continue
		}
		pos := map[int]int{}
		for _, w := range e.Past {
			i := ser.Index(forecast.PeriodOf(ser.Freq(), w.From))
			if i >= 0 && i < n {
				pos[i%m]++
			}
		}
		if len(pos) != 1 {
			continue
		}
		for slot, count := range pos {
			if cycles := (n - slot + m - 1) / m; count >= cycles {
				return e
			}
		}
	}
	return nil
}
