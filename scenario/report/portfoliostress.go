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
	return StressSummaryReport(stressSummary(r), chart)
}

// StressSummaryReport returns the report of a portfolio's stress run
// from its summary, as PortfolioStress documents it.
func StressSummaryReport(m *StressSummary, chart int) *Report {
	notes := portfolioStressNotes(m.Window, m.Fitted)
	rep := &Report{Name: "stress", Warnings: m.Warnings, Doc: portfolioStressDoc(m, notes), CSV: portfolioStressCSV(m),
		MoreTables: m.MoreTables}
	rep.Charts = append(rep.Charts, Chart{Name: "total", Plot: stressLoadChart(m, chart, -1)})
	for j, res := range m.Resources {
		rep.Charts = append(rep.Charts, Chart{Name: "resource-" + fileName(res.ID), Plot: stressLoadChart(m, chart, j)})
	}
	writePortfolioStressText(&rep.Text, m, notes)
	return rep
}

// portfolioStressNotes are the notes of a portfolio's stress run whose
// errors are drawn over window periods for fitted series.
func portfolioStressNotes(window, fitted int) []string {
	return []string{fmt.Sprintf("Errors drawn by whole historical periods (up to %d back, for the %s series with a baseline; a series with fewer resamples its own), so the sums keep the series' correlation; each event is drawn once per path for every series it moves",
		window, countText(fitted))}
}

// stressLoadChart draws the simulated total (j < 0) or resource j's load:
// the median of each scenario, the P5 to P95 band of scenario chart, and
// the resource's capacity.
func stressLoadChart(m *StressSummary, chart, j int) plots.LoadChart {
	labels := make([]string, len(m.Periods))
	for t, per := range m.Periods {
		labels[t] = per.String()
	}
	c := plots.LoadChart{Labels: labels, Highlight: chart}
	risks := m.Total
	if j < 0 {
		c.Title = fmt.Sprintf("Stress %s: total demand", m.Plan)
		c.Units = UnitsLabel(m.Units, m.freq())
	} else {
		res := m.Resources[j]
		c.Title = fmt.Sprintf("Stress %s: %s against its capacity", m.Plan, res.ID)
		c.Units = UnitsLabel(res.Units, m.freq())
		c.Capacity = res.Capacity
		risks = make([]supply.Risk, len(m.Risks))
		for k := range m.Risks {
			risks[k] = m.Risks[k][j]
		}
	}
	for k, rk := range risks {
		cv := plots.Curve{Name: m.Scenarios[k] + ", median", Values: make([]float64, len(rk.Periods))}
		for t, pr := range rk.Periods {
			cv.Values[t] = pr.P50
		}
		if k == chart {
			cv.Name = m.Scenarios[k] + ", median and P5 to P95"
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

func portfolioStressDoc(m *StressSummary, notes []string) PortfolioStressDoc {
	o := PortfolioStressDoc{Plan: m.Plan, Kind: "portfolio", Units: m.Units, Series: m.Series, Paths: m.Paths,
		Seed: m.Seed, Errors: portfolioErrors, ErrorWindow: m.Window, Quantiles: quantileDefinition,
		BreachThreshold: Num(m.Breach), Inputs: m.Inputs, Notes: notes, Warnings: List(m.Warnings), Caution: Caution}
	for k, tot := range m.Total {
		sj := portfolioStressScenarioJSON{Name: m.Scenarios[k], Events: List(m.CaseEvents[k]),
			Total: portfolioStressSumJSON{Resource: sim.TotalSum, Units: m.Units, Series: m.Series,
				Periods: stressPeriods(m.Periods, tot), FirstBreach: periodOrNull(m.Periods, tot.FirstBreach),
				TotalExpectedShortfall: Num(tot.TotalExpectedShortfall), PAnyBreach: Num(tot.PAnyBreach)},
			Resources: []portfolioStressSumJSON{}}
		for j, res := range m.Resources {
			rk := m.Risks[k][j]
			rj := portfolioStressSumJSON{Resource: res.ID, Units: res.Units, PerUnit: Num(res.PerUnit), Series: res.Series,
				Periods: stressPeriods(m.Periods, rk), FirstBreach: periodOrNull(m.Periods, rk.FirstBreach),
				TotalExpectedShortfall: Num(rk.TotalExpectedShortfall), PAnyBreach: Num(rk.PAnyBreach)}
			if m.Frozen != nil {
				rj.Frozen = frozenDoc(m.Periods, m.Frozen[k][j], baselineLoad)
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
func portfolioStressCSV(m *StressSummary) *Table {
	tb := (&Table{Head: []string{"scenario", "resource", "period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach",
		"expected_shortfall", "shortfall_if_breach", "util_p50", "util_p90"}}).Typed(kindsOf([]Kind{Label, Label, Label}, riskKinds)...)
	if m.Frozen != nil {
		tb.Head = append(tb.Head, "production", "stock", "stock_at_p50_demand", "stock_at_p90_demand", "p_short", "idle", "overload")
		tb.Kinds = append(tb.Kinds, frozenKinds...)
	}
	for k := range m.Total {
		rows := func(name string, rk supply.Risk, fz *supply.StockProjection) {
			for t, pr := range rk.Periods {
				row := append([]string{m.Scenarios[k], name, m.Periods[t].String()}, stressCells(pr)...)
				switch {
				case fz != nil:
					row = append(row, frozenCells(fz, t)...)
				case m.Frozen != nil:
					row = append(row, "", "", "", "", "", "", "")
				}
				tb.AddRow(row...)
			}
		}
		rows(sim.TotalSum, m.Total[k], nil)
		for j, res := range m.Resources {
			var fz *supply.StockProjection
			if m.Frozen != nil {
				fz = &m.Frozen[k][j]
			}
			rows(res.ID, m.Risks[k][j], fz)
		}
	}
	return tb
}

// writePortfolioStressText writes the text report of a portfolio's
// stress run.
func writePortfolioStressText(w *Text, m *StressSummary, notes []string) {
	last := len(m.Periods) - 1
	fmt.Fprintf(w, "Stress test %s: %s series, %d %s periods %s to %s%s\n", m.Plan, countText(m.Series),
		len(m.Periods), m.Periods[0].Freq, m.Periods[0], m.Periods[last], InUnits(m.Units))
	fmt.Fprintf(w, "Monte Carlo: %s paths, seed %d, errors drawn by whole historical periods (up to %d back); quantiles by Hyndman-Fan type 7\n",
		countText(m.Paths), m.Seed, m.Window)
	if len(m.Resources) == 0 {
		fmt.Fprintln(w, "Resources: none given (add resources or a capacity block to the scenario file to see breaches)")
	} else {
		fmt.Fprintf(w, "Breach threshold %s\n", PctText(m.Breach))
	}
	for k, tot := range m.Total {
		writeScenarioHeading(w, m.Scenarios[k], m.CaseEvents[k])
		fmt.Fprintf(w, "Total demand%s:\n", InUnits(m.Units))
		t := NewTable("period", "mean", "P5", "P10", "P50", "P90", "P95")
		for i, pr := range tot.Periods {
			t.AddRow(m.Periods[i].String(), wholeNum(pr.Mean), wholeNum(pr.P5), wholeNum(pr.P10),
				wholeNum(pr.P50), wholeNum(pr.P90), wholeNum(pr.P95))
		}
		w.Add(t)
		for j, res := range m.Resources {
			writeResourceStress(w, m, k, j)
			if m.Frozen != nil {
				writeFrozenText(w, m.Periods, res.Units, m.Frozen[k][j], baselineLoad)
			}
		}
	}
	writeNotesAndCaution(w, notes)
}

// writeResourceStress writes resource j's simulated load in scenario k
// against its capacity.
func writeResourceStress(w *Text, m *StressSummary, k, j int) {
	res, rk := m.Resources[j], m.Risks[k][j]
	fmt.Fprintf(w, "\nResource %s%s: %g per unit of demand of %s series\n", res.ID, InUnits(res.Units), res.PerUnit,
		countText(res.Series))
	hasCap := res.Capacity != nil
	head := []string{"period", "mean", "P10", "P50", "P90"}
	if hasCap {
		head = append(head, "capacity", "P(breach)", "exp. shortfall", "use P50", "use P90")
	}
	t := NewTable(head...)
	for i, pr := range rk.Periods {
		row := []string{m.Periods[i].String(), wholeNum(pr.Mean), wholeNum(pr.P10), wholeNum(pr.P50), wholeNum(pr.P90)}
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
	breach := PctText(m.Breach)
	if rk.FirstBreach >= 0 {
		fmt.Fprintf(w, "First period with P(breach) above %s: %s (%s)\n", breach,
			m.Periods[rk.FirstBreach], PctText(rk.Periods[rk.FirstBreach].PBreach))
	} else {
		fmt.Fprintf(w, "No period has P(breach) above %s\n", breach)
	}
	fmt.Fprintf(w, "Expected shortfall over the plan: %s%s; P(load above capacity in at least one period): %s\n",
		wholeNum(rk.TotalExpectedShortfall), unitsSuffix(res.Units), PctText(rk.PAnyBreach))
}

// countText formats a count with thousands separators.
func countText(n int) string { return forecast.FormatNumber(float64(n), 0) }
