package forecast

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestMeasure checks every measure on small worked examples, computed by
// hand from the definitions in Hyndman & Koehler (2006), "Another look at
// measures of forecast accuracy", IJF 22(4): e_t = y_t - f_t,
// MAPE = mean(|100 e_t / y_t|), MASE = mean(|e_t / Q|) with Q the
// in-sample mean absolute naive error, and from common practice for MAD,
// MSE, bias and the tracking signal (sum of errors over MAD).
func TestMeasure(t *testing.T) {
	n := simpleNaN
	tests := []struct {
		name              string
		actual, predicted []float64
		scale             float64
		div               Divisor
		want              Accuracy
		tol               float64
	}{
		{
			// Training 10, 12, 14, 13, 15: Q = (2+2+1+2)/4 = 1.75 (see
			// TestMASEScale). Test actuals 16, 14, 18, 20 against a flat
			// forecast of 15: e = 1, -1, 3, 5.
			name:   "worked example, n-1",
			actual: []float64{16, 14, 18, 20}, predicted: []float64{15, 15, 15, 15},
			scale: 1.75, div: DivisorNMinus1,
			want: Accuracy{
				N: 4,
				// MAD = (1+1+3+5)/4 = 2.5
				MAD: 2.5,
				// SSE = 1+1+9+25 = 36; MSE = 36/3 = 12; RMSE = sqrt(12)
				MSE: 12, RMSE: math.Sqrt(12),
				// MAPE = 100/4 * (1/16 + 1/14 + 3/18 + 5/20)
				//      = 25 * (0.0625 + 0.0714286 + 0.1666667 + 0.25) = 13.764881
				MAPE: 25 * (1.0/16 + 1.0/14 + 3.0/18 + 5.0/20),
				// MASE = mean(|e|/Q) = 2.5/1.75 = 1.4285714
				MASE: 2.5 / 1.75,
				// Bias = (1-1+3+5)/4 = 2; TS = 8/2.5 = 3.2
				Bias: 2, TrackingSignal: 3.2,
				Divisor: DivisorNMinus1,
			},
			tol: 1e-12,
		},
		{
			name:   "worked example, n",
			actual: []float64{16, 14, 18, 20}, predicted: []float64{15, 15, 15, 15},
			scale: 1.75, div: DivisorN,
			want: Accuracy{
				N: 4, MAD: 2.5,
				// MSE = 36/4 = 9; RMSE = 3
				MSE: 9, RMSE: 3,
				MAPE: 25 * (1.0/16 + 1.0/14 + 3.0/18 + 5.0/20), MASE: 2.5 / 1.75,
				Bias: 2, TrackingSignal: 3.2, Divisor: DivisorN,
			},
			tol: 1e-12,
		},
		{
			// Pairs with a NaN are skipped: (0, 1) and (4, 5) are used,
			// e = -1, -1. The zero actual is left out of MAPE only:
			// MAPE = 100 * |-1/4| / 1 = 25.
			name:   "zero actual and NaN pairs",
			actual: []float64{0, 4, n, 5}, predicted: []float64{1, 5, 3, n},
			scale: 2, div: DivisorNMinus1,
			want: Accuracy{
				N: 2, MAD: 1,
				// SSE = 2; MSE = 2/1 = 2
				MSE: 2, RMSE: math.Sqrt2,
				MAPE: 25, MAPESkipped: 1,
				// MASE = 1/2
				MASE: 0.5,
				// Bias = -1; TS = -2/1 = -2
				Bias: -1, TrackingSignal: -2,
			},
			tol: 1e-12,
		},
		{
			// A zero or NaN scale gives MASE = NaN; all actuals zero gives
			// MAPE = NaN; perfect forecasts give MAD = 0 and TS = 0.
			name:   "degenerate: perfect forecast of zeros",
			actual: []float64{0, 0, 0}, predicted: []float64{0, 0, 0},
			scale: 0, div: DivisorN,
			want: Accuracy{
				N: 3, MAD: 0, MSE: 0, RMSE: 0, MAPE: n, MAPESkipped: 3, MASE: n,
				Bias: 0, TrackingSignal: 0, Divisor: DivisorN,
			},
			tol: 0,
		},
		{
			// One pair: SSE/(n-1) is undefined.
			name:   "one pair, n-1",
			actual: []float64{3}, predicted: []float64{1},
			scale: n, div: DivisorNMinus1,
			want: Accuracy{
				// e = 2: MAD 2, MAPE 100*2/3, bias 2, TS 2/2 = 1
				N: 1, MAD: 2, MSE: n, RMSE: n, MAPE: 200.0 / 3, MASE: n, Bias: 2, TrackingSignal: 1,
			},
			tol: 1e-12,
		},
		{
			name:   "no pairs",
			actual: []float64{n, 1}, predicted: []float64{1, n},
			scale: 1, div: DivisorN,
			want: Accuracy{
				N: 0, MAD: n, MSE: n, RMSE: n, MAPE: n, MASE: n, Bias: n, TrackingSignal: n,
				Divisor: DivisorN,
			},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := Measure(tc.actual, tc.predicted, tc.scale, tc.div)
			if got.N != tc.want.N || got.MAPESkipped != tc.want.MAPESkipped || got.Divisor != tc.want.Divisor {
				t.Errorf("N, MAPESkipped, Divisor = %d, %d, %v, want %d, %d, %v",
					got.N, got.MAPESkipped, got.Divisor, tc.want.N, tc.want.MAPESkipped, tc.want.Divisor)
			}
			fields := []struct {
				name      string
				got, want float64
			}{
				{"MAD", got.MAD, tc.want.MAD},
				{"MSE", got.MSE, tc.want.MSE},
				{"RMSE", got.RMSE, tc.want.RMSE},
				{"MAPE", got.MAPE, tc.want.MAPE},
				{"MASE", got.MASE, tc.want.MASE},
				{"Bias", got.Bias, tc.want.Bias},
				{"TrackingSignal", got.TrackingSignal, tc.want.TrackingSignal},
			}
			for _, f := range fields {
				if math.IsNaN(f.want) != math.IsNaN(f.got) ||
					!math.IsNaN(f.want) && !scalar.EqualWithinAbsOrRel(f.got, f.want, tc.tol, tc.tol) {
					t.Errorf("%s = %v, want %v", f.name, f.got, f.want)
				}
			}
		})
	}
}

// TestMASEScale checks the scale of Hyndman & Koehler (2006), computed by
// hand: Q = (1/(n-m)) sum_{t=m+1..n} |y_t - y_{t-m}|.
func TestMASEScale(t *testing.T) {
	tests := []struct {
		name   string
		train  []float64
		season int
		want   float64
		tol    float64
	}{
		// |12-10| + |14-12| + |13-14| + |15-13| = 7 over 4 pairs = 1.75.
		{"naive", []float64{10, 12, 14, 13, 15}, 1, 1.75, 1e-15},
		// season 0 counts as 1.
		{"season 0", []float64{10, 12, 14, 13, 15}, 0, 1.75, 1e-15},
		// m = 4: |6-5| + |8-7| + |10-9| + |5-4| = 4 over 4 pairs = 1.
		{"seasonal", []float64{5, 7, 9, 4, 6, 8, 10, 5}, 4, 1, 1e-15},
		// m = 4, one more point: + |9-6| = 7 over 5 pairs = 1.4.
		{"seasonal, 9 points", []float64{5, 7, 9, 4, 6, 8, 10, 5, 9}, 4, 1.4, 1e-15},
		// The NaN drops the pairs (2, NaN) and (NaN, 6): |2-1| + |5-6| = 2 over 2 pairs = 1.
		{"NaN skipped", []float64{1, 2, simpleNaN, 6, 5}, 1, 1, 1e-15},
		// Too short: no pair at all.
		{"too short", []float64{3, 4}, 4, simpleNaN, 0},
		{"empty", nil, 1, simpleNaN, 0},
	}
	for _, tc := range tests {
		got := MASEScale(tc.train, tc.season)
		if math.IsNaN(tc.want) != math.IsNaN(got) ||
			!math.IsNaN(tc.want) && !scalar.EqualWithinAbsOrRel(got, tc.want, tc.tol, tc.tol) {
			t.Errorf("%s: MASEScale = %v, want %v", tc.name, got, tc.want)
		}
	}
}

func TestDivisor(t *testing.T) {
	tests := []struct {
		in      string
		want    Divisor
		wantErr bool
	}{
		{"", DivisorNMinus1, false},
		{"n-1", DivisorNMinus1, false},
		{" n ", DivisorN, false},
		{"n", DivisorN, false},
		{"N+1", 0, true},
		{"sample", 0, true},
	}
	for _, tc := range tests {
		got, err := ParseDivisor(tc.in)
		if (err != nil) != tc.wantErr || !tc.wantErr && got != tc.want {
			t.Errorf("ParseDivisor(%q) = %v, %v, want %v (error %v)", tc.in, got, err, tc.want, tc.wantErr)
		}
	}
	if DivisorNMinus1.String() != "n-1" || DivisorN.String() != "n" || Divisor(7).String() != "Divisor(7)" {
		t.Errorf("String: %q %q %q", DivisorNMinus1, DivisorN, Divisor(7))
	}
	var zero Accuracy
	if zero.Divisor != DivisorNMinus1 {
		t.Errorf("zero Divisor = %v, want n-1", zero.Divisor)
	}
}
