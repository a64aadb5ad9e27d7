package scenario

import (
	"reflect"
	"strings"
	"testing"
)

// viewSrc is a small portfolio: a contract split by baseline with a range,
// a customer leaving in percent, and a new product with its own units.
const viewSrc = head + `events:
  - id: contract
    kind: step
    start: 2027-02
    effect: {units: 1000, split: baseline}
    range: {low: 800, high: 1300}
    scope:
      - {series: "milk/*/north"}
      - {series: milk/choc/schools, new: true, effect: {units: 200}}
  - id: exit
    kind: step
    start: 2027-05
    effect: {percent: -100}
    range: {low: -100, high: -80}
    scope: [{series: "*/*/south"}]
scenarios:
  - {name: base, events: []}
  - {name: won, events: [contract]}
  - {name: both, events: [exit, contract]}
`

// TestSharesRange: a shared units range scales with the share, an own
// effect keeps the event's relative range, a percent range is kept.
func TestSharesRange(t *testing.T) {
	f, err := Parse(strings.NewReader(viewSrc), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	names := []string{"milk/whole/north", "milk/skim/north", "milk/whole/south", "milk/choc/schools"}
	w := map[string]float64{"milk/whole/north": 300, "milk/skim/north": 100}
	got, err := f.SharesOf(names, func(_ *Event, s string) float64 { return w[s] }, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		series, event string
		units         float64
		r             *Range
	}{
		// 1,000 × 300/400 = 750, range 800 × 0.75 = 600 to 1,300 × 0.75 = 975.
		{"milk/whole/north", "contract", 750, &Range{600, 975}},
		// 1,000 × 100/400 = 250, range 200 to 325.
		{"milk/skim/north", "contract", 250, &Range{200, 325}},
		// Own 200 units, 200/1,000 of the event's: range 160 to 260.
		{"milk/choc/schools", "contract", 200, &Range{160, 260}},
		// Percent applies in full with the event's range.
		{"milk/whole/south", "exit", -100, &Range{-100, -80}},
	} {
		s, ok := got[tc.series][tc.event]
		if !ok || s.Effect.Value() != tc.units || !reflect.DeepEqual(s.Range, tc.r) {
			t.Errorf("%s, %s: %+v (range %+v); want %v, range %+v", tc.series, tc.event, s, s.Range, tc.units, tc.r)
		}
	}
	if _, ok := got["milk/whole/south"]["contract"]; ok {
		t.Error("the contract moves milk/whole/south")
	}
	// Asking for one series gives its shares alone, the split still
	// counting the others.
	one, err := f.SharesOf(names, func(_ *Event, s string) float64 { return w[s] }, func(s string) bool { return s == "milk/skim/north" })
	if err != nil {
		t.Fatal(err)
	}
	if len(one) != 1 || !reflect.DeepEqual(one["milk/skim/north"], got["milk/skim/north"]) {
		t.Errorf("shares of milk/skim/north alone = %+v, want %+v", one, got["milk/skim/north"])
	}
}

// TestForSeries: a series' view holds its events with its own effect and
// range, scenarios keep their names with the events the view has, and the
// file is left as it was.
func TestForSeries(t *testing.T) {
	f, err := Parse(strings.NewReader(viewSrc), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	before := f.Events[0].Effect
	names := []string{"milk/whole/north", "milk/whole/south"}
	shares, err := f.SharesOf(names, func(*Event, string) float64 { return 1 }, nil)
	if err != nil {
		t.Fatal(err)
	}
	// milk/whole/north takes the whole contract (the only series sharing
	// it), milk/whole/south only the exit.
	north := f.ForSeries("milk/whole/north", shares["milk/whole/north"])
	if len(north.Events) != 1 || north.Events[0].ID != "contract" || north.Events[0].Effect.Units != 1000 ||
		north.Events[0].Effect.Split != SplitNone || north.Events[0].Scope != nil || north.History.Series != "milk/whole/north" {
		t.Fatalf("north view: %+v, history %+v", north.Events, north.History)
	}
	wantCases := map[string][]string{"base": {}, "won": {"contract"}, "both": {"contract"}}
	for _, c := range north.Cases() {
		var ids []string
		for _, e := range c.Events {
			ids = append(ids, e.ID)
			if e != north.Events[0] {
				t.Errorf("scenario %s: event %s is not the view's copy", c.Name, e.ID)
			}
		}
		if want := wantCases[c.Name]; len(ids) != len(want) || (len(ids) > 0 && !reflect.DeepEqual(ids, want)) {
			t.Errorf("scenario %s: events %v; want %v", c.Name, ids, want)
		}
	}
	south := f.ForSeries("milk/whole/south", shares["milk/whole/south"])
	if len(south.Events) != 1 || south.Events[0].ID != "exit" || south.Scenarios[2].Events[0] != south.Events[0] {
		t.Errorf("south view: %+v", south.Events)
	}
	if f.Events[0].Effect != before || f.Events[0].Scope == nil || f.History.Series == "milk/whole/north" || len(f.Scenarios[2].Events) != 2 {
		t.Error("ForSeries changed the file")
	}
	// Errors about the view point into the file.
	if err := north.ValueError("events", Pos{}, "x"); !strings.HasPrefix(err.Error(), "plan.yaml:") {
		t.Errorf("view error %v", err)
	}
}
