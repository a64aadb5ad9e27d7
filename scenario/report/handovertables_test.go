package report

import (
	"strings"
	"testing"

	"forelay/forecast"
	"forelay/scenario"
)

const eventsBody = `plan: ev
horizon: 6
units: crates
baseline: {method: seasonal-naive}
events:
  - id: launch
    kind: step
    start: 2026-02
    effect: {units: 40}
    ramp: {periods: 3, shape: linear}
    probability: 0.6
    range: {low: 30, high: 55}
    note: a new customer
  - id: promo
    kind: pulse
    start: 2026-04
    periods: 2
    effect: {percent: -8.5}
    payback: {share: 0.25, periods: 2}
  - id: outage
    kind: pulse
    start: 2025-06
    note: line down
scenarios:
  - {name: base, events: []}
  - {name: all, events: [launch, promo]}
`

// TestEventsTable checks each cell of the events table of a plan of one
// series: the expected texts are written out by hand from eventsBody.
func TestEventsTable(t *testing.T) {
	p := supplyPlan(t, eventsBody, nil)
	tb := eventsTable(p.File, learntEvents(p.Future), p.Periods[0], 0)
	if got := strings.Join(tb.Head, "|"); got != "id|kind|timing|effect|probability|range|scope|note" {
		t.Errorf("head %s: no owner column while no event has an owner", got)
	}
	want := [][]string{
		{"launch", "step", "from 2026-02 on; linear ramp over 3 periods", "+40 crates per period", "60%", "30 to 55", "the plan's series", "a new customer"},
		{"promo", "pulse", "2026-04, 2 periods; 25% paid back over 2 periods", "-8.5% of the baseline", "100%", "-", "the plan's series", ""},
		{"outage", "pulse", "2025-06, 1 period; in the history, taken out before fitting", "estimated from the history (see Scenarios)", "100%", "-", "the plan's series", "line down"},
	}
	if len(tb.Rows) != len(want) {
		t.Fatalf("%d rows, want %d", len(tb.Rows), len(want))
	}
	for i, row := range want {
		for j, cell := range row {
			if tb.Rows[i][j] != cell {
				t.Errorf("row %s, %s: got %q, want %q", row[0], tb.Head[j], tb.Rows[i][j], cell)
			}
		}
	}
}

// An event with an owner (from owner: or an events file's owner column)
// gives the events table an owner column; events without one leave it
// empty.
func TestEventsTableOwner(t *testing.T) {
	f, err := scenario.Parse(strings.NewReader(`plan: p
history: {file: h.csv}
horizon: 3
events:
  - {id: big-order, kind: step, start: 2027-01, effect: {units: 10}, owner: institutional sales}
  - {id: fair, kind: pulse, start: 2027-02, effect: {units: 5}}
`), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	next, err := forecast.ParsePeriod("2027-01", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	tb := eventsTable(f, nil, next, 0)
	if got := strings.Join(tb.Head, "|"); got != "id|kind|timing|effect|probability|range|scope|note|owner" {
		t.Errorf("head %q", got)
	}
	if got := tb.Rows[0][len(tb.Rows[0])-1]; got != "institutional sales" {
		t.Errorf("owner of big-order %q", got)
	}
	if got := tb.Rows[1][len(tb.Rows[1])-1]; got != "" {
		t.Errorf("owner of fair %q, want none", got)
	}
}
