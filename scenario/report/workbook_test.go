package report

import (
	"bytes"
	"math"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// bookReport is a small report with a cell of every kind, an empty cell
// and a NaN, in a CSV table, a further CSV table and a workbook-only
// table.
func bookReport() *Report {
	main := (&Table{Head: []string{"scenario", "period", "demand", "p_breach", "change_pct", "rank", "signal"}}).
		Typed(Label, Label, Quantity, Share, Percent, Count, Ratio)
	main.AddRow("base", "2027-01", "1234.50", "0.1250", "12.50", "1", "-1.2500")
	main.AddRow("base", "2027", "", "NaN", "-3.25", "12", "0.0000")
	more := (&Table{Head: []string{"level", "group", "value"}}).Typed(Label, Label, Quantity)
	more.AddRow("family", "milk", "1000000.00")
	extra := (&Table{Head: []string{"event", "probability"}}).Typed(Label, Share)
	extra.AddRow("new-contract", "0.8000")
	return &Report{Name: "track", CSV: main, MoreCSV: []CSVFile{{"track-rollups", more}},
		MoreTables: []CSVFile{{"events", extra}}}
}

func openBook(t *testing.T, b []byte) *excelize.File {
	t.Helper()
	wb, err := excelize.OpenReader(bytes.NewReader(b))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { wb.Close() })
	return wb
}

// TestXLSXCells reads a workbook back: sheets in order, text as text,
// numbers as numbers with their formats, empty cells for missing values.
func TestXLSXCells(t *testing.T) {
	b, err := bookReport().XLSX()
	if err != nil {
		t.Fatal(err)
	}
	wb := openBook(t, b)
	if got, want := strings.Join(wb.GetSheetList(), ","), "tracking,tracking-rollups,events"; got != want {
		t.Fatalf("sheets %s, want %s", got, want)
	}
	// Each want is the CSV cell as a number (a Percent divided by 100,
	// 12.50 points = 0.125) and the number format of its kind: the
	// built-in formats 4 (#,##0.00), 10 (0.00%) and 3 (#,##0) of the
	// file format (ECMA-376 part 1, 18.8.30), or our custom 0.0000.
	for _, c := range []struct {
		sheet, cell string
		text        string // for a text cell
		num         float64
		numFmt      int
		custom      string
		empty       bool
	}{
		{sheet: "tracking", cell: "A1", text: "scenario"},
		{sheet: "tracking", cell: "B2", text: "2027-01"},
		{sheet: "tracking", cell: "B3", text: "2027"}, // a yearly period stays a label
		{sheet: "tracking", cell: "C2", num: 1234.5, numFmt: 4},
		{sheet: "tracking", cell: "D2", num: 0.125, numFmt: 10},
		{sheet: "tracking", cell: "E2", num: 0.125, numFmt: 10},
		{sheet: "tracking", cell: "E3", num: -0.0325, numFmt: 10},
		{sheet: "tracking", cell: "F3", num: 12, numFmt: 3},
		{sheet: "tracking", cell: "G2", num: -1.25, custom: "0.0000"},
		{sheet: "tracking", cell: "C3", empty: true},
		{sheet: "tracking", cell: "D3", empty: true}, // NaN
		{sheet: "tracking-rollups", cell: "C2", num: 1e6, numFmt: 4},
		{sheet: "events", cell: "B2", num: 0.8, numFmt: 10},
	} {
		raw, err := wb.GetCellValue(c.sheet, c.cell, excelize.Options{RawCellValue: true})
		if err != nil {
			t.Fatal(err)
		}
		typ, err := wb.GetCellType(c.sheet, c.cell)
		if err != nil {
			t.Fatal(err)
		}
		switch {
		case c.empty:
			if raw != "" {
				t.Errorf("%s!%s = %q, want empty", c.sheet, c.cell, raw)
			}
		case c.text != "":
			if raw != c.text || typ != excelize.CellTypeSharedString {
				t.Errorf("%s!%s = %q (type %v), want text %q", c.sheet, c.cell, raw, typ, c.text)
			}
		default:
			v, err := strconv.ParseFloat(raw, 64)
			// A number cell has no type attribute (unset) or t="n".
			if err != nil || math.Abs(v-c.num) > 1e-12 || (typ != excelize.CellTypeUnset && typ != excelize.CellTypeNumber) {
				t.Errorf("%s!%s = %q (type %v), want the number %g", c.sheet, c.cell, raw, typ, c.num)
			}
			id, err := wb.GetCellStyle(c.sheet, c.cell)
			if err != nil {
				t.Fatal(err)
			}
			st, err := wb.GetStyle(id)
			if err != nil {
				t.Fatal(err)
			}
			custom := ""
			if st.CustomNumFmt != nil {
				custom = *st.CustomNumFmt
			}
			if st.NumFmt != c.numFmt || custom != c.custom {
				t.Errorf("%s!%s: number format %d %q, want %d %q", c.sheet, c.cell, st.NumFmt, custom, c.numFmt, c.custom)
			}
		}
	}
}

// TestXLSXLayout checks what makes a sheet easy to filter and pivot: the
// head frozen, no merged cell, widths between the bounds, fixed document
// times.
func TestXLSXLayout(t *testing.T) {
	b, err := bookReport().XLSX()
	if err != nil {
		t.Fatal(err)
	}
	wb := openBook(t, b)
	for _, sheet := range wb.GetSheetList() {
		p, err := wb.GetPanes(sheet)
		if err != nil {
			t.Fatal(err)
		}
		if !p.Freeze || p.YSplit != 1 || p.XSplit != 0 || p.TopLeftCell != "A2" {
			t.Errorf("%s: panes %+v, want the first row frozen", sheet, p)
		}
		merged, err := wb.GetMergeCells(sheet)
		if err != nil {
			t.Fatal(err)
		}
		if len(merged) > 0 {
			t.Errorf("%s: %d merged cells, want none", sheet, len(merged))
		}
		w, err := wb.GetColWidth(sheet, "A")
		if err != nil {
			t.Fatal(err)
		}
		if w < minColWidth || w > maxColWidth {
			t.Errorf("%s: column A is %g wide, want %d to %d", sheet, w, minColWidth, maxColWidth)
		}
	}
	// "new-contract" is 12 characters, + 1 of room for a label.
	if w, _ := wb.GetColWidth("events", "A"); w != 13 {
		t.Errorf("events column A is %g wide, want 13", w)
	}
	props, err := wb.GetDocProps()
	if err != nil {
		t.Fatal(err)
	}
	if props.Created != WorkbookTime || props.Modified != WorkbookTime {
		t.Errorf("document times %q, %q, want %q", props.Created, props.Modified, WorkbookTime)
	}
}

// TestXLSXSameBytes: the same report gives the same bytes.
func TestXLSXSameBytes(t *testing.T) {
	a, err := bookReport().XLSX()
	if err != nil {
		t.Fatal(err)
	}
	b, err := bookReport().XLSX()
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(a, b) {
		t.Error("two workbooks of the same report differ")
	}
}

func TestXLSXErrors(t *testing.T) {
	bad := (&Table{Head: []string{"period", "demand"}}).Typed(Label, Quantity)
	bad.AddRow("2027-01", "n/a")
	for _, c := range []struct {
		name string
		r    *Report
		want string
	}{
		{"not a number", &Report{Name: "plan", CSV: bad}, `report plan, sheet plan: row 2, column demand: "n/a" is not a number`},
		{"no table", &Report{Name: "check"}, "report check: no table to write into a workbook"},
	} {
		t.Run(c.name, func(t *testing.T) {
			_, err := c.r.XLSX()
			if err == nil || err.Error() != c.want {
				t.Errorf("error %v, want %q", err, c.want)
			}
		})
	}
}

func TestSheetName(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"plan", "plan"},
		{"track", "tracking"},
		{"track-rollups", "tracking-rollups"},
		{"track-summary", "tracking-summary"},
		{strings.Repeat("x", 40), strings.Repeat("x", 31)}, // a sheet name holds at most 31 characters (common practice)
	} {
		if got := SheetName(c.in); got != c.want {
			t.Errorf("SheetName(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}
