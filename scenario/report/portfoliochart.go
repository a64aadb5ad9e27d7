package report

import (
	"fmt"
	"strings"

	"forelay/plots"
	"forelay/scenario/supply"
)

// AllCharts asks ForPortfolio for a chart of every series.
const AllCharts = -1

// portfolioCharts returns the charts of a portfolio: the total (its
// summed history, baseline and each scenario with events, with the bands
// of the sums), then one chart per resource against its capacity, in
// file order (resources are few, so each has its chart whatever the
// number of series charts), then the plans of the series the events
// change most (SeriesCharts).
func portfolioCharts(s *PortfolioSummary) []Chart {
	charts := []Chart{{Name: "total", Plot: totalChart(s)}}
	for _, r := range s.Resources {
		charts = append(charts, Chart{Name: "resource-" + r.ID, Plot: resourceChart(s, r)})
	}
	return append(charts, s.SeriesCharts...)
}

// fileName turns a series name into part of a file name: each "/" becomes
// "--" (levels never hold "/", and names are otherwise kept as written).
func fileName(series string) string { return strings.ReplaceAll(series, "/", "--") }

// totalChart draws the total: the summed history over the periods every
// series with history covers (at most ChartHistory of them), the summed
// baseline and each scenario with events with the bands of the sums.
func totalChart(s *PortfolioSummary) plots.PlanChart {
	first := s.Periods[0]
	show := len(s.HistoryTail)
	var labels []string
	for i := range show {
		labels = append(labels, first.Add(i-show).String())
	}
	for _, per := range s.Periods {
		labels = append(labels, per.String())
	}
	total := s.Rollups[0][0]
	c := plots.PlanChart{
		Title:         fmt.Sprintf("Plan %s: total of %d series", s.Plan, len(s.Series)),
		Units:         UnitsLabel(s.Units, first.Freq.String()),
		Labels:        labels,
		History:       plots.Curve{Name: "History", Values: s.HistoryTail},
		Baseline:      plots.Curve{Name: "Baseline", Start: show, Values: total.Baseline},
		ForecastStart: show,
	}
	for k, rs := range s.Rollups {
		if len(s.CaseEvents[k]) == 0 {
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
func resourceChart(s *PortfolioSummary, r ResourceLoad) plots.LoadChart {
	labels := make([]string, len(s.Periods))
	for t, per := range s.Periods {
		labels[t] = per.String()
	}
	c := plots.LoadChart{
		Title:    fmt.Sprintf("Plan %s: %s against its capacity", s.Plan, r.ID),
		Units:    UnitsLabel(r.Units, s.Periods[0].Freq.String()),
		Labels:   labels,
		Capacity: r.Capacity,
	}
	band := -1 // the scenario whose load carries the band
	for k, risk := range r.Risk {
		if len(s.CaseEvents[k]) > 0 {
			c.Scenarios = append(c.Scenarios, plots.Curve{Name: s.Scenarios[k], Values: risk.Load})
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
	focus.Name += fmt.Sprintf(", band ± %s SD", G3(s.Z))
	focus.Lower, focus.Upper = loadBand(r.Risk[band], s.Z)
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
