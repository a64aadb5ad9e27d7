// # History files
//
// ReadHistory reads the past values of one or more series from a CSV file
// (RFC 4180; the delimiter a comma, semicolon or tab, see "CSV as
// spreadsheets save it") or a workbook's sheet (see "Workbooks", where rows
// are lines and cells are named instead). A UTF-8 byte order mark at the start is
// skipped, and so is every blank row (empty, spaces only, or only empty
// cells). The first row left is the header; its cells are compared with
// spaces trimmed and case ignored. It decides the layout:
//
// Long layout: the header has the columns series, period and value, in any
// order. Other columns (a note, say) are ignored. Each row holds one value of
// one series; the series appear in the order of their first row:
//
//	series,period,value,note
//	north,2026-01,120,
//	north,2026-02,131,promotion
//	south,2026-01,88,
//
// Wide layout: otherwise, when the first column is period. Each other column
// is one series, named by its header cell (kept as written, spaces trimmed;
// an empty or repeated name is an error), in column order. A series may start
// later or stop earlier than the others: empty cells before its first value
// and after its last one are not part of it.
//
//	period,north,south
//	2026-01,120,
//	2026-02,131,88
//
// Any other header is an error naming the header line.
//
// # Composite keys
//
// A series name may be a path of levels separated by "/", such as
// milk/whole-1l/grocer-north. A series column may hold such names as
// they are. Or ReadOptions.Key names the columns that make the name, from
// the widest level to the narrowest (family, product, customer, say): the
// header must then have the columns period and value and every key column
// (compared like the other header cells; a series column is then just
// another column), and each row's series is named by its key cells,
// trimmed, joined by "/":
//
//	family,product,customer,period,value
//	milk,whole-1l,grocer-north,2026-01,120
//
// A key cell that is empty, or holds a "/", is an error at that cell. A
// key naming a column twice, or the period or value column, is an error at
// the header; so is a wide file read with a key.
//
// # Periods
//
// A period label is one of
//
//	2026        a year
//	2026-Q1     a quarter
//	2026-03     a month
//	2026-W11    an ISO 8601 week (Monday to Sunday)
//	2026-03-15  a day, or the first day of a week
//
// All labels of a file have the same form. Unless ReadOptions.Freq says
// otherwise, the form gives the frequency. Dates are days, except when the
// smallest spacing between consecutive dates of a series, across all series
// of the file, is a multiple of 7 days: then they are weeks, each starting on
// its date, and every date of the file must fall on the weekday of the first
// one. ReadOptions.Freq may ask for the frequency the labels have, or for
// weeks when the labels are dates (each week then starts on its date, as
// above); any other choice is an error, since forcing a coarser frequency
// would need the values to be added up first, and a finer one cannot be had.
//
// Within a series the periods must increase, each at most once. A series
// runs from its first value to its last one: in both layouts, missing values
// (see below) before the first and after the last are dropped, and a series
// with no value at all is an error. A period inside that run that has no
// row, or whose value is missing, is a gap: an error, unless ReadOptions.Fill
// says how to fill it (see FillMode). A gap of more than 10000 periods is an
// error even then.
//
// # Values
//
// A value cell holds a plain decimal number (see ParseDecimal): an
// optional sign, digits with an optional decimal point, and an optional
// exponent, with spaces around it allowed. Negative values are allowed. An
// empty cell is a missing value (ErrEmptyCell when it is an error; a fill
// mode fills it when it lies inside a series). Anything else is an error
// wrapping ErrBadNumber, and ErrNotDecimal or ErrNotFinite: digit
// separators (1_000, 1,000), hexadecimal (0x1p4), NaN and infinities are
// refused, never read as missing, so a fill mode never hides them.
//
// # Errors
//
// Every error about the content of the file is a *ParseError whose File is
// the name given to ReadHistory, with the 1-based line and column (in bytes,
// after a byte order mark) of the offending cell, Field set to the header of
// its column (empty for errors in the header), and Err wrapping one of the
// sentinels ErrMissingColumn, ErrDuplicateColumn, ErrBadPeriod, ErrBadNumber
// (with ErrNotDecimal or ErrNotFinite), ErrEmptyCell, ErrDuplicatePeriod,
// ErrUnsorted, ErrGap, ErrNoSeries or ErrBadKey, or, for a row
// that is not valid CSV or has the wrong number of cells, the error of
// encoding/csv (such as csv.ErrQuote or csv.ErrFieldCount). When a file
// has several problems, the first one met is reported; the order and gap
// checks, which need a whole series, report the earliest cell in the file.
// An error from the io.Reader itself is returned wrapped as it is.
package data

import (
	"cmp"
	"encoding/csv"
	"errors"
	"fmt"
	"forelay/forecast"
	"io"
	"math"
	"os"
	"slices"
	"strconv"
	"strings"
)

// ErrDuplicateColumn is returned (wrapped) when a header names the same
// column twice: a key column of the long layout, or a series of the wide
// layout.
var ErrDuplicateColumn = errors.New("duplicate column")

// maxFillGap is the longest gap, in periods, that a fill mode may close.
const maxFillGap = 10000

// ReadOptions tells ReadHistory how to read periods and gaps. The zero value
// infers the frequency and rejects gaps.
type ReadOptions struct {
	// Freq forces the frequency of the file. FreqUnknown (the zero value)
	// infers it from the labels.
	Freq forecast.Frequency
	// Fill says what to do with gaps. FillNone (the zero value) makes them
	// errors.
	Fill FillMode
	// Key names the columns whose values, joined by "/", name the series
	// of a long file (see "Composite keys"); nil reads the series column.
	Key []string
	// Format names the sheet of a workbook and the decimal mark of a CSV
	// file (see "Workbooks" and "CSV as spreadsheets save it").
	Format
	// Keep, when set, says which series of a long file to keep whole,
	// with their values, in History.Series; of the others only the name
	// and the periods they run over are kept, in History.Extents (see
	// extent.go). Nil keeps every series.
	Keep func(name string) bool
}

// A History is the content of one history file.
type History struct {
	// File is the name the file was read under, as given to ReadHistory.
	File string
	// Layout is "wide" or "long".
	Layout string
	// Series holds the series in file order (column order for the wide
	// layout, order of first appearance for the long one). Each has at least
	// one value and no gaps. With ReadOptions.Keep, it holds only the
	// series kept whole.
	Series []forecast.Series
	// Extents lists every series of the file, in the same order, with
	// the periods it runs over, whether it is in Series or not.
	Extents Extents
	// Filled lists every value that a fill mode made up, by series in the
	// order of Series and then by period. It is nil when nothing was filled.
	Filled []Filled
	// Read says how the file was read when it is not a CSV file separated
	// by commas with decimal points: "cells separated by semicolons,
	// decimal commas" or "sheet \"demand\"" (see Rows.Describe); empty
	// otherwise.
	Read string
}

// Lookup returns the series called name. An empty name picks the only
// series of a file that has exactly one. A series whose values were not
// kept (ReadOptions.Keep) comes with as many zeros as it has periods.
// When no series matches it returns an error wrapping ErrNoSeries whose
// message lists the series of the file.
func (h *History) Lookup(name string) (forecast.Series, error) {
	x := h.extents()
	for i := range x.Len() {
		if name != x.Name(i) && (name != "" || x.Len() != 1) {
			continue
		}
		if k := x.Series(i); k >= 0 {
			return h.Series[k], nil
		}
		return forecast.Series{Name: x.Name(i), Start: x.Start(i), Values: make([]float64, x.Periods(i))}, nil
	}
	names := make([]string, x.Len())
	for i := range names {
		names[i] = strconv.Quote(x.Name(i))
	}
	if name == "" {
		return forecast.Series{}, fmt.Errorf("%w: %s holds %d series, name one of %s", ErrNoSeries, h.File, len(names), strings.Join(names, ", "))
	}
	return forecast.Series{}, fmt.Errorf("%w %q in %s (it has %s)", ErrNoSeries, name, h.File, strings.Join(names, ", "))
}

// ReadHistory reads a history file in the format described in the package
// documentation (see "History files"). The name is used in error messages
// only. It panics if opt.Freq or opt.Fill is not one of the defined
// constants; every problem with the data comes back as an error.
func ReadHistory(r io.Reader, name string, opt ReadOptions) (*History, error) {
	if opt.Freq < forecast.FreqUnknown || opt.Freq > forecast.Yearly {
		panic(fmt.Sprintf("forecast: ReadHistory with %v", opt.Freq))
	}
	if opt.Fill < FillNone || opt.Fill > FillInterpolate {
		panic(fmt.Sprintf("forecast: ReadHistory with %v", opt.Fill))
	}
	hr := &historyReader{file: name, opt: opt}
	h, err := hr.read(r)
	return h, hr.inSheet(err)
}

// read reads the file: rows, frequency, periods, series.
func (hr *historyReader) read(r io.Reader) (*History, error) {
	if err := hr.readRows(r); err != nil {
		return nil, err
	}
	f, err := hr.frequency()
	if err != nil {
		return nil, err
	}
	if err := hr.parsePeriods(f); err != nil {
		return nil, err
	}
	h, err := hr.build()
	if err == nil && !hr.rows.Standard() {
		h.Read = hr.rows.Describe()
	}
	return h, err
}

// A cell is one field of the file with its 1-based position.
type cell struct {
	text      string // trimmed
	line, col int
}

// A pos is the 1-based line and column of a cell.
type pos struct{ line, col int }

// A point is one row of one series: its period, its value (NaN when
// missing), and where its label and its value cell are.
type point struct {
	period       forecast.Period
	v            float64
	label, value pos
}

// A column is one series being read: its header cell (wide layout), the
// header of its value cells (for ParseError.Field) and its points in file
// order.
type column struct {
	name   string
	header cell
	field  string
	pts    []point
}

// A slotKind says what a cell of a long row holds.
type slotKind int

const (
	slotLabel  slotKind = iota // the period label
	slotSeries                 // the series name
	slotKey                    // a key cell of ReadOptions.Key
	slotValue                  // the value
)

// A slot is a cell that each long row checks: its column index, what it
// holds and, for a key cell, its index in ReadOptions.Key.
type slot struct {
	col  int
	kind slotKind
	key  int
}

type historyReader struct {
	file string
	opt  ReadOptions
	rows *Rows // the file's rows, CSV or a sheet

	long   bool
	header []cell
	// indices of the key columns of the long layout
	seriesCol, periodCol, valueCol int
	// indices of the columns of ReadOptions.Key, and their header cells
	keyCols   []int
	keyFields []string
	// field names of the period and value columns, for ParseError.Field
	periodField, valueField, seriesField string
	// the cells a long row checks, in column order, so that the first
	// problem met is the leftmost one
	slots []slot

	cols []*column // the series kept whole, in file order
	// every series in file order (see extent.go); long layout: the index
	// that finds one by name, and the index of the series of the last row
	// (-1 before the first)
	ext   Extents
	index nameIndex
	last  int
	name  []byte // long layout: the series name of this row
	// long layout: the key cells of this row, trimmed, in key order
	keyText []string
	nrows   int // data rows read
	// Of the series read for their extent only: the smallest step between
	// two rows of one, the value cell of the first row of each that has
	// no value yet (by index in ext), and the earliest row out of order.
	extentGap int
	blank     map[int]pos
	order     *ParseError

	form     forecast.Frequency // frequency of the label form
	formCell cell               // first label, where the form was set
	anchor   forecast.Period    // period of the first label
	// first date label that does not fall on the weekday of the first
	// one (dates only), and its period
	offDay   *cell
	offDayAt forecast.Period
}

func (hr *historyReader) errAt(c cell, field string, err error) *ParseError {
	return &ParseError{File: hr.file, Line: c.line, Column: c.col, Field: field, Err: err}
}

func (hr *historyReader) errPos(p pos, field string, err error) *ParseError {
	return &ParseError{File: hr.file, Line: p.line, Column: p.col, Field: field, Err: err}
}

var utf8BOM = []byte{0xEF, 0xBB, 0xBF}

// readRows reads the header and the data rows, checks each row and adds
// its values to the series they belong to.
func (hr *historyReader) readRows(r io.Reader) error {
	cr, err := OpenRows(r, hr.file, hr.opt.Format)
	if err != nil {
		return err
	}
	hr.rows = cr
	lastRow := 0 // line of the last row read, for the no-data error
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return hr.csvError(err)
		}
		if blankRecord(rec) {
			continue
		}
		lastRow, _ = cr.FieldPos(0)
		if err := hr.readRecord(cr, rec); err != nil {
			return err
		}
	}
	if hr.header == nil {
		return &ParseError{File: hr.file, Err: fmt.Errorf("%w: the file is empty", ErrNoSeries)}
	}
	if hr.nrows == 0 {
		return &ParseError{File: hr.file, Line: lastRow, Err: fmt.Errorf("%w: no data rows after the header", ErrNoSeries)}
	}
	return nil
}

// csvError turns an error of the CSV reader into the error ReadHistory
// returns.
func (hr *historyReader) csvError(err error) error {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &ParseError{File: hr.file, Line: pe.Line, Column: pe.Column, Err: pe.Err}
	}
	var own *ParseError // from a BoundedReader: it names the file already
	if errors.As(err, &own) {
		return own
	}
	return fmt.Errorf("%s: %w", hr.file, err)
}

// blankRecord reports whether every cell of rec is empty or spaces.
func blankRecord(rec []string) bool {
	for _, s := range rec {
		if strings.TrimSpace(s) != "" {
			return false
		}
	}
	return true
}

// cellAt returns cell i of the record cr has just read.
func cellAt(cr *Rows, rec []string, i int) cell {
	line, col := cr.FieldPos(i)
	return cell{text: strings.TrimSpace(rec[i]), line: line, col: col}
}

// readRecord reads one row that is not blank: the header, or a data row.
func (hr *historyReader) readRecord(cr *Rows, rec []string) error {
	if hr.header == nil {
		cells := make([]cell, len(rec))
		for i := range rec {
			cells[i] = cellAt(cr, rec, i)
		}
		if err := hr.readHeader(cells); err != nil {
			return err
		}
		if hr.long {
			hr.setSlots()
		}
		return nil
	}
	if len(rec) != len(hr.header) {
		line, _ := cr.FieldPos(0)
		c := cell{line: line, col: 1}
		if len(rec) > len(hr.header) {
			c = cellAt(cr, rec, len(hr.header))
		}
		return hr.errAt(c, "", fmt.Errorf("%w: %d cells, but the header (line %d) has %d",
			csv.ErrFieldCount, len(rec), hr.header[0].line, len(hr.header)))
	}
	hr.nrows++
	if hr.long {
		return hr.readLongRow(cr, rec)
	}
	return hr.readWideRow(cr, rec)
}

// setSlots lists the cells a long row checks, in column order.
func (hr *historyReader) setSlots() {
	hr.slots = []slot{{col: hr.periodCol, kind: slotLabel}, {col: hr.valueCol, kind: slotValue}}
	if hr.keyCols == nil {
		hr.slots = append(hr.slots, slot{col: hr.seriesCol, kind: slotSeries})
	}
	for i, k := range hr.keyCols {
		hr.slots = append(hr.slots, slot{col: k, kind: slotKey, key: i})
	}
	slices.SortFunc(hr.slots, func(a, b slot) int { return cmp.Compare(a.col, b.col) })
	hr.keyText = make([]string, len(hr.keyCols))
	hr.last = -1
}

// readLongRow checks the cells of a long data row from the left and adds
// its value to its series.
func (hr *historyReader) readLongRow(cr *Rows, rec []string) error {
	var pt point
	for _, s := range hr.slots {
		c := cellAt(cr, rec, s.col)
		switch s.kind {
		case slotLabel:
			p, err := hr.parseLabel(c)
			if err != nil {
				return err
			}
			pt.period, pt.label = p, pos{c.line, c.col}
		case slotSeries:
			if c.text == "" {
				return hr.errAt(c, hr.seriesField, fmt.Errorf("%w: no series name", ErrEmptyCell))
			}
		case slotKey:
			if err := hr.checkKeyCell(c, s.key); err != nil {
				return err
			}
			hr.keyText[s.key] = c.text
		case slotValue:
			v, err := hr.value(c.text)
			if err != nil {
				return hr.errAt(c, hr.valueField, err)
			}
			pt.v, pt.value = v, pos{c.line, c.col}
		}
	}
	if hr.keyCols == nil {
		hr.name = append(hr.name[:0], strings.TrimSpace(rec[hr.seriesCol])...)
	} else {
		hr.name = appendKey(hr.name[:0], hr.keyText)
	}
	i, err := hr.seriesOf(hr.name, pt.label)
	if err != nil {
		return err
	}
	hr.add(i, pt)
	return nil
}

// readWideRow checks the cells of a wide data row from the left and adds
// one value to each series.
func (hr *historyReader) readWideRow(cr *Rows, rec []string) error {
	label := cellAt(cr, rec, 0)
	p, err := hr.parseLabel(label)
	if err != nil {
		return err
	}
	for i, c := range hr.cols {
		vc := cellAt(cr, rec, i+1)
		v, err := hr.value(vc.text)
		if err != nil {
			return hr.errAt(vc, c.field, err)
		}
		c.pts = append(c.pts, point{period: p, v: v, label: pos{label.line, label.col}, value: pos{vc.line, vc.col}})
	}
	return nil
}

// readHeader decides the layout from the header row.
func (hr *historyReader) readHeader(cells []cell) error {
	first := map[string]int{} // lower-case name -> index of first cell
	for i, c := range cells {
		k := strings.ToLower(c.text)
		if _, ok := first[k]; !ok {
			first[k] = i
		}
	}
	_, hasSeries := first["series"]
	_, hasValue := first["value"]
	_, hasPeriod := first["period"]
	if hr.opt.Key != nil {
		return hr.readKeyHeader(cells, first)
	}
	switch {
	case hasSeries && hasPeriod && hasValue:
		hr.long = true
		for _, key := range []string{"series", "period", "value"} {
			for _, c := range cells[first[key]+1:] {
				if strings.EqualFold(c.text, key) {
					return hr.errAt(c, "", fmt.Errorf("%w: %q is already column %d", ErrDuplicateColumn, c.text, first[key]+1))
				}
			}
		}
		hr.header = cells
		hr.seriesCol, hr.periodCol, hr.valueCol = first["series"], first["period"], first["value"]
		hr.seriesField = cells[hr.seriesCol].text
		hr.periodField = cells[hr.periodCol].text
		hr.valueField = cells[hr.valueCol].text
		return nil
	case strings.EqualFold(cells[0].text, "period"):
		seen := map[string]int{strings.ToLower(cells[0].text): 0}
		for i, c := range cells[1:] {
			if c.text == "" {
				return hr.errAt(c, "", fmt.Errorf("%w: column %d has no series name", ErrMissingColumn, i+2))
			}
			k := c.text
			if strings.EqualFold(k, "period") {
				k = "period"
			}
			if j, ok := seen[k]; ok {
				return hr.errAt(c, "", fmt.Errorf("%w: %q is already column %d", ErrDuplicateColumn, c.text, j+1))
			}
			seen[k] = i + 1
			if err := hr.pushExtent([]byte(c.text), pos{c.line, c.col}, hr.wideExtent); err != nil {
				return err
			}
			hr.cols = append(hr.cols, &column{name: c.text, header: c, field: c.text})
		}
		if len(hr.cols) == 0 {
			return hr.errAt(cells[0], "", fmt.Errorf("%w: the header has a period column but no series columns", ErrNoSeries))
		}
		hr.header = cells
		hr.periodField = cells[0].text
		return nil
	}
	texts := make([]string, len(cells))
	for i, c := range cells {
		texts[i] = c.text
	}
	return hr.errAt(cell{line: cells[0].line, col: 1}, "", fmt.Errorf(
		"%w: header %q: want columns series, period and value (long layout), or period first and then one column per series (wide layout)%s",
		ErrMissingColumn, strings.Join(texts, ","), hr.headerHint(len(cells))))
}

// parseLabel reads the label of a row in its own form (so that a month 13,
// a 30 February or a week 53 that does not exist is refused) and checks
// the form against the labels before it.
func (hr *historyReader) parseLabel(c cell) (forecast.Period, error) {
	if c.text == "" {
		return forecast.Period{}, hr.errAt(c, hr.periodField, fmt.Errorf("%w: no period label", forecast.ErrBadPeriod))
	}
	p, err := forecast.ParsePeriod(c.text, forecast.FreqUnknown)
	if err != nil {
		return forecast.Period{}, hr.errAt(c, hr.periodField, err)
	}
	switch lf := p.Freq; {
	case hr.form == forecast.FreqUnknown:
		hr.form, hr.formCell, hr.anchor = lf, c, p
		hr.formCell.text = strings.Clone(c.text)
	case lf != hr.form:
		return forecast.Period{}, hr.errAt(c, hr.periodField, fmt.Errorf("%w: %q is %s, but the labels before it are %s (line %d)",
			forecast.ErrBadPeriod, c.text, labelKind(lf, false), labelKind(hr.form, true), hr.formCell.line))
	case lf == forecast.Daily && hr.offDay == nil && p.Sub(hr.anchor)%7 != 0:
		// An error only if the dates turn out to be weeks.
		off := c
		off.text = strings.Clone(c.text)
		hr.offDay, hr.offDayAt = &off, p
	}
	return p, nil
}

// labelKind names a label form for messages: "a month" or "months".
func labelKind(f forecast.Frequency, plural bool) string {
	one := map[forecast.Frequency][2]string{
		forecast.Daily:     {"a date", "dates"},
		forecast.Weekly:    {"an ISO week", "ISO weeks"},
		forecast.Monthly:   {"a month", "months"},
		forecast.Quarterly: {"a quarter", "quarters"},
		forecast.Yearly:    {"a year", "years"},
	}[f]
	if plural {
		return one[1]
	}
	return one[0]
}

// frequency returns the frequency of the file: the forced one if it fits

// frequency returns the frequency of the file: the forced one if it fits
// the labels, else the one the labels give.
func (hr *historyReader) frequency() (forecast.Frequency, error) {
	if f := hr.opt.Freq; f != forecast.FreqUnknown {
		if f == hr.form || f == forecast.Weekly && hr.form == forecast.Daily {
			return f, nil
		}
		how := "aggregate first"
		if f < hr.form {
			how = fmt.Sprintf("%s cannot be split into %ss", labelKind(hr.form, true), f)
		}
		return 0, hr.errAt(hr.formCell, hr.periodField, fmt.Errorf("%w: labels are %s but --period %s was asked; %s",
			forecast.ErrBadPeriod, labelKind(hr.form, true), f, how))
	}
	if hr.form != forecast.Daily {
		return hr.form, nil
	}
	// Dates: the smallest spacing between consecutive dates of a series
	// decides between days and weeks.
	minGap := hr.extentGap
	for _, c := range hr.cols {
		for i := 1; i < len(c.pts); i++ {
			if d := c.pts[i].period.Sub(c.pts[i-1].period); d > 0 && (minGap == 0 || d < minGap) {
				minGap = d
			}
		}
	}
	if minGap > 0 && minGap%7 == 0 {
		return forecast.Weekly, nil
	}
	return forecast.Daily, nil
}

// parsePeriods turns the periods, read in the frequency of their form,
// into periods of frequency f: dates become weeks that start on them, all
// on the weekday of the first one.
func (hr *historyReader) parsePeriods(f forecast.Frequency) error {
	if f != forecast.Weekly || hr.form != forecast.Daily {
		return nil
	}
	if hr.offDay != nil {
		wa, wp := hr.anchor.Start().Weekday(), hr.offDayAt.Start().Weekday()
		return hr.errAt(*hr.offDay, hr.periodField, fmt.Errorf("%w: %s is a %s, but the weeks of this file start on %s (line %d)",
			forecast.ErrBadPeriod, hr.offDay.text, wp, wa, hr.formCell.line))
	}
	week, err := forecast.ParsePeriod(hr.formCell.text, forecast.Weekly)
	if err != nil {
		return hr.errAt(hr.formCell, hr.periodField, err) // not reached: checked before
	}
	for _, c := range hr.cols {
		for i := range c.pts {
			c.pts[i].period = week.Add(c.pts[i].period.Sub(hr.anchor) / 7)
		}
	}
	hr.weekExtents()
	hr.anchor = week
	return nil
}

// earliest keeps the error at the smaller (line, column).
func earliest(a, b *ParseError) *ParseError {
	if a == nil || b != nil && (b.Line < a.Line || b.Line == a.Line && b.Column < a.Column) {
		return b
	}
	return a
}

// forSeries names the series in a message of the long layout.
func (hr *historyReader) forSeries(c *column) string {
	if hr.long {
		return fmt.Sprintf(" of series %q", c.name)
	}
	return ""
}

// build checks order and gaps, fills, and assembles the History.
func (hr *historyReader) build() (*History, error) {
	// Order: periods increase within each series.
	first := hr.order
	for _, c := range hr.cols {
		first = earliest(first, hr.checkOrder(c))
	}
	if first != nil {
		return nil, first
	}

	h := &History{File: hr.file, Layout: "wide", Series: make([]forecast.Series, 0, len(hr.cols))}
	if hr.long {
		h.Layout = "long"
	}
	for _, c := range hr.cols {
		s, filled, err := hr.series(c)
		if err != nil {
			first = earliest(first, err)
			continue
		}
		h.Series = append(h.Series, s)
		h.Filled = append(h.Filled, filled...)
	}
	if first = earliest(first, hr.emptyExtent()); first != nil {
		return nil, first
	}
	h.Extents = hr.extents(h.Series)
	return h, nil
}

// comparePeriods orders periods of one frequency.
func comparePeriods(a, b forecast.Period) int {
	switch {
	case a.Before(b):
		return -1
	case b.Before(a):
		return 1
	}
	return 0
}

// checkOrder returns the first period of a series that repeats an earlier
// one or comes before the one above it, or nil.
func (hr *historyReader) checkOrder(c *column) *ParseError {
	for i := 1; i < len(c.pts); i++ {
		pt, prev := c.pts[i], c.pts[i-1]
		if prev.period.Before(pt.period) {
			continue
		}
		// The periods above increase, so a repeated one is found by
		// bisection.
		j, dup := slices.BinarySearchFunc(c.pts[:i], pt.period, func(q point, p forecast.Period) int {
			return comparePeriods(q.period, p)
		})
		if dup {
			return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w %s%s (first on line %d)",
				ErrDuplicatePeriod, pt.period, hr.forSeries(c), c.pts[j].label.line))
		}
		return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w: %s%s comes after %s (line %d)",
			ErrUnsorted, pt.period, hr.forSeries(c), prev.period, prev.label.line))
	}
	return nil
}

// series turns one column into a Series, checking and filling its gaps.
func (hr *historyReader) series(c *column) (forecast.Series, []Filled, *ParseError) {
	lo, hi := -1, -1 // first and last point with a value
	for i, pt := range c.pts {
		if !math.IsNaN(pt.v) {
			if lo < 0 {
				lo = i
			}
			hi = i
		}
	}
	if lo < 0 {
		at, field := c.header, ""
		if hr.long {
			at, field = cell{line: c.pts[0].value.line, col: c.pts[0].value.col}, hr.valueField
		}
		return forecast.Series{}, nil, hr.errAt(at, field, fmt.Errorf("%w: series %q has no values", ErrEmptyCell, c.name))
	}
	pts := c.pts[lo : hi+1]
	start := pts[0].period
	n := pts[len(pts)-1].period.Sub(start) + 1
	values := make([]float64, n)
	var lines []int // line of each value, when a fill mode may need it
	if hr.opt.Fill != FillNone {
		lines = make([]int, n)
	}
	for k := range values {
		values[k] = math.NaN()
	}
	for i, pt := range pts {
		if i > 0 {
			if err := hr.checkGap(c, pts[i-1], pt); err != nil {
				return forecast.Series{}, nil, err
			}
		}
		k := pt.period.Sub(start)
		if math.IsNaN(pt.v) && hr.opt.Fill == FillNone {
			return forecast.Series{}, nil, hr.errPos(pt.value, c.field, fmt.Errorf("%w for %s inside series %q (a %w); use --fill zero|interpolate",
				ErrEmptyCell, pt.period, c.name, ErrGap))
		}
		values[k] = pt.v
		if lines != nil {
			lines[k] = pt.label.line
		}
	}
	var filled []Filled
	if hr.opt.Fill != FillNone {
		for _, k := range fillInterior(values, hr.opt.Fill) {
			filled = append(filled, Filled{Series: c.name, Period: start.Add(k), Value: values[k], Line: lines[k]})
		}
	}
	return forecast.Series{Name: c.name, Start: start, Values: values}, filled, nil
}

// checkGap checks the periods between two consecutive points of a
// series: none, unless a fill mode may fill them.
func (hr *historyReader) checkGap(c *column, prev, pt point) *ParseError {
	d := pt.period.Sub(prev.period)
	if d > maxFillGap && hr.opt.Fill != FillNone {
		return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w: %d periods%s from %s to %s (between line %d and %d); too long to fill",
			ErrGap, d-1, hr.forSeries(c), prev.period.Add(1), pt.period.Add(-1), prev.label.line, pt.label.line))
	}
	if d > 1 && hr.opt.Fill == FillNone {
		what := fmt.Sprintf("value for %s", prev.period.Add(1))
		if d > 2 {
			what = fmt.Sprintf("values for %s to %s", prev.period.Add(1), pt.period.Add(-1))
		}
		return hr.errPos(pt.label, hr.periodField, fmt.Errorf("%w: no %s%s (between line %d and %d); use --fill zero|interpolate",
			ErrGap, what, hr.forSeries(c), prev.label.line, pt.label.line))
	}
	return nil
}

// ReadFile reads the history file at path with opt, under the size limits
// and the limit of series name lengths (0: none): ReadHistory through a
// BoundedReader, then History.CheckNameLength.
func ReadFile(path string, opt ReadOptions, limits SizeLimits, nameLength int) (*History, error) {
	fh, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	h, err := ReadHistory(BoundedReader(fh, path, limits), path, opt)
	if err != nil {
		return nil, err
	}
	if nameLength > 0 {
		if err := h.CheckNameLength(nameLength); err != nil {
			return nil, err
		}
	}
	return h, nil
}
