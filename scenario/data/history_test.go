package data

import (
	"encoding/csv"
	"errors"
	"fmt"
	"forelay/forecast"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// The history format is this package's own, so most expected values below
// are read off the test input by hand; the comments say how. Dates, weekdays
// and ISO weeks were checked with Python's datetime module (Debian python3
// 3.11), e.g. /usr/bin/python3 -c 'import datetime as d;
// print(d.date(2026,3,19).strftime("%A"))'. Error positions follow
// encoding/csv's convention: 1-based lines and byte columns.

// wantSeries is one expected series: its name, first label and values.
type wantSeries struct {
	name   string
	start  string
	values []float64
}

// wantFilled is one expected filled cell.
type wantFilled struct {
	series, period string
	value          float64
	line           int
}

func checkHistory(t *testing.T, h *History, layout string, freq forecast.Frequency, want []wantSeries, filled []wantFilled, tol float64) {
	t.Helper()
	if h.Layout != layout {
		t.Errorf("Layout = %q, want %q", h.Layout, layout)
	}
	if len(h.Series) != len(want) {
		t.Fatalf("got %d series %v, want %d", len(h.Series), h.Series, len(want))
	}
	for i, w := range want {
		s := h.Series[i]
		if s.Name != w.name || s.Start.String() != w.start || s.Freq() != freq {
			t.Errorf("series %d = %q from %s (%v), want %q from %s (%v)", i, s.Name, s.Start, s.Freq(), w.name, w.start, freq)
		}
		if len(s.Values) != len(w.values) {
			t.Errorf("series %q values = %v, want %v", s.Name, s.Values, w.values)
			continue
		}
		for k := range w.values {
			if !scalar.EqualWithinAbsOrRel(s.Values[k], w.values[k], tol, tol) {
				t.Errorf("series %q value %d = %v, want %v", s.Name, k, s.Values[k], w.values[k])
			}
		}
	}
	if len(h.Filled) != len(filled) {
		t.Fatalf("Filled = %v, want %v", h.Filled, filled)
	}
	for i, w := range filled {
		f := h.Filled[i]
		if f.Series != w.series || f.Period.String() != w.period || f.Line != w.line ||
			!scalar.EqualWithinAbsOrRel(f.Value, w.value, tol, tol) {
			t.Errorf("Filled[%d] = {%q %s %v line %d}, want {%q %s %v line %d}",
				i, f.Series, f.Period, f.Value, f.Line, w.series, w.period, w.value, w.line)
		}
	}
}

func TestReadHistory(t *testing.T) {
	tests := []struct {
		name   string
		input  string
		opt    ReadOptions
		layout string
		freq   forecast.Frequency
		// want and filled are read off the input by hand, unless a
		// comment gives the calculation.
		want   []wantSeries
		filled []wantFilled
		tol    float64
	}{
		{
			name:   "wide monthly, ragged starts and ends",
			input:  "period,north,south\n2025-11,10,\n2025-12,12,5\n2026-01,11,6\n2026-02,,7\n",
			layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{{"north", "2025-11", []float64{10, 12, 11}}, {"south", "2025-12", []float64{5, 6, 7}}},
		},
		{
			name: "long monthly, columns in any order and case, extra column",
			input: " Value , Note ,SERIES,Period\n" +
				"4.5,,east,2026-01\n" +
				"-3,credit note,west,2026-01\n" +
				"5.25,,east,2026-02\n" +
				"1e2,,west,2026-02\n" +
				"+7,,west,2026-03\n",
			layout: "long", freq: forecast.Monthly,
			want: []wantSeries{{"east", "2026-01", []float64{4.5, 5.25}}, {"west", "2026-01", []float64{-3, 100, 7}}},
		},
		{
			name:   "daily dates",
			input:  "period,kiosk\n2026-02-27,3\n2026-02-28,4\n2026-03-01,5\n",
			layout: "wide", freq: forecast.Daily,
			want: []wantSeries{{"kiosk", "2026-02-27", []float64{3, 4, 5}}},
		},
		{
			// Python: date(2026,3,4) is a Wednesday; one week later is 03-11.
			name:   "weekly inferred from dates 7 days apart",
			input:  "period,kiosk\n2026-03-04,3\n2026-03-11,4\n2026-03-18,5\n",
			layout: "wide", freq: forecast.Weekly,
			want: []wantSeries{{"kiosk", "2026-03-04", []float64{3, 4, 5}}},
		},
		{
			// The smallest spacing is 7 days, so a 14-day step is a
			// missing week: 3 + (5-3)*1/2 = 4.
			name:   "weekly inferred, missing week interpolated",
			input:  "period,kiosk\n2026-03-04,3\n2026-03-11,3\n2026-03-25,5\n",
			opt:    ReadOptions{Fill: FillInterpolate},
			layout: "wide", freq: forecast.Weekly,
			want:   []wantSeries{{"kiosk", "2026-03-04", []float64{3, 3, 4, 5}}},
			filled: []wantFilled{{"kiosk", "2026-03-18", 4, 0}},
		},
		{
			// Two series of weeks from the same Wednesday (see above),
			// their rows interleaved; b starts two weeks after a.
			name:   "long weekly dates, interleaved series",
			input:  "series,period,value\na,2026-03-04,1\nb,2026-03-18,5\na,2026-03-11,2\nb,2026-03-25,6\n",
			layout: "long", freq: forecast.Weekly,
			want: []wantSeries{{"a", "2026-03-04", []float64{1, 2}}, {"b", "2026-03-18", []float64{5, 6}}},
		},
		{
			// Only 14-day steps: still weeks, and forcing weeks gives the
			// same. The missing week is filled with 0.
			name:   "forced weekly on dates, zero fill",
			input:  "period,kiosk\n2026-03-04,3\n2026-03-18,5\n",
			opt:    ReadOptions{Freq: forecast.Weekly, Fill: FillZero},
			layout: "wide", freq: forecast.Weekly,
			want:   []wantSeries{{"kiosk", "2026-03-04", []float64{3, 0, 5}}},
			filled: []wantFilled{{"kiosk", "2026-03-11", 0, 0}},
		},
		{
			// One date per series gives no spacing: days.
			name:   "single dates are days",
			input:  "series,period,value\na,2026-03-04,1\nb,2026-03-11,2\n",
			layout: "long", freq: forecast.Daily,
			want: []wantSeries{{"a", "2026-03-04", []float64{1}}, {"b", "2026-03-11", []float64{2}}},
		},
		{
			// Python: fromisocalendar(2025,52,1) = 2025-12-22 and
			// fromisocalendar(2026,1,1) = 2025-12-29, one week apart.
			name:   "ISO weeks across a year end",
			input:  "period,kiosk\n2025-W52,1\n2026-W01,2\n2026-W02,3\n",
			layout: "wide", freq: forecast.Weekly,
			want: []wantSeries{{"kiosk", "2025-W52", []float64{1, 2, 3}}},
		},
		{
			// Python: fromisocalendar(2020,53,1) = 2020-12-28, and
			// fromisocalendar(2021,1,1) = 2021-01-04 follows it.
			name:   "ISO week 53",
			input:  "period,kiosk\n2020-W52,1\n2020-W53,2\n2021-W01,3\n",
			opt:    ReadOptions{Freq: forecast.Weekly},
			layout: "wide", freq: forecast.Weekly,
			want: []wantSeries{{"kiosk", "2020-W52", []float64{1, 2, 3}}},
		},
		{
			name:   "quarters",
			input:  "period,kiosk\n2025-Q3,1\n2025-Q4,2\n2026-Q1,3\n",
			layout: "wide", freq: forecast.Quarterly,
			want: []wantSeries{{"kiosk", "2025-Q3", []float64{1, 2, 3}}},
		},
		{
			name:   "years, forced",
			input:  "period,kiosk\n2024,1\n2025,2\n2026,3\n",
			opt:    ReadOptions{Freq: forecast.Yearly},
			layout: "wide", freq: forecast.Yearly,
			want: []wantSeries{{"kiosk", "2024", []float64{1, 2, 3}}},
		},
		{
			name:   "BOM, CRLF, blank and empty rows, spaces",
			input:  "\ufeffperiod , a\r\n\r\n  \r\n2026-01 ,  1 \r\n,\r\n 2026-02, 2\r\n",
			layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{{"a", "2026-01", []float64{1, 2}}},
		},
		{
			name:   "quoted names and values",
			input:  "period,\"north, east\",\"say \"\"hi\"\"\"\n2026-01,\"1.5\",2\n",
			layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{{"north, east", "2026-01", []float64{1.5}}, {"say \"hi\"", "2026-01", []float64{2}}},
		},
		{
			// Every form of ParseDecimal's grammar, spaces around it.
			name:   "plain decimal forms",
			input:  "period,a\n2026-01, +.5 \n2026-02,7.\n2026-03,-1.25E+2\n2026-04,3e-1\n2026-05,007\n",
			layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{{"a", "2026-01", []float64{0.5, 7, -125, 0.3, 7}}},
		},
		{
			// Interior empty cell (line 3) and missing row (2026-03) in
			// one run from 10 (2026-01) to 16 (2026-04), d = 3:
			// 10 + 6*1/3 = 12, 10 + 6*2/3 = 14.
			name:   "wide, interpolate over an empty cell and a missing row",
			input:  "period,a\n2026-01,10\n2026-02,\n2026-04,16\n",
			opt:    ReadOptions{Fill: FillInterpolate},
			layout: "wide", freq: forecast.Monthly,
			want:   []wantSeries{{"a", "2026-01", []float64{10, 12, 14, 16}}},
			filled: []wantFilled{{"a", "2026-02", 12, 3}, {"a", "2026-03", 14, 0}},
			tol:    1e-12,
		},
		{
			name:   "forced month on month labels",
			input:  "period,a\n2026-01,1\n",
			opt:    ReadOptions{Freq: forecast.Monthly},
			layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{{"a", "2026-01", []float64{1}}},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			h, err := ReadHistory(strings.NewReader(tc.input), "h.csv", tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			if h.File != "h.csv" {
				t.Errorf("File = %q", h.File)
			}
			checkHistory(t, h, tc.layout, tc.freq, tc.want, tc.filled, tc.tol)
		})
	}
}

// TestReadHistoryFiles reads the fixtures in testdata/history.
func TestReadHistoryFiles(t *testing.T) {
	tests := []struct {
		file   string
		opt    ReadOptions
		layout string
		freq   forecast.Frequency
		want   []wantSeries
		filled []wantFilled
		tol    float64
	}{
		{
			file: "wide_monthly.csv", layout: "wide", freq: forecast.Monthly,
			want: []wantSeries{
				{"bolts", "2025-10", []float64{120, 132, 128, 141}},
				{"nuts", "2025-11", []float64{40, 44, 39, 47}},
				{"washers", "2025-12", []float64{15, 17, 18}},
			},
		},
		{
			// BOM, CRLF, blank lines and a note column; the dates are
			// Wednesdays 7 days apart (Python datetime), so weeks.
			file: "long_weekly.csv", layout: "long", freq: forecast.Weekly,
			want: []wantSeries{
				{"hinges", "2026-01-07", []float64{30, 34, -2}},
				{"latches", "2026-01-14", []float64{12, 15}},
			},
		},
		{
			// clips: empty cell on line 3 (2025-02), no row for 2025-03; pins:
			// no rows for 2025-03 and 2025-04. All become 0.
			file: "long_gaps.csv", opt: ReadOptions{Fill: FillZero}, layout: "long", freq: forecast.Monthly,
			want: []wantSeries{
				{"clips", "2025-01", []float64{10, 0, 0, 16, 20}},
				{"pins", "2025-02", []float64{7, 0, 0, 1}},
			},
			filled: []wantFilled{
				{"clips", "2025-02", 0, 3}, {"clips", "2025-03", 0, 0},
				{"pins", "2025-03", 0, 0}, {"pins", "2025-04", 0, 0},
			},
		},
		{
			// clips from 10 (2025-01) to 16 (2025-04), d = 3:
			//   2025-02: 10 + (16-10)*1/3 = 12, 2025-03: 10 + (16-10)*2/3 = 14
			// pins from 7 (2025-02) to 1 (2025-05), d = 3:
			//   2025-03: 7 + (1-7)*1/3 = 5,     2025-04: 7 + (1-7)*2/3 = 3
			file: "long_gaps.csv", opt: ReadOptions{Fill: FillInterpolate}, layout: "long", freq: forecast.Monthly,
			want: []wantSeries{
				{"clips", "2025-01", []float64{10, 12, 14, 16, 20}},
				{"pins", "2025-02", []float64{7, 5, 3, 1}},
			},
			filled: []wantFilled{
				{"clips", "2025-02", 12, 3}, {"clips", "2025-03", 14, 0},
				{"pins", "2025-03", 5, 0}, {"pins", "2025-04", 3, 0},
			},
			tol: 1e-12,
		},
	}
	for _, tc := range tests {
		t.Run(tc.file+"/"+tc.opt.Fill.String(), func(t *testing.T) {
			f, err := os.Open(filepath.Join("..", "..", "testdata", "history", tc.file))
			if err != nil {
				t.Fatal(err)
			}
			defer f.Close()
			h, err := ReadHistory(f, tc.file, tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			checkHistory(t, h, tc.layout, tc.freq, tc.want, tc.filled, tc.tol)
		})
	}
}

// mark removes the first position marker from s and returns its 1-based
// line and byte column, as encoding/csv's tests do. "§" marks a cell; "¶"
// marks a line only (column 0). Without a marker line and column are 0.
func mark(s string) (clean string, line, col int) {
	for _, m := range []string{"§", "¶"} {
		i := strings.Index(s, m)
		if i < 0 {
			continue
		}
		before := s[:i]
		line = strings.Count(before, "\n") + 1
		if m == "§" {
			col = i - strings.LastIndex(before, "\n")
		}
		return before + s[i+len(m):], line, col
	}
	return s, 0, 0
}

func TestReadHistoryErrors(t *testing.T) {
	tests := []struct {
		name  string
		input string // with a position marker, see mark
		opt   ReadOptions
		want  []error // every one must match errors.Is
		field string
		msg   string // a part of the message
	}{
		{
			name:  "empty file",
			input: "",
			want:  []error{ErrNoSeries},
		},
		{
			name:  "header only",
			input: "¶period,a\n\n",
			want:  []error{ErrNoSeries},
			msg:   "no data rows",
		},
		{
			name:  "unknown header",
			input: "\n§date,qty\n2026-01,5\n",
			want:  []error{ErrMissingColumn},
			msg:   `header "date,qty": want columns series, period and value`,
		},
		{
			name:  "long header missing value",
			input: "§series,period,qty\na,2026-01,5\n",
			want:  []error{ErrMissingColumn},
		},
		{
			name:  "wide header with an empty name",
			input: "period,a,§\n2026-01,1,2\n",
			want:  []error{ErrMissingColumn},
			msg:   "column 3 has no series name",
		},
		{
			name:  "wide header with a repeated name",
			input: "period,a,b,§a\n2026-01,1,2,3\n",
			want:  []error{ErrDuplicateColumn},
			msg:   `"a" is already column 2`,
		},
		{
			name:  "wide series named period",
			input: "period,a,§Period\n2026-01,1,2\n",
			want:  []error{ErrDuplicateColumn},
		},
		{
			name:  "long header with a repeated key",
			input: "series,period,value,§VALUE\na,2026-01,1,2\n",
			want:  []error{ErrDuplicateColumn},
		},
		{
			name:  "wide header without series",
			input: "§period\n2026-01\n",
			want:  []error{ErrNoSeries},
		},
		{
			name:  "bad number",
			input: "period,qty\n2026-01,5\n2026-02,§1O\n",
			want:  []error{ErrBadNumber},
			field: "qty",
			msg:   `not a plain decimal number: "1O"; write digits`,
		},
		{
			name:  "number out of range",
			input: "series,period,value\na,2026-01,§1e999\n",
			want:  []error{ErrBadNumber, ErrNotFinite},
			field: "value",
			msg:   "out of range",
		},
		{
			// The message form of the issue: file:line:column: series:
			// what was found.
			name:  "digit separator",
			input: "period,bottled-l\n2026-01,980\n2026-02,§1_000\n",
			want:  []error{ErrBadNumber, ErrNotDecimal},
			field: "bottled-l",
			msg:   `h.csv:3:9: bottled-l: not a plain decimal number: "1_000"; write the digits without separators, such as 1000`,
		},
		{
			name:  "thousands separator in a quoted cell",
			input: "series,period,value\na,2026-01,§\"1,000\"\n",
			want:  []error{ErrNotDecimal},
			msg:   `"1,000"; if the comma separates thousands, write 1000 (thousands separators are not read)`,
		},
		{
			name:  "hexadecimal float",
			input: "period,a\n2026-01,§0x1p4\n",
			want:  []error{ErrBadNumber, ErrNotDecimal},
			msg:   `not a plain decimal number: "0x1p4"; write the value in decimal digits`,
		},
		{
			name:  "NaN is not a missing value",
			input: "period,a\n2026-01,1\n2026-02,§NaN\n2026-03,3\n",
			want:  []error{ErrBadNumber, ErrNotFinite},
			field: "a",
			msg:   `h.csv:3:9: a: not a finite number: "NaN"; leave the cell empty where the value is missing`,
		},
		{
			// --fill fills empty cells only: it never hides a NaN.
			name:  "NaN with a fill mode",
			input: "series,period,value\na,2026-01,1\na,2026-02,§nan\na,2026-03,3\n",
			opt:   ReadOptions{Fill: FillInterpolate},
			want:  []error{ErrNotFinite},
			field: "value",
		},
		{
			name:  "NaN at the end of a column",
			input: "period,a,b\n2026-01,1,1\n2026-02,2,§-Inf\n",
			opt:   ReadOptions{Fill: FillZero},
			want:  []error{ErrNotFinite},
			msg:   `not a finite number: "-Inf"`,
		},
		{
			name:  "infinity spelled out",
			input: "period,a\n2026-01, §+Infinity \n", // columns skip leading spaces
			want:  []error{ErrNotFinite},
			msg:   `"+Infinity"`,
		},
		{
			name:  "first error of a row is the leftmost",
			input: "value,period,series\n§x,2026-13,\n",
			want:  []error{ErrBadNumber},
		},
		{
			name:  "bad month",
			input: "period,a\n§2026-13,5\n",
			want:  []error{forecast.ErrBadPeriod},
			field: "period",
		},
		{
			name:  "no such date",
			input: "period,a\n2026-02-28,5\n§2026-02-29,5\n",
			want:  []error{forecast.ErrBadPeriod},
		},
		{
			name:  "no such ISO week",
			input: "period,a\n2021-W52,5\n§2021-W53,5\n",
			want:  []error{forecast.ErrBadPeriod},
		},
		{
			name:  "unreadable label",
			input: "Series,Period,Value\na,§Jan 2026,5\n",
			want:  []error{forecast.ErrBadPeriod},
			field: "Period",
		},
		{
			name:  "empty label",
			input: "period,a\n2026-01,1\n §,5\n", // columns skip leading spaces
			want:  []error{forecast.ErrBadPeriod},
			msg:   "no period label",
		},
		{
			name:  "mixed label forms",
			input: "period,a\n2026-01,5\n§2026-Q1,6\n",
			want:  []error{forecast.ErrBadPeriod},
			msg:   `"2026-Q1" is a quarter, but the labels before it are months (line 2)`,
		},
		{
			name:  "forced coarser frequency",
			input: "period,a\n§2026-01,5\n2026-02,6\n",
			opt:   ReadOptions{Freq: forecast.Quarterly},
			want:  []error{forecast.ErrBadPeriod},
			msg:   "labels are months but --period quarter was asked; aggregate first",
		},
		{
			name:  "forced months on dates",
			input: "period,a\n§2026-01-01,5\n",
			opt:   ReadOptions{Freq: forecast.Monthly},
			want:  []error{forecast.ErrBadPeriod},
			msg:   "aggregate first",
		},
		{
			name:  "forced finer frequency",
			input: "period,a\n§2026-01,5\n",
			opt:   ReadOptions{Freq: forecast.Daily},
			want:  []error{forecast.ErrBadPeriod},
			msg:   "months cannot be split into days",
		},
		{
			name:  "forced days on ISO weeks",
			input: "period,a\n§2026-W01,5\n",
			opt:   ReadOptions{Freq: forecast.Daily},
			want:  []error{forecast.ErrBadPeriod},
		},
		{
			// Smallest spacing 7 days, so weeks from Wednesday 2026-03-04;
			// Python: date(2026,3,19).strftime("%A") = Thursday.
			name:  "weekly date off the weekday",
			input: "period,a\n2026-03-04,1\n2026-03-11,2\n§2026-03-19,3\n",
			want:  []error{forecast.ErrBadPeriod},
			msg:   "2026-03-19 is a Thursday, but the weeks of this file start on Wednesday (line 2)",
		},
		{
			// Weeks (smallest spacing 7 days) from Wednesday 2026-03-04;
			// the first date off that weekday in the file is b's
			// 2026-03-05, a Thursday (one day after a Wednesday), although
			// a's rows come first in the series order.
			name:  "weekly dates off the weekday, long, earliest row",
			input: "series,period,value\na,2026-03-04,1\nb,§2026-03-05,1\na,2026-03-11,2\nb,2026-03-12,2\na,2026-03-19,3\n",
			want:  []error{forecast.ErrBadPeriod},
			field: "period",
			msg:   "2026-03-05 is a Thursday, but the weeks of this file start on Wednesday (line 2)",
		},
		{
			// The periods above the last row increase, and it repeats the
			// second one (line 3), not the one just above it.
			name:  "duplicate of an earlier period, long",
			input: "series,period,value\na,2026-01,1\na,2026-02,2\na,2026-03,3\na,2026-04,4\na,§2026-02,5\n",
			want:  []error{ErrDuplicatePeriod},
			msg:   `duplicate period 2026-02 of series "a" (first on line 3)`,
		},
		{
			name:  "forced weeks, date off the weekday",
			input: "period,a\n2026-03-04,1\n§2026-03-05,2\n",
			opt:   ReadOptions{Freq: forecast.Weekly},
			want:  []error{forecast.ErrBadPeriod},
		},
		{
			name:  "forced days on weekly dates leaves gaps",
			input: "period,a\n2026-03-04,1\n§2026-03-11,2\n",
			opt:   ReadOptions{Freq: forecast.Daily},
			want:  []error{ErrGap},
			msg:   "no values for 2026-03-05 to 2026-03-10 (between line 2 and 3)",
		},
		{
			name:  "duplicate period, long",
			input: "series,period,value\na,2026-01,1\nb,2026-01,1\na,2026-02,2\na,§2026-01,3\n",
			want:  []error{ErrDuplicatePeriod},
			field: "period",
			msg:   `duplicate period 2026-01 of series "a" (first on line 2)`,
		},
		{
			name:  "duplicate period, wide",
			input: "period,a\n2026-01,1\n§2026-01,2\n",
			want:  []error{ErrDuplicatePeriod},
			msg:   "(first on line 2)",
		},
		{
			name:  "unsorted, long",
			input: "series,period,value\na,2026-03,1\nb,2026-01,1\na,§2026-02,2\n",
			want:  []error{ErrUnsorted},
			msg:   `2026-02 of series "a" comes after 2026-03 (line 2)`,
		},
		{
			name:  "unsorted, wide",
			input: "period,a\n2026-Q2,1\n§2026-Q1,2\n",
			want:  []error{ErrUnsorted},
		},
		{
			name:  "gap, wide",
			input: "period,a\n2025-02,1\n2025-03,1\n\n2025-04,1\n§2025-06,1\n",
			want:  []error{ErrGap},
			field: "period",
			msg:   "gap in periods: no value for 2025-05 (between line 5 and 6); use --fill zero|interpolate",
		},
		{
			// b's gap (line 4) comes before a's (line 5) in the file,
			// though a is the first series.
			name:  "earliest gap across series",
			input: "series,period,value\na,2025-01,1\nb,2025-01,1\nb,§2025-03,1\na,2025-04,1\n",
			want:  []error{ErrGap},
			msg:   `no value for 2025-02 of series "b" (between line 3 and 4)`,
		},
		{
			name:  "empty cell inside a wide column",
			input: "period,a,b\n2026-01,1,1\n2026-02,§,2\n2026-03,3,3\n",
			want:  []error{ErrEmptyCell, ErrGap},
			field: "a",
			msg:   `empty value for 2026-02 inside series "a"`,
		},
		{
			name:  "empty cell inside a long series",
			input: "series,period,value\na,2026-01,1\na,2026-02,§\na,2026-03,3\n",
			want:  []error{ErrEmptyCell, ErrGap},
			field: "value",
		},
		{
			name:  "wide column without values",
			input: "period,a,§b\n2026-01,1,\n2026-02,2, \n",
			want:  []error{ErrEmptyCell},
			msg:   `series "b" has no values`,
		},
		{
			name:  "long series without values",
			input: "series,period,value\na,2026-01,1\nb,2026-01,§\nb,2026-02, \n",
			want:  []error{ErrEmptyCell},
			msg:   `series "b" has no values`,
		},
		{
			name:  "long row without series name",
			input: "series,period,value\na,2026-01,1\n§,2026-02,2\n",
			want:  []error{ErrEmptyCell},
			field: "series",
		},
		{
			name:  "too many cells",
			input: "period,a\n2026-01,1,§2\n",
			want:  []error{csv.ErrFieldCount},
			msg:   "3 cells, but the header (line 1) has 2",
		},
		{
			name:  "too few cells",
			input: "period,a,b\n§2026-01,1\n",
			want:  []error{csv.ErrFieldCount},
		},
		{
			// encoding/csv reports the closing quote.
			name:  "bad quotes",
			input: "period,a\n2026-01,\"1§\"2\n",
			want:  []error{csv.ErrQuote},
		},
		{
			name:  "bare quote",
			input: "period,a\n2026-01,1§\"2\n",
			want:  []error{csv.ErrBareQuote},
		},
		{
			// Python: (date(2030,1,1)-date(2000,1,2)).days = 10957
			// days, so 10956 missing days: more than 10000.
			name:  "gap too long to fill",
			input: "period,a\n2000-01-01,1\n2000-01-02,1\n§2030-01-01,1\n",
			opt:   ReadOptions{Fill: FillZero},
			want:  []error{ErrGap},
			msg:   "10956 periods from 2000-01-03 to 2029-12-31",
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			input, line, col := mark(tc.input)
			h, err := ReadHistory(strings.NewReader(input), "h.csv", tc.opt)
			if err == nil {
				t.Fatalf("no error; got %+v", h)
			}
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v (%T) is not a *ParseError", err, err)
			}
			for _, w := range tc.want {
				if !errors.Is(err, w) {
					t.Errorf("error %q does not wrap %q", err, w)
				}
			}
			if pe.File != "h.csv" || pe.Line != line || pe.Column != col {
				t.Errorf("error at %s:%d:%d, want h.csv:%d:%d (%v)", pe.File, pe.Line, pe.Column, line, col, err)
			}
			if tc.field != "" && pe.Field != tc.field {
				t.Errorf("Field = %q, want %q", pe.Field, tc.field)
			}
			if !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("error %q does not contain %q", err, tc.msg)
			}
		})
	}
}

// The message form given in the brief for a gap:
// history.csv:15:1: period: gap in periods: no value for 2025-04 (between
// line 14 and 15); use --fill zero|interpolate.
func TestReadHistoryGapMessage(t *testing.T) {
	var b strings.Builder
	b.WriteString("period,qty\n")
	p := mustPeriod(t, "2024-03", forecast.Monthly)
	for range 13 { // 2024-03 .. 2025-03 on lines 2 to 14
		fmt.Fprintf(&b, "%s,1\n", p)
		p = p.Add(1)
	}
	b.WriteString("2025-05,1\n") // line 15; 2025-04 is missing
	_, err := ReadHistory(strings.NewReader(b.String()), "history.csv", ReadOptions{})
	want := "history.csv:15:1: period: gap in periods: no value for 2025-04 (between line 14 and 15); use --fill zero|interpolate"
	if err == nil || err.Error() != want {
		t.Errorf("error = %v\nwant    %s", err, want)
	}
}

type failingReader struct{}

var errDisk = errors.New("disk on fire")

func (failingReader) Read([]byte) (int, error) { return 0, errDisk }

func TestReadHistoryReaderError(t *testing.T) {
	_, err := ReadHistory(failingReader{}, "h.csv", ReadOptions{})
	if !errors.Is(err, errDisk) || !strings.HasPrefix(err.Error(), "h.csv: ") {
		t.Errorf("error = %v, want the reader's error prefixed with the file name", err)
	}
}

func TestReadHistoryPanicsOnBadOptions(t *testing.T) {
	for _, opt := range []ReadOptions{{Freq: forecast.Frequency(9)}, {Fill: FillMode(-1)}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("ReadHistory(%+v) did not panic", opt)
				}
			}()
			ReadHistory(strings.NewReader("period,a\n2026-01,1\n"), "h.csv", opt)
		}()
	}
}

func TestLookup(t *testing.T) {
	h, err := ReadHistory(strings.NewReader("period,north,south\n2026-01,1,2\n"), "h.csv", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	s, err := h.Lookup("south")
	if err != nil || s.Name != "south" || s.Values[0] != 2 {
		t.Errorf("Lookup(south) = %+v, %v", s, err)
	}
	_, err = h.Lookup("east")
	if !errors.Is(err, ErrNoSeries) || !strings.Contains(err.Error(), `"east" in h.csv (it has "north", "south")`) {
		t.Errorf("Lookup(east) error = %v", err)
	}
	_, err = h.Lookup("")
	if !errors.Is(err, ErrNoSeries) || !strings.Contains(err.Error(), `name one of "north", "south"`) {
		t.Errorf("Lookup(\"\") error = %v", err)
	}
	one := &History{File: "one.csv", Series: []forecast.Series{{Name: "only"}}}
	if s, err := one.Lookup(""); err != nil || s.Name != "only" {
		t.Errorf("Lookup(\"\") on one series = %+v, %v", s, err)
	}
}

func TestParseFillMode(t *testing.T) {
	tests := []struct {
		in   string
		want FillMode
	}{
		{"", FillNone}, {"none", FillNone}, {"zero", FillZero}, {" Interpolate ", FillInterpolate},
	}
	for _, tc := range tests {
		got, err := ParseFillMode(tc.in)
		if err != nil || got != tc.want {
			t.Errorf("ParseFillMode(%q) = %v, %v; want %v", tc.in, got, err, tc.want)
		}
		if tc.in != "" && tc.in != " Interpolate " && got.String() != tc.in {
			t.Errorf("%v.String() = %q, want %q", got, got.String(), tc.in)
		}
	}
	if _, err := ParseFillMode("linear"); err == nil || !strings.Contains(err.Error(), "want none, zero or interpolate") {
		t.Errorf("ParseFillMode(linear) error = %v", err)
	}
	if s := FillMode(7).String(); s != "FillMode(7)" {
		t.Errorf("FillMode(7).String() = %q", s)
	}
}

func TestFillInterior(t *testing.T) {
	nan := math.NaN()
	tests := []struct {
		name string
		in   []float64
		mode FillMode
		want []float64
		idx  []int
		tol  float64
	}{
		{
			// leading and trailing NaNs stay; nothing inside
			name: "ends untouched", in: []float64{nan, 1, 2, nan}, mode: FillInterpolate,
			want: []float64{nan, 1, 2, nan},
		},
		{
			// 2 + (8-2)*1/4 = 3.5, 2 + 6*2/4 = 5, 2 + 6*3/4 = 6.5
			name: "interpolate a run of three", in: []float64{2, nan, nan, nan, 8}, mode: FillInterpolate,
			want: []float64{2, 3.5, 5, 6.5, 8}, idx: []int{1, 2, 3}, tol: 1e-12,
		},
		{
			// -1 + (3-(-1))*1/2 = 1; 3 + (0-3)*1/3 = 2, 3 - 3*2/3 = 1
			name: "two runs, negative start", in: []float64{-1, nan, 3, nan, nan, 0}, mode: FillInterpolate,
			want: []float64{-1, 1, 3, 2, 1, 0}, idx: []int{1, 3, 4}, tol: 1e-12,
		},
		{
			name: "zero", in: []float64{5, nan, nan, 7, nan}, mode: FillZero,
			want: []float64{5, 0, 0, 7, nan}, idx: []int{1, 2},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			v := append([]float64(nil), tc.in...)
			idx := fillInterior(v, tc.mode)
			if fmt.Sprint(idx) != fmt.Sprint(tc.idx) {
				t.Errorf("indices = %v, want %v", idx, tc.idx)
			}
			for i := range v {
				same := math.IsNaN(v[i]) && math.IsNaN(tc.want[i]) || scalar.EqualWithinAbsOrRel(v[i], tc.want[i], tc.tol, tc.tol)
				if !same {
					t.Errorf("v[%d] = %v, want %v", i, v[i], tc.want[i])
				}
			}
		})
	}
}

func ExampleReadHistory() {
	const data = `series,period,value
north,2026-01,120
north,2026-02,
north,2026-03,150
south,2026-02,80
`
	h, err := ReadHistory(strings.NewReader(data), "sales.csv", ReadOptions{Fill: FillInterpolate})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, s := range h.Series {
		fmt.Println(s.Name, s.Start, s.Values)
	}
	for _, f := range h.Filled {
		fmt.Printf("filled %s %s = %g (line %d)\n", f.Series, f.Period, f.Value, f.Line)
	}
	_, err = ReadHistory(strings.NewReader(data), "sales.csv", ReadOptions{})
	fmt.Println(err)
	// Output:
	// north 2026-01 [120 135 150]
	// south 2026-02 [80]
	// filled north 2026-02 = 135 (line 3)
	// sales.csv:3:15: value: empty value for 2026-02 inside series "north" (a gap in periods); use --fill zero|interpolate
}

// FuzzReadHistory checks that no input makes ReadHistory panic, that every
// error is a *ParseError, and that what it returns holds together.
func FuzzReadHistory(f *testing.F) {
	f.Add("period,a,b\n2026-01,1,\n2026-02,,2\n2026-04,3,3\n", uint8(0), uint8(2))
	f.Add("series,period,value\na,2026-03-04,1\na,2026-03-18,x\nb,2026-03-11,2\n", uint8(2), uint8(1))
	f.Add("\ufeffSeries,Period,Value,Note\r\nh,2026-W52,1,\"a,b\"\r\n\r\nh,2027-W01,2,\r\n", uint8(0), uint8(0))
	f.Add("period,a\n2026-Q1,1\n2026-Q3,NaN\n2026-Q4,-2\n", uint8(4), uint8(1))
	f.Add("period,a\n2026-Q1,1_0\n2026-Q2,\n2026-Q3,.5e+1\n", uint8(4), uint8(2))
	f.Fuzz(func(t *testing.T, data string, freq, fill uint8) {
		opt := ReadOptions{Freq: forecast.Frequency(freq % 6), Fill: FillMode(fill % 3)}
		h, err := ReadHistory(strings.NewReader(data), "f.csv", opt)
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v (%T) is not a *ParseError", err, err)
			}
			return
		}
		if len(h.Series) == 0 {
			t.Fatal("no series and no error")
		}
		for _, s := range h.Series {
			if len(s.Values) == 0 {
				t.Fatalf("series %q is empty", s.Name)
			}
			for _, v := range s.Values {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("series %q holds %v", s.Name, v)
				}
			}
			if opt.Freq != forecast.FreqUnknown && s.Freq() != opt.Freq {
				t.Fatalf("series %q is %v, asked %v", s.Name, s.Freq(), opt.Freq)
			}
		}
		if opt.Fill == FillNone && len(h.Filled) > 0 {
			t.Fatalf("filled %d cells with FillNone", len(h.Filled))
		}
		for _, fc := range h.Filled {
			s, err := h.Lookup(fc.Series)
			if err != nil {
				t.Fatal(err)
			}
			if i := s.Index(fc.Period); i <= 0 || i >= s.Len()-1 || s.Values[i] != fc.Value {
				t.Fatalf("filled cell %+v does not match series %v", fc, s)
			}
		}
	})
}

// mustPeriod parses label at frequency f or fails the test.
func mustPeriod(t *testing.T, label string, f forecast.Frequency) forecast.Period {
	t.Helper()
	p, err := forecast.ParsePeriod(label, f)
	if err != nil {
		t.Fatal(err)
	}
	return p
}
