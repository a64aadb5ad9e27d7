package data

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// Rows reads the rows of a table file, a CSV file or one sheet of a
// workbook, one at a time, with the place of each cell. Histories,
// actuals, production plans and events files are all read through it, so
// that a workbook is read by the same rules as a CSV file.
type Rows struct {
	// File is the name the file was opened under, for messages.
	File string
	// Sheet is the sheet read from a workbook; empty for a CSV file.
	Sheet string
	// Separator is the cell separator of a CSV file (',', ';' or '\t'),
	// detected from its header; 0 for a workbook.
	Separator rune
	// Decimal is the decimal mark asked for.
	Decimal Decimal

	csv   *csv.Reader
	sheet *sheetRows
}

// Workbook signatures: an .xlsx file is a zip archive; an .xls file of
// the older binary format is an OLE compound file.
var (
	zipMagic = []byte("PK\x03\x04")
	oleMagic = []byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1}
)

// OpenRows starts reading the table file r holds: a workbook (.xlsx,
// told by its content, not its name) from the sheet format.Sheet names or
// its first one, or else a CSV file whose separator is detected from its
// header (see "CSV as spreadsheets save it"), a UTF-8 byte order mark
// skipped. name is used in messages. The errors are *ParseError values:
// wrapping ErrDialect for a decimal comma asked of a comma-separated file
// or a sheet the workbook lacks, or the workbook's own error when it
// cannot be read. A workbook is read whole into memory; r should be
// bounded (BoundedReader).
func OpenRows(r io.Reader, name string, format Format) (*Rows, error) {
	br := bufio.NewReaderSize(r, headerPeek)
	head, _ := br.Peek(len(oleMagic))
	switch {
	case bytes.HasPrefix(head, zipMagic):
		src, err := io.ReadAll(br)
		if err != nil {
			return nil, readError(name, err)
		}
		sr, sheet, err := openSheet(src, name, format.Sheet, format.Percent)
		if err != nil {
			return nil, err
		}
		return &Rows{File: name, Sheet: sheet, Decimal: format.Decimal, sheet: sr}, nil
	case bytes.Equal(head, oleMagic):
		return nil, &ParseError{File: name, Err: fmt.Errorf("%w: a workbook in the older binary format (.xls); save it as .xlsx, or as CSV", ErrDialect)}
	}
	if bytes.HasPrefix(head, utf8BOM) {
		br.Discard(len(utf8BOM))
	}
	sep := detectSeparator(br)
	if format.Decimal == DecimalComma && sep == ',' {
		return nil, &ParseError{File: name, Err: fmt.Errorf(
			"%w: decimal commas were asked for (--decimal comma, or decimal: comma under history), but the cells of this file are separated by commas, which would split every number in two; save the file with semicolons or tabs between cells, or write decimal points and leave the decimal setting out",
			ErrDialect)}
	}
	cr := csv.NewReader(br)
	cr.Comma = sep
	cr.FieldsPerRecord = -1 // checked by the caller, so that blank rows of any width pass
	cr.TrimLeadingSpace = sep != '\t'
	cr.ReuseRecord = true
	return &Rows{File: name, Separator: sep, Decimal: format.Decimal, csv: cr}, nil
}

// readError turns an error reading the file into the error to return:
// a *ParseError from a BoundedReader names the file already.
func readError(name string, err error) error {
	if pe, ok := err.(*ParseError); ok {
		return pe
	}
	return fmt.Errorf("%s: %w", name, err)
}

// Read returns the next row, io.EOF after the last one. The slice may be
// reused by the next call. The cells of a workbook row are its values as
// text (see "Workbooks"); a row shorter than the header is padded with
// empty cells.
func (r *Rows) Read() ([]string, error) {
	if r.sheet != nil {
		return r.sheet.read()
	}
	return r.csv.Read()
}

// FieldPos returns the 1-based line and column of cell i of the row read
// last: in a CSV file the line and byte column, in a workbook the row and
// column number (1 for A).
func (r *Rows) FieldPos(i int) (line, column int) {
	if r.sheet != nil {
		return r.sheet.row, i + 1
	}
	return r.csv.FieldPos(i)
}

// Describe says how the file is read, for notes and messages: "cells
// separated by semicolons, decimal commas" or "sheet \"demand\"".
func (r *Rows) Describe() string {
	if r.sheet != nil {
		return "sheet " + strconv.Quote(r.Sheet)
	}
	s := "cells separated by " + separatorName(r.Separator)
	if r.Decimal == DecimalComma {
		s += ", decimal commas"
	}
	return s
}

// Standard reports whether the file is a CSV file separated by commas
// and read with decimal points: the case that needs no note.
func (r *Rows) Standard() bool {
	return r.sheet == nil && r.Separator == ',' && r.Decimal == DecimalPoint
}

// ErrorAt returns a *ParseError at the 1-based line and column of a cell
// (as FieldPos gives them), naming the sheet of a workbook.
func (r *Rows) ErrorAt(line, column int, field string, err error) *ParseError {
	return &ParseError{File: r.File, Sheet: r.Sheet, Line: line, Column: column, Field: field, Err: err}
}

// headerHint ends the message about a header that fits no layout: it
// names the separator the header was read with.
func (hr *historyReader) headerHint(cells int) string {
	if hr.rows == nil || hr.rows.sheet != nil {
		return ""
	}
	if cells == 1 {
		return "; the line has no comma, semicolon or tab, so it was read as one cell: separate the cells by one of them"
	}
	return fmt.Sprintf("; its cells were read as separated by %s, the separator found most on this line", separatorName(hr.rows.Separator))
}

// inSheet names the sheet in a *ParseError about a workbook's cells, and
// calls the lines its message names rows, as a spreadsheet does.
func (hr *historyReader) inSheet(err error) error {
	if pe, ok := err.(*ParseError); ok && hr.rows != nil && hr.rows.Sheet != "" && pe.Sheet == "" && pe.File == hr.file {
		pe.Sheet = hr.rows.Sheet
		pe.Err = rowWords{pe.Err}
	}
	return err
}

// rowWords is an error whose message says "row" where the reader of a
// CSV file says "line"; it wraps the error as it is.
type rowWords struct{ err error }

var lineToRow = strings.NewReplacer("(line ", "(row ", "on line ", "on row ", "between line ", "between rows ")

func (e rowWords) Error() string { return lineToRow.Replace(e.err.Error()) }

// Unwrap returns the error.
func (e rowWords) Unwrap() error { return e.err }
