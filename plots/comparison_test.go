package plots

import (
	"fmt"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/plot/plotter"
)

// TestComparisonChart checks the layout of a comparison: the plans and the
// capacity on the upper panel, the changes from the baseline on a panel of
// their own, and scenarios told apart by dash pattern and marker as well as
// colour.
func TestComparisonChart(t *testing.T) {
	c := ComparisonChart{
		Labels:   monthLabels(2026, 4),
		Baseline: []float64{100, 110, 120, 130},
		Scenarios: []Curve{
			{Name: "gain", Values: []float64{100, 140, 150, 160}},
			{Name: "loss", Start: 2, Values: []float64{60, 70}},
		},
		Capacity: []float64{150, 150, math.NaN(), math.NaN()},
	}
	p, err := c.Plot()
	if err != nil {
		t.Fatal(err)
	}
	f := p.X.Tick.Marker.(*frame)
	if len(f.panels) != 1 {
		t.Fatalf("%d panels, want the change panel", len(f.panels))
	}
	g := f.panels[0].f
	// Plans and capacity: lowest 60 (loss in 2026-03), highest 160 (gain
	// in 2026-04). Changes: gain 0, 30, 30, 30; loss 60-120 = -60 and
	// 70-130 = -60; the baseline's own line at 0 (hand calculation).
	for _, tc := range []struct {
		what           string
		lo, hi         float64
		wantLo, wantHi float64
	}{{"plans", f.lo, f.hi, 60, 160}, {"changes", g.lo, g.hi, -60, 30}} {
		if tc.lo != tc.wantLo || tc.hi != tc.wantHi {
			t.Errorf("%s span %v to %v, want %v to %v", tc.what, tc.lo, tc.hi, tc.wantLo, tc.wantHi)
		}
	}
	var names []string
	for _, e := range f.key.entries {
		names = append(names, e.name)
	}
	if want := []string{"Baseline", "gain", "loss", "Capacity"}; !reflect.DeepEqual(names, want) {
		t.Errorf("key %q, want %q", names, want)
	}
	if len(g.key.entries) != 0 {
		t.Errorf("the change panel has a key of its own")
	}
	// The two scenarios differ in dash pattern and in marker shape.
	look := func(k int) (string, string) {
		th := f.key.entries[k].thumbs
		return fmt.Sprint(th[0].(*plotter.Line).LineStyle.Dashes), fmt.Sprintf("%T", th[1].(*plotter.Scatter).GlyphStyle.Shape)
	}
	d1, m1 := look(1)
	d2, m2 := look(2)
	if d1 == d2 || m1 == m2 {
		t.Errorf("scenarios look alike: dashes %s and %s, markers %s and %s", d1, d2, m1, m2)
	}
}
