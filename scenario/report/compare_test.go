package report

import (
	"forelay/scenario/supply"
	"math"
	"slices"
	"strings"
	"testing"
)

// compareReportBody has three future events and four scenarios, one of
// them the baseline alone; the capacity is added by the tests that want
// one.
const compareReportBody = `plan: crates
horizon: 12
units: crates
baseline: {method: linear-trend, dummies: true}
events:
  - id: new-store
    kind: step
    start: 2026-03
    effect: {units: 120}
    ramp: {periods: 2}
    probability: 0.6
    range: {low: 80, high: 150}
  - id: summer-promo
    kind: pulse
    start: 2026-07
    periods: 2
    effect: {percent: 15}
    payback: {share: 0.5, periods: 1}
  - id: lost-account
    kind: step
    start: 2026-05
    effect: {units: -90}
scenarios:
  - {name: plain, events: []}
  - {name: committed, events: [summer-promo]}
  - {name: upside, events: [summer-promo, new-store]}
  - {name: downside, events: [summer-promo, lost-account]}
`

// TestCompareCSVCells checks that compare.csv has a number in every number
// cell, as plan.csv does: 0 for an event outside a scenario, and 0 breach
// probability and pre-build without a capacity. Only prebuild_before, a
// period, may be empty.
func TestCompareCSVCells(t *testing.T) {
	p := supplyPlan(t, compareReportBody, nil)
	r := Compare(supply.CompareScenarios(simulated(t, p), 0.95))
	head := r.CSV.Head
	if !slices.Equal(head[10:], []string{"new-store", "summer-promo", "lost-account"}) || len(r.CSV.Rows) != 4 {
		t.Fatalf("head %q, %d rows", head, len(r.CSV.Rows))
	}
	col := map[string]int{}
	for j, h := range head {
		col[h] = j
	}
	for _, row := range r.CSV.Rows {
		for j, cell := range row {
			if cell == "" && head[j] != "prebuild_before" {
				t.Errorf("scenario %s: %s is empty", row[0], head[j])
			}
		}
		if row[col["breach_probability"]] != "0.0000" || row[col["prebuild"]] != "0.00" {
			t.Errorf("scenario %s without capacity: breach %q, prebuild %q; want 0.0000 and 0.00",
				row[0], row[col["breach_probability"]], row[col["prebuild"]])
		}
	}
	// The committed scenario has only summer-promo: new-store adds 0.
	if got := r.CSV.Rows[1][col["new-store"]]; r.CSV.Rows[1][0] != "committed" || got != "0.00" {
		t.Errorf("committed, new-store = %q, want 0.00", got)
	}
	text := r.Text.String()
	if !strings.Contains(text, "Capacity: none given (no breach probability or pre-build)\n") || strings.Contains(text, "P(breach)") {
		t.Errorf("text without capacity:\n%s", text)
	}
}

// TestCompareReport checks that the waterfalls add up (baseline plus the
// contributions is the scenario's total), that only scenarios with events
// get one, and the tables of the text.
func TestCompareReport(t *testing.T) {
	p := supplyPlan(t, compareReportBody+"capacity: {units: 1250}\n", nil)
	run := supply.CompareScenarios(simulated(t, p), 0.9)
	r := Compare(run)
	want := []string{"compare", "waterfall-committed", "waterfall-upside", "waterfall-downside"}
	if r.Name != "compare" || !slices.Equal(chartNames(r), want) {
		t.Fatalf("report %q, charts %q, want %q", r.Name, chartNames(r), want)
	}
	for k, c := range run.Rows[1:] {
		wf := waterfallChart(run, c)
		sum := wf.Start
		for _, st := range wf.Steps {
			sum += st.Value
		}
		if math.Abs(sum-c.Total) > 1e-6*c.Total || wf.Units != "crates over the plan" {
			t.Errorf("waterfall %d (%s): %v + steps = %v, want %v", k, c.Name, wf.Start, sum, c.Total)
		}
	}
	doc := docOf(t, r)
	first := doc["scenarios"].([]any)[0].(map[string]any)
	if cs, ok := first["contributions"].([]any); !ok || len(cs) != 0 || doc["service"] != 0.9 {
		t.Errorf("plain scenario's contributions %v (want []), service %v", first["contributions"], doc["service"])
	}
	text := r.Text.String()
	for _, want := range []string{
		"Capacity: 1,250 per month; pre-build sized at the 90.0% quantile of demand (cycle service level, not fill rate)\n",
		"(P(breach): chance that demand exceeds capacity in at least one period)\n",
		"Contributions to each scenario's total:\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q:\n%s", want, text)
		}
	}
	rows := map[string][]string{}
	for _, line := range strings.Split(text, "\n") {
		if f := strings.Fields(line); len(f) > 0 {
			rows[f[0]] = f
		}
	}
	for _, tc := range []struct {
		row  string
		want []string
	}{
		{"scenario", []string{"scenario", "total", "vs", "baseline", "peak", "in", "P90", "peak", "in", "P(breach)", "pre-build", "before"}},
		{"event", []string{"event", "plain", "committed", "upside", "downside"}},
		// new-store ramps up over 2 months from 2026-03: 60 in 2026-03,
		// then 120 a month for the 9 months 2026-04 to 2026-12, 1,140 in
		// all; it is in upside alone, "-" elsewhere.
		{"new-store", []string{"new-store", "-", "-", "+1,140", "-"}},
		// lost-account: -90 a month over the 8 months 2026-05 to 2026-12,
		// -720, in downside alone.
		{"lost-account", []string{"lost-account", "-", "-", "-", "-720"}},
	} {
		if !slices.Equal(rows[tc.row], tc.want) {
			t.Errorf("row %q, want %q", rows[tc.row], tc.want)
		}
	}
}
