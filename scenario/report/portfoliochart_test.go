package report

import (
	"bytes"
	"fmt"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"forelay/plots"
	"forelay/scenario"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
)

// resourceFile is a portfolio of three series with two resources: a
// bottling line over the milk series, 0.5 line-hours a unit, with a
// capacity of 2,500 that rises to 3,000 from 2026-04, and a cream room
// with no capacity. The contract adds 900 units to the milk series from
// 2026-03, split by their baselines.
const resourceFile = `bands: {z: 1.5}
events:
  - id: contract
    kind: step
    start: 2026-03
    effect: {units: 900, split: baseline}
    scope: [{series: "milk/*"}]
resources:
  - id: bottling
    series: "milk/**"
    units: line-hours
    per-unit: 0.5
    capacity: {units: 2500, changes: [{from: 2026-04, units: 3000}]}
  - id: cream-room
    series: "cream/**"
    per-unit: 1
`

// resourcePortfolio plans three invented series (the plantest history
// times 1, 3 and 0.5, monthly 2022-01 to 2025-12, rounded to the 4
// decimals written) with the naive method over 6 months, under
// resourceFile and the given scenarios block, and returns the portfolio
// and each series' last value.
func resourcePortfolio(t *testing.T, scenarios string) (*plan.Portfolio, map[string]float64) {
	t.Helper()
	names := []string{"milk/a", "milk/b", "cream/c"}
	scale := []float64{1, 3, 0.5}
	hist := plantest.History(48)
	last := map[string]float64{}
	var b strings.Builder
	b.WriteString("period," + strings.Join(names, ",") + "\n")
	for i, v := range hist {
		fmt.Fprintf(&b, "%d-%02d", 2022+i/12, i%12+1)
		for k, s := range scale {
			x := math.Round(v*s*1e4) / 1e4
			fmt.Fprintf(&b, ",%.4f", x)
			last[names[k]] = x
		}
		b.WriteString("\n")
	}
	dir := t.TempDir()
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	body := "plan: p\nhistory: {file: h.csv, series: \"**\"}\nhorizon: 6\nbaseline: {method: naive}\n" + resourceFile + scenarios
	path := filepath.Join(dir, "plan.yaml")
	if err := os.WriteFile(path, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	f, err := scenario.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	in, err := plan.ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	pf, err := plan.BuildPortfolio(f, in, 1)
	if err != nil {
		t.Fatal(err)
	}
	return pf, last
}

// TestResourceCharts checks the charts of a portfolio with two resources:
// one per resource after the total and before the series, whatever the
// number of series charts asked for, laid out from the loads by hand, and
// written as PNG and SVG.
func TestResourceCharts(t *testing.T) {
	pf, last := resourcePortfolio(t, "scenarios:\n  - {name: base, events: []}\n  - {name: deal, events: [contract]}\n")
	for _, n := range []int{0, 1, AllCharts} {
		r, err := ForPortfolio(pf, PortfolioOptions{Charts: n})
		if err != nil {
			t.Fatal(err)
		}
		var names []string
		for _, c := range r.Charts {
			names = append(names, c.Name)
		}
		// The contract changes both milk series; milk/b, three times the
		// larger, gets the larger share, so it is charted first.
		want := []string{"total", "resource-bottling", "resource-cream-room"}
		switch n {
		case 1:
			want = append(want, "series-milk--b")
		case AllCharts:
			want = append(want, "series-milk--b", "series-milk--a", "series-cream--c")
		}
		if !reflect.DeepEqual(names, want) {
			t.Errorf("--charts %d: charts %q, want %q", n, names, want)
		}
	}

	r, err := ForPortfolio(pf, PortfolioOptions{})
	if err != nil {
		t.Fatal(err)
	}
	bottling := r.Charts[1].Plot.(plots.LoadChart)
	// Naive baselines: each series' last value L. The bottling line's load
	// is 0.5 (L_a + L_b) without events; with the contract's 900 units
	// added to the milk series from 2026-03 (x = 2) it is
	// 0.5 (L_a + L_b + 900) = 0.5 (L_a + L_b) + 450 (hand calculation).
	base := 0.5 * (last["milk/a"] + last["milk/b"])
	wantBase := []float64{base, base, base, base, base, base}
	wantDeal := []float64{base, base, base + 450, base + 450, base + 450, base + 450}
	plantest.EqualSlices(t, "baseline load", bottling.Baseline.Values, wantBase, 1e-9)
	if len(bottling.Scenarios) != 1 || bottling.Highlight != 0 {
		t.Fatalf("%d scenarios, highlight %d; want the deal alone, highlighted", len(bottling.Scenarios), bottling.Highlight)
	}
	deal := bottling.Scenarios[0]
	plantest.EqualSlices(t, "deal load", deal.Values, wantDeal, 1e-9)
	if deal.Name != "deal, band ± 1.5 SD" || bottling.Baseline.Name != "Baseline" {
		t.Errorf("names %q and %q, want Baseline and deal with its band", bottling.Baseline.Name, deal.Name)
	}
	// The band is load ± z SD with the file's z = 1.5 and the SD of the
	// load risk, the lower edge clipped at 0 (the band's definition).
	sum, err := newPortfolioSummary(pf, 0)
	if err != nil {
		t.Fatal(err)
	}
	risk := sum.Resources[0].Risk[1]
	for j, l := range risk.Load {
		if risk.SD[j] <= 0 {
			t.Fatalf("period %d: load SD %v, want a spread", j, risk.SD[j])
		}
		plantest.Same(t, fmt.Sprintf("lower[%d]", j), deal.Lower[j], math.Max(0, l-1.5*risk.SD[j]), 1e-12)
		plantest.Same(t, fmt.Sprintf("upper[%d]", j), deal.Upper[j], l+1.5*risk.SD[j], 1e-12)
	}
	if bottling.Baseline.Lower != nil {
		t.Errorf("the baseline, not highlighted, has a band")
	}
	// Capacity 2,500 to 2026-03, 3,000 from 2026-04 (resourceFile).
	if want := []float64{2500, 2500, 2500, 3000, 3000, 3000}; !reflect.DeepEqual(bottling.Capacity, want) {
		t.Errorf("capacity %v, want %v", bottling.Capacity, want)
	}
	if bottling.Units != "line-hours per month" || bottling.Labels[0] != "2026-01" || len(bottling.Labels) != 6 {
		t.Errorf("units %q, labels %v", bottling.Units, bottling.Labels)
	}
	cream := r.Charts[2].Plot.(plots.LoadChart)
	if cream.Capacity != nil || cream.Units != "units per month" {
		t.Errorf("cream room: capacity %v, units %q; want none and units per month", cream.Capacity, cream.Units)
	}

	// Written into --out as PNG and SVG.
	dir := t.TempDir()
	set := NewFiles(dir)
	for _, c := range r.Charts {
		if err := set.AddChart(c.Name, c.Plot); err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
	}
	if _, err := set.Commit(); err != nil {
		t.Fatal(err)
	}
	for _, id := range []string{"bottling", "cream-room"} {
		b, err := os.ReadFile(filepath.Join(dir, "resource-"+id+".png"))
		if err != nil {
			t.Fatal(err)
		}
		if _, err := png.Decode(bytes.NewReader(b)); err != nil {
			t.Errorf("resource-%s.png: %v", id, err)
		}
		svg, err := os.ReadFile(filepath.Join(dir, "resource-"+id+".svg"))
		if err != nil {
			t.Fatal(err)
		}
		if !bytes.Contains(svg, []byte(id+" against its capacity")) {
			t.Errorf("resource-%s.svg lacks its title", id)
		}
	}
}

// TestResourceChartBaselineOnly checks the band of a plan whose only
// scenario has no events: the baseline's load is highlighted and carries
// the band.
func TestResourceChartBaselineOnly(t *testing.T) {
	pf, _ := resourcePortfolio(t, "scenarios:\n  - {name: base, events: []}\n")
	r, err := ForPortfolio(pf, PortfolioOptions{})
	if err != nil {
		t.Fatal(err)
	}
	c := r.Charts[1].Plot.(plots.LoadChart)
	if len(c.Scenarios) != 0 || c.Baseline.Upper == nil || c.Baseline.Name != "Baseline, band ± 1.5 SD" {
		t.Fatalf("scenarios %d, baseline %q with band %v; want the baseline alone with the band", len(c.Scenarios), c.Baseline.Name, c.Baseline.Upper)
	}
	if _, err := c.Plot(); err != nil {
		t.Fatal(err)
	}
}
