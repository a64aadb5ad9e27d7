package scenario

import (
	"errors"
	"math"
	"strings"
	"testing"

	"forelay/forecast"
)

// TestShares checks each form of a scoped effect against arithmetic by
// hand: an entry's own effect, a units effect split by baseline, split
// equally or given in full, a percent effect, and a new series.
func TestShares(t *testing.T) {
	names := []string{"milk/whole-1l/north", "milk/whole-1l/south", "milk/skim-1l/north", "cream/pot/north", "milk/choc/schools"}
	// Weights (a series' baseline over the event's span), invented round
	// numbers so that the shares are exact.
	weights := map[string]float64{"milk/whole-1l/north": 300, "milk/whole-1l/south": 100, "milk/skim-1l/north": 600, "cream/pot/north": 50}
	weight := func(s string) float64 { return weights[s] }
	type want struct {
		series string
		units  float64 // the series' effect: units, or percent when pct
		pct    bool
		share  float64
		new    bool
	}
	for _, tc := range []struct {
		name  string
		event string // the event's effect and scope, in YAML flow style
		want  []want
	}{
		{"split by baseline", "effect: {units: 38000, split: baseline}, scope: [{series: \"milk/whole-1l/*\"}]",
			// 38,000 × 300/400 = 28,500 and 38,000 × 100/400 = 9,500.
			[]want{{"milk/whole-1l/north", 28500, false, 0.75, false}, {"milk/whole-1l/south", 9500, false, 0.25, false}}},
		{"split equally", "effect: {units: 900, split: equal}, scope: [{series: \"milk/*/north\"}, {series: milk/whole-1l/south}]",
			// 900 / 3 = 300 each, in the order of the plan's series.
			[]want{{"milk/whole-1l/north", 300, false, 1.0 / 3, false}, {"milk/whole-1l/south", 300, false, 1.0 / 3, false}, {"milk/skim-1l/north", 300, false, 1.0 / 3, false}}},
		{"no split: the full effect each", "effect: {units: 40}, scope: [{series: \"**/north\"}]",
			[]want{{"milk/whole-1l/north", 40, false, 1, false}, {"milk/skim-1l/north", 40, false, 1, false}, {"cream/pot/north", 40, false, 1, false}}},
		{"percent applies per series", "effect: {percent: -100}, scope: [{series: \"*/*/north\"}]",
			[]want{{"milk/whole-1l/north", -100, true, 1, false}, {"milk/skim-1l/north", -100, true, 1, false}, {"cream/pot/north", -100, true, 1, false}}},
		// Own effects stay out of the split: the 1,000 is shared by
		// whole-1l/north (300) and skim-1l/north (600) alone: 1,000 ×
		// 300/900 and 1,000 × 600/900.
		{"own effects beside a split", "effect: {units: 1000, split: baseline}, scope: [{series: \"milk/*/north\"}, {series: cream/pot/north, effect: {percent: 5}}, {series: milk/choc/schools, new: true, effect: {units: 70}}]",
			[]want{{"milk/whole-1l/north", 1000.0 / 3, false, 1.0 / 3, false}, {"milk/skim-1l/north", 2000.0 / 3, false, 2.0 / 3, false}, {"cream/pot/north", 5, true, 1, false}, {"milk/choc/schools", 70, false, 1, true}}},
		// A new series shares an equal split like any other: 600 / 2.
		{"new series in an equal split", "effect: {units: 600, split: equal}, scope: [{series: milk/whole-1l/south}, {series: milk/choc/schools, new: true}]",
			[]want{{"milk/whole-1l/south", 300, false, 0.5, false}, {"milk/choc/schools", 300, false, 0.5, true}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Parse(strings.NewReader(head+"events:\n  - {id: a, kind: step, start: 2027-02, "+tc.event+"}\n"), "plan.yaml")
			if err != nil {
				t.Fatal(err)
			}
			got, err := f.Events[0].Shares(names, weight)
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != len(tc.want) {
				t.Fatalf("%d shares %+v; want %d", len(got), got, len(tc.want))
			}
			for i, w := range tc.want {
				g := got[i]
				if g.Series != w.series || g.New != w.new || g.Effect.IsPercent != w.pct || g.Effect.Split != SplitNone ||
					math.Abs(g.Effect.Value()-w.units) > 1e-9 || math.Abs(g.Share-w.share) > 1e-12 {
					t.Errorf("share %d = %+v; want %+v", i, g, w)
				}
			}
		})
	}
}

// TestSharesEdges: an event without a scope moves every series in full,
// and a split by baseline over series without baseline is refused.
func TestSharesEdges(t *testing.T) {
	f, err := Parse(strings.NewReader(head+"events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 5}}\n"+
		"  - {id: b, kind: step, start: 2027-02, effect: {units: 5, split: baseline}, scope: [{series: \"x/*\"}]}\n"), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	got, err := f.Events[0].Shares([]string{"x/a", "x/b"}, nil)
	if err != nil || len(got) != 2 || got[1].Series != "x/b" || got[1].Effect.Units != 5 || got[1].Entry != -1 {
		t.Errorf("no scope: %+v, %v", got, err)
	}
	zero := func(string) float64 { return 0 }
	if _, err := f.Events[1].Shares([]string{"x/a", "x/b"}, zero); !errors.Is(err, ErrNoSplitBase) || !strings.Contains(err.Error(), "split: equal") {
		t.Errorf("zero weights: %v; want ErrNoSplitBase suggesting split: equal", err)
	}
	// A negative weight counts as 0: all 5 units go to x/b.
	neg := func(s string) float64 { return map[string]float64{"x/a": -10, "x/b": 4}[s] }
	if got, err := f.Events[1].Shares([]string{"x/a", "x/b"}, neg); err != nil || got[0].Effect.Units != 0 || got[1].Effect.Units != 5 {
		t.Errorf("negative weight: %+v, %v", got, err)
	}
}

// TestSpanWeight: the weight sums the baseline where the step or pulse is
// under way, by hand.
func TestSpanWeight(t *testing.T) {
	f, err := Parse(strings.NewReader(head+"events:\n"+
		"  - {id: s, kind: step, start: 2027-03, ramp: {periods: 2}, effect: {units: 5}}\n"+
		"  - {id: p, kind: pulse, start: 2027-02, periods: 2, effect: {units: 5}, payback: {share: 1, periods: 2}}\n"), "plan.yaml")
	if err != nil {
		t.Fatal(err)
	}
	first := period("2027-01", forecast.Monthly)
	baseline := []float64{1, 2, 4, 8, 16, -32}
	// Step from 2027-03 (index 2; the ramp's first period is under way):
	// 4 + 8 + 16 + 0 (the negative baseline counts as 0) = 28.
	if got := f.Events[0].SpanWeight(first, baseline); got != 28 {
		t.Errorf("step: %v; want 28", got)
	}
	// Pulse in 2027-02 and 2027-03, payback in 2027-04 and 05 left out:
	// 2 + 4 = 6.
	if got := f.Events[1].SpanWeight(first, baseline); got != 6 {
		t.Errorf("pulse: %v; want 6", got)
	}
}
