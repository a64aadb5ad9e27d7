package data

import (
	"errors"
	"fmt"

	"forelay/forecast"
)

// Sentinel errors, matched with errors.Is. Parse errors wrap them.
var (
	// ErrMissingColumn: the header lacks a column the layout needs.
	ErrMissingColumn = errors.New("missing column")
	// ErrBadNumber: a cell that should hold a number does not (the same
	// error value as forecast's, so errors.Is matches either).
	ErrBadNumber = forecast.ErrBadNumber
	// ErrEmptyCell: a cell that should hold a value is empty or NaN (the
	// same error value as forecast's).
	ErrEmptyCell = forecast.ErrEmptyCell
	// ErrDuplicatePeriod: the same period appears twice for one series.
	ErrDuplicatePeriod = errors.New("duplicate period")
	// ErrUnsorted: the periods of a series go backwards.
	ErrUnsorted = errors.New("periods out of order")
	// ErrGap: periods are missing and no fill rule was given.
	ErrGap = errors.New("gap in periods")
	// ErrNoSeries: the file holds no series, or not the one asked for.
	ErrNoSeries = errors.New("no such series")
)

// A ParseError reports a problem at a place in an input file. Line and
// Column are 1-based; Column counts bytes (as encoding/csv does). A zero
// Line or Column is left out of the message. In a workbook, Sheet names
// the sheet, Line is the row and Column the column (1 for A).
type ParseError struct {
	File   string
	Sheet  string // the sheet of a workbook; empty for a text file
	Line   int
	Column int
	Field  string // the column or key involved, if any
	Err    error
}

// Error prints "file:line:column: field: message", or for a sheet of a
// workbook "file: sheet NAME, cell C14: field: message" (", row 14" when
// the whole row is at fault).
func (e *ParseError) Error() string {
	s := e.File
	if e.Sheet != "" {
		s += ": sheet " + e.Sheet
		switch {
		case e.Line > 0 && e.Column > 0:
			s += ", cell " + CellName(e.Column, e.Line)
		case e.Line > 0:
			s += fmt.Sprintf(", row %d", e.Line)
		}
	} else if e.Line > 0 {
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

// CellName returns the name of the cell of a sheet at a 1-based column
// and row, as a spreadsheet shows it: CellName(3, 14) is "C14" and
// CellName(28, 2) "AB2". It panics if col or row is below 1.
func CellName(col, row int) string {
	if col < 1 || row < 1 {
		panic(fmt.Sprintf("data: CellName(%d, %d)", col, row))
	}
	var letters []byte
	for n := col; n > 0; n = (n - 1) / 26 {
		letters = append([]byte{byte('A' + (n-1)%26)}, letters...)
	}
	return fmt.Sprintf("%s%d", letters, row)
}
