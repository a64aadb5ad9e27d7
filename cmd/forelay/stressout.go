package main

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/supply"
	"io"
	"math"
	"strings"

	"forelay/scenario"
)

// The JSON shape of stress.json (and "forelay stress --json"). Field names
// are documented in the README; keep them stable.

type stressPeriodJSON struct {
	Period            string `json:"period"`
	Mean              num    `json:"mean"`
	P5                num    `json:"p5"`
	P10               num    `json:"p10"`
	P50               num    `json:"p50"`
	P90               num    `json:"p90"`
	P95               num    `json:"p95"`
	Capacity          num    `json:"capacity"`
	PBreach           num    `json:"p_breach"`
	ExpectedShortfall num    `json:"expected_shortfall"`
	ShortfallIfBreach num    `json:"shortfall_if_breach"`
	UtilP50           num    `json:"util_p50"`
	UtilP90           num    `json:"util_p90"`
}

type frozenPeriodJSON struct {
	Period           string `json:"period"`
	Production       num    `json:"production"`
	Demand           num    `json:"demand"`
	Stock            num    `json:"stock"`
	StockAtP50Demand num    `json:"stock_at_p50_demand"`
	StockAtP90Demand num    `json:"stock_at_p90_demand"`
	PShort           num    `json:"p_short"`
	Capacity         num    `json:"capacity"`
	Idle             num    `json:"idle"`
	Overload         num    `json:"overload"`
}

type frozenJSON struct {
	Source         string             `json:"source"`
	OpeningStock   num                `json:"opening_stock"`
	FirstShortfall *string            `json:"first_shortfall"`
	Lowest         report.PeakDoc     `json:"lowest_stock"`
	Highest        report.PeakDoc     `json:"highest_stock"`
	EndStock       num                `json:"end_stock"`
	IdleTotal      num                `json:"idle_total"`
	OverloadTotal  num                `json:"overload_total"`
	Periods        []frozenPeriodJSON `json:"periods"`
}

type stressScenarioJSON struct {
	Name                   string             `json:"name"`
	Events                 []string           `json:"events"`
	Periods                []stressPeriodJSON `json:"periods"`
	FirstBreach            *string            `json:"first_breach"`
	TotalExpectedShortfall num                `json:"total_expected_shortfall"`
	PAnyBreach             num                `json:"p_any_breach"`
	Frozen                 *frozenJSON        `json:"frozen,omitempty"`
}

type stressOutJSON struct {
	Plan            string               `json:"plan"`
	Units           string               `json:"units,omitempty"`
	Series          string               `json:"series"`
	Paths           int                  `json:"paths"`
	Seed            uint64               `json:"seed"`
	Errors          string               `json:"errors"`
	ErrorPool       int                  `json:"error_pool,omitempty"`
	Psi             []num                `json:"psi"`
	Quantiles       string               `json:"quantiles"`
	BreachThreshold num                  `json:"breach_threshold"`
	Inputs          map[string]string    `json:"inputs"`
	Scenarios       []stressScenarioJSON `json:"scenarios"`
	Notes           []string             `json:"notes"`
	Warnings        []string             `json:"warnings"`
	Caution         string               `json:"caution"`
}

// quantileDefinition names the quantile estimator in the JSON outputs.
const quantileDefinition = "Hyndman-Fan type 7 (linear interpolation between order statistics)"

func eventIDs(list []*scenario.Event) []string {
	ids := []string{}
	for _, e := range list {
		ids = append(ids, e.ID)
	}
	return ids
}

func stressJSON(r *stressResult) stressOutJSON {
	p, mc := r.Plan, r.Sim
	o := stressOutJSON{Plan: p.File.Plan, Units: p.File.Units, Series: p.History.Name, Paths: mc.Paths, Seed: mc.Seed,
		Errors: mc.Errors.String(), ErrorPool: mc.Pool, Psi: nums(mc.Psi), Quantiles: quantileDefinition,
		BreachThreshold: num(r.Opts.Breach), Inputs: p.Digests, Notes: r.Notes, Warnings: warningList(r.Warnings), Caution: report.Caution}
	for s, rk := range r.Risks {
		sj := stressScenarioJSON{Name: rk.Name, Events: eventIDs(p.Scenarios[s].Events),
			FirstBreach: report.PeriodOrNull(p, rk.FirstBreach), TotalExpectedShortfall: num(rk.TotalExpectedShortfall),
			PAnyBreach: num(rk.PAnyBreach)}
		for t, pr := range rk.Periods {
			sj.Periods = append(sj.Periods, stressPeriodJSON{Period: p.Periods[t].String(), Mean: num(pr.Mean),
				P5: num(pr.P5), P10: num(pr.P10), P50: num(pr.P50), P90: num(pr.P90), P95: num(pr.P95),
				Capacity: num(pr.Capacity), PBreach: num(pr.PBreach), ExpectedShortfall: num(pr.ExpectedShortfall),
				ShortfallIfBreach: num(pr.ShortfallIfBreach), UtilP50: num(pr.UtilP50), UtilP90: num(pr.UtilP90)})
		}
		if r.Frozen != nil {
			fz := r.Frozen[s]
			fj := &frozenJSON{Source: r.Source, OpeningStock: num(fz.Opening), FirstShortfall: report.PeriodOrNull(p, fz.FirstShortfall),
				Lowest:   report.PeakDoc{Period: p.Periods[fz.Low].String(), Value: num(fz.Stock[fz.Low])},
				Highest:  report.PeakDoc{Period: p.Periods[fz.High].String(), Value: num(fz.Stock[fz.High])},
				EndStock: num(fz.Stock[len(fz.Stock)-1]), IdleTotal: num(plan.Total(fz.Idle)),
				OverloadTotal: num(plan.Total(fz.Overload))}
			for t := range fz.Stock {
				fj.Periods = append(fj.Periods, frozenPeriodJSON{Period: p.Periods[t].String(), Production: num(fz.Production[t]),
					Demand: num(fz.Demand[t]), Stock: num(fz.Stock[t]), StockAtP50Demand: num(fz.StockP50[t]),
					StockAtP90Demand: num(fz.StockP90[t]), PShort: num(fz.PShort[t]), Capacity: num(fz.Capacity[t]), Idle: num(fz.Idle[t]),
					Overload: num(fz.Overload[t])})
			}
			sj.Frozen = fj
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}

// stressCSV renders stress.csv: one row per scenario and period. The
// frozen-production columns are there only when production is frozen.
// Quantities have two decimals, probabilities and utilisations four; a
// value that does not apply (no capacity) is an empty cell.
func stressCSV(r *stressResult) *report.Table {
	var rows [][]string
	head := []string{"scenario", "period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach",
		"expected_shortfall", "shortfall_if_breach", "util_p50", "util_p90"}
	if r.Frozen != nil {
		head = append(head, "production", "stock", "stock_at_p50_demand", "stock_at_p90_demand", "p_short", "idle", "overload")
	}
	rows = append(rows, head)
	for s, rk := range r.Risks {
		for t, pr := range rk.Periods {
			row := []string{rk.Name, r.Plan.Periods[t].String(), report.CSVNum(pr.Mean, 2), report.CSVNum(pr.P5, 2), report.CSVNum(pr.P10, 2),
				report.CSVNum(pr.P50, 2), report.CSVNum(pr.P90, 2), report.CSVNum(pr.P95, 2), report.CSVNum(pr.Capacity, 2), report.CSVNum(pr.PBreach, 4),
				report.CSVNum(pr.ExpectedShortfall, 2), report.CSVNum(pr.ShortfallIfBreach, 2), report.CSVNum(pr.UtilP50, 4), report.CSVNum(pr.UtilP90, 4)}
			if r.Frozen != nil {
				fz := r.Frozen[s]
				row = append(row, report.CSVNum(fz.Production[t], 2), report.CSVNum(fz.Stock[t], 2), report.CSVNum(fz.StockP50[t], 2),
					report.CSVNum(fz.StockP90[t], 2), report.CSVNum(fz.PShort[t], 4), report.CSVNum(fz.Idle[t], 2), report.CSVNum(fz.Overload[t], 2))
			}
			rows = append(rows, row)
		}
	}
	return csvTable(rows)
}

// writeStressText writes the human report of a stress run.
func writeStressText(w io.Writer, r *stressResult) {
	p, mc := r.Plan, r.Sim
	f := p.File
	units := ""
	if f.Units != "" {
		units = " " + f.Units
	}
	fmt.Fprintf(w, "Stress test %s: series %s, %d %s periods %s to %s%s\n", f.Plan, p.History.Name, len(p.Periods),
		p.History.Freq(), p.Periods[0], p.Periods[len(p.Periods)-1], report.InUnits(f.Units))
	fmt.Fprintf(w, "Monte Carlo: %s; quantiles by Hyndman-Fan type 7\n", report.SimText(mc))
	hasCap := f.Capacity != nil
	if hasCap {
		fmt.Fprintf(w, "Capacity: %s; breach threshold %s\n", report.CapacityText(p), report.PctText(r.Opts.Breach))
	} else {
		fmt.Fprintln(w, "Capacity: none given (add a capacity block to the scenario file to see breaches)")
	}
	for s, rk := range r.Risks {
		fmt.Fprintln(w)
		evs := "baseline only"
		if ids := eventIDs(p.Scenarios[s].Events); len(ids) > 0 {
			evs = "events: " + strings.Join(ids, ", ")
		}
		fmt.Fprintf(w, "Scenario %s (%s)\n", rk.Name, evs)
		head := []string{"period", "mean", "P5", "P10", "P50", "P90", "P95"}
		if hasCap {
			head = append(head, "capacity", "P(breach)", "exp. shortfall", "use P50", "use P90")
		}
		t := newTable(head...)
		for i, pr := range rk.Periods {
			row := []string{p.Periods[i].String(), fmtNum(pr.Mean, 0), fmtNum(pr.P5, 0), fmtNum(pr.P10, 0),
				fmtNum(pr.P50, 0), fmtNum(pr.P90, 0), fmtNum(pr.P95, 0)}
			if hasCap {
				row = append(row, fmtNum(pr.Capacity, 0), report.PctText(pr.PBreach), fmtNum(pr.ExpectedShortfall, 0),
					report.PctText(pr.UtilP50), report.PctText(pr.UtilP90))
			}
			t.AddRow(row...)
		}
		writeTable(w, t)
		if hasCap {
			if rk.FirstBreach >= 0 {
				fmt.Fprintf(w, "First period with P(breach) above %s: %s (%s)\n", report.PctText(r.Opts.Breach),
					p.Periods[rk.FirstBreach], report.PctText(rk.Periods[rk.FirstBreach].PBreach))
			} else {
				fmt.Fprintf(w, "No period has P(breach) above %s\n", report.PctText(r.Opts.Breach))
			}
			fmt.Fprintf(w, "Expected shortfall over the plan: %s%s; P(demand above capacity in at least one period): %s\n",
				fmtNum(rk.TotalExpectedShortfall, 0), units, report.PctText(rk.PAnyBreach))
		}
		if r.Frozen != nil {
			writeFrozenText(w, p, r.Frozen[s], r.Source, units)
		}
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

// writeFrozenText writes the frozen-production projection of a scenario.
func writeFrozenText(w io.Writer, p *plan.Plan, fz supply.StockProjection, source, units string) {
	from := "the baseline (the previous plan)"
	if source != "baseline" {
		from = source
	}
	fmt.Fprintf(w, "\nFrozen production held at %s, opening stock %s%s:\n", from, fmtNum(fz.Opening, 0), units)
	t := newTable("period", "production", "demand", "stock", "stock @P50", "stock @P90", "P(short)", "idle capacity", "overload")
	for i := range fz.Stock {
		t.AddRow(p.Periods[i].String(), fmtNum(fz.Production[i], 0), fmtNum(fz.Demand[i], 0), fmtNum(fz.Stock[i], 0),
			fmtNum(fz.StockP50[i], 0), fmtNum(fz.StockP90[i], 0), report.PctText(fz.PShort[i]), fmtNum(fz.Idle[i], 0),
			fmtNum(fz.Overload[i], 0))
	}
	writeTable(w, t)
	fmt.Fprintln(w, "(stock at the end of each period under the adjusted plan; @P50 and @P90: when cumulative demand runs at its P50 or P90)")
	if fz.FirstShortfall >= 0 {
		fmt.Fprintf(w, "Stock runs short first in %s (%s%s); lowest %s%s in %s\n", p.Periods[fz.FirstShortfall],
			fmtNum(fz.Stock[fz.FirstShortfall], 0), units, fmtNum(fz.Stock[fz.Low], 0), units, p.Periods[fz.Low])
	} else {
		fmt.Fprintln(w, "Stock never runs short under the adjusted plan")
	}
	if hi := fz.Stock[fz.High]; hi > fz.Opening {
		fmt.Fprintf(w, "Stock builds up to %s%s by %s", fmtNum(hi, 0), units, p.Periods[fz.High])
		if idle := plan.Total(fz.Idle); !math.IsNaN(idle) {
			fmt.Fprintf(w, "; idle capacity over the plan %s%s", fmtNum(idle, 0), units)
		}
		fmt.Fprintln(w)
	} else if idle := plan.Total(fz.Idle); !math.IsNaN(idle) {
		fmt.Fprintf(w, "Idle capacity over the plan: %s%s\n", fmtNum(idle, 0), units)
	}
	writeOverloadText(w, p, fz, units)
}

// writeOverloadText says in which periods the frozen plan asks for more
// than the capacity, if any. The overload is counted period by period,
// never netted against idle capacity elsewhere.
func writeOverloadText(w io.Writer, p *plan.Plan, fz supply.StockProjection, units string) {
	var over []string
	for i, v := range fz.Overload {
		if v > 0 {
			over = append(over, fmt.Sprintf("%s (%s)", p.Periods[i], fmtNum(v, 0)))
		}
	}
	if len(over) == 0 {
		return
	}
	periods := "periods"
	if len(over) == 1 {
		periods = "period"
	}
	fmt.Fprintf(w, "Overload: the frozen plan asks for more than capacity in %d %s (%s%s in all): %s\n",
		len(over), periods, fmtNum(plan.Total(fz.Overload), 0), units, strings.Join(over, ", "))
	fmt.Fprintln(w, "Lower the frozen plan or raise capacity; the stock above counts the plan as made")
}
