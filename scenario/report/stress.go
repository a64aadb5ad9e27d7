package report

import (
	"fmt"
	"forelay/scenario/supply"
)

// The JSON shape of stress.json (and "forelay stress --json"). Field names
// are documented in the README; keep them stable.

type stressPeriodJSON struct {
	Period            string `json:"period"`
	Mean              Num    `json:"mean"`
	P5                Num    `json:"p5"`
	P10               Num    `json:"p10"`
	P50               Num    `json:"p50"`
	P90               Num    `json:"p90"`
	P95               Num    `json:"p95"`
	Capacity          Num    `json:"capacity"`
	PBreach           Num    `json:"p_breach"`
	ExpectedShortfall Num    `json:"expected_shortfall"`
	ShortfallIfBreach Num    `json:"shortfall_if_breach"`
	UtilP50           Num    `json:"util_p50"`
	UtilP90           Num    `json:"util_p90"`
}

type stressScenarioJSON struct {
	Name                   string             `json:"name"`
	Events                 []string           `json:"events"`
	Periods                []stressPeriodJSON `json:"periods"`
	FirstBreach            *string            `json:"first_breach"`
	TotalExpectedShortfall Num                `json:"total_expected_shortfall"`
	PAnyBreach             Num                `json:"p_any_breach"`
	Frozen                 *frozenJSON        `json:"frozen,omitempty"`
}

// StressDoc is the document of stress.json.
type StressDoc struct {
	Plan            string               `json:"plan"`
	Units           string               `json:"units,omitempty"`
	Series          string               `json:"series"`
	Paths           int                  `json:"paths"`
	Seed            uint64               `json:"seed"`
	Errors          string               `json:"errors"`
	ErrorPool       int                  `json:"error_pool,omitempty"`
	Psi             []Num                `json:"psi"`
	Quantiles       string               `json:"quantiles"`
	BreachThreshold Num                  `json:"breach_threshold"`
	Inputs          map[string]string    `json:"inputs"`
	Scenarios       []stressScenarioJSON `json:"scenarios"`
	Notes           []string             `json:"notes"`
	Warnings        []string             `json:"warnings"`
	Caution         string               `json:"caution"`
}

// Stress returns the report of a stress run: the text, stress.json,
// stress.csv, the fan chart of scenario chart (an index into the plan's
// scenarios) and, under frozen production, its stock chart. It panics if
// chart is out of range.
func Stress(r *supply.StressRun, chart int) *Report {
	notes := append(SimNotes(r.Plan), r.Notes...)
	rep := &Report{Name: "stress", Warnings: r.Warnings, Doc: stressDoc(r, notes), CSV: stressCSV(r),
		Charts: []Chart{{Name: "fan", Plot: fanChart(r, chart)}}, MoreTables: planTables(r.Plan)}
	if r.Frozen != nil {
		rep.Charts = append(rep.Charts, Chart{Name: "stock", Plot: stockChart(r, chart)})
	}
	writeStressText(&rep.Text, r, notes)
	return rep
}

func stressDoc(r *supply.StressRun, notes []string) StressDoc {
	p, mc := r.Plan, r.Sim
	o := StressDoc{Plan: p.File.Plan, Units: p.File.Units, Series: p.History.Name, Paths: mc.Paths, Seed: mc.Seed,
		Errors: mc.Errors.String(), ErrorPool: mc.Pool, Psi: Nums(mc.Psi), Quantiles: quantileDefinition,
		BreachThreshold: Num(r.Settings.Breach), Inputs: p.Digests, Notes: notes, Warnings: List(r.Warnings), Caution: Caution}
	for s, rk := range r.Risks {
		sj := stressScenarioJSON{Name: rk.Name, Events: eventIDList(p.Scenarios[s].Events),
			FirstBreach: PeriodOrNull(p, rk.FirstBreach), TotalExpectedShortfall: Num(rk.TotalExpectedShortfall),
			PAnyBreach: Num(rk.PAnyBreach)}
		sj.Periods = stressPeriods(p.Periods, rk)
		if r.Frozen != nil {
			sj.Frozen = frozenDoc(p.Periods, r.Frozen[s], r.Source)
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}

// stressCSV renders stress.csv: one row per scenario and period. The
// frozen-production columns are there only when production is frozen.
// Quantities have two decimals, probabilities and utilisations four; a
// value that does not apply (no capacity) is an empty cell.
func stressCSV(r *supply.StressRun) *Table {
	tb := (&Table{Head: []string{"scenario", "period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach",
		"expected_shortfall", "shortfall_if_breach", "util_p50", "util_p90"}}).Typed(kindsOf([]Kind{Label, Label}, riskKinds)...)
	if r.Frozen != nil {
		tb.Head = append(tb.Head, "production", "stock", "stock_at_p50_demand", "stock_at_p90_demand", "p_short", "idle", "overload")
		tb.Kinds = append(tb.Kinds, frozenKinds...)
	}
	for s, rk := range r.Risks {
		for t, pr := range rk.Periods {
			row := append([]string{rk.Name, r.Plan.Periods[t].String()}, stressCells(pr)...)
			if r.Frozen != nil {
				row = append(row, frozenCells(&r.Frozen[s], t)...)
			}
			tb.AddRow(row...)
		}
	}
	return tb
}

// riskKinds are the kinds of stress.csv's columns from mean to util_p90,
// and frozenKinds those of its frozen-production columns.
var (
	riskKinds   = []Kind{Quantity, Quantity, Quantity, Quantity, Quantity, Quantity, Quantity, Share, Quantity, Quantity, Share, Share}
	frozenKinds = []Kind{Quantity, Quantity, Quantity, Quantity, Share, Quantity, Quantity}
)

// writeStressText writes the text report of a stress run.
func writeStressText(w *Text, r *supply.StressRun, notes []string) {
	p := r.Plan
	f := p.File
	fmt.Fprintf(w, "Stress test %s: %s\n", f.Plan, planSpan(p))
	fmt.Fprintf(w, "Monte Carlo: %s; quantiles by Hyndman-Fan type 7\n", SimText(r.Sim))
	if f.Capacity != nil {
		fmt.Fprintf(w, "Capacity: %s; breach threshold %s\n", CapacityText(p), PctText(r.Settings.Breach))
	} else {
		fmt.Fprintln(w, "Capacity: none given (add a capacity block to the scenario file to see breaches)")
	}
	for s := range r.Risks {
		writeStressScenario(w, r, s)
		if r.Frozen != nil {
			writeFrozenText(w, p.Periods, p.File.Units, r.Frozen[s], r.Source)
		}
	}
	writeNotesAndCaution(w, notes)
}

// writeStressScenario writes the table of scenario s's simulated demand
// and, with a capacity, its breaches.
func writeStressScenario(w *Text, r *supply.StressRun, s int) {
	p, rk := r.Plan, r.Risks[s]
	hasCap := p.File.Capacity != nil
	writeScenarioHeading(w, rk.Name, eventIDList(p.Scenarios[s].Events))
	head := []string{"period", "mean", "P5", "P10", "P50", "P90", "P95"}
	if hasCap {
		head = append(head, "capacity", "P(breach)", "exp. shortfall", "use P50", "use P90")
	}
	t := NewTable(head...)
	for i, pr := range rk.Periods {
		row := []string{p.Periods[i].String(), wholeNum(pr.Mean), wholeNum(pr.P5), wholeNum(pr.P10),
			wholeNum(pr.P50), wholeNum(pr.P90), wholeNum(pr.P95)}
		if hasCap {
			row = append(row, wholeNum(pr.Capacity), PctText(pr.PBreach), wholeNum(pr.ExpectedShortfall),
				PctText(pr.UtilP50), PctText(pr.UtilP90))
		}
		t.AddRow(row...)
	}
	w.Add(t)
	if !hasCap {
		return
	}
	breach := PctText(r.Settings.Breach)
	if rk.FirstBreach >= 0 {
		fmt.Fprintf(w, "First period with P(breach) above %s: %s (%s)\n", breach,
			p.Periods[rk.FirstBreach], PctText(rk.Periods[rk.FirstBreach].PBreach))
	} else {
		fmt.Fprintf(w, "No period has P(breach) above %s\n", breach)
	}
	fmt.Fprintf(w, "Expected shortfall over the plan: %s%s; P(demand above capacity in at least one period): %s\n",
		wholeNum(rk.TotalExpectedShortfall), unitsSuffix(p.File.Units), PctText(rk.PAnyBreach))
}

// stressCells returns the CSV cells of one period's risk: mean, P5 to
// P95, capacity, P(breach), expected shortfall, shortfall if breach and
// the P50 and P90 utilisation.
func stressCells(pr supply.PeriodRisk) []string {
	return []string{CSVNum(pr.Mean, 2), CSVNum(pr.P5, 2), CSVNum(pr.P10, 2),
		CSVNum(pr.P50, 2), CSVNum(pr.P90, 2), CSVNum(pr.P95, 2), CSVNum(pr.Capacity, 2), CSVNum(pr.PBreach, 4),
		CSVNum(pr.ExpectedShortfall, 2), CSVNum(pr.ShortfallIfBreach, 2), CSVNum(pr.UtilP50, 4), CSVNum(pr.UtilP90, 4)}
}

// frozenCells returns the CSV cells of period t of a stock projection:
// production, stock, stock at P50 and P90 demand, P(short), idle and
// overload.
func frozenCells(fz *supply.StockProjection, t int) []string {
	return []string{CSVNum(fz.Production[t], 2), CSVNum(fz.Stock[t], 2), CSVNum(fz.StockP50[t], 2),
		CSVNum(fz.StockP90[t], 2), CSVNum(fz.PShort[t], 4), CSVNum(fz.Idle[t], 2), CSVNum(fz.Overload[t], 2)}
}
