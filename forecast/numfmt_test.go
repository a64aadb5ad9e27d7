package forecast

import (
	"math"
	"testing"
)

func TestFormatNumber(t *testing.T) {
	// Expected strings written by hand: commas every three digits of the
	// whole part, rounding by strconv (round half to even on the binary
	// value).
	for _, tc := range []struct {
		v        float64
		decimals int
		want     string
	}{
		{900000, 0, "900,000"},
		{-1234567.891, 1, "-1,234,567.9"},
		{480123.4, 0, "480,123"},
		{1234.5678, 2, "1,234.57"},
		{12.5, 2, "12.50"},
		{0.25, -1, "0.25"},
		{1e6, -1, "1,000,000"},
		{-0.004, 2, "0.00"}, // rounds to zero: no minus sign
		{0, -1, "0"},
		{math.NaN(), 0, "-"},
		{math.Inf(1), 0, "inf"},
		{math.Inf(-1), 0, "-inf"},
	} {
		if got := FormatNumber(tc.v, tc.decimals); got != tc.want {
			t.Errorf("FormatNumber(%v, %d) = %q, want %q", tc.v, tc.decimals, got, tc.want)
		}
	}
}

func TestDecimals(t *testing.T) {
	// The rule of the plan tables: 0 decimals from 1000, 1 from 100, else 2.
	for _, tc := range []struct {
		v    []float64
		want int
	}{
		{[]float64{12, -1500}, 0},
		{[]float64{999.9, math.NaN()}, 1},
		{[]float64{99}, 2},
		{nil, 2},
	} {
		if got := Decimals(tc.v); got != tc.want {
			t.Errorf("Decimals(%v) = %d, want %d", tc.v, got, tc.want)
		}
	}
}
