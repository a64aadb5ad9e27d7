package report

import (
	"fmt"
	"math"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// The tables of a report that have no CSV file of their own and go only
// into writers of several tables (Report.MoreTables): the events acting
// on a plan and the accuracy of its baselines, or the accuracy of a plan
// over tracked periods.

// eventsHead and eventsKinds are the columns of the events table.
var (
	eventsHead = []string{"event", "series", "kind", "start", "end", "effect", "effect_unit", "low", "high",
		"probability", "total", "from_past", "note"}
	eventsKinds = []Kind{Label, Label, Label, Label, Label, Quantity, Label, Quantity, Quantity, Share, Quantity, Label, Label}
)

// accuracyHead and accuracyKinds are the columns of the accuracy table of
// a plan's baselines.
var (
	accuracyHead = []string{"series", "basis", "method", "settings", "chosen", "n", "mad", "mse", "rmse", "mape",
		"mase", "bias", "aicc", "note"}
	accuracyKinds = []Kind{Label, Label, Label, Label, Label, Count, Quantity, Quantity, Quantity, Percent, Ratio,
		Quantity, Ratio, Label}
)

// planTables returns the events and accuracy tables of a plan of one
// series.
func planTables(p *plan.Plan) []CSVFile {
	return plansTables(p.Future, []*plan.Plan{p})
}

// portfolioTables returns the events and accuracy tables of a portfolio:
// one row per event and series it moves, and the accuracy of every
// series' baseline (none for a series a scope creates).
func portfolioTables(pf *plan.Portfolio) []CSVFile {
	return plansTables(pf.File.Events, pf.Plans)
}

// plansTables returns the events table (for each event in order, a row
// for each plan that holds it as a future event, with that plan's view of
// it) and the accuracy table of plans.
func plansTables(order []*scenario.Event, plans []*plan.Plan) []CSVFile {
	ev := (&Table{Head: eventsHead}).Typed(eventsKinds...)
	for _, e := range order {
		for _, p := range plans {
			if fe := futureEvent(p, e.ID); fe != nil {
				ev.AddRow(eventRow(p, fe)...)
			}
		}
	}
	acc := (&Table{Head: accuracyHead}).Typed(accuracyKinds...)
	for _, p := range plans {
		if p.Fit != nil {
			acc.Rows = append(acc.Rows, accuracyRows(p.History.Name, p.Fit)...)
		}
	}
	return []CSVFile{{"events", ev}, {"accuracy", acc}}
}

// futureEvent returns p's future event id, or nil.
func futureEvent(p *plan.Plan, id string) *scenario.Event {
	for _, e := range p.Future {
		if e.ID == id {
			return e
		}
	}
	return nil
}

// eventRow is the row of event e as plan p sees it: its effect at full
// size in units or percent, its range, its probability and its total
// contribution over the plan's periods.
func eventRow(p *plan.Plan, e *scenario.Event) []string {
	end := ""
	if e.HasEnd {
		end = e.End.Label
	}
	unit := "units"
	if e.Effect.IsPercent {
		unit = "percent"
	}
	low, high := "", ""
	if e.Range != nil {
		low, high = CSVNum(e.Range.Low, 2), CSVNum(e.Range.High, 2)
	}
	past := ""
	if e.Effect.FromPast {
		past = "yes"
	}
	return []string{e.ID, p.History.Name, e.Kind.String(), e.Start.Label, end, CSVNum(e.Effect.Value(), 2), unit, low, high,
		CSVNum(e.Probability, 4), CSVNum(plan.Total(p.Effects[e.ID].Contrib), 2), past, e.Note}
}

// accuracyRows are the rows of one baseline: its in-sample accuracy, its
// backtest's, and each candidate's backtest when a method was chosen
// among several.
func accuracyRows(series string, r *forecast.Result) [][]string {
	row := func(basis, method, settings, chosen string, a *forecast.Accuracy, aicc float64, note string) []string {
		out := []string{series, basis, method, settings, chosen, "", "", "", "", "", "", "", CSVNum(aicc, 4), note}
		if a != nil {
			copy(out[5:12], []string{fmt.Sprint(a.N), CSVNum(a.MAD, 2), CSVNum(a.MSE, 2), CSVNum(a.RMSE, 2),
				CSVNum(a.MAPE, 2), CSVNum(a.MASE, 4), CSVNum(a.Bias, 2)})
		}
		return out
	}
	nan := math.NaN()
	rows := [][]string{row("in-sample", r.Method.String(), r.Model.Describe(), "yes", &r.Accuracy, nan, "")}
	if bt := r.Backtest; bt != nil {
		rows = append(rows, row("backtest", r.Method.String(), r.Model.Describe(), "yes", &bt.Accuracy, nan,
			fmt.Sprintf("%d origins from %d points", bt.Origins, bt.Train)))
	}
	for _, c := range r.Candidates {
		chosen := ""
		if c.Chosen {
			chosen = "yes"
		}
		rows = append(rows, row("candidate", c.Method.String(), c.Describe, chosen, c.Backtest, c.AICc, c.Skipped))
	}
	return rows
}

// Track accuracy: the forecast value added over the tracked periods.
var (
	trackAccuracyHead = []string{"level", "name", "periods", "plan_mad", "plan_bias", "baseline_mad", "baseline_bias",
		"improvement", "improvement_share"}
	trackAccuracyKinds = []Kind{Label, Label, Count, Quantity, Quantity, Quantity, Quantity, Quantity, Share}
)

// trackAccuracyRow is the row of one tracked series or roll-up.
func trackAccuracyRow(level, name string, va forecast.ValueAdded) []string {
	return []string{level, name, fmt.Sprint(va.N), CSVNum(va.PlanMAD, 2), CSVNum(va.PlanBias, 2), CSVNum(va.BaselineMAD, 2),
		CSVNum(va.BaselineBias, 2), CSVNum(va.Improvement, 2), CSVNum(va.ImprovementShare, 4)}
}

// trackTables returns the accuracy table of a tracking run: the plan's
// and the baseline's errors over the tracked periods.
func trackTables(t Track) []CSVFile {
	acc := (&Table{Head: trackAccuracyHead}).Typed(trackAccuracyKinds...)
	acc.AddRow(trackAccuracyRow("series", t.Plan.Series, t.Tracking.ValueAdded)...)
	return []CSVFile{{"accuracy", acc}}
}

// portfolioTrackTables returns the accuracy table of a portfolio's
// tracking: each tracked series, then each tracked roll-up.
func portfolioTrackTables(t PortfolioTrack) []CSVFile {
	acc := (&Table{Head: trackAccuracyHead}).Typed(trackAccuracyKinds...)
	for _, s := range t.Tracking.Series {
		acc.AddRow(trackAccuracyRow("series", s.Plan.Series, s.ValueAdded)...)
	}
	for _, ru := range t.Tracking.Rollups {
		acc.AddRow(trackAccuracyRow(ru.Level, ru.Group, ru.ValueAdded)...)
	}
	return []CSVFile{{"accuracy", acc}}
}
