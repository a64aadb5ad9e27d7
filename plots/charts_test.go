package plots_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/plot"

	"forelay/plots"
)

var nan = math.NaN()

// TestInvalidInput checks that bad data comes back as an error wrapping the
// right sentinel, with the chart named, and never as a panic.
func TestInvalidInput(t *testing.T) {
	labels := demoLabels(6)
	vals := []float64{1, 2, 3, 4, 5, 6}
	plan := func(edit func(*plots.PlanChart)) func() (*plot.Plot, error) {
		c := plots.PlanChart{Labels: labels, History: plots.Curve{Values: vals}}
		edit(&c)
		return c.Plot
	}
	fan := func(edit func(*plots.FanChart)) func() (*plot.Plot, error) {
		c := plots.FanChart{
			Labels: labels, Start: 3,
			P5: []float64{1, 1, 1}, P10: []float64{2, 2, 2}, P50: []float64{3, 3, 3},
			P90: []float64{4, 4, 4}, P95: []float64{5, 5, 5},
		}
		edit(&c)
		return c.Plot
	}
	control := func(edit func(*plots.ControlChart)) func() (*plot.Plot, error) {
		c := plots.ControlChart{Labels: labels, Errors: []float64{1, -1, 2, -2, 0, 1}, UCL: 3, LCL: -3, Sigma: 1}
		edit(&c)
		return c.Plot
	}
	signal := func(edit func(*plots.SignalChart)) func() (*plot.Plot, error) {
		c := plots.SignalChart{Labels: labels, Signal: []float64{nan, 1, 2, 3, 4, 5}, Limit: 4}
		edit(&c)
		return c.Plot
	}
	waterfall := func(edit func(*plots.Waterfall)) func() (*plot.Plot, error) {
		c := plots.Waterfall{Start: 100, Steps: []plots.Step{{Label: "up", Value: 10}, {Label: "down", Value: -5}}}
		edit(&c)
		return c.Plot
	}
	stock := func(edit func(*plots.StockChart)) func() (*plot.Plot, error) {
		c := plots.StockChart{Labels: labels, Demand: vals, Build: vals}
		edit(&c)
		return c.Plot
	}

	comparison := func(edit func(*plots.ComparisonChart)) func() (*plot.Plot, error) {
		c := plots.ComparisonChart{Labels: labels, Baseline: vals, Scenarios: []plots.Curve{{Name: "up", Start: 3, Values: []float64{5, 6, 7}}}}
		edit(&c)
		return c.Plot
	}

	load := func(edit func(*plots.LoadChart)) func() (*plot.Plot, error) {
		c := plots.LoadChart{
			Labels:   labels,
			Baseline: plots.Curve{Values: vals},
			Scenarios: []plots.Curve{{Name: "up", Start: 3, Values: []float64{5, 6, 7},
				Lower: []float64{4, 5, 6}, Upper: []float64{6, 7, 8}}},
			Capacity: []float64{6, 6, 6, 6, 6, 6},
		}
		edit(&c)
		return c.Plot
	}

	for _, tc := range []struct {
		name  string
		build func() (*plot.Plot, error)
		want  error // nil: must succeed
	}{
		{"plan ok", plan(func(*plots.PlanChart) {}), nil},
		{"plan no labels", plan(func(c *plots.PlanChart) { c.Labels = nil }), plots.ErrNoData},
		{"plan no curves", plan(func(c *plots.PlanChart) { c.History = plots.Curve{} }), plots.ErrNoData},
		{"plan NaN in history is a gap", plan(func(c *plots.PlanChart) { c.History.Values = []float64{1, nan} }), nil},
		{"plan Inf in history", plan(func(c *plots.PlanChart) { c.History.Values = []float64{1, math.Inf(1)} }), plots.ErrNotFinite},
		{"plan Inf in baseline", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 5, Values: []float64{math.Inf(-1)}}
		}), plots.ErrNotFinite},
		{"plan band too short", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 4, Values: []float64{5, 6}, Lower: []float64{4}, Upper: []float64{6, 7}}
		}), plots.ErrLength},
		{"plan band without upper", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 4, Values: []float64{5, 6}, Lower: []float64{4, 5}}
		}), plots.ErrLength},
		{"plan band floored above its top", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 4, Values: []float64{5, 6}, Lower: []float64{4, 8}, Upper: []float64{6, 7}}
		}), nil},
		{"plan NaN in band is a gap", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 4, Values: []float64{5, 6}, Lower: []float64{4, 5}, Upper: []float64{6, nan}}
		}), nil},
		{"plan Inf in band", plan(func(c *plots.PlanChart) {
			c.Baseline = plots.Curve{Start: 4, Values: []float64{5, 6}, Lower: []float64{4, math.Inf(-1)}, Upper: []float64{6, 7}}
		}), plots.ErrNotFinite},
		{"plan curve past the labels", plan(func(c *plots.PlanChart) { c.History.Start = 1 }), plots.ErrRange},
		{"plan negative start", plan(func(c *plots.PlanChart) { c.History.Start = -1; c.History.Values = vals[:2] }), plots.ErrRange},
		{"plan empty scenario", plan(func(c *plots.PlanChart) { c.Scenarios = []plots.Curve{{Name: "x"}} }), plots.ErrNoData},
		{"plan window backwards", plan(func(c *plots.PlanChart) { c.Windows = []plots.Window{{From: 3, To: 2}} }), plots.ErrOrder},
		{"plan window NaN", plan(func(c *plots.PlanChart) { c.Windows = []plots.Window{{From: nan, To: 2}} }), plots.ErrNotFinite},
		{"plan forecast start past the end", plan(func(c *plots.PlanChart) { c.ForecastStart = 7 }), plots.ErrRange},
		{"plan forecast start at the end", plan(func(c *plots.PlanChart) { c.ForecastStart = 6 }), nil},

		{"fan ok", fan(func(*plots.FanChart) {}), nil},
		{"fan capacity with gaps", fan(func(c *plots.FanChart) { c.Capacity = []float64{6, nan, 7} }), nil},
		{"fan no labels", fan(func(c *plots.FanChart) { c.Labels = nil }), plots.ErrNoData},
		{"fan no quantiles", fan(func(c *plots.FanChart) { c.P50 = nil }), plots.ErrNoData},
		{"fan short p90", fan(func(c *plots.FanChart) { c.P90 = c.P90[:2] }), plots.ErrLength},
		{"fan NaN median is a gap", fan(func(c *plots.FanChart) { c.P50 = []float64{3, nan, 3} }), nil},
		{"fan infinite median", fan(func(c *plots.FanChart) { c.P50 = []float64{3, math.Inf(1), 3} }), plots.ErrNotFinite},
		{"fan crossed quantiles drawn", fan(func(c *plots.FanChart) { c.P10 = []float64{2, 3.5, 2} }), nil},
		{"fan past the labels", fan(func(c *plots.FanChart) { c.Start = 4 }), plots.ErrRange},
		{"fan mean too long", fan(func(c *plots.FanChart) { c.Mean = []float64{3, 3, 3, 3} }), plots.ErrLength},
		{"fan NaN mean is a gap", fan(func(c *plots.FanChart) { c.Mean = []float64{3, nan, 3} }), nil},
		{"fan infinite capacity", fan(func(c *plots.FanChart) { c.Capacity = []float64{6, math.Inf(1), 7} }), plots.ErrNotFinite},

		{"control ok", control(func(*plots.ControlChart) {}), nil},
		{"control no labels", control(func(c *plots.ControlChart) { c.Labels = nil }), plots.ErrNoData},
		{"control short errors", control(func(c *plots.ControlChart) { c.Errors = c.Errors[:5] }), plots.ErrLength},
		{"control NaN error", control(func(c *plots.ControlChart) { c.Errors[2] = nan }), plots.ErrNotFinite},
		{"control limits crossed", control(func(c *plots.ControlChart) { c.UCL, c.LCL = -3, 3 }), plots.ErrOrder},
		{"control NaN limit", control(func(c *plots.ControlChart) { c.UCL = nan }), plots.ErrNotFinite},
		{"control negative sigma", control(func(c *plots.ControlChart) { c.Sigma = -1 }), plots.ErrRange},
		{"control hit outside", control(func(c *plots.ControlChart) { c.Hits = []plots.Hit{{Index: 6, Label: "1"}} }), plots.ErrRange},

		{"signal ok", signal(func(*plots.SignalChart) {}), nil},
		{"signal all undefined", signal(func(c *plots.SignalChart) { c.Signal = []float64{nan, nan, nan, nan, nan, nan} }), plots.ErrNoData},
		{"signal infinite", signal(func(c *plots.SignalChart) { c.Signal[3] = math.Inf(1) }), plots.ErrNotFinite},
		{"signal zero limit", signal(func(c *plots.SignalChart) { c.Limit = 0 }), plots.ErrRange},
		{"signal long", signal(func(c *plots.SignalChart) { c.Signal = append(c.Signal, 1) }), plots.ErrLength},

		{"waterfall ok", waterfall(func(*plots.Waterfall) {}), nil},
		{"waterfall no steps", waterfall(func(c *plots.Waterfall) { c.Steps = nil }), nil},
		{"waterfall NaN step", waterfall(func(c *plots.Waterfall) { c.Steps[1].Value = nan }), plots.ErrNotFinite},
		{"waterfall NaN start", waterfall(func(c *plots.Waterfall) { c.Start = nan }), plots.ErrNotFinite},
		{"waterfall unnamed step", waterfall(func(c *plots.Waterfall) { c.Steps[0].Label = "" }), plots.ErrNoData},
		{"waterfall overflow", waterfall(func(c *plots.Waterfall) {
			c.Start = math.MaxFloat64
			c.Steps[0].Value = math.MaxFloat64
		}), plots.ErrNotFinite},

		{"comparison ok", comparison(func(*plots.ComparisonChart) {}), nil},
		{"comparison no scenarios", comparison(func(c *plots.ComparisonChart) { c.Scenarios = nil }), nil},
		{"comparison no labels", comparison(func(c *plots.ComparisonChart) { c.Labels = nil }), plots.ErrNoData},
		{"comparison no baseline", comparison(func(c *plots.ComparisonChart) { c.Baseline = nil }), plots.ErrNoData},
		{"comparison short baseline", comparison(func(c *plots.ComparisonChart) { c.Baseline = vals[:5] }), plots.ErrLength},
		{"comparison scenario past the labels", comparison(func(c *plots.ComparisonChart) { c.Scenarios[0].Start = 4 }), plots.ErrRange},
		{"comparison infinite capacity", comparison(func(c *plots.ComparisonChart) { c.Capacity = []float64{1, 2, 3, 4, 5, math.Inf(1)} }), plots.ErrNotFinite},
		{"comparison short capacity", comparison(func(c *plots.ComparisonChart) { c.Capacity = []float64{1} }), plots.ErrLength},

		{"load ok", load(func(*plots.LoadChart) {}), nil},
		{"load without capacity", load(func(c *plots.LoadChart) { c.Capacity = nil }), nil},
		{"load open capacity", load(func(c *plots.LoadChart) { c.Capacity = []float64{6, nan, nan, 6, nan, 6} }), nil},
		{"load only a baseline", load(func(c *plots.LoadChart) { c.Scenarios = nil }), nil},
		{"load only scenarios", load(func(c *plots.LoadChart) { c.Baseline = plots.Curve{} }), nil},
		{"load NaN is a gap", load(func(c *plots.LoadChart) { c.Scenarios[0].Values = []float64{5, nan, 7} }), nil},
		{"load no labels", load(func(c *plots.LoadChart) { c.Labels = nil }), plots.ErrNoData},
		{"load no loads", load(func(c *plots.LoadChart) { c.Baseline, c.Scenarios = plots.Curve{}, nil }), plots.ErrNoData},
		{"load empty scenario", load(func(c *plots.LoadChart) { c.Scenarios = append(c.Scenarios, plots.Curve{Name: "x"}) }), plots.ErrNoData},
		{"load short capacity", load(func(c *plots.LoadChart) { c.Capacity = c.Capacity[:5] }), plots.ErrLength},
		{"load long capacity", load(func(c *plots.LoadChart) { c.Capacity = append(c.Capacity, 6) }), plots.ErrLength},
		{"load short band", load(func(c *plots.LoadChart) { c.Scenarios[0].Upper = []float64{6, 7} }), plots.ErrLength},
		{"load band without lower", load(func(c *plots.LoadChart) { c.Scenarios[0].Lower = nil }), plots.ErrLength},
		{"load infinite capacity", load(func(c *plots.LoadChart) { c.Capacity[2] = math.Inf(1) }), plots.ErrNotFinite},
		{"load infinite load", load(func(c *plots.LoadChart) { c.Baseline.Values = []float64{1, 2, math.Inf(-1)} }), plots.ErrNotFinite},
		{"load past the labels", load(func(c *plots.LoadChart) { c.Scenarios[0].Start = 4 }), plots.ErrRange},
		{"load highlight past the scenarios", load(func(c *plots.LoadChart) { c.Highlight = 1 }), plots.ErrRange},
		{"load negative highlight", load(func(c *plots.LoadChart) { c.Highlight = -1 }), plots.ErrRange},
		{"load highlight without scenarios", load(func(c *plots.LoadChart) { c.Scenarios, c.Highlight = nil, 1 }), plots.ErrRange},

		{"stock ok", stock(func(*plots.StockChart) {}), nil},
		{"stock open capacity", stock(func(c *plots.StockChart) { c.Capacity = []float64{9, 9, nan, nan, 9, 9} }), nil},
		{"stock nothing", stock(func(c *plots.StockChart) { c.Demand, c.Build = nil, nil }), plots.ErrNoData},
		{"stock no labels", stock(func(c *plots.StockChart) { c.Labels = nil }), plots.ErrNoData},
		{"stock short stock", stock(func(c *plots.StockChart) { c.Stock = vals[:5] }), plots.ErrLength},
		{"stock NaN demand is a gap", stock(func(c *plots.StockChart) { c.Demand = []float64{1, 2, nan, 4, 5, 6} }), nil},
		{"stock infinite build", stock(func(c *plots.StockChart) { c.Build = []float64{1, 2, math.Inf(1), 4, 5, 6} }), plots.ErrNotFinite},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := tc.build()
			if tc.want == nil {
				if err != nil {
					t.Fatalf("unexpected error: %v", err)
				}
				if _, err := plots.Render(p, "png", plots.DefaultWidth, plots.DefaultHeight); err != nil {
					t.Fatalf("render: %v", err)
				}
				return
			}
			if !errors.Is(err, tc.want) || p != nil {
				t.Fatalf("got %v, %v; want error %v", p, err, tc.want)
			}
			if !strings.HasPrefix(err.Error(), "plots: ") {
				t.Errorf("error %q lacks the package prefix", err)
			}
		})
	}
}

// TestEdgeCases renders charts at the edges of what is allowed: one period,
// flat values, a lone point, gaps, more scenarios than looks.
func TestEdgeCases(t *testing.T) {
	many := make([]plots.Curve, 8)
	for k := range many {
		many[k] = plots.Curve{Start: 2, Values: []float64{float64(k), float64(k + 1)}}
	}
	for _, tc := range []struct {
		name  string
		build func() (*plot.Plot, error)
	}{
		{"one period", plots.PlanChart{Labels: []string{"2026-03"}, History: plots.Curve{Values: []float64{5}}}.Plot},
		{"flat", plots.PlanChart{Labels: demoLabels(4), History: plots.Curve{Values: []float64{7, 7, 7, 7}}}.Plot},
		{"zeros", plots.PlanChart{Labels: demoLabels(3), Baseline: plots.Curve{Values: []float64{0, 0, 0}, Lower: []float64{0, 0, 0}, Upper: []float64{0, 0, 0}}}.Plot},
		{"lone baseline point", plots.PlanChart{Labels: demoLabels(3), Baseline: plots.Curve{Start: 2, Values: []float64{4}, Lower: []float64{3}, Upper: []float64{5}}}.Plot},
		{"eight scenarios", plots.PlanChart{Labels: demoLabels(4), Scenarios: many, ForecastStart: 2}.Plot},
		{"window off the axis", plots.PlanChart{Labels: demoLabels(4), History: plots.Curve{Values: []float64{1, 2, 3, 4}}, Windows: []plots.Window{{Label: "later", From: 10, To: 12}}}.Plot},
		{"odd labels", plots.PlanChart{Labels: []string{"wk a", "wk b", "wk c"}, History: plots.Curve{Values: []float64{1, 2, 3}}}.Plot},
		{"negative waterfall", plots.Waterfall{Start: -50, Steps: []plots.Step{{Label: "loss", Value: -20}, {Label: "zero", Value: 0}}}.Plot},
		{"waterfall zero start", plots.Waterfall{Start: 0, Steps: []plots.Step{{Label: "new", Value: 20}}}.Plot},
		{"signal gap", plots.SignalChart{Labels: demoLabels(4), Signal: []float64{nan, 1, nan, -5}, Limit: 4}.Plot},
		{"control one point", plots.ControlChart{Labels: demoLabels(1), Errors: []float64{0}, UCL: 1, LCL: -1}.Plot},
		{"stock only capacity", plots.StockChart{Labels: demoLabels(2), Capacity: []float64{nan, nan}}.Plot},
		{"load one period over", plots.LoadChart{Labels: demoLabels(1), Baseline: plots.Curve{Values: []float64{5}, Lower: []float64{4}, Upper: []float64{6}},
			Capacity: []float64{4.5}}.Plot},
		{"load no capacity anywhere", plots.LoadChart{Labels: demoLabels(3), Scenarios: []plots.Curve{{Values: []float64{1, 2, 3}}}, Capacity: []float64{nan, nan, nan}}.Plot},
		{"load eight scenarios", plots.LoadChart{Labels: demoLabels(4), Scenarios: many, Highlight: 7, Capacity: []float64{1, 1, 1, 1}}.Plot},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := tc.build()
			if err != nil {
				t.Fatal(err)
			}
			for _, f := range []string{"png", "svg"} {
				if _, err := plots.Render(p, f, 4*72, 3*72); err != nil {
					t.Fatal(err)
				}
			}
		})
	}
}
