package plan

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"forelay/scenario/data"
)

// A portfolio's actuals read from a workbook (keyed long layout) and from
// a CSV file with semicolons and decimal commas are those of the same
// table as a plain CSV file, and so are the errors' places.
func TestPortfolioActualsSpreadsheets(t *testing.T) {
	key := []string{"family", "item"}
	want, err := tinyPortfolio(t).ReadActuals(strings.NewReader(tinyActuals), "actuals.csv", key)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	book := filepath.Join(dir, "actuals.xlsx")
	writeBook(t, book, tinyActuals)
	semi := filepath.Join(dir, "actuals-semi.csv")
	text := strings.NewReplacer(",", ";", "104", "104,0").Replace(tinyActuals)
	if err := os.WriteFile(semi, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		path   string
		format data.Format
	}{{book, data.Format{}}, {semi, data.Format{Decimal: data.DecimalComma}}} {
		got, err := tinyPortfolio(t).ReadActualsFile(c.path, key, c.format, data.SizeLimits{})
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(got.Values, want.Values) {
			t.Errorf("%s: values %v, want %v", c.path, got.Values, want.Values)
		}
	}

	// Without a/x's first row, its first actual comes after the plan's
	// first period: the error is at the period cell (column C) of a/x's
	// first row left, row 5 (header, a/y, b/z, c/w, then a/x).
	late := filepath.Join(dir, "late.xlsx")
	writeBook(t, late, strings.Replace(tinyActuals, "a,x,2027-01,104\n", "", 1))
	_, err = tinyPortfolio(t).ReadActualsFile(late, key, data.Format{}, data.SizeLimits{})
	if err == nil || !strings.Contains(err.Error(), "late.xlsx: sheet Sheet1, cell C5: period: ") {
		t.Errorf("error %v, want one at sheet Sheet1, cell C5", err)
	}
}

// writeBook writes the rows of a CSV text into a workbook's first sheet,
// numbers as numbers.
func writeBook(t *testing.T, path, text string) {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	for r, line := range strings.Split(strings.TrimSpace(text), "\n") {
		for c, cell := range strings.Split(line, ",") {
			var v any = cell
			if x, err := data.ParseDecimal(cell); err == nil {
				v = x
			}
			if err := f.SetCellValue("Sheet1", data.CellName(c+1, r+1), v); err != nil {
				t.Fatal(err)
			}
		}
	}
	if err := f.SaveAs(path); err != nil {
		t.Fatal(err)
	}
}
