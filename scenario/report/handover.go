package report

import (
	"fmt"
	"slices"
	"strings"

	"forelay/forecast"
	"forelay/plots"
	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
)

// A Handover is what "forelay report" ran on a plan of one series, to
// bind into one document (ForHandover).
type Handover struct {
	// Plan is the plan.
	Plan *plan.Plan
	// Compare is the comparison of its scenarios.
	Compare *supply.CompareRun
	// Stress is its stress test against capacity, and Chart the index of
	// the scenario whose charts it draws.
	Stress *supply.StressRun
	Chart  int
	// Buffer is the pre-build and safety stock of one scenario; nil when
	// the plan has no capacity to size it against.
	Buffer *supply.BufferRun
	// Track is the tracking of new actuals; nil when none were given.
	Track *Track
	// More are input files besides the scenario and the history (the
	// actuals).
	More []InputFile
	// Left are sentences saying what was left out and why.
	Left []string
}

// ForHandover binds the reports of a plan of one series into a Book: what
// was planned and from what, the baseline with its accuracy and the
// candidates it beat, the events, each scenario with its chart, the
// comparison and its waterfalls, the capacity risk, the pre-build, the
// tracking when there are actuals, the warnings of them all and the
// caution.
func ForHandover(h Handover) *Book {
	p := h.Plan
	f := p.File
	d := forecast.Decimals(p.Baseline)
	b := &Book{Title: "Plan " + f.Plan, Lead: []string{planSpan(p)}}

	var in Text
	in.Add(factsTable(planFacts(p)...))
	fmt.Fprintln(&in, "Input files (SHA-256 of their bytes; the same files give the same report):")
	in.Add(filesTable(inputFiles(f, p.Digests, h.More)))
	for _, s := range h.Left {
		fmt.Fprintf(&in, "Note: %s\n", s)
	}
	b.Sections = append(b.Sections, Section{ID: "planned", Title: "What was planned, and from what", Text: &in})
	b.warn(p.Warnings)

	var base Text
	FitText(&base, p.Fit, len(p.Periods), Bands{Z: p.Z, Mode: p.Mode, From: p.From}, f.Units)
	b.Sections = append(b.Sections, Section{ID: "baseline", Title: "Baseline and its accuracy",
		Intro: "The statistical forecast before any event, fitted to the history with the past events taken out, and the candidates it was chosen from.",
		Text:  &base})

	b.Sections = append(b.Sections, eventsSection(f, learntEvents(p.Future), p.Periods[0], d))

	pr := ForPlan(p, false, nil)
	pr.Charts = scenarioCharts(p)
	b.add("scenarios", "Scenarios", "Each scenario is the baseline plus its events; the risk-weighted plan weighs each event by its probability.", pr)
	b.Sections[len(b.Sections)-1].ChartPerHeading = true

	if h.Compare != nil {
		b.add("comparison", "Scenarios side by side", "The scenarios' key figures from the Monte Carlo, and how each event adds to each scenario's total.", captioned(Compare(h.Compare), compareCaption))
	}
	if h.Stress != nil {
		b.add("capacity", "Capacity risk", "Simulated demand against capacity, period by period: the chance of a breach and the expected shortfall.", captioned(Stress(h.Stress, h.Chart), stressCaption(p.Scenarios[h.Chart].Name)))
	}
	if h.Buffer != nil {
		b.add("prebuild", "Pre-build and safety stock", "", captioned(Buffer(h.Buffer), bufferCaption))
	}
	if h.Track != nil {
		b.add("tracking", "Tracking against new actuals", "", captioned(ForTrack(*h.Track), trackCaption))
	}
	return b
}

// planFacts are the facts of a plan of one series.
func planFacts(p *plan.Plan) [][2]string {
	f := p.File
	names := make([]string, len(p.Scenarios))
	for i, sp := range p.Scenarios {
		names[i] = sp.Name
	}
	return [][2]string{
		{"plan", f.Plan},
		{"series", p.History.Name},
		{"units", OrNone([]string{f.Units})},
		{"periods planned", fmt.Sprintf("%d %s periods, %s to %s", len(p.Periods), p.History.Freq(), p.Periods[0], p.Periods[len(p.Periods)-1])},
		{"history", fmt.Sprintf("%d periods, %s to %s", p.History.Len(), p.History.Start, p.History.Period(p.History.Len()-1))},
		{"scenarios", strings.Join(names, ", ")},
		{"bands", fmt.Sprintf("+- %.3g standard errors", p.Z)},
	}
}

// learntEvents maps the id of each event of list to the event.
func learntEvents(list []*scenario.Event) map[string]*scenario.Event {
	m := map[string]*scenario.Event{}
	for _, e := range list {
		m[e.ID] = e
	}
	return m
}

// eventsSection is the table of a file's events.
func eventsSection(f *scenario.File, learnt map[string]*scenario.Event, next forecast.Period, d int) Section {
	var t Text
	if len(f.Events) == 0 {
		fmt.Fprintln(&t, "The scenario file names no event: every scenario is the baseline.")
	} else {
		t.Add(eventsTable(f, learnt, next, d))
		fmt.Fprintln(&t, "Range: a 90% interval of the effect at full size. Probability: the chance the event happens at all.")
	}
	return Section{ID: "events", Title: "Events", Intro: "The events the scenarios are made of, as the scenario file gives them.", Text: &t}
}

// scenarioCharts draws the plan once per scenario: the history, the
// baseline and that scenario alone, with the windows of its events.
func scenarioCharts(p *plan.Plan) []Chart {
	var out []Chart
	for _, sp := range p.Scenarios {
		c := PlanChart(p)
		c.Title = "Scenario " + sp.Name
		c.Scenarios = nil
		if len(sp.Events) > 0 {
			c.Scenarios = append(c.Scenarios, planCurve(p, sp, c.ForecastStart))
		}
		c.Windows = keepWindows(c.Windows, eventIDList(sp.Events))
		caption := fmt.Sprintf("Scenario %s: the history, the baseline with its band and the adjusted plan with its band (%s).",
			sp.Name, evsText(eventIDList(sp.Events)))
		out = append(out, Chart{Name: "scenario-" + sp.Name, Plot: c, Caption: caption})
	}
	return out
}

// evsText names a scenario's events, or says it has none.
func evsText(ids []string) string {
	if len(ids) == 0 {
		return "no events: the baseline alone"
	}
	return "events " + strings.Join(ids, ", ")
}

// captioned sets the captions of r's charts that have none, by their
// names, and returns r.
func captioned(r *Report, caption func(name string) string) *Report {
	for i := range r.Charts {
		if r.Charts[i].Caption == "" {
			r.Charts[i].Caption = caption(r.Charts[i].Name)
		}
	}
	return r
}

func compareCaption(name string) string {
	if s, ok := strings.CutPrefix(name, "waterfall-"); ok {
		return "How the events of scenario " + s + " take the baseline's total to the scenario's total, one step per event."
	}
	return "Every scenario with events against the baseline, period by period (and the capacity above), with each one's change from the baseline below."
}

func stressCaption(scenario string) func(string) string {
	return func(name string) string {
		switch {
		case name == "fan":
			return "Scenario " + scenario + ": the spread of simulated demand per period (quantile bands) against capacity."
		case name == "stock":
			return "Scenario " + scenario + ": the projected stock under frozen production."
		case name == "total":
			return "Scenario " + scenario + ": the portfolio's simulated total per period."
		}
		res, _ := strings.CutPrefix(name, "resource-")
		return "Scenario " + scenario + ": the simulated load of resource " + res + " against its capacity."
	}
}

func bufferCaption(string) string {
	return "The stock to build ahead of the periods whose demand exceeds capacity, and the build per period."
}

func trackCaption(name string) string {
	if name == "signal" {
		return "The tracking signal per period against its alarm limits."
	}
	return "The errors of the plan against the new actuals, with the control limits."
}

// planCurve is a scenario's plan and band on a plan chart whose first
// plan period is at x = start.
func planCurve(p *plan.Plan, sp plan.ScenarioPlan, start int) plots.Curve {
	return plots.Curve{Name: sp.Name, Start: start, Values: sp.Adjusted, Lower: sp.Lower, Upper: sp.Upper}
}

// keepWindows returns the windows labelled with one of ids.
func keepWindows(ws []plots.Window, ids []string) []plots.Window {
	var out []plots.Window
	for _, w := range ws {
		if slices.Contains(ids, w.Label) {
			out = append(out, w)
		}
	}
	return out
}
