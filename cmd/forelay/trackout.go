package main

import (
	"forelay/scenario/report"
	"strings"

	"forelay/forecast"
	"forelay/plots"
)

// The JSON shape of "forelay track --json". Field names are documented in
// the README (section "track"); keep them stable.

type trackPeriodJSON struct {
	Period         string   `json:"period"`
	Actual         num      `json:"actual"`
	Plan           num      `json:"plan"`
	Baseline       num      `json:"baseline"`
	Error          num      `json:"error"`
	CumError       num      `json:"cum_error"`
	MAD            num      `json:"mad"`
	TrackingSignal num      `json:"tracking_signal"`
	SignalClean    num      `json:"signal_without_outliers"`
	Sigmas         num      `json:"sigmas"`
	Verdict        string   `json:"verdict"`
	Rules          []string `json:"rules"`
}

type fvaJSON struct {
	N                int `json:"n"`
	PlanMAD          num `json:"plan_mad"`
	BaselineMAD      num `json:"baseline_mad"`
	PlanBias         num `json:"plan_bias"`
	BaselineBias     num `json:"baseline_bias"`
	Improvement      num `json:"improvement"`
	ImprovementShare num `json:"improvement_share"`
}

type latestJSON struct {
	Period  string `json:"period"`
	Verdict string `json:"verdict"`
	Message string `json:"message"`
}

type trackOutJSON struct {
	Scenario     string            `json:"scenario"`
	Plan         string            `json:"plan"`
	PlanSource   string            `json:"plan_source"`
	Series       string            `json:"series"`
	Units        string            `json:"units,omitempty"`
	Signal       string            `json:"signal"`
	TSLimit      num               `json:"ts_limit"`
	Z            num               `json:"z"`
	MADSmoothing num               `json:"mad_smoothing"`
	MAD          num               `json:"mad"`
	MSE          num               `json:"mse"`
	Sigma        num               `json:"sigma"`
	UCL          num               `json:"ucl"`
	LCL          num               `json:"lcl"`
	Periods      []trackPeriodJSON `json:"periods"`
	FVA          fvaJSON           `json:"fva"`
	Latest       latestJSON        `json:"latest"`
	Warnings     []string          `json:"warnings"`
}

func trackJSON(r trackReport) trackOutJSON {
	tp, tr := r.tp, r.tr
	c := tr.Config
	o := trackOutJSON{Scenario: tr.Scenario, Plan: tp.Name, PlanSource: r.source, Series: tp.Series, Units: tp.Units,
		Signal: c.Signal.String(), TSLimit: num(c.TSLimit), Z: num(c.Z), MADSmoothing: num(c.MADSmoothing),
		MAD: num(c.InitialMAD), MSE: num(c.MSE), Sigma: num(tr.Limits.Sigma), UCL: num(tr.Limits.UCL), LCL: num(tr.Limits.LCL),
		Periods: []trackPeriodJSON{}, Warnings: warningList(r.warnings),
	}
	for i, p := range tr.Points {
		rules := make([]string, len(p.Rules))
		for k, ru := range p.Rules {
			rules[k] = ru.String()
		}
		o.Periods = append(o.Periods, trackPeriodJSON{Period: tr.Periods[i].String(), Actual: num(p.Actual), Plan: num(p.Plan),
			Baseline: num(tr.Baseline[i]), Error: num(p.Error), CumError: num(p.CumError), MAD: num(p.MAD),
			TrackingSignal: num(p.TrackingSignal), SignalClean: num(p.SignalWithoutOutliers), Sigmas: num(p.Sigmas), Verdict: p.Verdict.String(), Rules: rules})
	}
	va := tr.ValueAdded
	o.FVA = fvaJSON{N: va.N, PlanMAD: num(va.PlanMAD), BaselineMAD: num(va.BaselineMAD), PlanBias: num(va.PlanBias),
		BaselineBias: num(va.BaselineBias), Improvement: num(va.Improvement), ImprovementShare: num(va.ImprovementShare)}
	per, last := tr.Latest()
	o.Latest = latestJSON{Period: per.String(), Verdict: last.Verdict.String(), Message: latestText(r)}
	return o
}

// trackCSV renders track.csv: one row per tracked period with the columns
// period, actual, plan, baseline, error, cum_error, mad, tracking_signal,
// sigmas, verdict and rules (rule names separated by spaces). Values have
// two decimals, the signal and the sigmas four.
func trackCSV(r trackReport) *report.Table {
	tr := r.tr
	var rows [][]string
	rows = append(rows, []string{"period", "actual", "plan", "baseline", "error", "cum_error", "mad", "tracking_signal", "sigmas", "verdict", "rules"})
	for i, p := range tr.Points {
		rules := make([]string, len(p.Rules))
		for k, ru := range p.Rules {
			rules[k] = ru.String()
		}
		rows = append(rows, []string{tr.Periods[i].String(), report.CSV2(p.Actual), report.CSV2(p.Plan), report.CSV2(tr.Baseline[i]), report.CSV2(p.Error),
			report.CSV2(p.CumError), report.CSV2(p.MAD), report.F4(p.TrackingSignal), report.F4(p.Sigmas), p.Verdict.String(), strings.Join(rules, " ")})
	}
	return csvTable(rows)
}

// ruleMark is the short note the control chart writes by a point where a
// run rule fired: WE1 to WE4. The tracking signal's rule is shown on the
// signal chart instead.
var ruleMark = map[forecast.Rule]string{
	forecast.RuleBeyondLimit: "WE1", forecast.RuleTwoOfThree: "WE2",
	forecast.RuleFourOfFive: "WE3", forecast.RuleEightInARow: "WE4",
}

// trackCharts lays out the control chart (the errors with their limits and
// the run rules that fired) and the tracking signal chart (the signal with
// its limits).
func trackCharts(r trackReport) (plots.ControlChart, plots.SignalChart) {
	tp, tr := r.tp, r.tr
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
