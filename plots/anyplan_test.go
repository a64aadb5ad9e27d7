package plots_test

import (
	"math"
	"testing"
	"time"

	"gonum.org/v1/plot"

	"forelay/plots"
)

// planLike returns a plan chart of four history periods and three plan
// periods with the given history, baseline and scenario values and bands
// (nil leaves a curve out).
func planLike(hist, base, lo, hi, scen, slo, shi []float64) plots.PlanChart {
	n := len(hist)
	m := max(len(base), len(scen))
	c := plots.PlanChart{Labels: demoLabels(n + m), History: plots.Curve{Values: hist}, ForecastStart: n}
	if base != nil {
		c.Baseline = plots.Curve{Start: n, Values: base, Lower: lo, Upper: hi}
	}
	if scen != nil {
		c.Scenarios = []plots.Curve{{Name: "loss", Start: n, Values: scen, Lower: slo, Upper: shi}}
		c.Windows = []plots.Window{{Label: "loss", From: float64(n) - 0.5, To: float64(n+m) - 1.5}}
	}
	return c
}

// TestDrawsAnyPlan renders charts of every finite plan the plan step can
// produce, however odd: negative plans, bands floored above their upper
// edge (a floor of 0 under a plan that went negative), zero-width bands,
// all zeros, one period, gaps, and values near the ends of the float64
// range. Each must build and render in PNG and SVG without an error, a
// panic or a hang.
func TestDrawsAnyPlan(t *testing.T) {
	big := math.MaxFloat64
	h := []float64{100, 120, 110, 130}
	for _, tc := range []struct {
		name  string
		build func() (*plot.Plot, error)
	}{
		// A loss larger than the series with floor 0: the lower band is
		// raised to 0, above the negative upper band.
		{"floored negative plan", planLike(h, []float64{125, 126, 127}, []float64{100, 100, 100}, []float64{150, 152, 154},
			[]float64{125, -774, -874}, []float64{100, 0, 0}, []float64{150, -740, -830}).Plot},
		{"negative plan unfloored", planLike(h, []float64{125, 126, 127}, nil, nil,
			[]float64{-900, -774, -874}, []float64{-950, -800, -900}, []float64{-850, -740, -830}).Plot},
		{"clipped at zero", planLike(h, []float64{125, 126, 127}, nil, nil,
			[]float64{0, 0, 0}, []float64{0, 0, 0}, []float64{0, 0, 0}).Plot},
		{"zero-width bands", planLike(h, []float64{5, 5, 5}, []float64{5, 5, 5}, []float64{5, 5, 5}, nil, nil, nil).Plot},
		{"all zero", planLike([]float64{0, 0, 0, 0}, []float64{0, 0, 0}, []float64{0, 0, 0}, []float64{0, 0, 0},
			[]float64{0, 0, 0}, nil, nil).Plot},
		{"one period", plots.PlanChart{Labels: demoLabels(1), Baseline: plots.Curve{Values: []float64{-3}, Lower: []float64{0}, Upper: []float64{-1}}}.Plot},
		{"gaps", planLike([]float64{nan, 120, nan, 130}, []float64{125, nan, 127}, []float64{100, nan, 100}, []float64{150, 160, nan},
			[]float64{nan, nan, nan}, nil, nil).Plot},
		{"only gaps in the history", planLike([]float64{nan, nan, nan, nan}, []float64{1, 2, 3}, nil, nil, nil, nil, nil).Plot},
		{"huge", planLike([]float64{big, -big, big / 2, 0}, []float64{big, big, -big}, []float64{-big, -big, -big}, []float64{big, big, big},
			[]float64{-big, 0, big}, nil, nil).Plot},
		{"tiny", planLike([]float64{1e-300, 2e-300, 0, 5e-324}, []float64{1e-300, 1e-300, 1e-300}, nil, nil, nil, nil, nil).Plot},
		{"huge and flat", planLike([]float64{1e17, 1e17 + 16, 1e17, 1e17 + 32}, []float64{1e17, 1e17, 1e17}, nil, nil, nil, nil, nil).Plot},

		{"stock negative", plots.StockChart{Labels: demoLabels(3), Demand: []float64{-5, -6, -7}, Capacity: []float64{0, 0, 0},
			Build: []float64{0, 0, 0}, Stock: []float64{-5, -11, -18}}.Plot},
		{"stock all zero", plots.StockChart{Labels: demoLabels(3), Demand: []float64{0, 0, 0}, Capacity: []float64{0, 0, 0},
			Build: []float64{0, 0, 0}, Stock: []float64{0, 0, 0}}.Plot},
		{"stock one period", plots.StockChart{Labels: demoLabels(1), Demand: []float64{7}, Capacity: []float64{5}, Build: []float64{5}, Stock: []float64{2}}.Plot},
		{"stock gaps", plots.StockChart{Labels: demoLabels(3), Demand: []float64{nan, 6, 7}, Capacity: []float64{nan, nan, nan},
			Build: []float64{1, nan, 2}, Stock: []float64{nan, 3, nan}}.Plot},
		{"stock huge", plots.StockChart{Labels: demoLabels(2), Demand: []float64{big, -big}, Build: []float64{big, big}, Stock: []float64{-big, big}}.Plot},

		{"fan crossed", plots.FanChart{Labels: demoLabels(3), Start: 1, P5: []float64{0, 0}, P10: []float64{1, 0}, P50: []float64{0, 0},
			P90: []float64{-1, 0}, P95: []float64{0, 0}}.Plot},
		{"fan huge", plots.FanChart{Labels: demoLabels(2), P5: []float64{-big, -big}, P10: []float64{0, 0}, P50: []float64{0, 0},
			P90: []float64{big, big}, P95: []float64{big, big}}.Plot},

		{"comparison negative", plots.ComparisonChart{Labels: demoLabels(3), Baseline: []float64{125, 126, 127},
			Scenarios: []plots.Curve{{Values: []float64{125, -774, -874}}, {Values: []float64{0, 0, 0}}}, Capacity: []float64{0, 0, 0}}.Plot},
		{"comparison gaps and one period", plots.ComparisonChart{Labels: demoLabels(1), Baseline: []float64{nan},
			Scenarios: []plots.Curve{{Values: []float64{5}}}}.Plot},
		{"comparison huge", plots.ComparisonChart{Labels: demoLabels(2), Baseline: []float64{-big, big},
			Scenarios: []plots.Curve{{Values: []float64{big, -big}}}}.Plot},
		{"load negative", plots.LoadChart{Labels: demoLabels(3), Baseline: plots.Curve{Values: []float64{-5, -6, -7}},
			Scenarios: []plots.Curve{{Values: []float64{-5, 0, 5}, Lower: []float64{0, 0, 0}, Upper: []float64{-1, 3, 9}}}, Capacity: []float64{0, 0, 0}}.Plot},
		{"load all zero", plots.LoadChart{Labels: demoLabels(3), Scenarios: []plots.Curve{{Values: []float64{0, 0, 0}, Lower: []float64{0, 0, 0},
			Upper: []float64{0, 0, 0}}}, Capacity: []float64{0, 0, 0}}.Plot},
		{"load huge", plots.LoadChart{Labels: demoLabels(2), Scenarios: []plots.Curve{{Values: []float64{big, -big}, Lower: []float64{-big, -big},
			Upper: []float64{big, big}}}, Capacity: []float64{-big, big}}.Plot},
		{"waterfall huge", plots.Waterfall{Start: big / 2, Steps: []plots.Step{{Label: "a", Value: big / 4}, {Label: "b", Value: -big}}}.Plot},
		{"waterfall tiny", plots.Waterfall{Start: 1e-300, Steps: []plots.Step{{Label: "a", Value: 5e-324}}}.Plot},
		{"control huge", plots.ControlChart{Labels: demoLabels(2), Errors: []float64{big, -big}, UCL: big, LCL: -big, Sigma: big}.Plot},
		{"signal huge", plots.SignalChart{Labels: demoLabels(2), Signal: []float64{big, -big}, Limit: big}.Plot},
	} {
		t.Run(tc.name, func(t *testing.T) {
			done := make(chan error, 1)
			go func() {
				p, err := tc.build()
				if err == nil {
					for _, f := range []string{"png", "svg"} {
						if _, err = plots.Render(p, f, plots.DefaultWidth, plots.DefaultHeight); err != nil {
							break
						}
					}
				}
				done <- err
			}()
			select {
			case err := <-done:
				if err != nil {
					t.Fatal(err)
				}
			case <-time.After(20 * time.Second):
				t.Fatal("no chart after 20 s")
			}
		})
	}
}
