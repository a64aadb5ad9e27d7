package data

// # Workbooks
//
// A history, a file of actuals or a production plan may be a workbook
// (.xlsx) instead of a CSV file: it is told by its content. The sheet read
// is the first one, or the one ReadOptions.Sheet (Format.Sheet) names.
// Its rows are read like the lines of a CSV file, with the same layouts,
// keys and rules: row n is line n, and errors name the sheet and the cell
// ("history.xlsx: sheet demand, cell C14: ..."). A cell is read as the
// value it holds, not as it is shown: a number is read in full, whatever
// its number format; a formula is read by its last computed value; a
// number formatted as a date (a spreadsheet date) becomes a period label:
// a day (2026-03-15) when its format shows the day, a month (2026-03)
// when it shows the month but not the day, a year when it shows only the
// year. A period may also be written as a text label (2026-03, 2026-Q1).
// Rows and cells left empty are blank, as in a CSV file.

import (
	"bytes"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/xuri/excelize/v2"
)

// unzipLimit bounds how much a workbook may unpack to, so that a small
// file cannot expand without end.
const unzipLimit = 1 << 30

// maxStyles is the most cell styles a workbook may have (the spreadsheet
// format's own limit, 64000, rounded up).
const maxStyles = 1 << 16

// sheetRows reads the rows of one sheet of a workbook.
type sheetRows struct {
	f      *excelize.File
	file   string
	name   string
	rows   *excelize.Rows
	row    int // 1-based number of the row read last
	width  int // cells in the first row that is not blank
	cells  []string
	date04 bool
	// grain of each cell style of the workbook: what its number format
	// shows of a date, percentShown, or notDate
	grains []dateGrain
	// dates is whether any style is a date (or, with percent, a
	// percentage) format; when none is, no cell style is looked up (which
	// would load the whole sheet once more)
	dates bool
	// percent gives percentage cells as text with a percent sign (see
	// Format.Percent)
	percent bool
}

// A dateGrain is what a number format shows of a date, or that it shows
// a percentage.
type dateGrain int

const (
	notDate dateGrain = iota
	dayGrain
	monthGrain
	yearGrain
	percentShown
)

// openSheet opens the workbook in src and starts reading the sheet called
// sheet, or the first one when sheet is empty. It returns the name of the
// sheet read.
func openSheet(src []byte, file, sheet string, percent bool) (*sheetRows, string, error) {
	f, err := excelize.OpenReader(bytes.NewReader(src), excelize.Options{UnzipSizeLimit: unzipLimit})
	if err != nil {
		return nil, "", &ParseError{File: file, Err: fmt.Errorf("%w: not a workbook that can be read (%v); save it again as .xlsx, or as CSV", ErrDialect, err)}
	}
	list := f.GetSheetList()
	if len(list) == 0 {
		return nil, "", &ParseError{File: file, Err: fmt.Errorf("%w: the workbook has no sheet", ErrNoSeries)}
	}
	if sheet == "" {
		sheet = list[0]
	} else if named, ok := findSheet(list, sheet); ok {
		sheet = named
	} else {
		quoted := make([]string, len(list))
		for i, s := range list {
			quoted[i] = strconv.Quote(s)
		}
		return nil, "", &ParseError{File: file, Err: fmt.Errorf("%w: no sheet %q; the workbook has %s", ErrDialect, sheet, strings.Join(quoted, ", "))}
	}
	rows, err := f.Rows(sheet)
	if err != nil {
		return nil, "", &ParseError{File: file, Sheet: sheet, Err: fmt.Errorf("%w: %v", ErrDialect, err)}
	}
	sr := &sheetRows{f: f, file: file, name: sheet, rows: rows, percent: percent}
	for id := 0; id < maxStyles; id++ {
		st, err := f.GetStyle(id)
		if err != nil {
			break // past the last style
		}
		g := styleGrain(st)
		sr.grains = append(sr.grains, g)
		sr.dates = sr.dates || g != notDate && (g != percentShown || percent)
	}
	if props, err := f.GetWorkbookProps(); err == nil && props.Date1904 != nil {
		sr.date04 = *props.Date1904
	}
	return sr, sheet, nil
}

// findSheet returns the sheet of list called name, compared as a
// spreadsheet does (case ignored), and whether there is one.
func findSheet(list []string, name string) (string, bool) {
	for _, s := range list {
		if strings.EqualFold(s, name) {
			return s, true
		}
	}
	return "", false
}

// read returns the next row's cells as text, padded to the width of the
// first row that is not blank.
func (sr *sheetRows) read() ([]string, error) {
	if !sr.rows.Next() {
		if err := sr.rows.Error(); err != nil {
			return nil, &ParseError{File: sr.file, Sheet: sr.name, Line: sr.row + 1, Err: err}
		}
		sr.rows.Close()
		return nil, io.EOF
	}
	sr.row++
	raw, err := sr.rows.Columns(excelize.Options{RawCellValue: true})
	if err != nil {
		return nil, &ParseError{File: sr.file, Sheet: sr.name, Line: sr.row, Err: err}
	}
	sr.cells = append(sr.cells[:0], raw...)
	for i, v := range sr.cells {
		if v != "" && isDecimal(v) {
			sr.cells[i] = sr.dateLabel(i+1, v)
		}
	}
	if sr.width == 0 && !blankRecord(sr.cells) {
		sr.width = len(sr.cells)
	}
	for len(sr.cells) < sr.width {
		sr.cells = append(sr.cells, "")
	}
	return sr.cells, nil
}

// dateLabel returns the period label of the number v in column col of the
// current row when its cell is formatted as a date, the percentage with a
// percent sign when it is formatted as one and sr.percent is set, and v
// unchanged otherwise.
func (sr *sheetRows) dateLabel(col int, v string) string {
	if !sr.dates {
		return v
	}
	id, err := sr.f.GetCellStyle(sr.name, CellName(col, sr.row))
	if err != nil || id < 0 || id >= len(sr.grains) || sr.grains[id] == notDate {
		return v
	}
	g := sr.grains[id]
	x, err := strconv.ParseFloat(v, 64)
	if g == percentShown {
		if !sr.percent || err != nil {
			return v
		}
		// 12 significant digits, so that 0.07 shows as 7%, not as
		// 7.000000000000001%.
		return strconv.FormatFloat(x*100, 'g', 12, 64) + "%"
	}
	if err != nil || x < 0 || x > 2958465 { // 9999-12-31
		return v
	}
	t, err := excelize.ExcelDateToTime(math.Floor(x), sr.date04)
	if err != nil {
		return v
	}
	switch g {
	case monthGrain:
		return t.Format("2006-01")
	case yearGrain:
		return t.Format("2006")
	}
	return t.Format("2006-01-02")
}

// styleGrain says what a cell style's number format shows of a date.
func styleGrain(st *excelize.Style) dateGrain {
	if st.CustomNumFmt != nil {
		return formatGrain(*st.CustomNumFmt)
	}
	switch n := st.NumFmt; {
	case n == 17: // mmm-yy
		return monthGrain
	case n >= 14 && n <= 16, n == 22, n >= 27 && n <= 36, n >= 50 && n <= 58:
		return dayGrain
	case n == 9 || n == 10: // 0% and 0.00%
		return percentShown
	}
	return notDate
}

// formatGrain reads a number format code: the date parts it shows, its
// quoted text, escaped characters and bracketed parts (colours, locales,
// elapsed times) left out. An m next to an h or s is minutes.
func formatGrain(code string) dateGrain {
	var parts []byte
	quoted, bracket := false, false
	for i := 0; i < len(code); i++ {
		c := code[i]
		switch {
		case quoted:
			quoted = c != '"'
		case bracket:
			bracket = c != ']'
		case c == '"':
			quoted = true
		case c == '[':
			bracket = true
		case c == '\\' || c == '_' || c == '*':
			i++
		case c == ';':
			i = len(code) // the first section decides
		default:
			parts = append(parts, c|0x20) // lower case
		}
	}
	s := string(parts)
	hasTime := strings.ContainsAny(s, "hs")
	switch {
	case strings.Contains(s, "d"):
		return dayGrain
	case strings.Contains(s, "m") && !hasTime:
		return monthGrain
	case strings.Contains(s, "y"):
		if strings.Contains(s, "m") {
			return monthGrain
		}
		return yearGrain
	case strings.Contains(s, "%"):
		return percentShown
	}
	return notDate
}
