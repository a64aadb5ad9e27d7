package report

import (
	"forelay/scenario/sim"
	"forelay/scenario/supply"
	"math"
	"slices"
	"strings"
	"testing"
)

const bufferReportBody = `plan: buf
horizon: 6
units: crates
baseline: {method: seasonal-naive}
events:
  - id: rush
    kind: pulse
    start: 2026-04
    effect: {units: 400}
scenarios:
  - {name: base, events: []}
  - {name: rush, events: [rush]}
capacity: {units: 1150}
`

// TestBufferReport checks the document, CSV and text of a buffer run with
// demand from the bands and from the paths.
func TestBufferReport(t *testing.T) {
	p := supplyPlan(t, bufferReportBody, nil)
	mc := simulated(t, p)
	s := supply.BufferSettings{Scenario: 1, Service: 0.95, LeadTime: 2.5, Opening: 300}
	for _, tc := range []struct {
		name, source string
		mc           *sim.Simulation
		demandLine   string
	}{
		// z(0.95) = 1.644854 from a standard normal table, 1.645 to three
		// decimals.
		{"bands", "bands", nil, "Demand: adjusted plan + 1.645 x standard error (the 95.0% normal quantile)\n"},
		{"paths", "monte-carlo", mc, "Demand: the 95.0% quantile of each period's simulated demand (300 paths, seed 5, "},
	} {
		t.Run(tc.name, func(t *testing.T) {
			run, err := supply.SizeBuffer(p, tc.mc, s)
			if err != nil {
				t.Fatal(err)
			}
			r := Buffer(run)
			if r.Name != "buffer" || !slices.Equal(chartNames(r), []string{"buffer"}) || !slices.Equal(r.Warnings, p.Warnings) {
				t.Fatalf("report %q, charts %q", r.Name, chartNames(r))
			}
			doc := docOf(t, r)
			if doc["demand_source"] != tc.source || doc["scenario"] != "rush" || doc["service_definition"] != "cycle service level, not fill rate" {
				t.Errorf("document %v", doc)
			}
			if _, ok := doc["seed"]; ok != (tc.mc != nil) {
				t.Errorf("seed given: %v, with paths: %v", ok, tc.mc != nil)
			}
			// Safety stock = z × spread, z(0.95) = 1.644854 (above).
			ss, spread := doc["safety_stock"].(float64), doc["lead_time_spread"].(float64)
			if math.Abs(ss-1.644854*spread) > 1e-5*ss {
				t.Errorf("safety stock %v, want 1.644854 × %v", ss, spread)
			}
			// The build plan meets demand from the opening stock:
			// stock_t = stock_{t−1} + build_t − demand_t, build within
			// capacity.
			stock := 300.0
			for _, pv := range doc["periods"].([]any) {
				pm := pv.(map[string]any)
				stock += pm["build"].(float64) - pm["demand"].(float64)
				if pm["build"].(float64) > pm["capacity"].(float64)+1e-6 || math.Abs(stock-pm["stock"].(float64)) > 1e-4 {
					t.Errorf("period %v", pm)
				}
			}
			if len(r.CSV.Head) != 6 || len(r.CSV.Rows) != 6 {
				t.Errorf("CSV head %q, %d rows", r.CSV.Head, len(r.CSV.Rows))
			}
			text := r.Text.String()
			for _, want := range []string{"Buffer for scenario rush of plan buf (crates)\n", tc.demandLine,
				"Service: 95.0% cycle service level, not fill rate (",
				"Safety stock for a lead time of 2.5 months: z 1.645 x spread ", ", a 95.0% cycle service level, not fill rate.\n"} {
				if !strings.Contains(text, want) {
					t.Errorf("text lacks %q:\n%s", want, text)
				}
			}
		})
	}
}

// TestBufferText checks the sentences on building ahead against the
// hand-worked build plans of supply's TestPlanBuffer: demand 60 80 90 150
// 160 70 against capacity 100 100 100 100 120 100, the first period over
// capacity the fourth (2026-04), whose start needs S_4 = 90.
func TestBufferText(t *testing.T) {
	p := supplyPlan(t, bufferReportBody, nil)
	demand := []float64{60, 80, 90, 150, 160, 70}
	capacity := []float64{100, 100, 100, 100, 120, 100}
	for _, tc := range []struct {
		name    string
		demand  []float64
		opening float64
		want    []string
	}{
		// From 60: period 2 is the first to make more than its demand.
		{"build from 2026-02", demand, 60, []string{
			"Pre-build: hold 90 crates at the start of 2026-04, the first period whose demand exceeds capacity.\n",
			"Building ahead must start in 2026-02 (from an opening stock of 60 crates, building as late as capacity allows).\n"}},
		// From 0: S_1 = 20 is missing at the start (the gap).
		{"short at the start", demand, 0, []string{
			"Pre-build: hold 90 crates at the start of 2026-04",
			"The plan needs 20 crates in stock at the start of 2026-01 but opens with 0 crates: building ahead should have started before the plan; even at full capacity 20 of demand go unmet.\n"}},
		// From 500 the stock covers every S_t.
		{"covered", demand, 500, []string{"The opening stock of 500 crates covers it: no building ahead is needed.\n"}},
		{"never over", []float64{60, 80, 90, 90, 100, 70}, 0, []string{
			"No period's demand at the 95.0% quantile exceeds capacity: nothing needs building ahead.\n"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			run, err := supply.SizeBuffer(p, nil, supply.BufferSettings{Service: 0.95, LeadTime: 1, Opening: tc.opening})
			if err != nil {
				t.Fatal(err)
			}
			run.Buffer = supply.PlanBuffer(tc.demand, capacity, tc.opening)
			text := Buffer(run).Text.String()
			for _, want := range append(tc.want, "Safety stock for a lead time of 1 month: ") {
				if !strings.Contains(text, want) {
					t.Errorf("text lacks %q:\n%s", want, text)
				}
			}
		})
	}
}
