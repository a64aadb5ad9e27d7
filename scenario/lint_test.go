package scenario

import (
	"fmt"
	"strings"
	"testing"

	"forelay/forecast"
)

func TestLint(t *testing.T) {
	// The history runs 2024-01 to 2026-10 (34 months); the horizon of 18
	// runs 2026-11 to 2028-04.
	hist := forecast.Series{Name: "milk", Start: period("2024-01", forecast.Monthly), Values: make([]float64, 34)}
	const top = "plan: p\nhistory: {file: h.csv}\nhorizon: 18\nunits: litres\nevents:\n"
	for _, tc := range []struct {
		name string
		src  string // § marks the position of the warning; none: no warning
		want string // the warning after "plan.yaml:line:col: "
	}{
		{"after the horizon", "  - {id: late, kind: step, start: §2028-05, effect: {units: 10}}\n",
			`event "late": start: 2028-05 lies after the horizon (2026-11 to 2028-04), so the event adds nothing to the plan. Check the year, or lengthen horizon to reach it.`},
		// A payback that reaches into the horizon counts.
		{"payback reaches the horizon", "  - {id: a, kind: pulse, start: 2026-10, effect: {units: 10}, payback: {share: 1}}\n", ""},
		{"last period of the horizon", "  - {id: a, kind: pulse, start: 2028-04, effect: {units: 10}}\n", ""},
		// After the horizon, but cleaned out of the history through its
		// past occurrence: no warning.
		{"after the horizon with a past", "  - {id: a, kind: pulse, start: 2028-08, effect: {from: past}, past: [2025-08]}\n", ""},
		{"before the history", "  - {id: old, kind: pulse, start: 2023-03, end: §2023-05}\n",
			`event "old": end: the event (2023-03 to 2023-05) lies before the history (2024-01 to 2026-10), so it is neither cleaned out of the history nor in the plan. Check the dates, or remove the event.`},
		{"before the history, by periods", "  - {id: old, kind: pulse, start: §2023-11, periods: 2}\n",
			`event "old": start: the event (2023-11 to 2023-12) lies before the history`},
		// A past occurrence before the history, the others inside it.
		{"old occurrence", "  - {id: fair, kind: pulse, start: 2027-08, effect: {from: past}, past: [§2023-08, 2024-08, 2025-08]}\n",
			`event "fair": past[0]: 2023-08 lies before the history (2024-01 to 2026-10), so there is nothing to clean out and nothing to learn from it. Remove it, or check the year.`},
		// A step without end that began before the history is in today's
		// level: no warning.
		{"open step before the history", "  - {id: old, kind: step, start: 2023-03, effect: {units: 5}}\n", ""},
		// The year typo: 2026-03 is in the history, 2027-03 in the horizon.
		{"year typo", "  - {id: promo, kind: pulse, start: §2026-03, periods: 2, effect: {units: 20000}}\n",
			`event "promo": start: 2026-03 lies inside the history (2024-01 to 2026-10), so the event is treated as a past event: it is taken out of the history and its effect of 20,000 litres is not used in the plan. Did you mean 2027-03? Put the start of a coming event in the horizon (2026-11 to 2028-04), or leave out the effect of a past one.`},
		{"year typo, quarter and percent", "  - {id: promo, kind: pulse, start: §2026-Q1, end: 2026-Q1, effect: {percent: 12.5}}\n",
			`its effect of 12.5 % is not used in the plan. Did you mean 2027-Q1? Put`},
		// One year later is past the horizon's end: no hint.
		{"year typo, no hint", "  - {id: promo, kind: pulse, start: §2024-06, effect: {units: 5}}\n",
			`its effect of 5 litres is not used in the plan. Put the start`},
		// A declared past event (no effect) gets no warning, nor does one
		// learnt from its past occurrences, nor one reaching the forecast.
		{"declared past", "  - {id: storm, kind: pulse, start: 2026-03, periods: 2}\n", ""},
		{"reaches the forecast", "  - {id: deal, kind: step, start: 2026-09, effect: {units: 5}}\n", ""},
		{"percent below 1", "  - {id: promo, kind: pulse, start: 2027-03, effect: {percent: §0.4}}\n",
			`event "promo": effect.percent: 0.4 means 0.4 %, not 40 %. For 40 % write 40.`},
		{"percent above -1", "  - {id: dip, kind: pulse, start: 2027-03, effect: {percent: §-0.25}}\n",
			`event "dip": effect.percent: -0.25 means -0.25 %, not -25 %. For -25 % write -25.`},
		{"percent 1", "  - {id: a, kind: pulse, start: 2027-03, effect: {percent: 1}}\n", ""},
		{"percent 0", "  - {id: a, kind: pulse, start: 2027-03, effect: {percent: 0}}\n", ""},
		{"scope entry percent", "  - {id: exit, kind: step, start: 2027-03, scope: [{series: a, effect: {percent: -100}}, {series: b, effect: {percent: §0.5}}]}\n",
			`event "exit": scope[1].effect.percent: 0.5 means 0.5 %, not 50 %. For 50 % write 50.`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src, line, col := tc.src, 0, 0
			if tc.want != "" {
				src, line, col = marked(tc.src)
			}
			f, err := Parse(strings.NewReader(top+src), "plan.yaml")
			if err != nil {
				t.Fatal(err)
			}
			if err := f.Resolve(hist.Next()); err != nil {
				t.Fatal(err)
			}
			got := f.Lint(hist)
			if tc.want == "" {
				if len(got) != 0 {
					t.Errorf("warnings %q, want none", got)
				}
				return
			}
			// line counts from the start of src: add the lines of top.
			prefix := fmt.Sprintf("plan.yaml:%d:%d: ", line+5, col)
			if len(got) != 1 || !strings.HasPrefix(got[0], prefix) || !strings.Contains(got[0], tc.want) {
				t.Errorf("warnings:\n%s\nwant one with prefix %q holding\n%s", strings.Join(got, "\n"), prefix, tc.want)
			}
		})
	}
}

func TestLintOrder(t *testing.T) {
	// Warnings come in file order of the events, each event's in the order
	// outside, past, percent.
	hist := forecast.Series{Name: "milk", Start: period("2024-01", forecast.Monthly), Values: make([]float64, 34)}
	src := "plan: p\nhistory: {file: h.csv}\nhorizon: 6\nevents:\n" +
		"  - {id: b, kind: pulse, start: 2027-03, effect: {percent: 0.5}}\n" +
		"  - {id: a, kind: pulse, start: 2029-03, effect: {units: 1}}\n" +
		"  - {id: c, kind: pulse, start: 2025-03, effect: {percent: 0.5}}\n"
	f, err := Parse(strings.NewReader(src), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	got := f.Lint(hist)
	// Columns counted by hand: start's value is at byte 33 of its line
	// ("  - {id: b, kind: pulse, start: " is 32 bytes), the percent at 60.
	want := []string{"plan.yaml:5:60: ", "plan.yaml:6:33: ", "plan.yaml:7:33: ", "plan.yaml:7:60: "}
	if len(got) != len(want) {
		t.Fatalf("warnings:\n%s", strings.Join(got, "\n"))
	}
	for i, w := range want {
		if !strings.HasPrefix(got[i], w) {
			t.Errorf("warning %d: %s; want prefix %s", i, got[i], w)
		}
	}
}

func TestYearLater(t *testing.T) {
	// One calendar year on, in the form written; no such label: false.
	for _, tc := range []struct{ in, want string }{
		{"2026-03", "2027-03"}, {"2026-Q4", "2027-Q4"}, {"2026-W10", "2027-W10"}, {"2026-03-14", "2027-03-14"}, {"2026", "2027"},
		{"2024-02-29", ""}, // 2025 has no 29 February
		{"2026-W53", ""},   // ISO 2027 has 52 weeks (ISO 8601: a year has 53 when it starts on a Thursday, 2026 does)
	} {
		w, err := ParseWhen(tc.in)
		if err != nil {
			t.Fatal(err)
		}
		got, ok := yearLater(w)
		if got.Label != tc.want || ok != (tc.want != "") {
			t.Errorf("yearLater(%s) = %q, %v; want %q", tc.in, got.Label, ok, tc.want)
		}
	}
}
