package main

import (
	"forelay/plots"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/supply"
)

// fanLabels returns the x labels of a chart that shows the last periods
// of the history and then the plan, and the number of history periods
// shown.
func fanLabels(p *plan.Plan) (labels []string, show int) {
	n := p.History.Len()
	show = min(n, report.ChartHistory(p.History.Freq()))
	labels = make([]string, 0, show+len(p.Periods))
	for i := n - show; i < n; i++ {
		labels = append(labels, p.History.Period(i).String())
	}
	for _, per := range p.Periods {
		labels = append(labels, per.String())
	}
	return labels, show
}

// fanChart is the fan chart of the charted scenario: the history leading
// in, then the simulated quantiles, the mean and the capacity.
func fanChart(r *stressResult) plots.FanChart {
	p := r.Plan
	labels, show := fanLabels(p)
	rk := r.Risks[r.Chart]
	H := len(rk.Periods)
	c := plots.FanChart{
		Title:   "Stress test " + p.File.Plan + ": " + rk.Name,
		Units:   report.UnitsLabel(p.File.Units, p.History.Freq().String()),
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

// stockChart is the frozen-production chart of the charted scenario:
// demand (the adjusted plan), capacity, production as bars and the stock.
func stockChart(r *stressResult) plots.StockChart {
	p := r.Plan
	fz := r.Frozen[r.Chart]
	labels := make([]string, len(p.Periods))
	for t, per := range p.Periods {
		labels[t] = per.String()
	}
	c := plots.StockChart{
		Title:      "Frozen production, " + p.File.Plan + ": " + r.Risks[r.Chart].Name,
		Units:      report.UnitsLabel(p.File.Units, p.History.Freq().String()),
		StockUnits: report.StockLabel(p.File.Units),
		Labels:     labels,
		Demand:     fz.Demand,
		Build:      fz.Production,
		Stock:      fz.Stock,
	}
	if p.File.Capacity != nil {
		c.Capacity = fz.Capacity
	}
	return c
}
