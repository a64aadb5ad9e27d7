package report

import (
	"fmt"
	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/plan"
	"strings"
)

// The formatters the stress, buffer and compare reports share.

// quantileDefinition names the quantile estimator in the JSON documents
// of the Monte Carlo runs.
const quantileDefinition = "Hyndman-Fan type 7 (linear interpolation between order statistics)"

// serviceDefinition is said in every output that sizes stock for a
// service level.
const serviceDefinition = "cycle service level, not fill rate"

// wholeNum formats a quantity for a text table or sentence: thousands
// separators, no decimals, "-" for NaN.
func wholeNum(v float64) string { return forecast.FormatNumber(v, 0) }

// unitsSuffix returns " litres" for units "litres", or "" for none: the
// unit after a quantity in a sentence.
func unitsSuffix(units string) string {
	if units == "" {
		return ""
	}
	return " " + units
}

// eventIDList returns the ids of the events, in order; an empty list, never
// nil, for none.
func eventIDList(list []*scenario.Event) []string {
	ids := []string{}
	for _, e := range list {
		ids = append(ids, e.ID)
	}
	return ids
}

// writeScenarioHeading writes the line that opens a scenario's section,
// a blank line first: its name and its events' ids, or "baseline only".
func writeScenarioHeading(t *Text, name string, ids []string) {
	evs := "baseline only"
	if len(ids) > 0 {
		evs = "events: " + strings.Join(ids, ", ")
	}
	fmt.Fprintln(t)
	t.Heading(fmt.Sprintf("Scenario %s (%s)", name, evs))
}

// writeNotesAndCaution writes the notes, a blank line first, one "Note: ...." line
// each, and then the caution that ends every report.
func writeNotesAndCaution(t *Text, notes []string) {
	if len(notes) > 0 {
		fmt.Fprintln(t)
		for _, n := range notes {
			fmt.Fprintf(t, "Note: %s.\n", strings.TrimSuffix(n, "."))
		}
	}
	fmt.Fprintln(t)
	t.caution()
}

// PeriodLabels returns the labels of the plan's periods, the x labels of
// a chart over the plan alone.
func PeriodLabels(p *plan.Plan) []string {
	labels := make([]string, len(p.Periods))
	for t, per := range p.Periods {
		labels[t] = per.String()
	}
	return labels
}

// FanLabels returns the x labels of a chart that shows the last periods
// of the history (ChartHistory of them at most) and then the plan, and
// the number of history periods shown.
func FanLabels(p *plan.Plan) (labels []string, show int) {
	n := p.History.Len()
	show = min(n, ChartHistory(p.History.Freq()))
	labels = make([]string, 0, show+len(p.Periods))
	for i := n - show; i < n; i++ {
		labels = append(labels, p.History.Period(i).String())
	}
	for _, per := range p.Periods {
		labels = append(labels, per.String())
	}
	return labels, show
}
