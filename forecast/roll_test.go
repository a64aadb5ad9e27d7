package forecast

import (
	"math"
	"testing"
)

// TestRollerMatchesExtend checks that rolling a model forward one
// observation at a time forecasts, bit for bit, what Model.Extend over the
// same data forecasts, at every origin of a backtest, for every model that
// rolls. The series are invented: a seasonal one, and an intermittent one
// whose training window ends in zeros (Croston's periods since the last
// demand carry over); a missing value in the holdout is included, as
// Extend accepts one.
func TestRollerMatchesExtend(t *testing.T) {
	seasonal := make([]float64, 60)
	for i := range seasonal {
		seasonal[i] = 100 + float64(i) + 20*math.Sin(2*math.Pi*float64(i)/12) + float64((i*7)%5)
	}
	intermittent := []float64{0, 3, 0, 0, 5, 0, 0, 0, 2, 0, 4, 0, 0, 6, 0, 1, 0, 0, 3, 0,
		0, 0, 2, 0, 0, 5, 0, 0, 0, 0, 4, 0, 2, 0, 0, 3, 0, 0}
	tests := []struct {
		name   string
		y      []float64
		train  int
		method Method
		cfg    Config
	}{
		{"naive", seasonal, 40, Naive, Config{Season: 12}},
		{"seasonal naive", seasonal, 40, SeasonalNaive, Config{Season: 12}},
		{"moving average", seasonal, 40, MovingAverage, Config{Season: 12}},
		{"weighted moving average", seasonal, 40, WeightedMovingAverage, Config{Season: 12}},
		{"linear trend with dummies", seasonal, 40, LinearTrend, Config{Season: 12, Dummies: true}},
		{"ses", seasonal, 40, SES, Config{Season: 12}},
		{"damped holt", seasonal, 40, DampedHolt, Config{Season: 12}},
		{"holt-winters additive", seasonal, 40, HoltWintersAdditive, Config{Season: 12}},
		{"holt-winters multiplicative", seasonal, 40, HoltWintersMultiplicative, Config{Season: 12}},
		{"croston, training ends in zeros", intermittent, 29, Croston, Config{Season: 1}},
		{"sba", intermittent, 26, SBA, Config{Season: 1}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			y := append([]float64(nil), tc.y...)
			y[len(y)-3] = math.NaN() // a missing value in the holdout
			base, err := FitMethod(y[:tc.train], tc.method, tc.cfg)
			if err != nil {
				t.Fatal(err)
			}
			r, ok := base.(rollable)
			if !ok {
				t.Fatalf("%T does not roll", base)
			}
			roll := r.roller(y[:tc.train])
			for o := tc.train + 1; o <= len(y); o++ {
				roll.rollOn(y[:o])
				got, want := roll.Forecast(6), base.Extend(y[:o]).Forecast(6)
				for k := range want {
					// Tolerance: none; the same arithmetic in the same order.
					if got[k] != want[k] && !(math.IsNaN(got[k]) && math.IsNaN(want[k])) {
						t.Fatalf("origin %d, lead %d: rolled %v, extended %v", o, k+1, got[k], want[k])
					}
				}
			}
		})
	}
}
