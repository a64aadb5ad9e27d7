package forecast

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestMovingAverage(t *testing.T) {
	y := []float64{10, 12, 11, 15, 14}
	tests := []struct {
		name         string
		fit          func([]float64, Config) (Model, error)
		cfg          Config
		wantFitted   []float64
		wantForecast float64
		wantDescribe string
		wantParams   int
		tol          float64
	}{
		{
			name: "moving average, default window 3",
			fit:  fitMovingAverage,
			cfg:  Config{},
			// (10+12+11)/3 = 11, (12+11+15)/3 = 38/3.
			wantFitted: []float64{simpleNaN, simpleNaN, simpleNaN, 11, 38.0 / 3},
			// (11+15+14)/3 = 40/3.
			wantForecast: 40.0 / 3,
			wantDescribe: "window 3",
			tol:          1e-14,
		},
		{
			name: "moving average, window 2",
			fit:  fitMovingAverage,
			cfg:  Config{Window: 2},
			// (10+12)/2 = 11, (12+11)/2 = 11.5, (11+15)/2 = 13.
			wantFitted: []float64{simpleNaN, simpleNaN, 11, 11.5, 13},
			// (15+14)/2 = 14.5.
			wantForecast: 14.5,
			wantDescribe: "window 2",
			tol:          1e-14,
		},
		{
			name: "weighted, weights 1/2/2 scaled to 0.2/0.4/0.4",
			fit:  fitWeightedMovingAverage,
			cfg:  Config{Weights: []float64{1, 2, 2}},
			// 0.2*10 + 0.4*12 + 0.4*11 = 2 + 4.8 + 4.4 = 11.2;
			// 0.2*12 + 0.4*11 + 0.4*15 = 2.4 + 4.4 + 6 = 12.8.
			wantFitted: []float64{simpleNaN, simpleNaN, simpleNaN, 11.2, 12.8},
			// 0.2*11 + 0.4*15 + 0.4*14 = 2.2 + 6 + 5.6 = 13.8.
			wantForecast: 13.8,
			wantDescribe: "weights 0.2/0.4/0.4",
			tol:          1e-14,
		},
		{
			name: "weighted, window given with matching weights",
			fit:  fitWeightedMovingAverage,
			cfg:  Config{Window: 2, Weights: []float64{0.25, 0.75}},
			// 0.25*10 + 0.75*12 = 11.5; 0.25*12 + 0.75*11 = 11.25;
			// 0.25*11 + 0.75*15 = 14.
			wantFitted: []float64{simpleNaN, simpleNaN, 11.5, 11.25, 14},
			// 0.25*15 + 0.75*14 = 14.25.
			wantForecast: 14.25,
			wantDescribe: "weights 0.25/0.75",
			tol:          1e-14,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, err := tc.fit(y, tc.cfg)
			if err != nil {
				t.Fatal(err)
			}
			if got := m.Fitted(); !simpleSameFloats(got, tc.wantFitted, tc.tol) {
				t.Errorf("Fitted = %v, want %v", got, tc.wantFitted)
			}
			if got := m.Extend(y).Fitted(); !simpleSameFloats(got, tc.wantFitted, tc.tol) {
				t.Errorf("Filter = %v, want %v", got, tc.wantFitted)
			}
			want := []float64{tc.wantForecast, tc.wantForecast, tc.wantForecast}
			if got := m.Forecast(3); !simpleSameFloats(got, want, tc.tol) {
				t.Errorf("Forecast = %v, want %v", got, want)
			}
			if got := m.Describe(); got != tc.wantDescribe {
				t.Errorf("Describe = %q, want %q", got, tc.wantDescribe)
			}
			if got := m.NumParams(); got != tc.wantParams {
				t.Errorf("NumParams = %d, want %d", got, tc.wantParams)
			}
			if c, ok := m.VarianceFactors(3); ok || c != nil {
				t.Errorf("VarianceFactors = %v, %v, want nil, false", c, ok)
			}
		})
	}
}

// TestWMAFitExact checks the fitted weights where the best answer is known
// without computation: a series of period 2 is repeated exactly by its
// value two periods back, so w = (1, 0) (oldest first) gives SSE = 0. No
// other weights do: with w = (a, 1-a) the prediction of a 1 is
// a*1 + (1-a)*5 = 5 - 4a, which is 1 only for a = 1.
func TestWMAFitExact(t *testing.T) {
	y := []float64{1, 5, 1, 5, 1, 5, 1, 5, 1, 5}
	m, err := fitWeightedMovingAverage(y, Config{Window: 2})
	if err != nil {
		t.Fatal(err)
	}
	mm := m.(*movingAverageModel)
	// y_t = y_{t-2}: weight 1 on the older value.
	want := []float64{1, 0}
	const tol = 1e-8
	if !simpleSameFloats(mm.weights, want, tol) {
		t.Errorf("weights = %v, want %v", mm.weights, want)
	}
	if got := m.NumParams(); got != 1 {
		t.Errorf("NumParams = %d, want 1", got)
	}
	if got := m.Describe(); got != "weights 1/0, fitted" {
		t.Errorf("Describe = %q", got)
	}
}

// TestWMAFitConstant checks the degenerate case of a constant series, where
// every weight vector fits exactly; the ridge picks equal weights.
func TestWMAFitConstant(t *testing.T) {
	y := []float64{4, 4, 4, 4, 4, 4, 4, 4}
	m, err := fitWeightedMovingAverage(y, Config{})
	if err != nil {
		t.Fatal(err)
	}
	// Any weights summing to one forecast 4; the minimum-norm ones are 1/3 each.
	want := []float64{1.0 / 3, 1.0 / 3, 1.0 / 3}
	if w := m.(*movingAverageModel).weights; !simpleSameFloats(w, want, 1e-6) {
		t.Errorf("weights = %v, want %v", w, want)
	}
	if f := m.Forecast(1); !scalar.EqualWithinAbsOrRel(f[0], 4, 1e-12, 1e-12) {
		t.Errorf("Forecast = %v, want 4", f)
	}
}

// wmaGolden is the file written by testdata/reference/gen_wma.py.
type wmaGolden struct {
	Scipy string `json:"scipy"`
	Cases []struct {
		Name    string    `json:"name"`
		Window  int       `json:"window"`
		Y       []float64 `json:"y"`
		Weights []float64 `json:"weights"`
		SSE     float64   `json:"sse"`
	} `json:"cases"`
}

// TestWMAFitScipy compares the fitted weights with scipy 1.10.1's SLSQP
// (scipy.optimize.minimize, method="SLSQP", bounds [0, 1], equality
// constraint sum(w) = 1; best of several starts), run by
// testdata/reference/gen_wma.py on the nile and elec_equip datasets that
// statsmodels 0.13.5 ships. The SSE must agree to 1e-4 (relative), and the
// weights, which are unique for these data, to 1e-3.
func TestWMAFitScipy(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("testdata", "reference", "wma_golden.json"))
	if err != nil {
		t.Fatal(err)
	}
	var g wmaGolden
	if err := json.Unmarshal(b, &g); err != nil {
		t.Fatal(err)
	}
	if len(g.Cases) == 0 {
		t.Fatal("no cases in wma_golden.json")
	}
	for _, tc := range g.Cases {
		t.Run(tc.Name, func(t *testing.T) {
			m, err := fitWeightedMovingAverage(tc.Y, Config{Window: tc.Window})
			if err != nil {
				t.Fatal(err)
			}
			w := m.(*movingAverageModel).weights
			sum := 0.0
			for _, v := range w {
				if v < 0 {
					t.Errorf("negative weight in %v", w)
				}
				sum += v
			}
			if !scalar.EqualWithinAbsOrRel(sum, 1, 1e-12, 1e-12) {
				t.Errorf("weights sum to %v", sum)
			}
			sse := 0.0
			for i, f := range m.Fitted() {
				if !math.IsNaN(f) {
					sse += (tc.Y[i] - f) * (tc.Y[i] - f)
				}
			}
			if !scalar.EqualWithinAbsOrRel(sse, tc.SSE, 0, 1e-4) {
				t.Errorf("SSE = %v, scipy %v (weights %v vs %v)", sse, tc.SSE, w, tc.Weights)
			}
			if !simpleSameFloats(w, tc.Weights, 1e-3) {
				t.Errorf("weights = %v, scipy %v", w, tc.Weights)
			}
		})
	}
}

// TestWMAFilterOtherData checks that Filter holds the weights and runs over
// other data of any length.
func TestWMAFilterOtherData(t *testing.T) {
	m, err := fitWeightedMovingAverage([]float64{10, 12, 11, 15, 14}, Config{Weights: []float64{1, 2, 2}})
	if err != nil {
		t.Fatal(err)
	}
	// Weights 0.2/0.4/0.4: 0.2*1 + 0.4*2 + 0.4*3 = 2.2; 0.2*2 + 0.4*3 + 0.4*4 = 3.2.
	want := []float64{simpleNaN, simpleNaN, simpleNaN, 2.2, 3.2}
	if got := m.Extend([]float64{1, 2, 3, 4, 5}).Fitted(); !simpleSameFloats(got, want, 1e-14) {
		t.Errorf("Filter = %v, want %v", got, want)
	}
	// Shorter than the window: no prediction at all.
	if got := m.Extend([]float64{1, 2}).Fitted(); !simpleSameFloats(got, []float64{simpleNaN, simpleNaN}, 0) {
		t.Errorf("Filter(short) = %v, want all NaN", got)
	}
}
