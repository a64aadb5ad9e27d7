package report

import (
	"fmt"
	"math"
	"slices"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// ForPlan returns the report of "forelay plan": the summary of every
// scenario (with every period when detail is set, and the period-by-period
// account of event when it is not nil), plan.json's document, plan.csv,
// the plan chart and the plan's warnings.
func ForPlan(p *plan.Plan, detail bool, event *scenario.Event) *Report {
	r := &Report{Name: "plan", Warnings: p.Warnings, Doc: Plan(p), CSV: planCSV(p),
		Charts: []Chart{{Name: "plan", Plot: PlanChart(p)}}, MoreTables: planTables(p)}
	planText(&r.Text, p, detail)
	if event != nil {
		eventText(&r.Text, p, event)
	}
	return r
}

// planText writes the summary of a plan: the baseline, the cleaning
// estimates, each scenario's totals and peak, the notes and the caution.
func planText(w *Text, p *plan.Plan, detail bool) {
	f := p.File
	d := forecast.Decimals(p.Baseline)
	fmt.Fprintf(w, "Plan %s: %s\n", f.Plan, planSpan(p))
	r := p.Fit
	fmt.Fprintf(w, "Baseline %s (%s)", r.Method, choiceText(r))
	if pt := ParamText(r.Model.Params()); pt != "" {
		fmt.Fprintf(w, ", %s", pt)
	} else if r.Method == forecast.Combination {
		fmt.Fprintf(w, ", %s", r.Model.Describe())
	}
	fmt.Fprintf(w, "; fitted to %d periods %s to %s\n", p.History.Len(), p.History.Start, p.History.Period(p.History.Len()-1))
	fmt.Fprintf(w, "Baseline accuracy (one step, in-sample): MAD %s, MSE %s (/%s), MAPE %s%%\n",
		num(r.Accuracy.MAD, d), num(r.Accuracy.MSE, d), r.Accuracy.Divisor, num(r.Accuracy.MAPE, 2))
	writeChecks(w, r)
	fmt.Fprintf(w, "Bands: adjusted +- %.3g x standard error (%s; event ranges count as 90%% intervals)\n", p.Z, BandSourceText(p.VarSource, p.Fit.Calibration()))
	cleaningText(w, p, d)
	for _, sp := range p.Scenarios {
		scenarioText(w, p, sp, d, detail)
	}
	writeNotesAndCaution(w, p.Notes)
}

// cleaningText lists the past events taken out of the history, with
// their estimates; nothing when there are none.
func cleaningText(w *Text, p *plan.Plan, d int) {
	if len(p.Cleaning) == 0 {
		return
	}
	units := unitsSuffix(p.File.Units)
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Taken out of the history before fitting (estimate +- standard error):")
	for _, c := range p.Cleaning {
		verb := "added"
		if c.Effect < 0 {
			verb = "took away"
		}
		what := "per period in " + c.When
		if c.Kind == scenario.Step {
			what = "as a lasting level shift from " + c.When
		}
		fmt.Fprintf(w, "  %s %s %s +- %s%s %s\n", c.ID, verb, num(math.Abs(c.Effect), d), num(c.StdErr, d), units, what)
	}
}

// scenarioText writes one scenario: its totals against the baseline, each
// event's share, its peak and, with detail, every period.
func scenarioText(w *Text, p *plan.Plan, sp plan.ScenarioPlan, d int, detail bool) {
	units := unitsSuffix(p.File.Units)
	writeScenarioHeading(w, sp.Name, eventIDList(sp.Events))
	base := plan.Total(p.Baseline)
	t := NewTable("", "total"+units, "vs baseline", "share")
	t.AddRow("baseline", num(base, d), "", "")
	for _, e := range p.Future {
		if !slices.Contains(sp.Events, e) {
			continue
		}
		c := plan.Total(sp.Contrib[e.ID])
		label := e.ID
		if e.Probability < 1 {
			label += fmt.Sprintf(" (p=%.2g)", e.Probability)
		}
		t.AddRow(label, "", Signed(c, d), Pct(c, base))
	}
	adj := plan.Total(sp.Adjusted)
	t.AddRow("adjusted plan", num(adj, d), Signed(adj-base, d), Pct(adj-base, base))
	rw := plan.Total(sp.RiskWeighted)
	t.AddRow("risk-weighted", num(rw, d), Signed(rw-base, d), Pct(rw-base, base))
	w.Add(t)
	i, v := plan.Peak(sp.Adjusted)
	fmt.Fprintf(w, "Peak %s: %s%s (band %s to %s)\n", p.Periods[i], num(v, d), units, num(sp.Lower[i], d), num(sp.Upper[i], d))
	if !detail {
		return
	}
	dt := NewTable("period", "baseline", "adjusted", "risk-weighted", "lower", "upper")
	for k, per := range p.Periods {
		dt.AddRow(per.String(), num(p.Baseline[k], d), num(sp.Adjusted[k], d), num(sp.RiskWeighted[k], d),
			num(sp.Lower[k], d), num(sp.Upper[k], d))
	}
	fmt.Fprintln(w)
	w.Add(dt)
}

// eventText writes how one future event adds up: in every period it
// touches, its share of full size, its contribution to the plan and the
// standard deviation of that contribution (from its range), and which
// scenarios hold it.
func eventText(w *Text, p *plan.Plan, e *scenario.Event) {
	eff := p.Effects[e.ID]
	d := forecast.Decimals(p.Baseline)
	var in []string
	for _, sp := range p.Scenarios {
		if slices.Contains(sp.Events, e) {
			in = append(in, sp.Name)
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "Event %s, period by period (in scenarios: %s)\n", e.ID, OrNone(in))
	t := NewTable("period", "share", "baseline", "contribution"+InUnits(p.File.Units), "std dev")
	for i, per := range p.Periods {
		if eff.Share[i] == 0 {
			continue
		}
		t.AddRow(per.String(), num(eff.Share[i], 3), num(p.Baseline[i], d), Signed(eff.Contrib[i], d), num(eff.Sigma[i], d))
	}
	if len(t.Rows) == 0 {
		fmt.Fprintln(w, "The event touches none of the plan's periods.")
		return
	}
	w.Add(t)
	if e.Probability < 1 {
		fmt.Fprintf(w, "Probability %s: the risk-weighted plan counts %s of each contribution.\n", num(e.Probability, 2), num(e.Probability, 2))
	}
}

// planKinds are the kinds of plan.csv's columns before the events.
var planKinds = []Kind{Label, Label, Quantity, Quantity, Quantity, Quantity, Quantity}

// planCSV is plan.csv: one row per scenario and period with the columns
// scenario, period, baseline, adjusted, risk_weighted, lower, upper and
// then one column per future event holding its contribution, two
// decimals.
func planCSV(p *plan.Plan) *Table {
	t := &Table{Head: []string{"scenario", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}}
	for _, e := range p.Future {
		t.Head = append(t.Head, e.ID)
	}
	t.Typed(kindsOf(planKinds, repeatKind(Quantity, len(p.Future)))...)
	for _, sp := range p.Scenarios {
		for k, per := range p.Periods {
			row := []string{sp.Name, per.String(), CSV2(p.Baseline[k]), CSV2(sp.Adjusted[k]),
				CSV2(sp.RiskWeighted[k]), CSV2(sp.Lower[k]), CSV2(sp.Upper[k])}
			for _, e := range p.Future {
				row = append(row, CSV2(sp.Contrib[e.ID][k]))
			}
			t.Rows = append(t.Rows, row)
		}
	}
	return t
}
