package forecast

import (
	"errors"
	"fmt"
)

// Sentinel errors, matched with errors.Is.
var (
	// ErrBadNumber: a value that should be a number is not (an infinity).
	ErrBadNumber = errors.New("not a number")
	// ErrEmptyCell: a value that should be there is empty or NaN.
	ErrEmptyCell = errors.New("empty value")
	// ErrTooShort: a series has fewer points than the method needs.
	ErrTooShort = errors.New("too few points")
	// ErrInternal: a fit failed through a bug, not through the data.
	ErrInternal = errors.New("internal error")
)

// TooShortError says a series is too short for a method. It wraps ErrTooShort.
type TooShortError struct {
	Series string
	Method Method
	Need   int
	Have   int
}

func (e *TooShortError) Error() string {
	pts := "points"
	if e.Have == 1 {
		pts = "point"
	}
	return fmt.Sprintf("series %q has %d %s; %s needs at least %d", e.Series, e.Have, pts, e.Method, e.Need)
}

// Unwrap returns ErrTooShort.
func (e *TooShortError) Unwrap() error { return ErrTooShort }
