package forecast

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestSelectionErrorsByHand works the selection's own errors through on
// two methods with three origins and two lead times. Actuals: origin i,
// lead k+1 targets period i+k, with values 10, 12, 11, 13. Method A always
// forecasts 11, method B 12, so their errors are
//
//	A: (-1, 1), (1, 0), (0, 2)      B: (-2, 0), (0, -1), (-1, 1)
//
// and their mean (the combination) forecasts 11.5.
func TestSelectionErrorsByHand(t *testing.T) {
	mk := func(f float64, errs [][]float64, origins int) *Backtest {
		fc := [][]float64{{f, f}, {f, f}, {f, f}}
		return &Backtest{Train: 10, Origins: origins, Forecasts: fc, Errors: errs}
	}
	errA := [][]float64{{-1, 1}, {1, 0}, {0, 2}}
	errB := [][]float64{{-2, 0}, {0, -1}, {-1, 1}}
	for _, c := range []struct {
		name    string
		origins int
		only    bool
		want    [][]float64
	}{
		// 36 origins: no penalty. Origin 1 knows the error at (0, lead 1):
		// A 1, B 2, combination |10 - 11.5| = 1.5: A wins, its errors at
		// origin 1 are (1, 0). Origin 2 knows (0,1), (0,2), (1,1): A mean
		// (1+1+1)/3 = 1, B (2+0+0)/3 = 0.667, combination (1.5+0.5+0.5)/3
		// = 0.833: B wins, its errors at origin 2 are (-1, 1).
		{"singles win", 36, false, [][]float64{{1, 0}, {-1, 1}}},
		// 3 origins: a single method's error counts 1 + 0.1 (36/3 - 1) =
		// 2.1 times: origin 1, A 2.1 against the combination's 1.5;
		// origin 2, B 1.4 against 0.833. The combination wins both: its
		// errors are 12 - 11.5, 11 - 11.5 and 11 - 11.5, 13 - 11.5.
		{"combination wins", 3, false, [][]float64{{0.5, -0.5}, {-0.5, 1.5}}},
		// Only the combination: its errors whatever the scores.
		{"combination only", 36, true, [][]float64{{0.5, -0.5}, {-0.5, 1.5}}},
	} {
		cands := []Candidate{{Method: SES, bt: mk(11, errA, c.origins)}, {Method: Naive, bt: mk(12, errB, c.origins)}}
		got := selectionErrors(cands, MetricMAD, c.only)
		if len(got) != len(c.want) {
			t.Fatalf("%s: %v, want %v", c.name, got, c.want)
		}
		for i := range got {
			for k := range got[i] {
				if !scalar.EqualWithinAbs(got[i][k], c.want[i][k], 1e-12) {
					t.Errorf("%s: %v, want %v", c.name, got, c.want)
				}
			}
		}
	}
	// Backtests that do not share their origins give nothing.
	bad := []Candidate{{Method: SES, bt: mk(11, errA, 3)}, {Method: Naive, bt: &Backtest{Train: 9, Errors: errB, Forecasts: errB}}}
	if got := selectionErrors(bad, MetricMAD, false); got != nil {
		t.Errorf("origins differ: %v, want nil", got)
	}
}
