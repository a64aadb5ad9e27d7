package report

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"forelay/plots"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// AllCharts asks ForPortfolio for a chart of every series.
const AllCharts = -1

// portfolioCharts returns the charts of a portfolio: the total (its
// summed history, baseline and each scenario with events, with the bands
// of the sums), then one chart per resource against its capacity, in
// file order (resources are few, so each has its chart whatever n is),
// then the plans of the n series the events change most (the largest
// change in any scenario first; all of them for AllCharts).
func portfolioCharts(pf *plan.Portfolio, rollups [][]plan.Rollup, res []resourceLoad, n int) []Chart {
	charts := []Chart{{Name: "total", Plot: totalChart(pf, rollups)}}
	for _, r := range res {
		charts = append(charts, Chart{Name: "resource-" + r.ID, Plot: resourceChart(pf, r)})
	}
	if n == AllCharts {
		n = len(pf.Plans)
	}
	for _, i := range mostChanged(pf)[:min(n, len(pf.Plans))] {
		p := pf.Plans[i]
		charts = append(charts, Chart{Name: "series-" + fileName(p.History.Name), Plot: PlanChart(p)})
	}
	return charts
}

// mostChanged returns the indexes of the portfolio's series ordered by the
// largest absolute change of their total over the horizon in any
// scenario, largest first, ties in the order of Names.
func mostChanged(pf *plan.Portfolio) []int {
	size := make([]float64, len(pf.Plans))
	order := make([]int, len(pf.Plans))
	for i, p := range pf.Plans {
		order[i] = i
		base := plan.Total(p.Baseline)
		for _, sp := range p.Scenarios {
			size[i] = max(size[i], math.Abs(plan.Total(sp.Adjusted)-base))
		}
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(size[b], size[a]) })
	return order
}

// fileName turns a series name into part of a file name: each "/" becomes
// "--" (levels never hold "/", and names are otherwise kept as written).
func fileName(series string) string { return strings.ReplaceAll(series, "/", "--") }

// totalChart draws the total: the summed history over the periods every
// series with history covers (at most ChartHistory of them), the summed
// baseline and each scenario with events with the bands of the sums.
func totalChart(pf *plan.Portfolio, rollups [][]plan.Rollup) plots.PlanChart {
	p0 := pf.Plans[0]
	freq := p0.Periods[0].Freq
	common := math.MaxInt
	for _, p := range pf.Plans {
		if p.History.Len() > 0 {
			common = min(common, p.History.Len())
		}
	}
	if common == math.MaxInt {
		common = 0
	}
	show := min(common, ChartHistory(freq))
	hist := make([]float64, show)
	var labels []string
	for i := range show {
		labels = append(labels, p0.Periods[0].Add(i-show).String())
	}
	for _, p := range pf.Plans {
		n := p.History.Len()
		for i := range show {
			if n > 0 {
				hist[i] += p.History.Values[n-show+i]
			}
		}
	}
	for _, per := range p0.Periods {
		labels = append(labels, per.String())
	}
	total := rollups[0][0]
	c := plots.PlanChart{
		Title:         fmt.Sprintf("Plan %s: total of %d series", pf.File.Plan, len(pf.Plans)),
		Units:         UnitsLabel(pf.File.Units, freq.String()),
		Labels:        labels,
		History:       plots.Curve{Name: "History", Values: hist},
		Baseline:      plots.Curve{Name: "Baseline", Start: show, Values: total.Baseline},
		ForecastStart: show,
	}
	cases := pf.File.Cases()
	for k, rs := range rollups {
		if len(cases[k].Events) == 0 {
			continue
		}
		t := rs[0]
		c.Scenarios = append(c.Scenarios, plots.Curve{Name: t.Scenario, Start: show, Values: t.Adjusted, Lower: t.Lower, Upper: t.Upper})
	}
	return c
}

// resourceChart draws resource r against its capacity over the plan
// periods, as the total chart draws the plan: the load of the baseline
// demand (that of the first scenario without events, when there is one)
// and the load of each scenario with events. The last scenario with
// events (the baseline's load when none has any) is highlighted with a
// band of the plan's z standard deviations of the load either side,
// clipped at 0: load ± z·SD, from supply.LoadRisk.
func resourceChart(pf *plan.Portfolio, r resourceLoad) plots.LoadChart {
	p0 := pf.Plans[0]
	labels := make([]string, len(p0.Periods))
	for t, per := range p0.Periods {
		labels[t] = per.String()
	}
	c := plots.LoadChart{
		Title:    fmt.Sprintf("Plan %s: %s against its capacity", pf.File.Plan, r.ID),
		Units:    UnitsLabel(r.Units, p0.Periods[0].Freq.String()),
		Labels:   labels,
		Capacity: r.Capacity,
	}
	cases := pf.File.Cases()
	band := -1 // the scenario whose load carries the band
	for k, risk := range r.Risk {
		if len(cases[k].Events) > 0 {
			c.Scenarios = append(c.Scenarios, plots.Curve{Name: p0.Scenarios[k].Name, Values: risk.Load})
			band = k
		} else if c.Baseline.Values == nil {
			c.Baseline = plots.Curve{Name: "Baseline", Values: risk.Load}
			if len(c.Scenarios) == 0 {
				band = k
			}
		}
	}
	focus := &c.Baseline
	if len(c.Scenarios) > 0 {
		c.Highlight = len(c.Scenarios) - 1
		focus = &c.Scenarios[c.Highlight]
	}
	focus.Name += fmt.Sprintf(", band ± %s SD", G3(p0.Z))
	focus.Lower, focus.Upper = loadBand(r.Risk[band], p0.Z)
	return c
}

// loadBand returns the band load ± z·SD of a load risk, its lower edge
// clipped at 0.
func loadBand(risk *supply.LoadRisk, z float64) (lower, upper []float64) {
	lower = make([]float64, len(risk.Load))
	upper = make([]float64, len(risk.Load))
	for t, l := range risk.Load {
		lower[t] = max(0, l-z*risk.SD[t])
		upper[t] = l + z*risk.SD[t]
	}
	return lower, upper
}
