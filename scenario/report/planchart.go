package report

import (
	"forelay/plots"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// PlanChart lays out the plan chart: the last years of history (see
// ChartHistory) with the past events cleaned out of it marked, the
// baseline with its band, each scenario with events and its band, and the
// windows of the events ahead.
func PlanChart(p *plan.Plan) plots.PlanChart {
	n := p.History.Len()
	show := min(n, ChartHistory(p.History.Freq()))
	off := n - show // first history index shown
	labels := make([]string, 0, show+len(p.Periods))
	for i := range show {
		labels = append(labels, p.History.Period(off+i).String())
	}
	for _, per := range p.Periods {
		labels = append(labels, per.String())
	}
	c := plots.PlanChart{
		Title:   "Plan " + p.File.Plan + ": " + p.History.Name,
		Units:   UnitsLabel(p.File.Units, p.History.Freq().String()),
		Labels:  labels,
		History: plots.Curve{Name: "History", Values: p.History.Values[off:]},
		Baseline: plots.Curve{Name: "Baseline", Start: show, Values: p.Baseline,
			Lower: p.BaselineLower, Upper: p.BaselineUpper},
		Windows:       futureWindows(p, show),
		Past:          pastWindows(p, off),
		ForecastStart: show,
	}
	for _, sp := range p.Scenarios {
		if len(sp.Events) == 0 {
			continue // the baseline already shows it
		}
		c.Scenarios = append(c.Scenarios, plots.Curve{Name: sp.Name, Start: show, Values: sp.Adjusted, Lower: sp.Lower, Upper: sp.Upper})
	}
	return c
}

// futureWindows returns the windows of the events acting on the plan, in
// whole periods, on a chart whose first plan period is at x = show. A
// step lasts; only its start and ramp are shaded, so the windows of later
// events stay readable.
func futureWindows(p *plan.Plan, show int) []plots.Window {
	hz := len(p.Periods)
	first := p.Periods[0]
	var ws []plots.Window
	for _, e := range p.Future {
		lo, hi, open := e.Window(first)
		from := lo.Sub(first)
		to := hz - 1
		if !open {
			to = hi.Sub(first)
		}
		if e.Kind == scenario.Step {
			to = min(to, from+max(e.Ramp.Periods, 1)-1)
		}
		from, to = max(from, 0), min(to, hz-1)
		if to < from {
			continue
		}
		ws = append(ws, plots.Window{Label: e.ID, From: float64(show+from) - 0.5, To: float64(show+to) + 0.5})
	}
	return ws
}

// pastWindows returns the windows of the past events and past occurrences
// cleaned out of the history (one per estimate of p.Cleaning), in whole
// periods, on a chart whose first label is history period off. Those
// before the history shown are left out.
func pastWindows(p *plan.Plan, off int) []plots.Window {
	shown := p.History.Period(off)
	n := p.History.Len() - off
	var ws []plots.Window
	for _, est := range p.Cleaning {
		e := cleanedOccurrence(p.File, est)
		if e == nil {
			continue
		}
		lo, hi, open := e.Window(p.History.Start)
		from, to := lo.Sub(shown), n-1
		if !open {
			to = min(hi.Sub(shown), n-1)
		}
		from = max(from, 0)
		if to < from {
			continue
		}
		ws = append(ws, plots.Window{Label: est.ID, From: float64(from) - 0.5, To: float64(to) + 0.5})
	}
	return ws
}

// cleanedOccurrence returns the event, or the past occurrence of one,
// that estimate est was made for: the event with est's ID whose start is
// est.When. It returns nil when there is none.
func cleanedOccurrence(f *scenario.File, est plan.Estimate) *scenario.Event {
	for _, e := range f.Events {
		if e.ID != est.ID {
			continue
		}
		if e.Start.Label == est.When {
			return e
		}
		for _, o := range e.Occurrences() {
			if o.Start.Label == est.When {
				return o
			}
		}
	}
	return nil
}
