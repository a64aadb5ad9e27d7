package report

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// Check returns the report of "forelay check": the summary of a scenario
// file that passed its checks against the history ser, and its warnings.
// Its document is written as one line of JSON.
func Check(path string, f *scenario.File, ser forecast.Series, warnings []string) *Report {
	past := 0
	for _, e := range f.Events {
		if e.IsPast(ser.Next()) {
			past++
		}
	}
	r := &Report{Name: "check", Warnings: warnings, Compact: true, Doc: map[string]any{"file": path, "ok": true, "plan": f.Plan, "series": ser.Name,
		"period": ser.Freq().String(), "n": ser.Len(), "events": len(f.Events), "past_events": past,
		"scenarios": len(f.Cases()), "horizon": f.Horizon, "warnings": List(warnings)}}
	fmt.Fprintf(&r.Text, "%s: ok: plan %s, series %s (%d %s periods, %s to %s), %d event(s) of which %d past, %d scenario(s), horizon %d\n",
		path, f.Plan, ser.Name, ser.Len(), ser.Freq(), ser.Start, ser.Period(ser.Len()-1), len(f.Events), past, len(f.Cases()), f.Horizon)
	return r
}

// CheckPortfolio is the report of "forelay check" on a scenario file that
// plans several series (plan.WantsPortfolio): the series to plan (as
// plan.CheckPortfolio returns them; the first stands for the periods they
// share), those the scopes create, the levels, events, scenarios and
// resources. Its JSON document has kind "portfolio" and series_count in
// place of series.
func CheckPortfolio(path string, f *scenario.File, in *plan.Inputs, planned []forecast.Series, warnings []string) *Report {
	names := make([]string, len(planned))
	for i, s := range planned {
		names[i] = s.Name
	}
	created := f.NewSeries(names)
	levels := in.Levels
	ser := planned[0]
	r := &Report{Name: "check", Warnings: warnings, Compact: true, Doc: map[string]any{"file": path, "ok": true, "kind": "portfolio",
		"plan": f.Plan, "series_count": len(planned), "new_series": len(created), "levels": List(levels),
		"period": ser.Freq().String(), "end": ser.Period(ser.Len() - 1).String(), "events": len(f.Events),
		"scenarios": len(f.Cases()), "resources": len(f.AllResources()), "horizon": f.Horizon, "warnings": List(warnings)}}
	fmt.Fprintf(&r.Text, "%s: ok: plan %s, %d series (and %d new) at %d level(s) (%s), %s periods to %s, %d event(s), %d scenario(s), %d resource(s), horizon %d\n",
		path, f.Plan, len(planned), len(created), len(levels), strings.Join(levels, ", "), ser.Freq(), ser.Period(ser.Len()-1),
		len(f.Events), len(f.Cases()), len(f.AllResources()), f.Horizon)
	return r
}
