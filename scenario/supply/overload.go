package supply

import (
	"fmt"
	"forelay/forecast"
	"forelay/scenario/plan"
	"math"
	"strconv"
)

// splitCapacity splits the gap between capacity c and production prod of
// one period into idle capacity, max(0, c − prod), and overload,
// max(0, prod − c); both are NaN when c is NaN (no limit). At most one of
// them is above zero.
func splitCapacity(c, prod float64) (idle, overload float64) {
	if math.IsNaN(c) {
		return math.NaN(), math.NaN()
	}
	return math.Max(0, c-prod), math.Max(0, prod-c)
}

// OverloadWarnings returns one warning per period in which the frozen
// production prod (one value per plan period, from source as returned by
// FrozenProduction) asks for more than the capacity, in period order, for
// example
//
//	production plan prev.csv: 2027-09 plans 700,000 against capacity 680,000 (overload 20,000 litres); lower the frozen plan or raise capacity
//
// The overload is max(0, production − capacity) of that period alone: it
// is never netted against the idle capacity of other periods. It returns
// nil without a capacity or without overload, and panics if prod is not as
// long as the plan.
func OverloadWarnings(p *plan.Plan, prod []float64, source string) []string {
	if len(prod) != len(p.Periods) {
		panic("scenario: OverloadWarnings with production of the wrong length")
	}
	capacity := CapacityPerPeriod(p)
	if capacity == nil {
		return nil
	}
	what := "production plan " + source
	if source == "baseline" {
		what = "frozen production (the baseline forecast)"
	}
	units := ""
	if p.File.Units != "" {
		units = " " + p.File.Units
	}
	var out []string
	for t, c := range capacity {
		if _, over := splitCapacity(c, prod[t]); over > 0 {
			out = append(out, fmt.Sprintf("%s: %s plans %s against capacity %s (overload %s%s); lower the frozen plan or raise capacity",
				what, p.Periods[t], groupDigits(prod[t]), groupDigits(c), groupDigits(over), units))
		}
	}
	return out
}

// groupDigits formats v for a sentence: at most two decimals, trailing
// zeros dropped, thousands separated by commas ("20,000", "1,250.5"). A
// value that rounds to zero keeps three significant digits.
func groupDigits(v float64) string {
	r := math.Round(v*100) / 100
	if r == 0 && v != 0 {
		return strconv.FormatFloat(v, 'g', 3, 64)
	}
	return forecast.FormatNumber(r, -1)
}
