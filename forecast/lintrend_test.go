package forecast

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestLinearTrendByHand checks the simple regression on a short series
// where everything can be written out.
func TestLinearTrendByHand(t *testing.T) {
	// y = 1, 3, 5, 7 lies on y = -1 + 2t (t = 1..4), so OLS gives b0 = -1,
	// b1 = 2, fitted = y and forecasts 9, 11.
	y := []float64{1, 3, 5, 7}
	m, err := fitLinearTrend(y, Config{Season: 1})
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-12
	lt := m.(*linearTrendModel)
	if want := []float64{-1, 2}; !simpleSameFloats(lt.coef, want, tol) {
		t.Errorf("coef = %v, want %v", lt.coef, want)
	}
	if got := m.Fitted(); !simpleSameFloats(got, y, tol) {
		t.Errorf("Fitted = %v, want %v", got, y)
	}
	if want, got := []float64{9, 11}, m.Forecast(2); !simpleSameFloats(got, want, tol) {
		t.Errorf("Forecast = %v, want %v", got, want)
	}
	// Simple regression prediction variance (any regression text):
	// c = 1 + 1/n + (t - tbar)^2 / Sxx with n = 4, tbar = 2.5,
	// Sxx = 2.25 + 0.25 + 0.25 + 2.25 = 5:
	// t = 5: 1 + 0.25 + 6.25/5 = 2.5; t = 6: 1 + 0.25 + 12.25/5 = 3.7.
	if want, got := []float64{2.5, 3.7}, simpleMustVar(t, m, 2); !simpleSameFloats(got, want, tol) {
		t.Errorf("VarianceFactors = %v, want %v", got, want)
	}
	if got := m.Describe(); got != "slope 2 per period" {
		t.Errorf("Describe = %q", got)
	}
	if m.NumParams() != 2 {
		t.Errorf("NumParams = %d, want 2", m.NumParams())
	}
	// Filter holds the coefficients: the line depends on t only.
	if want, got := []float64{1, 3, 5, 7, 9}, m.Extend([]float64{0, 0, 0, 0, 0}).Fitted(); !simpleSameFloats(got, want, tol) {
		t.Errorf("Filter = %v, want %v", got, want)
	}
}

func simpleMustVar(t *testing.T, m Model, h int) []float64 {
	t.Helper()
	c, ok := m.VarianceFactors(h)
	if !ok {
		t.Fatal("VarianceFactors: ok = false")
	}
	return c
}

// olsGolden is the file written by testdata/reference/gen_ols.py.
type olsGolden struct {
	Statsmodels string `json:"statsmodels"`
	Horizon     int    `json:"horizon"`
	Cases       []struct {
		Name      string    `json:"name"`
		Season    int       `json:"season"`
		Dummies   bool      `json:"dummies"`
		Y         []float64 `json:"y"`
		Coef      []float64 `json:"coef"`
		Fitted    []float64 `json:"fitted"`
		Forecast  []float64 `json:"forecast"`
		VarFactor []float64 `json:"var_factor"`
	} `json:"cases"`
}

// TestLinearTrendStatsmodels compares coefficients, fitted values,
// forecasts and prediction variance factors with statsmodels 0.13.5 OLS
// (sm.OLS(y, X).fit(); params, fittedvalues,
// get_prediction(Xf).predicted_mean and se_obs**2 / scale), computed by
// testdata/reference/gen_ols.py on the elec_equip and nile datasets that
// statsmodels ships, with and without seasonal dummies.
func TestLinearTrendStatsmodels(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("testdata", "reference", "ols_golden.json"))
	if err != nil {
		t.Fatal(err)
	}
	var g olsGolden
	if err := json.Unmarshal(b, &g); err != nil {
		t.Fatal(err)
	}
	if len(g.Cases) == 0 || !strings.HasPrefix(g.Statsmodels, "0.13.5") {
		t.Fatalf("unexpected golden file: %d cases, statsmodels %q", len(g.Cases), g.Statsmodels)
	}
	const tol = 1e-9
	for _, tc := range g.Cases {
		t.Run(tc.Name, func(t *testing.T) {
			m, err := fitLinearTrend(tc.Y, Config{Season: tc.Season, Dummies: tc.Dummies})
			if err != nil {
				t.Fatal(err)
			}
			if got := m.(*linearTrendModel).coef; !simpleSameFloats(got, tc.Coef, tol) {
				t.Errorf("coef = %v,\nwant %v", got, tc.Coef)
			}
			if got := m.Fitted(); !simpleSameFloats(got, tc.Fitted, tol) {
				t.Errorf("Fitted differs from statsmodels fittedvalues")
			}
			if got := m.Extend(tc.Y).Fitted(); !simpleSameFloats(got, tc.Fitted, tol) {
				t.Errorf("Filter(y) differs from statsmodels fittedvalues")
			}
			if got := m.Forecast(g.Horizon); !simpleSameFloats(got, tc.Forecast, tol) {
				t.Errorf("Forecast = %v,\nwant %v", got, tc.Forecast)
			}
			if got := simpleMustVar(t, m, g.Horizon); !simpleSameFloats(got, tc.VarFactor, tol) {
				t.Errorf("VarianceFactors = %v,\nwant %v", got, tc.VarFactor)
			}
			if d := m.Describe(); tc.Dummies != strings.Contains(d, "dummies for season") {
				t.Errorf("Describe = %q", d)
			}
			if want := len(tc.Coef); m.NumParams() != want {
				t.Errorf("NumParams = %d, want %d", m.NumParams(), want)
			}
		})
	}
}
