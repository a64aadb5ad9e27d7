package plots

import (
	"fmt"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
)

// A ComparisonChart sets the scenarios of a plan side by side over the plan
// periods. The upper panel draws the baseline and each scenario's adjusted
// plan, with the capacity when there is one; the panel below draws each
// scenario's change from the baseline,
//
//	change[j] = Values[j] - Baseline[Start+j],
//
// around a zero line that is the baseline, on a value axis of its own, so
// differences that are small beside the plan still show, and show when
// each scenario parts from the baseline. Each scenario keeps one look
// (colour, grey level, dash pattern and marker) in both panels, the same
// as in a PlanChart with the same scenarios in the same order.
type ComparisonChart struct {
	// Title is the heading above the chart; empty for none.
	Title string

	// Units names the quantity and unit of the plans, as the value axis
	// label of the upper panel. Empty gives "Quantity".
	Units string

	// ChangeUnits is the value axis label of the change panel. Empty gives
	// "Change from baseline".
	ChangeUnits string

	// Labels holds the label of each plan period; it must not be empty.
	Labels []string

	// Baseline is the baseline per period, one value per label. NaN leaves
	// a gap; ±Inf is an error.
	Baseline []float64

	// Scenarios are the adjusted plans, placed by x position as a Curve is;
	// their bands are not drawn. A missing name becomes "Scenario k". There
	// may be none.
	Scenarios []Curve

	// Capacity is the most that can be supplied per period, drawn as a step
	// line in the upper panel. Nil leaves it out; otherwise it has one value
	// per label, and NaN marks a period without a limit.
	Capacity []float64
}

// changeShare is the share of the chart's height the change panel takes.
const changeShare = 0.4

// Plot checks c and builds the chart. It returns an error wrapping ErrNoData
// for no labels or no baseline, ErrLength for a baseline or capacity whose
// length differs from Labels', ErrRange for a scenario outside the labels
// and ErrNotFinite for ±Inf.
func (c ComparisonChart) Plot() (*plot.Plot, error) {
	if err := c.check(); err != nil {
		return nil, chartError("comparison chart", err)
	}
	f := newFrame(c.Title, c.Labels, orDefault(c.Units, "Quantity"), false)
	g := newFrame("", c.Labels, orDefault(c.ChangeUnits, "Change from baseline"), false)
	g.include([]float64{0})

	var capThumb plot.Thumbnailer
	if c.Capacity != nil {
		lk := look{Color: colInk, Width: vg.Points(1.4), Dashes: dashLong}
		for _, s := range steps(0, c.Capacity) {
			l := newLine(s, lk)
			f.add(l)
			if capThumb == nil {
				capThumb = l
			}
		}
		f.include(c.Capacity)
	}
	zero := make([]float64, len(c.Labels))
	g.series(0, zero, lookBaseline, 0)

	names := make([]string, len(c.Scenarios))
	thumbs := make([][]plot.Thumbnailer, len(c.Scenarios))
	for k := len(c.Scenarios) - 1; k >= 0; k-- {
		s := c.Scenarios[k]
		names[k] = orDefault(s.Name, fmt.Sprintf("Scenario %d", k+1))
		lk := scenarioLooks[k%len(scenarioLooks)]
		phase := float64(k) / float64(len(c.Scenarios))
		thumbs[k] = f.series(s.Start, s.Values, lk, phase)
		change := make([]float64, len(s.Values))
		for j, v := range s.Values {
			change[j] = v - c.Baseline[s.Start+j]
		}
		g.series(s.Start, change, lk, phase)
	}
	baseThumbs := f.series(0, c.Baseline, lookBaseline, 0)

	if baseThumbs != nil {
		f.key.add("Baseline", baseThumbs...)
	}
	for k := range c.Scenarios {
		if thumbs[k] != nil {
			f.key.add(names[k], thumbs[k]...)
		}
	}
	if capThumb != nil {
		f.key.add("Capacity", capThumb)
	}
	f.stack(g, changeShare)
	return f.done(), nil
}

// check validates c.
func (c ComparisonChart) check() error {
	n := len(c.Labels)
	if n == 0 {
		return fmt.Errorf("labels: %w", ErrNoData)
	}
	if len(c.Baseline) == 0 {
		return fmt.Errorf("baseline: %w", ErrNoData)
	}
	if err := sameLength("baseline", c.Baseline, n, "label"); err != nil {
		return err
	}
	if err := finiteOrNaN("baseline", c.Baseline); err != nil {
		return err
	}
	if err := checkScenarios(c.Scenarios, n, false); err != nil {
		return err
	}
	return checkCapacity(c.Capacity, n)
}
