package main

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/supply"
	"io"
	"math"
	"strings"

	"forelay/plots"
)

// The JSON shape of compare.json (and "forelay compare --json"). Field
// names are documented in the README; keep them stable.

type contributionJSON struct {
	Event string `json:"event"`
	Total num    `json:"total"`
}

type compareScenarioJSON struct {
	Name              string             `json:"name"`
	Events            []string           `json:"events"`
	Total             num                `json:"total"`
	BaselineTotal     num                `json:"baseline_total"`
	Change            num                `json:"change"`
	Peak              report.PeakDoc     `json:"peak"`
	P90Peak           report.PeakDoc     `json:"p90_peak"`
	BreachProbability num                `json:"breach_probability"`
	Prebuild          num                `json:"prebuild"`
	PrebuildBefore    *string            `json:"prebuild_before"`
	Contributions     []contributionJSON `json:"contributions"`
}

type compareOutJSON struct {
	Plan          string                `json:"plan"`
	Units         string                `json:"units,omitempty"`
	Paths         int                   `json:"paths"`
	Seed          uint64                `json:"seed"`
	Errors        string                `json:"errors"`
	Service       num                   `json:"service"`
	BaselineTotal num                   `json:"baseline_total"`
	Scenarios     []compareScenarioJSON `json:"scenarios"`
	Inputs        map[string]string     `json:"inputs"`
	Notes         []string              `json:"notes"`
	Warnings      []string              `json:"warnings"`
	Caution       string                `json:"caution"`
}

func compareJSON(r *compareResult) compareOutJSON {
	p, mc := r.Plan, r.Sim
	o := compareOutJSON{Plan: p.File.Plan, Units: p.File.Units, Paths: mc.Paths, Seed: mc.Seed, Errors: mc.Errors.String(),
		Service: num(r.Opts.Service), BaselineTotal: num(plan.Total(p.Baseline)), Inputs: p.Digests,
		Notes: r.Notes, Warnings: warningList(r.Plan.Warnings), Caution: report.Caution}
	for _, c := range r.Rows {
		cj := compareScenarioJSON{Name: c.Name, Events: eventIDs(c.Events), Total: num(c.Total), BaselineTotal: num(c.BaselineTotal),
			Change:            num(c.Total - c.BaselineTotal),
			Peak:              report.PeakDoc{Period: p.Periods[c.Peak].String(), Value: num(c.PeakValue)},
			P90Peak:           report.PeakDoc{Period: p.Periods[c.P90Peak].String(), Value: num(c.P90PeakValue)},
			BreachProbability: num(c.PAnyBreach), Prebuild: num(c.Prebuild), PrebuildBefore: report.PeriodOrNull(p, c.PrebuildAt),
			Contributions: []contributionJSON{}}
		for _, k := range c.Contributions {
			cj.Contributions = append(cj.Contributions, contributionJSON{Event: k.ID, Total: num(k.Total)})
		}
		o.Scenarios = append(o.Scenarios, cj)
	}
	return o
}

// compareCSV renders compare.csv: one row per scenario, then one column
// per future event holding its contribution to the total. Every number
// cell holds a number, as in plan.csv: an event not in the scenario
// contributes 0, and without a capacity nothing can be breached or needs
// building ahead, so breach_probability and prebuild are 0. Only
// prebuild_before, a period, is empty when there is none.
func compareCSV(r *compareResult) *report.Table {
	p := r.Plan
	head := []string{"scenario", "total", "change", "peak_period", "peak", "p90_peak_period", "p90_peak",
		"breach_probability", "prebuild", "prebuild_before"}
	for _, e := range p.Future {
		head = append(head, e.ID)
	}
	rows := [][]string{head}
	for _, c := range r.Rows {
		before := ""
		if c.PrebuildAt >= 0 {
			before = p.Periods[c.PrebuildAt].String()
		}
		row := []string{c.Name, report.CSVNum(c.Total, 2), report.CSVNum(c.Total-c.BaselineTotal, 2), p.Periods[c.Peak].String(),
			report.CSVNum(c.PeakValue, 2), p.Periods[c.P90Peak].String(), report.CSVNum(c.P90PeakValue, 2), report.CSVNum(zeroIfNaN(c.PAnyBreach), 4),
			report.CSVNum(zeroIfNaN(c.Prebuild), 2), before}
		for _, e := range p.Future {
			row = append(row, contributionOf(c, e.ID, report.CSVNum, report.CSVNum(0, 2)))
		}
		rows = append(rows, row)
	}
	return csvTable(rows)
}

// zeroIfNaN returns v, or 0 when v is NaN.
func zeroIfNaN(v float64) float64 {
	if math.IsNaN(v) {
		return 0
	}
	return v
}

// contributionOf formats event id's contribution to c with format, or
// returns missing when the event is not in the scenario.
func contributionOf(c supply.Comparison, id string, format func(float64, int) string, missing string) string {
	for _, k := range c.Contributions {
		if k.ID == id {
			return format(k.Total, 2)
		}
	}
	return missing
}

// writeCompareText writes the human comparison.
func writeCompareText(w io.Writer, r *compareResult) {
	p := r.Plan
	f := p.File
	fmt.Fprintf(w, "Scenarios of plan %s: series %s, %d %s periods %s to %s%s\n", f.Plan, p.History.Name, len(p.Periods),
		p.History.Freq(), p.Periods[0], p.Periods[len(p.Periods)-1], report.InUnits(f.Units))
	fmt.Fprintf(w, "Monte Carlo: %s\n", report.SimText(r.Sim))
	hasCap := f.Capacity != nil
	if hasCap {
		fmt.Fprintf(w, "Capacity: %s; pre-build sized at the %s quantile of demand (%s)\n", report.CapacityText(p), report.PctText(r.Opts.Service), serviceDefinition)
	} else {
		fmt.Fprintln(w, "Capacity: none given (no breach probability or pre-build)")
	}
	fmt.Fprintln(w)
	base := plan.Total(p.Baseline)
	head := []string{"scenario", "total", "vs baseline", "peak", "in", "P90 peak", "in"}
	if hasCap {
		head = append(head, "P(breach)", "pre-build", "before")
	}
	t := newTable(head...).Left(4, 6, 9)
	t.AddRow(append([]string{"(baseline)", fmtNum(base, 0), "", "", "", "", ""}, make([]string, len(head)-7)...)...)
	for _, c := range r.Rows {
		row := []string{c.Name, fmtNum(c.Total, 0), report.Pct(c.Total-c.BaselineTotal, base), fmtNum(c.PeakValue, 0),
			p.Periods[c.Peak].String(), fmtNum(c.P90PeakValue, 0), p.Periods[c.P90Peak].String()}
		if hasCap {
			before := "-"
			if c.PrebuildAt >= 0 {
				before = p.Periods[c.PrebuildAt].String()
			}
			row = append(row, report.PctText(c.PAnyBreach), fmtNum(c.Prebuild, 0), before)
		}
		t.AddRow(row...)
	}
	writeTable(w, t)
	if hasCap {
		fmt.Fprintln(w, "(P(breach): chance that demand exceeds capacity in at least one period)")
	}
	if len(p.Future) > 0 {
		fmt.Fprintln(w)
		fmt.Fprintln(w, "Contributions to each scenario's total:")
		ch := []string{"event"}
		for _, c := range r.Rows {
			ch = append(ch, c.Name)
		}
		ct := newTable(ch...)
		for _, e := range p.Future {
			row := []string{e.ID}
			for _, c := range r.Rows {
				row = append(row, contributionOf(c, e.ID, func(v float64, _ int) string { return report.Signed(v, 0) }, "-"))
			}
			ct.AddRow(row...)
		}
		writeTable(w, ct)
	}
	if len(r.Notes) > 0 {
		fmt.Fprintln(w)
		for _, n := range r.Notes {
			fmt.Fprintf(w, "Note: %s.\n", strings.TrimSuffix(n, "."))
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, report.Caution)
}

// waterfallChart walks from the baseline total through each event's
// contribution to scenario c's total.
func waterfallChart(r *compareResult, c supply.Comparison) plots.Waterfall {
	p := r.Plan
	wf := plots.Waterfall{
		Title:      "Plan " + p.File.Plan + ": " + c.Name,
		StartLabel: "Baseline",
		Start:      c.BaselineTotal,
		EndLabel:   c.Name,
	}
	wf.Units = "units over the plan"
	if p.File.Units != "" {
		wf.Units = p.File.Units + " over the plan"
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
func compareChart(r *compareResult) plots.ComparisonChart {
	p := r.Plan
	labels := make([]string, len(p.Periods))
	for t, per := range p.Periods {
		labels[t] = per.String()
	}
	c := plots.ComparisonChart{
		Title:       "Scenarios of plan " + p.File.Plan + ": " + p.History.Name,
		Units:       report.UnitsLabel(p.File.Units, p.History.Freq().String()),
		ChangeUnits: "change from baseline",
		Labels:      labels,
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
