package plots

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A FanChart shows the spread of simulated outcomes (for example from a Monte
// Carlo run of a scenario) period by period: two nested bands, P5 to P95 and
// P10 to P90, the median (P50) and the mean as lines, an optional capacity
// drawn as a step line, and the history leading in.
//
// The quantile slices all start at x position Start and have one value per
// forecast period.
type FanChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit, as the value axis label. Empty
	// gives "Quantity".
	Units string

	// Labels holds the label of each x position; it must not be empty.
	Labels []string

	// History is the actual demand before the simulation; it may be empty.
	// Its default name is "History". A band on it is drawn too.
	History Curve

	// Start is the x position of the first simulated period.
	Start int

	// P5, P10, P50, P90 and P95 are the 5th, 10th, 50th, 90th and 95th
	// percentiles of the outcomes in each period. They must have the same,
	// non-zero length and not be ±Inf; NaN leaves a gap. They are drawn as
	// given: where a lower quantile lies above an upper one (rounding can
	// cross two nearly equal quantiles) their band has no width.
	P5, P10, P50, P90, P95 []float64

	// Mean is the mean outcome per period, drawn dashed. Nil leaves it out;
	// otherwise it is as long as P50, with NaN for a gap.
	Mean []float64

	// Capacity is the most that can be supplied per period, drawn as a
	// step line. Nil leaves it out; otherwise it is as long as P50, and NaN
	// marks a period without a limit.
	Capacity []float64
}

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for empty Labels or quantiles, ErrLength when the slices differ in length,
// ErrRange when they run past the labels and ErrNotFinite for ±Inf.
func (c FanChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("fan chart", err)
	}
	f := newFrame(c.Title, c.Labels, orDefault(c.Units, "Quantity"), false)

	outer := newBand(c.Start, c.P5, c.P95, colFanOuter, draw.LineStyle{})
	inner := newBand(c.Start, c.P10, c.P90, colFanInner, draw.LineStyle{})
	f.add(outer, inner)
	f.include(c.P5, c.P95)

	hist := named(c.History, "History")
	histBand := f.band(hist, lookHistory)

	var capThumb plot.Thumbnailer
	if c.Capacity != nil {
		lk := look{Color: colRust, Width: vg.Points(2.2), Dashes: dashLong}
		for _, s := range steps(c.Start, c.Capacity) {
			l := newLine(s, lk)
			f.add(l)
			if capThumb == nil {
				capThumb = l
			}
		}
		f.include(c.Capacity)
	}
	var meanThumbs []plot.Thumbnailer
	if c.Mean != nil {
		lk := look{Color: colPlum, Width: vg.Points(1.6), Dashes: dashDash, Shape: draw.BoxGlyph{}, Radius: vg.Points(2)}
		meanThumbs = f.series(c.Start, c.Mean, lk, 0.5)
	}
	median := look{Color: colIndigo, Width: vg.Points(2), Shape: draw.CircleGlyph{}, Radius: vg.Points(2.2)}
	medThumbs := f.series(c.Start, c.P50, median, 0)
	histThumbs := f.series(hist.Start, hist.Values, lookHistory, 0, histBand)

	if histThumbs != nil {
		f.key.add(hist.Name, histThumbs...)
	}
	f.key.add("Median (P50)", medThumbs...)
	if meanThumbs != nil {
		f.key.add("Mean", meanThumbs...)
	}
	f.key.add("P10 to P90", inner)
	f.key.add("P5 to P95", outer)
	if capThumb != nil {
		f.key.add("Capacity", capThumb)
	}
	return f.done(), nil
}

// check validates c.
func (c FanChart) check() error {
	n := len(c.Labels)
	if n == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if err := c.History.check("history", n); err != nil {
		return err
	}
	m := len(c.P50)
	if m == 0 {
		return fmt.Errorf("p50: %w", ErrNoData)
	}
	if c.Start < 0 || c.Start+m > n {
		return fmt.Errorf("quantiles at positions %d to %d, but the chart has %d labels: %w", c.Start, c.Start+m-1, n, ErrRange)
	}
	qs := []struct {
		name string
		vs   []float64
	}{{"p5", c.P5}, {"p10", c.P10}, {"p50", c.P50}, {"p90", c.P90}, {"p95", c.P95}}
	for _, q := range qs {
		if err := sameLength(q.name, q.vs, m, "value of p50"); err != nil {
			return err
		}
		if err := finiteOrNaN(q.name, q.vs); err != nil {
			return err
		}
	}
	if c.Mean != nil {
		if err := sameLength("mean", c.Mean, m, "value of p50"); err != nil {
			return err
		}
		if err := finiteOrNaN("mean", c.Mean); err != nil {
			return err
		}
	}
	if c.Capacity != nil {
		if err := sameLength("capacity", c.Capacity, m, "value of p50"); err != nil {
			return err
		}
		if err := finiteOrNaN("capacity", c.Capacity); err != nil {
			return err
		}
	}
	return nil
}
