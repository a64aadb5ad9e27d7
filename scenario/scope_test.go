package scenario

import (
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"

	"forelay/forecast"
	"forelay/scenario/data"
)

// portfolio is the example of the scope and resources sections of the
// reference (SCHEMA.md), on a head of three dairy series.
const portfolio = head + `events:
  - id: grocer-exit
    kind: step
    start: 2027-05
    scope:
      - {series: "*/*/grocer-north", effect: {percent: -100}}
  - id: school-contract
    kind: step
    start: 2027-02
    ramp: {periods: 3, shape: linear}
    effect: {units: 38000, split: baseline}
    scope:
      - {series: "milk/whole-1l/*"}
      - {series: "milk/choc-250ml/schools", new: true, effect: {units: 2000}}
resources:
  - id: bottling-1
    series: "milk/**"
    per-unit: 0.0012
    units: line-hours
    capacity: {units: 600, changes: [{from: 2027-09, units: 680}]}
`

// dairy are the series of the plan the portfolio example is checked
// against.
var dairy = []string{"milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south", "cream/pot-200ml/grocer-north"}

func TestParseScope(t *testing.T) {
	f, err := Parse(strings.NewReader(portfolio), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	exit, school := f.Events[0], f.Events[1]
	// Positions are counted by hand in the text above: head has 3 lines,
	// "events:" is line 4.
	wantExit := []ScopeEntry{{Series: "*/*/grocer-north", Effect: &Effect{Percent: -100, IsPercent: true}, Pos: Pos{Line: 9, Column: 9}}}
	if !reflect.DeepEqual(exit.Scope, wantExit) {
		t.Errorf("grocer-exit scope %+v; want %+v", exit.Scope, wantExit)
	}
	if exit.Effect != (Effect{}) {
		t.Errorf("grocer-exit effect %+v; want none", exit.Effect)
	}
	wantSchool := []ScopeEntry{{Series: "milk/whole-1l/*", Pos: Pos{Line: 16, Column: 9}}, {Series: "milk/choc-250ml/schools", New: true, Effect: &Effect{Units: 2000}, Pos: Pos{Line: 17, Column: 9}}}
	if !reflect.DeepEqual(school.Scope, wantSchool) {
		t.Errorf("school-contract scope %+v; want %+v", school.Scope, wantSchool)
	}
	if want := (Effect{Units: 38000, Split: SplitBaseline}); school.Effect != want {
		t.Errorf("school-contract effect %+v; want %+v", school.Effect, want)
	}
	wantRes := []Resource{{ID: "bottling-1", Series: "milk/**", PerUnit: 0.0012, Units: "line-hours", Pos: Pos{Line: 19, Column: 5}, path: `resource "bottling-1": `,
		Capacity: &Capacity{Units: 600, Pos: Pos{Line: 23, Column: 15}, Changes: []CapacityChange{{From: f.Resources[0].Capacity.Changes[0].From, Units: 680, Pos: Pos{Line: 23, Column: 38}}}}}}
	if !reflect.DeepEqual(f.Resources, wantRes) {
		t.Errorf("resources %+v; want %+v", f.Resources, wantRes)
	}
	if ch := f.Resources[0].Capacity.Changes[0].From; ch.Label != "2027-09" {
		t.Errorf("capacity change from %v; want 2027-09", ch)
	}
	if err := f.CheckSeries(dairy, nil); err != nil {
		t.Errorf("CheckSeries: %v", err)
	}
	// Every entry of grocer-exit has its own effect, so the event needs
	// none; school-contract has its own. (Its new series takes an effect
	// of its own: split by baseline would give a series without history
	// nothing, and the decoder refuses that.)
	if err := f.Resolve(period("2027-01", forecast.Monthly)); err != nil {
		t.Errorf("Resolve: %v", err)
	}
}

func TestParseSplit(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Split
	}{
		{"", SplitNone}, {"none", SplitNone}, {"baseline", SplitBaseline}, {"equal", SplitEqual},
	} {
		got, err := ParseSplit(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("ParseSplit(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
		if tc.in != "" && got.String() != tc.in {
			t.Errorf("%v.String() = %q; want %q", got, got.String(), tc.in)
		}
	}
	if _, err := ParseSplit("even"); err == nil {
		t.Error("ParseSplit(even): no error")
	}
}

func TestCheckSeriesErrors(t *testing.T) {
	const step = "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5}, "
	for _, tc := range []struct {
		name  string
		src   string   // § marks the expected position
		names []string // the plan's series
		kind  error
		want  string
	}{
		{"pattern matches nothing", head + step + "scope: [{series: §\"*/*/grocer-east\"}]}\n", dairy, ErrValue,
			// Distance to "*/*/grocer-east" (wildcards free), by hand:
			// east to north is 4 edits (e→n, a→o, s→r, insert h), east to
			// south 4 (e→s, a→o, s→u, insert h); at equal distance the
			// names keep their order.
			`event "a": scope[0].series: the pattern "*/*/grocer-east" matches no series of the plan; the nearest are "milk/whole-1l/grocer-north", "milk/whole-1l/grocer-south", "cream/pot-200ml/grocer-north"`},
		{"name matches nothing", head + step + "scope: [{series: milk/whole-1l/grocer-nort}, {series: §milk/whole-1l/grocer-nord}]}\n", []string{"milk/whole-1l/grocer-nort"}, ErrValue,
			`event "a": scope[1].series: no series of the plan is called "milk/whole-1l/grocer-nord"; the nearest are "milk/whole-1l/grocer-nort"`},
		{"new on an existing series", head + step + "scope: [{series: §milk/whole-1l/grocer-north, new: true}]}\n", dairy, ErrValue,
			`event "a": scope[0].series: "milk/whole-1l/grocer-north" is already a series of the plan; leave out new: true to move it`},
		{"resource matches nothing", head + "resources:\n  - {id: r, series: §\"butter/**\", per-unit: 1}\n", dairy, ErrValue,
			`resource "r": series: the pattern "butter/**" matches no series of the plan; the nearest are`},
		{"event without scope", head + "events:\n  - {id: b, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: \"milk/**\"}]}\n  - §{id: a, kind: step, start: 2027-02, effect: {units: 5}}\n", dairy, ErrMissing,
			`event "a": scope: required: the plan has 3 series; say which the event moves (scope: [{series: NAME or PATTERN}])`},
		{"new on a series of the history not selected", head + step + "scope: [{series: §milk/whole-1l/grocer-east, new: true}]}\n", nil, ErrValue,
			`event "a": scope[0].series: "milk/whole-1l/grocer-east" is a series of h.csv that history.series does not select; select it and leave out new: true`},
		// milk/whole-1l/grocer-north is matched by both entries.
		{"series matched by two entries", head + step + "scope: [{series: \"milk/**\"}, {series: §\"*/*/grocer-north\", effect: {percent: 5}}]}\n", dairy, ErrValue,
			`event "a": scope[1].series: "milk/whole-1l/grocer-north" is matched by event "a": scope[0] too; an event moves each series once: narrow a pattern, or make two events`},
		// A pattern may match a series another entry creates.
		{"pattern over a new series", head + step + "scope: [{series: milk/choc/schools, new: true}, {series: §\"milk/choc/*\"}]}\n", dairy, ErrValue,
			`event "a": scope[1].series: "milk/choc/schools" is matched by event "a": scope[0] too`},
		// One series of the history and one that a scope creates make two.
		{"event without scope beside a new series", head + "events:\n  - {id: b, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: milk/x, new: true}]}\n  - §{id: a, kind: pulse, start: 2027-02, effect: {units: 5}}\n", []string{"milk/y"}, ErrMissing,
			`event "a": scope: required: the plan has 2 series`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src, line, col := marked(tc.src)
			f, err := Parse(strings.NewReader(src), "plan.yaml")
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			hist := tc.names
			if tc.names == nil {
				tc.names, hist = dairy, append(dairy[:len(dairy):len(dairy)], "milk/whole-1l/grocer-east")
			}
			err = f.CheckSeries(tc.names, hist)
			if _, ok := err.(*data.ParseError); !ok {
				t.Fatalf("want exactly one problem, got %v", err)
			}
			prefix := fmt.Sprintf("plan.yaml:%d:%d: ", line, col)
			if msg := err.Error(); !strings.HasPrefix(msg, prefix) || !strings.Contains(msg, tc.want) {
				t.Errorf("error\n  %s\nwant prefix %q and fragment %q", msg, prefix, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("error %v does not wrap %v", err, tc.kind)
			}
		})
	}
}

func TestCheckSeriesAccepts(t *testing.T) {
	for _, tc := range []struct {
		name  string
		src   string
		names []string
	}{
		{"one series, no scope", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5}}\ncapacity: {units: 9}\n", []string{"milk"}},
		{"a scope on the plan's only series", head + "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: milk}]}\n", []string{"milk"}},
		{"no events", head + "resources:\n  - {id: r, series: \"**\", per-unit: 2}\n", dairy},
		// A scope may name a series another event creates, and a resource
		// may load it.
		{"scope on a created series", head + "events:\n" +
			"  - {id: a, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: milk/choc/schools, new: true}]}\n" +
			"  - {id: b, kind: pulse, start: 2027-04, effect: {units: 5}, scope: [{series: \"*/choc/*\"}]}\n" +
			"resources:\n  - {id: r, series: \"*/choc/**\", per-unit: 2}\n", dairy},
		// Two events may both create the same new series.
		{"one new series from two events", head + "events:\n" +
			"  - {id: a, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: milk/choc/schools, new: true}]}\n" +
			"  - {id: b, kind: step, start: 2027-06, effect: {units: 5}, scope: [{series: milk/choc/schools, new: true}]}\n", dairy},
	} {
		f, err := Parse(strings.NewReader(tc.src), "plan.yaml")
		if err != nil {
			t.Fatalf("%s: Parse: %v", tc.name, err)
		}
		if err := f.CheckSeries(tc.names, tc.names); err != nil {
			t.Errorf("%s: CheckSeries: %v", tc.name, err)
		}
	}
}

func TestCheckSeriesSeveral(t *testing.T) {
	// Three problems come back as a list in file order.
	src := head + "events:\n" +
		"  - {id: a, kind: step, start: 2027-02, effect: {units: 5}}\n" +
		"  - {id: b, kind: step, start: 2027-02, effect: {units: 5}, scope: [{series: tea}]}\n" +
		"resources:\n  - {id: r, series: coffee, per-unit: 1}\n"
	f, err := Parse(strings.NewReader(src), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	err = f.CheckSeries([]string{"milk", "cream"}, nil)
	var list ErrorList
	if !errors.As(err, &list) || len(list) != 3 {
		t.Fatalf("error %v; want a list of 3", err)
	}
	// Columns counted by hand: the event's "{" is column 5, tea column 78
	// of line 6, coffee column 21 of line 8.
	for i, want := range []string{"plan.yaml:5:5: ", "plan.yaml:6:78: ", "plan.yaml:8:21: "} {
		if !strings.HasPrefix(list[i].Error(), want) {
			t.Errorf("problem %d: %v; want prefix %q", i, list[i], want)
		}
	}
}

func TestResolveScopeEffects(t *testing.T) {
	month := period("2027-01", forecast.Monthly)
	// An entry without an effect beside one with an effect, and an event
	// without one: the entry has nothing to share.
	src, line, col := marked(head + "events:\n  - {id: a, kind: step, start: 2027-02, scope: [{series: x, effect: {units: 1}}, §{series: y}]}\n")
	f, err := Parse(strings.NewReader(src), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	err = f.Resolve(month)
	want := fmt.Sprintf("plan.yaml:%d:%d: event \"a\": scope[1].effect: required: the event reaches the forecast (2027-01 on) and gives no effect for this entry to share", line, col)
	if err == nil || !strings.HasPrefix(err.Error(), want) || !errors.Is(err, ErrMissing) {
		t.Errorf("error %v; want %q", err, want)
	}
	// No entry has an effect: the event needs one, as without a scope.
	src, line, col = marked(head + "events:\n  - §{id: a, kind: step, start: 2027-02, scope: [{series: x}]}\n")
	if f, err = Parse(strings.NewReader(src), "plan.yaml"); err != nil {
		t.Fatal(err)
	}
	want = fmt.Sprintf("plan.yaml:%d:%d: event \"a\": effect: required", line, col)
	if err := f.Resolve(month); err == nil || !strings.HasPrefix(err.Error(), want) {
		t.Errorf("error %v; want %q", err, want)
	}
	// A past event with a scope needs no effect.
	f, err = Parse(strings.NewReader(head+"events:\n  - {id: a, kind: pulse, start: 2025-07, scope: [{series: x}]}\n"), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Resolve(month); err != nil {
		t.Errorf("past event: %v", err)
	}
	// A resource's capacity change must start a period.
	src, line, col = marked(head + "resources:\n  - {id: r, series: x, per-unit: 1, capacity: {units: 5, changes: [{from: §2027-06-15, units: 6}]}}\n")
	if f, err = Parse(strings.NewReader(src), "plan.yaml"); err != nil {
		t.Fatal(err)
	}
	want = fmt.Sprintf("plan.yaml:%d:%d: resource \"r\": capacity.changes[0].from: 2027-06-15 falls inside a month", line, col)
	if err := f.Resolve(month); err == nil || !strings.HasPrefix(err.Error(), want) {
		t.Errorf("error %v; want %q", err, want)
	}
}

func TestAllResources(t *testing.T) {
	f, err := Parse(strings.NewReader(head+"units: litres\ncapacity: {units: 540000}\n"), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	// The rule: a top-level capacity is one resource over every
	// series with a per-unit of 1.
	want := []Resource{{ID: CapacityResource, Series: "**", PerUnit: 1, Units: "litres", Capacity: f.Capacity, Pos: f.Capacity.Pos}}
	if got := f.AllResources(); !reflect.DeepEqual(got, want) {
		t.Errorf("AllResources() = %+v; want %+v", got, want)
	}
	f, err = Parse(strings.NewReader(portfolio), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if got := f.AllResources(); !reflect.DeepEqual(got, f.Resources) {
		t.Errorf("AllResources() = %+v; want the file's", got)
	}
	if f, _ = Parse(strings.NewReader(head), "plan.yaml"); f.AllResources() != nil {
		t.Error("AllResources of a file without capacity is not nil")
	}
}
