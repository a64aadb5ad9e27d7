package report

import (
	"slices"

	"forelay/forecast"
	"forelay/plots"
	"forelay/scenario/plan"
)

// A Track is a tracking run to report: the plan tracked against and the
// tracking of the new actuals.
type Track struct {
	Plan     plan.TrackPlan
	Tracking *plan.Tracking
	// Source says where the plan came from: "read from out/plan.json" or
	// "recomputed from plan.yaml".
	Source string
	// DefaultLimit is true when the tracking signal's limit is the
	// signal's default rather than one asked for.
	DefaultLimit bool
	// Warnings are the plan's warnings, or those about the inputs a saved
	// plan was made from.
	Warnings []string
}

// ForTrack returns the report of "forelay track": the text (limits in
// force, the table of tracked periods, the forecast value added and the
// verdict on the latest period), its JSON document, track.csv (no JSON
// file), the control chart and the tracking signal chart.
func ForTrack(t Track) *Report {
	control, signal := trackCharts(t)
	r := &Report{Name: "track", NoJSONFile: true, Warnings: t.Warnings, Doc: trackDoc(t), CSV: trackCSV(t),
		Charts: []Chart{{Name: "control", Plot: control}, {Name: "signal", Plot: signal}}, MoreTables: trackTables(t)}
	trackText(&r.Text, t)
	return r
}

// trackCSV is track.csv: one row per tracked period with the columns
// period, actual, plan, baseline, error, cum_error, mad, tracking_signal,
// sigmas, verdict and rules (rule names separated by spaces). Values have
// two decimals, the signal and the sigmas four.
func trackCSV(t Track) *Table {
	tr := t.Tracking
	tb := (&Table{Head: slices.Clone(trackHead)}).Typed(trackKinds...)
	for i := range tr.Points {
		tb.AddRow(trackRow(tr, i)...)
	}
	return tb
}

// trackCharts lays out the control chart (the errors with their limits and
// the run rules that fired) and the tracking signal chart (the signal with
// its limits).
func trackCharts(t Track) (plots.ControlChart, plots.SignalChart) {
	tp, tr := t.Plan, t.Tracking
	labels := make([]string, len(tr.Periods))
	errs := make([]float64, len(tr.Points))
	sig := make([]float64, len(tr.Points))
	var hits []plots.Hit
	for i, p := range tr.Points {
		labels[i] = tr.Periods[i].String()
		errs[i], sig[i] = p.Error, p.TrackingSignal
		for _, ru := range p.Rules {
			if m, ok := ruleMark[ru]; ok {
				hits = append(hits, plots.Hit{Index: i, Label: m})
			}
		}
	}
	what := tp.Series + ", scenario " + tr.Scenario
	cc := plots.ControlChart{Title: "Errors against the plan (actual - plan): " + what, Units: tp.Units,
		Labels: labels, Errors: errs, UCL: tr.Limits.UCL, LCL: tr.Limits.LCL, Sigma: tr.Limits.Sigma, Hits: hits}
	title, ylabel := "Tracking signal: "+what, ""
	if tr.Config.Signal == forecast.SignalSmoothed {
		title = "Trigg's smoothed tracking signal: " + what
		ylabel = "Smoothed error ÷ smoothed MAD"
	}
	sc := plots.SignalChart{Title: title, Labels: labels, Signal: sig, Limit: tr.Config.TSLimit, YLabel: ylabel}
	return cc, sc
}
