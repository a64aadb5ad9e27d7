package plots

import (
	"fmt"
	"slices"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot/vg"
)

// monthLabels returns n month labels from year y, month 1.
func monthLabels(y, n int) []string {
	ls := make([]string, n)
	for i := range ls {
		ls[i] = fmt.Sprintf("%04d-%02d", y+i/12, i%12+1)
	}
	return ls
}

// shownBy returns the labels each rule shows.
func shownBy(rules [][]bool, labels []string) [][]string {
	out := make([][]string, len(rules))
	for r, rule := range rules {
		for i, on := range rule {
			if on {
				out[r] = append(out[r], labels[i])
			}
		}
	}
	return out
}

func hasSet(sets [][]string, want []string) bool {
	for _, s := range sets {
		if slices.Equal(s, want) {
			return true
		}
	}
	return false
}

func TestPeriodRules(t *testing.T) {
	// Calendar facts below were checked with Python 3.11's datetime
	// (Debian /usr/bin/python3):
	//   date(2020,12,31).isocalendar() -> (2020, 53, 4): 2020 has an ISO week 53
	//   date(2021,1,4).isocalendar()   -> (2021, 1, 1)
	//   date(2025,12,29).weekday() -> 0 (Monday); date(2026,1,1).weekday() -> 3
	var iso []string
	for i := range 43 { // 2020-W40 .. 2021-W29
		d := time.Date(2020, 9, 28, 0, 0, 0, 0, time.UTC).AddDate(0, 0, 7*i)
		y, w := d.ISOWeek()
		iso = append(iso, fmt.Sprintf("%04d-W%02d", y, w))
	}
	var weeks []string
	for i := range 10 { // Mondays from 2025-12-01
		weeks = append(weeks, time.Date(2025, 12, 1, 0, 0, 0, 0, time.UTC).AddDate(0, 0, 7*i).Format("2006-01-02"))
	}
	var days []string
	for i := range 40 { // 2026-01-25 .. 2026-03-05
		days = append(days, time.Date(2026, 1, 25, 0, 0, 0, 0, time.UTC).AddDate(0, 0, i).Format("2006-01-02"))
	}
	quarters := []string{"2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4", "2027-Q1"}

	for _, tc := range []struct {
		name     string
		labels   []string
		wantName string
		want     [][]string // sets of labels some rule must show
	}{
		{
			name: "months", labels: monthLabels(2025, 24), wantName: "Month",
			want: [][]string{
				monthLabels(2025, 24),
				// Every 2, 3 and 6 months from January, then every year.
				{"2025-01", "2025-03", "2025-05", "2025-07", "2025-09", "2025-11", "2026-01", "2026-03", "2026-05", "2026-07", "2026-09", "2026-11"},
				{"2025-01", "2025-04", "2025-07", "2025-10", "2026-01", "2026-04", "2026-07", "2026-10"},
				{"2025-01", "2025-07", "2026-01", "2026-07"},
				{"2025-01", "2026-01"},
				// Every 2 years: only even years start a bucket.
				{"2026-01"},
			},
		},
		{
			// Every 13 weeks from week 1; week 53 of 2020 stays in the last
			// bucket of its year instead of standing alone.
			name: "ISO weeks", labels: iso, wantName: "Week (ISO)",
			want: [][]string{
				{"2020-W40", "2021-W01", "2021-W14", "2021-W27"},
				{"2021-W01"},
			},
		},
		{
			// Weeks labelled by their Monday: the week of 2025-12-29 holds
			// 1 January 2026, so it is the first week of the year.
			name: "week dates", labels: weeks, wantName: "Week",
			want: [][]string{
				{"2025-12-29"},
				// Months: the weeks holding 1 December 2025, 1 January
				// and 1 February 2026.
				{"2025-12-01", "2025-12-29", "2026-01-26"},
			},
		},
		{
			name: "days", labels: days, wantName: "Day",
			want: [][]string{
				{"2026-02-01", "2026-03-01"},
				{"2026-02-01", "2026-02-15", "2026-03-01"},
			},
		},
		{
			name: "quarters", labels: quarters, wantName: "Quarter",
			want: [][]string{
				quarters,
				{"2025-Q3", "2026-Q1", "2026-Q3", "2027-Q1"},
				{"2026-Q1", "2027-Q1"},
			},
		},
		{
			name: "not periods", labels: []string{"a", "b", "c", "d", "e"}, wantName: "Period",
			want: [][]string{{"a", "b", "c", "d", "e"}, {"a", "c", "e"}, {"a", "d"}},
		},
		{
			name: "mixed frequencies", labels: []string{"2026-01", "2026-Q1"}, wantName: "Period",
			want: [][]string{{"2026-01", "2026-Q1"}},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			rules, name := periodRules(tc.labels)
			if name != tc.wantName {
				t.Errorf("axis name %q, want %q", name, tc.wantName)
			}
			sets := shownBy(rules, tc.labels)
			for _, w := range tc.want {
				if !hasSet(sets, w) {
					t.Errorf("no rule shows %v; rules show %v", w, sets)
				}
			}
			for r := 1; r < len(rules); r++ {
				if slices.Equal(rules[r], rules[r-1]) {
					t.Errorf("rules %d and %d are the same", r-1, r)
				}
			}
		})
	}
}

func TestPickThinsWithoutOverlap(t *testing.T) {
	labels := monthLabels(2021, 72) // six years
	sty := textStyle(fontSans, sizeTick, colInk)
	for _, tc := range []struct {
		name  string
		width vg.Length
		want  []string // the shown labels, when fixed by the width
	}{
		// 72 slots of 40 points: a 7-character label is about 33 points
		// wide, so every month fits with the 6-point gap.
		{name: "wide", width: 72 * 40},
		// 7 inches: every 6 months (January and July).
		{name: "page", width: 7 * vg.Inch},
		// 2 inches: years would be about 24 points apart, too close for
		// 33-point labels, so every 2 years.
		{name: "narrow", width: 2 * vg.Inch, want: []string{"2022-01", "2024-01", "2026-01"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			pt := newPeriodTicks(labels, false)
			pt.width, pt.style = tc.width, sty
			var shown []string
			var at []float64
			for _, tk := range pt.Ticks(-0.5, float64(len(labels))-0.5) {
				if !tk.IsMinor() {
					shown = append(shown, tk.Label)
					at = append(at, tk.Value)
				}
			}
			if tc.want != nil && !slices.Equal(shown, tc.want) {
				t.Errorf("shown %v, want %v", shown, tc.want)
			}
			slot := tc.width / vg.Length(len(labels))
			for k := 1; k < len(shown); k++ {
				gap := vg.Length(at[k]-at[k-1])*slot - (sty.Width(shown[k])+sty.Width(shown[k-1]))/2
				if gap < vg.Points(6) {
					t.Errorf("%s and %s are %.1f points apart, want at least 6", shown[k-1], shown[k], gap.Points())
				}
			}
			// When more than one label per year shows, every January does.
			if len(shown) > 6 {
				for y := 2021; y <= 2026; y++ {
					if !slices.Contains(shown, fmt.Sprintf("%d-01", y)) {
						t.Errorf("%d-01 missing from %v", y, shown)
					}
				}
			}
			if tc.name == "wide" && len(shown) != 72 {
				t.Errorf("wide: %d labels shown, want all 72", len(shown))
			}
			if tc.name == "page" && !slices.Equal(shown[:3], []string{"2021-01", "2021-07", "2022-01"}) {
				t.Errorf("page: shown %v, want every 6 months", shown)
			}
		})
	}
}

func TestIndexSteps(t *testing.T) {
	got := indexSteps(45)
	want := []int{1, 2, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 30, 40, 50}
	if !slices.Equal(got, want) {
		t.Errorf("indexSteps(45) = %v, want %v", got, want)
	}
}

func TestWrapLabel(t *testing.T) {
	sty := textStyle(fontSans, sizeTick, colInk)
	got := wrapLabel("Plant shutdown payback", sty.Width("shutdown")+1, sty)
	if want := "Plant\nshutdown\npayback"; got != want {
		t.Errorf("wrapLabel = %q, want %q", got, want)
	}
	if got := wrapLabel("Cheese contract", vg.Inch, sty); strings.Contains(got, "\n") {
		t.Errorf("wrapLabel wrapped %q though it fits", got)
	}
}
