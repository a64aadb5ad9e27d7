package plots

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A SignalChart plots a tracking signal (the running sum of forecast errors
// divided by the mean absolute deviation) period by period, with lines at
// +Limit and -Limit. Points beyond a limit get a distinct marker.
//
// Signal[i] is drawn at x = i, so Labels and Signal have the same length.
type SignalChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Labels holds the period label of each value; it must not be empty.
	Labels []string

	// Signal is the tracking signal per period. NaN marks a period where
	// it is undefined (no deviation yet) and leaves a gap; ±Inf is an
	// error, and at least one value must be a number.
	Signal []float64

	// Limit is the alarm level, drawn at +Limit and -Limit; finite and
	// positive (4 is a common choice; common practice).
	Limit float64

	// YLabel is the value-axis label; empty means the cumulative signal's
	// "Tracking signal (running error sum ÷ MAD)".
	YLabel string
}

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for no labels or no defined value, ErrLength when Signal and Labels differ
// in length, ErrNotFinite for ±Inf or a NaN Limit and ErrRange for a Limit
// that is not positive.
func (c SignalChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("signal chart", err)
	}
	ylabel := c.YLabel
	if ylabel == "" {
		ylabel = "Tracking signal (running error sum ÷ MAD)"
	}
	f := newFrame(c.Title, c.Labels, ylabel, false)
	f.pad = 0.08
	f.include(c.Signal, []float64{c.Limit, -c.Limit})
	dec := decimalsFor(c.Limit)

	limit := draw.LineStyle{Color: colRust, Width: vg.Points(1.5), Dashes: dashDash}
	hi := &hrule{y: c.Limit, line: limit}
	lo := &hrule{y: -c.Limit, line: limit}
	zero := &hrule{y: 0, line: draw.LineStyle{Color: colRule, Width: vg.Points(1)}}
	f.add(zero, hi, lo)

	lk := look{Color: colIndigo, Width: vg.Points(1.6), Shape: draw.CircleGlyph{}, Radius: vg.Points(2)}
	rs := runs(0, c.Signal)
	var line *plotter.Line
	var in, out plotter.XYs
	for _, r := range rs {
		l := newLine(r, lk)
		if line == nil {
			line = l
		}
		f.add(l)
		for _, p := range r {
			if math.Abs(p.Y) > c.Limit {
				out = append(out, p)
			} else {
				in = append(in, p)
			}
		}
	}
	dots := &plotter.Scatter{XYs: in, GlyphStyle: lk.glyphStyle()}
	f.add(dots)
	f.key.add("Tracking signal", line, dots)
	f.key.add(fmt.Sprintf("Limits ±%s", groupDigits(c.Limit, dec)), hi)
	if len(out) > 0 {
		alarm := &plotter.Scatter{XYs: out, GlyphStyle: draw.GlyphStyle{
			Color: colRust, Radius: vg.Points(3.6), Shape: draw.PyramidGlyph{},
		}}
		f.add(alarm)
		f.key.add("Beyond a limit", alarm)
	}
	return f.done(), nil
}

// check validates c.
func (c SignalChart) check() error {
	if len(c.Labels) == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if err := sameLength("signal", c.Signal, len(c.Labels), "label"); err != nil {
		return err
	}
	if err := finiteOrNaN("signal", c.Signal); err != nil {
		return err
	}
	if _, _, ok := extent(c.Signal); !ok {
		return fmt.Errorf("signal has no defined value: %w", ErrNoData)
	}
	if err := finiteScalar("limit", c.Limit); err != nil {
		return err
	}
	if c.Limit <= 0 {
		return fmt.Errorf("limit %v is not positive: %w", c.Limit, ErrRange)
	}
	return nil
}
