package report

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
)

// PortfolioOptions are the extras of a portfolio's report.
type PortfolioOptions struct {
	// Charts is how many of the most-changed series get a chart besides
	// the total and the resources, which are always charted (AllCharts
	// for every series).
	Charts int
	// Detail adds every period of the total of each scenario.
	Detail bool
	// Event, when not empty, adds where that event lands: every series it
	// moves, with its share and its contribution.
	Event string
}

// ErrNoPortfolioEvent is wrapped by the error of a portfolio report asked
// about an event that moves no planned series in the forecast periods.
var ErrNoPortfolioEvent = fmt.Errorf("no such future event")

// portfolioEventText writes where event id lands: each series it moves in
// the forecast periods, in the order of Names, with its effect at full
// size (units or percent per period), its total contribution over the
// horizon, and the sum.
func portfolioEventText(w *Text, pf *plan.Portfolio, id string) error {
	var rows [][]string
	total := 0.0
	units := unitsSuffix(pf.File.Units)
	var all []float64
	for _, p := range pf.Plans {
		if eff, ok := p.Effects[id]; ok {
			all = append(all, plan.Total(eff.Contrib))
		}
	}
	d := forecast.Decimals(all)
	for _, p := range pf.Plans {
		eff, ok := p.Effects[id]
		if !ok {
			continue
		}
		e, err := p.FutureEvent(id)
		if err != nil {
			return err
		}
		effect := num(e.Effect.Units, d) + units + " per period"
		if e.Effect.IsPercent {
			effect = fmt.Sprintf("%s%%", num(e.Effect.Percent, -1))
		}
		c := plan.Total(eff.Contrib)
		total += c
		rows = append(rows, []string{p.History.Name, effect, Signed(c, d)})
	}
	if len(rows) == 0 {
		var ids []string
		for _, e := range pf.File.Events {
			ids = append(ids, e.ID)
		}
		return fmt.Errorf("%w: %q moves no planned series in the forecast periods (the file's events: %s)", ErrNoPortfolioEvent, id, strings.Join(ids, ", "))
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "Event %s moves %d series (contribution at full size, summed over the horizon):\n", id, len(rows))
	t := NewTable("series", "effect", "contribution"+units)
	for _, r := range rows {
		t.AddRow(r...)
	}
	t.AddRow("total", "", Signed(total, d))
	w.Add(t)
	return nil
}

// portfolioDetailText writes every period of the total of scenario k.
func portfolioDetailText(w *Text, pf *plan.Portfolio, total plan.Rollup) {
	d := forecast.Decimals(total.Baseline)
	t := NewTable("period", "baseline", "plan", "risk-weighted", "lower", "upper")
	for k, per := range pf.Plans[0].Periods {
		t.AddRow(per.String(), num(total.Baseline[k], d), num(total.Adjusted[k], d), num(total.RiskWeighted[k], d),
			num(total.Lower[k], d), num(total.Upper[k], d))
	}
	fmt.Fprintf(w, "Total per period:\n")
	w.Add(t)
}
