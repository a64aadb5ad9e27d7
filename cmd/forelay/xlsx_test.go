package main

import (
	"bytes"
	"encoding/csv"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"forelay/scenario/report"
)

// Columns of the CSV files by what the workbook must make of them; every
// other column holds quantities. The lists are written out here rather
// than taken from package report, so that a column typed wrongly there
// fails this test.
var (
	// xlsxText are the columns kept as text (names, periods, verdicts).
	xlsxText = map[string]bool{"scenario": true, "series": true, "period": true, "resource": true, "level": true,
		"group": true, "peak_period": true, "p90_peak_period": true, "prebuild_before": true, "verdict": true, "rules": true}
	// xlsxShare are probabilities and utilisations: the 0.00% format.
	xlsxShare = map[string]bool{"p_breach": true, "util_p50": true, "util_p90": true, "p_short": true, "utilisation": true,
		"breach_probability": true}
	// xlsxCount are whole numbers: the #,##0 format.
	xlsxCount = map[string]bool{"rank": true, "members": true, "periods": true}
	// xlsxRatio are numbers without a unit: the 0.0000 format.
	xlsxRatio = map[string]bool{"tracking_signal": true, "sigmas": true}
)

// xlsxColumn returns how the workbook holds CSV column name: as text, or
// as a number with the number format (built-in id, or custom code) and
// the factor from the CSV's number to the cell's (change_pct is in
// points, the cell a fraction).
func xlsxColumn(name string) (text bool, numFmt int, custom string, scale float64) {
	switch {
	case xlsxText[name] || strings.HasSuffix(name, "_prebuild_before"):
		return true, 0, "", 0
	case name == "change_pct":
		return false, 10, "", 0.01
	case xlsxShare[name] || strings.HasSuffix(name, "_breach_probability"):
		return false, 10, "", 1
	case xlsxCount[name]:
		return false, 3, "", 1
	case xlsxRatio[name]:
		return false, 0, "0.0000", 1
	}
	return false, 4, "", 1
}

// xlsxRuns are the command lines whose workbook is read back; OUT stands
// for the --out directory. sheets are the workbook's sheets in order.
var xlsxRuns = []struct {
	name, command string
	args          []string
	sheets        string
	portfolio     bool
}{
	{"plan-dairy", "plan", []string{"../../examples/dairy/plan.yaml"}, "plan,events,accuracy", false},
	{"compare-dairy", "compare", []string{"../../examples/dairy/plan.yaml", "--paths", "2000"}, "compare,events,accuracy", false},
	{"stress-dairy", "stress", []string{"../../examples/dairy/plan.yaml", "--paths", "2000"}, "stress,events,accuracy", false},
	{"buffer-dairy", "buffer", []string{"../../examples/dairy/plan.yaml", "--scenario", "with-contract", "--paths", "2000"},
		"buffer,events,accuracy", false},
	{"track-dairy", "track", []string{"../../examples/dairy/plan.yaml", "--actuals", "../../examples/dairy/actuals.csv",
		"--scenario", "with-contract"}, "tracking,accuracy", false},
	{"plan-portfolio", "plan", []string{"../../examples/portfolio/plan.yaml"}, "plan,rollup,summary,resources,events,accuracy", true},
	{"stress-portfolio", "stress", []string{"../../examples/portfolio/plan.yaml", "--paths", "1000"}, "stress,events,accuracy", true},
	{"compare-portfolio", "compare", []string{"../../examples/portfolio/plan.yaml", "--paths", "500"}, "compare,events,accuracy", true},
	{"track-portfolio", "track", []string{"../../examples/portfolio/plan.yaml", "--actuals", "../../examples/portfolio/actuals.csv",
		"--scenario", "committed"}, "tracking,tracking-rollups,tracking-summary,accuracy", true},
}

// TestXLSXMatchesCSV runs each command with --xlsx, reads the workbook
// back and compares every cell of every sheet with the CSV file written
// in the same run: the same text, or the same number (to 1e-9, the CSV
// holding at most four decimals) with the number format of its column;
// an empty CSV cell is an empty cell. Every sheet has its head frozen and
// no merged cell.
func TestXLSXMatchesCSV(t *testing.T) {
	for _, r := range xlsxRuns {
		t.Run(r.name, func(t *testing.T) {
			if r.portfolio && testing.Short() {
				t.Skip("plans 301 series")
			}
			dir := filepath.Join(t.TempDir(), "out")
			xlsxRun(t, r.command, append(r.args, "--xlsx", "--out", dir))
			wb := openWorkbook(t, filepath.Join(dir, r.command+".xlsx"))
			if got := strings.Join(wb.GetSheetList(), ","); got != r.sheets {
				t.Fatalf("sheets %s, want %s", got, r.sheets)
			}
			csvs, _ := filepath.Glob(filepath.Join(dir, "*.csv"))
			if len(csvs) == 0 {
				t.Fatal("no CSV file written")
			}
			for _, path := range csvs {
				sheet := report.SheetName(strings.TrimSuffix(filepath.Base(path), ".csv"))
				compareSheet(t, wb, sheet, readCSVFile(t, path))
			}
			for _, sheet := range wb.GetSheetList() {
				checkSheetLayout(t, wb, sheet)
				if rows, err := wb.GetRows(sheet); err != nil || len(rows) < 2 {
					t.Errorf("sheet %s: %d rows (%v), want a head and at least one row", sheet, len(rows), err)
				}
			}
		})
	}
}

// compareSheet compares sheet, cell by cell, with the CSV records.
func compareSheet(t *testing.T, wb *excelize.File, sheet string, records [][]string) {
	t.Helper()
	rows, err := wb.GetRows(sheet, excelize.Options{RawCellValue: true})
	if err != nil {
		t.Fatalf("sheet %s: %v", sheet, err)
	}
	if len(rows) != len(records) {
		t.Fatalf("sheet %s has %d rows, the CSV file %d", sheet, len(rows), len(records))
	}
	head := records[0]
	checked := 0
	for i, rec := range records {
		for j, want := range rec {
			cell, _ := excelize.CoordinatesToCellName(j+1, i+1)
			got := ""
			if j < len(rows[i]) {
				got = rows[i][j]
			}
			typ, err := wb.GetCellType(sheet, cell)
			if err != nil {
				t.Fatal(err)
			}
			text, numFmt, custom, scale := xlsxColumn(head[j])
			switch {
			case i == 0 || text:
				if got != want || (want != "" && typ != excelize.CellTypeSharedString) {
					t.Errorf("%s!%s = %q (type %v), CSV %q", sheet, cell, got, typ, want)
				}
			case want == "":
				if got != "" {
					t.Errorf("%s!%s = %q, CSV empty", sheet, cell, got)
				}
			default:
				w, err := strconv.ParseFloat(want, 64)
				if err != nil {
					t.Fatalf("%s: column %s, row %d: %q is not a number", sheet, head[j], i+1, want)
				}
				g, err := strconv.ParseFloat(got, 64)
				if err != nil || (typ != excelize.CellTypeUnset && typ != excelize.CellTypeNumber) || math.Abs(g-w*scale) > 1e-9 {
					t.Errorf("%s!%s (%s) = %q (type %v), CSV %q", sheet, cell, head[j], got, typ, want)
					continue
				}
				checkNumFmt(t, wb, sheet, cell, head[j], numFmt, custom)
				checked++
			}
		}
	}
	if checked == 0 {
		t.Errorf("sheet %s: no number compared", sheet)
	}
}

// checkNumFmt checks the number format of a cell; the ids are the
// built-in formats of the file format (ECMA-376 part 1, 18.8.30): 4 is
// #,##0.00, 10 is 0.00%, 3 is #,##0.
func checkNumFmt(t *testing.T, wb *excelize.File, sheet, cell, col string, numFmt int, custom string) {
	t.Helper()
	id, err := wb.GetCellStyle(sheet, cell)
	if err != nil {
		t.Fatal(err)
	}
	st, err := wb.GetStyle(id)
	if err != nil {
		t.Fatal(err)
	}
	got := ""
	if st.CustomNumFmt != nil {
		got = *st.CustomNumFmt
	}
	if st.NumFmt != numFmt || got != custom {
		t.Errorf("%s!%s (%s): number format %d %q, want %d %q", sheet, cell, col, st.NumFmt, got, numFmt, custom)
	}
}

// checkSheetLayout checks that the head row is frozen and no cell merged.
func checkSheetLayout(t *testing.T, wb *excelize.File, sheet string) {
	t.Helper()
	p, err := wb.GetPanes(sheet)
	if err != nil {
		t.Fatal(err)
	}
	if !p.Freeze || p.YSplit != 1 || p.XSplit != 0 {
		t.Errorf("sheet %s: panes %+v, want the head row frozen", sheet, p)
	}
	merged, err := wb.GetMergeCells(sheet)
	if err != nil {
		t.Fatal(err)
	}
	if len(merged) != 0 {
		t.Errorf("sheet %s: %d merged cells, want none", sheet, len(merged))
	}
}

// TestXLSXSameBytes runs the same command twice (for a portfolio with 1
// and with 2 workers) and compares the workbooks byte for byte.
func TestXLSXSameBytes(t *testing.T) {
	for _, c := range []struct {
		name, command string
		a, b          []string
		portfolio     bool
	}{
		{"plan-dairy", "plan", []string{"../../examples/dairy/plan.yaml"}, []string{"../../examples/dairy/plan.yaml"}, false},
		{"stress-dairy", "stress", []string{"../../examples/dairy/plan.yaml", "--paths", "2000"},
			[]string{"../../examples/dairy/plan.yaml", "--paths", "2000", "--workers", "1"}, false},
		{"track-dairy", "track", []string{"../../examples/dairy/plan.yaml", "--actuals", "../../examples/dairy/actuals.csv", "--scenario", "with-contract"},
			[]string{"../../examples/dairy/plan.yaml", "--actuals", "../../examples/dairy/actuals.csv", "--scenario", "with-contract"}, false},
		{"plan-portfolio", "plan", []string{"../../examples/portfolio/plan.yaml", "--workers", "1"},
			[]string{"../../examples/portfolio/plan.yaml", "--workers", "2"}, true},
	} {
		t.Run(c.name, func(t *testing.T) {
			if c.portfolio && testing.Short() {
				t.Skip("plans 301 series twice")
			}
			var books [2][]byte
			for i, args := range [][]string{c.a, c.b} {
				dir := filepath.Join(t.TempDir(), "out")
				xlsxRun(t, c.command, append(args, "--xlsx", "--out", dir))
				b, err := os.ReadFile(filepath.Join(dir, c.command+".xlsx"))
				if err != nil {
					t.Fatal(err)
				}
				books[i] = b
			}
			if !bytes.Equal(books[0], books[1]) {
				t.Errorf("%s.xlsx differs between two runs (%d and %d bytes)", c.command, len(books[0]), len(books[1]))
			}
		})
	}
}

// TestXLSXNeedsOut: --xlsx without --out is a flag error on every command
// that takes it.
func TestXLSXNeedsOut(t *testing.T) {
	for _, args := range [][]string{
		{"plan", "plan.yaml", "--xlsx"},
		{"stress", "plan.yaml", "--xlsx"},
		{"compare", "plan.yaml", "--xlsx"},
		{"buffer", "plan.yaml", "--xlsx"},
		{"track", "plan.yaml", "--actuals", "a.csv", "--xlsx"},
	} {
		var stdout, stderr bytes.Buffer
		code := run(args, &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow)
		want := "forelay: --xlsx writes DIR/" + args[0] + ".xlsx beside the other output files: add --out DIR\n"
		if code != exitInput || !strings.HasPrefix(stderr.String(), want) {
			t.Errorf("%v: exit %d, stderr %q; want exit %d and %q", args, code, stderr.String(), exitInput, want)
		}
	}
}

// xlsxRun runs forelay command with args (and --no-chart, but for track,
// which has no such flag) and fails the test unless it exits with 0.
func xlsxRun(t *testing.T, command string, args []string) {
	t.Helper()
	if command != "track" {
		args = append(args, "--no-chart")
	}
	var stdout, stderr bytes.Buffer
	if code := run(append([]string{command}, args...), &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow); code != 0 {
		t.Fatalf("forelay %s: exit %d\n%s", command, code, stderr.String())
	}
}

func openWorkbook(t *testing.T, path string) *excelize.File {
	t.Helper()
	wb, err := excelize.OpenFile(path)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { wb.Close() })
	return wb
}

func readCSVFile(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	records, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return records
}
