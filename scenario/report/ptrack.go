package report

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"strings"

	"forelay/forecast"
	"forelay/scenario/plan"
)

// TopFlagged is how many series with bias or outliers the text of a
// portfolio's tracking lists; track-summary.csv ranks every series.
const TopFlagged = 20

// A PortfolioTrack is the tracking of a portfolio to report.
type PortfolioTrack struct {
	Plan     *plan.PortfolioTrackPlan
	Tracking *plan.PortfolioTracking
	// Source says where the plan came from: "read from out/plan.json" or
	// "recomputed from plan.yaml".
	Source string
	// DefaultLimit is true when the tracking signal's limit is the
	// signal's default rather than one asked for.
	DefaultLimit bool
	// Warnings are the portfolio's warnings (or those about the inputs of
	// a saved plan), then those about the actuals.
	Warnings []string
	// InPage is set when the report goes into a page without its CSV
	// files (the handover report): the text then points to no file.
	InPage bool
}

// ForPortfolioTrack returns the report of "forelay track" on a portfolio:
// the text (the limits, the count of series per verdict of the latest
// period, the series with bias or outliers ranked by the size of their
// tracking signal, the roll-ups tracked as one series each, and the
// verdict on the total), its JSON document (kind "portfolio-track"),
// track.csv (every series and period), track-rollups.csv (every roll-up
// and period), track-summary.csv (every series ranked) and the control
// and signal charts of the total (none when the total is not tracked).
func ForPortfolioTrack(t PortfolioTrack) *Report {
	r := &Report{Name: "track", NoJSONFile: true, Warnings: t.Warnings, Doc: portfolioTrackDoc(t),
		CSV:        portfolioTrackCSV(t),
		MoreCSV:    []CSVFile{{"track-rollups", rollupTrackCSV(t)}, {"track-summary", trackSummaryCSV(t)}},
		MoreTables: portfolioTrackTables(t)}
	if total := totalTrack(t); total != nil {
		control, signal := trackCharts(*total)
		r.Charts = []Chart{{Name: "control", Plot: control}, {Name: "signal", Plot: signal}}
	}
	portfolioTrackText(&r.Text, t)
	return r
}

// totalTrack returns the total's tracking as that of one series, or nil
// when the total is not tracked.
func totalTrack(t PortfolioTrack) *Track {
	for _, ru := range t.Tracking.Rollups {
		if ru.Depth == 0 {
			return &Track{Plan: ru.Plan, Tracking: ru.Tracking, Source: t.Source, DefaultLimit: t.DefaultLimit}
		}
	}
	return nil
}

// rankedSeries returns the tracked series ordered by the size of the
// tracking signal of their latest period, largest first, ties by name.
func rankedSeries(tr *plan.PortfolioTracking) []plan.SeriesTracking {
	out := slices.Clone(tr.Series)
	slices.SortStableFunc(out, func(a, b plan.SeriesTracking) int {
		_, pa := a.Latest()
		_, pb := b.Latest()
		if c := cmp.Compare(math.Abs(pb.TrackingSignal), math.Abs(pa.TrackingSignal)); c != 0 {
			return c
		}
		return strings.Compare(a.Plan.Series, b.Plan.Series)
	})
	return out
}

// trackRow is one tracked period as CSV cells: period, actual, plan,
// baseline, error, cum_error, mad, tracking_signal, sigmas, verdict and
// rules, as in track.csv of one series.
func trackRow(tr *plan.Tracking, i int) []string {
	p := tr.Points[i]
	return []string{tr.Periods[i].String(), CSV2(p.Actual), CSV2(p.Plan), CSV2(tr.Baseline[i]), CSV2(p.Error),
		CSV2(p.CumError), CSV2(p.MAD), F4(p.TrackingSignal), F4(p.Sigmas), p.Verdict.String(), strings.Join(ruleNames(p.Rules), " ")}
}

// trackHead is the head of trackRow's cells, and trackKinds their kinds.
var (
	trackHead  = []string{"period", "actual", "plan", "baseline", "error", "cum_error", "mad", "tracking_signal", "sigmas", "verdict", "rules"}
	trackKinds = []Kind{Label, Quantity, Quantity, Quantity, Quantity, Quantity, Quantity, Ratio, Ratio, Label, Label}
)

// portfolioTrackCSV is track.csv of a portfolio: one row per tracked
// series and period, series in the portfolio's order, with the column
// series before those of track.csv of one series.
func portfolioTrackCSV(t PortfolioTrack) *Table {
	tb := (&Table{Head: append([]string{"series"}, trackHead...)}).Typed(kindsOf([]Kind{Label}, trackKinds)...)
	for _, s := range t.Tracking.Series {
		for i := range s.Points {
			tb.Rows = append(tb.Rows, append([]string{s.Plan.Series}, trackRow(s.Tracking, i)...))
		}
	}
	return tb
}

// rollupTrackCSV is track-rollups.csv: one row per tracked roll-up and
// period, with the columns level, group, members, sigma, then those of
// track.csv of one series.
func rollupTrackCSV(t PortfolioTrack) *Table {
	tb := (&Table{Head: append([]string{"level", "group", "members", "sigma"}, trackHead...)}).
		Typed(kindsOf([]Kind{Label, Label, Count, Quantity}, trackKinds)...)
	for _, ru := range t.Tracking.Rollups {
		for i := range ru.Points {
			tb.Rows = append(tb.Rows, append([]string{ru.Level, ru.Group, fmt.Sprint(len(ru.Members)), CSV2(ru.Limits.Sigma)}, trackRow(ru.Tracking, i)...))
		}
	}
	return tb
}

// trackSummaryCSV is track-summary.csv: every tracked series ranked by
// the size of its latest tracking signal (rank 1 the largest; ties by
// name), with the columns rank, series, periods (the number tracked),
// then the latest period's cells as in track.csv.
func trackSummaryCSV(t PortfolioTrack) *Table {
	tb := (&Table{Head: append([]string{"rank", "series", "periods"}, trackHead...)}).Typed(kindsOf([]Kind{Count, Label, Count}, trackKinds)...)
	for i, s := range rankedSeries(t.Tracking) {
		n := len(s.Points)
		tb.Rows = append(tb.Rows, append([]string{fmt.Sprint(i + 1), s.Plan.Series, fmt.Sprint(n)}, trackRow(s.Tracking, n-1)...))
	}
	return tb
}

// verdictCounts counts the tracked series by the verdict of their latest
// period.
func verdictCounts(tr *plan.PortfolioTracking) map[forecast.Verdict]int {
	n := map[forecast.Verdict]int{}
	for _, s := range tr.Series {
		_, p := s.Latest()
		n[p.Verdict]++
	}
	return n
}

// verdictOrder is the order verdicts are listed in.
var verdictOrder = []forecast.Verdict{forecast.InControl, forecast.Bias, forecast.Outlier}

// PortfolioAlert returns the message of --fail-on NAME on a portfolio's
// tracking when the latest verdict of a series or roll-up is one of
// verdicts ("--fail-on any: the latest verdict is bias or outlier in 2
// series or roll-ups: a, b"), or "" when none is. name is the flag's
// value.
func PortfolioAlert(tr *plan.PortfolioTracking, verdicts []forecast.Verdict, name string) string {
	hit := tr.Matching(verdicts)
	if len(hit) == 0 {
		return ""
	}
	words := make([]string, len(verdicts))
	for i, v := range verdicts {
		words[i] = v.String()
	}
	const shown = 10
	list := strings.Join(hit[:min(shown, len(hit))], ", ")
	if len(hit) > shown {
		list += fmt.Sprintf(" and %d more", len(hit)-shown)
	}
	return fmt.Sprintf("--fail-on %s: the latest verdict is %s in %d %s: %s", name, strings.Join(words, " or "),
		len(hit), Plural(len(hit), "series or roll-up", "series or roll-ups"), list)
}
