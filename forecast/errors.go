package forecast

import (
	"errors"
	"fmt"
)

// Sentinel errors, matched with errors.Is. Parse errors wrap them.
var (
	// ErrMissingColumn: the header lacks a column the layout needs.
	ErrMissingColumn = errors.New("missing column")
	// ErrBadNumber: a cell that should hold a number does not.
	ErrBadNumber = errors.New("not a number")
	// ErrEmptyCell: a cell that should hold a value is empty or NaN.
	ErrEmptyCell = errors.New("empty value")
	// ErrDuplicatePeriod: the same period appears twice for one series.
	ErrDuplicatePeriod = errors.New("duplicate period")
	// ErrUnsorted: the periods of a series go backwards.
	ErrUnsorted = errors.New("periods out of order")
	// ErrGap: periods are missing and no fill rule was given.
	ErrGap = errors.New("gap in periods")
	// ErrTooShort: a series has fewer points than the method needs.
	ErrTooShort = errors.New("too few points")
	// ErrNoSeries: the file holds no series, or not the one asked for.
	ErrNoSeries = errors.New("no such series")
	// ErrInternal: a fit failed through a bug, not through the data.
	ErrInternal = errors.New("internal error")
)

// A ParseError reports a problem at a place in an input file. Line and
// Column are 1-based; Column counts bytes (as encoding/csv does). A zero
// Line or Column is left out of the message.
type ParseError struct {
	File   string
	Line   int
	Column int
	Field  string // the column or key involved, if any
	Err    error
}

// Error prints "file:line:column: field: message".
func (e *ParseError) Error() string {
	s := e.File
	if e.Line > 0 {
		s += fmt.Sprintf(":%d", e.Line)
		if e.Column > 0 {
			s += fmt.Sprintf(":%d", e.Column)
		}
	}
	if e.Field != "" {
		s += ": " + e.Field
	}
	return s + ": " + e.Err.Error()
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

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
