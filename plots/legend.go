package plots

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// legend is the key of a chart: a boxed block of entries in as many columns as
// fit, drawn in the headroom the frame keeps free above the data. It replaces
// gonum/plot's legend so the key never sits on top of the lines.
type legend struct {
	entries []legendEntry
	style   text.Style

	cols   int       // columns, set by reserve
	offset vg.Length // distance of the box below the top of the data area
}

type legendEntry struct {
	name   string
	thumbs []plot.Thumbnailer
}

// Sizes of the key, in points.
const (
	keyThumb   = 26 // thumbnail width
	keyTextGap = 5  // thumbnail to text
	keyColGap  = 14 // between columns
	keyPad     = 4  // inside the box
	keyInset   = 4  // box to the data area's edge
)

// add appends an entry drawn with thumbs laid over each other.
func (l *legend) add(name string, thumbs ...plot.Thumbnailer) {
	l.entries = append(l.entries, legendEntry{name: name, thumbs: thumbs})
}

func (l *legend) rowHeight() vg.Length {
	e := l.style.FontExtents()
	return e.Ascent + e.Descent + vg.Points(3)
}

func (l *legend) colWidth() vg.Length {
	var w vg.Length
	for _, e := range l.entries {
		w = vg.Length(math.Max(float64(w), float64(l.style.Width(e.name))))
	}
	return vg.Points(keyThumb+keyTextGap) + w
}

// columns returns how many columns fit in width dw.
func (l *legend) columns(dw vg.Length) int {
	if len(l.entries) == 0 {
		return 0
	}
	room := dw - vg.Points(2*keyPad+2*keyInset)
	cols := int((room + vg.Points(keyColGap)) / (l.colWidth() + vg.Points(keyColGap)))
	return min(max(cols, 1), len(l.entries))
}

// reserve lays the key out for a data area dw wide, placing it off below the
// top, and returns the height it takes (0 with no entries).
func (l *legend) reserve(dw, off vg.Length, _, _ float64) vg.Length {
	l.offset = off
	l.cols = l.columns(dw)
	if l.cols == 0 {
		return 0
	}
	rows := (len(l.entries) + l.cols - 1) / l.cols
	return vg.Length(rows)*l.rowHeight() + vg.Points(2*keyPad+keyInset)
}

// Plot draws the key. It implements plot.Plotter.
func (l *legend) Plot(c draw.Canvas, _ *plot.Plot) {
	if len(l.entries) == 0 {
		return
	}
	cols := l.cols
	if w := c.Max.X - c.Min.X; cols == 0 || cols > l.columns(w) {
		cols = l.columns(w)
	}
	rows := (len(l.entries) + cols - 1) / cols
	rowH, colW := l.rowHeight(), l.colWidth()
	x0 := c.Min.X + vg.Points(keyInset)
	y1 := c.Max.Y - l.offset - vg.Points(keyInset)
	w := vg.Length(cols)*colW + vg.Length(cols-1)*vg.Points(keyColGap) + vg.Points(2*keyPad)
	h := vg.Length(rows)*rowH + vg.Points(2*keyPad)
	box := []vg.Point{{X: x0, Y: y1 - h}, {X: x0 + w, Y: y1 - h}, {X: x0 + w, Y: y1}, {X: x0, Y: y1}}
	c.FillPolygon(color.NRGBA{R: 0xff, G: 0xff, B: 0xff, A: 0xeb}, box)
	c.StrokeLines(draw.LineStyle{Color: rgb(0xa8a8a8), Width: vg.Points(0.5)}, append(box, box[0]))

	sty := l.style
	sty.XAlign = draw.XLeft
	sty.YAlign = draw.YCenter
	for k, e := range l.entries {
		r, col := k/cols, k%cols
		left := x0 + vg.Points(keyPad) + vg.Length(col)*(colW+vg.Points(keyColGap))
		top := y1 - vg.Points(keyPad) - vg.Length(r)*rowH
		thumb := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: left, Y: top - rowH + vg.Points(2)},
			Max: vg.Point{X: left + vg.Points(keyThumb), Y: top - vg.Points(1)},
		}}
		for _, t := range e.thumbs {
			t.Thumbnail(&thumb)
		}
		c.FillText(sty, vg.Point{X: left + vg.Points(keyThumb+keyTextGap), Y: top - rowH/2}, e.name)
	}
}
