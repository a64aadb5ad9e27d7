package report

import (
	"cmp"
	"math"
	"slices"

	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// PortfolioSummary is what the report of a portfolio plan shows of the
// whole portfolio: its roll-ups, resources, each series' totals and the
// charts. A plan over every series (ForPortfolio) and a merge of shards
// (package shard) both fill one, so the two write the same text, files
// and charts.
type PortfolioSummary struct {
	// Plan and Units are the scenario file's, Levels the names of the
	// levels of its series names; HistoryEnd labels the history's last
	// period and Inputs are the digests of the input files.
	Plan, Units string
	Levels      []string
	HistoryEnd  string
	Inputs      map[string]string
	// Periods are the plan's periods and Z the width of its bands in
	// standard errors; Scenarios and CaseEvents are each scenario's name
	// and event ids.
	Periods    []forecast.Period
	Z          float64
	Scenarios  []string
	CaseEvents [][]string
	// Rollups[k] are scenario k's roll-ups: the total, then every group
	// of every level, from the widest (plan.Portfolio.Rollups); their
	// Members may be empty, and GroupSizes[i] is the number of series of
	// the i-th roll-up, the same in every scenario.
	Rollups    [][]plan.Rollup
	GroupSizes []int
	// Resources are the resources with their loads per scenario.
	Resources []ResourceLoad
	// Series are the series, in the order of the portfolio's names.
	Series []SeriesSummary
	// HistoryTail is the summed history over the last periods that every
	// series with history covers, at most ChartHistory of them, ending
	// with the history's last period; SeriesCharts are the plans of the
	// series the events change most, charted.
	HistoryTail  []float64
	SeriesCharts []Chart
	// Notes and Warnings are the plan's.
	Notes, Warnings []string
	// MoreTables are the events and accuracy tables of the workbook;
	// empty when the series' plans are not at hand (a merge).
	MoreTables []CSVFile

	// detail, when set, writes more of scenario k after its roll-ups;
	// inPage is set when the report goes into a page whose table of every
	// series stands in for summary.csv (the handover report).
	detail func(w *Text, k int)
	inPage bool
}

// A SeriesSummary is one series of a portfolio: whether a scope creates
// it (New), its in-sample MAD and MSE (0 when New), its baseline per
// period and its plan per scenario and period.
type SeriesSummary struct {
	Name     string
	New      bool
	MAD, MSE float64
	Baseline []float64
	Adjusted [][]float64
}

// SeriesSummaryOf returns what a portfolio's report shows of the plan of
// one of its series.
func SeriesSummaryOf(p *plan.Plan) SeriesSummary {
	ss := SeriesSummary{Name: p.History.Name, New: p.Fit == nil, Baseline: p.Baseline}
	if p.Fit != nil {
		ss.MAD, ss.MSE = p.Fit.Accuracy.MAD, p.Fit.Accuracy.MSE
	}
	for _, sp := range p.Scenarios {
		ss.Adjusted = append(ss.Adjusted, sp.Adjusted)
	}
	return ss
}

// A ResourceLoad is a resource with the number of series it loads and
// its load in each scenario.
type ResourceLoad struct {
	supply.Resource
	// Size is the number of series the resource loads.
	Size int
	// Risk holds the load per period of each scenario, in scenario order,
	// with its spread and breach risk.
	Risk []*supply.LoadRisk
}

// newPortfolioSummary returns the summary of a portfolio planned whole,
// with the charts of its n most-changed series (AllCharts for all). It
// returns the error of Portfolio.Rollups or supply.PortfolioLoadRisk.
func newPortfolioSummary(pf *plan.Portfolio, n int) (*PortfolioSummary, error) {
	p0 := pf.Plans[0]
	s := &PortfolioSummary{Plan: pf.File.Plan, Units: pf.File.Units, Levels: pf.Levels,
		HistoryEnd: p0.History.Period(p0.History.Len() - 1).String(), Inputs: p0.Digests, Periods: p0.Periods, Z: p0.Z,
		Notes: pf.Notes, Warnings: pf.Warnings, MoreTables: portfolioTables(pf), HistoryTail: historyTail(pf)}
	cases := pf.File.Cases()
	for k, sp := range p0.Scenarios {
		s.Scenarios = append(s.Scenarios, sp.Name)
		s.CaseEvents = append(s.CaseEvents, eventIDList(cases[k].Events))
		rs, err := pf.Rollups(sp.Name)
		if err != nil {
			return nil, err
		}
		s.Rollups = append(s.Rollups, rs)
	}
	for _, ru := range s.Rollups[0] {
		s.GroupSizes = append(s.GroupSizes, len(ru.Members))
	}
	for _, r := range supply.PortfolioResources(pf) {
		rl := ResourceLoad{Resource: r, Size: len(r.Series)}
		for k := range p0.Scenarios {
			risk, err := supply.PortfolioLoadRisk(pf, r, k)
			if err != nil {
				return nil, err
			}
			rl.Risk = append(rl.Risk, risk)
		}
		s.Resources = append(s.Resources, rl)
	}
	for _, p := range pf.Plans {
		s.Series = append(s.Series, SeriesSummaryOf(p))
	}
	if n == AllCharts {
		n = len(pf.Plans)
	}
	for _, i := range ByChange(s.Series)[:min(n, len(pf.Plans))] {
		p := pf.Plans[i]
		s.SeriesCharts = append(s.SeriesCharts, Chart{Name: SeriesChartName(p.History.Name), Plot: PlanChart(p)})
	}
	return s, nil
}

// historyTail returns the summed history of a portfolio over the last
// periods every series with history covers, at most ChartHistory.
func historyTail(pf *plan.Portfolio) []float64 {
	common := math.MaxInt
	for _, p := range pf.Plans {
		if p.History.Len() > 0 {
			common = min(common, p.History.Len())
		}
	}
	if common == math.MaxInt {
		common = 0
	}
	show := min(common, ChartHistory(pf.Plans[0].Periods[0].Freq))
	hist := make([]float64, show)
	for _, p := range pf.Plans {
		n := p.History.Len()
		for i := range show {
			if n > 0 {
				hist[i] += p.History.Values[n-show+i]
			}
		}
	}
	return hist
}

// ChangeSize is how much the events change a series: the largest absolute
// change of its total over the horizon in any scenario.
func ChangeSize(s SeriesSummary) float64 {
	base := plan.Total(s.Baseline)
	size := 0.0
	for _, adj := range s.Adjusted {
		size = max(size, math.Abs(plan.Total(adj)-base))
	}
	return size
}

// ByChange returns the indexes of series ordered by ChangeSize, largest
// first, ties in the order given.
func ByChange(series []SeriesSummary) []int {
	size := make([]float64, len(series))
	order := make([]int, len(series))
	for i, s := range series {
		order[i], size[i] = i, ChangeSize(s)
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(size[b], size[a]) })
	return order
}

// SeriesChartName is the base name of the chart files of a series' plan.
func SeriesChartName(series string) string { return "series-" + fileName(series) }
