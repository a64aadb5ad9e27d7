package supply

import (
	"math"
	"testing"
)

// TestNormalBreach checks the breach chance and the expected shortfall
// against the standard normal table and its loss function: at a capacity
// one standard deviation above the mean, P = 1 − Φ(1) = 0.15866 and
// E[(Z − 1)+] = φ(1) − (1 − Φ(1)) = 0.24197 − 0.15866 = 0.08332 (the
// tabulated unit normal loss function L(1) = 0.0833); at the mean, 0.5 and
// φ(0) = 0.39894.
func TestNormalBreach(t *testing.T) {
	for _, tc := range []struct {
		mean, sd, c, p, short float64
	}{
		{100, 10, 110, 0.15866, 10 * 0.08332},
		{100, 10, 100, 0.5, 10 * 0.39894},
		{100, 0, 90, 1, 10},
		{100, 0, 110, 0, 0},
	} {
		p, s := normalBreach(tc.mean, tc.sd, tc.c)
		if math.Abs(p-tc.p) > 5e-5 || math.Abs(s-tc.short) > 5e-4 {
			t.Errorf("mean %v, sd %v, capacity %v: P %v, shortfall %v; want %v, %v", tc.mean, tc.sd, tc.c, p, s, tc.p, tc.short)
		}
	}
}
