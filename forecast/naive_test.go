package forecast

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// simpleSameFloats reports whether got and want have the same length and
// agree within tol (absolute or relative), NaN matching NaN.
func simpleSameFloats(got, want []float64, tol float64) bool {
	if len(got) != len(want) {
		return false
	}
	for i := range got {
		if math.IsNaN(want[i]) {
			if !math.IsNaN(got[i]) {
				return false
			}
			continue
		}
		if !scalar.EqualWithinAbsOrRel(got[i], want[i], tol, tol) {
			return false
		}
	}
	return true
}

var simpleNaN = math.NaN()

func TestNaive(t *testing.T) {
	y := []float64{10, 12, 11, 15}
	m, err := fitNaive(y, Config{Season: 1})
	if err != nil {
		t.Fatal(err)
	}
	// Naive: yhat_{t+1} = y_t, so the fitted values are y shifted by one
	// and every forecast is the last value, 15.
	wantFitted := []float64{simpleNaN, 10, 12, 11}
	wantForecast := []float64{15, 15, 15}
	// Random walk: c_h = h (Hyndman & Athanasopoulos, FPP 3rd ed., Table 5.2,
	// sigma_h = sigma sqrt(h)).
	wantVar := []float64{1, 2, 3, 4}
	const tol = 1e-15
	if got := m.Fitted(); !simpleSameFloats(got, wantFitted, tol) {
		t.Errorf("Fitted = %v, want %v", got, wantFitted)
	}
	if got := m.Extend(y).Fitted(); !simpleSameFloats(got, wantFitted, tol) {
		t.Errorf("Filter(y) = %v, want %v", got, wantFitted)
	}
	if got := m.Forecast(3); !simpleSameFloats(got, wantForecast, tol) {
		t.Errorf("Forecast(3) = %v, want %v", got, wantForecast)
	}
	if got, ok := m.VarianceFactors(4); !ok || !simpleSameFloats(got, wantVar, tol) {
		t.Errorf("VarianceFactors(4) = %v, %v, want %v, true", got, ok, wantVar)
	}
	if m.Method() != Naive || m.NumParams() != 0 || !math.IsNaN(m.Params().Alpha) {
		t.Errorf("Method, NumParams, Params = %v, %d, %+v", m.Method(), m.NumParams(), m.Params())
	}
	if got := m.Forecast(0); len(got) != 0 {
		t.Errorf("Forecast(0) = %v, want empty", got)
	}
}

func TestSeasonalNaive(t *testing.T) {
	tests := []struct {
		name         string
		y            []float64
		season, h    int
		wantFitted   []float64
		wantForecast []float64
		wantVar      []float64
		tol          float64
	}{
		{
			name:   "season 4, two cycles",
			y:      []float64{5, 7, 9, 4, 6, 8, 10, 5},
			season: 4,
			h:      9,
			// yhat_t = y_{t-4}; NaN for the first cycle.
			wantFitted: []float64{simpleNaN, simpleNaN, simpleNaN, simpleNaN, 5, 7, 9, 4},
			// The last cycle 6, 8, 10, 5 repeated.
			wantForecast: []float64{6, 8, 10, 5, 6, 8, 10, 5, 6},
			// c_h = floor((h-1)/4) + 1 (FPP 3rd ed., Table 5.2: sigma_h = sigma sqrt(k+1)).
			wantVar: []float64{1, 1, 1, 1, 2, 2, 2, 2, 3},
			tol:     1e-15,
		},
		{
			name:   "season 1 is the naive method",
			y:      []float64{3, 1, 2},
			season: 1,
			h:      3,
			// yhat_t = y_{t-1}.
			wantFitted:   []float64{simpleNaN, 3, 1},
			wantForecast: []float64{2, 2, 2},
			// c_h = h for m = 1 (floor((h-1)/1) + 1 = h).
			wantVar: []float64{1, 2, 3},
			tol:     1e-15,
		},
		{
			name:       "season 12, horizon 13",
			y:          []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13},
			season:     12,
			h:          13,
			wantFitted: []float64{simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, simpleNaN, 1},
			// y[n-12+(h-1) mod 12] = y[1+(h-1) mod 12]: 2..13, then 2 again.
			wantForecast: []float64{2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 2},
			// floor((13-1)/12) + 1 = 2 at h = 13, 1 before.
			wantVar: []float64{1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 2},
			tol:     1e-15,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, err := fitSeasonalNaive(tc.y, Config{Season: tc.season})
			if err != nil {
				t.Fatal(err)
			}
			if got := m.Fitted(); !simpleSameFloats(got, tc.wantFitted, tc.tol) {
				t.Errorf("Fitted = %v, want %v", got, tc.wantFitted)
			}
			if got := m.Extend(tc.y).Fitted(); !simpleSameFloats(got, tc.wantFitted, tc.tol) {
				t.Errorf("Filter = %v, want %v", got, tc.wantFitted)
			}
			if got := m.Forecast(tc.h); !simpleSameFloats(got, tc.wantForecast, tc.tol) {
				t.Errorf("Forecast = %v, want %v", got, tc.wantForecast)
			}
			if got, ok := m.VarianceFactors(tc.h); !ok || !simpleSameFloats(got, tc.wantVar, tc.tol) {
				t.Errorf("VarianceFactors = %v, %v, want %v, true", got, ok, tc.wantVar)
			}
		})
	}
}

func TestSimpleMinPoints(t *testing.T) {
	w3 := []float64{1, 1, 2}
	tests := []struct {
		name string
		m    Method
		cfg  Config
		want int
	}{
		// The rule of simpleMinPoints: the model's quantities plus one error.
		{"naive", Naive, Config{Season: 12}, 2},
		{"seasonal naive 12", SeasonalNaive, Config{Season: 12}, 13},
		{"moving average default window", MovingAverage, Config{}, 4},
		{"moving average window 5", MovingAverage, Config{Window: 5}, 6},
		{"wma given weights", WeightedMovingAverage, Config{Weights: w3}, 4},
		{"wma fitted default", WeightedMovingAverage, Config{}, 6},
		{"wma fitted window 4", WeightedMovingAverage, Config{Window: 4}, 8},
		{"linear trend", LinearTrend, Config{Season: 12}, 3},
		{"linear trend with dummies", LinearTrend, Config{Season: 12, Dummies: true}, 14},
		{"croston", Croston, Config{}, 2},
		{"sba", SBA, Config{}, 2},
	}
	for _, tc := range tests {
		if got := simpleMinPoints(tc.m, tc.cfg); got != tc.want {
			t.Errorf("%s: simpleMinPoints = %d, want %d", tc.name, got, tc.want)
		}
	}
}

// TestSimpleErrors checks that bad input comes back as an error, not a
// panic, for every simple method.
func TestSimpleErrors(t *testing.T) {
	neg := -0.5
	big := 1.5
	fits := map[Method]func([]float64, Config) (Model, error){
		Naive:                 fitNaive,
		SeasonalNaive:         fitSeasonalNaive,
		MovingAverage:         fitMovingAverage,
		WeightedMovingAverage: fitWeightedMovingAverage,
		LinearTrend:           fitLinearTrend,
		Croston:               func(y []float64, c Config) (Model, error) { return fitCroston(y, c, false) },
		SBA:                   func(y []float64, c Config) (Model, error) { return fitCroston(y, c, true) },
	}
	long := []float64{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15}
	tests := []struct {
		name     string
		m        Method
		y        []float64
		cfg      Config
		sentinel error // checked with errors.Is when not nil
		need     int   // checked on a *TooShortError when not 0
	}{
		{"naive NaN", Naive, []float64{1, simpleNaN, 3}, Config{Season: 1}, ErrBadNumber, 0},
		{"naive Inf", Naive, []float64{1, math.Inf(1), 3}, Config{Season: 1}, ErrBadNumber, 0},
		{"naive empty", Naive, nil, Config{Season: 1}, ErrTooShort, 2},
		{"naive one point", Naive, []float64{4}, Config{Season: 1}, ErrTooShort, 2},
		{"seasonal naive short", SeasonalNaive, long[:12], Config{Season: 12}, ErrTooShort, 13},
		{"seasonal naive season 0", SeasonalNaive, long, Config{}, nil, 0},
		{"moving average short", MovingAverage, long[:3], Config{}, ErrTooShort, 4},
		{"moving average bad window", MovingAverage, long, Config{Window: -1}, nil, 0},
		{"moving average NaN", MovingAverage, []float64{1, 2, 3, simpleNaN, 5}, Config{}, ErrBadNumber, 0},
		{"wma negative weight", WeightedMovingAverage, long, Config{Weights: []float64{1, -1, 2}}, nil, 0},
		{"wma NaN weight", WeightedMovingAverage, long, Config{Weights: []float64{1, simpleNaN, 2}}, nil, 0},
		{"wma zero weights", WeightedMovingAverage, long, Config{Weights: []float64{0, 0, 0}}, nil, 0},
		{"wma wrong count", WeightedMovingAverage, long, Config{Window: 4, Weights: []float64{1, 2, 3}}, nil, 0},
		{"wma bad window", WeightedMovingAverage, long, Config{Window: -3}, nil, 0},
		{"wma fitted short", WeightedMovingAverage, long[:5], Config{}, ErrTooShort, 6},
		{"wma given short", WeightedMovingAverage, long[:2], Config{Weights: []float64{1, 1}}, ErrTooShort, 3},
		{"linear trend short", LinearTrend, long[:2], Config{Season: 1}, ErrTooShort, 3},
		{"linear trend dummies short", LinearTrend, long[:13], Config{Season: 12, Dummies: true}, ErrTooShort, 14},
		{"linear trend NaN", LinearTrend, []float64{1, 2, simpleNaN, 4}, Config{Season: 1}, ErrBadNumber, 0},
		{"croston all zero", Croston, []float64{0, 0, 0, 0}, Config{}, nil, 0},
		{"sba all zero", SBA, []float64{0, 0, 0}, Config{}, nil, 0},
		{"croston short", Croston, []float64{3}, Config{}, ErrTooShort, 2},
		{"croston NaN", Croston, []float64{0, 3, simpleNaN}, Config{}, ErrBadNumber, 0},
		{"croston negative alpha", Croston, []float64{0, 3, 0, 2}, Config{Fixed: Fixed{Alpha: &neg}}, nil, 0},
		{"croston alpha above 1", SBA, []float64{0, 3, 0, 2}, Config{Fixed: Fixed{Alpha: &big}}, nil, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, err := fits[tc.m](tc.y, tc.cfg)
			if err == nil {
				t.Fatalf("got model %v, want an error", m.Describe())
			}
			if tc.sentinel != nil && !errors.Is(err, tc.sentinel) {
				t.Errorf("error %q does not wrap %q", err, tc.sentinel)
			}
			if tc.need != 0 {
				var ts *TooShortError
				if !errors.As(err, &ts) {
					t.Fatalf("error %q is not a *TooShortError", err)
				}
				if ts.Need != tc.need || ts.Have != len(tc.y) || ts.Method != tc.m || ts.Series != "" {
					t.Errorf("TooShortError = %+v, want Need %d, Have %d, Method %v", *ts, tc.need, len(tc.y), tc.m)
				}
			}
		})
	}
}
