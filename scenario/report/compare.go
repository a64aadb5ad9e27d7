package report

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
	"math"
)

// The JSON shape of compare.json (and "forelay compare --json"). Field
// names are documented in the README; keep them stable.

type contributionJSON struct {
	Event string `json:"event"`
	Total Num    `json:"total"`
}

type compareScenarioJSON struct {
	Name              string             `json:"name"`
	Events            []string           `json:"events"`
	Total             Num                `json:"total"`
	BaselineTotal     Num                `json:"baseline_total"`
	Change            Num                `json:"change"`
	Peak              PeakDoc            `json:"peak"`
	P90Peak           PeakDoc            `json:"p90_peak"`
	BreachProbability Num                `json:"breach_probability"`
	Prebuild          Num                `json:"prebuild"`
	PrebuildBefore    *string            `json:"prebuild_before"`
	Contributions     []contributionJSON `json:"contributions"`
}

// CompareDoc is the document of compare.json.
type CompareDoc struct {
	Plan          string                `json:"plan"`
	Units         string                `json:"units,omitempty"`
	Paths         int                   `json:"paths"`
	Seed          uint64                `json:"seed"`
	Errors        string                `json:"errors"`
	Service       Num                   `json:"service"`
	BaselineTotal Num                   `json:"baseline_total"`
	Scenarios     []compareScenarioJSON `json:"scenarios"`
	Inputs        map[string]string     `json:"inputs"`
	Notes         []string              `json:"notes"`
	Warnings      []string              `json:"warnings"`
	Caution       string                `json:"caution"`
}

// Compare returns the report of a comparison of scenarios: the text,
// compare.json, compare.csv, the comparison chart and a waterfall chart
// for each scenario with events.
func Compare(r *supply.CompareRun) *Report {
	notes := SimNotes(r.Plan)
	rep := &Report{Name: "compare", Warnings: r.Plan.Warnings, Doc: compareDoc(r, notes), CSV: compareCSV(r),
		Charts: []Chart{{Name: "compare", Plot: compareChart(r)}}, MoreTables: planTables(r.Plan)}
	for _, c := range r.Rows {
		if len(c.Contributions) > 0 {
			rep.Charts = append(rep.Charts, Chart{Name: "waterfall-" + c.Name, Plot: waterfallChart(r, c)})
		}
	}
	writeCompareText(&rep.Text, r, notes)
	return rep
}

func compareDoc(r *supply.CompareRun, notes []string) CompareDoc {
	p, mc := r.Plan, r.Sim
	o := CompareDoc{Plan: p.File.Plan, Units: p.File.Units, Paths: mc.Paths, Seed: mc.Seed, Errors: mc.Errors.String(),
		Service: Num(r.Service), BaselineTotal: Num(plan.Total(p.Baseline)), Inputs: p.Digests,
		Notes: notes, Warnings: List(p.Warnings), Caution: Caution}
	for _, c := range r.Rows {
		cj := compareScenarioJSON{Name: c.Name, Events: eventIDList(c.Events), Total: Num(c.Total), BaselineTotal: Num(c.BaselineTotal),
			Change:            Num(c.Total - c.BaselineTotal),
			Peak:              PeakDoc{Period: p.Periods[c.Peak].String(), Value: Num(c.PeakValue)},
			P90Peak:           PeakDoc{Period: p.Periods[c.P90Peak].String(), Value: Num(c.P90PeakValue)},
			BreachProbability: Num(c.PAnyBreach), Prebuild: Num(c.Prebuild), PrebuildBefore: PeriodOrNull(p, c.PrebuildAt),
			Contributions: []contributionJSON{}}
		for _, k := range c.Contributions {
			cj.Contributions = append(cj.Contributions, contributionJSON{Event: k.ID, Total: Num(k.Total)})
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
func compareCSV(r *supply.CompareRun) *Table {
	p := r.Plan
	tb := &Table{Head: []string{"scenario", "total", "change", "peak_period", "peak", "p90_peak_period", "p90_peak",
		"breach_probability", "prebuild", "prebuild_before"}}
	for _, e := range p.Future {
		tb.Head = append(tb.Head, e.ID)
	}
	tb.Typed(kindsOf(compareKinds, []Kind{Share, Quantity, Label}, repeatKind(Quantity, len(p.Future)))...)
	for _, c := range r.Rows {
		before := ""
		if c.PrebuildAt >= 0 {
			before = p.Periods[c.PrebuildAt].String()
		}
		row := []string{c.Name, CSVNum(c.Total, 2), CSVNum(c.Total-c.BaselineTotal, 2), p.Periods[c.Peak].String(),
			CSVNum(c.PeakValue, 2), p.Periods[c.P90Peak].String(), CSVNum(c.P90PeakValue, 2), CSVNum(zeroIfNaN(c.PAnyBreach), 4),
			CSVNum(zeroIfNaN(c.Prebuild), 2), before}
		for _, e := range p.Future {
			row = append(row, contributionOf(c, e.ID, CSVNum, CSVNum(0, 2)))
		}
		tb.AddRow(row...)
	}
	return tb
}

// compareKinds are the kinds of compare.csv's first seven columns, from
// scenario to p90_peak.
var compareKinds = []Kind{Label, Quantity, Quantity, Label, Quantity, Label, Quantity}

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

// writeCompareText writes the text report of a comparison.
func writeCompareText(w *Text, r *supply.CompareRun, notes []string) {
	p := r.Plan
	f := p.File
	fmt.Fprintf(w, "Scenarios of plan %s: %s\n", f.Plan, planSpan(p))
	fmt.Fprintf(w, "Monte Carlo: %s\n", SimText(r.Sim))
	if f.Capacity != nil {
		fmt.Fprintf(w, "Capacity: %s; pre-build sized at the %s quantile of demand (%s)\n", CapacityText(p), PctText(r.Service), serviceDefinition)
	} else {
		fmt.Fprintln(w, "Capacity: none given (no breach probability or pre-build)")
	}
	fmt.Fprintln(w)
	w.Add(compareTable(r))
	if f.Capacity != nil {
		fmt.Fprintln(w, "(P(breach): chance that demand exceeds capacity in at least one period)")
	}
	if len(p.Future) > 0 {
		fmt.Fprintln(w)
		fmt.Fprintln(w, "Contributions to each scenario's total:")
		w.Add(contributionTable(r))
	}
	writeNotesAndCaution(w, notes)
}

// compareTable is the table of the scenarios side by side, the baseline
// first.
func compareTable(r *supply.CompareRun) *Table {
	p := r.Plan
	hasCap := p.File.Capacity != nil
	base := plan.Total(p.Baseline)
	head := []string{"scenario", "total", "vs baseline", "peak", "in", "P90 peak", "in"}
	if hasCap {
		head = append(head, "P(breach)", "pre-build", "before")
	}
	t := NewTable(head...).Left(4, 6, 9)
	t.AddRow(append([]string{"(baseline)", wholeNum(base), "", "", "", "", ""}, make([]string, len(head)-7)...)...)
	for _, c := range r.Rows {
		row := []string{c.Name, wholeNum(c.Total), Pct(c.Total-c.BaselineTotal, base), wholeNum(c.PeakValue),
			p.Periods[c.Peak].String(), wholeNum(c.P90PeakValue), p.Periods[c.P90Peak].String()}
		if hasCap {
			before := "-"
			if c.PrebuildAt >= 0 {
				before = p.Periods[c.PrebuildAt].String()
			}
			row = append(row, PctText(c.PAnyBreach), wholeNum(c.Prebuild), before)
		}
		t.AddRow(row...)
	}
	return t
}

// contributionTable is the table of each event's contribution to each
// scenario's total, "-" where the event is not in the scenario.
func contributionTable(r *supply.CompareRun) *Table {
	head := []string{"event"}
	for _, c := range r.Rows {
		head = append(head, c.Name)
	}
	t := NewTable(head...)
	for _, e := range r.Plan.Future {
		row := []string{e.ID}
		for _, c := range r.Rows {
			row = append(row, contributionOf(c, e.ID, func(v float64, _ int) string { return Signed(v, 0) }, "-"))
		}
		t.AddRow(row...)
	}
	return t
}
