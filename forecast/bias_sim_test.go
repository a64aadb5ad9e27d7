package forecast

import (
	"flag"
	"math"
	"math/rand/v2"
	"testing"
)

var biasSim = flag.Bool("biassim", false, "run the false-alarm simulation of the backtest bias test (a few seconds)")

// TestBiasFalseAlarmRate is a simulation study, not a check: it measures
// how often backtests are called biased at the 5% level, for series drawn
// from models that fit them (the rate should be near 5%) and from models
// that do not (a higher rate is power), comparing BiasOf on the one-step
// errors with a Newey-West test of all the pooled errors grouped by origin
// (lag H-1, normal p-value). Run it with
//
//	go test ./forecast -run BiasFalseAlarmRate -biassim -v
//
// The rates quoted in the doc of Backtest.Bias come from it (seeded, 1000
// series per row, monthly, H = 12).
func TestBiasFalseAlarmRate(t *testing.T) {
	if !*biasSim {
		t.Skip("simulation; run with -biassim")
	}
	rng := rand.New(rand.NewPCG(7, 7))
	noise := func(sd float64) float64 { return sd * rng.NormFloat64() }
	season := func(i int) float64 { return 10 * math.Sin(2*math.Pi*float64(i)/12) }
	gen := func(n int, f func(i int, prev float64) float64) []float64 {
		y := make([]float64, n)
		prev := 100.0
		for i := range y {
			y[i] = f(i, prev)
			prev = y[i]
		}
		return y
	}
	level := 100.0
	cases := []struct {
		name string
		m    Method
		gen  func(n int) []float64
	}{
		{"fits: white noise, ses", SES, func(n int) []float64 {
			return gen(n, func(int, float64) float64 { return 100 + noise(10) })
		}},
		{"fits: local level, ses", SES, func(n int) []float64 {
			level = 100
			return gen(n, func(int, float64) float64 { e := noise(10); level += 0.3 * e; return level - 0.3*e + e })
		}},
		{"fits: random walk, naive", Naive, func(n int) []float64 {
			return gen(n, func(_ int, prev float64) float64 { return prev + noise(5) })
		}},
		{"fits: season and noise, holt-winters", HoltWintersAdditive, func(n int) []float64 {
			return gen(n, func(i int, _ float64) float64 { return 100 + season(i) + noise(5) })
		}},
		{"fits: fixed trend and noise, holt", Holt, func(n int) []float64 {
			return gen(n, func(i int, _ float64) float64 { return 100 + 0.5*float64(i) + noise(5) })
		}},
		{"misses: trend 0.5/period, ses", SES, func(n int) []float64 {
			return gen(n, func(i int, _ float64) float64 { return 100 + 0.5*float64(i) + noise(5) })
		}},
		{"misses: trend 0.2/period, ses", SES, func(n int) []float64 {
			return gen(n, func(i int, _ float64) float64 { return 100 + 0.2*float64(i) + noise(5) })
		}},
	}
	const reps, H = 1000, 12
	for _, c := range cases {
		for _, n := range []int{96, 180} {
			G := DefaultHoldout(n)
			pooled, oneStep := 0, 0
			for range reps {
				y := c.gen(n)
				rows := backtestErrors(t, y, c.m, G, H)
				if pooledBiasT(rows, H-1) > 1.96 {
					pooled++
				}
				var one []float64
				for _, r := range rows {
					one = append(one, r[0])
				}
				if BiasOf(one).Significant() {
					oneStep++
				}
			}
			t.Logf("%-40s n=%3d origins=%d  pooled, lag %d: %.3f   one-step (BiasOf): %.3f",
				c.name, n, G, H-1, float64(pooled)/reps, float64(oneStep)/reps)
		}
	}
}

// backtestErrors returns the errors of RunBacktest's loop, by origin and
// lead time.
func backtestErrors(t *testing.T, y []float64, m Method, holdout, maxH int) [][]float64 {
	n, train := len(y), len(y)-holdout
	base, err := FitMethod(y[:train], m, Config{Season: 12})
	if err != nil {
		t.Fatal(err)
	}
	var rows [][]float64
	for o := train; o < n; o++ {
		model := base
		if o > train {
			model = base.Extend(y[:o])
		}
		f := model.Forecast(min(maxH, n-o))
		row := make([]float64, len(f))
		for k := range f {
			row[k] = y[o+k] - f[k]
		}
		rows = append(rows, row)
	}
	return rows
}

// pooledBiasT returns |mean/SE| for the mean of every error, with the
// Newey-West standard error of a ratio of sums over origins:
// u_g = sum_g - mean count_g, SE^2 = G NeweyWest(u, lag) / M^2.
func pooledBiasT(rows [][]float64, lag int) float64 {
	tot, m := 0.0, 0
	for _, r := range rows {
		for _, e := range r {
			tot += e
			m++
		}
	}
	mean := tot / float64(m)
	u := make([]float64, len(rows))
	for g, r := range rows {
		for _, e := range r {
			u[g] += e
		}
		u[g] -= mean * float64(len(r))
	}
	se := math.Sqrt(float64(len(rows))*NeweyWest(u, lag)) / float64(m)
	return math.Abs(mean / se)
}
