package report

import (
	"forelay/scenario/supply"
	"slices"
	"testing"
)

// TestFanChart checks the window of the fan chart and the stock chart of
// a stress run: 36 months of history (ChartHistory of a monthly plan) out
// of 48, 2023-01 to 2025-12, then the 4 plan months; the stock chart
// covers the plan months alone.
func TestFanChart(t *testing.T) {
	p := supplyPlan(t, frozenStressBody, map[string]string{"prev.csv": frozenStressCSV})
	labels, show := FanLabels(p)
	if show != 36 || len(labels) != 40 || labels[0] != "2023-01" || labels[35] != "2025-12" || labels[36] != "2026-01" {
		t.Fatalf("labels %q, %d of history", labels, show)
	}
	run, err := supply.Stress(simulated(t, p), supply.StressSettings{Breach: 0.1, Production: production(t, p)})
	if err != nil {
		t.Fatal(err)
	}
	fan := fanChart(run, 0)
	if fan.Start != 36 || len(fan.History.Values) != 36 || fan.History.Values[35] != p.History.Values[47] {
		t.Errorf("fan chart history from %d, %d values", fan.Start, len(fan.History.Values))
	}
	// Capacity 680,000, then 700,000 from 2026-03 (frozenStressBody).
	if !slices.Equal(fan.Capacity, []float64{680000, 680000, 700000, 700000}) || fan.Units != "litres per month" {
		t.Errorf("fan chart capacity %v, units %q", fan.Capacity, fan.Units)
	}
	stock := stockChart(run, 0)
	if !slices.Equal(stock.Labels, []string{"2026-01", "2026-02", "2026-03", "2026-04"}) ||
		!slices.Equal(stock.Build, []float64{650000, 700000, 690000, 720000}) || stock.StockUnits != "litres in stock" {
		t.Errorf("stock chart %+v", stock)
	}
}
