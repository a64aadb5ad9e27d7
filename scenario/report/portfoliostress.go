package report

import (
	"fmt"

	"forelay/forecast"
	"forelay/plots"
	"forelay/scenario/sim"
	"forelay/scenario/supply"
)

// The JSON shape of stress.json for a portfolio (kind "portfolio"). Field
// names are documented in the README; keep them stable.

type portfolioStressSumJSON struct {
	Resource               string             `json:"resource"`
	Units                  string             `json:"units,omitempty"`
	PerUnit                Num                `json:"per_unit,omitempty"`
	Series                 int                `json:"series"`
	Periods                []stressPeriodJSON `json:"periods"`
	FirstBreach            *string            `json:"first_breach"`
	TotalExpectedShortfall Num                `json:"total_expected_shortfall"`
	PAnyBreach             Num                `json:"p_any_breach"`
	Frozen                 *frozenJSON        `json:"frozen,omitempty"`
}

type portfolioStressScenarioJSON struct {
	Name      string                   `json:"name"`
	Events    []string                 `json:"events"`
	Total     portfolioStressSumJSON   `json:"total"`
	Resources []portfolioStressSumJSON `json:"resources"`
}

// PortfolioStressDoc is the document of stress.json for a portfolio.
type PortfolioStressDoc struct {
	Plan            string                        `json:"plan"`
	Kind            string                        `json:"kind"`
	Units           string                        `json:"units,omitempty"`
	Series          int                           `json:"series"`
	Paths           int                           `json:"paths"`
	Seed            uint64                        `json:"seed"`
	Errors          string                        `json:"errors"`
	ErrorWindow     int                           `json:"error_window"`
	Quantiles       string                        `json:"quantiles"`
	BreachThreshold Num                           `json:"breach_threshold"`
	Inputs          map[string]string             `json:"inputs"`
	Scenarios       []portfolioStressScenarioJSON `json:"scenarios"`
	Notes           []string                      `json:"notes"`
	Warnings        []string                      `json:"warnings"`
	Caution         string                        `json:"caution"`
}

// portfolioErrors is the error model of a portfolio's Monte Carlo, as
// stress.json names it.
const portfolioErrors = "bootstrap of whole periods"

// PortfolioStress returns the report of a portfolio's stress run: the
// text (per scenario, the simulated total and each resource's load
// against its capacity, with frozen production when the file freezes
// it), stress.json, stress.csv (a resource column: "total" for the
// total's rows, then one row per resource and period) and the charts:
// the total and each resource's load against its capacity, the median of
// every scenario with the P5 to P95 band of scenario chart (an index into
// the scenarios). It panics if chart is out of range.
func PortfolioStress(r *supply.PortfolioStressRun, chart int) *Report {
	notes := portfolioStressNotes(r.Sim.Window, r.Sim.Fitted)
	rep := &Report{Name: "stress", Warnings: r.Warnings, Doc: portfolioStressDoc(r, notes), CSV: portfolioStressCSV(r),
		MoreTables: portfolioTables(r.Portfolio)}
	rep.Charts = append(rep.Charts, Chart{Name: "total", Plot: stressLoadChart(r, chart, -1)})
	for j, res := range r.Resources {
		rep.Charts = append(rep.Charts, Chart{Name: "resource-" + fileName(res.ID), Plot: stressLoadChart(r, chart, j)})
	}
	writePortfolioStressText(&rep.Text, r, notes)
	return rep
}

// stressLoadChart draws the simulated total (j < 0) or resource j's load:
// the median of each scenario, the P5 to P95 band of scenario chart, and
// the resource's capacity.
// portfolioStressNotes are the notes of a portfolio's stress run whose
// errors are drawn over window periods for fitted series.
func portfolioStressNotes(window, fitted int) []string {
	return []string{fmt.Sprintf("Errors drawn by whole historical periods (up to %d back, for the %s series with a baseline; a series with fewer resamples its own), so the sums keep the series' correlation; each event is drawn once per path for every series it moves",
		window, countText(fitted))}
}

func stressLoadChart(r *supply.PortfolioStressRun, chart, j int) plots.LoadChart {
	pf := r.Portfolio
	p0 := pf.Plans[0]
	c := plots.LoadChart{Labels: PeriodLabels(p0), Highlight: chart}
	risks := r.Total
	if j < 0 {
		c.Title = fmt.Sprintf("Stress %s: total demand", pf.File.Plan)
		c.Units = UnitsLabel(pf.File.Units, p0.History.Freq().String())
	} else {
		res := r.Resources[j]
		c.Title = fmt.Sprintf("Stress %s: %s against its capacity", pf.File.Plan, res.ID)
		c.Units = UnitsLabel(res.Units, p0.History.Freq().String())
		c.Capacity = res.Capacity
		risks = make([]supply.Risk, len(r.Risks))
		for k := range r.Risks {
			risks[k] = r.Risks[k][j]
		}
	}
	for k, rk := range risks {
		cv := plots.Curve{Name: p0.Scenarios[k].Name + ", median", Values: make([]float64, len(rk.Periods))}
		for t, pr := range rk.Periods {
			cv.Values[t] = pr.P50
		}
		if k == chart {
			cv.Name = p0.Scenarios[k].Name + ", median and P5 to P95"
			cv.Lower, cv.Upper = make([]float64, len(rk.Periods)), make([]float64, len(rk.Periods))
			for t, pr := range rk.Periods {
				cv.Lower[t], cv.Upper[t] = pr.P5, pr.P95
			}
		}
		c.Scenarios = append(c.Scenarios, cv)
	}
	return c
}

// stressPeriods returns the JSON of each period of a capacity risk.
func stressPeriods(periods []forecast.Period, rk supply.Risk) []stressPeriodJSON {
	var out []stressPeriodJSON
	for t, pr := range rk.Periods {
		out = append(out, stressPeriodJSON{Period: periods[t].String(), Mean: Num(pr.Mean),
			P5: Num(pr.P5), P10: Num(pr.P10), P50: Num(pr.P50), P90: Num(pr.P90), P95: Num(pr.P95),
			Capacity: Num(pr.Capacity), PBreach: Num(pr.PBreach), ExpectedShortfall: Num(pr.ExpectedShortfall),
			ShortfallIfBreach: Num(pr.ShortfallIfBreach), UtilP50: Num(pr.UtilP50), UtilP90: Num(pr.UtilP90)})
	}
	return out
}

func portfolioStressDoc(r *supply.PortfolioStressRun, notes []string) PortfolioStressDoc {
	pf, mc := r.Portfolio, r.Sim
	p0 := pf.Plans[0]
	o := PortfolioStressDoc{Plan: pf.File.Plan, Kind: "portfolio", Units: pf.File.Units, Series: len(pf.Plans), Paths: mc.Paths,
		Seed: mc.Seed, Errors: portfolioErrors, ErrorWindow: mc.Window, Quantiles: quantileDefinition,
		BreachThreshold: Num(r.Settings.Breach), Inputs: p0.Digests, Notes: notes, Warnings: List(r.Warnings), Caution: Caution}
	for k, tot := range r.Total {
		sj := portfolioStressScenarioJSON{Name: tot.Name, Events: eventIDList(pf.File.Cases()[k].Events),
			Total: portfolioStressSumJSON{Resource: sim.TotalSum, Units: pf.File.Units, Series: len(pf.Plans),
				Periods: stressPeriods(p0.Periods, tot), FirstBreach: periodOrNull(p0.Periods, tot.FirstBreach),
				TotalExpectedShortfall: Num(tot.TotalExpectedShortfall), PAnyBreach: Num(tot.PAnyBreach)},
			Resources: []portfolioStressSumJSON{}}
		for j, res := range r.Resources {
			rk := r.Risks[k][j]
			rj := portfolioStressSumJSON{Resource: res.ID, Units: res.Units, PerUnit: Num(res.PerUnit), Series: len(res.Series),
				Periods: stressPeriods(p0.Periods, rk), FirstBreach: periodOrNull(p0.Periods, rk.FirstBreach),
				TotalExpectedShortfall: Num(rk.TotalExpectedShortfall), PAnyBreach: Num(rk.PAnyBreach)}
			if r.Frozen != nil {
				rj.Frozen = frozenDoc(p0.Periods, r.Frozen[k][j], baselineLoad)
			}
			sj.Resources = append(sj.Resources, rj)
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}

// portfolioStressCSV renders stress.csv of a portfolio: one row per
// scenario, resource (the total first) and period, with the columns of a
// single series' stress.csv after the resource.
func portfolioStressCSV(r *supply.PortfolioStressRun) *Table {
	tb := (&Table{Head: []string{"scenario", "resource", "period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach",
		"expected_shortfall", "shortfall_if_breach", "util_p50", "util_p90"}}).Typed(kindsOf([]Kind{Label, Label, Label}, riskKinds)...)
	if r.Frozen != nil {
		tb.Head = append(tb.Head, "production", "stock", "stock_at_p50_demand", "stock_at_p90_demand", "p_short", "idle", "overload")
		tb.Kinds = append(tb.Kinds, frozenKinds...)
	}
	periods := r.Portfolio.Plans[0].Periods
	for k, tot := range r.Total {
		rows := func(name string, rk supply.Risk, fz *supply.StockProjection) {
			for t, pr := range rk.Periods {
				row := append([]string{tot.Name, name, periods[t].String()}, stressCells(pr)...)
				switch {
				case fz != nil:
					row = append(row, frozenCells(fz, t)...)
				case r.Frozen != nil:
					row = append(row, "", "", "", "", "", "", "")
				}
				tb.AddRow(row...)
			}
		}
		rows(sim.TotalSum, tot, nil)
		for j, res := range r.Resources {
			var fz *supply.StockProjection
			if r.Frozen != nil {
				fz = &r.Frozen[k][j]
			}
			rows(res.ID, r.Risks[k][j], fz)
		}
	}
	return tb
}

// writePortfolioStressText writes the text report of a portfolio's
// stress run.
func writePortfolioStressText(w *Text, r *supply.PortfolioStressRun, notes []string) {
	pf, mc := r.Portfolio, r.Sim
	p0 := pf.Plans[0]
	fmt.Fprintf(w, "Stress test %s: %s series, %d %s periods %s to %s%s\n", pf.File.Plan, countText(len(pf.Plans)),
		len(p0.Periods), p0.History.Freq(), p0.Periods[0], p0.Periods[len(p0.Periods)-1], InUnits(pf.File.Units))
	fmt.Fprintf(w, "Monte Carlo: %s paths, seed %d, errors drawn by whole historical periods (up to %d back); quantiles by Hyndman-Fan type 7\n",
		countText(mc.Paths), mc.Seed, mc.Window)
	if len(r.Resources) == 0 {
		fmt.Fprintln(w, "Resources: none given (add resources or a capacity block to the scenario file to see breaches)")
	} else {
		fmt.Fprintf(w, "Breach threshold %s\n", PctText(r.Settings.Breach))
	}
	for k, tot := range r.Total {
		writeScenarioHeading(w, tot.Name, eventIDList(pf.File.Cases()[k].Events))
		fmt.Fprintf(w, "Total demand%s:\n", InUnits(pf.File.Units))
		t := NewTable("period", "mean", "P5", "P10", "P50", "P90", "P95")
		for i, pr := range tot.Periods {
			t.AddRow(p0.Periods[i].String(), wholeNum(pr.Mean), wholeNum(pr.P5), wholeNum(pr.P10),
				wholeNum(pr.P50), wholeNum(pr.P90), wholeNum(pr.P95))
		}
		w.Add(t)
		for j, res := range r.Resources {
			writeResourceStress(w, r, k, j)
			if r.Frozen != nil {
				writeFrozenText(w, p0.Periods, res.Units, r.Frozen[k][j], baselineLoad)
			}
		}
	}
	writeNotesAndCaution(w, notes)
}

// writeResourceStress writes resource j's simulated load in scenario k
// against its capacity.
func writeResourceStress(w *Text, r *supply.PortfolioStressRun, k, j int) {
	res, rk := r.Resources[j], r.Risks[k][j]
	periods := r.Portfolio.Plans[0].Periods
	fmt.Fprintf(w, "\nResource %s%s: %g per unit of demand of %s series\n", res.ID, InUnits(res.Units), res.PerUnit,
		countText(len(res.Series)))
	hasCap := res.Capacity != nil
	head := []string{"period", "mean", "P10", "P50", "P90"}
	if hasCap {
		head = append(head, "capacity", "P(breach)", "exp. shortfall", "use P50", "use P90")
	}
	t := NewTable(head...)
	for i, pr := range rk.Periods {
		row := []string{periods[i].String(), wholeNum(pr.Mean), wholeNum(pr.P10), wholeNum(pr.P50), wholeNum(pr.P90)}
		if hasCap {
			row = append(row, wholeNum(pr.Capacity), PctText(pr.PBreach), wholeNum(pr.ExpectedShortfall),
				PctText(pr.UtilP50), PctText(pr.UtilP90))
		}
		t.AddRow(row...)
	}
	w.Add(t)
	if !hasCap {
		fmt.Fprintln(w, "No capacity given: load only")
		return
	}
	breach := PctText(r.Settings.Breach)
	if rk.FirstBreach >= 0 {
		fmt.Fprintf(w, "First period with P(breach) above %s: %s (%s)\n", breach,
			periods[rk.FirstBreach], PctText(rk.Periods[rk.FirstBreach].PBreach))
	} else {
		fmt.Fprintf(w, "No period has P(breach) above %s\n", breach)
	}
	fmt.Fprintf(w, "Expected shortfall over the plan: %s%s; P(load above capacity in at least one period): %s\n",
		wholeNum(rk.TotalExpectedShortfall), unitsSuffix(res.Units), PctText(rk.PAnyBreach))
}

// countText formats a count with thousands separators.
func countText(n int) string { return forecast.FormatNumber(float64(n), 0) }
