package sim

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
)

var (
	walshA = plantest.Walsh(10, 10, -10, -10)
	walshB = plantest.Walsh(10, -10, -10, 10)
)

// one returns the sum of the single series i.
func one(name string, i int) Sum { return Sum{Name: name, Members: []int{i}, Weights: []float64{1}} }

// pathVar returns the variance (divided by n) of the paths of period t.
func pathVar(ps *PathSet, t int) float64 {
	row := ps.Demand[t]
	m := mean(row)
	v := 0.0
	for _, x := range row {
		v += (x - m) * (x - m)
	}
	return v / float64(len(row))
}

func simulatePortfolio(t *testing.T, pf *plan.Portfolio, sums []Sum, opt SimOptions) *PortfolioSimulation {
	t.Helper()
	mc, err := SimulatePortfolio(pf, sums, opt)
	if err != nil {
		t.Fatal(err)
	}
	return mc
}

// TestPortfolioCorrelation checks the two known answers of a sum: two
// series with the same errors add up to twice the spread of one (exactly,
// path by path, since both take the error of the same period), and two
// series with uncorrelated errors to the square root of two times
// (variances add), within the Monte Carlo's error: with 20,000 paths the
// relative standard error of a variance is about sqrt(2/20000) = 1 % for
// normal-like paths, and the tolerance is 5 %.
func TestPortfolioCorrelation(t *testing.T) {
	t.Run("same errors", func(t *testing.T) {
		pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{walshA, walshA}, "")
		mc := simulatePortfolio(t, pf, []Sum{one("a", 0), one("b", 1), TotalOf(pf)}, SimOptions{Paths: 2000, Seed: 3})
		a, b, total := mc.Scenarios[0][0], mc.Scenarios[0][1], mc.Scenarios[0][2]
		if !reflect.DeepEqual(a.Demand, b.Demand) {
			t.Fatal("two series with the same history and errors have different paths")
		}
		for h := range a.Demand {
			for i, v := range a.Demand[h] {
				if total.Demand[h][i] != 2*v {
					t.Fatalf("period %d, path %d: total %v, want 2 × %v", h, i, total.Demand[h][i], v)
				}
			}
			if pathVar(a, h) == 0 {
				t.Fatalf("period %d: no spread to compare", h)
			}
			if r := math.Sqrt(pathVar(total, h) / pathVar(a, h)); math.Abs(r-2) > 1e-9 {
				t.Errorf("period %d: spread of the sum / spread of one = %v, want 2", h, r)
			}
		}
	})
	t.Run("uncorrelated errors", func(t *testing.T) {
		pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{walshA, walshB}, "")
		mc := simulatePortfolio(t, pf, []Sum{one("a", 0), one("b", 1), TotalOf(pf)}, SimOptions{Paths: 20000, Seed: 5})
		a, b, total := mc.Scenarios[0][0], mc.Scenarios[0][1], mc.Scenarios[0][2]
		for h := range a.Demand {
			va, vb, vt := pathVar(a, h), pathVar(b, h), pathVar(total, h)
			if math.Abs(vt/(va+vb)-1) > 0.05 {
				t.Errorf("period %d: variance of the sum %v, want var a + var b = %v", h, vt, va+vb)
			}
			// Each series' paths have the variance of its plan's bands.
			for k, v := range []float64{va, vb} {
				if want := pf.Plans[k].BaselineVar[h]; math.Abs(v/want-1) > 0.05 {
					t.Errorf("period %d, series %d: path variance %v, want the band's %v", h, k, v, want)
				}
			}
			if h == 0 {
				r := math.Sqrt(vt / ((va + vb) / 2))
				t.Logf("period 1: spread of the sum / mean spread of one = %.4f (sqrt 2 = 1.4142)", r)
			}
		}
	})
}

// TestPortfolioWindows checks how series of different lengths share their
// errors: series c has the history of a from its 25th month only, so its
// 24 one-step errors are a's last 24. The lag drawn is uniform over the 49
// months of a's history (Portfolio.Span; a has 48 errors, the naive
// method making no prediction for the first month); when it falls in c's
// 24 both take the same error, otherwise c resamples its own. So c's
// paths keep the variance of its bands (within 5 %), and the errors of a
// and c in the first month are correlated by P(lag < 24) = 24/49 (their
// errors have the same spread; the rare draws where both resample add
// little): within 0.05 with 20,000 paths (standard error about 0.006).
// The plan's variance of the sum, worked out by forecast.SumVariance on the
// same model, matches the simulated total's within 5 %.
func TestPortfolioWindows(t *testing.T) {
	c := append([]float64(nil), walshA...)
	for i := range 24 {
		c[i] = math.NaN()
	}
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/c"}, [][]float64{walshA, c}, "")
	mc := simulatePortfolio(t, pf, []Sum{one("a", 0), one("c", 1)}, SimOptions{Paths: 20000, Seed: 13})
	if mc.Window != 49 || mc.Fitted != 2 {
		t.Fatalf("window %d, fitted %d; want 49 and 2", mc.Window, mc.Fitted)
	}
	a, cc := mc.Scenarios[0][0], mc.Scenarios[0][1]
	for h := range cc.Demand {
		if v, want := pathVar(cc, h), pf.Plans[1].BaselineVar[h]; math.Abs(v/want-1) > 0.05 {
			t.Errorf("period %d: path variance of c %v, want its band's %v", h, v, want)
		}
	}
	ra, rc := a.Demand[0], cc.Demand[0]
	ma, mcc := mean(ra), mean(rc)
	cov := 0.0
	for i := range ra {
		cov += (ra[i] - ma) * (rc[i] - mcc)
	}
	cov /= float64(len(ra))
	if r := cov / math.Sqrt(pathVar(a, 0)*pathVar(cc, 0)); math.Abs(r-24.0/49) > 0.05 {
		t.Errorf("correlation of a and c in month 1: %.3f, want 24/49 = %.3f", r, 24.0/49)
	}
	// The plan's band of the sum (forecast.SumVariance) rests on the same
	// model: the simulated total has its variance, within 5 %.
	rs, err := pf.Rollups(pf.Plans[0].Scenarios[0].Name)
	if err != nil {
		t.Fatal(err)
	}
	tot := simulatePortfolio(t, pf, []Sum{TotalOf(pf)}, SimOptions{Paths: 20000, Seed: 13}).Scenarios[0][0]
	for h := range tot.Demand {
		if v, want := pathVar(tot, h), rs[0].Var[h]; math.Abs(v/want-1) > 0.05 {
			t.Errorf("period %d: variance of the simulated total %v, the plan's %v", h, v, want)
		}
	}
}

// TestPortfolioSharedEvent checks that an event is drawn once per path for
// every series it moves: with its probability of 0.5 it happens on the
// same paths in both series (common random numbers between the scenario
// with it and the one without), on about half of them (binomial standard
// error sqrt(0.25/4000) = 0.008, tolerance 0.04), and each series takes
// the same quantile of its share's range (here equal shares, so the same
// size).
func TestPortfolioSharedEvent(t *testing.T) {
	body := `events:
  - id: fair
    kind: pulse
    start: 2026-03
    periods: 1
    probability: 0.5
    effect: {units: 400, split: equal}
    range: {low: 200, high: 600}
    scope: [{series: "milk/*"}]
scenarios:
  - {name: base, events: []}
  - {name: fair, events: [fair]}
`
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{walshA, walshB}, body)
	mc := simulatePortfolio(t, pf, []Sum{one("a", 0), one("b", 1)}, SimOptions{Paths: 4000, Seed: 9})
	const t0 = 1 // 2026-03: the history ends in 2026-01
	happened := 0
	for i := range mc.Paths {
		da := mc.Scenarios[1][0].Demand[t0][i] - mc.Scenarios[0][0].Demand[t0][i]
		db := mc.Scenarios[1][1].Demand[t0][i] - mc.Scenarios[0][1].Demand[t0][i]
		if math.Abs(da-db) > 1e-9 {
			t.Fatalf("path %d: the event adds %v to a and %v to b; want the same (equal shares)", i, da, db)
		}
		if da != 0 {
			happened++
			if da < 100-1e-9 || da > 300+1e-9 {
				t.Fatalf("path %d: share %v outside the share's range 100 to 300", i, da)
			}
		}
	}
	if p := float64(happened) / float64(mc.Paths); math.Abs(p-0.5) > 0.04 {
		t.Errorf("event on %.3f of the paths, want about 0.5", p)
	}
}

// TestPortfolioStreams checks the streams' promises: the same paths for
// any number of workers, a shorter run gives the first paths of a longer
// one, and a series' paths do not depend on the other series of the run
// when the series cover the same periods.
func TestPortfolioStreams(t *testing.T) {
	series := []string{"milk/a", "milk/b", "cream/c"}
	pf := testplan.Portfolio(t, series, [][]float64{walshA, walshB, testHistory(49)}, "")
	sums := []Sum{one("a", 0), TotalOf(pf)}
	ref := simulatePortfolio(t, pf, sums, SimOptions{Paths: 3000, Seed: 11, Workers: 1})
	for _, w := range []int{2, 3, 8} {
		got := simulatePortfolio(t, pf, sums, SimOptions{Paths: 3000, Seed: 11, Workers: w})
		if !reflect.DeepEqual(got.Scenarios, ref.Scenarios) {
			t.Errorf("%d workers: paths differ from one worker's", w)
		}
	}
	short := simulatePortfolio(t, pf, sums, SimOptions{Paths: 1500, Seed: 11})
	for h, row := range short.Scenarios[0][1].Demand {
		if !reflect.DeepEqual(row, ref.Scenarios[0][1].Demand[h][:1500]) {
			t.Fatalf("period %d: 1,500 paths are not the first of 3,000", h)
		}
	}
	other := testplan.Portfolio(t, []string{"milk/a", "cream/d"}, [][]float64{walshA, testHistory(49)}, "")
	alone := simulatePortfolio(t, other, []Sum{one("a", 0)}, SimOptions{Paths: 3000, Seed: 11})
	if !reflect.DeepEqual(alone.Scenarios[0][0].Demand, ref.Scenarios[0][0].Demand) {
		t.Error("series a's paths depend on the other series of the run")
	}
	cut := append([]float64(nil), walshB...)
	for i := range 30 {
		cut[i] = math.NaN()
	}
	withShort := testplan.Portfolio(t, []string{"milk/a", "milk/s"}, [][]float64{walshA, cut}, "")
	got := simulatePortfolio(t, withShort, []Sum{one("a", 0)}, SimOptions{Paths: 3000, Seed: 11})
	if !reflect.DeepEqual(got.Scenarios[0][0].Demand, ref.Scenarios[0][0].Demand) {
		t.Error("series a's paths depend on a shorter series beside it")
	}
}

func TestPortfolioRefusals(t *testing.T) {
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{walshA, walshB}, "")
	if _, err := SimulatePortfolio(pf, nil, SimOptions{Paths: 500, Errors: Normal}); !errors.Is(err, ErrPortfolioNormal) {
		t.Errorf("normal errors: %v, want ErrPortfolioNormal", err)
	}
	if _, err := SimulatePortfolio(pf, nil, SimOptions{Paths: 50}); !errors.Is(err, ErrTooFewPaths) {
		t.Errorf("50 paths: %v, want ErrTooFewPaths", err)
	}
}
