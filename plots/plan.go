package plots

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A PlanChart shows a plan over time: the history, the statistical baseline,
// the baseline adjusted by each scenario, each with its band if it has one,
// the windows of the scenario's events shaded and labelled, the past events
// that were cleaned out of the history shaded in a look of their own, and a
// vertical line where the forecast starts.
//
// Each window's label is written above the data at the window's left edge,
// in the first row where it keeps clear of every other label, so labels of
// events in neighbouring periods never overlap.
//
// Every curve is placed by x position, the index into Labels (see Curve).
// Windows are drawn first, then all bands, then the scenario lines, the
// baseline and the history on top, so no band hides a line and the actuals
// are never covered.
type PlanChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit of the values, as the value axis
	// label ("litres per month"). Empty gives "Quantity".
	Units string

	// Labels holds the label of each x position: Labels[i] names the period
	// at x = i. It must not be empty. Period labels (2026-03, 2026-Q1, ...)
	// are thinned by the calendar; other strings every k-th.
	Labels []string

	// History is the actual demand. It may be empty. Its default name is
	// "History".
	History Curve

	// Baseline is the statistical forecast (and, if wanted, its fit over
	// the history). It may be empty. Its default name is "Baseline".
	Baseline Curve

	// Scenarios are the adjusted plans, drawn in turn in six distinct looks
	// (colour, grey level, dash pattern and marker), which repeat from the
	// seventh on. Each must have values; a missing name becomes
	// "Scenario k".
	Scenarios []Curve

	// Windows are shaded behind the curves and labelled at the top.
	Windows []Window

	// Past are the windows of past events, the ones cleaned out of the
	// history before the baseline was fitted: shaded grey and hatched, and
	// labelled as Windows are.
	Past []Window

	// ForecastStart is the x position of the first forecast period. A
	// dashed line is drawn half a period before it, between the last
	// actual and the first forecast, with the notes "actuals" and
	// "forecast" at its foot. Zero draws no line; it must lie in
	// [0, len(Labels)].
	ForecastStart int
}

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// when Labels is empty or no curve has values, ErrRange for a curve or
// ForecastStart outside the labels, ErrNotFinite for ±Inf in a curve or NaN
// or ±Inf in a window, ErrLength for a band whose length differs from its
// curve's, and ErrOrder for a window the wrong way round.
func (c PlanChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("plan chart", err)
	}
	f := newFrame(c.Title, c.Labels, orDefault(c.Units, "Quantity"), false)

	c.addWindows(f)

	hist := named(c.History, "History")
	base := named(c.Baseline, "Baseline")
	scen := make([]Curve, len(c.Scenarios))
	for k, s := range c.Scenarios {
		scen[k] = named(s, fmt.Sprintf("Scenario %d", k+1))
	}

	// Bands under everything, widest context first.
	histBand := f.band(hist, lookHistory)
	baseBand := f.band(base, lookBaseline)
	scenBands := make([]plot.Thumbnailer, len(scen))
	for k, s := range scen {
		scenBands[k] = f.band(s, scenarioLooks[k%len(scenarioLooks)])
	}

	if c.ForecastStart > 0 {
		f.add(&vmarker{
			x:     float64(c.ForecastStart) - 0.5,
			line:  draw.LineStyle{Color: rgb(0x555555), Width: vg.Points(1), Dashes: []vg.Length{vg.Points(2), vg.Points(2)}},
			left:  "actuals",
			right: "forecast",
			style: textStyle(fontIt, sizeNote, rgb(0x444444)),
		})
	}

	// Lines: scenarios (last first), baseline, history on top.
	scenThumbs := make([][]plot.Thumbnailer, len(scen))
	for k := len(scen) - 1; k >= 0; k-- {
		lk := scenarioLooks[k%len(scenarioLooks)]
		scenThumbs[k] = f.series(scen[k].Start, scen[k].Values, lk, float64(k)/float64(len(scen)), scenBands[k])
	}
	baseThumbs := f.series(base.Start, base.Values, lookBaseline, 0, baseBand)
	histThumbs := f.series(hist.Start, hist.Values, lookHistory, 0, histBand)

	if histThumbs != nil {
		f.key.add(hist.Name, histThumbs...)
	}
	if baseThumbs != nil {
		f.key.add(base.Name, baseThumbs...)
	}
	for k, s := range scen {
		if scenThumbs[k] != nil {
			f.key.add(s.Name, scenThumbs[k]...)
		}
	}
	if len(c.Windows) > 0 {
		f.key.add("Event window", lookWindow)
	}
	if len(c.Past) > 0 {
		f.key.add("Past event (cleaned out)", lookPast)
	}
	return f.done(), nil
}

// addWindows shades the event windows and the past events, first so that
// everything else is drawn over them, and keeps room above the data for
// their labels.
func (c PlanChart) addWindows(f *frame) {
	if len(c.Windows)+len(c.Past) == 0 {
		return
	}
	s := &spans{style: textStyle(fontIt, sizeNote, rgb(0x4a4030))}
	for _, w := range c.Windows {
		s.items = append(s.items, spanItem{w: w, look: lookWindow})
	}
	for _, w := range c.Past {
		s.items = append(s.items, spanItem{w: w, look: lookPast})
	}
	f.add(s)
	f.tops = append(f.tops, s)
}

// check validates c.
func (c PlanChart) check() error {
	n := len(c.Labels)
	if n == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if err := c.History.check("history", n); err != nil {
		return err
	}
	if err := c.Baseline.check("baseline", n); err != nil {
		return err
	}
	if err := checkScenarios(c.Scenarios, n, true); err != nil {
		return err
	}
	if len(c.History.Values) == 0 && len(c.Baseline.Values) == 0 && len(c.Scenarios) == 0 {
		return fmt.Errorf("no curve has values: %w", ErrNoData)
	}
	for k, w := range c.Windows {
		if err := w.check(fmt.Sprintf("window %d (%q)", k+1, w.Label)); err != nil {
			return err
		}
	}
	for k, w := range c.Past {
		if err := w.check(fmt.Sprintf("past window %d (%q)", k+1, w.Label)); err != nil {
			return err
		}
	}
	if c.ForecastStart < 0 || c.ForecastStart > n {
		return fmt.Errorf("forecast start %d outside 0 to %d: %w", c.ForecastStart, n, ErrRange)
	}
	return nil
}

// named returns c with name def when it has none.
func named(c Curve, def string) Curve {
	c.Name = orDefault(c.Name, def)
	return c
}

// orDefault returns s, or def when s is empty.
func orDefault(s, def string) string {
	if s == "" {
		return def
	}
	return s
}
