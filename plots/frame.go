package plots

import (
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// DefaultWidth and DefaultHeight are the size the charts are laid out for
// until Render is given another (8 by 4.5 inches, 1536 by 864 pixels in PNG):
// a size whose text reads in a printed report and on a slide.
const (
	DefaultWidth  = 8 * vg.Inch
	DefaultHeight = 4.5 * vg.Inch
)

// A frame is the scaffolding every chart shares: the plot with its title,
// axes and grid, the period axis, the key, and the headroom kept free above
// the data for the key and for window labels. The frame is also the x
// axis's tick marker, which is how Render finds it to lay the chart out for
// the size asked for.
type frame struct {
	p    *plot.Plot
	x    *periodTicks
	key  *legend
	tops []topBand
	n    int // number of x positions (labels)

	// lo and hi are the extent of the values on the y axis.
	lo, hi float64
	// zero keeps 0 as the bottom of the value axis when no value is
	// negative, for bar charts.
	zero bool
	// pad is the fraction of the data range added below and above.
	pad float64
	// yMin and yMax, when set (not NaN), fix the value axis range before
	// headroom.
	yMin, yMax float64

	// panels are drawn below this frame, sharing its x axis (stack.go).
	panels []panel
	// minYAxis is the least width the value axis is assumed to take when
	// laying out, so the panels of a stack fit their aligned data areas.
	minYAxis vg.Length
}

// A topBand is something drawn in the headroom above the data (the key,
// window labels). reserve lays it out for a data area dw wide spanning
// [xmin, xmax] in x, placed off below the top, and returns its height.
type topBand interface {
	reserve(dw, off vg.Length, xmin, xmax float64) vg.Length
}

// layout is implemented by the frame: Render lays the chart out for the
// size asked for and then draws it, with any panels stacked below.
type layout interface {
	fitStack(w, h vg.Length)
	drawStack(c draw.Canvas)
}

var (
	_ layout      = (*frame)(nil)
	_ plot.Ticker = (*frame)(nil)
)

// newFrame starts a chart with the given title, x labels and value axis
// label. nominal selects a category x axis (every label shown).
func newFrame(title string, labels []string, yLabel string, nominal bool) *frame {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle = textStyle(fontBold, sizeTitle, colInk)
	p.Title.TextStyle.XAlign = draw.XCenter
	p.Title.TextStyle.YAlign = draw.YTop
	p.Title.Padding = vg.Points(8)

	axisLine := draw.LineStyle{Color: rgb(0x555555), Width: vg.Points(0.8)}
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle = textStyle(fontSans, sizeAxis, colInk)
		a.Label.Padding = vg.Points(4)
		a.Tick.Label = textStyle(fontSans, sizeTick, rgb(0x333333))
		a.Tick.LineStyle = axisLine
		a.Tick.Length = vg.Points(4)
		a.LineStyle = axisLine
		a.Padding = vg.Points(2)
	}
	p.X.Label.TextStyle.XAlign = draw.XCenter
	p.Y.Label.TextStyle.XAlign = draw.XCenter
	p.X.Tick.Label.XAlign = draw.XCenter
	p.X.Tick.Label.YAlign = draw.YTop
	p.Y.Tick.Label.XAlign = draw.XRight
	p.Y.Tick.Label.YAlign = draw.YCenter
	p.Y.Label.Text = yLabel
	p.Y.Tick.Marker = ValueTicks{}

	f := &frame{
		p:    p,
		x:    newPeriodTicks(labels, nominal),
		key:  &legend{style: textStyle(fontSans, sizeKey, colInk)},
		n:    len(labels),
		lo:   math.Inf(1),
		hi:   math.Inf(-1),
		pad:  0.04,
		yMin: math.NaN(),
		yMax: math.NaN(),
	}
	p.X.Label.Text = f.x.name
	p.X.Tick.Marker = f
	f.tops = append(f.tops, f.key)

	grid := plotter.NewGrid()
	grid.Vertical.Color = nil
	grid.Horizontal = draw.LineStyle{Color: colGrid, Width: vg.Points(0.6)}
	p.Add(grid)
	return f
}

// Ticks returns the x axis ticks. It implements plot.Ticker.
func (f *frame) Ticks(min, max float64) []plot.Tick {
	f.x.style = f.p.X.Tick.Label
	return f.x.Ticks(min, max)
}

// maxAxis bounds the value axis: values beyond ±maxAxis are drawn at the
// edge of the data area. It keeps the axis range, with its padding and
// headroom, well inside the float64 range.
const maxAxis = math.MaxFloat64 / 16

// onAxis returns v limited to ±maxAxis, so that no drawn coordinate
// overflows when gonum/plot maps it to the canvas. NaN stays NaN.
func onAxis(v float64) float64 {
	return math.Max(-maxAxis, math.Min(v, maxAxis))
}

// include widens the value extent to cover vs (NaN and ±Inf are skipped),
// up to ±maxAxis.
func (f *frame) include(vs ...[]float64) {
	if lo, hi, ok := extent(vs...); ok {
		f.lo = math.Min(f.lo, math.Max(lo, -maxAxis))
		f.hi = math.Max(f.hi, math.Min(hi, maxAxis))
	}
}

// add adds plotters in drawing order.
func (f *frame) add(ps ...plot.Plotter) { f.p.Add(ps...) }

// done finishes the chart: the key goes on top, the x range is set to the
// labels with half a period either side, and the chart is laid out for the
// default size.
func (f *frame) done() *plot.Plot {
	f.p.Add(f.key)
	for _, q := range f.panels {
		q.f.p.Add(q.f.key)
	}
	f.fitStack(DefaultWidth, DefaultHeight)
	return f.p
}

// fit lays the chart out for a drawing w by h: it thins the x labels to the
// data area's width and sets the value axis so the headroom the top bands
// need stays free of data.
func (f *frame) fit(w, h vg.Length) {
	p := f.p
	p.X.Min, p.X.Max = -0.5, float64(f.n)-0.5

	lo, hi := f.valueRange()
	p.Y.Min, p.Y.Max = lo, hi

	dw := w - f.yAxisWidth() - f.rightOverhang() - vg.Points(4)
	dw = vg.Length(math.Max(float64(dw), float64(vg.Inch)))
	f.x.width = dw
	f.x.style = p.X.Tick.Label
	if f.x.nominal {
		dw = f.fitNominal(dw, h)
	}

	var room vg.Length
	for _, t := range f.tops {
		room += t.reserve(dw, room, p.X.Min, p.X.Max)
	}
	dh := h - f.titleHeight() - f.xAxisHeight() - vg.Points(4)
	// Value labels at least two and a half line heights apart.
	lines := float64(dh / (2.5 * p.Y.Tick.Label.Height("0")))
	p.Y.Tick.Marker = ValueTicks{Max: int(math.Max(2, math.Min(maxValueTicks, lines)))}
	if room > 0 && dh > 0 {
		room = vg.Length(math.Min(float64(room), 0.6*float64(dh)))
		p.Y.Max = hi + (hi-lo)*float64(room/(dh-room))
	}
}

// valueRange returns the value axis range before headroom.
func (f *frame) valueRange() (lo, hi float64) {
	lo, hi = f.lo, f.hi
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		lo, hi = 0, 1
	}
	if !math.IsNaN(f.yMin) {
		lo = f.yMin
	}
	if !math.IsNaN(f.yMax) {
		hi = f.yMax
	}
	if hi == lo {
		d := math.Max(math.Abs(hi)*0.1, 1)
		if f.zero && lo == 0 {
			return 0, d
		}
		return lo - d/2, hi + d/2
	}
	span := hi - lo
	bottom, top := lo-f.pad*span, hi+f.pad*span
	if math.IsNaN(f.yMin) && f.zero && lo >= 0 {
		bottom = 0
	}
	if !math.IsNaN(f.yMin) {
		bottom = lo
	}
	if !math.IsNaN(f.yMax) {
		top = hi
	}
	return bottom, top
}

// yAxisWidth estimates the width the value axis takes left of the data.
func (f *frame) yAxisWidth() vg.Length {
	a := f.p.Y
	var w vg.Length
	if a.Label.Text != "" {
		w += a.Label.TextStyle.Height(a.Label.Text) + a.Label.Padding
	}
	var lw vg.Length
	for _, t := range a.Tick.Marker.Ticks(a.Min, a.Max) {
		lw = vg.Length(math.Max(float64(lw), float64(a.Tick.Label.Width(t.Label))))
	}
	w += lw + a.Tick.Label.Width(" ") + a.Tick.Length + a.Width/2 + a.Padding
	return vg.Length(math.Max(float64(w), float64(f.minYAxis)))
}

// rightOverhang estimates how far the last x label reaches past the data.
func (f *frame) rightOverhang() vg.Length {
	var w vg.Length
	for _, l := range f.x.labels {
		w = vg.Length(math.Max(float64(w), float64(f.p.X.Tick.Label.Width(l))))
	}
	if f.x.nominal {
		return vg.Points(4)
	}
	return w / 2
}

// titleHeight is the height the title takes above the plot.
func (f *frame) titleHeight() vg.Length {
	if f.p.Title.Text == "" {
		return 0
	}
	return f.p.Title.TextStyle.Height(f.p.Title.Text) + f.p.Title.Padding
}

// xAxisHeight estimates the height the x axis takes below the data.
func (f *frame) xAxisHeight() vg.Length {
	a := f.p.X
	h := a.Tick.Length + a.Width/2 + a.Padding
	if a.Label.Text != "" {
		h += a.Label.TextStyle.Height(a.Label.Text) + a.Label.Padding
	}
	var th vg.Length
	for _, t := range f.Ticks(a.Min, a.Max) {
		r := a.Tick.Label.Rectangle(t.Label)
		th = vg.Length(math.Max(float64(th), float64(r.Max.Y-r.Min.Y)))
	}
	return h + th
}

// maxLabelLines is the most lines a wrapped category label may take, and
// maxTurnedRunes the most characters of a turned one.
const (
	maxLabelLines  = 3
	maxTurnedRunes = 40
)

// fitNominal wraps category labels to their slots in a data area dw wide.
// When even wrapped they do not fit in maxLabelLines lines, it turns them
// instead, by 30 degrees or more steeply when the slots are narrow (writing
// only every k-th label if even upright ones would touch), shortens long
// ones with an ellipsis so none reaches down more than a third of the
// height h, and, if a label would then run off the left edge, moves the
// data right. It
// returns the data area's new width.
func (f *frame) fitNominal(dw, h vg.Length) vg.Length {
	p := f.p
	p.Y.Padding = vg.Points(2)
	p.X.Tick.Label.Rotation = 0
	p.X.Tick.Label.XAlign = draw.XCenter
	p.X.Tick.Label.YAlign = draw.YTop
	slot := dw / vg.Length(f.n)
	room := slot - p.X.Tick.Label.Width("M")
	f.x.wrapped = make([]string, f.n)
	turn := false
	for i, l := range f.x.labels {
		f.x.wrapped[i] = wrapLabel(l, room, p.X.Tick.Label)
		if p.X.Tick.Label.Width(f.x.wrapped[i]) > room || strings.Count(f.x.wrapped[i], "\n") >= maxLabelLines {
			turn = true
		}
	}
	if !turn {
		return dw
	}
	for i, l := range f.x.labels {
		f.x.wrapped[i] = shorten(l, maxTurnedRunes)
	}
	// Parallel turned labels need a line height between them across the
	// slant: slot * sin(angle) >= height. Steeper when needed; when even
	// upright labels do not fit, only every k-th is written.
	sty := p.X.Tick.Label
	lh := sty.Height("M") * 1.15
	angle := math.Pi / 6
	if float64(slot)*math.Sin(angle) < float64(lh) {
		angle = math.Asin(math.Min(1, float64(lh/slot)))
	}
	if k := int(math.Ceil(float64(lh / slot))); k > 1 {
		for i := range f.x.wrapped {
			if i%k != 0 {
				f.x.wrapped[i] = ""
			}
		}
	}
	// No label may reach down more than a third of the drawing.
	for i, l := range f.x.wrapped {
		for n := len([]rune(l)); n > 4 && sty.Width(l)*vg.Length(math.Sin(angle)) > h/3; n-- {
			l = shorten(f.x.labels[i], n-1)
		}
		f.x.wrapped[i] = l
	}
	p.X.Tick.Label.Rotation = angle
	p.X.Tick.Label.XAlign = draw.XRight
	p.X.Tick.Label.YAlign = draw.YTop
	if angle > math.Pi/3 {
		p.X.Tick.Label.YAlign = draw.YCenter
	}
	sty = p.X.Tick.Label
	yw := f.yAxisWidth()
	var over vg.Length
	for i, l := range f.x.wrapped {
		reach := sty.Width(l)*vg.Length(math.Cos(angle)) + sty.Height("M")*vg.Length(math.Sin(angle))
		over = vg.Length(math.Max(float64(over), float64(reach-yw-slot*vg.Length(float64(i)+0.5))))
	}
	if over > 0 {
		p.Y.Padding += over
		dw -= over
		f.x.width = dw
	}
	return dw
}

// shorten cuts s to at most n characters, ending it with an ellipsis when
// cut.
func shorten(s string, n int) string {
	r := []rune(s)
	if len(r) <= n {
		return s
	}
	return string(r[:n-1]) + "…"
}
