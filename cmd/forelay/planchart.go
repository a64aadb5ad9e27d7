package main

import (
	"math"

	"forelay/plots"
	"forelay/scenario"
)

// chartHistory is how many periods of history the plan chart shows before
// the forecast: three years of months, or the equivalent.
func chartHistory(season int) int {
	if season < 4 {
		return 24
	}
	return 3 * season
}

// planChart lays out the plan chart: the last years of history, the
// baseline with its band, each scenario with events and its band, and the
// event windows.
func planChart(p *scenario.Plan) plots.PlanChart {
	n := p.History.Len()
	show := min(n, chartHistory(p.Fit.Config.Season))
	off := n - show // first history index shown
	hz := len(p.Periods)
	labels := make([]string, show+hz)
	for i := 0; i < show; i++ {
		labels[i] = p.History.Period(off + i).String()
	}
	for i, per := range p.Periods {
		labels[show+i] = per.String()
	}
	base := plots.Curve{Name: "Baseline", Start: show, Values: p.Baseline,
		Lower: make([]float64, hz), Upper: make([]float64, hz)}
	for t := range p.Baseline {
		w := p.Z * math.Sqrt(p.BaselineVar[t])
		base.Lower[t], base.Upper[t] = p.Baseline[t]-w, p.Baseline[t]+w
	}
	c := plots.PlanChart{
		Title:         "Plan " + p.File.Plan + ": " + p.History.Name,
		Units:         unitsLabel(p.File.Units, p.History.Freq().String()),
		Labels:        labels,
		History:       plots.Curve{Name: "History", Values: p.History.Values[off:]},
		Baseline:      base,
		ForecastStart: show,
	}
	for _, sp := range p.Scenarios {
		if len(sp.Events) == 0 {
			continue // the baseline already shows it
		}
		c.Scenarios = append(c.Scenarios, plots.Curve{Name: sp.Name, Start: show, Values: sp.Adjusted, Lower: sp.Lower, Upper: sp.Upper})
	}
	first := p.Periods[0]
	for _, e := range p.Future {
		lo, hi, open := e.Window(first)
		from := float64(show + lo.Sub(first))
		to := float64(show + hz - 1)
		if !open {
			to = float64(show + hi.Sub(first))
		}
		if e.Kind == scenario.Step {
			// A step lasts; shade only its start and ramp so the windows
			// of later events stay readable.
			to = min(to, from+float64(max(e.Ramp.Periods, 1)-1))
		}
		if to > float64(show+hz-1) {
			to = float64(show + hz - 1)
		}
		if from < float64(show) {
			from = float64(show)
		}
		if to < from || from > float64(show+hz-1) {
			continue
		}
		c.Windows = append(c.Windows, plots.Window{Label: e.ID, From: from, To: to})
	}
	return c
}

// unitsLabel is the value-axis label: "litres per month", or "per month".
func unitsLabel(units, period string) string {
	if units == "" {
		return "units per " + period
	}
	return units + " per " + period
}

// stockLabel is the value-axis label of a stock panel: "litres in stock".
func stockLabel(units string) string {
	if units == "" {
		return "units in stock"
	}
	return units + " in stock"
}
