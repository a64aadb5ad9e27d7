package data

import (
	"fmt"
	"forelay/forecast"
	"math"
	"strings"
)

// FillMode says what ReadHistory does with a gap inside a series: a period
// that has no row, or whose cell is empty (a NaN in the file is an error,
// never a gap). The zero value, FillNone, makes every gap an error.
type FillMode int

// The fill modes.
const (
	// FillNone rejects gaps with an error wrapping ErrGap.
	FillNone FillMode = iota
	// FillZero puts 0 in every missing period, for quantities where no
	// record means nothing happened.
	FillZero
	// FillInterpolate draws a straight line between the values on either
	// side of the gap. For a gap from index i to index j (v[i] and v[j]
	// known, i < k < j):
	//
	//	v[k] = v[i] + (v[j] - v[i]) * (k - i) / (j - i)
	FillInterpolate
)

var fillNames = [...]string{"none", "zero", "interpolate"}

// String returns the mode's name as ParseFillMode reads it: none, zero or
// interpolate.
func (m FillMode) String() string {
	if m < 0 || int(m) >= len(fillNames) {
		return fmt.Sprintf("FillMode(%d)", int(m))
	}
	return fillNames[m]
}

// ParseFillMode reads a fill mode name: none, zero or interpolate, in any
// case and with surrounding spaces ignored. The empty string gives FillNone.
// Any other text returns an error naming the accepted values.
func ParseFillMode(s string) (FillMode, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "none":
		return FillNone, nil
	case "zero":
		return FillZero, nil
	case "interpolate":
		return FillInterpolate, nil
	}
	return FillNone, fmt.Errorf("unknown fill %q (want none, zero or interpolate)", s)
}

// Filled records one value that ReadHistory made up to close a gap, so that
// a caller can tell the planner what was filled.
type Filled struct {
	// Series is the name of the series the value went into.
	Series string
	// Period is the period that had no value.
	Period forecast.Period
	// Value is the value filled in.
	Value float64
	// Line is the 1-based line of the empty cell, or 0 when the period had
	// no row at all.
	Line int
}

// fillInterior replaces every NaN of v that lies between two numbers by the
// rule of m (see FillZero and FillInterpolate) and returns the indices it
// replaced, in increasing order. NaNs before the first number or after the
// last one are left alone. It panics if m is FillNone or unknown.
func fillInterior(v []float64, m FillMode) []int {
	if m != FillZero && m != FillInterpolate {
		panic("forecast: fillInterior with mode " + m.String())
	}
	var idx []int
	last := -1 // index of the last number seen
	for j, x := range v {
		if math.IsNaN(x) {
			continue
		}
		if last >= 0 && j-last > 1 {
			a, b, d := v[last], x, float64(j-last)
			for k := last + 1; k < j; k++ {
				if m == FillZero {
					v[k] = 0
				} else {
					v[k] = a + (b-a)*float64(k-last)/d
				}
				idx = append(idx, k)
			}
		}
		last = j
	}
	return idx
}
