package plots

import (
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The plotters below draw the parts of the charts that gonum/plot has no
// plotter for. They leave the axis ranges to the frame, so none of them
// reports a data range.

// band fills the area between lo and hi over the x positions x0, x0+1, ...
// and draws the two edges with edge when edge.Width > 0.
//
// The band is drawn in runs of periods where both edges are numbers; NaN in
// either edge leaves a gap. Where lo lies above hi (a lower edge raised to a
// floor above the whole band) the band has no width: both edges are drawn
// at hi. A run of one period becomes a narrow block so it stays visible.
type band struct {
	x0     int
	lo, hi []float64
	fill   color.Color
	edge   draw.LineStyle
}

// newBand returns the band between lo and hi from x position x0.
func newBand(x0 int, lo, hi []float64, fill color.Color, edge draw.LineStyle) *band {
	return &band{x0: x0, lo: lo, hi: hi, fill: fill, edge: edge}
}

// bandRun is a stretch of a band without gaps, in data units.
type bandRun struct{ xs, lo, hi []float64 }

// runs splits the band into its stretches without gaps, with each lower
// edge at most its upper edge and both limited to ±maxAxis.
func (b *band) runs() []bandRun {
	var out []bandRun
	var cur bandRun
	flush := func() {
		if len(cur.xs) == 1 { // a lone period: a narrow block
			x := cur.xs[0]
			cur = bandRun{xs: []float64{x - 0.3, x + 0.3}, lo: []float64{cur.lo[0], cur.lo[0]}, hi: []float64{cur.hi[0], cur.hi[0]}}
		}
		if len(cur.xs) > 0 {
			out = append(out, cur)
		}
		cur = bandRun{}
	}
	for j := range b.lo {
		lo, hi := b.lo[j], b.hi[j]
		if math.IsNaN(lo) || math.IsNaN(hi) {
			flush()
			continue
		}
		hi = onAxis(hi)
		lo = math.Min(onAxis(lo), hi)
		cur.xs = append(cur.xs, float64(b.x0+j))
		cur.lo = append(cur.lo, lo)
		cur.hi = append(cur.hi, hi)
	}
	flush()
	return out
}

// Plot draws the band. It implements plot.Plotter.
func (b *band) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	for _, r := range b.runs() {
		n := len(r.xs)
		poly := make([]vg.Point, 0, 2*n)
		top := make([]vg.Point, n)
		bot := make([]vg.Point, n)
		for i := range n {
			top[i] = vg.Point{X: trX(r.xs[i]), Y: trY(r.hi[i])}
			bot[i] = vg.Point{X: trX(r.xs[i]), Y: trY(r.lo[i])}
		}
		poly = append(poly, top...)
		for i := n - 1; i >= 0; i-- {
			poly = append(poly, bot[i])
		}
		if pts := c.ClipPolygonXY(poly); len(pts) > 2 {
			c.FillPolygon(b.fill, pts)
		}
		if b.edge.Width > 0 {
			c.StrokeLines(b.edge, c.ClipLinesXY(top)...)
			c.StrokeLines(b.edge, c.ClipLinesXY(bot)...)
		}
	}
}

// Thumbnail draws the band's key swatch. It implements plot.Thumbnailer.
func (b *band) Thumbnail(c *draw.Canvas) {
	r := inset(c.Rectangle, 0, 1)
	c.FillPolygon(b.fill, rectPoints(r))
	if b.edge.Width > 0 {
		c.StrokeLine2(b.edge, r.Min.X, r.Max.Y, r.Max.X, r.Max.Y)
		c.StrokeLine2(b.edge, r.Min.X, r.Min.Y, r.Max.X, r.Min.Y)
	}
}

// A spanLook is how a kind of window is shaded: a translucent fill,
// optional hatching (crossed when cross is set) and the edge lines.
type spanLook struct {
	fill  color.Color
	hatch color.Color // nil: none
	cross bool
	edge  draw.LineStyle
}

// shade paints the window r in look l, clipped to c, and draws the edges
// that fall inside c at x0 and x1.
func (l spanLook) shade(c *draw.Canvas, r vg.Rectangle, x0, x1 vg.Length) {
	c.FillPolygon(l.fill, rectPoints(r))
	if l.hatch != nil {
		sty := draw.LineStyle{Color: l.hatch, Width: vg.Points(0.5)}
		hatch(c, r, sty, vg.Points(6))
		if l.cross {
			hatchFalling(c, r, sty, vg.Points(6))
		}
	}
	for _, x := range []vg.Length{x0, x1} {
		if c.ContainsX(x) {
			c.StrokeLine2(l.edge, x, r.Min.Y, x, r.Max.Y)
		}
	}
}

// Thumbnail draws the look's key swatch. It implements plot.Thumbnailer.
func (l spanLook) Thumbnail(c *draw.Canvas) {
	r := inset(c.Rectangle, 6, 0)
	l.shade(c, r, r.Min.X, r.Max.X)
}

// A spanItem is one window of a spans and its look.
type spanItem struct {
	w    Window
	look spanLook
}

// spans shades windows over the full height of the data area, edges them
// with thin lines and writes their labels in rows in the headroom, below
// the key. Each label starts just inside its window's left edge (moved left
// only where it would run off the data area), in the first row where it
// keeps clear of every label already placed, so no two labels overlap.
//
// The rows are counted when the chart is laid out, from an estimate of the
// data area's width, with a wide gap between labels; the labels are placed
// again when drawn, at their true positions, with a narrower gap, so they
// fit in the rows kept free.
type spans struct {
	items []spanItem
	style text.Style

	offset vg.Length      // distance of the first label row below the top
	placed []vg.Rectangle // label boxes as last drawn, for tests
}

// Gaps between two labels in one row: when counting rows and when drawing.
const (
	spanGapReserve = 12 // points
	spanGapDraw    = 5  // points
)

func (s *spans) rowHeight() vg.Length {
	e := s.style.FontExtents()
	return e.Ascent + e.Descent + vg.Points(2)
}

// labelX returns where the label of window w starts, for a data area from x
// = left to right whose x axis maps x positions with tr.
func (s *spans) labelX(w Window, tr func(float64) vg.Length, left, right vg.Length) vg.Length {
	x := vg.Length(math.Max(float64(tr(w.From)), float64(left))) + vg.Points(3)
	if lw := s.style.Width(w.Label); x+lw > right-vg.Points(2) {
		x = vg.Length(math.Max(float64(right-vg.Points(2)-lw), float64(left+vg.Points(2))))
	}
	return x
}

// assign returns the label row of each window (-1: no label shown) and the
// number of rows, for a data area from left to right whose x axis maps x
// positions with tr, keeping gap between labels in a row.
func (s *spans) assign(tr func(float64) vg.Length, left, right, gap vg.Length) (rows []int, n int) {
	rows = make([]int, len(s.items))
	var used [][][2]vg.Length // label extents in each row
	for i, it := range s.items {
		w := it.w
		if w.Label == "" || tr(w.To) < left || tr(w.From) > right {
			rows[i] = -1
			continue
		}
		x0 := s.labelX(w, tr, left, right)
		x1 := x0 + s.style.Width(w.Label)
		r := 0
		for ; r < len(used); r++ {
			clear := true
			for _, e := range used[r] {
				if x0 < e[1]+gap && e[0] < x1+gap {
					clear = false
					break
				}
			}
			if clear {
				break
			}
		}
		if r == len(used) {
			used = append(used, nil)
		}
		used[r] = append(used[r], [2]vg.Length{x0, x1})
		rows[i] = r
	}
	return rows, len(used)
}

// reserve counts the label rows for a data area dw wide spanning [xmin,
// xmax] and returns their height.
func (s *spans) reserve(dw, off vg.Length, xmin, xmax float64) vg.Length {
	s.offset = off
	tr := func(x float64) vg.Length { return vg.Length((x - xmin) / (xmax - xmin) * float64(dw)) }
	_, n := s.assign(tr, 0, dw, vg.Points(spanGapReserve))
	if n == 0 {
		return 0
	}
	return vg.Length(n)*s.rowHeight() + vg.Points(3)
}

// Plot draws the windows, then their labels on top. It implements
// plot.Plotter.
func (s *spans) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	for _, it := range s.items {
		x0, x1 := trX(it.w.From), trX(it.w.To)
		if x1 < c.Min.X || x0 > c.Max.X {
			continue
		}
		r := vg.Rectangle{
			Min: vg.Point{X: vg.Length(math.Max(float64(x0), float64(c.Min.X))), Y: c.Min.Y},
			Max: vg.Point{X: vg.Length(math.Min(float64(x1), float64(c.Max.X))), Y: c.Max.Y},
		}
		it.look.shade(&c, r, x0, x1)
	}
	sty := s.style
	sty.XAlign = draw.XLeft
	sty.YAlign = draw.YTop
	rows, _ := s.assign(trX, c.Min.X, c.Max.X, vg.Points(spanGapDraw))
	s.placed = s.placed[:0]
	e := sty.FontExtents()
	for i, it := range s.items {
		if rows[i] < 0 {
			continue
		}
		pt := vg.Point{X: s.labelX(it.w, trX, c.Min.X, c.Max.X), Y: c.Max.Y - s.offset - vg.Length(rows[i])*s.rowHeight()}
		c.FillText(sty, pt, it.w.Label)
		s.placed = append(s.placed, vg.Rectangle{
			Min: vg.Point{X: pt.X, Y: pt.Y - e.Ascent - e.Descent},
			Max: vg.Point{X: pt.X + sty.Width(it.w.Label), Y: pt.Y},
		})
	}
}

// vmarker is a vertical line at x over the full height of the data area,
// with a note on either side at the bottom (such as "actuals" and
// "forecast").
type vmarker struct {
	x           float64
	line        draw.LineStyle
	left, right string
	style       text.Style
}

// Plot draws the marker. It implements plot.Plotter.
func (m *vmarker) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	x := trX(m.x)
	if !c.ContainsX(x) {
		return
	}
	c.StrokeLine2(m.line, x, c.Min.Y, x, c.Max.Y)
	sty := m.style
	sty.YAlign = draw.YBottom
	y := c.Min.Y + vg.Points(3)
	if m.left != "" {
		sty.XAlign = draw.XRight
		c.FillText(sty, vg.Point{X: x - vg.Points(4), Y: y}, m.left)
	}
	if m.right != "" {
		sty.XAlign = draw.XLeft
		c.FillText(sty, vg.Point{X: x + vg.Points(4), Y: y}, m.right)
	}
}

// hrule is a horizontal line at y across the data area.
type hrule struct {
	y    float64
	line draw.LineStyle
}

// Plot draws the rule. It implements plot.Plotter.
func (r *hrule) Plot(c draw.Canvas, p *plot.Plot) {
	_, trY := p.Transforms(&c)
	if y := trY(onAxis(r.y)); c.ContainsY(y) {
		c.StrokeLine2(r.line, c.Min.X, y, c.Max.X, y)
	}
}

// Thumbnail draws the rule's key swatch. It implements plot.Thumbnailer.
func (r *hrule) Thumbnail(c *draw.Canvas) {
	y := c.Center().Y
	c.StrokeLine2(r.line, c.Min.X, y, c.Max.X, y)
}

// A swatch is the fill of a bar: colour, outline and, when hatch is not nil,
// diagonal hatching.
type swatch struct {
	fill  color.Color
	rim   draw.LineStyle
	hatch color.Color
}

// paint fills, hatches and outlines the rectangle r of c, clipped to c.
func (s swatch) paint(c *draw.Canvas, r vg.Rectangle) {
	pts := c.ClipPolygonXY(rectPoints(r))
	if len(pts) == 0 {
		return
	}
	if r.Max.Y-r.Min.Y < vg.Points(0.5) {
		// A zero amount: a short level line.
		c.StrokeLines(s.rim, c.ClipLinesXY([]vg.Point{{X: r.Min.X, Y: r.Min.Y}, {X: r.Max.X, Y: r.Min.Y}})...)
		return
	}
	if s.fill != nil {
		c.FillPolygon(s.fill, pts)
	}
	if s.hatch != nil {
		clip := vg.Rectangle{
			Min: vg.Point{X: vg.Length(math.Max(float64(r.Min.X), float64(c.Min.X))), Y: vg.Length(math.Max(float64(r.Min.Y), float64(c.Min.Y)))},
			Max: vg.Point{X: vg.Length(math.Min(float64(r.Max.X), float64(c.Max.X))), Y: vg.Length(math.Min(float64(r.Max.Y), float64(c.Max.Y)))},
		}
		hatch(c, clip, draw.LineStyle{Color: s.hatch, Width: vg.Points(0.7)}, vg.Points(4))
	}
	if s.rim.Width > 0 {
		c.StrokeLines(s.rim, c.ClipLinesXY(append(rectPoints(r), r.Min))...)
	}
}

// Thumbnail draws the swatch as a key entry. It implements plot.Thumbnailer.
func (s swatch) Thumbnail(c *draw.Canvas) {
	s.paint(c, inset(c.Rectangle, 4, 1))
}

// hatch strokes lines rising at 45 degrees, gap apart, across r. The lines
// sit on a grid anchored at the origin so neighbouring bars line up.
func hatch(c *draw.Canvas, r vg.Rectangle, sty draw.LineStyle, gap vg.Length) {
	// Lines y = x - s for s a multiple of gap, s in [x0-y1, x1-y0].
	first := math.Ceil(float64((r.Min.X - r.Max.Y) / gap))
	last := math.Floor(float64((r.Max.X - r.Min.Y) / gap))
	for k := first; k <= last; k++ {
		s := vg.Length(k) * gap
		xa := vg.Length(math.Max(float64(r.Min.X), float64(r.Min.Y+s)))
		xb := vg.Length(math.Min(float64(r.Max.X), float64(r.Max.Y+s)))
		if xb <= xa {
			continue
		}
		c.StrokeLine2(sty, xa, xa-s, xb, xb-s)
	}
}

// hatchFalling is hatch with the lines falling at 45 degrees; the two
// together cross-hatch r.
func hatchFalling(c *draw.Canvas, r vg.Rectangle, sty draw.LineStyle, gap vg.Length) {
	// Lines y = s - x for s a multiple of gap, s in [x0+y0, x1+y1].
	first := math.Ceil(float64((r.Min.X + r.Min.Y) / gap))
	last := math.Floor(float64((r.Max.X + r.Max.Y) / gap))
	for k := first; k <= last; k++ {
		s := vg.Length(k) * gap
		xa := vg.Length(math.Max(float64(r.Min.X), float64(s-r.Max.Y)))
		xb := vg.Length(math.Min(float64(r.Max.X), float64(s-r.Min.Y)))
		if xb <= xa {
			continue
		}
		c.StrokeLine2(sty, xa, s-xa, xb, s-xb)
	}
}

// A bar is one rectangle of a bar chart in data units: centred on x, w wide,
// from y0 to y1 (either order). cut draws an axis-break mark near the bar's
// base, for bars whose base lies below a value axis that does not start at
// zero.
type bar struct {
	x, w, y0, y1 float64
	look         swatch
	cut          bool
}

// bars draws a set of bars in order.
type bars []bar

// Plot draws the bars. It implements plot.Plotter.
func (bs bars) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	for _, b := range bs {
		if math.IsNaN(b.y0) || math.IsNaN(b.y1) {
			continue
		}
		y0, y1 := onAxis(b.y0), onAxis(b.y1)
		r := vg.Rectangle{
			Min: vg.Point{X: trX(b.x - b.w/2), Y: trY(math.Min(y0, y1))},
			Max: vg.Point{X: trX(b.x + b.w/2), Y: trY(math.Max(y0, y1))},
		}
		b.look.paint(&c, r)
		if b.cut {
			cutMark(&c, r)
		}
	}
}

// cutMark draws the break symbol across the lower part of bar r: a white
// slanted gap edged by two thin lines.
func cutMark(c *draw.Canvas, r vg.Rectangle) {
	h := vg.Points(5)
	base := vg.Length(math.Max(float64(r.Min.Y), float64(c.Min.Y))) + vg.Points(10)
	if base+h+vg.Points(4) > r.Max.Y {
		return
	}
	lean := vg.Points(4)
	x0, x1 := r.Min.X-vg.Points(2), r.Max.X+vg.Points(2)
	gap := []vg.Point{{X: x0, Y: base}, {X: x1, Y: base + lean}, {X: x1, Y: base + lean + h}, {X: x0, Y: base + h}}
	c.FillPolygon(color.White, gap)
	sty := draw.LineStyle{Color: colInk, Width: vg.Points(0.8)}
	c.StrokeLine2(sty, x0, base, x1, base+lean)
	c.StrokeLine2(sty, x0, base+h, x1, base+lean+h)
}

// rectPoints returns the corners of r, counter-clockwise from the lower left.
func rectPoints(r vg.Rectangle) []vg.Point {
	return []vg.Point{r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}}
}

// inset shrinks r by dx points on the left and right and dy on top and bottom.
func inset(r vg.Rectangle, dx, dy float64) vg.Rectangle {
	r.Min.X += vg.Points(dx)
	r.Max.X -= vg.Points(dx)
	r.Min.Y += vg.Points(dy)
	r.Max.Y -= vg.Points(dy)
	return r
}
