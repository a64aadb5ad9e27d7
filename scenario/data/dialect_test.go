package data

import (
	"errors"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// CSV files as spreadsheets save them: the separator found from the
// header, decimal commas when asked, a byte order mark. The values are
// written in the files by hand, so each expected number is the cell read
// with its decimal mark (tolerance 1e-12).
func TestReadHistoryDialects(t *testing.T) {
	tests := []struct {
		name, input string
		opt         ReadOptions
		want        []float64
		read        string
	}{
		{"comma", "period,a\n2026-01,12.5\n2026-02,7\n", ReadOptions{}, []float64{12.5, 7}, ""},
		{"semicolon", "period;a\n2026-01;12.5\n2026-02;7\n", ReadOptions{}, []float64{12.5, 7}, "cells separated by semicolons"},
		{"tab", "period\ta\n2026-01\t12.5\n2026-02\t7\n", ReadOptions{}, []float64{12.5, 7}, "cells separated by tabs"},
		{"semicolon, decimal comma", "period;a\n2026-01;12,5\n2026-02;-0,25\n",
			ReadOptions{Format: Format{Decimal: DecimalComma}}, []float64{12.5, -0.25}, "cells separated by semicolons, decimal commas"},
		{"tab, decimal comma, exponent", "period\ta\n2026-01\t1,5e2\n2026-02\t3\n",
			ReadOptions{Format: Format{Decimal: DecimalComma}}, []float64{150, 3}, "cells separated by tabs, decimal commas"},
		{"byte order mark, semicolons", "\ufeffperiod;a\r\n2026-01;1\r\n2026-02;2\r\n", ReadOptions{}, []float64{1, 2}, "cells separated by semicolons"},
		{"blank line before the header", "\n;;\nperiod;a\n2026-01;1\n2026-02;2\n", ReadOptions{}, []float64{1, 2}, "cells separated by semicolons"},
		// The header's commas are inside quotes: the separator is the
		// semicolon.
		{"quoted commas in the header", "period;\"a,b\"\n2026-01;4\n2026-02;5\n", ReadOptions{}, []float64{4, 5}, "cells separated by semicolons"},
		{"long layout, semicolons", "series;period;value\nx;2026-01;3,5\nx;2026-02;4\n",
			ReadOptions{Format: Format{Decimal: DecimalComma}}, []float64{3.5, 4}, "cells separated by semicolons, decimal commas"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			h, err := ReadHistory(strings.NewReader(tc.input), "h.csv", tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			got := h.Series[0].Values
			if len(got) != len(tc.want) {
				t.Fatalf("values %v, want %v", got, tc.want)
			}
			for i := range got {
				if !scalar.EqualWithinAbsOrRel(got[i], tc.want[i], 1e-12, 1e-12) {
					t.Errorf("value %d = %v, want %v", i, got[i], tc.want[i])
				}
			}
			if h.Read != tc.read {
				t.Errorf("Read = %q, want %q", h.Read, tc.read)
			}
		})
	}
}

// Numbers a spreadsheet writes that are refused, with the place and a
// message that says how to read them. The § marks the cell at fault.
func TestReadHistoryDialectErrors(t *testing.T) {
	comma := ReadOptions{Format: Format{Decimal: DecimalComma}}
	tests := []struct {
		name, input string
		opt         ReadOptions
		want        error
		msg         string
	}{
		{"decimal comma without the setting", "period;a\n2026-01;§12,5\n", ReadOptions{},
			ErrNotDecimal, `"12,5"; a decimal comma; read the file with --decimal comma (or decimal: comma under history`},
		{"points for thousands, decimal comma", "period;a\n2026-01;§1.234,5\n", ReadOptions{},
			ErrNotDecimal, `"1.234,5"; thousands separators are not read; write 1234.5, or 1234,5 and read the file with --decimal comma`},
		{"commas for thousands, decimal point", "period;a\n2026-01;§1,234.5\n", ReadOptions{},
			ErrNotDecimal, `"1,234.5"; thousands separators are not read; write the digits without them, such as 1234.5`},
		{"space for thousands", "period;a\n2026-01;§1 234\n", ReadOptions{},
			ErrNotDecimal, `"1 234"; thousands separators are not read; write the digits without them, such as 1234`},
		{"no-break space for thousands", "period;a\n2026-01;§12\u00a0345\n", ReadOptions{},
			ErrNotDecimal, `thousands separators are not read; write the digits without them, such as 12345`},
		{"comma, thousands or decimals", "period;a\n2026-01;§1,234\n", ReadOptions{},
			ErrNotDecimal, `"1,234"; if the comma separates thousands, write 1234 (thousands separators are not read); if it is a decimal comma, read the file with --decimal comma`},
		{"thousands with decimal commas", "period;a\n2026-01;§1.234,5\n", comma,
			ErrNotDecimal, `"1.234,5"; thousands separators are not read; write the digits without them, such as 1234,5`},
		{"point with decimal commas", "period;a\n2026-01;§12.5\n", comma,
			ErrNotDecimal, `"12.5"; decimal commas were asked for, so a point is not read; write 12,5`},
		{"two commas with decimal commas", "period;a\n2026-01;§1,2,3\n", comma,
			ErrNotDecimal, `"1,2,3"; write digits with an optional sign, comma and exponent`},
		{"decimal comma asked of a comma file", "period,a\n2026-01,1\n", comma,
			ErrDialect, "h.csv: cannot read the file this way: decimal commas were asked for (--decimal comma, or decimal: comma under history), but the cells of this file are separated by commas"},
		{"header read with semicolons", "§month;north;south\n2026-01;1;2\n", ReadOptions{},
			ErrMissingColumn, "its cells were read as separated by semicolons, the separator found most on this line"},
		{"header with no separator", "§period|a|b\n2026-01|1|2\n", ReadOptions{},
			ErrMissingColumn, `header "period|a|b": want columns series, period and value (long layout), or period first and then one column per series (wide layout); the line has no comma, semicolon or tab, so it was read as one cell`},
		{"binary workbook", "\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1rest", ReadOptions{},
			ErrDialect, "h.csv: cannot read the file this way: a workbook in the older binary format (.xls); save it as .xlsx, or as CSV"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			input, line, col := mark(tc.input)
			_, err := ReadHistory(strings.NewReader(input), "h.csv", tc.opt)
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v (%T) is not a *ParseError", err, err)
			}
			if !errors.Is(err, tc.want) {
				t.Errorf("error %q does not wrap %q", err, tc.want)
			}
			if pe.Line != line || pe.Column != col {
				t.Errorf("error at %d:%d, want %d:%d (%v)", pe.Line, pe.Column, line, col, err)
			}
			if !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("error %q does not contain %q", err, tc.msg)
			}
		})
	}
}

func TestParseDecimalMark(t *testing.T) {
	for in, want := range map[string]Decimal{"": DecimalPoint, "point": DecimalPoint, "Comma": DecimalComma} {
		got, err := ParseDecimalMark(in)
		if err != nil || got != want {
			t.Errorf("ParseDecimalMark(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	if _, err := ParseDecimalMark("dot"); err == nil || !strings.Contains(err.Error(), "want point or comma") {
		t.Errorf("ParseDecimalMark(dot): %v", err)
	}
}

func TestCellName(t *testing.T) {
	// Column letters as a spreadsheet shows them (common practice): A to
	// Z, then AA (27), AZ (52), BA (53), ZZ (702), AAA (703).
	for _, c := range []struct {
		col, row int
		want     string
	}{{1, 1, "A1"}, {3, 14, "C14"}, {26, 2, "Z2"}, {27, 2, "AA2"}, {52, 9, "AZ9"}, {53, 9, "BA9"}, {702, 1, "ZZ1"}, {703, 1, "AAA1"}} {
		if got := CellName(c.col, c.row); got != c.want {
			t.Errorf("CellName(%d, %d) = %q, want %q", c.col, c.row, got, c.want)
		}
	}
}
