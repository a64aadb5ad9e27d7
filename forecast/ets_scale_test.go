package forecast

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestFitExtremeScales fits copies of a golden series multiplied by 1e160
// and 1e-160 (whose squares overflow or underflow float64) and checks
// that every method whose parameters are fitted by least squares finds
// the parameters of the unscaled fit, and reports states, fitted values,
// forecasts and variance factors in the units of the data. Expected
// values: the unscaled fit times the factor (the fit is scale-equivariant:
// multiplying the data by c multiplies the SSE by c² for every parameter
// value, so the minimiser is the same).
func TestFitExtremeScales(t *testing.T) {
	g := loadETSGolden(t)
	y := g.series(t, "elec_equip_last120")
	methods := []struct {
		m   Method
		cfg Config
	}{
		{SES, Config{}},
		{Holt, Config{}},
		{DampedHolt, Config{}},
		{HoltWintersAdditive, Config{Season: 12}},
		{HoltWintersAdditive, Config{Season: 12, Damped: true}},
		{HoltWintersMultiplicative, Config{Season: 12}},
		{Croston, Config{}},
		{SBA, Config{}},
		{WeightedMovingAverage, Config{Window: 4}},
	}
	const tol = 1e-6
	for _, tc := range methods {
		base, err := FitMethod(y, tc.m, tc.cfg)
		if err != nil {
			t.Fatalf("%v: %v", tc.m, err)
		}
		for _, c := range []float64{1e160, 1e-160} {
			ys := make([]float64, len(y))
			for i, v := range y {
				ys[i] = v * c
			}
			md, err := FitMethod(ys, tc.m, tc.cfg)
			if err != nil {
				t.Errorf("%v at %g: %v", tc.m, c, err)
				continue
			}
			bp, p := base.Params(), md.Params()
			for i, pair := range [][2]float64{{p.Alpha, bp.Alpha}, {p.Beta, bp.Beta}, {p.Gamma, bp.Gamma}, {p.Phi, bp.Phi}} {
				if math.IsNaN(pair[0]) != math.IsNaN(pair[1]) || (!math.IsNaN(pair[1]) && !scalar.EqualWithinAbs(pair[0], pair[1], tol)) {
					t.Errorf("%v at %g: parameter %d = %v, unscaled fit %v", tc.m, c, i, pair[0], pair[1])
				}
			}
			same := func(what string, got, want []float64) {
				for i := range want {
					if math.IsNaN(want[i]) && math.IsNaN(got[i]) {
						continue
					}
					if !scalar.EqualWithinRel(got[i], want[i]*c, tol) {
						t.Errorf("%v at %g: %s[%d] = %v, want %v", tc.m, c, what, i, got[i], want[i]*c)
						return
					}
				}
			}
			same("fitted", md.Fitted(), base.Fitted())
			same("forecast", md.Forecast(24), base.Forecast(24))
			// SSE in units of c²: Σ((y - ŷ)/c)² equals the unscaled SSE.
			var sse, bsse float64
			for i, f := range md.Fitted() {
				if !math.IsNaN(f) {
					e := (ys[i] - f) / c
					sse += e * e
					bsse += (y[i] - base.Fitted()[i]) * (y[i] - base.Fitted()[i])
				}
			}
			if !scalar.EqualWithinRel(sse, bsse, tol) {
				t.Errorf("%v at %g: SSE/c² = %v, unscaled %v", tc.m, c, sse, bsse)
			}
			bf, bok := base.VarianceFactors(24)
			vf, ok := md.VarianceFactors(24)
			if ok != bok {
				t.Errorf("%v at %g: VarianceFactors ok = %v, unscaled %v", tc.m, c, ok, bok)
				continue
			}
			for i := range bf {
				if !scalar.EqualWithinRel(vf[i], bf[i], tol) {
					t.Errorf("%v at %g: variance factor %d = %v, unscaled %v", tc.m, c, i+1, vf[i], bf[i])
					break
				}
			}
			if e, ok := md.(*etsModel); ok {
				b := base.(*etsModel)
				if !scalar.EqualWithinRel(e.init.level, b.init.level*c, tol) || !scalar.EqualWithinRel(e.last.level, b.last.level*c, tol) {
					t.Errorf("%v at %g: level %v, want %v", tc.m, c, e.init.level, b.init.level*c)
				}
				if !scalar.EqualWithinAbs(e.init.trend/c, b.init.trend, tol*math.Abs(b.init.level)) {
					t.Errorf("%v at %g: trend %v, want %v", tc.m, c, e.init.trend, b.init.trend*c)
				}
				for j, s := range b.init.season {
					want := s * c
					if e.shape.mult {
						want = s // factors have no unit
					}
					if !scalar.EqualWithinAbsOrRel(e.init.season[j], want, tol*math.Abs(b.init.level*c), tol) {
						t.Errorf("%v at %g: seasonal state %d = %v, want %v", tc.m, c, j, e.init.season[j], want)
						break
					}
				}
			}
		}
	}
}
