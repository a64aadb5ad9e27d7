package plots

import (
	"errors"
	"fmt"
	"math"
)

// Sentinel errors, matched with errors.Is. The errors the chart builders and
// Render return wrap one of them and say which chart, field and index is at
// fault, for example
//
//	plots: plan chart: scenario "new account": upper[3] = NaN: value is NaN or infinite
var (
	// ErrNoData: a chart was given nothing to draw (no labels, no values).
	ErrNoData = errors.New("no data")
	// ErrNotFinite: a value that must be a number is NaN or ±Inf.
	ErrNotFinite = errors.New("value is NaN or infinite")
	// ErrLength: two slices that must match in length do not.
	ErrLength = errors.New("lengths differ")
	// ErrRange: an x position or index lies outside the labelled periods, or
	// a limit that must be positive is not.
	ErrRange = errors.New("out of range")
	// ErrOrder: values that must be ordered are not (a window ending
	// before it starts, a lower control limit above the upper one).
	ErrOrder = errors.New("out of order")
	// ErrFormat: Render was asked for a format other than png or svg.
	ErrFormat = errors.New("unsupported format")
	// ErrSize: Render was asked for a size that is not positive and finite,
	// or is larger than MaxSide.
	ErrSize = errors.New("bad size")
)

// chartError prefixes err with the chart's name: "plots: plan chart: ...".
func chartError(chart string, err error) error {
	return fmt.Errorf("plots: %s: %w", chart, err)
}

// finite reports an error for the first NaN or infinite value of vs, naming
// the slice as what.
func finite(what string, vs []float64) error {
	for i, v := range vs {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("%s[%d] = %v: %w", what, i, v, ErrNotFinite)
		}
	}
	return nil
}

// finiteOrNaN is finite but lets NaN through (NaN marks "no value" in the
// fields that allow it); only ±Inf is an error.
func finiteOrNaN(what string, vs []float64) error {
	for i, v := range vs {
		if math.IsInf(v, 0) {
			return fmt.Errorf("%s[%d] = %v: %w", what, i, v, ErrNotFinite)
		}
	}
	return nil
}

// sameLength reports an error when len(vs) != n, naming the slice as what.
func sameLength(what string, vs []float64, n int, of string) error {
	if len(vs) != n {
		return fmt.Errorf("%s has %d values, want %d (one per %s): %w", what, len(vs), n, of, ErrLength)
	}
	return nil
}

// finiteScalar reports an error when v is NaN or infinite.
func finiteScalar(what string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%s = %v: %w", what, v, ErrNotFinite)
	}
	return nil
}
