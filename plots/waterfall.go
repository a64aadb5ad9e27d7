package plots

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A Waterfall walks from a starting total through the contribution of each
// event to the end total. The totals are solid bars; an increase is a light
// bar rising from the running total, a decrease a darker, hatched bar falling
// from it, so the two differ in grey as well as colour. Thin dotted lines
// carry the running total from bar to bar, and every bar is labelled with
// its amount.
//
// The end total is Start plus the sum of the steps:
//
//	end = Start + Σ Steps[k].Value
//
// The value axis starts at zero, unless every running total is positive and
// they all lie within a range narrower than half the smallest; the axis then
// starts at a round value below the smallest total so the steps stay
// visible, and the total bars carry a break mark to show they are cut.
type Waterfall struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit, as the value axis label. Empty
	// gives "Quantity".
	Units string

	// StartLabel names the starting total; empty gives "Start".
	StartLabel string

	// Start is the starting total, such as the baseline's sum over the
	// plan horizon. It must be finite.
	Start float64

	// Steps are the contributions in the order they are applied. Each
	// needs a label and a finite value. There may be none.
	Steps []Step

	// EndLabel names the end total; empty gives "End".
	EndLabel string
}

// A Step is one contribution of a Waterfall.
type Step struct {
	// Label names the contribution (an event of the scenario); it must not
	// be empty. Long labels are wrapped or turned to fit.
	Label string

	// Value is the amount added (negative: taken away); finite.
	Value float64
}

// Bar geometry in x units (one category per unit).
const barWidth = 0.62

// Plot checks c and builds the chart. It returns an error wrapping
// ErrNotFinite for a NaN or infinite amount (or a running total that
// overflows) and ErrNoData for a step without a label.
func (c Waterfall) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("waterfall", err)
	}
	n := len(c.Steps)
	labels := make([]string, 0, n+2)
	labels = append(labels, orDefault(c.StartLabel, "Start"))
	totals := make([]float64, n+1) // totals[k] = running total after k steps
	totals[0] = c.Start
	vals := []float64{c.Start}
	for k, s := range c.Steps {
		labels = append(labels, s.Label)
		totals[k+1] = totals[k] + s.Value
		vals = append(vals, s.Value)
	}
	labels = append(labels, orDefault(c.EndLabel, "End"))
	end := totals[n]
	vals = append(vals, end)

	f := newFrame(c.Title, labels, orDefault(c.Units, "Quantity"), true)
	f.p.X.Label.Text = ""
	f.zero = true
	f.pad = 0.06
	base, cut := waterfallBase(totals)
	f.include(totals, []float64{base})
	if cut {
		f.yMin = base
	}

	total := swatch{fill: colTotal, rim: draw.LineStyle{Color: colInk, Width: vg.Points(0.8)}}
	up := swatch{fill: colUp, rim: draw.LineStyle{Color: rgb(0x2c6a4e), Width: vg.Points(0.9)}}
	down := swatch{fill: colDown, rim: draw.LineStyle{Color: rgb(0x5a2410), Width: vg.Points(0.9)}, hatch: rgb(0x5a2410)}

	bs := bars{{x: 0, w: barWidth, y0: base, y1: c.Start, look: total, cut: cut}}
	hasUp, hasDown := false, false
	for k, s := range c.Steps {
		b := bar{x: float64(k + 1), w: barWidth, y0: totals[k], y1: totals[k+1], look: up}
		if s.Value < 0 {
			b.look = down
			hasDown = true
		} else {
			hasUp = true
		}
		bs = append(bs, b)
	}
	bs = append(bs, bar{x: float64(n + 1), w: barWidth, y0: base, y1: end, look: total, cut: cut})

	link := draw.LineStyle{Color: rgb(0x666666), Width: vg.Points(0.8), Dashes: dashFine}
	for k := 0; k <= n; k++ {
		l := newLine(plotter.XYs{{X: float64(k) + barWidth/2, Y: onAxis(totals[k])}, {X: float64(k+1) - barWidth/2, Y: onAxis(totals[k])}}, look{})
		l.LineStyle = link
		f.add(l)
	}
	f.add(bs)

	dec := decimalsFor(vals...)
	var above, below plotter.XYLabels
	put := func(x, y float64, s string, under bool) {
		if under {
			below.XYs = append(below.XYs, plotter.XY{X: x, Y: onAxis(y)})
			below.Labels = append(below.Labels, s)
		} else {
			above.XYs = append(above.XYs, plotter.XY{X: x, Y: onAxis(y)})
			above.Labels = append(above.Labels, s)
		}
	}
	put(0, c.Start, groupDigits(c.Start, dec), c.Start < base)
	for k, s := range c.Steps {
		if s.Value < 0 {
			put(float64(k+1), totals[k+1], signedDigits(s.Value, dec), true)
		} else {
			put(float64(k+1), totals[k+1], signedDigits(s.Value, dec), false)
		}
	}
	put(float64(n+1), end, groupDigits(end, dec), end < base)
	for _, set := range []struct {
		l     plotter.XYLabels
		under bool
	}{{above, false}, {below, true}} {
		if len(set.l.XYs) == 0 {
			continue
		}
		sty := textStyle(fontSans, sizeNote, colInk)
		sty.XAlign = draw.XCenter
		off := vg.Points(3)
		sty.YAlign = draw.YBottom
		if set.under {
			sty.YAlign = draw.YTop
			off = -off
		}
		styles := make([]text.Style, len(set.l.XYs))
		for i := range styles {
			styles[i] = sty
		}
		f.add(&plotter.Labels{XYs: set.l.XYs, Labels: set.l.Labels, TextStyle: styles, Offset: vg.Point{Y: off}})
	}
	// Room for the labels above the highest bar and below the lowest.
	f.include([]float64{f.hi + 0.05*(f.hi-f.lo)})
	if !cut && f.lo < 0 {
		f.include([]float64{f.lo - 0.05*(f.hi-f.lo)})
	}

	f.key.add("Total", total)
	if hasUp {
		f.key.add("Increase", up)
	}
	if hasDown {
		f.key.add("Decrease", down)
	}
	return f.done(), nil
}

// waterfallBase returns where the value axis starts: 0, or, when every
// total is positive and they span less than half the smallest, a round value
// below the smallest (cut is then true).
func waterfallBase(totals []float64) (base float64, cut bool) {
	lo, hi, _ := extent(totals)
	if lo <= 0 || hi-lo >= 0.5*lo {
		return 0, false
	}
	span := hi - lo
	if span == 0 {
		span = 0.1 * lo
	}
	b := lo - 0.6*span
	step, _, _ := niceStep(b, hi, maxValueTicks)
	b = math.Floor(b/step) * step
	if b <= 0 {
		return 0, false
	}
	return b, true
}

// check validates c.
func (c Waterfall) check() error {
	if err := finiteScalar("start", c.Start); err != nil {
		return err
	}
	total := c.Start
	for k, s := range c.Steps {
		if s.Label == "" {
			return fmt.Errorf("step %d has no label: %w", k+1, ErrNoData)
		}
		what := fmt.Sprintf("step %d (%q)", k+1, s.Label)
		if err := finiteScalar(what, s.Value); err != nil {
			return err
		}
		total += s.Value
		if err := finiteScalar("running total after "+what, total); err != nil {
			return err
		}
	}
	return nil
}
