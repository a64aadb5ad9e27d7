package evaluate

import (
	"fmt"
	"math"
	"math/rand/v2"
	"time"

	"forelay/forecast"
)

// syntheticStart is the first day of every synthetic series.
var syntheticStart = time.Date(2010, 1, 1, 0, 0, 0, 0, time.UTC)

// A family of synthetic series: how a series of n values with season m is
// drawn.
type family struct {
	name string
	// seasons is the length in whole seasons, before the held-out part,
	// drawn uniformly from [lo, hi].
	lo, hi int
	draw   func(rng *rand.Rand, n, m int) []float64
}

// families are the synthetic families, in report order. Every level is
// around 100 to 200 and the noise a few percent to 10 % of it, so the
// series look like demand (positive) except where a family says otherwise.
var families = []family{
	{"level", 6, 12, drawLevel},
	{"trend-season", 6, 12, drawTrendSeason},
	{"damped-trend", 6, 12, drawDampedTrend},
	{"mult-season", 6, 12, drawMultSeason},
	{"heavy-tail", 6, 12, drawHeavyTail},
	{"level-shift", 6, 12, drawLevelShift},
	{"short", 3, 4, drawTrendSeason},
}

// Families returns the names of the synthetic families in report order:
//
//   - level: a constant level plus normal noise;
//   - trend-season: a straight line (its level changes by -30 % to +60 %
//     over the series) plus a fixed additive season plus normal noise;
//   - damped-trend: an additive damped-trend exponential smoothing process
//     (ETS(A,Ad,N): alpha 0.3, beta 0.1, phi 0.9) driven by normal errors;
//   - mult-season: a rising line times a fixed season times (1 + normal
//     noise of 5 %);
//   - heavy-tail: the trend-season shape with Student's t noise on 3
//     degrees of freedom;
//   - level-shift: the trend-season shape whose level steps up or down by
//     4 noise deviations at a point drawn in the last two thirds;
//   - short: the trend-season shape, only 3 or 4 seasons before the
//     held-out part.
//
// All but short hold 6 to 12 seasons before the held-out part.
func Families() []string {
	out := make([]string, len(families))
	for i, f := range families {
		out[i] = f.name
	}
	return out
}

// Synthetic returns reps seeded series of every family, monthly and then
// quarterly within each family, as cases with Source SourceSynthetic and
// Group the family name. A series holds its family's seasons plus H values
// (H as Config.Horizon gives it; nil means Frequency.DefaultHorizon), so
// that its first origin keeps them all as history. Series are named
// family-month-01 and so on and start in 2010-01 or 2010-Q1. The same seed
// gives the same series on the same Go release (math/rand/v2's PCG); each
// series has its own stream, so adding a family changes none of the others.
func Synthetic(seed uint64, reps int, horizon func(forecast.Frequency) int) []Case {
	if horizon == nil {
		horizon = forecast.Frequency.DefaultHorizon
	}
	var out []Case
	for fi, fam := range families {
		for qi, freq := range []forecast.Frequency{forecast.Monthly, forecast.Quarterly} {
			m := freq.SeasonLength()
			start := forecast.PeriodOf(freq, syntheticStart)
			for r := range reps {
				rng := rand.New(rand.NewPCG(seed, uint64(fi)<<32|uint64(qi)<<24|uint64(r)))
				n := (fam.lo+rng.IntN(fam.hi-fam.lo+1))*m + horizon(freq)
				s := forecast.Series{
					Name:   fmt.Sprintf("%s-%s-%02d", fam.name, freq, r+1),
					Start:  start,
					Values: fam.draw(rng, n, m),
				}
				out = append(out, Case{Series: s, Source: SourceSynthetic, Group: fam.name})
			}
		}
	}
	return out
}

// seasonShape returns m additive seasonal offsets with amplitude amp that
// sum to zero.
func seasonShape(rng *rand.Rand, m int, amp float64) []float64 {
	s := make([]float64, m)
	mean := 0.0
	phase := rng.Float64() * 2 * math.Pi
	for i := range s {
		s[i] = math.Sin(2*math.Pi*float64(i)/float64(m)+phase) + 0.4*rng.NormFloat64()
		mean += s[i] / float64(m)
	}
	for i := range s {
		s[i] = amp * (s[i] - mean)
	}
	return s
}

func drawLevel(rng *rand.Rand, n, _ int) []float64 {
	level, sd := 100+100*rng.Float64(), 5+10*rng.Float64()
	y := make([]float64, n)
	for t := range y {
		y[t] = level + sd*rng.NormFloat64()
	}
	return y
}

// trendSeason draws the line-plus-season shape and the noise deviation;
// noise(rng) returns one standardised noise value.
func trendSeason(rng *rand.Rand, n, m int, noise func(*rand.Rand) float64) ([]float64, float64) {
	level := 100 + 100*rng.Float64()
	slope := level * (-0.3 + 0.9*rng.Float64()) / float64(n)
	season := seasonShape(rng, m, 10+20*rng.Float64())
	sd := 4 + 8*rng.Float64()
	y := make([]float64, n)
	for t := range y {
		y[t] = level + slope*float64(t) + season[t%m] + sd*noise(rng)
	}
	return y, sd
}

func normal(rng *rand.Rand) float64 { return rng.NormFloat64() }

// studentT3 returns a Student's t value on 3 degrees of freedom scaled to
// unit variance (the t_3 variance is 3/(3-2) = 3).
func studentT3(rng *rand.Rand) float64 {
	chi := 0.0
	for range 3 {
		z := rng.NormFloat64()
		chi += z * z
	}
	return rng.NormFloat64() / math.Sqrt(chi/3) / math.Sqrt(3)
}

func drawTrendSeason(rng *rand.Rand, n, m int) []float64 {
	y, _ := trendSeason(rng, n, m, normal)
	return y
}

func drawHeavyTail(rng *rand.Rand, n, m int) []float64 {
	y, _ := trendSeason(rng, n, m, studentT3)
	return y
}

func drawLevelShift(rng *rand.Rand, n, m int) []float64 {
	y, sd := trendSeason(rng, n, m, normal)
	at := n/3 + rng.IntN(n-n/3)
	shift := 4 * sd
	if rng.IntN(2) == 0 {
		shift = -shift
	}
	for t := at; t < n; t++ {
		y[t] += shift
	}
	return y
}

// drawDampedTrend simulates ETS(A,Ad,N) (Hyndman et al. 2008, table 2.1):
//
//	y_t = l_{t-1} + phi b_{t-1} + e_t
//	l_t = l_{t-1} + phi b_{t-1} + alpha e_t
//	b_t = phi b_{t-1} + beta e_t
func drawDampedTrend(rng *rand.Rand, n, _ int) []float64 {
	const alpha, beta, phi = 0.3, 0.1, 0.9
	l, b, sd := 200+100*rng.Float64(), 2*rng.NormFloat64(), 3+3*rng.Float64()
	y := make([]float64, n)
	for t := range y {
		e := sd * rng.NormFloat64()
		y[t] = l + phi*b + e
		l += phi*b + alpha*e
		b = phi*b + beta*e
	}
	return y
}

func drawMultSeason(rng *rand.Rand, n, m int) []float64 {
	level, slope := 100+100*rng.Float64(), 0.3+0.7*rng.Float64()
	season := seasonShape(rng, m, 0.1+0.2*rng.Float64())
	y := make([]float64, n)
	for t := range y {
		y[t] = (level + slope*float64(t)) * (1 + season[t%m]) * (1 + 0.05*rng.NormFloat64())
	}
	return y
}
