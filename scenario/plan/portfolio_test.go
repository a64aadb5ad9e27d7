package plan

import (
	"math"
	"reflect"
	"strings"
	"testing"

	"forelay/scenario"
	"forelay/scenario/internal/plantest"
)

// writePortfolio writes a wide monthly history from 2022-01 of the given
// series (name to values) and a scenario file reading all of them
// (plantest.WriteWide), and returns the file read with its inputs.
func writePortfolio(t *testing.T, series []string, values [][]float64, body string) (*scenario.File, *Inputs) {
	t.Helper()
	f, err := scenario.Load(plantest.WriteWide(t, series, values, body))
	if err != nil {
		t.Fatal(err)
	}
	in, err := ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	return f, in
}

// scaled returns the invented history times k, rounded to the 4 decimals
// the history file holds.
func scaled(k float64) []float64 {
	v := plantest.History(48)
	for i := range v {
		v[i] = math.Round(v[i]*k*1e4) / 1e4
	}
	return v
}

const portfolioBody = `events:
  - id: contract
    kind: step
    start: 2026-03
    effect: {units: 900, split: baseline}
    scope: [{series: "milk/*"}]
  - id: exit
    kind: step
    start: 2026-05
    effect: {percent: -50}
    scope: [{series: cream/c}]
  - id: fair
    kind: pulse
    start: 2024-06
    periods: 1
    effect: {units: 300}
    scope: [{series: milk/a}]
scenarios:
  - {name: base, events: []}
  - {name: all, events: [contract, exit]}
`

// TestPortfolioScoped checks a portfolio against arithmetic by hand. With
// the naive method each baseline is the series' last value L, so the
// contract's 900 units split by baseline give milk/a 900 × L_a/(L_a+L_b)
// and milk/b the rest, from 2026-03 on; the exit halves cream/c from
// 2026-05 on and touches nothing else; the past fair is cleaned out of
// milk/a only.
func TestPortfolioScoped(t *testing.T) {
	names := []string{"milk/a", "milk/b", "cream/c"}
	vals := [][]float64{scaled(1), scaled(3), scaled(0.5)}
	vals[0][29] += 300 // the fair in 2024-06 (index 29)
	f, in := writePortfolio(t, names, vals, portfolioBody)
	pf, err := BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(pf.Names, names) || len(pf.Plans) != 3 {
		t.Fatalf("names %v, %d plans", pf.Names, len(pf.Plans))
	}
	last := func(i int) float64 { return vals[i][47] }
	shareA := last(0) / (last(0) + last(1))
	for i, p := range pf.Plans {
		all := p.Line("all", names[i])
		if all == nil || p.History.Name != names[i] {
			t.Fatalf("series %d: no line of scenario all for %s", i, names[i])
		}
		for k := range 12 { // 2026-01 .. 2026-12
			want := last(i)
			switch {
			case i == 0 && k >= 2:
				want += 900 * shareA
			case i == 1 && k >= 2:
				want += 900 * (1 - shareA)
			case i == 2 && k >= 4:
				want *= 0.5
			}
			if got := all.Adjusted[k]; math.Abs(got-want) > 1e-9*want {
				t.Errorf("%s, period %d: adjusted %v; want %v", names[i], k, got, want)
			}
		}
		if base := p.Line("base", names[i]); !reflect.DeepEqual(base.Adjusted, p.Baseline) {
			t.Errorf("%s: scenario base differs from the baseline", names[i])
		}
	}
	// The split adds up to the event's 900 units at full size.
	if sum := pf.Plans[0].Effects["contract"].Contrib[5] + pf.Plans[1].Effects["contract"].Contrib[5]; math.Abs(sum-900) > 1e-9 {
		t.Errorf("split sums to %v; want 900", sum)
	}
	if _, ok := pf.Plans[2].Effects["contract"]; ok {
		t.Error("the contract moves cream/c")
	}
	// The fair is cleaned out of milk/a (estimate near the 300 added; the
	// naive fit leaves the pulse's size to the intervention) and no other.
	if c := pf.Plans[0].Cleaning; len(c) != 1 || c[0].ID != "fair" {
		t.Errorf("milk/a cleaning %+v", c)
	}
	for _, p := range pf.Plans[1:] {
		if len(p.Cleaning) != 0 {
			t.Errorf("%s cleaned %+v", p.History.Name, p.Cleaning)
		}
	}
}

// TestPortfolioOfOne: a portfolio of one series is the plan Build makes.
func TestPortfolioOfOne(t *testing.T) {
	body := "plan: one\nhorizon: 12\nbaseline: {method: auto}\nevents:\n" +
		"  - {id: promo, kind: pulse, start: 2026-04, periods: 2, effect: {percent: 10}, payback: {share: 0.5, periods: 1}, range: {low: 5, high: 15}, probability: 0.7}\n" +
		"  - {id: storm, kind: pulse, start: 2024-02, periods: 1, effect: {units: -200}}\n"
	f, err := scenario.Load(plantest.Write(t, body, plantest.History(48), nil))
	if err != nil {
		t.Fatal(err)
	}
	in, err := ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	want, err := Build(f, in)
	if err != nil {
		t.Fatal(err)
	}
	pf, err := BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	got := pf.Plans[0]
	if !reflect.DeepEqual(got.Scenarios, want.Scenarios) || !reflect.DeepEqual(got.Effects, want.Effects) ||
		!reflect.DeepEqual(got.Cleaning, want.Cleaning) || !reflect.DeepEqual(got.BaselineVar, want.BaselineVar) ||
		!reflect.DeepEqual(got.Warnings, want.Warnings) || !reflect.DeepEqual(got.Notes, want.Notes) {
		t.Errorf("portfolio of one differs from Build:\n got %+v\nwant %+v", got.Scenarios, want.Scenarios)
	}
}

// TestPortfolioErrors: a split by baseline over series without baseline is
// refused with its position.
func TestPortfolioErrors(t *testing.T) {
	zeros := make([]float64, 48)
	for _, tc := range []struct {
		name string
		vals [][]float64
		body string
		want string
	}{
		{"nothing to split by", [][]float64{zeros, zeros},
			"events:\n  - {id: e, kind: step, start: 2026-02, effect: {units: 5, split: baseline}, scope: [{series: \"milk/*\"}]}\n",
			`event "e": effect.split: the 2 series sharing the effect have no baseline over the event's span`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, in := writePortfolio(t, []string{"milk/a", "milk/b"}, tc.vals, tc.body)
			_, err := BuildPortfolio(f, in, 0)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v; want %q", err, tc.want)
			}
		})
	}
}

// TestPortfolioNewSeries: a series that a scope creates has a zero
// baseline, so its plan is its event alone and its band comes from the
// event's range: a step of 5 units from 2026-02 with a range of 3 to 7 read
// as a 90 % interval, sd = 4 / (2 × 1.6449) (standard normal table), and a
// probability of 0.5 that halves the risk-weighted plan.
func TestPortfolioNewSeries(t *testing.T) {
	body := "events:\n  - {id: e, kind: step, start: 2026-02, effect: {units: 5}, range: {low: 3, high: 7}, probability: 0.5, scope: [{series: milk/n, new: true}]}\n"
	f, in := writePortfolio(t, []string{"milk/a", "milk/b"}, [][]float64{scaled(1), scaled(2)}, body)
	pf, err := BuildPortfolio(f, in, 2)
	if err != nil {
		t.Fatal(err)
	}
	if want := []string{"milk/a", "milk/b", "milk/n"}; !reflect.DeepEqual(pf.Names, want) {
		t.Fatalf("names %v; want %v", pf.Names, want)
	}
	n := pf.Plans[2]
	line := n.Line("plan", "milk/n")
	if n.Fit != nil || n.History.Name != "milk/n" || line == nil {
		t.Fatalf("new series plan %+v", n)
	}
	sd := 4 / (2 * 1.6448536269514722)
	for k := range 12 {
		want, rw, w := 0.0, 0.0, 0.0
		if k >= 1 {
			want, rw, w = 5, 2.5, 2*sd
		}
		if n.Baseline[k] != 0 || math.Abs(line.Adjusted[k]-want) > 1e-12 || math.Abs(line.RiskWeighted[k]-rw) > 1e-12 ||
			math.Abs(line.Upper[k]-(want+w)) > 1e-9 || math.Abs(line.Lower[k]-(want-w)) > 1e-9 {
			t.Errorf("period %d: baseline %v, plan %v, risk-weighted %v, band %v to %v; want %v, %v, %v -/+ %v",
				k, n.Baseline[k], line.Adjusted[k], line.RiskWeighted[k], line.Lower[k], line.Upper[k], want, rw, want, w)
		}
	}
	rs, err := pf.Rollups("plan")
	if err != nil {
		t.Fatal(err)
	}
	if len(rs[0].Members) != 3 || math.Abs(rs[0].Adjusted[5]-(pf.Plans[0].Baseline[5]+pf.Plans[1].Baseline[5]+5)) > 1e-9 {
		t.Errorf("total %+v", rs[0])
	}
}

// TestPortfolioStaleSeries: a series that ends before the others is left
// out of the plan with a warning, and the plan is that of the others.
func TestPortfolioStaleSeries(t *testing.T) {
	f, in := writePortfolio(t, []string{"milk/a", "milk/b", "milk/c"}, [][]float64{scaled(1), scaled(2)[:40], scaled(3)}, "")
	pf, err := BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(pf.Names, []string{"milk/a", "milk/c"}) {
		t.Errorf("names %v", pf.Names)
	}
	want := `1 of 3 series end before 2025-12, the last period of the others, and are left out of the plan: "milk/b" (to 2025-04); bring their history up to date, or leave them out of history.series`
	if len(pf.Warnings) == 0 || pf.Warnings[0] != want {
		t.Errorf("warnings %q; want first %q", pf.Warnings, want)
	}
}
