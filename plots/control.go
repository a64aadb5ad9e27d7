package plots

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A ControlChart plots forecast errors period by period around a centre line
// at zero, with the upper and lower control limits, optional guide lines at
// one and two standard deviations, and a distinct marker with a short note at
// each point where a rule fired.
//
// Errors[i] is drawn at x = i, so Labels and Errors have the same length.
type ControlChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the unit of the errors; the value axis reads
	// "Forecast error (Units)", or just "Forecast error" when empty.
	Units string

	// Labels holds the period label of each error; it must not be empty.
	Labels []string

	// Errors are the forecast errors, one per label, all finite. The sign
	// convention is the caller's.
	Errors []float64

	// UCL and LCL are the upper and lower control limits; finite, with
	// LCL < UCL.
	UCL, LCL float64

	// Sigma is the standard deviation of the errors. When positive, dotted
	// guide lines are drawn at ±Sigma and ±2 Sigma; zero leaves them out. It
	// must be finite and not negative.
	Sigma float64

	// Hits are the points where a rule fired, marked with a ring and noted.
	Hits []Hit
}

// A Hit marks a point of a ControlChart where a rule fired.
type Hit struct {
	// Index is the position of the point in Errors.
	Index int

	// Label is a short note written by the point, such as the rule's
	// number; it may be empty. Notes of several hits at one point are
	// joined with commas.
	Label string
}

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for no labels, ErrLength when Errors and Labels differ in length,
// ErrNotFinite for NaN or ±Inf, ErrOrder when LCL >= UCL and ErrRange for a
// negative Sigma or a hit outside the errors.
func (c ControlChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("control chart", err)
	}
	y := "Forecast error"
	if c.Units != "" {
		y += " (" + c.Units + ")"
	}
	f := newFrame(c.Title, c.Labels, y, false)
	f.pad = 0.1
	f.include(c.Errors, []float64{c.UCL, c.LCL, 0})
	dec := decimalsFor(c.UCL, c.LCL)

	var guides []plot.Thumbnailer
	if c.Sigma > 0 {
		for _, k := range []float64{-2, -1, 1, 2} {
			sty := draw.LineStyle{Color: colSlate, Width: vg.Points(0.8), Dashes: dashFine}
			if k == -2 || k == 2 {
				sty.Dashes = dashDot
			}
			r := &hrule{y: k * c.Sigma, line: sty}
			f.add(r)
			if k == 1 {
				guides = append(guides, r)
			}
		}
	}
	centre := &hrule{y: 0, line: draw.LineStyle{Color: colRule, Width: vg.Points(1)}}
	limit := draw.LineStyle{Color: colRust, Width: vg.Points(1.5), Dashes: dashDash}
	ucl := &hrule{y: c.UCL, line: limit}
	lcl := &hrule{y: c.LCL, line: limit}
	f.add(centre, ucl, lcl)

	pts := look{Color: colInk, Width: vg.Points(0.9), Shape: draw.CircleGlyph{}, Radius: vg.Points(2.2)}
	xys := runs(0, c.Errors)[0]
	line := newLine(xys, look{Color: rgb(0x7a7a7a), Width: vg.Points(0.9)})
	dots := &plotter.Scatter{XYs: xys, GlyphStyle: pts.glyphStyle()}
	f.add(line, dots)

	var hitMark *plotter.Scatter
	if len(c.Hits) > 0 {
		idx, notes := c.hitNotes()
		hx := make(plotter.XYs, len(idx))
		for k, i := range idx {
			hx[k] = plotter.XY{X: float64(i), Y: onAxis(c.Errors[i])}
		}
		hitMark = &plotter.Scatter{XYs: hx, GlyphStyle: draw.GlyphStyle{
			Color: colRust, Radius: vg.Points(5), Shape: thickRing{width: vg.Points(1.6)},
		}}
		f.add(hitMark)
		for k, i := range idx {
			if notes[k] == "" {
				continue
			}
			sty := textStyle(fontBold, sizeNote, colRust)
			sty.XAlign = draw.XCenter
			dy := vg.Points(7)
			sty.YAlign = draw.YBottom
			if c.Errors[i] < 0 {
				sty.YAlign = draw.YTop
				dy = -dy
			}
			lb := &plotter.Labels{
				XYs:       plotter.XYs{hx[k]},
				Labels:    []string{notes[k]},
				TextStyle: []text.Style{sty},
				Offset:    vg.Point{Y: dy},
			}
			f.add(lb)
		}
	}

	f.key.add("Error", line, dots)
	f.key.add(fmt.Sprintf("Limits: UCL %s, LCL %s", groupDigits(c.UCL, dec), groupDigits(c.LCL, dec)), ucl)
	if guides != nil {
		f.key.add("±1σ, ±2σ", guides...)
	}
	if hitMark != nil {
		f.key.add("Rule fired", hitMark)
	}
	return f.done(), nil
}

// hitNotes returns the hit positions in increasing order and the joined
// notes of each.
func (c ControlChart) hitNotes() ([]int, []string) {
	byIdx := map[int][]string{}
	for _, h := range c.Hits {
		l := byIdx[h.Index]
		if h.Label != "" && !slices.Contains(l, h.Label) {
			l = append(l, h.Label)
		}
		byIdx[h.Index] = l
	}
	idx := make([]int, 0, len(byIdx))
	for i := range byIdx {
		idx = append(idx, i)
	}
	sort.Ints(idx)
	notes := make([]string, len(idx))
	for k, i := range idx {
		notes[k] = strings.Join(byIdx[i], ",")
	}
	return idx, notes
}

// check validates c.
func (c ControlChart) check() error {
	if len(c.Labels) == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if err := sameLength("errors", c.Errors, len(c.Labels), "label"); err != nil {
		return err
	}
	if err := finite("errors", c.Errors); err != nil {
		return err
	}
	for _, s := range []struct {
		name string
		v    float64
	}{{"ucl", c.UCL}, {"lcl", c.LCL}, {"sigma", c.Sigma}} {
		if err := finiteScalar(s.name, s.v); err != nil {
			return err
		}
	}
	if c.LCL >= c.UCL {
		return fmt.Errorf("lcl %v is not below ucl %v: %w", c.LCL, c.UCL, ErrOrder)
	}
	if c.Sigma < 0 {
		return fmt.Errorf("sigma %v is negative: %w", c.Sigma, ErrRange)
	}
	for k, h := range c.Hits {
		if h.Index < 0 || h.Index >= len(c.Errors) {
			return fmt.Errorf("hit %d at index %d, outside 0 to %d: %w", k+1, h.Index, len(c.Errors)-1, ErrRange)
		}
	}
	return nil
}

// thickRing is a hollow circle drawn with a heavier line than gonum's ring,
// so rule hits stand out around the ordinary points.
type thickRing struct{ width vg.Length }

// DrawGlyph draws the ring. It implements draw.GlyphDrawer.
func (r thickRing) DrawGlyph(c *draw.Canvas, sty draw.GlyphStyle, pt vg.Point) {
	c.SetLineStyle(draw.LineStyle{Color: sty.Color, Width: r.width})
	var p vg.Path
	p.Move(vg.Point{X: pt.X + sty.Radius, Y: pt.Y})
	p.Arc(pt, sty.Radius, 0, 2*math.Pi)
	p.Close()
	c.Stroke(p)
}
