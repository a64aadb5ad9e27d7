package report

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// The small formatters of the reports: numbers as the tables show them,
// signs, shares, units and the one-line descriptions the reports repeat.

func InUnits(u string) string {
	if u == "" {
		return ""
	}
	return " (" + u + ")"
}

// Signed formats v with an explicit sign.
func Signed(v float64, decimals int) string {
	s := forecast.FormatNumber(v, decimals)
	if v > 0 || (v == 0 && !math.Signbit(v)) {
		return "+" + s
	}
	return s
}

// Pct formats v as a Signed percentage of base.
func Pct(v, base float64) string {
	if base == 0 {
		return "-"
	}
	return Signed(100*v/base, 1) + "%"
}

// Param formats a smoothing parameter, "-" when it does not apply.
func Param(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	return strconv.FormatFloat(v, 'f', 4, 64)
}

func ParamText(p forecast.Params) string {
	var parts []string
	for _, kv := range []struct {
		k string
		v float64
	}{{"alpha", p.Alpha}, {"beta", p.Beta}, {"gamma", p.Gamma}, {"phi", p.Phi}} {
		if kv.v == kv.v { // not NaN
			parts = append(parts, kv.k+" "+Param(kv.v))
		}
	}
	return strings.Join(parts, " ")
}

func BandSourceText(src forecast.VarianceSource, cal forecast.Calibration) string {
	switch src {
	case forecast.VarCalibrated, forecast.VarFlatCalibrated:
		how := "widening with lead time"
		if src == forecast.VarFlatCalibrated {
			how = "flat: the one-step spread at every lead time"
		}
		whose := ""
		if cal.Selection {
			whose = " of the selection's own choices"
		}
		ratio := forecast.FormatNumber(cal.Ratio, 2) + " x the model's variance"
		if !cal.Shaped {
			ratio = "shaped by the errors themselves"
		}
		return fmt.Sprintf("%s, calibrated on %s out-of-sample %s%s from %d %s at lead times 1 to %d, %s",
			how, forecast.FormatNumber(float64(cal.Errors), 0), Plural(cal.Errors, "error", "errors"), whose, cal.Origins,
			Plural(cal.Origins, "origin", "origins"), cal.Leads, ratio)
	case forecast.VarFlat:
		return "flat: sqrt(MSE) at every lead time"
	case forecast.VarAnalytic:
		return "widening with lead time: analytic variance of the model class"
	case forecast.VarBacktest:
		return "widening with lead time: backtest RMSE per lead time"
	}
	return "widening with lead time: MSE x lead time (no backtest available)"
}

// Plural returns one when n is 1 and many otherwise.
func Plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}

// SimText describes a simulation in one line: "10,000 paths, seed 1,
// errors resampled from 94 in-sample one-step errors".
func SimText(mc *sim.Simulation) string {
	how := fmt.Sprintf("errors resampled from %d in-sample one-step errors", mc.Pool)
	if mc.Errors == sim.Normal {
		how = "normal errors with the band variance"
	}
	return fmt.Sprintf("%s paths, seed %d, %s", forecast.FormatNumber(float64(mc.Paths), 0), mc.Seed, how)
}

// CapacityText describes the capacity schedule: "640,000 per month;
// 680,000 from 2027-09".
func CapacityText(p *plan.Plan) string {
	c := p.File.Capacity
	if c == nil {
		return "none given"
	}
	s := fmt.Sprintf("%s per %s", forecast.FormatNumber(c.Units, 0), p.History.Freq())
	for _, ch := range c.Changes {
		s += fmt.Sprintf("; %s from %s", forecast.FormatNumber(ch.Units, 0), ch.From.Label)
	}
	return s
}

// SimNotes are the remarks every Monte Carlo output carries besides the
// plan's own notes.
func SimNotes(p *plan.Plan) []string {
	notes := append([]string{}, p.Notes...)
	for _, e := range p.Future {
		if e.Range != nil {
			notes = append(notes, "the simulation draws each event's size from a triangular distribution between its range's low and high, peaked at the effect; the plan's bands read the same range as a 90% normal interval")
			break
		}
	}
	return notes
}

// PeriodOrNull returns the label of period index i of the plan, or nil
// when i < 0 (JSON null).
func PeriodOrNull(p *plan.Plan, i int) *string { return periodOrNull(p.Periods, i) }

// periodOrNull returns the label of periods[i], or nil when i < 0.
func periodOrNull(periods []forecast.Period, i int) *string {
	if i < 0 {
		return nil
	}
	s := periods[i].String()
	return &s
}

// CSVNum formats v for CSV with the given decimals; NaN is an empty cell.
func CSVNum(v float64, decimals int) string {
	if math.IsNaN(v) {
		return ""
	}
	return strconv.FormatFloat(v, 'f', decimals, 64)
}

// PctText formats a probability as a percentage with one decimal, "-" for
// NaN.
func PctText(v float64) string {
	if math.IsNaN(v) {
		return "-"
	}
	return strconv.FormatFloat(100*v, 'f', 1, 64) + "%"
}

// CSV2 formats a value for CSV files: two decimals, fixed notation, so
// files are stable and easy to read in a spreadsheet.
func CSV2(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

func OrNone(s []string) string {
	if len(s) == 0 {
		return "none"
	}
	return strings.Join(s, ", ")
}

// ChartHistory is how many periods of history the plan and fan charts show
// before the forecast: enough seasons to read the pattern, few enough that
// the plan is not squeezed into a sliver at the right. Three years of
// months or quarters, two years of weeks, twelve weeks of days, 24 years.
func ChartHistory(f forecast.Frequency) int {
	switch f {
	case forecast.Daily:
		return 84
	case forecast.Weekly:
		return 104
	case forecast.Monthly:
		return 36
	case forecast.Quarterly:
		return 12
	}
	return 24
}

// UnitsLabel is the value-axis label: "litres per month", or "per month".
func UnitsLabel(units, period string) string {
	if units == "" {
		return "units per " + period
	}
	return units + " per " + period
}

// StockLabel is the value-axis label of a stock panel: "litres in stock".
func StockLabel(units string) string {
	if units == "" {
		return "units in stock"
	}
	return units + " in stock"
}

// G3 formats a setting with up to three significant digits: 4, 0.1,
// 0.538.
func G3(v float64) string { return strconv.FormatFloat(v, 'g', 3, 64) }

func F4(v float64) string { return strconv.FormatFloat(v, 'f', 4, 64) }

// planSpan describes what a plan covers, for the first line of a report:
// "series bottled-l, 18 month periods 2026-11 to 2028-04 (litres)".
func planSpan(p *plan.Plan) string {
	return fmt.Sprintf("series %s, %d %s periods %s to %s%s", p.History.Name, len(p.Periods), p.History.Freq(),
		p.Periods[0], p.Periods[len(p.Periods)-1], InUnits(p.File.Units))
}
