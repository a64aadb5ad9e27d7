package plan

import (
	"errors"
	"fmt"
	"maps"
	"slices"

	"forelay/forecast"
	"forelay/scenario"
)

// A Portfolio is the plan of several series from one scenario file: one
// Plan per series, each built as the series sees the file
// (scenario.File.ForSeries), so that an event moves only the series of its
// scope, with the series' share of its effect, and a past event is cleaned
// out of those series only.
type Portfolio struct {
	// File is the scenario file the portfolio was built from.
	File *scenario.File
	// Names are the series planned, in the order history.series selects
	// them, then those the scopes create (new: true), and Levels the names
	// of their levels.
	Names  []string
	Levels []string
	// Plans holds each series' plan, in the order of Names. A plan's File
	// is the series' view of File.
	Plans []*Plan
	// Warnings are those of the file (File.Lint), then each series' own,
	// naming the series, in the order of Names.
	Warnings []string
	// Notes are remarks on the portfolio as a whole, one sentence each.
	Notes []string
	// Span is the number of periods from the earliest start among the
	// series history.series selects (those left out included) to the
	// first plan period: the longest a series' history can reach back,
	// the same whichever of the series are planned in a run (see
	// sim.SimulatePortfolio). Zero in a Portfolio built by hand.
	Span int

	// Shard is set in the plan of one shard of a portfolio (ReadShard):
	// the names the whole portfolio plans, and where the shard's own
	// series stand among them.
	Shard *ShardOf

	// index maps each name of Names to its plan's index (BuildPortfolio
	// sets it; nil in a Portfolio built by hand).
	index map[string]int
}

// PlanOf returns the plan of the series called name, or nil when the
// portfolio does not plan it.
func (pf *Portfolio) PlanOf(name string) *Plan {
	if i := pf.IndexOf(name); i >= 0 {
		return pf.Plans[i]
	}
	return nil
}

// IndexOf returns the index in Plans of the series called name, or -1.
func (pf *Portfolio) IndexOf(name string) int {
	if pf.index != nil {
		if i, ok := pf.index[name]; ok {
			return i
		}
		return -1
	}
	return slices.IndexFunc(pf.Plans, func(p *Plan) bool { return p.History.Name == name })
}

// WantsPortfolio reports whether the inputs call for a portfolio
// (BuildPortfolio) rather than a plan of one series (Build): history.series
// selects several series, or a scope creates one (new: true) beside the
// history's.
func WantsPortfolio(f *scenario.File, in *Inputs) bool {
	return len(in.Selected) > 1 || len(f.NewSeries(in.Selected)) > 0
}

// BuildPortfolio builds the plan of every series in (Inputs.Selected), in
// two passes over the series. The first cleans each history and fits its
// baseline; an effect split by baseline is then shared equally, which
// matters only for a future event that starts inside the history (its
// planned effect is taken out of the history before the fit). The second
// shares each effect among the series of its scope (scenario.Event.Shares,
// weighing a series by its baseline over the event's span) and lays the
// events on each baseline.
//
// The series are planned on workers goroutines (zero or less: one per
// core); the portfolio, and the error reported when several series fail
// (that of the first in order), do not depend on their number.
//
// The plans share their periods: a series that ends before the others is
// left out with a warning, and the scopes are checked against the series
// planned (CheckPortfolio).
// A series that a scope creates (new: true) comes after the selected ones:
// its baseline and the baseline's variance are zero, so its plan and
// bands come from its events alone (their range and probability), and it
// has no Fit. Resources are not part of a plan: their loads come from the
// plans (package supply). Errors are those of CheckPortfolio, then those of
// Build.
func BuildPortfolio(f *scenario.File, in *Inputs, workers int) (*Portfolio, error) {
	return BuildPortfolioProgress(f, in, workers, nil)
}

// BuildPortfolioProgress is BuildPortfolio that tells progress of each
// series whose history is cleaned and baseline fitted (the first pass; see
// forecast.Progress); the portfolio is that of BuildPortfolio.
func BuildPortfolioProgress(f *scenario.File, in *Inputs, workers int, progress forecast.Progress) (*Portfolio, error) {
	r, warnings, err := checkPortfolio(f, in)
	if err != nil {
		return nil, err
	}
	all := slices.Clip(r.names)
	created := f.NewSeries(all)
	all = append(all, created...)
	first := r.first
	// The series fitted: those whose values were read (in a shard, its
	// own and those that share an effect split by baseline, see
	// ReadShard) and those a scope creates.
	var fit []int
	for i := range all {
		if i >= len(r.names) || r.read(i) {
			fit = append(fit, i)
		}
	}
	equal, err := f.SharesOf(all, func(*scenario.Event, string) float64 { return 1 }, in.fitted(all, fit))
	if err != nil {
		return nil, err
	}
	pf := &Portfolio{File: f, Names: all, Levels: in.Levels, Plans: make([]*Plan, len(all)), Span: r.span}
	tick := progress.Counter(len(all))
	for range len(all) - len(fit) {
		tick() // another shard's series, not needed for a split
	}
	bases := make([][]float64, len(fit))
	err = eachSeries(len(fit), workers, func(j int) string { return all[fit[j]] }, func(j int) error {
		defer tick()
		i := fit[j]
		view := f.ForSeries(all[i], equal[all[i]])
		var p *Plan
		var base []float64
		if i >= len(r.names) { // created by a scope: no history to clean or fit
			p, base = newSeriesPlan(view, forecast.Series{Name: all[i], Start: first}, in.Digests), make([]float64, f.Horizon)
		} else {
			ser := r.series(i)
			one := &Inputs{History: in.History, Series: ser, Selected: []string{ser.Name}, Levels: in.Levels, Digests: in.Digests}
			var spec forecast.Spec
			p, spec = newPlan(view, one)
			if err := p.clean(spec); err != nil {
				return err
			}
			base = p.Fit.Model.Forecast(f.Horizon)
		}
		pf.Plans[i], bases[j] = p, base
		return nil
	})
	if err != nil {
		return nil, err
	}
	base := make(map[string][]float64, len(fit))
	for j, i := range fit {
		base[all[i]] = bases[j]
	}
	shares, err := f.SharesOf(all, func(e *scenario.Event, s string) float64 { return e.SpanWeight(first, base[s]) }, in.shard)
	var se *scenario.SplitError
	if errors.As(err, &se) {
		return nil, f.ValueError(fmt.Sprintf("event %q: effect.split", se.Event.ID), se.Event.Pos,
			"the %d series sharing the effect have no baseline over the event's span (%v); use split: equal, or give scope entries their own effects", se.Sharing, scenario.ErrNoSplitBase)
	}
	if err != nil {
		return nil, err
	}
	err = eachSeries(len(fit), workers, func(j int) string { return all[fit[j]] }, func(j int) error {
		p := pf.Plans[fit[j]]
		if !in.plans(p.History.Name) {
			return nil // planned by another shard (fitted here for a split only)
		}
		p.retarget(f.ForSeries(p.History.Name, shares[p.History.Name]))
		p.lay()
		return nil
	})
	if err != nil {
		return nil, err
	}
	pf.Notes = append(pf.Notes, inputNotes(f, in.History)...)
	if len(f.Resources) > 0 {
		pf.Notes = append(pf.Notes, fmt.Sprintf("the loads of the file's %d resource(s) are those of the planned demand, and their breach chances take the load as normal with the scenario's events happening; forelay stress simulates them with the events' probabilities and ranges", len(f.Resources)))
	}
	if in.shard != nil {
		pf.keepShard(in.shard, first, in.Digests)
	} else {
		pf.index = make(map[string]int, len(all))
		for i, name := range all {
			pf.index[name] = i
		}
	}
	lint := f.Lint(r.series(0))
	pf.Warnings = append(append(pf.Warnings, warnings...), lint...)
	seen := make(map[string]bool, len(pf.Warnings))
	for _, w := range pf.Warnings {
		seen[w] = true
	}
	for _, p := range pf.Plans {
		for _, w := range p.Warnings {
			if slices.Contains(lint, w) {
				continue // about the file, not the series
			}
			if w = fmt.Sprintf("series %s: %s", p.History.Name, w); !seen[w] {
				seen[w] = true
				pf.Warnings = append(pf.Warnings, w)
			}
		}
	}
	return pf, nil
}

// retarget points a cleaned plan at view, the series' view with the final
// shares: the plan's file becomes view and each future event its copy in
// view, except those whose effect was learnt from the past (a learnt
// effect is the series' own and is kept).
func (p *Plan) retarget(view *scenario.File) {
	p.File = view
	for i, e := range p.Future {
		if e.Effect.FromPast {
			continue
		}
		if v := view.Event(e.ID); v != nil {
			p.Future[i] = v
		}
	}
}

// createsSeries reports whether a scope entry of e creates a series
// (new: true).
func createsSeries(e *scenario.Event) bool {
	return slices.ContainsFunc(e.Scope, func(s scenario.ScopeEntry) bool { return s.New })
}

// noNewSeries refuses a scope entry with new: true in a plan of one
// series: only a portfolio plans series without history.
func noNewSeries(f *scenario.File) error {
	for _, e := range f.Events {
		for i, s := range e.Scope {
			if s.New {
				return f.ValueError(fmt.Sprintf("event %q: scope[%d].new", e.ID, i), s.Pos,
					"a series without history is planned as part of a plan of several series (by plan, stress, buffer and compare); this command takes the history's series only so far")
			}
		}
	}
	return nil
}

// newSeriesPlan starts the plan of a series that a scope creates: no
// history, no fit, and every event of its view that is not wholly past.
func newSeriesPlan(view *scenario.File, ser forecast.Series, digests map[string]string) *Plan {
	p := &Plan{File: view, History: ser, Z: view.Bands.Z, Floor: view.Bands.Floor, Digests: maps.Clone(digests),
		Mode: view.Bands.Widen, From: view.Bands.From}
	for _, e := range view.Events {
		if !e.IsPast(ser.Start) {
			p.Future = append(p.Future, e)
		}
	}
	return p
}

// CheckPortfolio makes the checks of a portfolio that need no fit and
// returns the series to plan, in the order of Inputs.Selected, with its
// warnings. The plan's history ends in the latest last period of the
// selected series; a series that ends earlier (discontinued, or not
// brought up to date) is left out with a warning naming how many, the
// first few and the fix, so that one stale series never stops the plan
// of thousands. The scopes and resources are then checked against the
// series planned (File.CheckSeries). A series whose values were not read
// (a series of another shard, see ReadShard) comes with zeros.
func CheckPortfolio(f *scenario.File, in *Inputs) ([]forecast.Series, []string, error) {
	r, warnings, err := checkPortfolio(f, in)
	if err != nil {
		return nil, nil, err
	}
	series := make([]forecast.Series, len(r.names))
	for i := range series {
		series[i] = r.series(i)
	}
	return series, warnings, nil
}

// checkPortfolio is CheckPortfolio, returning the series to plan as a
// roster.
func checkPortfolio(f *scenario.File, in *Inputs) (*roster, []string, error) {
	r, warnings, err := newRoster(f, in)
	if err != nil {
		return nil, nil, err
	}
	var file []string // needed for scope entries with new: true only
	if slices.ContainsFunc(f.Events, createsSeries) {
		file = names(in.History)
	}
	if err := f.CheckSeries(r.names, file); err != nil {
		return nil, nil, err
	}
	return r, warnings, nil
}
