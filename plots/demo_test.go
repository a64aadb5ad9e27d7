package plots_test

import (
	"fmt"
	"math"
	"math/rand/v2"

	"forelay/plots"
)

// Demo data for the tests and examples: the monthly milk intake of an
// invented dairy cooperative, in litres. Nothing here describes a real
// business; the numbers come from the formulas below and a seeded generator.

// demoLabels returns n monthly labels from 2023-01.
func demoLabels(n int) []string {
	ls := make([]string, n)
	for i := range ls {
		ls[i] = fmt.Sprintf("%04d-%02d", 2023+i/12, i%12+1)
	}
	return ls
}

// demoSeason is the intake pattern over the year: a spring flush peaking in
// May and a low in the autumn.
func demoSeason(month int) float64 {
	return 1 + 0.12*math.Cos(2*math.Pi*float64(month-4)/12)
}

const (
	demoHist    = 36 // 2023-01 to 2025-12
	demoHorizon = 18 // 2026-01 to 2027-06
)

// demoHistory returns 36 months of intake with noise from a seeded PCG.
func demoHistory() []float64 {
	rng := rand.New(rand.NewPCG(1, 1))
	h := make([]float64, demoHist)
	for i := range h {
		level := 520000 + 1500*float64(i)
		h[i] = math.Round(level*demoSeason(i%12) + 9000*rng.NormFloat64())
	}
	return h
}

// demoBaseline returns the baseline over the horizon with an 80% band that
// widens with the horizon.
func demoBaseline() (mid, lo, hi []float64) {
	mid = make([]float64, demoHorizon)
	lo = make([]float64, demoHorizon)
	hi = make([]float64, demoHorizon)
	for j := range mid {
		i := demoHist + j
		mid[j] = math.Round((520000 + 1500*float64(i)) * demoSeason(i%12))
		w := 1.28 * 9000 * math.Sqrt(1+0.15*float64(j))
		lo[j], hi[j] = mid[j]-w, mid[j]+w
	}
	return mid, lo, hi
}

// demoPlan is a plan chart with two scenarios, two event windows and a
// past event.
func demoPlan() plots.PlanChart {
	mid, lo, hi := demoBaseline()
	up := make([]float64, demoHorizon)
	down := make([]float64, demoHorizon)
	for j := range mid {
		up[j], down[j] = mid[j], mid[j]
		if j >= 3 { // a new cheese contract from 2026-04
			up[j] += 40000
		}
		if j == 6 || j == 7 { // a plant shutdown in 2026-07 and 2026-08
			down[j] -= 60000
		}
		if j == 8 { // with payback in 2026-09
			down[j] += 30000
		}
	}
	return plots.PlanChart{
		Title:    "Milk intake plan, demo dairy cooperative",
		Units:    "Litres per month",
		Labels:   demoLabels(demoHist + demoHorizon),
		History:  plots.Curve{Values: demoHistory()},
		Baseline: plots.Curve{Name: "Baseline (80% band)", Start: demoHist, Values: mid, Lower: lo, Upper: hi},
		Scenarios: []plots.Curve{
			{Name: "With cheese contract", Start: demoHist, Values: up},
			{Name: "Plant shutdown", Start: demoHist, Values: down},
		},
		Windows: []plots.Window{
			{Label: "cheese contract", From: demoHist + 2.5, To: demoHist + demoHorizon - 0.5},
			{Label: "shutdown", From: demoHist + 5.5, To: demoHist + 8.5},
		},
		Past: []plots.Window{
			{Label: "heat wave", From: 17.5, To: 19.5}, // 2024-07 and 2024-08
		},
		ForecastStart: demoHist,
	}
}

// demoFan is a fan chart of 2,000 simulated paths of the plan: the baseline
// with noise, and the cheese contract starting in 2026-04 with probability
// 0.6, which makes the fan lopsided (mean and median apart).
func demoFan() plots.FanChart {
	rng := rand.New(rand.NewPCG(1, 1))
	mid, _, _ := demoBaseline()
	const paths = 2000
	q := func(p float64, xs []float64) float64 { // nearest rank on sorted xs
		k := int(math.Ceil(p*float64(len(xs)))) - 1
		return xs[max(k, 0)]
	}
	c := plots.FanChart{
		Title:  "Simulated milk intake, demo dairy cooperative",
		Units:  "Litres per month",
		Labels: demoLabels(demoHist + demoHorizon),
		History: plots.Curve{
			Start:  demoHist - 12,
			Values: demoHistory()[demoHist-12:],
		},
		Start: demoHist,
	}
	c.Labels = c.Labels[:demoHist+demoHorizon]
	contract := make([]bool, paths)
	for k := range contract {
		contract[k] = rng.Float64() < 0.6
	}
	for j := range mid {
		xs := make([]float64, paths)
		sum := 0.0
		for k := range xs {
			xs[k] = mid[j] + 9000*math.Sqrt(1+0.15*float64(j))*rng.NormFloat64()
			if contract[k] && j >= 3 {
				xs[k] += 40000
			}
			sum += xs[k]
		}
		sortFloats(xs)
		c.P5 = append(c.P5, q(0.05, xs))
		c.P10 = append(c.P10, q(0.10, xs))
		c.P50 = append(c.P50, q(0.50, xs))
		c.P90 = append(c.P90, q(0.90, xs))
		c.P95 = append(c.P95, q(0.95, xs))
		c.Mean = append(c.Mean, sum/paths)
		cap := 700000.0
		if j >= 9 {
			cap = 720000
		}
		if j >= 15 {
			cap = math.NaN() // no agreed capacity yet
		}
		c.Capacity = append(c.Capacity, cap)
	}
	// Show only the last year of history.
	c.Labels = c.Labels[demoHist-12:]
	c.History.Start = 0
	c.Start = 12
	return c
}

func sortFloats(xs []float64) {
	for i := 1; i < len(xs); i++ {
		for j := i; j > 0 && xs[j-1] > xs[j]; j-- {
			xs[j-1], xs[j] = xs[j], xs[j-1]
		}
	}
}

// demoErrors returns 30 monthly forecast errors (actual minus forecast) with
// a standard deviation of 9,000 litres and an upward shift in the last eight.
func demoErrors() []float64 {
	rng := rand.New(rand.NewPCG(2, 2))
	e := make([]float64, 30)
	for i := range e {
		e[i] = math.Round(9000 * rng.NormFloat64())
		if i >= 22 {
			e[i] += 16000
		}
	}
	e[12] = 31000 // one wild month
	return e
}

// demoControl is a control chart of demoErrors with 3-sigma limits.
func demoControl() plots.ControlChart {
	e := demoErrors()
	var hits []plots.Hit
	for i, v := range e {
		if math.Abs(v) > 27000 {
			hits = append(hits, plots.Hit{Index: i, Label: "1"})
		}
	}
	hits = append(hits, plots.Hit{Index: 27, Label: "2"}, plots.Hit{Index: 28, Label: "2"}, plots.Hit{Index: 29, Label: "2"})
	return plots.ControlChart{
		Title:  "Forecast errors, demo dairy cooperative",
		Units:  "litres",
		Labels: demoLabels(30),
		Errors: e,
		UCL:    27000,
		LCL:    -27000,
		Sigma:  9000,
		Hits:   hits,
	}
}

// demoSignal is the tracking signal of demoErrors: running sum over the mean
// absolute error so far, undefined in the first month.
func demoSignal() plots.SignalChart {
	e := demoErrors()
	s := make([]float64, len(e))
	sum, abs := 0.0, 0.0
	for i, v := range e {
		sum += v
		abs += math.Abs(v)
		s[i] = sum / (abs / float64(i+1))
	}
	s[0] = math.NaN()
	return plots.SignalChart{
		Title:  "Tracking signal, demo dairy cooperative",
		Labels: demoLabels(len(e)),
		Signal: s,
		Limit:  4,
	}
}

// demoWaterfall walks the 2026 intake from the baseline through five events.
func demoWaterfall() plots.Waterfall {
	mid, _, _ := demoBaseline()
	total := 0.0
	for _, v := range mid[:12] {
		total += v
	}
	return plots.Waterfall{
		Title:      "From baseline to plan, 2026, demo dairy cooperative",
		Units:      "Litres in 2026",
		StartLabel: "Baseline",
		Start:      math.Round(total),
		Steps: []plots.Step{
			{Label: "Cheese contract", Value: 360000},
			{Label: "Plant shutdown", Value: -120000},
			{Label: "Shutdown payback", Value: 60000},
			{Label: "Farm exits", Value: -180000},
			{Label: "Summer promotion", Value: 45000},
		},
		EndLabel: "Plan",
	}
}

// demoStock is a level build against the 2026 plan with a capacity cut in
// the shutdown months.
func demoStock() plots.StockChart {
	mid, _, _ := demoBaseline()
	demand := append([]float64(nil), mid[:12]...)
	capacity := make([]float64, 12)
	build := make([]float64, 12)
	stock := make([]float64, 12)
	level := 0.0
	for _, v := range demand {
		level += v / 12
	}
	s := 40000.0
	for i := range demand {
		capacity[i] = 640000
		if i == 6 || i == 7 {
			capacity[i] = 480000
		}
		build[i] = math.Min(math.Round(level), capacity[i])
		s += build[i] - demand[i]
		stock[i] = s
	}
	return plots.StockChart{
		Title:    "Level build against the plan, 2026, demo dairy cooperative",
		Units:    "Litres",
		Labels:   demoLabels(48)[36:],
		Demand:   demand,
		Capacity: capacity,
		Build:    build,
		Stock:    stock,
	}
}

// demoComparison sets the two scenarios of demoPlan side by side over the
// horizon, with a capacity that rises in 2026-10 and is not agreed from
// 2027-04.
func demoComparison() plots.ComparisonChart {
	pc := demoPlan()
	capacity := make([]float64, demoHorizon)
	for j := range capacity {
		switch {
		case j >= 15:
			capacity[j] = math.NaN()
		case j >= 9:
			capacity[j] = 720000
		default:
			capacity[j] = 700000
		}
	}
	c := plots.ComparisonChart{
		Title:       "Scenarios of the milk intake plan, demo dairy cooperative",
		Units:       "Litres per month",
		ChangeUnits: "Litres vs baseline",
		Labels:      pc.Labels[demoHist:],
		Baseline:    pc.Baseline.Values,
		Capacity:    capacity,
	}
	for _, s := range pc.Scenarios {
		s.Start -= demoHist
		c.Scenarios = append(c.Scenarios, s)
	}
	return c
}

// demoLoad is the load of the cooperative's bottling line, in line-hours,
// over the 18 plan months in three scenarios: the baseline, the cheese
// contract (half a line-hour per 1,000 litres more from 2026-04) and the
// contract with a second customer, whose load is highlighted with a band
// of ± 2 standard deviations that widens with the horizon. The capacity is
// 400 line-hours, cut to 330 for the shutdown of 2026-07 and 2026-08 and
// raised to 430 from 2026-10.
func demoLoad() plots.LoadChart {
	mid, _, _ := demoBaseline()
	n := len(mid)
	base := make([]float64, n)
	contract := make([]float64, n)
	both := make([]float64, n)
	lo := make([]float64, n)
	hi := make([]float64, n)
	capacity := make([]float64, n)
	for j, v := range mid {
		base[j] = math.Round(v / 1000 * 0.55)
		contract[j] = base[j]
		if j >= 3 {
			contract[j] += 20
		}
		both[j] = contract[j]
		if j >= 5 {
			both[j] += 18
		}
		w := 2 * 6 * math.Sqrt(1+0.15*float64(j))
		lo[j], hi[j] = math.Max(0, both[j]-w), both[j]+w
		switch {
		case j == 6 || j == 7:
			capacity[j] = 330
		case j >= 9:
			capacity[j] = 430
		default:
			capacity[j] = 400
		}
	}
	return plots.LoadChart{
		Title:    "Bottling line against its capacity, demo dairy cooperative",
		Units:    "Line-hours per month",
		Labels:   demoLabels(demoHist + demoHorizon)[demoHist:],
		Baseline: plots.Curve{Values: base},
		Scenarios: []plots.Curve{
			{Name: "With cheese contract", Values: contract},
			{Name: "Contract and new grocer, ± 2 SD", Values: both, Lower: lo, Upper: hi},
		},
		Highlight: 1,
		Capacity:  capacity,
	}
}
