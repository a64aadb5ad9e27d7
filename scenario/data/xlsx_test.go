package data

import (
	"bytes"
	"errors"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
)

// A sheet is one sheet of a test workbook: its rows from A1, and the
// number format of the cells of its first column (0: none; a built-in
// format's id, or a custom code).
type sheet struct {
	name   string
	rows   [][]any
	numFmt int
	custom string
}

// workbook writes a workbook with excelize, the library the reader uses.
func workbook(t testing.TB, sheets ...sheet) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	for i, s := range sheets {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", s.name); err != nil {
				t.Fatal(err)
			}
		} else if _, err := f.NewSheet(s.name); err != nil {
			t.Fatal(err)
		}
		for r, row := range s.rows {
			cell := CellName(1, r+1)
			if err := f.SetSheetRow(s.name, cell, &row); err != nil {
				t.Fatal(err)
			}
		}
		if s.numFmt != 0 || s.custom != "" {
			st := &excelize.Style{NumFmt: s.numFmt}
			if s.custom != "" {
				st.CustomNumFmt = &s.custom
			}
			id, err := f.NewStyle(st)
			if err != nil {
				t.Fatal(err)
			}
			if err := f.SetCellStyle(s.name, "A2", CellName(1, len(s.rows)), id); err != nil {
				t.Fatal(err)
			}
		}
	}
	var b bytes.Buffer
	if err := f.Write(&b); err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// serial is the spreadsheet date of a day: days since 30 December 1899
// (the 1900 date system, common practice; 1 January 2026 is 46023).
func serial(t *testing.T, day string) float64 {
	t.Helper()
	d, err := time.Parse("2006-01-02", day)
	if err != nil {
		t.Fatal(err)
	}
	return float64(d.Sub(time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC)).Hours() / 24)
}

// Workbooks read as the same layouts as CSV files. Each expected value is
// a cell written by the test itself (tolerance 1e-12).
func TestReadHistoryWorkbook(t *testing.T) {
	if got := serial(t, "2026-01-01"); got != 46023 {
		t.Fatalf("serial(2026-01-01) = %v, want 46023", got)
	}
	tests := []struct {
		name   string
		sheets []sheet
		opt    ReadOptions
		series string
		start  string
		freq   forecast.Frequency
		want   []float64
		read   string
	}{
		{
			name: "wide, month labels as text",
			sheets: []sheet{{name: "demand", rows: [][]any{
				{"period", "bottled-l", "yoghurt"}, {"2026-01", 120, 40.5}, {"2026-02", 131, 41}, {"2026-03", 128.25, 39}}}},
			series: "bottled-l", start: "2026-01", freq: forecast.Monthly, want: []float64{120, 131, 128.25},
			read: `sheet "demand"`,
		},
		{
			name: "wide, dates formatted as months",
			sheets: []sheet{{name: "demand", custom: "mmm yyyy", rows: [][]any{
				{"period", "bottled-l"}, {serial(t, "2026-01-01"), 120}, {serial(t, "2026-02-01"), 131}, {serial(t, "2026-03-01"), 128}}}},
			series: "bottled-l", start: "2026-01", freq: forecast.Monthly, want: []float64{120, 131, 128},
			read: `sheet "demand"`,
		},
		{
			// Built-in format 14 (m/d/yyyy) shows the day; dates 7 days
			// apart are weeks.
			name: "wide, dates 7 days apart are weeks",
			sheets: []sheet{{name: "Sheet1", numFmt: 14, rows: [][]any{
				{"period", "cream"}, {serial(t, "2026-01-05"), 10}, {serial(t, "2026-01-12"), 11}, {serial(t, "2026-01-19"), 12}}}},
			series: "cream", start: "2026-01-05", freq: forecast.Weekly, want: []float64{10, 11, 12},
			read: `sheet "Sheet1"`,
		},
		{
			name: "long, the sheet named, numbers held as text",
			sheets: []sheet{
				{name: "notes", rows: [][]any{{"read me first"}}},
				{name: "demand", rows: [][]any{
					{"series", "period", "value"}, {"cheese", "2026-Q1", "7.5"}, {"cheese", "2026-Q2", 8}, {}, {"butter", "2026-Q1", 3}}},
			},
			opt:    ReadOptions{Format: Format{Sheet: "Demand"}},
			series: "cheese", start: "2026-Q1", freq: forecast.Quarterly, want: []float64{7.5, 8},
			read: `sheet "demand"`,
		},
		{
			name: "decimal commas in text cells",
			sheets: []sheet{{name: "demand", rows: [][]any{
				{"period", "whey"}, {"2026", "2,5"}, {"2027", 3}}}},
			opt:    ReadOptions{Format: Format{Decimal: DecimalComma}},
			series: "whey", start: "2026", freq: forecast.Yearly, want: []float64{2.5, 3},
			read: `sheet "demand"`,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src := workbook(t, tc.sheets...)
			h, err := ReadHistory(bytes.NewReader(src), "history.xlsx", tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			s, err := h.Lookup(tc.series)
			if err != nil {
				t.Fatal(err)
			}
			if s.Freq() != tc.freq || s.Start.String() != tc.start {
				t.Errorf("start %s (%s), want %s (%s)", s.Start, s.Freq(), tc.start, tc.freq)
			}
			if len(s.Values) != len(tc.want) {
				t.Fatalf("values %v, want %v", s.Values, tc.want)
			}
			for i := range s.Values {
				if !scalar.EqualWithinAbsOrRel(s.Values[i], tc.want[i], 1e-12, 1e-12) {
					t.Errorf("value %d = %v, want %v", i, s.Values[i], tc.want[i])
				}
			}
			if h.Read != tc.read {
				t.Errorf("Read = %q, want %q", h.Read, tc.read)
			}
		})
	}
}

// Errors in a workbook name the sheet and the cell.
func TestReadHistoryWorkbookErrors(t *testing.T) {
	rows := func(extra ...[]any) [][]any {
		r := [][]any{{"period", "bottled-l", "yoghurt"}}
		for i := 1; i <= 12; i++ {
			r = append(r, []any{"2025-" + []string{"01", "02", "03", "04", "05", "06", "07", "08", "09", "10", "11", "12"}[i-1], 100 + i, 50})
		}
		return append(r, extra...)
	}
	tests := []struct {
		name   string
		sheets []sheet
		opt    ReadOptions
		want   error
		msg    string
	}{
		{"not a number", []sheet{{name: "demand", rows: rows([]any{"2026-01", 113, "n/a"})}}, ReadOptions{},
			ErrNotDecimal, `history.xlsx: sheet demand, cell C14: yoghurt: not a plain decimal number: "n/a"`},
		{"thousands in a text cell", []sheet{{name: "demand", rows: rows([]any{"2026-01", "1,234.5", 1})}}, ReadOptions{},
			ErrNotDecimal, `history.xlsx: sheet demand, cell B14: bottled-l: not a plain decimal number: "1,234.5"; thousands separators are not read`},
		{"bad label", []sheet{{name: "demand", rows: rows([]any{"Jan 2026", 1, 1})}}, ReadOptions{},
			forecast.ErrBadPeriod, `history.xlsx: sheet demand, cell A14: period: `},
		{"a gap: a short row", []sheet{{name: "demand", rows: rows([]any{"2026-01", 1}, []any{"2026-02", 1, 2})}}, ReadOptions{},
			ErrGap, `history.xlsx: sheet demand, cell C14: yoghurt: `},
		{"too many cells", []sheet{{name: "demand", rows: rows([]any{"2026-01", 1, 2, 3})}}, ReadOptions{},
			nil, `history.xlsx: sheet demand, cell D14: wrong number of fields: 4 cells, but the header (row 1) has 3`},
		{"duplicate period", []sheet{{name: "demand", rows: rows([]any{"2025-03", 1, 2})}}, ReadOptions{},
			ErrDuplicatePeriod, `history.xlsx: sheet demand, cell A14: period: duplicate period 2025-03 (first on row 4)`},
		{"no such sheet", []sheet{{name: "demand", rows: rows()}, {name: "notes"}}, ReadOptions{Format: Format{Sheet: "sales"}},
			ErrDialect, `history.xlsx: cannot read the file this way: no sheet "sales"; the workbook has "demand", "notes"`},
		{"header", []sheet{{name: "demand", rows: [][]any{{}, {"month", "a"}, {"2026-01", 1}}}}, ReadOptions{},
			ErrMissingColumn, `history.xlsx: sheet demand, cell A2: missing column: header "month,a"`},
		{"empty sheet", []sheet{{name: "demand"}}, ReadOptions{},
			ErrNoSeries, `history.xlsx: sheet demand: no such series: the file is empty`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src := workbook(t, tc.sheets...)
			_, err := ReadHistory(bytes.NewReader(src), "history.xlsx", tc.opt)
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v (%T) is not a *ParseError", err, err)
			}
			if tc.want != nil && !errors.Is(err, tc.want) {
				t.Errorf("error %q does not wrap %q", err, tc.want)
			}
			if !strings.HasPrefix(err.Error(), tc.msg) {
				t.Errorf("error\n%s\ndoes not start with\n%s", err, tc.msg)
			}
		})
	}
}

func TestFormatGrain(t *testing.T) {
	// Number format codes as spreadsheets write them (common practice).
	for code, want := range map[string]dateGrain{
		"yyyy-mm-dd":       dayGrain,
		"d/m/yyyy":         dayGrain,
		"mmm yyyy":         monthGrain,
		"mm/yyyy":          monthGrain,
		"yyyy":             yearGrain,
		"h:mm":             notDate,
		"mm:ss":            notDate,
		"0.00":             notDate,
		"#,##0":            notDate,
		`"day" 0`:          notDate,
		"[$-407]mmmm yyyy": monthGrain,
		"General":          notDate,
		"0.0%":             percentShown,
		`0" %"`:            notDate,
	} {
		if got := formatGrain(code); got != want {
			t.Errorf("formatGrain(%q) = %v, want %v", code, got, want)
		}
	}
}

// A damaged workbook is an error, never a panic.
func FuzzReadWorkbook(f *testing.F) {
	f.Add(workbook(f, sheet{name: "demand", custom: "mmm yyyy", rows: [][]any{{"period", "a"}, {46023.0, 1}, {46054.0, 2}}}))
	f.Add([]byte("PK\x03\x04"))
	f.Fuzz(func(t *testing.T, src []byte) {
		h, err := ReadHistory(bytes.NewReader(src), "h.xlsx", ReadOptions{})
		if err == nil && len(h.Series) == 0 {
			t.Error("no error and no series")
		}
	})
}
