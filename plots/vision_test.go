package plots

import (
	"image/color"
	"math"
	"testing"
)

// Simulation of the common colour-vision deficiencies: the matrices of
// Machado, Oliveira & Fernandes (2009), "A physiologically-based model for
// simulation of color vision deficiency", IEEE TVCG 15(6), severity 1.0
// (dichromacy), applied to linear RGB (values from memory of the paper's
// table).
var visions = []struct {
	name string
	m    [3][3]float64
}{
	{"normal", [3][3]float64{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}},
	{"protanopia", [3][3]float64{{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}}},
	{"deuteranopia", [3][3]float64{{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}}},
	{"tritanopia", [3][3]float64{{1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602}, {0.004733, 0.691367, 0.303900}}},
}

// linear returns the linear value of an sRGB channel (IEC 61966-2-1).
func linear(v uint8) float64 {
	c := float64(v) / 255
	if c <= 0.04045 {
		return c / 12.92
	}
	return math.Pow((c+0.055)/1.055, 2.4)
}

// encode returns the sRGB channel (0 to 255) of a linear value, clipped
// to [0, 1] (IEC 61966-2-1).
func encode(v float64) float64 {
	v = math.Min(1, math.Max(0, v))
	if v <= 0.0031308 {
		return 255 * 12.92 * v
	}
	return 255 * (1.055*math.Pow(v, 1/2.4) - 0.055)
}

// seenGrey returns the grey level (BT.601 luma, as TestPaletteGreyLevels
// measures it) of c as a reader with vision m sees it: c in linear RGB,
// times m, back to sRGB.
func seenGrey(c color.NRGBA, m [3][3]float64) float64 {
	in := [3]float64{linear(c.R), linear(c.G), linear(c.B)}
	var out [3]float64
	for i := range 3 {
		out[i] = encode(m[i][0]*in[0] + m[i][1]*in[1] + m[i][2]*in[2])
	}
	return 0.299*out[0] + 0.587*out[1] + 0.114*out[2]
}

// TestPaletteColourVision checks that the colours sharing a chart stay
// apart by lightness for readers with the common colour-vision
// deficiencies (protanopia, deuteranopia, tritanopia), not by hue alone:
// as each sees them, every pair differs by at least the given number of
// grey levels. The step is smaller than in full colour vision
// (TestPaletteGreyLevels) because the lines also differ in dash and
// marker (TestScenarioLooksDistinct); it still keeps two lines from
// turning into one grey, which the third scenario colour once did under
// protanopia (2 levels apart from the second).
func TestPaletteColourVision(t *testing.T) {
	for _, tc := range []struct {
		name    string
		colours []color.NRGBA
		minStep float64
	}{
		{"plan lines", []color.NRGBA{colInk, colIndigo, colRust, colTeal, colOchre}, 12},
		{"more scenarios", []color.NRGBA{colPlum, colMoss, colSlate}, 20},
		{"load", []color.NRGBA{colIndigo, colRust, colTeal, colOchre, lookCapacity.Color}, 12},
		{"stock", []color.NRGBA{colInk, colIndigo, colRust, colBuild}, 12},
		{"waterfall", []color.NRGBA{colTotal, colUp, colDown}, 25},
		{"fan bands", []color.NRGBA{colFanOuter, colFanInner}, 40},
	} {
		for _, v := range visions[1:] {
			for i, a := range tc.colours {
				ga := seenGrey(a, v.m)
				for j, b := range tc.colours[:i] {
					if d := math.Abs(ga - seenGrey(b, v.m)); d < tc.minStep {
						t.Errorf("%s, %s: colours %d and %d are %.1f grey levels apart, want %.0f", v.name, tc.name, j, i, d, tc.minStep)
					}
				}
			}
		}
	}
}

// TestVisionIdentity checks the simulation's plumbing: with normal vision
// a colour's grey level is its BT.601 luma, within rounding.
func TestVisionIdentity(t *testing.T) {
	for _, c := range []color.NRGBA{colInk, colIndigo, colRust, colTeal, colOchre, colGrid} {
		if d := math.Abs(seenGrey(c, visions[0].m) - luma(c)); d > 0.5 {
			t.Errorf("%v: simulated normal grey %.2f, luma %.2f", c, seenGrey(c, visions[0].m), luma(c))
		}
	}
}
