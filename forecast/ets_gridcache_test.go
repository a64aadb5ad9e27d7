package forecast

import (
	"math"
	"testing"
)

// TestETSGridCacheChangesNothing fits the Holt-Winters models to invented
// monthly series (benchPortfolio) with the grid computed afresh and with
// the grid read from the other season kind's fit of the same data, and
// requires the same parameters and forecasts bit for bit (tolerance: none;
// a cached grid is the grid the fit computes).
func TestETSGridCacheChangesNothing(t *testing.T) {
	fitBoth := func(y []float64, first, second Method, cfg Config) (Model, Model) {
		a, err := FitMethod(y, first, cfg)
		if err != nil {
			t.Fatal(err)
		}
		b, err := FitMethod(y, second, cfg)
		if err != nil {
			t.Fatal(err)
		}
		return a, b
	}
	same := func(a, b Model) bool {
		fa, fb := a.Forecast(12), b.Forecast(12)
		pa, pb := a.Params(), b.Params()
		for i := range fa {
			if math.Float64bits(fa[i]) != math.Float64bits(fb[i]) {
				return false
			}
		}
		return math.Float64bits(pa.Alpha) == math.Float64bits(pb.Alpha) &&
			math.Float64bits(pa.Beta) == math.Float64bits(pb.Beta) &&
			math.Float64bits(pa.Gamma) == math.Float64bits(pb.Gamma)
	}
	for i, s := range benchPortfolio(12, 96) {
		for _, cfg := range []Config{{Season: 12}, {Season: 12, Damped: true}} {
			etsGrids = etsGridCache{}
			hwa, _ := fitBoth(s.Values, HoltWintersAdditive, Naive, cfg)
			etsGrids = etsGridCache{}
			hwm, _ := fitBoth(s.Values, HoltWintersMultiplicative, Naive, cfg)
			etsGrids = etsGridCache{}
			_, hwmHit := fitBoth(s.Values, HoltWintersAdditive, HoltWintersMultiplicative, cfg)
			if !cfg.Damped && etsGrids.hits != 1 {
				t.Fatalf("series %d: %d grids read from the cache, want 1", i, etsGrids.hits)
			}
			etsGrids = etsGridCache{}
			_, hwaHit := fitBoth(s.Values, HoltWintersMultiplicative, HoltWintersAdditive, cfg)
			if !same(hwa, hwaHit) {
				t.Errorf("series %d %+v: additive fit differs with the cached grid", i, cfg)
			}
			if !same(hwm, hwmHit) {
				t.Errorf("series %d %+v: multiplicative fit differs with the cached grid", i, cfg)
			}
		}
	}
}
