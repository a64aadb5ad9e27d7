package report

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/plots"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// A PortfolioHandover is what "forelay report" ran on a portfolio, to bind
// into one document (ForPortfolioHandover).
type PortfolioHandover struct {
	// Portfolio is the plan of every series.
	Portfolio *plan.Portfolio
	// Charts is how many of the most-changed series get a chart.
	Charts int
	// Compare is the comparison of its scenarios.
	Compare *supply.PortfolioCompareRun
	// Stress is its stress test, the total and each resource against
	// capacity, and Chart the index of the scenario it charts.
	Stress *supply.PortfolioStressRun
	Chart  int
	// Buffer is the pre-build per resource; nil when no resource has a
	// capacity.
	Buffer *supply.PortfolioBufferRun
	// Track is the tracking of new actuals; nil when none were given.
	Track *PortfolioTrack
	// More are input files besides the scenario and the history.
	More []InputFile
	// Left are sentences saying what was left out and why.
	Left []string
}

// ForPortfolioHandover binds the reports of a portfolio into a Book: what
// was planned and from what, the baselines, the events, the totals per
// level, the resources and the most-changed series with their charts, the
// comparison, the capacity risk and pre-build per resource, the tracking
// when there are actuals, a table of every series, the warnings and the
// caution. It returns the error of Portfolio.Rollups.
func ForPortfolioHandover(h PortfolioHandover) (*Book, error) {
	pf := h.Portfolio
	p0 := pf.Plans[0]
	f := pf.File
	d := forecast.Decimals(p0.Baseline)
	lead := fmt.Sprintf("%d series, %d %s periods %s to %s%s", len(pf.Plans), len(p0.Periods), p0.History.Freq(),
		p0.Periods[0], p0.Periods[len(p0.Periods)-1], InUnits(f.Units))
	b := &Book{Title: "Plan " + f.Plan, Lead: []string{lead}}

	sum, err := newPortfolioSummary(pf, h.Charts)
	if err != nil {
		return nil, err
	}
	rollups := sum.Rollups

	var in Text
	in.Add(factsTable(portfolioFacts(pf)...))
	fmt.Fprintln(&in, "Input files (SHA-256 of their bytes; the same files give the same report):")
	in.Add(filesTable(inputFiles(f, p0.Digests, h.More)))
	for _, s := range h.Left {
		fmt.Fprintf(&in, "Note: %s\n", s)
	}
	b.Sections = append(b.Sections, Section{ID: "planned", Title: "What was planned, and from what", Text: &in})

	var base Text
	base.Add(methodsTable(pf))
	fmt.Fprintln(&base, "Each series has a baseline of its own, fitted to its history with the past events taken out; the table of every series at the end gives each one's method and accuracy.")
	b.Sections = append(b.Sections, Section{ID: "baseline", Title: "Baselines", Text: &base})

	b.Sections = append(b.Sections, eventsSection(f, nil, p0.Periods[0], d))

	var lv Text
	levelTables(&lv, pf, rollups, d)
	b.Sections = append(b.Sections, Section{ID: "levels", Title: "Totals per level",
		Intro: "The plan summed over the horizon for every group of each level, the baseline and each scenario.", Text: &lv})

	sum.inPage = true
	r := PortfolioSummaryReport(sum)
	r.CSV = portfolioCSV(pf)
	r.Charts = append(scenarioTotals(sum), r.Charts[1:]...)
	b.add("scenarios", "Scenarios, resources and the most-changed series", "", captioned(r, portfolioCaption))
	b.Sections[len(b.Sections)-1].ChartPerHeading = true

	if h.Compare != nil {
		b.add("comparison", "Scenarios side by side", "The total and each resource in every scenario, from the Monte Carlo, and how each event adds to the total.", captioned(PortfolioCompare(h.Compare), compareCaption))
	}
	if h.Stress != nil {
		b.add("capacity", "Capacity risk per resource", "", captioned(PortfolioStress(h.Stress, h.Chart), stressCaption(p0.Scenarios[h.Chart].Name)))
	}
	if h.Buffer != nil {
		b.add("prebuild", "Pre-build per resource", "", captioned(PortfolioBuffer(h.Buffer), bufferCaption))
	}
	if h.Track != nil {
		tr := *h.Track
		tr.InPage = true
		b.add("tracking", "Tracking against new actuals", "", captioned(ForPortfolioTrack(tr), trackCaption))
	}

	var every Text
	every.Add(everySeriesTable(pf, d))
	b.Sections = append(b.Sections, Section{ID: "series", Title: "Every series",
		Intro: "Totals over the horizon; MAD is the baseline's in-sample one-step mean absolute deviation.", Text: &every})
	b.warn(pf.Warnings)
	return b, nil
}

// portfolioFacts are the facts of a portfolio.
func portfolioFacts(pf *plan.Portfolio) [][2]string {
	p0 := pf.Plans[0]
	f := pf.File
	var names []string
	for _, sp := range p0.Scenarios {
		names = append(names, sp.Name)
	}
	var res []string
	for _, r := range f.Resources {
		res = append(res, r.ID)
	}
	return [][2]string{
		{"plan", f.Plan},
		{"series", fmt.Sprintf("%d", len(pf.Plans))},
		{"levels", OrNone([]string{strings.Join(pf.Levels, ", ")})},
		{"units", OrNone([]string{f.Units})},
		{"periods planned", fmt.Sprintf("%d %s periods, %s to %s", len(p0.Periods), p0.History.Freq(), p0.Periods[0], p0.Periods[len(p0.Periods)-1])},
		{"scenarios", strings.Join(names, ", ")},
		{"resources", OrNone([]string{strings.Join(res, ", ")})},
		{"bands", fmt.Sprintf("+- %.3g standard errors", p0.Z)},
	}
}

// methodsTable counts the series of each baseline method, in the order
// first met.
func methodsTable(pf *plan.Portfolio) *Table {
	var order []string
	count := map[string]int{}
	for _, p := range pf.Plans {
		m := methodOf(p)
		if count[m] == 0 {
			order = append(order, m)
		}
		count[m]++
	}
	t := NewTable("baseline method", "series")
	for _, m := range order {
		t.AddRow(m, fmt.Sprint(count[m]))
	}
	return t
}

// methodOf names a series' baseline method.
func methodOf(p *plan.Plan) string {
	if p.Fit == nil {
		return "none (a new series)"
	}
	return p.Fit.Method.String()
}

// levelTables writes one table per level rolled up: each group's series,
// baseline total and total in every scenario.
func levelTables(w *Text, pf *plan.Portfolio, rollups [][]plan.Rollup, d int) {
	p0 := pf.Plans[0]
	head := []string{"group", "series", "baseline"}
	for _, sp := range p0.Scenarios {
		head = append(head, sp.Name)
	}
	var t *Table
	level := ""
	for i, r := range rollups[0] {
		if r.Level != level || t == nil {
			level = r.Level
			if r.Depth > 0 {
				w.Heading("Level " + level)
			}
			h := append([]string(nil), head...)
			h[0] = level
			t = NewTable(h...)
			w.Add(t)
		}
		row := []string{r.Group, fmt.Sprint(len(r.Members)), num(plan.Total(r.Baseline), d)}
		for k := range p0.Scenarios {
			row = append(row, num(plan.Total(rollups[k][i].Adjusted), d))
		}
		t.AddRow(row...)
	}
}

// everySeriesTable lists every series: its baseline method and in-sample
// MAD, its baseline total and its total in every scenario.
func everySeriesTable(pf *plan.Portfolio, d int) *Table {
	p0 := pf.Plans[0]
	head := []string{"series", "method", "MAD", "baseline"}
	for _, sp := range p0.Scenarios {
		head = append(head, sp.Name)
	}
	t := NewTable(head...).Left(1)
	for _, p := range pf.Plans {
		mad := "-"
		if p.Fit != nil {
			mad = num(p.Fit.Accuracy.MAD, d)
		}
		row := []string{p.History.Name, methodOf(p), mad, num(plan.Total(p.Baseline), d)}
		for _, sp := range p.Scenarios {
			row = append(row, num(plan.Total(sp.Adjusted), d))
		}
		t.AddRow(row...)
	}
	return t
}

// portfolioCaption captions the charts of a portfolio plan by their
// names.
func portfolioCaption(name string) string {
	if strings.HasPrefix(name, "resource-") {
		return "The load of resource " + strings.TrimPrefix(name, "resource-") + " in each scenario against its capacity."
	}
	s := strings.ReplaceAll(strings.TrimPrefix(name, "series-"), "--", "/")
	return "Series " + s + ", one of those the events change most: history, baseline and each scenario."
}

// scenarioTotals draws the portfolio's total once per scenario: the
// summed history, the summed baseline and that scenario alone with the
// band of the sum.
func scenarioTotals(s *PortfolioSummary) []Chart {
	var out []Chart
	for k, rs := range s.Rollups {
		c := totalChart(s)
		c.Title = "Total of " + fmt.Sprint(len(s.Series)) + " series: scenario " + rs[0].Scenario
		c.Scenarios = nil
		if len(s.CaseEvents[k]) > 0 {
			t := rs[0]
			c.Scenarios = []plots.Curve{{Name: t.Scenario, Start: c.ForecastStart, Values: t.Adjusted, Lower: t.Lower, Upper: t.Upper}}
		}
		caption := fmt.Sprintf("The portfolio's total in scenario %s: the summed history, the summed baseline and the scenario with the band of the sum (%s).",
			rs[0].Scenario, evsText(s.CaseEvents[k]))
		out = append(out, Chart{Name: "total-" + rs[0].Scenario, Plot: c, Caption: caption})
	}
	return out
}
