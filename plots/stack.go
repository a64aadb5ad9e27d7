package plots

import (
	"image/color"
	"math"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A chart may be a stack of panels one above the other that share the x
// axis, each with its own value axis: the stock panel under the build of a
// StockChart, the change panel under the plans of a ComparisonChart. The
// top panel is the *plot.Plot a chart returns; it carries the title and
// holds the panels below it, which Render lays out and draws with it.
// Only the lowest panel writes the period labels; the others show the
// tick marks alone. The data areas of all panels line up left and right.

// panelGap is the space between two panels of a stack.
const panelGap = 10 // points

// A panel is a frame drawn below another, taking share of the height.
type panel struct {
	f     *frame
	share float64
}

// stack hangs g below f (below f's other panels), taking share of the
// drawing's height, and keeps the period labels for the lowest panel.
func (f *frame) stack(g *frame, share float64) {
	f.panels = append(f.panels, panel{f: g, share: share})
	for _, q := range f.stacked()[:len(f.panels)] {
		q.x.bare = true
		q.p.X.Label.Text = ""
	}
}

// stacked returns f and its panels, top to bottom.
func (f *frame) stacked() []*frame {
	fs := []*frame{f}
	for _, q := range f.panels {
		fs = append(fs, q.f)
	}
	return fs
}

// heights splits the height h between f and its panels, leaving panelGap
// between each two.
func (f *frame) heights(h vg.Length) []vg.Length {
	room := h - vg.Length(len(f.panels))*vg.Points(panelGap)
	top := 1.0
	hs := make([]vg.Length, 0, len(f.panels)+1)
	hs = append(hs, 0)
	for _, q := range f.panels {
		top -= q.share
		hs = append(hs, room*vg.Length(q.share))
	}
	hs[0] = room * vg.Length(math.Max(top, 0.2))
	return hs
}

// fitStack lays f and its panels out for a drawing w by h. The value axes
// are fitted twice: the second time every panel reserves the width of the
// widest value axis, as the aligned data areas will have.
func (f *frame) fitStack(w, h vg.Length) {
	fs, hs := f.stacked(), f.heights(h)
	var yw vg.Length
	for i, q := range fs {
		q.fit(w, hs[i])
		yw = vg.Length(math.Max(float64(yw), float64(q.yAxisWidth())))
	}
	if len(fs) == 1 {
		return
	}
	for i, q := range fs {
		q.minYAxis = yw
		q.fit(w, hs[i])
	}
}

// drawStack draws f and its panels on c, their data areas aligned.
func (f *frame) drawStack(c draw.Canvas) {
	fs := f.stacked()
	if len(fs) == 1 {
		f.p.Draw(c)
		return
	}
	c.SetColor(color.White)
	c.Fill(c.Rectangle.Path())
	for i, t := range f.tiles(c) {
		fs[i].p.Draw(t)
	}
}

// tiles returns the canvas of f and of each panel within c, top to
// bottom, cropped so that their data areas line up: each panel gives up on
// the left and right what the widest axis of any panel takes there.
func (f *frame) tiles(c draw.Canvas) []draw.Canvas {
	fs, hs := f.stacked(), f.heights(c.Max.Y-c.Min.Y)
	ts := make([]draw.Canvas, len(fs))
	top := c.Max.Y
	for i := range fs {
		ts[i] = draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{
			Min: vg.Point{X: c.Min.X, Y: top - hs[i]},
			Max: vg.Point{X: c.Max.X, Y: top},
		}}
		top -= hs[i] + vg.Points(panelGap)
	}
	var left, right vg.Length
	for i, q := range fs {
		d := q.p.DataCanvas(ts[i])
		left = vg.Length(math.Max(float64(left), float64(d.Min.X-ts[i].Min.X)))
		right = vg.Length(math.Max(float64(right), float64(ts[i].Max.X-d.Max.X)))
	}
	for i, q := range fs {
		d := q.p.DataCanvas(ts[i])
		ts[i] = draw.Crop(ts[i], left-(d.Min.X-ts[i].Min.X), -(right - (ts[i].Max.X - d.Max.X)), 0, 0)
	}
	return ts
}
