package report

import (
	"fmt"

	"forelay/plots"
	"forelay/scenario/supply"
)

// The JSON shape of compare.json for a portfolio (kind "portfolio").
// Field names are documented in the README; keep them stable.

type resourceFiguresJSON struct {
	Resource          string  `json:"resource"`
	BreachProbability Num     `json:"breach_probability"`
	Prebuild          Num     `json:"prebuild"`
	PrebuildBefore    *string `json:"prebuild_before"`
}

type portfolioCompareScenarioJSON struct {
	Name          string                `json:"name"`
	Events        []string              `json:"events"`
	Total         Num                   `json:"total"`
	BaselineTotal Num                   `json:"baseline_total"`
	Change        Num                   `json:"change"`
	Peak          PeakDoc               `json:"peak"`
	P90Peak       PeakDoc               `json:"p90_peak"`
	Resources     []resourceFiguresJSON `json:"resources"`
	Contributions []contributionJSON    `json:"contributions"`
}

// PortfolioCompareDoc is the document of compare.json for a portfolio.
type PortfolioCompareDoc struct {
	Plan          string                         `json:"plan"`
	Kind          string                         `json:"kind"`
	Units         string                         `json:"units,omitempty"`
	Series        int                            `json:"series"`
	Paths         int                            `json:"paths"`
	Seed          uint64                         `json:"seed"`
	Errors        string                         `json:"errors"`
	Service       Num                            `json:"service"`
	BaselineTotal Num                            `json:"baseline_total"`
	Scenarios     []portfolioCompareScenarioJSON `json:"scenarios"`
	Inputs        map[string]string              `json:"inputs"`
	Notes         []string                       `json:"notes"`
	Warnings      []string                       `json:"warnings"`
	Caution       string                         `json:"caution"`
}

// PortfolioCompare returns the report of a comparison of a portfolio's
// scenarios: the text, compare.json, compare.csv (one row per scenario:
// the total's figures, each resource's breach probability and pre-build
// in columns named after it, and each event's contribution), the
// comparison chart of the total and a waterfall of each scenario with
// events.
func PortfolioCompare(r *supply.PortfolioCompareRun) *Report {
	pf := r.Portfolio
	notes := []string{"Totals are sums over every series; breach chances and pre-builds are each resource's, from its simulated load"}
	rep := &Report{Name: "compare", Warnings: pf.Warnings, Doc: portfolioCompareDoc(r, notes), CSV: portfolioCompareCSV(r),
		Charts: []Chart{{Name: "compare", Plot: portfolioCompareChart(r)}}, MoreTables: portfolioTables(pf)}
	for _, c := range r.Rows {
		if len(c.Contributions) > 0 {
			rep.Charts = append(rep.Charts, Chart{Name: "waterfall-" + c.Name, Plot: waterfallOf(pf.File.Plan, pf.File.Units, c)})
		}
	}
	writePortfolioCompareText(&rep.Text, r, notes)
	return rep
}

func portfolioCompareDoc(r *supply.PortfolioCompareRun, notes []string) PortfolioCompareDoc {
	pf, mc := r.Portfolio, r.Sim
	p0 := pf.Plans[0]
	o := PortfolioCompareDoc{Plan: pf.File.Plan, Kind: "portfolio", Units: pf.File.Units, Series: len(pf.Plans), Paths: mc.Paths,
		Seed: mc.Seed, Errors: portfolioErrors, Service: Num(r.Service), Inputs: p0.Digests, Notes: notes,
		Warnings: List(pf.Warnings), Caution: Caution}
	for k, c := range r.Rows {
		o.BaselineTotal = Num(c.BaselineTotal)
		cj := portfolioCompareScenarioJSON{Name: c.Name, Events: eventIDList(c.Events), Total: Num(c.Total),
			BaselineTotal: Num(c.BaselineTotal), Change: Num(c.Total - c.BaselineTotal),
			Peak:      PeakDoc{Period: p0.Periods[c.Peak].String(), Value: Num(c.PeakValue)},
			P90Peak:   PeakDoc{Period: p0.Periods[c.P90Peak].String(), Value: Num(c.P90PeakValue)},
			Resources: []resourceFiguresJSON{}, Contributions: []contributionJSON{}}
		for _, f := range r.Loads[k] {
			cj.Resources = append(cj.Resources, resourceFiguresJSON{Resource: f.ID, BreachProbability: Num(f.PAnyBreach),
				Prebuild: Num(f.Prebuild), PrebuildBefore: periodOrNull(p0.Periods, f.PrebuildAt)})
		}
		for _, ct := range c.Contributions {
			cj.Contributions = append(cj.Contributions, contributionJSON{Event: ct.ID, Total: Num(ct.Total)})
		}
		o.Scenarios = append(o.Scenarios, cj)
	}
	return o
}

// futureIDs returns the ids of the events that act on the plan in any
// scenario of the comparison, in file order.
func futureIDs(r *supply.PortfolioCompareRun) []string {
	seen := map[string]bool{}
	for _, c := range r.Rows {
		for _, e := range c.Events {
			seen[e.ID] = true
		}
	}
	var ids []string
	for _, e := range r.Portfolio.File.Events {
		if seen[e.ID] {
			ids = append(ids, e.ID)
		}
	}
	return ids
}

// portfolioCompareCSV renders compare.csv of a portfolio: one row per
// scenario; for each resource, <id>_breach_probability, <id>_prebuild
// and <id>_prebuild_before (0, 0 and empty without a capacity, as in a
// single series' compare.csv); then one column per event.
func portfolioCompareCSV(r *supply.PortfolioCompareRun) *Table {
	periods := r.Portfolio.Plans[0].Periods
	tb := (&Table{Head: []string{"scenario", "total", "change", "peak_period", "peak", "p90_peak_period", "p90_peak"}}).Typed(compareKinds...)
	for _, res := range r.Resources {
		tb.Head = append(tb.Head, res.ID+"_breach_probability", res.ID+"_prebuild", res.ID+"_prebuild_before")
		tb.Kinds = append(tb.Kinds, Share, Quantity, Label)
	}
	ids := futureIDs(r)
	tb.Head = append(tb.Head, ids...)
	tb.Kinds = append(tb.Kinds, repeatKind(Quantity, len(ids))...)
	for k, c := range r.Rows {
		row := []string{c.Name, CSVNum(c.Total, 2), CSVNum(c.Total-c.BaselineTotal, 2), periods[c.Peak].String(),
			CSVNum(c.PeakValue, 2), periods[c.P90Peak].String(), CSVNum(c.P90PeakValue, 2)}
		for _, f := range r.Loads[k] {
			before := ""
			if f.PrebuildAt >= 0 {
				before = periods[f.PrebuildAt].String()
			}
			row = append(row, CSVNum(zeroIfNaN(f.PAnyBreach), 4), CSVNum(zeroIfNaN(f.Prebuild), 2), before)
		}
		for _, id := range ids {
			row = append(row, contributionOf(c, id, CSVNum, CSVNum(0, 2)))
		}
		tb.AddRow(row...)
	}
	return tb
}

// writePortfolioCompareText writes the text report of a portfolio's
// comparison.
func writePortfolioCompareText(w *Text, r *supply.PortfolioCompareRun, notes []string) {
	pf := r.Portfolio
	p0 := pf.Plans[0]
	fmt.Fprintf(w, "Scenarios of plan %s: %s series, %d %s periods %s to %s%s\n", pf.File.Plan, countText(len(pf.Plans)),
		len(p0.Periods), p0.History.Freq(), p0.Periods[0], p0.Periods[len(p0.Periods)-1], InUnits(pf.File.Units))
	fmt.Fprintf(w, "Monte Carlo: %s paths, seed %d, errors drawn by whole historical periods; pre-builds at the %s quantile of each resource's load (%s)\n\n",
		countText(r.Sim.Paths), r.Sim.Seed, PctText(r.Service), serviceDefinition)
	if len(r.Rows) == 0 {
		return
	}
	base := r.Rows[0].BaselineTotal
	t := NewTable("scenario", "total", "vs baseline", "peak", "in", "P90 peak", "in").Left(4, 6)
	t.AddRow("(baseline)", wholeNum(base), "", "", "", "", "")
	for _, c := range r.Rows {
		t.AddRow(c.Name, wholeNum(c.Total), Pct(c.Total-c.BaselineTotal, base), wholeNum(c.PeakValue),
			p0.Periods[c.Peak].String(), wholeNum(c.P90PeakValue), p0.Periods[c.P90Peak].String())
	}
	w.Add(t)
	if len(r.Resources) > 0 {
		fmt.Fprintln(w, "\nResources (P(breach): chance that the load exceeds capacity in at least one period; pre-build in the resource's units):")
		rt := NewTable("scenario", "resource", "P(breach)", "pre-build", "before").Left(1, 4)
		for k, c := range r.Rows {
			for _, f := range r.Loads[k] {
				before := "-"
				if f.PrebuildAt >= 0 {
					before = p0.Periods[f.PrebuildAt].String()
				}
				rt.AddRow(c.Name, f.ID, PctText(f.PAnyBreach), wholeNum(f.Prebuild), before)
			}
		}
		w.Add(rt)
	}
	if ids := futureIDs(r); len(ids) > 0 {
		fmt.Fprintln(w, "\nContributions to each scenario's total (summed over the series each event moves):")
		head := []string{"event"}
		for _, c := range r.Rows {
			head = append(head, c.Name)
		}
		ct := NewTable(head...)
		for _, id := range ids {
			row := []string{id}
			for _, c := range r.Rows {
				row = append(row, contributionOf(c, id, func(v float64, _ int) string { return Signed(v, 0) }, "-"))
			}
			ct.AddRow(row...)
		}
		w.Add(ct)
	}
	writeNotesAndCaution(w, notes)
}

// portfolioCompareChart sets the scenarios' totals side by side: the
// summed baseline and each scenario with events above, each one's change
// from the baseline below.
func portfolioCompareChart(r *supply.PortfolioCompareRun) plots.ComparisonChart {
	pf := r.Portfolio
	p0 := pf.Plans[0]
	c := plots.ComparisonChart{
		Title:       "Scenarios of plan " + pf.File.Plan + ": total",
		Units:       UnitsLabel(pf.File.Units, p0.History.Freq().String()),
		ChangeUnits: "change from baseline",
		Labels:      PeriodLabels(p0),
		Baseline:    r.Baseline,
	}
	for k, row := range r.Rows {
		if len(row.Events) == 0 {
			continue
		}
		c.Scenarios = append(c.Scenarios, plots.Curve{Name: row.Name, Values: r.Adjusted[k]})
	}
	return c
}
