package sim

import (
	"errors"
	"forelay/scenario"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
	"math"
	"math/rand/v2"
	"reflect"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"

	"forelay/forecast"
)

func TestImpulseWeights(t *testing.T) {
	y := testHistory(24)
	third := 1.0 / 3
	for _, tc := range []struct {
		name string
		m    forecast.Method
		cfg  forecast.Config
		h    int
		// want: psi_1..psi_{h-1}; sources beside each case.
		want []float64
		tol  float64
	}{
		// The naive forecast is the random walk ARIMA(0,1,0), whose psi
		// weights are all 1 (Box, Jenkins & Reinsel, Time Series Analysis,
		// the psi-weight form of ARIMA models; by hand: every forecast is
		// the last value, so raising it by 1 raises them all by 1).
		{"naive", forecast.Naive, forecast.Config{}, 6, []float64{1, 1, 1, 1, 1}, 1e-9},
		// The seasonal naive forecast with season 4 is the seasonal random
		// walk: psi_j = 1 at j = 4, 8 and 0 elsewhere (by hand: a shock in
		// period n+1 is repeated one and two seasons later).
		{"seasonal-naive", forecast.SeasonalNaive, forecast.Config{Season: 4}, 10, []float64{0, 0, 0, 1, 0, 0, 0, 1, 0}, 1e-9},
		// A moving average of 3 forecasts the mean of the last three
		// values at every horizon, so a shock of 1 in the last value
		// moves them all by 1/3 (by hand).
		{"moving-average", forecast.MovingAverage, forecast.Config{Window: 3}, 5, []float64{third, third, third, third}, 1e-9},
		// The regression line ignores the values it is run over (Extend),
		// so no shock carries on (by hand).
		{"linear-trend", forecast.LinearTrend, forecast.Config{Season: 12, Dummies: true}, 4, []float64{0, 0, 0}, 1e-9},
		// h = 1 has no weights.
		{"one period", forecast.Naive, forecast.Config{}, 1, []float64{}, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m, err := forecast.FitMethod(y, tc.m, tc.cfg)
			if err != nil {
				t.Fatal(err)
			}
			orig := append([]float64(nil), y...)
			got := forecast.ImpulseWeights(m, y, tc.h)
			plantest.EqualSlices(t, "psi", got, tc.want, tc.tol)
			plantest.EqualSlices(t, "y after", y, orig, 0)
		})
	}
}

func TestErrorScales(t *testing.T) {
	for _, tc := range []struct {
		name string
		v    []float64
		s2   float64
		psi  []float64
		// want: k_h = sqrt(v_h / (s2 (1 + sum_{j<h} psi_j^2))), by hand.
		want []float64
	}{
		// k1 = sqrt(4/2) = 1.414214; k2 = sqrt(8/(2*(1+1))) = 1.414214;
		// k3 = sqrt(9/(2*(1+1+0.25))) = sqrt(2) = 1.414214.
		{"random walk like", []float64{4, 8, 9}, 2, []float64{1, 0.5}, []float64{math.Sqrt2, math.Sqrt2, math.Sqrt2}},
		// No psi: k_h = sqrt(v_h/s2) = 3, 2; zero variance gives 0.
		{"white noise", []float64{9, 4, 0}, 1, []float64{0, 0}, []float64{3, 2, 0}},
		// Zero shock variance gives zero errors.
		{"no shocks", []float64{1, 1}, 0, []float64{1}, []float64{0, 0}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, err := ErrorScales(tc.v, tc.s2, tc.psi)
			if err != nil {
				t.Fatal(err)
			}
			plantest.EqualSlices(t, "k", got, tc.want, 1e-12)
		})
	}
	if _, err := ErrorScales([]float64{math.NaN()}, 1, nil); err == nil {
		t.Error("a NaN variance gave no error")
	}
}

const bandsBody = `plan: bands
horizon: 12
baseline: {method: %s}
`

// TestSimulateMatchesBands checks that with no events and normal errors
// the simulated quantiles are the analytic band quantiles
// baseline_t + Φ⁻¹(p) sqrt(V_t), and the mean the baseline.
//
// Tolerance: the sample p-quantile of N normal draws has standard error
// sqrt(p(1−p)/N) / φ(Φ⁻¹(p)) × sigma (asymptotic variance of a sample
// quantile, e.g. Stuart & Ord, Kendall's Advanced Theory of Statistics,
// vol. 1, order statistics; from memory), which is 0.0125 sigma for the
// median and 0.0212 sigma for P5/P95 at N = 10,000; the mean has standard
// error sigma/sqrt(N) = 0.01 sigma. Each check allows 4.5 standard errors,
// so a correct simulation fails one of the 72 quantile checks per method
// with probability below 0.1% (the run is seeded, so it either always
// passes or always fails).
func TestSimulateMatchesBands(t *testing.T) {
	const n = 10000
	for _, method := range []string{"naive", "linear-trend, dummies: true", "moving-average, window: 4"} {
		t.Run(method, func(t *testing.T) {
			p := buildTestPlan(t, sprintf(bandsBody, method), testHistory(48))
			sim, err := Simulate(p, SimOptions{Paths: n, Seed: 7, Errors: Normal})
			if err != nil {
				t.Fatal(err)
			}
			ps := sim.Scenarios[0]
			for tt := range p.Periods {
				sd := math.Sqrt(p.BaselineVar[tt])
				sp := ps.Spread[tt]
				if d := math.Abs(sp.Mean - p.Baseline[tt]); d > 4.5*sd/math.Sqrt(n) {
					t.Errorf("period %d: mean %v, want %v (off by %.2f sd)", tt, sp.Mean, p.Baseline[tt], d/sd)
				}
				for i, q := range []float64{sp.P5, sp.P10, sp.P50, sp.P90, sp.P95} {
					lv := Levels[i]
					z := distuv.UnitNormal.Quantile(lv)
					want := p.Baseline[tt] + z*sd
					se := math.Sqrt(lv*(1-lv)/n) / distuv.UnitNormal.Prob(z) * sd
					if d := math.Abs(q - want); d > 4.5*se {
						t.Errorf("period %d P%g: %v, want %v (off by %.1f standard errors)", tt, 100*lv, q, want, d/se)
					}
				}
			}
		})
	}
}

// TestSimulateHorizonCorrelation checks that the error paths keep the
// model's correlation across horizons. For the naive forecast (a random
// walk) e_h is the sum of h shocks, so corr(e_1, e_h) = 1/sqrt(h) (by
// hand: Cov = s2, Var e_1 = s2, Var e_h = h s2). The sample correlation of
// N pairs has standard error about (1 − rho²)/sqrt(N) (Fisher; from
// memory), under 0.01 here; the check allows 0.03.
func TestSimulateHorizonCorrelation(t *testing.T) {
	p := buildTestPlan(t, sprintf(bandsBody, "naive"), testHistory(48))
	for _, em := range []ErrorModel{Normal, Bootstrap} {
		sim, err := Simulate(p, SimOptions{Paths: 10000, Seed: 3, Errors: em})
		if err != nil {
			t.Fatal(err)
		}
		for _, h := range []int{2, 4, 9} {
			got := stat.Correlation(sim.Error[0], sim.Error[h-1], nil)
			if want := 1 / math.Sqrt(float64(h)); math.Abs(got-want) > 0.03 {
				t.Errorf("%v: corr(e1, e%d) = %.4f, want %.4f", em, h, got, want)
			}
		}
	}
}

// TestSimulateBootstrapVariance checks that bootstrapped errors have the
// band variance V_t. The sample variance of N draws has relative standard
// error sqrt((kurtosis − 1)/N), about 1.4% for near-normal errors at
// N = 10,000; the check allows 6%.
func TestSimulateBootstrapVariance(t *testing.T) {
	for _, method := range []string{"naive", "linear-trend, dummies: true"} {
		p := buildTestPlan(t, sprintf(bandsBody, method), testHistory(48))
		sim, err := Simulate(p, SimOptions{Paths: 10000, Seed: 11})
		if err != nil {
			t.Fatal(err)
		}
		if sim.Pool == 0 || sim.Errors != Bootstrap {
			t.Fatalf("pool %d, errors %v", sim.Pool, sim.Errors)
		}
		for tt, row := range sim.Error {
			got := stat.Variance(row, nil)
			if !scalar.EqualWithinRel(got, p.BaselineVar[tt], 0.06) {
				t.Errorf("%s period %d: variance %.6g, want %.6g", method, tt, got, p.BaselineVar[tt])
			}
		}
	}
}

const eventBody = `plan: events
horizon: 6
baseline: {method: linear-trend, dummies: true}
events:
  - id: contract
    kind: step
    start: 2026-02
    effect: {units: 30}
    probability: 0.7
    range: {low: 20, high: 80}
  - id: promo
    kind: pulse
    start: 2026-04
    periods: 2
    effect: {percent: 10}
    probability: 0.5
    range: {low: 5, high: 20}
  - id: fixed
    kind: step
    start: 2026-01
    effect: {units: -40}
scenarios:
  - {name: none, events: []}
  - {name: all, events: [contract, promo, fixed]}
`

// TestSimulateEventMeans checks an event's sampled mean against
// probability × the triangular mean (low + effect + high)/3, the mean of a
// triangular distribution (any table of distributions; gonum's
// distuv.Triangle.Mean gives the same). Tolerance: 4.5 standard errors of
// the sample mean, sqrt(Var/N), with Var = p E[X²] − (p E[X])² and
// E[X²] = Var_tri + mean², Var_tri = (a² + b² + c² − ab − ac − bc)/18.
func TestSimulateEventMeans(t *testing.T) {
	const n = 20000
	p := buildTestPlan(t, eventBody, testHistory(48))
	sim, err := Simulate(p, SimOptions{Paths: n, Seed: 5, Errors: Normal})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		id          string
		prob        float64
		a, c, b     float64 // low, effect (mode), high
		wantMean    float64
		wantOccurs  float64
		constSize   bool
		description string
	}{
		// 0.7 * (20 + 30 + 80)/3 = 0.7 * 43.3333 = 30.3333.
		{"contract", 0.7, 20, 30, 80, 0.7 * 130 / 3, 0.7, false, "units step"},
		// 0.5 * (5 + 10 + 20)/3 = 0.5 * 11.6667 = 5.83333 percent.
		{"promo", 0.5, 5, 10, 20, 0.5 * 35 / 3, 0.5, false, "percent pulse"},
		// Certain, no range: always -40.
		{"fixed", 1, -40, -40, -40, -40, 1, true, "fixed step"},
	} {
		k := -1
		for i, e := range p.Future {
			if e.ID == tc.id {
				k = i
			}
		}
		amt := sim.Amount[k]
		got := stat.Mean(amt, nil)
		occ := 0
		for _, v := range amt {
			if v != 0 {
				occ++
			}
		}
		m := (tc.a + tc.b + tc.c) / 3
		vtri := (tc.a*tc.a + tc.b*tc.b + tc.c*tc.c - tc.a*tc.b - tc.a*tc.c - tc.b*tc.c) / 18
		v := tc.prob*(vtri+m*m) - tc.prob*tc.prob*m*m
		se := math.Sqrt(v / n)
		if math.Abs(got-tc.wantMean) > 4.5*se+1e-12 {
			t.Errorf("%s (%s): mean %.5f, want %.5f (se %.4f)", tc.id, tc.description, got, tc.wantMean, se)
		}
		share := float64(occ) / n
		if sep := math.Sqrt(tc.prob * (1 - tc.prob) / n); math.Abs(share-tc.wantOccurs) > 4.5*sep+1e-12 {
			t.Errorf("%s: occurs on %.4f of paths, want %.4f", tc.id, share, tc.wantOccurs)
		}
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range amt {
			if v != 0 {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
		if lo < tc.a || hi > tc.b {
			t.Errorf("%s: sizes from %v to %v, outside [%v, %v]", tc.id, lo, hi, tc.a, tc.b)
		}
	}

	// In the scenario with every event, the mean demand less the mean
	// error and the baseline is the sum of probability × mean size ×
	// contribution per unit: in 2026-04 (t = 3) the contract (30.3333
	// units), the promo (5.83333% of the baseline) and the fixed step
	// (-40) all act.
	all, none := sim.Scenarios[1], sim.Scenarios[0]
	for tt := range p.Periods {
		got := stat.Mean(all.Demand[tt], nil) - stat.Mean(none.Demand[tt], nil)
		want := -40.0
		if tt >= 1 {
			want += 0.7 * 130 / 3
		}
		if tt == 3 || tt == 4 {
			want += 0.5 * 35 / 3 / 100 * p.Baseline[tt]
		}
		// Common random numbers: the errors cancel, leaving the event
		// draws; 4.5 standard errors of those (at most 1 unit here).
		if math.Abs(got-want) > 1 {
			t.Errorf("period %d: mean event effect %.4f, want %.4f", tt, got, want)
		}
	}
	// The scenario without events is baseline + error, exactly.
	for tt, row := range none.Demand {
		for i, d := range row {
			if d != p.Baseline[tt]+sim.Error[tt][i] {
				t.Fatalf("period %d path %d: %v is not baseline + error", tt, i, d)
			}
		}
	}
}

func TestSimulateDeterministic(t *testing.T) {
	p := buildTestPlan(t, eventBody, testHistory(48))
	run := func(seed uint64) *Simulation {
		s, err := Simulate(p, SimOptions{Paths: 500, Seed: seed})
		if err != nil {
			t.Fatal(err)
		}
		return s
	}
	a, b, c := run(9), run(9), run(10)
	same := func(x, y *Simulation) bool {
		for s := range x.Scenarios {
			for tt := range x.Scenarios[s].Demand {
				for i := range x.Scenarios[s].Demand[tt] {
					if math.Float64bits(x.Scenarios[s].Demand[tt][i]) != math.Float64bits(y.Scenarios[s].Demand[tt][i]) {
						return false
					}
				}
			}
		}
		return true
	}
	if !same(a, b) {
		t.Error("the same seed gave different paths")
	}
	if same(a, c) {
		t.Error("different seeds gave the same paths")
	}
}

// An event's draws come from its own stream: taking another event out of
// the plan leaves them as they were.
func TestSimulateEventStreams(t *testing.T) {
	p := buildTestPlan(t, eventBody, testHistory(48))
	a, err := Simulate(p, SimOptions{Paths: 300, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	p.Future = p.Future[1:] // drop "contract"
	b, err := Simulate(p, SimOptions{Paths: 300, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	plantest.EqualSlices(t, "promo draws", b.Amount[0], a.Amount[1], 0)
}

// simModels are the three ways a simulation draws its errors: bootstrap
// and normal shocks through the recursion, and the direct sums.
var simModels = []struct {
	name   string
	errors ErrorModel
	opaque bool
}{
	{"bootstrap", Bootstrap, false},
	{"normal", Normal, false},
	{"sums", Bootstrap, true},
}

// simPlan builds the event plan with a naive baseline (every psi weight
// 1), hiding the model's form when opaque.
func simPlan(t *testing.T, opaque bool) *plan.Plan {
	t.Helper()
	p := buildTestPlan(t, strings.Replace(eventBody, "linear-trend, dummies: true", "naive", 1), testHistory(48))
	if opaque {
		p.Fit.Model = opaqueModel{p.Fit.Model}
	}
	return p
}

// The worker count changes nothing: 1, 2 and 7 workers give the same
// simulation, every path and every summary, bit for bit. 3,000 paths
// make two full blocks and a short one.
func TestSimulateWorkers(t *testing.T) {
	for _, m := range simModels {
		t.Run(m.name, func(t *testing.T) {
			p := simPlan(t, m.opaque)
			var first *Simulation
			for _, w := range []int{1, 2, 7} {
				sim, err := Simulate(p, SimOptions{Paths: 3000, Seed: 8, Errors: m.errors, Workers: w})
				if err != nil {
					t.Fatal(err)
				}
				if first == nil {
					first = sim
				} else if !reflect.DeepEqual(sim, first) {
					t.Errorf("%d workers: the simulation differs from 1 worker's", w)
				}
			}
		})
	}
}

// The paths can be drawn in parts: a run of N paths is the first N paths
// of a run of 2N, block for block, for N a multiple of StreamBlock and
// for N that ends inside a block.
func TestSimulateInParts(t *testing.T) {
	for _, m := range simModels {
		t.Run(m.name, func(t *testing.T) {
			p := simPlan(t, m.opaque)
			for _, n := range []int{2 * StreamBlock, 1500} {
				short, err := Simulate(p, SimOptions{Paths: n, Seed: 4, Errors: m.errors, Workers: 2})
				if err != nil {
					t.Fatal(err)
				}
				long, err := Simulate(p, SimOptions{Paths: 2 * n, Seed: 4, Errors: m.errors, Workers: 1})
				if err != nil {
					t.Fatal(err)
				}
				samePrefix(t, sprintf("%d paths: error", n), short.Error, long.Error)
				samePrefix(t, sprintf("%d paths: event draws", n), short.Amount, long.Amount)
				for k := range short.Scenarios {
					samePrefix(t, sprintf("%d paths: demand of %s", n, short.Scenarios[k].Name), short.Scenarios[k].Demand, long.Scenarios[k].Demand)
				}
			}
		})
	}
}

// samePrefix checks that every row of short is the start of the same row
// of long, bit for bit.
func samePrefix(t *testing.T, what string, short, long [][]float64) {
	t.Helper()
	for r, row := range short {
		for i, v := range row {
			if math.Float64bits(v) != math.Float64bits(long[r][i]) {
				t.Fatalf("%s: row %d path %d (block %d): %v, want %v", what, r, i, i/StreamBlock, v, long[r][i])
			}
		}
	}
}

// TestSimulateStreamDefinition draws the first paths of block 1 again
// from the documented streams, built here from hash/fnv and
// math/rand/v2: the shocks from PCG(seed, FNV-1a("shock\x00demand\x001"))
// (the test history's series is "demand"), H = 6 normal draws per path,
// and the event's two uniforms per path from
// PCG(seed, FNV-1a("event\x00contract\x001")). The linear trend has no
// psi weights, so error = k_h × sd × z exactly; the size is the
// triangular quantile of the second uniform.
func TestSimulateStreamDefinition(t *testing.T) {
	const seed = 21
	p := buildTestPlan(t, eventBody, testHistory(48))
	sim, err := Simulate(p, SimOptions{Paths: 2 * StreamBlock, Seed: seed, Errors: Normal})
	if err != nil {
		t.Fatal(err)
	}
	if p.History.Name != "demand" {
		t.Fatalf("series %q", p.History.Name)
	}
	shocks := rand.New(rand.NewPCG(seed, fnvRef("shock\x00demand\x001")))
	events := rand.New(rand.NewPCG(seed, fnvRef("event\x00contract\x001")))
	sd := math.Sqrt(sim.S2)
	k := slices.IndexFunc(p.Future, func(e *scenario.Event) bool { return e.ID == "contract" })
	for i := StreamBlock; i < StreamBlock+5; i++ {
		for tt := range p.Periods {
			want := sim.Scale[tt] * (sd * shocks.NormFloat64())
			if got := sim.Error[tt][i]; got != want {
				t.Errorf("path %d period %d: error %v, want %v", i, tt, got, want)
			}
		}
		// The contract: probability 0.7, size triangular on [20, 80]
		// peaked at 30 (eventBody), read at the second uniform.
		want := 0.0
		if occ, u := events.Float64(), events.Float64(); occ < 0.7 {
			want = distuv.NewTriangle(20, 80, 30, nil).Quantile(u)
		}
		if got := sim.Amount[k][i]; got != want {
			t.Errorf("path %d: contract drawn %v, want %v", i, got, want)
		}
	}
}

// The shocks are keyed by the series name, the event draws are not: a
// series of another name gets other errors and the same event draws.
func TestSimulateSeriesKey(t *testing.T) {
	p := buildTestPlan(t, eventBody, testHistory(48))
	a, err := Simulate(p, SimOptions{Paths: 300, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	p.History.Name = "cream"
	b, err := Simulate(p, SimOptions{Paths: 300, Seed: 2})
	if err != nil {
		t.Fatal(err)
	}
	if reflect.DeepEqual(a.Error, b.Error) {
		t.Error("renaming the series left its errors as they were")
	}
	if !reflect.DeepEqual(a.Amount, b.Amount) {
		t.Error("renaming the series changed the event draws")
	}
}

func TestSimulateErrors(t *testing.T) {
	p := buildTestPlan(t, sprintf(bandsBody, "naive"), testHistory(24))
	if _, err := Simulate(p, SimOptions{Paths: 99}); !errors.Is(err, ErrTooFewPaths) {
		t.Errorf("99 paths: error %v, want ErrTooFewPaths", err)
	}
	s, err := Simulate(p, SimOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if s.Paths != DefaultPaths {
		t.Errorf("zero Paths gave %d paths, want %d", s.Paths, DefaultPaths)
	}
	for _, tc := range []struct {
		in   string
		want ErrorModel
		bad  bool
	}{{"", Bootstrap, false}, {"Normal", Normal, false}, {"bootstrap", Bootstrap, false}, {"gauss", Bootstrap, true}} {
		got, err := ParseErrorModel(tc.in)
		if (err != nil) != tc.bad || got != tc.want {
			t.Errorf("ParseErrorModel(%q) = %v, %v", tc.in, got, err)
		}
	}
}

// TestSimulateFloor: simulated demand, like the plan, never goes below the
// floor; with floor: none it does. The test history runs near 1,000 a
// month; a loss of 1,100 takes every path's middle below zero.
func TestSimulateFloor(t *testing.T) {
	body := `plan: floor
horizon: 6
baseline: {method: naive}
bands: {floor: %s}
events:
  - {id: loss, kind: step, start: 2026-02, effect: {units: -1100}}
`
	for _, c := range []struct {
		floor   string
		wantMin float64 // the least P50 over the periods of the loss, at least
		clipped bool
	}{
		{"0", 0, true},
		{"none", math.Inf(-1), false},
	} {
		p := buildTestPlan(t, sprintf(body, c.floor), testHistory(48))
		sim, err := Simulate(p, SimOptions{Paths: 2000, Seed: 5, Errors: Normal})
		if err != nil {
			t.Fatal(err)
		}
		ps := sim.Scenarios[0]
		low := math.Inf(1)
		for _, row := range ps.Demand {
			for _, v := range row {
				low = math.Min(low, v)
			}
		}
		if c.clipped && low < 0 {
			t.Errorf("floor %s: a path goes to %v", c.floor, low)
		}
		if !c.clipped && low >= 0 {
			t.Errorf("floor %s: no path below 0 (least %v); the loss should take them there", c.floor, low)
		}
		for tt := 1; tt < len(p.Periods); tt++ {
			if ps.Spread[tt].P50 < c.wantMin {
				t.Errorf("floor %s, period %d: P50 %v below %v", c.floor, tt, ps.Spread[tt].P50, c.wantMin)
			}
		}
	}
}
