package supply

import (
	"errors"
	"forelay/scenario/data"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"math"
	"strings"
	"testing"
)

// handPaths makes a PathSet from demand[t][i].
func handPaths(name string, demand [][]float64) *sim.PathSet { return sim.NewPathSet(name, demand) }

func TestCapacityRisk(t *testing.T) {
	nan := math.NaN()
	ps := handPaths("s", [][]float64{
		{5, 1, 9, 3, 7, 10, 2, 8, 4, 6},
		{10, 9, 8, 7, 6, 5, 4, 3, 2, 1},
		{3, 0, 3, 0, 0, 0, 0, 0, 0, 0},
		{1, 1, 1, 1, 1, 1, 1, 1, 1, 50},
	})
	capacity := []float64{7.5, 10, 2, nan}
	for _, tc := range []struct {
		name      string
		threshold float64
		// All by hand. Period 0: the values 8, 9 and 10 are above 7.5, so
		// P(breach) = 3/10, ES = (0.5 + 1.5 + 2.5)/10 = 0.45 and the mean
		// excess of the breaching paths 4.5/3 = 1.5; P50 = 5.5 (h = 4.5),
		// P90 = 9.1 (h = 8.1), so utilisation 5.5/7.5 and 9.1/7.5.
		// Period 1: 10 equals the capacity, which is no breach. Period 2:
		// two paths at 3 > 2: P = 0.2, ES = 2/10. Period 3: no limit.
		// Paths breaching somewhere: 7, 2, 5 (period 0) and 0, 2
		// (period 2): 4 of 10.
		wantFirst int
	}{
		{"threshold 0.25", 0.25, 0},
		{"threshold 0.3 is not exceeded by 0.3", 0.3, -1},
		{"threshold 0.1", 0.1, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := CapacityRisk(ps, capacity, tc.threshold)
			if r.FirstBreach != tc.wantFirst {
				t.Errorf("first breach %d, want %d", r.FirstBreach, tc.wantFirst)
			}
			want := []struct{ pb, es, ifb, u50, u90 float64 }{
				{0.3, 0.45, 1.5, 5.5 / 7.5, 9.1 / 7.5},
				{0, 0, nan, 5.5 / 10, 9.1 / 10},
				// Period 2 sorted: eight 0s, then 3, 3; P50 (h = 4.5) = 0,
				// P90 (h = 8.1) = 3 + 0.1*(3 - 3) = 3, so 0/2 and 3/2.
				{0.2, 0.2, 1, 0, 1.5},
				{nan, nan, nan, nan, nan},
			}
			for i, w := range want {
				pr := r.Periods[i]
				plantest.Same(t, "p_breach", pr.PBreach, w.pb, 1e-12)
				plantest.Same(t, "expected shortfall", pr.ExpectedShortfall, w.es, 1e-12)
				plantest.Same(t, "shortfall if breach", pr.ShortfallIfBreach, w.ifb, 1e-12)
				plantest.Same(t, "util P50", pr.UtilP50, w.u50, 1e-12)
				plantest.Same(t, "util P90", pr.UtilP90, w.u90, 1e-12)
			}
			plantest.Same(t, "total expected shortfall", r.TotalExpectedShortfall, 0.65, 1e-12)
			plantest.Same(t, "P(any breach)", r.PAnyBreach, 0.4, 1e-12)
		})
	}
	r := CapacityRisk(ps, nil, 0.1)
	if r.FirstBreach != -1 || !math.IsNaN(r.TotalExpectedShortfall) || !math.IsNaN(r.PAnyBreach) || !math.IsNaN(r.Periods[0].PBreach) {
		t.Errorf("without capacity: %+v", r)
	}
	plantest.Same(t, "mean without capacity", r.Periods[0].Mean, 5.5, 1e-12)
}

func TestProjectStock(t *testing.T) {
	// By hand: stock_t = stock_{t-1} + production_t - demand_t from 10:
	// 10 + 100 - 80 = 30, 30 + 100 - 90 = 40, 40 + 100 - 150 = -10.
	// Idle = max(0, capacity - production) = 20, 20, 0 and overload =
	// max(0, production - capacity) = 0, 0, 10: period 3 plans 100
	// against a capacity of 90.
	// Paths (4): cumulative demand 90 100 110 120 | 190 200 210 220 |
	// 290 320 290 360 against made = 110, 210, 310. Median cumulative
	// demand 105, 205, 305 leaves 5 each time; the P90 (h = 2.7) is
	// 110 + 0.7*10 = 117, 217, 320 + 0.7*40 = 348, leaving -7, -7, -38.
	// Paths short: 1, 1 and 2 of 4.
	ps := handPaths("s", [][]float64{{90, 100, 110, 120}, {100, 100, 100, 100}, {100, 120, 80, 140}})
	sp := ProjectStock([]float64{100, 100, 100}, []float64{80, 90, 150}, []float64{120, 120, 90}, 10, ps)
	plantest.EqualSlices(t, "stock", sp.Stock, []float64{30, 40, -10}, 1e-12)
	plantest.EqualSlices(t, "idle", sp.Idle, []float64{20, 20, 0}, 1e-12)
	plantest.EqualSlices(t, "overload", sp.Overload, []float64{0, 0, 10}, 1e-12)
	plantest.EqualSlices(t, "stock at P50", sp.StockP50, []float64{5, 5, 5}, 1e-12)
	plantest.EqualSlices(t, "stock at P90", sp.StockP90, []float64{-7, -7, -38}, 1e-12)
	plantest.EqualSlices(t, "share short", sp.PShort, []float64{0.25, 0.25, 0.5}, 1e-12)
	if sp.FirstShortfall != 2 || sp.Low != 2 || sp.High != 1 {
		t.Errorf("first shortfall %d, low %d, high %d; want 2, 2, 1", sp.FirstShortfall, sp.Low, sp.High)
	}
	nop := ProjectStock([]float64{5, 5}, []float64{1, 2}, nil, 0, nil)
	plantest.EqualSlices(t, "stock (no paths)", nop.Stock, []float64{4, 7}, 0)
	if !math.IsNaN(nop.Idle[0]) || !math.IsNaN(nop.Overload[0]) || !math.IsNaN(nop.StockP50[0]) || nop.FirstShortfall != -1 {
		t.Errorf("no capacity or paths: %+v", nop)
	}
}

const frozenBody = `plan: frozen
horizon: 3
baseline: {method: naive}
capacity: {units: 2000}
production: {mode: frozen, plan: prev.csv}
`

// readFrozen reads p's production plan (plan.ReadProduction) and returns
// FrozenProduction of it, or the first error.
func readFrozen(p *plan.Plan) ([]float64, string, error) {
	prod, err := plan.ReadProduction(p)
	if err != nil {
		return nil, "", err
	}
	return FrozenProduction(p, prod)
}

func TestFrozenProduction(t *testing.T) {
	hist := testHistory(48) // 2022-01 .. 2025-12; the plan is 2026-01 .. 2026-03
	for _, tc := range []struct {
		name    string
		csv     string
		want    []float64
		wantErr []string // substrings of the error
	}{
		{"one series", "period,units\n2025-12,1\n2026-01,10\n2026-02,20\n2026-03,30\n2026-04,40\n", []float64{10, 20, 30}, nil},
		{"named like the history", "period,other,demand\n2026-01,1,11\n2026-02,2,12\n2026-03,3,13\n", []float64{11, 12, 13}, nil},
		{"too short", "period,units\n2026-01,10\n2026-02,20\n", nil,
			[]string{"plan.yaml:6:34: production.plan: ", "prev.csv covers 2026-01 to 2026-02, but the plan runs from 2026-01 to 2026-03"}},
		{"bad number", "period,units\n2026-01,10\n2026-02,x\n2026-03,30\n", nil, []string{"prev.csv:3:9: units: "}},
		{"no series named so", "period,a,b\n2026-01,1,2\n2026-02,1,2\n2026-03,1,2\n", nil, []string{"plan.yaml:6:34: production.plan: ", `no such series "demand"`}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := buildWithFiles(t, frozenBody, hist, map[string]string{"prev.csv": tc.csv})
			if err != nil {
				t.Fatal(err)
			}
			got, src, err := readFrozen(p)
			if tc.wantErr != nil {
				var pe *data.ParseError
				if !errors.As(err, &pe) {
					t.Fatalf("error %v, want a ParseError", err)
				}
				for _, w := range tc.wantErr {
					if !strings.Contains(err.Error(), w) {
						t.Errorf("error %v, want it to contain %q", err, w)
					}
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !strings.HasSuffix(src, "prev.csv") {
				t.Errorf("source %q", src)
			}
			plantest.EqualSlices(t, "production", got, tc.want, 0)
		})
	}
	p := buildTestPlan(t, strings.Replace(frozenBody, ", plan: prev.csv", "", 1), hist)
	got, src, err := FrozenProduction(p, nil)
	if err != nil || src != "baseline" {
		t.Fatalf("no plan CSV: %v, %q", err, src)
	}
	plantest.EqualSlices(t, "production = baseline", got, p.Baseline, 0)
	plantest.EqualSlices(t, "capacity", CapacityPerPeriod(p), []float64{2000, 2000, 2000}, 0)
}

const capacityBody = `plan: cap
horizon: 4
baseline: {method: naive}
capacity:
  units: 1000
  changes: [{from: 2026-03, units: 1200}]
`

func TestCapacityPerPeriod(t *testing.T) {
	// Capacity.At: 1000 before the change in 2026-03, 1200 from it.
	p := buildTestPlan(t, capacityBody, testHistory(48))
	plantest.EqualSlices(t, "capacity", CapacityPerPeriod(p), []float64{1000, 1000, 1200, 1200}, 0)
	p.File.Capacity = nil
	if CapacityPerPeriod(p) != nil {
		t.Error("no capacity gave a schedule")
	}
}

const overloadBody = `plan: overload
horizon: 4
units: litres
baseline: {method: naive}
capacity:
  units: 680000
  changes: [{from: 2026-03, units: 700000}]
production: {mode: frozen, plan: prev.csv}
`

// TestOverload: a frozen plan above capacity in some periods is overload
// in those periods alone, never negative idle capacity netted against the
// others, and each such period gets a warning.
func TestOverload(t *testing.T) {
	// Capacity 680,000, 680,000, 700,000, 700,000 (the change from
	// 2026-03). Frozen plan 650,000, 700,000, 690,000, 720,000. By hand:
	// idle = 30,000, 0, 10,000, 0 (total 40,000, not 40,000 - 20,000 -
	// 20,000 = 0 as a signed difference would give); overload = 0,
	// 20,000, 0, 20,000.
	csv := "period,litres\n2026-01,650000\n2026-02,700000\n2026-03,690000\n2026-04,720000\n"
	p, err := buildWithFiles(t, overloadBody, testHistory(48), map[string]string{"prev.csv": csv})
	if err != nil {
		t.Fatal(err)
	}
	prod, src, err := readFrozen(p)
	if err != nil {
		t.Fatal(err)
	}
	sp := ProjectStock(prod, p.Scenarios[0].Adjusted, CapacityPerPeriod(p), 0, nil)
	plantest.EqualSlices(t, "idle", sp.Idle, []float64{30000, 0, 10000, 0}, 0)
	plantest.EqualSlices(t, "overload", sp.Overload, []float64{0, 20000, 0, 20000}, 0)
	plantest.Same(t, "total idle", plan.Total(sp.Idle), 40000, 0)

	got := OverloadWarnings(p, prod, src)
	want := []string{
		src + ": 2026-02 plans 700,000 against capacity 680,000 (overload 20,000 litres); lower the frozen plan or raise capacity",
		src + ": 2026-04 plans 720,000 against capacity 700,000 (overload 20,000 litres); lower the frozen plan or raise capacity",
	}
	if len(got) != len(want) {
		t.Fatalf("warnings %q, want %q", got, want)
	}
	for i := range want {
		if got[i] != "production plan "+want[i] {
			t.Errorf("warning %d:\n got %s\nwant production plan %s", i, got[i], want[i])
		}
	}
	// Held at the baseline instead (the naive forecast, below capacity
	// here: the history is about 1,200 a month), nothing is over.
	if w := OverloadWarnings(p, p.Baseline, "baseline"); w != nil {
		t.Errorf("baseline production: warnings %q", w)
	}
	// Without capacity there is no overload to report.
	p.File.Capacity = nil
	if w := OverloadWarnings(p, prod, src); w != nil {
		t.Errorf("no capacity: warnings %q", w)
	}
}

func TestGroupDigits(t *testing.T) {
	// By hand: commas every three digits, at most two decimals.
	for _, tc := range []struct {
		v    float64
		want string
	}{
		{700000, "700,000"}, {1250.5, "1,250.5"}, {999, "999"}, {1000, "1,000"},
		{1234567.891, "1,234,567.89"}, {-20000, "-20,000"}, {0.001234, "0.00123"}, {0, "0"},
	} {
		if got := groupDigits(tc.v); got != tc.want {
			t.Errorf("groupDigits(%v) = %q, want %q", tc.v, got, tc.want)
		}
	}
}

// TestResources: the capacity block is the resource "capacity" over the
// plan's one series, one unit per unit of demand; without it there is
// none.
func TestResources(t *testing.T) {
	p := buildTestPlan(t, "plan: p\nhorizon: 2\nbaseline: {method: naive}\ncapacity: {units: 900}\n", testHistory(24))
	rs := Resources(p)
	if len(rs) != 1 || rs[0].ID != CapacityResource || rs[0].PerUnit != 1 || len(rs[0].Series) != 1 || rs[0].Series[0] != "demand" {
		t.Fatalf("resources %+v", rs)
	}
	plantest.EqualSlices(t, "capacity", ResourceOf(p, "capacity").Capacity, []float64{900, 900}, 0)
	if ResourceOf(p, "line-2") != nil {
		t.Error("found a resource the plan does not have")
	}
	if q := buildTestPlan(t, "plan: p\nhorizon: 2\nbaseline: {method: naive}\n", testHistory(24)); Resources(q) != nil {
		t.Error("a plan without capacity has resources")
	}
}
