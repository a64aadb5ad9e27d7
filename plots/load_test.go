package plots

import (
	"image/color"
	"math"
	"reflect"
	"testing"
)

// TestLoadChartMarks checks which periods a load chart marks, against a
// reading by hand of a small case: the highlighted load starts at x = 1,
// so its value j sits over Capacity[1+j].
func TestLoadChartMarks(t *testing.T) {
	nan := math.NaN()
	for _, tc := range []struct {
		name      string
		values    []float64
		upper     []float64 // nil: no band
		capacity  []float64
		wantBand  []Window
		wantLoad  []Window
		wantNames []string
	}{
		{
			// x:        1     2     3    4     5    6
			// capacity: 10    10    NaN  10    8    8
			// load:     9     11    12   9.5   9    8.5
			// upper:    9.5   12    13   10.5  9.5  9
			// x = 1: 9 and 9.5 <= 10, nothing; x = 2: 11 > 10, load;
			// x = 3: no capacity, nothing; x = 4: 9.5 <= 10 < 10.5,
			// band; x = 5 and 6: 9 > 8 and 8.5 > 8, load, one window.
			name:      "band and load above",
			values:    []float64{9, 11, 12, 9.5, 9, 8.5},
			upper:     []float64{9.5, 12, 13, 10.5, 9.5, 9},
			capacity:  []float64{1, 10, 10, nan, 10, 8, 8},
			wantBand:  []Window{{From: 3.5, To: 4.5}},
			wantLoad:  []Window{{From: 1.5, To: 2.5}, {From: 4.5, To: 6.5}},
			wantNames: []string{"base", "other", "focus", "Capacity", "Band above capacity", "Load above capacity"},
		},
		{
			// Without a band only the load counts: x = 2, 5 and 6.
			name:      "no band",
			values:    []float64{9, 11, 12, 9.5, 9, 8.5},
			capacity:  []float64{1, 10, 10, nan, 10, 8, 8},
			wantLoad:  []Window{{From: 1.5, To: 2.5}, {From: 4.5, To: 6.5}},
			wantNames: []string{"base", "other", "focus", "Capacity", "Load above capacity"},
		},
		{
			// Capacity everywhere above: nothing marked, no key entries
			// for marks.
			name:      "within capacity",
			values:    []float64{1, 2, 3, 4, 5, 6},
			upper:     []float64{2, 3, 4, 5, 6, 7},
			capacity:  []float64{7, 7, 7, 7, 7, 7, 7},
			wantNames: []string{"base", "other", "focus", "Capacity"},
		},
		{
			// No capacity: nothing marked and no capacity in the key.
			name:      "no capacity",
			values:    []float64{9, 11, 12, 9.5, 9, 8.5},
			wantNames: []string{"base", "other", "focus"},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			focus := Curve{Name: "focus", Start: 1, Values: tc.values}
			if tc.upper != nil {
				focus.Lower, focus.Upper = tc.values, tc.upper
			}
			c := LoadChart{
				Labels:   monthLabels(2026, 7),
				Baseline: Curve{Name: "base", Values: []float64{0, 1, 1, 1, 1, 1, 1}},
				// Far above the capacity, but not highlighted: never
				// marked.
				Scenarios: []Curve{{Name: "other", Values: []float64{50, 50, 50, 50, 50, 50, 50}}, focus},
				Highlight: 1,
				Capacity:  tc.capacity,
			}
			band, load := c.marks(focus)
			if !reflect.DeepEqual(band, tc.wantBand) || !reflect.DeepEqual(load, tc.wantLoad) {
				t.Errorf("marks: band %v, load %v; want %v and %v", band, load, tc.wantBand, tc.wantLoad)
			}
			p, err := c.Plot()
			if err != nil {
				t.Fatal(err)
			}
			var names []string
			for _, e := range p.X.Tick.Marker.(*frame).key.entries {
				names = append(names, e.name)
			}
			if !reflect.DeepEqual(names, tc.wantNames) {
				t.Errorf("key %q, want %q", names, tc.wantNames)
			}
		})
	}
}

// TestLoadChartLooks checks that a load chart reads in grey and in print:
// the capacity is the only line that is solid and has no marker, it is
// darker than every load line of the first five scenarios and the
// baseline by at least 25 grey levels, and the two kinds of marks differ
// in their hatching (crossed or not), not only in their tint.
func TestLoadChartLooks(t *testing.T) {
	loads := append([]look{lookBaseline}, scenarioLooks...)
	for i, l := range loads {
		if l.Dashes == nil && l.Shape == nil {
			t.Errorf("load look %d is solid and unmarked, like the capacity", i)
		}
	}
	if lookCapacity.Dashes != nil || lookCapacity.Shape != nil {
		t.Errorf("capacity look has dashes %v and marker %T, want a solid line without one", lookCapacity.Dashes, lookCapacity.Shape)
	}
	for i, l := range loads[:6] {
		if d := luma(l.Color) - luma(lookCapacity.Color); d < 25 {
			t.Errorf("load look %d is %.1f grey levels lighter than the capacity, want at least 25", i, d)
		}
	}
	for _, l := range []spanLook{lookBandOver, lookLoadOver} {
		if l.hatch == nil {
			t.Errorf("a mark without hatching: %+v", l)
		}
	}
	if lookBandOver.cross == lookLoadOver.cross {
		t.Errorf("the two marks are hatched alike")
	}
	// The load-above mark is the darker of the two: its fill is more
	// opaque over white.
	if a, b := lookBandOver.fill.(color.NRGBA).A, lookLoadOver.fill.(color.NRGBA).A; a >= b {
		t.Errorf("fill alpha: band above %d, load above %d; want the load's higher", a, b)
	}
}
