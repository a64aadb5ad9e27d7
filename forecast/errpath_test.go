package forecast

import "testing"

// otherModel is a Model from outside the package's methods.
type otherModel struct{ Model }

func TestShockForm(t *testing.T) {
	y := make([]float64, 36)
	for i := range y {
		y[i] = 100 + float64(i%12) + 0.5*float64(i)
	}
	fit := func(m Method, cfg Config) Model {
		md, err := FitMethod(y, m, cfg)
		if err != nil {
			t.Fatal(err)
		}
		return md
	}
	damped := fit(HoltWintersAdditive, Config{Season: 12, Damped: true})
	for _, tc := range []struct {
		name       string
		md         Model
		wantSeason int
		wantPhi    float64 // by the table on ShockForm
		wantOK     bool
	}{
		{"naive", fit(Naive, Config{}), 1, 1, true},
		{"seasonal-naive", fit(SeasonalNaive, Config{Season: 4}), 4, 1, true},
		{"moving-average", fit(MovingAverage, Config{Window: 3}), 1, 1, true},
		{"holt", fit(Holt, Config{}), 1, 1, true},
		{"holt-winters damped", damped, 12, damped.Params().Phi, true},
		{"linear-trend", fit(LinearTrend, Config{}), 1, 1, true},
		{"another package's model", otherModel{damped}, 0, 0, false},
	} {
		m, phi, ok := ShockForm(tc.md)
		if m != tc.wantSeason || phi != tc.wantPhi || ok != tc.wantOK {
			t.Errorf("%s: ShockForm = %d, %v, %v; want %d, %v, %v", tc.name, m, phi, ok, tc.wantSeason, tc.wantPhi, tc.wantOK)
		}
	}
}
