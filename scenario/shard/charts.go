package shard

import (
	"cmp"
	"slices"

	"forelay/plots"
	"forelay/scenario/plan"
	"forelay/scenario/report"
)

// NoCharts is PlanSums.ChartCount of a plan run with --charts none: the
// merge writes no chart at all.
const NoCharts = -2

// A SeriesChart is the chart of one series' plan (report.PlanChart) as
// sums.json holds it, with what the merge ranks it by: the series' index
// in the whole portfolio and how much the events change it
// (report.ChangeSize).
type SeriesChart struct {
	Index         int           `json:"index"`
	Size          float64       `json:"size"`
	Series        string        `json:"series"`
	Title         string        `json:"title"`
	Units         string        `json:"units"`
	Labels        []string      `json:"labels"`
	History       ChartCurve    `json:"history"`
	Baseline      ChartCurve    `json:"baseline"`
	Scenarios     []ChartCurve  `json:"scenarios"`
	Windows       []ChartWindow `json:"windows"`
	Past          []ChartWindow `json:"past"`
	ForecastStart int           `json:"forecast_start"`
}

// A ChartCurve is a plots.Curve; empty numbers stand for none.
type ChartCurve struct {
	Name   string `json:"name"`
	Start  int    `json:"start"`
	Values Floats `json:"values"`
	Lower  Floats `json:"lower"`
	Upper  Floats `json:"upper"`
}

// A ChartWindow is a plots.Window.
type ChartWindow struct {
	Label string  `json:"label"`
	From  float64 `json:"from"`
	To    float64 `json:"to"`
}

// shardCharts returns the charts of the n series of the shard the events
// change most (report.AllCharts for all of them), in the order a run over
// every series ranks them.
func shardCharts(pf *plan.Portfolio, series []report.SeriesSummary, n int) []SeriesChart {
	if n == NoCharts {
		n = 0
	}
	if n == report.AllCharts || n > len(series) {
		n = len(series)
	}
	out := []SeriesChart{}
	for _, i := range report.ByChange(series)[:n] {
		p := pf.Plans[i]
		c := report.PlanChart(p)
		sc := SeriesChart{Index: pf.Shard.Index[i], Size: report.ChangeSize(series[i]), Series: p.History.Name, Title: c.Title, Units: c.Units,
			Labels: c.Labels, History: curveOf(c.History), Baseline: curveOf(c.Baseline), ForecastStart: c.ForecastStart}
		for _, cv := range c.Scenarios {
			sc.Scenarios = append(sc.Scenarios, curveOf(cv))
		}
		sc.Windows, sc.Past = windowsOf(c.Windows), windowsOf(c.Past)
		out = append(out, sc)
	}
	return out
}

// mergedCharts returns the charts of the n series of the whole portfolio
// the events change most, from all, the shards' own most-changed series:
// the largest change first, ties in the order of the portfolio.
func mergedCharts(all []SeriesChart, n int) []report.Chart {
	slices.SortFunc(all, func(a, b SeriesChart) int {
		if c := cmp.Compare(b.Size, a.Size); c != 0 {
			return c
		}
		return cmp.Compare(a.Index, b.Index)
	})
	if n != report.AllCharts {
		all = all[:max(0, min(n, len(all)))]
	}
	var out []report.Chart
	for _, sc := range all {
		c := plots.PlanChart{Title: sc.Title, Units: sc.Units, Labels: sc.Labels, History: sc.History.curve(), Baseline: sc.Baseline.curve(),
			ForecastStart: sc.ForecastStart}
		for _, cv := range sc.Scenarios {
			c.Scenarios = append(c.Scenarios, cv.curve())
		}
		for _, w := range sc.Windows {
			c.Windows = append(c.Windows, plots.Window(w))
		}
		for _, w := range sc.Past {
			c.Past = append(c.Past, plots.Window(w))
		}
		out = append(out, report.Chart{Name: report.SeriesChartName(sc.Series), Plot: c})
	}
	return out
}

func curveOf(c plots.Curve) ChartCurve {
	return ChartCurve{Name: c.Name, Start: c.Start, Values: c.Values, Lower: c.Lower, Upper: c.Upper}
}

// curve returns the plots.Curve, nil where the numbers are empty.
func (c ChartCurve) curve() plots.Curve {
	return plots.Curve{Name: c.Name, Start: c.Start, Values: c.Values.orNil(), Lower: c.Lower.orNil(), Upper: c.Upper.orNil()}
}

func windowsOf(ws []plots.Window) []ChartWindow {
	out := []ChartWindow{}
	for _, w := range ws {
		out = append(out, ChartWindow(w))
	}
	return out
}
