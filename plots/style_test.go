package plots

import (
	"image/color"
	"math"
	"reflect"
	"testing"
)

// luma is the ITU-R BT.601 grey level of c, Y' = 0.299 R + 0.587 G + 0.114 B,
// the weights image/color.GrayModel documents and uses.
func luma(c color.NRGBA) float64 {
	return 0.299*float64(c.R) + 0.587*float64(c.G) + 0.114*float64(c.B)
}

// TestPaletteGreyLevels checks that the series that share a chart stay apart
// when printed in grey: their BT.601 grey levels differ by at least the
// given step.
func TestPaletteGreyLevels(t *testing.T) {
	for _, tc := range []struct {
		name    string
		colours []color.NRGBA
		minStep float64
	}{
		// History, baseline and the first three scenarios of a plan chart.
		{"plan lines", []color.NRGBA{colInk, colIndigo, colRust, colTeal, colOchre}, 25},
		// Waterfall: totals, increases and (hatched) decreases.
		{"waterfall", []color.NRGBA{colTotal, colUp, colDown}, 40},
		// Fan chart bands.
		{"fan bands", []color.NRGBA{colFanOuter, colFanInner}, 40},
		// Load chart: baseline, the first three scenarios and the capacity.
		{"load", []color.NRGBA{colIndigo, colRust, colTeal, colOchre, lookCapacity.Color}, 25},
		// Stock chart: demand, capacity, stock lines and build bars.
		{"stock", []color.NRGBA{colInk, colIndigo, colRust, colBuild}, 25},
	} {
		for i, a := range tc.colours {
			// Go's own conversion agrees with the formula to within a level.
			g := color.GrayModel.Convert(a).(color.Gray)
			if math.Abs(float64(g.Y)-luma(a)) > 1 {
				t.Errorf("%s: colour %d: GrayModel gives %d, BT.601 formula %.1f", tc.name, i, g.Y, luma(a))
			}
			for j, b := range tc.colours[:i] {
				if d := math.Abs(luma(a) - luma(b)); d < tc.minStep {
					t.Errorf("%s: colours %d and %d are %.1f grey levels apart, want %.0f", tc.name, j, i, d, tc.minStep)
				}
			}
		}
	}
}

// TestScenarioLooksDistinct checks that no two scenario looks share a dash
// pattern or a marker shape, and none copies the history or baseline line.
func TestScenarioLooksDistinct(t *testing.T) {
	for i, a := range scenarioLooks {
		if reflect.DeepEqual(a.Dashes, lookHistory.Dashes) && a.Shape == nil {
			t.Errorf("scenario look %d looks like the history line", i)
		}
		if reflect.DeepEqual(a.Dashes, lookBaseline.Dashes) {
			t.Errorf("scenario look %d has the baseline's dashes", i)
		}
		for j, b := range scenarioLooks[:i] {
			if reflect.DeepEqual(a.Dashes, b.Dashes) {
				t.Errorf("scenario looks %d and %d share dashes", j, i)
			}
			if reflect.TypeOf(a.Shape) == reflect.TypeOf(b.Shape) {
				t.Errorf("scenario looks %d and %d share a marker", j, i)
			}
		}
	}
}
