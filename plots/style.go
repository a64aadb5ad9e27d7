package plots

import (
	"image/color"

	stdfnt "golang.org/x/image/font"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The look of the charts. Series are told apart by four things at once so a
// chart still reads when printed in grey: colour, grey level (each colour's
// luma differs from its neighbours'), dash pattern and marker shape. Fills
// are light tints; negative amounts are also hatched.

// rgb builds an opaque colour from a 0xRRGGBB value.
func rgb(v uint32) color.NRGBA {
	return color.NRGBA{R: uint8(v >> 16), G: uint8(v >> 8), B: uint8(v), A: 0xff}
}

// tint returns c with alpha a (0 transparent, 255 opaque).
func tint(c color.NRGBA, a uint8) color.NRGBA {
	c.A = a
	return c
}

// The palette. The luma in each comment is the ITU-R BT.601 grey level
// 0.299 R + 0.587 G + 0.114 B that image/color.GrayModel uses.
var (
	colInk    = rgb(0x1e1e24) // luma 31: history, text, demand
	colIndigo = rgb(0x263f6a) // luma 60: baseline, median, capacity
	colRust   = rgb(0xa8401a) // luma 91: first scenario, alarms, stock
	colTeal   = rgb(0x36988a) // luma 121: second scenario
	colOchre  = rgb(0xdfaa2f) // luma 172: third scenario
	colPlum   = rgb(0x6b3070) // luma 73: fourth scenario
	colMoss   = rgb(0x5f7a2e) // luma 104: fifth scenario
	colSlate  = rgb(0x8a8f99) // luma 142: sixth scenario, guide lines
	colGrid   = rgb(0xe3e3e3) // luma 227: grid lines
	colRule   = rgb(0x6e6e6e) // luma 110: zero and centre lines
	colWindow = rgb(0xd9cdb8) // luma 206: event windows (drawn translucent)

	colFanOuter = rgb(0xcdd6e6) // luma 213: P5-P95
	colFanInner = rgb(0x8fa3c6) // luma 162: P10-P90
	colUp       = rgb(0xb7dcc8) // luma 207: waterfall increases
	colDown     = rgb(0xc9775a) // luma 140: waterfall decreases (hatched)
	colTotal    = rgb(0x4d6285) // luma 95: waterfall totals
	colBuild    = rgb(0xe8d7a8) // luma 213: production bars
	colBuildRim = rgb(0x7d6424) // luma 99: production bar outlines
)

// Dash patterns, in points. nil is a solid line.
var (
	dashSolid   []vg.Length
	dashDash    = []vg.Length{vg.Points(6), vg.Points(3)}
	dashDashDot = []vg.Length{vg.Points(7), vg.Points(2.5), vg.Points(1.5), vg.Points(2.5)}
	dashLong    = []vg.Length{vg.Points(11), vg.Points(3.5)}
	dashDot     = []vg.Length{vg.Points(1.5), vg.Points(2.5)}
	dashDashDD  = []vg.Length{vg.Points(7), vg.Points(2), vg.Points(1.5), vg.Points(2), vg.Points(1.5), vg.Points(2)}
	dashShort   = []vg.Length{vg.Points(3), vg.Points(2.5)}
	dashFine    = []vg.Length{vg.Points(1), vg.Points(3)}
)

// A look is the full drawing style of one line series: line colour, width and
// dash, and the marker placed on some of its points (nil Shape: no marker).
type look struct {
	Color  color.NRGBA
	Width  vg.Length
	Dashes []vg.Length
	Shape  draw.GlyphDrawer
	Radius vg.Length
}

// lineStyle returns l's line style.
func (l look) lineStyle() draw.LineStyle {
	return draw.LineStyle{Color: l.Color, Width: l.Width, Dashes: l.Dashes}
}

// glyphStyle returns l's marker style.
func (l look) glyphStyle() draw.GlyphStyle {
	return draw.GlyphStyle{Color: l.Color, Radius: l.Radius, Shape: l.Shape}
}

// Fixed looks of the named series.
var (
	lookHistory  = look{Color: colInk, Width: vg.Points(1.6)}
	lookBaseline = look{Color: colIndigo, Width: vg.Points(1.6), Dashes: dashDash}
)

// Looks of the windows of a plan chart: the events of the plan, and the
// past events cleaned out of the history (grey and hatched, so the two
// differ in print and in grey).
var (
	lookWindow = spanLook{
		fill: tint(colWindow, 0x66),
		edge: draw.LineStyle{Color: rgb(0xa89a80), Width: vg.Points(0.6), Dashes: dashShort},
	}
	lookPast = spanLook{
		fill:  tint(colSlate, 0x2e),
		hatch: tint(colSlate, 0x8c),
		edge:  draw.LineStyle{Color: colSlate, Width: vg.Points(0.6), Dashes: dashFine},
	}
)

// scenarioLooks are cycled through by the scenarios of a plan chart. Dash
// pattern and marker shape are unique within the list.
var scenarioLooks = []look{
	{Color: colRust, Width: vg.Points(1.8), Dashes: dashDashDot, Shape: draw.TriangleGlyph{}, Radius: vg.Points(2.6)},
	{Color: colTeal, Width: vg.Points(1.8), Dashes: dashLong, Shape: draw.BoxGlyph{}, Radius: vg.Points(2.2)},
	{Color: colOchre, Width: vg.Points(2.0), Dashes: dashShort, Shape: draw.CircleGlyph{}, Radius: vg.Points(2.3)},
	{Color: colPlum, Width: vg.Points(1.8), Dashes: dashDashDD, Shape: draw.CrossGlyph{}, Radius: vg.Points(2.6)},
	{Color: colMoss, Width: vg.Points(1.8), Dashes: dashDot, Shape: draw.PyramidGlyph{}, Radius: vg.Points(2.6)},
	{Color: colSlate, Width: vg.Points(2.0), Dashes: dashSolid, Shape: draw.RingGlyph{}, Radius: vg.Points(2.4)},
}

// Fonts. The charts use the Liberation Sans faces that gonum/plot embeds, so
// the output does not depend on the fonts installed on the machine.
var (
	fontSans = font.Font{Typeface: "Liberation", Variant: "Sans"}
	fontBold = font.Font{Typeface: "Liberation", Variant: "Sans", Weight: stdfnt.WeightBold}
	fontIt   = font.Font{Typeface: "Liberation", Variant: "Sans", Style: stdfnt.StyleItalic}
)

// textStyle returns a plain text style in face f of size pt points.
func textStyle(f font.Font, pt float64, c color.Color) text.Style {
	return text.Style{
		Color:   c,
		Font:    font.From(f, vg.Points(pt)),
		Handler: plot.DefaultTextHandler,
	}
}

// Text sizes in points.
const (
	sizeTitle = 13
	sizeAxis  = 10
	sizeTick  = 9
	sizeKey   = 9
	sizeNote  = 8
)
