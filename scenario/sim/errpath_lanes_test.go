package sim

import (
	"math/rand/v2"
	"testing"
)

// The lanes of a laneFilter give what errorFilter gives path by path,
// number for number: the same arithmetic in the same order.
func TestLaneFilterMatchesErrorFilter(t *testing.T) {
	seasonal := &shockResponse{m: 4, phi: 0.9, a: []float64{0.7, 0.3, 0, 0.2}, b: []float64{0.05, 0.05, 0.05, 0.05}, trend: true}
	seasonal.active = []int{0, 1, 2, 3}
	for _, tc := range []struct {
		name string
		r    *shockResponse
	}{
		{"naive", &shockResponse{m: 1, phi: 1, a: []float64{1}, b: []float64{0}, active: []int{0}}},
		{"seasonal naive", &shockResponse{m: 3, phi: 1, a: []float64{1, 0, 0}, b: []float64{0, 0, 0}, active: []int{0}}},
		{"damped", &shockResponse{m: 1, phi: 0.5, a: []float64{0.2}, b: []float64{1}, active: []int{0}, trend: true}},
		{"damped seasonal", seasonal},
	} {
		t.Run(tc.name, func(t *testing.T) {
			const lanes, B, H = 8, 5, 23
			rng := rand.New(rand.NewPCG(3, 4))
			buf := make([]float64, H*lanes)
			eps := make([][]float64, B)
			for i := range eps {
				eps[i] = make([]float64, H)
				for tt := range eps[i] {
					eps[i][tt] = rng.NormFloat64()
					buf[tt*lanes+i] = eps[i][tt]
				}
			}
			f := newLaneFilter(tc.r, lanes)
			for range 2 { // a second run starts afresh
				copyBuf := append([]float64(nil), buf...)
				f.run(copyBuf, B)
				for i := range B {
					want := filterAll(tc.r, eps[i])
					for tt, w := range want {
						if got := copyBuf[tt*lanes+i]; got != w {
							t.Fatalf("lane %d period %d: %v, want %v", i, tt, got, w)
						}
					}
				}
			}
		})
	}
}
