package data

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// The expected values are the decimal numbers as written (exactly
// representable, or the float64 nearest to them, as strconv.ParseFloat
// gives); the grammar is ParseDecimal's own.
func TestParseDecimal(t *testing.T) {
	good := []struct {
		in   string
		want float64
	}{
		{"0", 0},
		{"12", 12},
		{"-3.5", -3.5},
		{"+.5", 0.5},
		{"7.", 7},
		{" 1.2e3 ", 1200},
		{"1E-2", 0.01},
		{"-0", math.Copysign(0, -1)},
		{"0012.50", 12.5},
		{"1e-999", 0}, // below the smallest subnormal: 0, as strconv.ParseFloat
		{"1.7976931348623157e308", math.MaxFloat64},
	}
	for _, tc := range good {
		got, err := ParseDecimal(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("ParseDecimal(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
	}
	bad := []struct {
		in   string
		kind error
		msg  string
	}{
		{"", ErrNotDecimal, `not a plain decimal number: ""`},
		{"1_000", ErrNotDecimal, `not a plain decimal number: "1_000"; write the digits without separators, such as 1000`},
		{"1,000", ErrNotDecimal, "no thousands separators"},
		{"0x1p4", ErrNotDecimal, `"0x1p4"; write the value in decimal digits`},
		{"-0X10", ErrNotDecimal, "decimal digits"},
		{".", ErrNotDecimal, "such as -12.5 or 1.2e3"},
		{"+", ErrNotDecimal, ""},
		{"1e", ErrNotDecimal, ""},
		{"1e+", ErrNotDecimal, ""},
		{"e5", ErrNotDecimal, ""},
		{"1.2.3", ErrNotDecimal, ""},
		{"--1", ErrNotDecimal, ""},
		{"1 000", ErrNotDecimal, ""},
		{"١٢", ErrNotDecimal, ""}, // Arabic-Indic digits are not 0 to 9
		{"12kg", ErrNotDecimal, ""},
		{"NaN", ErrNotFinite, `not a finite number: "NaN"; leave the cell empty where the value is missing`},
		{"-nan", ErrNotFinite, ""},
		{"Inf", ErrNotFinite, ""},
		{"+inf", ErrNotFinite, ""},
		{"-Infinity", ErrNotFinite, ""},
		{"1e309", ErrNotFinite, "out of range"},
		{"-2e308", ErrNotFinite, "out of range"},
	}
	for _, tc := range bad {
		got, err := ParseDecimal(tc.in)
		if err == nil {
			t.Errorf("ParseDecimal(%q) = %v, want an error", tc.in, got)
			continue
		}
		if !errors.Is(err, tc.kind) || !errors.Is(err, ErrBadNumber) {
			t.Errorf("ParseDecimal(%q): %v does not wrap %v and %v", tc.in, err, tc.kind, ErrBadNumber)
		}
		if !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("ParseDecimal(%q): %q does not contain %q", tc.in, err, tc.msg)
		}
	}
}
