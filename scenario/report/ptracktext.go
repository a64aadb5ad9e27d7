package report

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
)

// portfolioTrackText writes the text report of a portfolio's tracking.
func portfolioTrackText(w *Text, t PortfolioTrack) {
	pt, tr := t.Plan, t.Tracking
	c := tr.Config
	units := unitsSuffix(pt.Units)
	first, last := trackedSpan(tr)
	fmt.Fprintf(w, "Tracking plan %s against scenario %s: %d of %d series, %s periods %s to %s%s\n",
		pt.Name, tr.Scenario, len(tr.Series), len(pt.Series), pt.Periods[0].Freq, first, last, InUnits(pt.Units))
	fmt.Fprintf(w, "plan: %s\n", t.Source)
	fmt.Fprintln(w, "Limits in force:")
	for _, l := range [...][2]string{
		{"tracking signal", signalText(Track{Tracking: &plan.Tracking{Config: c}, DefaultLimit: t.DefaultLimit})},
		{"MAD", fmt.Sprintf("each series starts at its baseline's in-sample MAD, then MAD_t = %s |error_t| + %s MAD_t-1",
			G3(c.MADSmoothing), G3(1-c.MADSmoothing))},
		{"control chart", fmt.Sprintf("+-%s sigma; a series' sigma = sqrt(its in-sample MSE), a roll-up's = sqrt(variance of its sum at lead 1)", G3(c.Z))},
	} {
		fmt.Fprintf(w, "  %-15s  %s\n", l[0], l[1])
	}
	fmt.Fprintln(w)
	if len(tr.Series) > 0 {
		n := verdictCounts(tr)
		parts := make([]string, len(verdictOrder))
		for i, v := range verdictOrder {
			parts[i] = fmt.Sprintf("%d %s", n[v], v)
		}
		fmt.Fprintf(w, "Latest period of each series: %s (of %d series tracked)\n", strings.Join(parts, ", "), len(tr.Series))
		flaggedText(w, tr, units, n[forecast.Bias]+n[forecast.Outlier], t.InPage)
	}
	rollupTrackText(w, t, units)
	if total := totalTrack(t); total != nil {
		fmt.Fprintln(w)
		fmt.Fprintln(w, "Total: "+latestText(*total))
	}
	writeNotesAndCaution(w, tr.Notes)
}

// trackedSpan returns the first tracked period and the latest one of any
// series or roll-up.
func trackedSpan(tr *plan.PortfolioTracking) (first, last forecast.Period) {
	all := make([]*plan.Tracking, 0, len(tr.Series)+len(tr.Rollups))
	for _, s := range tr.Series {
		all = append(all, s.Tracking)
	}
	for _, r := range tr.Rollups {
		all = append(all, r.Tracking)
	}
	for _, x := range all {
		per, _ := x.Latest()
		if first.IsZero() {
			first, last = x.Periods[0], per
		}
		if last.Before(per) {
			last = per
		}
	}
	return first, last
}

// flaggedText lists the series whose latest verdict is bias or outlier,
// the TopFlagged largest tracking signals first.
func flaggedText(w *Text, tr *plan.PortfolioTracking, units string, flagged int, inPage bool) {
	if flagged == 0 {
		fmt.Fprintln(w, "No series shows bias or an outlier in its latest period.")
		return
	}
	fmt.Fprintln(w)
	shown := min(flagged, TopFlagged)
	every := "; every series in track-summary.csv"
	if inPage {
		every = ""
	}
	fmt.Fprintf(w, "Series with bias or an outlier in their latest period (%d of %d, by |tracking signal|%s):\n",
		shown, flagged, every)
	sdec := signalDecimals(tr.Config)
	tb := NewTable("series", "period", "verdict", "actual"+units, "plan"+units, "error"+units, "cum. error"+units,
		"tracking signal", "sigmas", "rules").Left(0, 1, 2, 9)
	n := 0
	for _, s := range rankedSeries(tr) {
		per, p := s.Latest()
		if p.Verdict == forecast.InControl {
			continue
		}
		if n++; n > shown {
			break
		}
		dec := forecast.SpreadDecimals(s.Plan.MAD)
		tb.AddRow(s.Plan.Series, per.String(), p.Verdict.String(), num(p.Actual, dec), num(p.Plan, dec), Signed(p.Error, dec),
			Signed(p.CumError, dec), Signed(p.TrackingSignal, sdec), Signed(p.Sigmas, 2), rulesText(p.Rules))
	}
	w.Add(tb)
}

// rollupTrackText writes the roll-ups tracked, each on its latest period.
func rollupTrackText(w *Text, t PortfolioTrack, units string) {
	tr := t.Tracking
	if len(tr.Rollups) == 0 {
		return
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Roll-ups, each tracked as one series (error = the sum of its series' errors; sigma = sqrt of the variance of the sum at lead 1):")
	sdec := signalDecimals(tr.Config)
	tb := NewTable("group", "series", "period", "sigma"+units, "actual"+units, "plan"+units, "cum. error"+units,
		"tracking signal", "sigmas", "verdict", "rules").Left(0, 2, 9, 10)
	for _, ru := range tr.Rollups {
		per, p := ru.Latest()
		dec := forecast.SpreadDecimals(ru.Plan.MAD)
		tb.AddRow(ru.Label(), fmt.Sprint(len(ru.Members)), per.String(), num(ru.Limits.Sigma, dec), num(p.Actual, dec), num(p.Plan, dec),
			Signed(p.CumError, dec), Signed(p.TrackingSignal, sdec), Signed(p.Sigmas, 2), p.Verdict.String(), rulesText(p.Rules))
	}
	w.Add(tb)
}
