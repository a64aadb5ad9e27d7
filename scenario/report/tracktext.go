package report

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"forelay/forecast"
)

// trackText writes the text report of a tracking run.
func trackText(w *Text, t Track) {
	tp, tr := t.Plan, t.Tracking
	c := tr.Config
	units := unitsSuffix(tp.Units)
	dec := forecast.SpreadDecimals(tp.MAD)
	n := len(tr.Points)
	fmt.Fprintf(w, "Tracking %s against scenario %s of plan %s: %d %s period(s) %s to %s%s\n",
		tp.Series, tr.Scenario, tp.Name, n, tr.Periods[0].Freq, tr.Periods[0], tr.Periods[n-1], InUnits(tp.Units))
	fmt.Fprintf(w, "plan: %s\n", t.Source)
	fmt.Fprintln(w, "Limits in force:")
	for _, l := range [...][2]string{
		{"tracking signal", signalText(t)},
		{"MAD", fmt.Sprintf("starts at %s%s (the baseline's in-sample MAD), then MAD_t = %s |error_t| + %s MAD_t-1",
			num(tp.MAD, dec), units, G3(c.MADSmoothing), G3(1-c.MADSmoothing))},
		{"control chart", fmt.Sprintf("sigma = sqrt(MSE) = %s%s; UCL %s, LCL %s%s (z = %s)",
			num(tr.Limits.Sigma, dec), units, Signed(tr.Limits.UCL, dec), Signed(tr.Limits.LCL, dec), units, G3(c.Z))},
	} {
		fmt.Fprintf(w, "  %-15s  %s\n", l[0], l[1])
	}
	fmt.Fprintln(w)

	sdec := signalDecimals(c)
	tb := NewTable("period", "actual", "plan", "error", "cum. error", "MAD", "tracking signal", "sigmas", "verdict", "rules").Left(8, 9)
	for i, p := range tr.Points {
		tb.AddRow(tr.Periods[i].String(), num(p.Actual, dec), num(p.Plan, dec), Signed(p.Error, dec), Signed(p.CumError, dec),
			num(p.MAD, dec), Signed(p.TrackingSignal, sdec), Signed(p.Sigmas, 2), p.Verdict.String(), rulesText(p.Rules))
	}
	w.Add(tb)
	fmt.Fprintln(w)

	va := tr.ValueAdded
	fmt.Fprintf(w, "Forecast value added over %d period(s) (error = actual - forecast):\n", va.N)
	ft := NewTable("", "MAD", "bias")
	ft.AddRow("  adjusted plan", num(va.PlanMAD, dec), Signed(va.PlanBias, dec))
	ft.AddRow("  baseline", num(va.BaselineMAD, dec), Signed(va.BaselineBias, dec))
	w.Add(ft)
	fmt.Fprintln(w, fvaText(t, dec))
	fmt.Fprintln(w)
	fmt.Fprintln(w, latestText(t))
}

// signalDecimals is the number of decimals of the tracking signal: 3 for
// the smoothed signal, which lies within +-1, and 2 for the cumulative one.
func signalDecimals(c forecast.TrackConfig) int {
	if c.Signal == forecast.SignalSmoothed {
		return 3
	}
	return 2
}

// signalText describes the tracking signal and its limit.
func signalText(t Track) string {
	c := t.Tracking.Config
	if c.Signal == forecast.SignalSmoothed {
		s := fmt.Sprintf("Trigg's smoothed error / MAD (smoothing %s); alarm beyond +-%s", G3(c.MADSmoothing), G3(c.TSLimit))
		if t.DefaultLimit {
			s += " (the 95% limit for this smoothing)"
		}
		return s
	}
	return fmt.Sprintf("cumulative error / MAD; alarm beyond +-%s", G3(c.TSLimit))
}

// fvaText says whether the events helped.
func fvaText(t Track, dec int) string {
	tr := t.Tracking
	va := tr.ValueAdded
	units := unitsSuffix(t.Plan.Units)
	share := ""
	if !math.IsNaN(va.ImprovementShare) {
		share = fmt.Sprintf(" (%s%% of the baseline's)", num(100*math.Abs(va.ImprovementShare), 1))
	}
	switch {
	case tr.Unchanged():
		return fmt.Sprintf("Scenario %s changes nothing on these periods: the adjusted plan is the baseline.", tr.Scenario)
	case va.Improvement > 0:
		return fmt.Sprintf("The events helped: they cut the MAD by %s%s%s.", num(va.Improvement, dec), units, share)
	case va.Improvement < 0:
		return fmt.Sprintf("The events did not help: they raised the MAD by %s%s%s.", num(-va.Improvement, dec), units, share)
	}
	return "The events made no difference to the MAD on these periods."
}

// latestText is the verdict on the latest period in plain words.
func latestText(t Track) string {
	per, p := t.Tracking.Latest()
	c := t.Tracking.Config
	sdec := signalDecimals(c)
	var why []string
	side := p.Sigmas
	for _, rule := range p.Rules {
		switch rule {
		case forecast.RuleTrackingSignal:
			w := fmt.Sprintf("tracking signal %s beyond +-%s", Signed(p.TrackingSignal, sdec), G3(c.TSLimit))
			if p.Verdict == forecast.Outlier {
				w += fmt.Sprintf(", but %s without the %s", Signed(p.SignalWithoutOutliers, sdec), outlierPeriods(t))
			}
			why = append(why, w)
			side = p.TrackingSignal
		case forecast.RuleBeyondLimit:
			why = append(why, fmt.Sprintf("error %s sigma, beyond the %s-sigma limit", Signed(p.Sigmas, 2), G3(c.Z)))
		case forecast.RuleTwoOfThree:
			why = append(why, "two of the last three errors beyond 2 sigma on one side (we2)")
		case forecast.RuleFourOfFive:
			why = append(why, "four of the last five errors beyond 1 sigma on one side (we3)")
		case forecast.RuleEightInARow:
			why = append(why, "eight errors in a row on one side (we4)")
		}
	}
	dir := "actuals above the plan"
	if side < 0 {
		dir = "actuals below the plan"
	}
	switch p.Verdict {
	case forecast.Bias:
		return fmt.Sprintf("%s: bias: %s (%s); re-forecast.", per, strings.Join(why, "; "), dir)
	case forecast.Outlier:
		return fmt.Sprintf("%s: outlier: %s (%s) with no sign of drift; check for an unplanned event.", per, strings.Join(why, "; "), dir)
	}
	return fmt.Sprintf("%s: in-control: tracking signal %s within +-%s, error %s sigma; no action needed.",
		per, Signed(p.TrackingSignal, sdec), G3(c.TSLimit), Signed(p.Sigmas, 2))
}

// outlierPeriods names the tracked periods whose error lies beyond the
// control limits: "error beyond the limits in 2027-01" or "errors beyond
// the limits in 2027-01, 2027-03".
func outlierPeriods(t Track) string {
	var per []string
	for i, p := range t.Tracking.Points {
		if slices.Contains(p.Rules, forecast.RuleBeyondLimit) {
			per = append(per, t.Tracking.Periods[i].String())
		}
	}
	if len(per) == 1 {
		return "error beyond the limits in " + per[0]
	}
	return "errors beyond the limits in " + strings.Join(per, ", ")
}

// rulesText lists rule names, "-" for none.
func rulesText(rules []forecast.Rule) string {
	if len(rules) == 0 {
		return "-"
	}
	return strings.Join(ruleNames(rules), ", ")
}

// ruleMark is the short note the control chart writes by a point where a
// run rule fired: WE1 to WE4. The tracking signal's rule is shown on the
// signal chart instead.
var ruleMark = map[forecast.Rule]string{
	forecast.RuleBeyondLimit: "WE1", forecast.RuleTwoOfThree: "WE2",
	forecast.RuleFourOfFive: "WE3", forecast.RuleEightInARow: "WE4",
}
