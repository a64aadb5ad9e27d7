package main

import (
	"encoding/csv"
	"os"
	"strings"
	"time"

	"github.com/rogpeppe/go-internal/testscript"
	"github.com/xuri/excelize/v2"

	"forelay/scenario/data"
)

// scriptCmds are the commands the end-to-end scripts have besides the
// built-in ones.
var scriptCmds = map[string]func(ts *testscript.TestScript, neg bool, args []string){
	"xlsx": cmdXLSX,
}

// cmdXLSX writes a workbook, so that scripts need no binary file:
//
//	xlsx OUT.xlsx SHEET FILE.csv [SHEET FILE.csv ...]
//
// Each CSV file becomes a sheet of that name. A cell that is a plain
// decimal number is stored as a number; "day:2026-01-15" as a spreadsheet
// date shown as a day (yyyy-mm-dd) and "month:2026-01" as the date of the
// month's first day shown as a month (mmm yyyy); anything else as text.
func cmdXLSX(ts *testscript.TestScript, neg bool, args []string) {
	if neg {
		ts.Fatalf("unsupported: ! xlsx")
	}
	if len(args) < 3 || len(args)%2 == 0 {
		ts.Fatalf("usage: xlsx OUT.xlsx SHEET FILE.csv [SHEET FILE.csv ...]")
	}
	f := excelize.NewFile()
	defer f.Close()
	day, err := f.NewStyle(&excelize.Style{NumFmt: 14})
	ts.Check(err)
	monthFmt := "mmm yyyy"
	month, err := f.NewStyle(&excelize.Style{CustomNumFmt: &monthFmt})
	ts.Check(err)
	for i := 1; i < len(args); i += 2 {
		sheet := args[i]
		if i == 1 {
			ts.Check(f.SetSheetName("Sheet1", sheet))
		} else {
			_, err := f.NewSheet(sheet)
			ts.Check(err)
		}
		src, err := os.ReadFile(ts.MkAbs(args[i+1]))
		ts.Check(err)
		cr := csv.NewReader(strings.NewReader(string(src)))
		cr.FieldsPerRecord = -1
		rows, err := cr.ReadAll()
		ts.Check(err)
		for r, row := range rows {
			for c, text := range row {
				if text == "" {
					continue
				}
				cell := data.CellName(c+1, r+1)
				switch {
				case strings.HasPrefix(text, "day:"), strings.HasPrefix(text, "month:"):
					layout, style := "2006-01-02", day
					if strings.HasPrefix(text, "month:") {
						layout, style = "2006-01", month
					}
					t, err := time.Parse(layout, text[strings.Index(text, ":")+1:])
					ts.Check(err)
					// Days since 30 December 1899: the 1900 date system.
					ts.Check(f.SetCellValue(sheet, cell, t.Sub(time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC)).Hours()/24))
					ts.Check(f.SetCellStyle(sheet, cell, cell, style))
				default:
					var v any = text
					if x, err := data.ParseDecimal(text); err == nil {
						v = x
					}
					ts.Check(f.SetCellValue(sheet, cell, v))
				}
			}
		}
	}
	ts.Check(f.SaveAs(ts.MkAbs(args[0])))
}
