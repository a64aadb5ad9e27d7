package report

import (
	"fmt"
	"forelay/plots"
	"forelay/scenario/supply"
	"math"
)

// The charts of the stress, buffer and compare reports.

// fanChart is the fan chart of scenario s of a stress run: the history
// leading in, then the simulated quantiles, the mean and the capacity.
func fanChart(r *supply.StressRun, s int) plots.FanChart {
	p := r.Plan
	labels, show := FanLabels(p)
	rk := r.Risks[s]
	H := len(rk.Periods)
	c := plots.FanChart{
		Title:   "Stress test " + p.File.Plan + ": " + rk.Name,
		Units:   UnitsLabel(p.File.Units, p.History.Freq().String()),
		Labels:  labels,
		History: plots.Curve{Name: "History", Values: p.History.Values[p.History.Len()-show:]},
		Start:   show,
		P5:      make([]float64, H), P10: make([]float64, H), P50: make([]float64, H),
		P90: make([]float64, H), P95: make([]float64, H), Mean: make([]float64, H),
	}
	for t, pr := range rk.Periods {
		c.P5[t], c.P10[t], c.P50[t], c.P90[t], c.P95[t], c.Mean[t] = pr.P5, pr.P10, pr.P50, pr.P90, pr.P95, pr.Mean
	}
	if capacity := supply.CapacityPerPeriod(p); capacity != nil {
		c.Capacity = capacity
	}
	return c
}

// stockChart is the frozen-production chart of scenario s of a stress
// run: demand (the adjusted plan), capacity, production as bars and the
// stock.
func stockChart(r *supply.StressRun, s int) plots.StockChart {
	p := r.Plan
	fz := r.Frozen[s]
	c := plots.StockChart{
		Title:      "Frozen production, " + p.File.Plan + ": " + r.Risks[s].Name,
		Units:      UnitsLabel(p.File.Units, p.History.Freq().String()),
		StockUnits: StockLabel(p.File.Units),
		Labels:     PeriodLabels(p),
		Demand:     fz.Demand,
		Build:      fz.Production,
		Stock:      fz.Stock,
	}
	if p.File.Capacity != nil {
		c.Capacity = fz.Capacity
	}
	return c
}

// bufferChart is the build plan of a buffer run: demand at the service
// quantile, capacity and the build as bars, with the stock in a panel
// below.
func bufferChart(r *supply.BufferRun) plots.StockChart {
	p, b := r.Plan, r.Buffer
	return plots.StockChart{
		Title: fmt.Sprintf("Build ahead, %s: %s at %s service", p.File.Plan, p.Scenarios[r.Settings.Scenario].Name,
			PctText(r.Settings.Service)),
		Units:      UnitsLabel(p.File.Units, p.History.Freq().String()),
		StockUnits: StockLabel(p.File.Units),
		Labels:     PeriodLabels(p),
		Demand:     b.Demand,
		Capacity:   b.Capacity,
		Build:      b.Build,
		Stock:      b.Stock,
	}
}

// waterfallChart walks from the baseline total through each event's
// contribution to scenario c's total.
func waterfallChart(r *supply.CompareRun, c supply.Comparison) plots.Waterfall {
	return waterfallOf(r.Plan.File.Plan, r.Plan.File.Units, c)
}

// waterfallOf walks from the baseline total through each event's
// contribution to scenario c's total of plan name, in units.
func waterfallOf(name, units string, c supply.Comparison) plots.Waterfall {
	wf := plots.Waterfall{
		Title:      "Plan " + name + ": " + c.Name,
		StartLabel: "Baseline",
		Start:      c.BaselineTotal,
		EndLabel:   c.Name,
	}
	wf.Units = "units over the plan"
	if units != "" {
		wf.Units = units + " over the plan"
	}
	for _, k := range c.Contributions {
		if math.IsNaN(k.Total) {
			continue
		}
		wf.Steps = append(wf.Steps, plots.Step{Label: k.ID, Value: k.Total})
	}
	return wf
}

// compareChart sets the scenarios side by side over the plan periods:
// the baseline, each scenario with events and the capacity above, each
// scenario's change from the baseline below. Scenarios without events are
// the baseline and are left out, as on the plan chart, so each scenario
// keeps its look across plan.png and compare.png.
func compareChart(r *supply.CompareRun) plots.ComparisonChart {
	p := r.Plan
	c := plots.ComparisonChart{
		Title:       "Scenarios of plan " + p.File.Plan + ": " + p.History.Name,
		Units:       UnitsLabel(p.File.Units, p.History.Freq().String()),
		ChangeUnits: "change from baseline",
		Labels:      PeriodLabels(p),
		Baseline:    p.Baseline,
		Capacity:    supply.CapacityPerPeriod(p),
	}
	for _, sp := range p.Scenarios {
		if len(sp.Events) == 0 {
			continue
		}
		c.Scenarios = append(c.Scenarios, plots.Curve{Name: sp.Name, Values: sp.Adjusted})
	}
	return c
}
