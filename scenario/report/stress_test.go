package report

import (
	"forelay/scenario/supply"
	"slices"
	"strings"
	"testing"
)

// frozenStressBody freezes production at prev.csv against a capacity that
// rises in 2026-03 (the plan of supply's TestOverload).
const frozenStressBody = `plan: overload
horizon: 4
units: litres
baseline: {method: naive}
capacity:
  units: 680000
  changes: [{from: 2026-03, units: 700000}]
production: {mode: frozen, plan: prev.csv}
`

// frozenStressCSV is the frozen plan: 650,000, 700,000, 690,000, 720,000.
const frozenStressCSV = "period,litres\n2026-01,650000\n2026-02,700000\n2026-03,690000\n2026-04,720000\n"

// TestStressFrozen checks the report of a stress run under frozen
// production: the frozen columns of stress.csv, the stock chart, the
// overload and idle capacity in the text, the document's fields.
func TestStressFrozen(t *testing.T) {
	p := supplyPlan(t, frozenStressBody, map[string]string{"prev.csv": frozenStressCSV})
	run, err := supply.Stress(simulated(t, p), supply.StressSettings{Breach: 0.1, Opening: 1000, Production: production(t, p)})
	if err != nil {
		t.Fatal(err)
	}
	r := Stress(run, len(p.Scenarios)-1)
	if r.Name != "stress" || !slices.Equal(chartNames(r), []string{"fan", "stock"}) || !slices.Equal(r.Warnings, run.Warnings) {
		t.Fatalf("report %q, charts %q, warnings %q", r.Name, chartNames(r), r.Warnings)
	}

	// stress.csv: 14 columns of risk and 7 of frozen production, one row
	// per scenario and period.
	if len(r.CSV.Head) != 21 || r.CSV.Head[14] != "production" || len(r.CSV.Rows) != 4*len(p.Scenarios) {
		t.Fatalf("head %q, %d rows", r.CSV.Head, len(r.CSV.Rows))
	}
	col := map[string]int{}
	for j, h := range r.CSV.Head {
		col[h] = j
	}
	// 2026-02 (the second row): capacity 680,000 before the change, the
	// frozen plan 700,000, so no idle capacity and an overload of
	// 700,000 − 680,000 = 20,000; 2026-03: 700,000 − 690,000 = 10,000 idle.
	for _, c := range []struct {
		row       int
		col, want string
	}{
		{1, "period", "2026-02"}, {1, "capacity", "680000.00"}, {1, "production", "700000.00"},
		{1, "idle", "0.00"}, {1, "overload", "20000.00"},
		{2, "capacity", "700000.00"}, {2, "idle", "10000.00"}, {2, "overload", "0.00"},
	} {
		if got := r.CSV.Rows[c.row][col[c.col]]; got != c.want {
			t.Errorf("row %d %s = %q, want %q", c.row, c.col, got, c.want)
		}
	}

	text := r.Text.String()
	for _, want := range []string{
		"Stress test overload: series demand, 4 month periods 2026-01 to 2026-04 (litres)\n",
		"Capacity: 680,000 per month; 700,000 from 2026-03; breach threshold 10.0%\n",
		"opening stock 1,000 litres:\n",
		// Idle: 30,000 + 0 + 10,000 + 0; overload 20,000 + 20,000.
		"; idle capacity over the plan 40,000 litres\n",
		"Overload: the frozen plan asks for more than capacity in 2 periods (40,000 litres in all): 2026-02 (20,000), 2026-04 (20,000)\n",
		"\n" + Caution + "\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q:\n%s", want, text)
		}
	}

	doc := docOf(t, r)
	if doc["breach_threshold"] != 0.1 || doc["quantiles"] != quantileDefinition || doc["series"] != "demand" {
		t.Errorf("document %v", doc)
	}
	sc := doc["scenarios"].([]any)[0].(map[string]any)
	// The field names the README documents.
	for _, k := range []string{"name", "events", "periods", "first_breach", "total_expected_shortfall", "p_any_breach", "frozen"} {
		if _, ok := sc[k]; !ok {
			t.Errorf("scenario lacks %q", k)
		}
	}
	for _, k := range []string{"period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach", "expected_shortfall",
		"shortfall_if_breach", "util_p50", "util_p90"} {
		if _, ok := sc["periods"].([]any)[0].(map[string]any)[k]; !ok {
			t.Errorf("period lacks %q", k)
		}
	}
	fz := sc["frozen"].(map[string]any)
	// The frozen plan's overload, 20,000 + 20,000 (see above).
	if fz["overload_total"] != 40000.0 || fz["idle_total"] != 40000.0 || fz["opening_stock"] != 1000.0 {
		t.Errorf("frozen %v", fz)
	}
	for _, pv := range sc["periods"].([]any) {
		pm := pv.(map[string]any)
		q := []float64{pm["p5"].(float64), pm["p10"].(float64), pm["p50"].(float64), pm["p90"].(float64), pm["p95"].(float64)}
		if !slices.IsSorted(q) {
			t.Errorf("%s: quantiles out of order %v", pm["period"], q)
		}
	}
}

// TestStressNoCapacity: without a capacity the breach columns are empty
// cells and null in the document, the text says how to add one, and a
// production plan not frozen is noted as unread.
func TestStressNoCapacity(t *testing.T) {
	body := "plan: plain\nhorizon: 3\nbaseline: {method: naive}\nproduction: {plan: prev.csv}\n"
	p := supplyPlan(t, body, nil)
	run, err := supply.Stress(simulated(t, p), supply.StressSettings{Breach: 0.1})
	if err != nil {
		t.Fatal(err)
	}
	r := Stress(run, 0)
	if !slices.Equal(chartNames(r), []string{"fan"}) || len(r.CSV.Head) != 14 {
		t.Fatalf("charts %q, head %q", chartNames(r), r.CSV.Head)
	}
	for _, row := range r.CSV.Rows {
		if row[8] != "" || row[9] != "" {
			t.Errorf("row %q: capacity and p_breach should be empty", row)
		}
	}
	text := r.Text.String()
	for _, want := range []string{
		"Capacity: none given (add a capacity block to the scenario file to see breaches)\n",
		"Note: production.plan is read only with production mode frozen.\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q:\n%s", want, text)
		}
	}
	if strings.Contains(text, "P(breach)") {
		t.Errorf("text speaks of breaches without a capacity:\n%s", text)
	}
	doc := docOf(t, r)
	sc := doc["scenarios"].([]any)[0].(map[string]any)
	if sc["first_breach"] != nil || sc["total_expected_shortfall"] != nil || sc["frozen"] != nil {
		t.Errorf("scenario %v", sc)
	}
	if notes := doc["notes"].([]any); notes[len(notes)-1] != "production.plan is read only with production mode frozen" {
		t.Errorf("notes %v", notes)
	}
}
