package report

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"forelay/forecast"
	"forelay/plots"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// TestPlanChartWindows checks the windows of the demo plan's chart: each
// event shaded over whole periods, and the past events cleaned out of the
// history marked on the history shown.
func TestPlanChartWindows(t *testing.T) {
	c := PlanChart(loadPlan(t, "../../examples/dairy/plan.yaml"))
	at := func(label string) float64 {
		i := slices.Index(c.Labels, label)
		if i < 0 {
			t.Fatalf("no label %s", label)
		}
		return float64(i)
	}
	type win struct {
		label    string
		from, to string // first and last period shaded
	}
	check := func(what string, got []plots.Window, want []win) {
		t.Helper()
		if len(got) != len(want) {
			t.Fatalf("%s: %v, want %v", what, got, want)
		}
		for k, w := range want {
			// Whole periods: from half a period before the first to half
			// a period after the last.
			if got[k].Label != w.label || got[k].From != at(w.from)-0.5 || got[k].To != at(w.to)+0.5 {
				t.Errorf("%s %d: %+v, want %s over %s to %s", what, k, got[k], w.label, w.from, w.to)
			}
		}
	}
	// examples/dairy/plan.yaml: the contract ramps over 3 months from
	// 2027-02, the grocer leaves over 2 from 2027-05, the fair is one month.
	check("window", c.Windows, []win{
		{"school-milk-contract", "2027-02", "2027-04"},
		{"grocer-exit", "2027-05", "2027-06"},
		{"harvest-fair", "2027-08", "2027-08"},
	})
	// The history shown is the 36 months 2023-11 to 2026-10; the fair's
	// past dates in it are 2024-08, 2025-09 and 2026-08 (2019-08 to
	// 2023-09 lie before it), and the storm took 2025-07 and 2025-08.
	// Estimates come in file order: the fair's occurrences, then the storm.
	if c.Labels[0] != "2023-11" || c.ForecastStart != 36 {
		t.Fatalf("history shown from %s over %d months, want 2023-11 over 36", c.Labels[0], c.ForecastStart)
	}
	check("past", c.Past, []win{
		{"harvest-fair", "2024-08", "2024-08"},
		{"harvest-fair", "2025-09", "2025-09"},
		{"harvest-fair", "2026-08", "2026-08"},
		{"storm-outage-2025", "2025-07", "2025-08"},
	})
}

// TestChartHistoryWindow checks how much history the plan chart shows
// before a weekly and a daily plan: two years of weeks and twelve weeks of
// days, out of a longer history.
func TestChartHistoryWindow(t *testing.T) {
	for _, tc := range []struct {
		period string
		start  forecast.Period
		n      int
		want   int
	}{
		{"week", forecast.PeriodOf(forecast.Weekly, time.Date(2021, 1, 4, 0, 0, 0, 0, time.UTC)), 260, 104},
		{"day", forecast.PeriodOf(forecast.Daily, time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC)), 365, 84},
	} {
		t.Run(tc.period, func(t *testing.T) {
			dir := t.TempDir()
			var b strings.Builder
			b.WriteString("period,units\n")
			for i := range tc.n {
				// A seasonal pattern with a period of 7 and of 52.
				v := 1000 + 100*math.Sin(2*math.Pi*float64(i)/52) + 30*math.Sin(2*math.Pi*float64(i)/7)
				fmt.Fprintf(&b, "%s,%.0f\n", tc.start.Add(i), v)
			}
			write(t, filepath.Join(dir, "history.csv"), b.String())
			write(t, filepath.Join(dir, "plan.yaml"), fmt.Sprintf(
				"plan: w\nhistory: {file: history.csv, period: %s}\nhorizon: 26\nbaseline: {method: seasonal-naive}\n", tc.period))
			c := PlanChart(loadPlan(t, filepath.Join(dir, "plan.yaml")))
			if c.ForecastStart != tc.want || len(c.Labels) != tc.want+26 {
				t.Errorf("%d periods of history and %d labels, want %d and %d", c.ForecastStart, len(c.Labels), tc.want, tc.want+26)
			}
			if want := tc.start.Add(tc.n - tc.want).String(); c.Labels[0] != want {
				t.Errorf("first label %s, want %s", c.Labels[0], want)
			}
		})
	}
}

func write(t *testing.T, path, s string) {
	t.Helper()
	if err := os.WriteFile(path, []byte(s), 0o644); err != nil {
		t.Fatal(err)
	}
}

// loadPlan loads the scenario file at path and builds its plan.
func loadPlan(t *testing.T, path string) *plan.Plan {
	t.Helper()
	f, err := scenario.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	p, err := plan.Load(f)
	if err != nil {
		t.Fatal(err)
	}
	return p
}
