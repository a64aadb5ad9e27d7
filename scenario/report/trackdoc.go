package report

import "forelay/forecast"

// The JSON shape of "forelay track --json". Field names are documented in
// the README (section "track"); keep them stable.

type trackPeriodJSON struct {
	Period         string   `json:"period"`
	Actual         Num      `json:"actual"`
	Plan           Num      `json:"plan"`
	Baseline       Num      `json:"baseline"`
	Error          Num      `json:"error"`
	CumError       Num      `json:"cum_error"`
	MAD            Num      `json:"mad"`
	TrackingSignal Num      `json:"tracking_signal"`
	SignalClean    Num      `json:"signal_without_outliers"`
	Sigmas         Num      `json:"sigmas"`
	Verdict        string   `json:"verdict"`
	Rules          []string `json:"rules"`
}

type fvaJSON struct {
	N                int `json:"n"`
	PlanMAD          Num `json:"plan_mad"`
	BaselineMAD      Num `json:"baseline_mad"`
	PlanBias         Num `json:"plan_bias"`
	BaselineBias     Num `json:"baseline_bias"`
	Improvement      Num `json:"improvement"`
	ImprovementShare Num `json:"improvement_share"`
}

type latestJSON struct {
	Period  string `json:"period"`
	Verdict string `json:"verdict"`
	Message string `json:"message"`
}

// TrackDoc is the JSON document of a tracking run.
type TrackDoc struct {
	Scenario     string            `json:"scenario"`
	Plan         string            `json:"plan"`
	PlanSource   string            `json:"plan_source"`
	Series       string            `json:"series"`
	Units        string            `json:"units,omitempty"`
	Signal       string            `json:"signal"`
	TSLimit      Num               `json:"ts_limit"`
	Z            Num               `json:"z"`
	MADSmoothing Num               `json:"mad_smoothing"`
	MAD          Num               `json:"mad"`
	MSE          Num               `json:"mse"`
	Sigma        Num               `json:"sigma"`
	UCL          Num               `json:"ucl"`
	LCL          Num               `json:"lcl"`
	Periods      []trackPeriodJSON `json:"periods"`
	FVA          fvaJSON           `json:"fva"`
	Latest       latestJSON        `json:"latest"`
	Warnings     []string          `json:"warnings"`
}

// trackDoc returns the JSON document of t.
func trackDoc(t Track) TrackDoc {
	tp, tr := t.Plan, t.Tracking
	c := tr.Config
	o := TrackDoc{Scenario: tr.Scenario, Plan: tp.Name, PlanSource: t.Source, Series: tp.Series, Units: tp.Units,
		Signal: c.Signal.String(), TSLimit: Num(c.TSLimit), Z: Num(c.Z), MADSmoothing: Num(c.MADSmoothing),
		MAD: Num(c.InitialMAD), MSE: Num(c.MSE), Sigma: Num(tr.Limits.Sigma), UCL: Num(tr.Limits.UCL), LCL: Num(tr.Limits.LCL),
		Periods: trackPeriods(tr), FVA: fvaOf(tr.ValueAdded), Warnings: List(t.Warnings),
	}
	per, last := tr.Latest()
	o.Latest = latestJSON{Period: per.String(), Verdict: last.Verdict.String(), Message: latestText(t)}
	return o
}

// fvaOf returns the forecast value added as JSON.
func fvaOf(va forecast.ValueAdded) fvaJSON {
	return fvaJSON{N: va.N, PlanMAD: Num(va.PlanMAD), BaselineMAD: Num(va.BaselineMAD), PlanBias: Num(va.PlanBias),
		BaselineBias: Num(va.BaselineBias), Improvement: Num(va.Improvement), ImprovementShare: Num(va.ImprovementShare)}
}

// ruleNames returns the names of rules, an empty list for none.
func ruleNames(rules []forecast.Rule) []string {
	names := make([]string, len(rules))
	for i, r := range rules {
		names[i] = r.String()
	}
	return names
}
