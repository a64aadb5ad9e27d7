package report

import (
	"fmt"

	"forelay/forecast"
	"forelay/scenario"
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
