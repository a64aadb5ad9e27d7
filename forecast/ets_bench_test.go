package forecast

import "testing"

// The benchmarks fit one 120-point monthly series: the last 120 points of
// statsmodels' elec_equip dataset (testdata/statsmodels/ets_golden.json).

func benchETS(b *testing.B, m Method, cfg Config) {
	g := loadETSGolden(b)
	y := g.series(b, "elec_equip_last120")
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		// Each fit evaluates its starting grid: a fit of the same data
		// again would read the grid from the cache (see etsGrids).
		etsGrids = etsGridCache{}
		if _, err := fitETS(y, m, cfg); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkHoltWintersAdditive120 fits Holt-Winters additive (season 12).
// Target: at most 0.5 ms per fit on one core.
func BenchmarkHoltWintersAdditive120(b *testing.B) {
	benchETS(b, HoltWintersAdditive, Config{Season: 12})
}

// BenchmarkHoltWintersMult120 fits Holt-Winters multiplicative (season 12).
func BenchmarkHoltWintersMult120(b *testing.B) {
	benchETS(b, HoltWintersMultiplicative, Config{Season: 12})
}

// BenchmarkSES120 fits simple exponential smoothing.
func BenchmarkSES120(b *testing.B) {
	benchETS(b, SES, Config{})
}
