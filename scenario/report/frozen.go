package report

import (
	"fmt"
	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/supply"
	"math"
	"strings"
)

// The frozen-production part of a stress report: the stock projected
// under production held at the previous plan.

type frozenPeriodJSON struct {
	Period           string `json:"period"`
	Production       Num    `json:"production"`
	Demand           Num    `json:"demand"`
	Stock            Num    `json:"stock"`
	StockAtP50Demand Num    `json:"stock_at_p50_demand"`
	StockAtP90Demand Num    `json:"stock_at_p90_demand"`
	PShort           Num    `json:"p_short"`
	Capacity         Num    `json:"capacity"`
	Idle             Num    `json:"idle"`
	Overload         Num    `json:"overload"`
}

type frozenJSON struct {
	Source         string             `json:"source"`
	OpeningStock   Num                `json:"opening_stock"`
	FirstShortfall *string            `json:"first_shortfall"`
	Lowest         PeakDoc            `json:"lowest_stock"`
	Highest        PeakDoc            `json:"highest_stock"`
	EndStock       Num                `json:"end_stock"`
	IdleTotal      Num                `json:"idle_total"`
	OverloadTotal  Num                `json:"overload_total"`
	Periods        []frozenPeriodJSON `json:"periods"`
}

// frozenDoc returns the JSON of a stock projection over periods.
func frozenDoc(periods []forecast.Period, fz supply.StockProjection, source string) *frozenJSON {
	fj := &frozenJSON{Source: source, OpeningStock: Num(fz.Opening), FirstShortfall: periodOrNull(periods, fz.FirstShortfall),
		Lowest:   PeakDoc{Period: periods[fz.Low].String(), Value: Num(fz.Stock[fz.Low])},
		Highest:  PeakDoc{Period: periods[fz.High].String(), Value: Num(fz.Stock[fz.High])},
		EndStock: Num(fz.Stock[len(fz.Stock)-1]), IdleTotal: Num(plan.Total(fz.Idle)),
		OverloadTotal: Num(plan.Total(fz.Overload))}
	for t := range fz.Stock {
		fj.Periods = append(fj.Periods, frozenPeriodJSON{Period: periods[t].String(), Production: Num(fz.Production[t]),
			Demand: Num(fz.Demand[t]), Stock: Num(fz.Stock[t]), StockAtP50Demand: Num(fz.StockP50[t]),
			StockAtP90Demand: Num(fz.StockP90[t]), PShort: Num(fz.PShort[t]), Capacity: Num(fz.Capacity[t]), Idle: Num(fz.Idle[t]),
			Overload: Num(fz.Overload[t])})
	}
	return fj
}

// writeFrozenText writes the frozen-production projection of a scenario
// over periods, in units (the file's, or a resource's); source is where
// production comes from (supply.FrozenProduction), and "baseline load"
// for a resource of a portfolio.
func writeFrozenText(w *Text, periods []forecast.Period, unitName string, fz supply.StockProjection, source string) {
	units := unitsSuffix(unitName)
	from := source
	switch source {
	case "baseline":
		from = "the baseline (the previous plan)"
	case baselineLoad:
		from = "the load of the baselines (the previous plan)"
	}
	fmt.Fprintf(w, "\nFrozen production held at %s, opening stock %s%s:\n", from, wholeNum(fz.Opening), units)
	t := NewTable("period", "production", "demand", "stock", "stock @P50", "stock @P90", "P(short)", "idle capacity", "overload")
	for i := range fz.Stock {
		t.AddRow(periods[i].String(), wholeNum(fz.Production[i]), wholeNum(fz.Demand[i]), wholeNum(fz.Stock[i]),
			wholeNum(fz.StockP50[i]), wholeNum(fz.StockP90[i]), PctText(fz.PShort[i]), wholeNum(fz.Idle[i]),
			wholeNum(fz.Overload[i]))
	}
	w.Add(t)
	fmt.Fprintln(w, "(stock at the end of each period under the adjusted plan; @P50 and @P90: when cumulative demand runs at its P50 or P90)")
	if fz.FirstShortfall >= 0 {
		fmt.Fprintf(w, "Stock runs short first in %s (%s%s); lowest %s%s in %s\n", periods[fz.FirstShortfall],
			wholeNum(fz.Stock[fz.FirstShortfall]), units, wholeNum(fz.Stock[fz.Low]), units, periods[fz.Low])
	} else {
		fmt.Fprintln(w, "Stock never runs short under the adjusted plan")
	}
	if hi := fz.Stock[fz.High]; hi > fz.Opening {
		fmt.Fprintf(w, "Stock builds up to %s%s by %s", wholeNum(hi), units, periods[fz.High])
		if idle := plan.Total(fz.Idle); !math.IsNaN(idle) {
			fmt.Fprintf(w, "; idle capacity over the plan %s%s", wholeNum(idle), units)
		}
		fmt.Fprintln(w)
	} else if idle := plan.Total(fz.Idle); !math.IsNaN(idle) {
		fmt.Fprintf(w, "Idle capacity over the plan: %s%s\n", wholeNum(idle), units)
	}
	writeOverloadText(w, periods, fz, units)
}

// baselineLoad is the source of a resource's frozen production in a
// portfolio: its load under the baselines.
const baselineLoad = "baseline load"

// writeOverloadText says in which periods the frozen plan asks for more
// than the capacity, if any. The overload is counted period by period,
// never netted against idle capacity elsewhere.
func writeOverloadText(w *Text, periods []forecast.Period, fz supply.StockProjection, units string) {
	var over []string
	for i, v := range fz.Overload {
		if v > 0 {
			over = append(over, fmt.Sprintf("%s (%s)", periods[i], wholeNum(v)))
		}
	}
	if len(over) == 0 {
		return
	}
	fmt.Fprintf(w, "Overload: the frozen plan asks for more than capacity in %d %s (%s%s in all): %s\n",
		len(over), Plural(len(over), "period", "periods"), wholeNum(plan.Total(fz.Overload)), units, strings.Join(over, ", "))
	fmt.Fprintln(w, "Lower the frozen plan or raise capacity; the stock above counts the plan as made")
}
