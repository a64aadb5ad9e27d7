package forecast

import (
	"math"
	"math/rand/v2"
	"testing"
)

// benchPortfolio returns k seeded monthly series of n points with varied
// level, trend, season strength and noise (the same recipe as
// examples/generate -kind bench, built in memory).
func benchPortfolio(k, n int) []Series {
	start, _ := ParsePeriod("2016-01", Monthly)
	out := make([]Series, k)
	for j := range out {
		rng := rand.New(rand.NewPCG(uint64(j)+1, 7))
		level := math.Exp(5 + 7*rng.Float64()) // about 150 to 160,000
		trend := (rng.Float64() - 0.3) * 0.006
		amp := 0.3 * rng.Float64()
		noise := 0.01 + 0.09*rng.Float64()
		phase := 2 * math.Pi * rng.Float64()
		y := make([]float64, n)
		for t := range y {
			s := 1 + amp*math.Sin(2*math.Pi*float64(t)/12+phase)
			y[t] = math.Max(0, math.Round(level*math.Pow(1+trend, float64(t))*s*(1+noise*rng.NormFloat64())))
		}
		out[j] = Series{Name: "s", Start: start, Values: y}
	}
	return out
}

// BenchmarkFitAllAuto1000 fits method auto (backtest MAD over every
// candidate and the combination of the best three, built from their
// backtests) to 1,000 monthly series of 120 points on two workers. Target:
// at most 15 s per run on two cores (see README, Performance).
func BenchmarkFitAllAuto1000(b *testing.B) {
	series := benchPortfolio(1000, 120)
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		for _, oc := range FitAll(series, Spec{}, 2) {
			if oc.Err != nil {
				b.Fatal(oc.Err)
			}
		}
	}
}
