package plots

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A LoadChart sets the load on one shared resource (a line, a filler, a
// store) against its capacity, period by period: the load of each
// scenario as a line, a band around the load of one scenario (the
// highlighted one), and the capacity as a step line. The periods where
// the highlighted load, or the upper edge of its band, lies above the
// capacity are shaded over the whole height of the chart and hatched, so
// they read in grey and in print: lightly hatched where only the band
// reaches above the capacity, cross-hatched where the load itself does.
//
// The chart draws what it is given: the caller computes the loads and the
// band (a plan's load plus or minus a multiple of its standard deviation,
// or Monte Carlo quantiles of a stress run). The only thing it works out
// itself is which periods to mark, by comparing the highlighted load and
// its upper edge with the capacity of the same period; a period without a
// capacity (NaN) or without a value (NaN) is never marked.
//
// Every load is placed by x position, as a Curve is. Marks are drawn
// first, then the bands, then the scenario lines (last first), the
// baseline, and the capacity on top, so no band hides a line and the
// capacity is never covered. Each scenario has the look (colour, grey
// level, dash pattern and marker) it has in a PlanChart or a
// ComparisonChart with the same scenarios in the same order.
type LoadChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the resource's unit and period, as the value axis label
	// ("line-hours per month"). Empty gives "Load".
	Units string

	// Labels holds the label of each x position: Labels[i] names the
	// period at x = i. It must not be empty.
	Labels []string

	// Baseline is the load of the demand without events. It may be empty.
	// Its default name is "Baseline"; it is drawn in the baseline look of
	// the plan chart.
	Baseline Curve

	// Scenarios are the loads of the scenarios, drawn in turn in the six
	// scenario looks, which repeat from the seventh on. Each must have
	// values; a missing name becomes "Scenario k".
	Scenarios []Curve

	// Highlight is the index in Scenarios of the highlighted load, the one
	// whose periods over capacity are marked; with no scenarios the
	// Baseline is highlighted and Highlight must be 0. The highlighted
	// load's band (its Lower and Upper) is the chart's band; the chart is
	// meant to carry no other, though it draws every band it is given. Its
	// name in the key should say what the band is ("plan, ± 2 SD").
	Highlight int

	// Capacity is the most the resource can do in each period, drawn as a
	// step line. Nil leaves it out (and nothing is marked); otherwise it
	// has one value per label, NaN marking a period without a capacity,
	// and ±Inf is an error.
	Capacity []float64
}

// Looks of the load chart: the capacity as a heavy dark solid step line
// with no marker (no load line is solid, dark and unmarked at once), the
// periods where the band reaches above it lightly hatched, and those where
// the load does, darker and cross-hatched.
var (
	lookCapacity = look{Color: colInk, Width: vg.Points(2.4)}
	lookBandOver = spanLook{
		fill:  tint(colRust, 0x1c),
		hatch: tint(colRust, 0x73),
		edge:  draw.LineStyle{Color: tint(colRust, 0x99), Width: vg.Points(0.6), Dashes: dashFine},
	}
	lookLoadOver = spanLook{
		fill:  tint(colRust, 0x38),
		hatch: tint(colRust, 0xb3),
		cross: true,
		edge:  draw.LineStyle{Color: colRust, Width: vg.Points(0.8)},
	}
)

// Plot checks c and builds the chart. It returns an error wrapping
// ErrNoData when Labels is empty, a scenario has no values or no load has
// any, ErrRange for a load outside the labels or a Highlight that is not
// an index of Scenarios, ErrLength for a band whose length differs from
// its load's or a Capacity whose length differs from Labels', and
// ErrNotFinite for ±Inf in a load, a band or the capacity.
func (c LoadChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("load chart", err)
	}
	f := newFrame(c.Title, c.Labels, orDefault(c.Units, "Load"), false)

	base := named(c.Baseline, "Baseline")
	scen := make([]Curve, len(c.Scenarios))
	for k, s := range c.Scenarios {
		scen[k] = named(s, fmt.Sprintf("Scenario %d", k+1))
	}
	hi := base
	if len(scen) > 0 {
		hi = scen[c.Highlight]
	}
	bandOver, loadOver := c.marks(hi)
	if len(bandOver)+len(loadOver) > 0 {
		s := &spans{style: textStyle(fontIt, sizeNote, colInk)}
		for _, w := range bandOver {
			s.items = append(s.items, spanItem{w: w, look: lookBandOver})
		}
		for _, w := range loadOver {
			s.items = append(s.items, spanItem{w: w, look: lookLoadOver})
		}
		f.add(s)
	}

	baseBand := f.band(base, lookBaseline)
	scenBands := make([]plot.Thumbnailer, len(scen))
	for k, s := range scen {
		scenBands[k] = f.band(s, scenarioLooks[k%len(scenarioLooks)])
	}
	scenThumbs := make([][]plot.Thumbnailer, len(scen))
	for k := len(scen) - 1; k >= 0; k-- {
		lk := scenarioLooks[k%len(scenarioLooks)]
		scenThumbs[k] = f.series(scen[k].Start, scen[k].Values, lk, float64(k)/float64(len(scen)), scenBands[k])
	}
	baseThumbs := f.series(base.Start, base.Values, lookBaseline, 0, baseBand)
	capThumb := c.addCapacity(f)

	if baseThumbs != nil {
		f.key.add(base.Name, baseThumbs...)
	}
	for k, s := range scen {
		if scenThumbs[k] != nil {
			f.key.add(s.Name, scenThumbs[k]...)
		}
	}
	if capThumb != nil {
		f.key.add("Capacity", capThumb)
	}
	if len(bandOver) > 0 {
		f.key.add("Band above capacity", lookBandOver)
	}
	if len(loadOver) > 0 {
		f.key.add("Load above capacity", lookLoadOver)
	}
	return f.done(), nil
}

// addCapacity draws the capacity as a step line on f, on top of
// everything drawn so far, and returns its key thumbnail (nil when there
// is no capacity to draw).
func (c LoadChart) addCapacity(f *frame) plot.Thumbnailer {
	var thumb *plotter.Line
	for _, s := range steps(0, c.Capacity) {
		l := newLine(s, lookCapacity)
		f.add(l)
		if thumb == nil {
			thumb = l
		}
	}
	f.include(c.Capacity)
	if thumb == nil {
		return nil
	}
	return thumb
}

// marks returns the windows, in whole periods, where load h lies above the
// capacity (loadOver) and where only its band's upper edge does
// (bandOver). Neighbouring periods of one kind make one window.
func (c LoadChart) marks(h Curve) (bandOver, loadOver []Window) {
	if c.Capacity == nil {
		return nil, nil
	}
	kind := make([]int, len(c.Labels)) // 0 none, 1 band above, 2 load above
	for j, v := range h.Values {
		x := h.Start + j
		cp := c.Capacity[x]
		switch {
		case math.IsNaN(cp):
		case v > cp:
			kind[x] = 2
		case h.hasBand() && h.Upper[j] > cp:
			kind[x] = 1
		}
	}
	for x := 0; x < len(kind); {
		k, end := kind[x], x
		for end+1 < len(kind) && kind[end+1] == k {
			end++
		}
		w := Window{From: float64(x) - 0.5, To: float64(end) + 0.5}
		switch k {
		case 1:
			bandOver = append(bandOver, w)
		case 2:
			loadOver = append(loadOver, w)
		}
		x = end + 1
	}
	return bandOver, loadOver
}

// check validates c.
func (c LoadChart) check() error {
	n := len(c.Labels)
	if n == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if err := c.Baseline.check("baseline", n); err != nil {
		return err
	}
	if err := checkScenarios(c.Scenarios, n, true); err != nil {
		return err
	}
	if len(c.Baseline.Values) == 0 && len(c.Scenarios) == 0 {
		return fmt.Errorf("no load has values: %w", ErrNoData)
	}
	if m := len(c.Scenarios); c.Highlight < 0 || c.Highlight >= max(m, 1) {
		return fmt.Errorf("highlight %d is not an index of the %d scenarios: %w", c.Highlight, m, ErrRange)
	}
	return checkCapacity(c.Capacity, n)
}
