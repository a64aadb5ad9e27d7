package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"forelay/scenario/data"
)

// sheetsHistory is a wide history of 14 months, invented.
const sheetsHistory = "period,bottled-l,yoghurt\n2025-01,120,40\n2025-02,131,43\n2025-03,128,42\n2025-04,135,45\n2025-05,140,46\n" +
	"2025-06,152,50\n2025-07,160,53\n2025-08,158,52\n2025-09,149,49\n2025-10,141,47\n2025-11,133,44\n2025-12,129,43\n2026-01,126,n/a\n2026-02,137,45\n"

// bookOf writes the rows of a CSV text into a workbook with one sheet,
// numbers stored as numbers.
func bookOf(t *testing.T, sheet, text string) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetSheetName("Sheet1", sheet); err != nil {
		t.Fatal(err)
	}
	for r, line := range strings.Split(strings.TrimSpace(text), "\n") {
		for c, cell := range strings.Split(line, ",") {
			var v any = cell
			if x, err := data.ParseDecimal(cell); err == nil {
				v = x
			}
			if err := f.SetCellValue(sheet, data.CellName(c+1, r+1), v); err != nil {
				t.Fatal(err)
			}
		}
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

// Every mistake in a spreadsheet input is an input error: exit code 2,
// with the file and the place in the message.
func TestSpreadsheetInputErrors(t *testing.T) {
	const events = "plan: p\nhistory: {file: h.csv, series: bottled-l}\nhorizon: 3\nbaseline: {method: naive}\nevents-file: deals.csv\n"
	good := strings.ReplaceAll(sheetsHistory, "n/a", "42")
	tests := []struct {
		name  string
		files map[string][]byte
		args  []string
		msg   string
	}{
		{"cell of a sheet", map[string][]byte{"h.xlsx": bookOf(t, "demand", sheetsHistory)},
			[]string{"fit", "--history", "h.xlsx", "--method", "naive"}, `h.xlsx: sheet demand, cell C14: yoghurt: not a plain decimal number: "n/a"`},
		{"no such sheet", map[string][]byte{"h.xlsx": bookOf(t, "demand", good)},
			[]string{"fit", "--history", "h.xlsx", "--sheet", "sales", "--method", "naive"}, `h.xlsx: cannot read the file this way: no sheet "sales"; the workbook has "demand"`},
		{"decimal comma, comma separator", map[string][]byte{"h.csv": []byte(good)},
			[]string{"fit", "--history", "h.csv", "--decimal", "comma", "--method", "naive"}, "separated by commas"},
		{"thousands", map[string][]byte{"h.csv": []byte(strings.Replace(good, "2025-02,131,", "2025-02,\"1,131\",", 1))},
			[]string{"fit", "--history", "h.csv", "--method", "naive"}, `h.csv:3:9: bottled-l: not a plain decimal number: "1,131"; if the comma separates thousands, write 1131`},
		{"bad --decimal", map[string][]byte{"h.csv": []byte(good)},
			[]string{"fit", "--history", "h.csv", "--decimal", "dot"}, `--decimal: unknown decimal mark "dot"`},
		{"events file, CSV", map[string][]byte{"h.csv": []byte(good), "p.yaml": []byte(events),
			"deals.csv": []byte("id,kind,start,units\nbig-order,stepp,2026-04,10\n")},
			[]string{"check", "p.yaml"}, `deals.csv:2:11: event "big-order": kind: unknown kind "stepp"; want step or pulse; did you mean step?`},
		{"events file, workbook", map[string][]byte{"h.csv": []byte(good), "p.yaml": []byte(strings.Replace(events, "deals.csv", "deals.xlsx", 1)),
			"deals.xlsx": bookOf(t, "deals", "id,kind,start,units,probability\nbig-order,step,2026-04,10,80\n")},
			[]string{"plan", "p.yaml"}, `deals.xlsx: sheet deals, cell E2: event "big-order": probability: must be in [0, 1], got 80`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			for name, b := range tc.files {
				if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
					t.Fatal(err)
				}
			}
			t.Chdir(dir)
			var stdout, stderr bytes.Buffer
			code := run(tc.args, &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow)
			if code != exitInput {
				t.Errorf("exit code %d, want %d; stderr:\n%s", code, exitInput, stderr.String())
			}
			if !strings.Contains(stderr.String(), tc.msg) {
				t.Errorf("stderr\n%s\ndoes not contain\n%s", stderr.String(), tc.msg)
			}
		})
	}
}
