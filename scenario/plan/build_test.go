package plan

import (
	"forelay/scenario"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func TestLintTestdataYearTypo(t *testing.T) {
	// testdata/scenario/year-typo.yaml: the promotion written 2026-06 (line
	// 12, column 12) lies in the history, which ends 2026-10; one year
	// later, 2027-06, lies in the horizon 2026-11 to 2028-04. The declared
	// past outage gets no warning. Build gives the same warning.
	f, err := scenario.Load(filepath.Join("..", "..", "testdata", "scenario", "year-typo.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := Load(f)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Warnings) != 1 {
		t.Fatalf("warnings %q", p.Warnings)
	}
	w := p.Warnings[0]
	for _, frag := range []string{"year-typo.yaml:12:12: event \"summer-promo\": start: 2026-06 lies inside the history (2023-11 to 2026-10), so the event is treated as a past event",
		"its effect of 8 % is not used in the plan. Did you mean 2027-06?"} {
		if !strings.Contains(w, frag) {
			t.Errorf("warning %q lacks %q", w, frag)
		}
	}
	if lint := f.Lint(p.History); len(lint) != 1 || lint[0] != w {
		t.Errorf("Lint %q, Build %q", lint, w)
	}
	// The promotion is cleaned out of the history, not planned.
	if len(p.Future) != 0 || len(p.Cleaning) != 2 {
		t.Errorf("future %d events, cleaning %+v", len(p.Future), p.Cleaning)
	}
}

func TestBuildLeavesOutEventsBeforeHistory(t *testing.T) {
	// History from 2022-01. An event and a past occurrence wholly before
	// it have nothing to clean: Build leaves them out (it used to fail
	// with a zero intervention) and warns of each.
	body := "plan: p\nhorizon: 3\nbaseline: {method: naive}\nevents:\n" +
		"  - {id: ancient, kind: pulse, start: 2020-03, periods: 2}\n" +
		"  - {id: fair, kind: pulse, start: 2024-03, effect: {units: 10}, past: [2021-03, 2022-05]}\n"
	p := buildTestPlan(t, body, testHistory(24))
	if len(p.Cleaning) != 1 || p.Cleaning[0].When != "2022-05" {
		t.Errorf("cleaning %+v; want the 2022-05 occurrence only", p.Cleaning)
	}
	if len(p.Warnings) != 2 || !strings.Contains(p.Warnings[0], `event "ancient": start: the event (2020-03 to 2020-04) lies before the history (2022-01 to 2023-12)`) ||
		!strings.Contains(p.Warnings[1], `event "fair": past[0]: 2021-03 lies before the history`) {
		t.Errorf("warnings:\n%s", strings.Join(p.Warnings, "\n"))
	}
}

// TestBuildIsPure: Build reads no file and changes neither the scenario
// file nor its inputs. The demo's harvest fair learns its effect from its
// past occurrences; the file's event keeps "from: past" with no units and
// no range, the plan's copy carries the learnt effect, and a second Build
// from the same file and inputs gives the same plan.
func TestBuildIsPure(t *testing.T) {
	f, err := scenario.Load(filepath.Join("..", "..", "examples", "dairy", "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	in, err := Read(f)
	if err != nil {
		t.Fatal(err)
	}
	history := slices.Clone(in.Series.Values)
	a, err := Build(f, in)
	if err != nil {
		t.Fatal(err)
	}
	fair := f.Event("harvest-fair")
	if !fair.Effect.FromPast || fair.Effect.Units != 0 || fair.Range != nil {
		t.Errorf("the file's event was changed: %+v, range %v", fair.Effect, fair.Range)
	}
	var learnt *scenario.Event
	for _, e := range a.Future {
		if e.ID == "harvest-fair" {
			learnt = e
		}
	}
	if learnt == nil || learnt == fair || learnt.Effect.Units == 0 || learnt.Range == nil {
		t.Fatalf("the plan's harvest fair: %+v", learnt)
	}
	if !slices.Equal(in.Series.Values, history) {
		t.Error("the inputs' history was changed")
	}
	b, err := Build(f, in)
	if err != nil {
		t.Fatal(err)
	}
	for s := range a.Scenarios {
		if !slices.Equal(a.Scenarios[s].Adjusted, b.Scenarios[s].Adjusted) || !slices.Equal(a.Scenarios[s].Upper, b.Scenarios[s].Upper) {
			t.Errorf("scenario %s differs between two builds", a.Scenarios[s].Name)
		}
	}
}
