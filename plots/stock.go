package plots

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A StockChart shows, period by period, what is asked for and what is made:
// demand as a line, capacity as a step line, the planned build as bars and
// the stock at the end of each period as a second line. It serves the
// buffer and frozen-production views of a plan.
//
// Each slice has one value per label (x = i) or is nil to leave that part
// out; at least one must be given. NaN marks a missing value (a gap in a
// line, no bar); ±Inf is an error.
type StockChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit, as the value axis label. Empty
	// gives "Quantity".
	Units string

	// Labels holds the label of each period; it must not be empty.
	Labels []string

	// Demand is the demand per period.
	Demand []float64

	// Capacity is the most that can be made per period. NaN marks a
	// period without a limit.
	Capacity []float64

	// Build is the quantity made per period, drawn as bars.
	Build []float64

	// Stock is the stock at the end of each period; it may be negative.
	Stock []float64
}

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for no labels or no series, ErrLength for a series whose length differs
// from Labels' and ErrNotFinite for ±Inf.
func (c StockChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("stock chart", err)
	}
	f := newFrame(c.Title, c.Labels, orDefault(c.Units, "Quantity"), false)
	f.zero = true
	f.include([]float64{0})

	var buildSw swatch
	if c.Build != nil {
		buildSw = swatch{fill: colBuild, rim: draw.LineStyle{Color: colBuildRim, Width: vg.Points(0.8)}}
		bs := make(bars, len(c.Build))
		for i, v := range c.Build {
			bs[i] = bar{x: float64(i), w: 0.6, y0: 0, y1: v, look: buildSw}
		}
		f.add(bs)
		f.include(c.Build)
	}
	if lo, _, ok := extent(c.Stock); ok && lo < 0 {
		f.add(&hrule{y: 0, line: draw.LineStyle{Color: colRule, Width: vg.Points(1)}})
	}
	var capThumb *plotter.Line
	if c.Capacity != nil {
		lk := look{Color: colIndigo, Width: vg.Points(2), Dashes: dashDash}
		for _, s := range steps(0, c.Capacity) {
			l := newLine(s, lk)
			f.add(l)
			if capThumb == nil {
				capThumb = l
			}
		}
		f.include(c.Capacity)
	}
	stockLook := look{Color: colRust, Width: vg.Points(1.8), Dashes: dashDashDot, Shape: draw.BoxGlyph{}, Radius: vg.Points(2.2)}
	stockThumbs := f.series(0, c.Stock, stockLook, 0.5)
	demandLook := look{Color: colInk, Width: vg.Points(1.6), Shape: draw.CircleGlyph{}, Radius: vg.Points(2.2)}
	demandThumbs := f.series(0, c.Demand, demandLook, 0)

	if demandThumbs != nil {
		f.key.add("Demand", demandThumbs...)
	}
	if capThumb != nil {
		f.key.add("Capacity", capThumb)
	}
	if c.Build != nil {
		f.key.add("Build", buildSw)
	}
	if stockThumbs != nil {
		f.key.add("Stock (end of period)", stockThumbs...)
	}
	return f.done(), nil
}

// check validates c.
func (c StockChart) check() error {
	n := len(c.Labels)
	if n == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if c.Demand == nil && c.Capacity == nil && c.Build == nil && c.Stock == nil {
		return fmt.Errorf("no demand, capacity, build or stock: %w", ErrNoData)
	}
	for _, s := range []struct {
		name string
		vs   []float64
	}{{"demand", c.Demand}, {"capacity", c.Capacity}, {"build", c.Build}, {"stock", c.Stock}} {
		if s.vs == nil {
			continue
		}
		if err := sameLength(s.name, s.vs, n, "label"); err != nil {
			return err
		}
		if err := finiteOrNaN(s.name, s.vs); err != nil {
			return err
		}
	}
	return nil
}
