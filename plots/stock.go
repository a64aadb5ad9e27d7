package plots

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A StockChart shows, period by period, what is asked for and what is made,
// and the stock that results. It serves the buffer and frozen-production
// views of a plan.
//
// The upper panel holds demand as a line, capacity as a step line and the
// planned build as bars, on a value axis from zero. The stock at the end of
// each period has a panel of its own below, on its own value axis, so a
// pre-build that is small beside the demand still shows: bars rising from
// zero, hatched where the stock is below zero (a backlog). Without demand,
// capacity and build the stock is the only panel.
//
// Each slice has one value per label (x = i) or is nil to leave that part
// out; at least one must be given. NaN marks a missing value (a gap in a
// line, no bar); ±Inf is an error.
type StockChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit of demand, capacity and build, as
	// the value axis label of the upper panel. Empty gives "Quantity".
	Units string

	// StockUnits is the value axis label of the stock panel. Empty gives
	// "Stock".
	StockUnits string

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

// stockShare is the share of the chart's height the stock panel takes.
const stockShare = 0.36

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for no labels or no series, ErrLength for a series whose length differs
// from Labels' and ErrNotFinite for ±Inf.
func (c StockChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("stock chart", err)
	}
	stockUnits := orDefault(c.StockUnits, "Stock")
	if c.Demand == nil && c.Capacity == nil && c.Build == nil {
		f := newFrame(c.Title, c.Labels, stockUnits, false)
		addStock(f, f.key, c.Stock)
		return f.done(), nil
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
	if lo, _, ok := extent(c.Demand, c.Capacity, c.Build); ok && lo < 0 {
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
	if c.Stock != nil {
		g := newFrame("", c.Labels, stockUnits, false)
		addStock(g, f.key, c.Stock)
		f.stack(g, stockShare)
	}
	return f.done(), nil
}

// addStock draws the stock at the end of each period as bars from zero on
// f, light where there is stock and hatched where it is below zero, and
// names them in key (the chart's one key, above the top panel).
func addStock(f *frame, key *legend, stock []float64) {
	f.zero = true
	f.include([]float64{0}, stock)
	held := swatch{fill: tint(colRust, 0x59), rim: draw.LineStyle{Color: colRust, Width: vg.Points(0.8)}}
	short := swatch{fill: tint(colDown, 0x80), rim: draw.LineStyle{Color: rgb(0x5a2410), Width: vg.Points(0.8)}, hatch: rgb(0x5a2410)}
	bs := make(bars, 0, len(stock))
	hasShort := false
	for i, v := range stock {
		b := bar{x: float64(i), w: 0.6, y0: 0, y1: v, look: held}
		if v < 0 {
			b.look, hasShort = short, true
		}
		bs = append(bs, b)
	}
	f.add(bs)
	f.add(&hrule{y: 0, line: draw.LineStyle{Color: colRule, Width: vg.Points(1)}})
	key.add("Stock at end of period", held)
	if hasShort {
		key.add("Backlog (stock below zero)", short)
	}
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
