package report

import (
	"fmt"
	"math"
	"strconv"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// WorkbookTime is the creation and modification time written into every
// workbook's document properties: a fixed time, so that the same inputs
// give the same bytes.
const WorkbookTime = "2000-01-01T00:00:00Z"

// Number formats of the workbook's cells by Kind: built-in formats of the
// file format (4 is #,##0.00, 10 is 0.00%, 3 is #,##0) and one custom
// format for ratios.
const (
	numFmtQuantity = 4
	numFmtShare    = 10
	numFmtCount    = 3
	numFmtRatio    = "0.0000"
)

// Column widths of the workbook, in characters.
const (
	minColWidth = 8
	maxColWidth = 48
)

// XLSX returns the report's tables as a workbook (Office Open XML): one
// sheet per table, in order: the CSV table (named after the report, or
// "tracking" for track), each of MoreCSV, then each of MoreTables (the
// events and the accuracy). Each sheet has the table's head as a frozen
// first row with a filter, then one row per table row; cells of a number
// column (see Kind) are stored as numbers with a number format (two
// decimals for quantities, a percentage for shares and percentages, whole
// numbers for counts, four decimals for ratios), the others as text, and
// an empty cell or a number that is not finite (NaN) is left empty. Column
// widths follow the longest cell; no cell is merged. The document
// properties carry WorkbookTime, so the same report gives the same bytes.
//
// It returns an error when a cell of a number column is not a number (a
// bug in the report's builder) or when the workbook cannot be written.
func (r *Report) XLSX() ([]byte, error) {
	wb := excelize.NewFile()
	defer wb.Close()
	st, err := newSheetStyles(wb)
	if err != nil {
		return nil, err
	}
	var tables []CSVFile
	if r.CSV != nil {
		tables = append(tables, CSVFile{r.Name, r.CSV})
	}
	tables = append(tables, r.MoreCSV...)
	tables = append(tables, r.MoreTables...)
	if len(tables) == 0 {
		return nil, fmt.Errorf("report %s: no table to write into a workbook", r.Name)
	}
	for i, t := range tables {
		name := SheetName(t.Name)
		if i == 0 {
			err = wb.SetSheetName(wb.GetSheetName(0), name)
		} else {
			_, err = wb.NewSheet(name)
		}
		if err != nil {
			return nil, err
		}
		if err := writeSheet(wb, name, t.Table, st); err != nil {
			return nil, fmt.Errorf("report %s, sheet %s: %w", r.Name, name, err)
		}
	}
	wb.SetActiveSheet(0)
	if err := wb.SetDocProps(&excelize.DocProperties{Creator: "forelay", Title: r.Name, Created: WorkbookTime,
		Modified: WorkbookTime}); err != nil {
		return nil, err
	}
	buf, err := wb.WriteToBuffer()
	if err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// SheetName returns the name of the sheet of the table written as
// name.csv: name itself, but "tracking" for track's tables
// ("tracking-rollups" for track-rollups), cut to the 31 characters a
// sheet name may have.
func SheetName(name string) string {
	switch name {
	case "track":
		name = "tracking"
	case "track-rollups", "track-summary":
		name = "tracking" + name[len("track"):]
	}
	if utf8.RuneCountInString(name) > 31 {
		name = string([]rune(name)[:31])
	}
	return name
}

// sheetStyles are the workbook's style ids: the head's, and each number
// kind's.
type sheetStyles struct {
	head int
	kind map[Kind]int
}

func newSheetStyles(wb *excelize.File) (sheetStyles, error) {
	st := sheetStyles{kind: map[Kind]int{}}
	var err error
	if st.head, err = wb.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}}); err != nil {
		return st, err
	}
	ratio := numFmtRatio
	for _, k := range []struct {
		kind  Kind
		style excelize.Style
	}{
		{Quantity, excelize.Style{NumFmt: numFmtQuantity}},
		{Share, excelize.Style{NumFmt: numFmtShare}},
		{Percent, excelize.Style{NumFmt: numFmtShare}},
		{Count, excelize.Style{NumFmt: numFmtCount}},
		{Ratio, excelize.Style{CustomNumFmt: &ratio}},
	} {
		id, err := wb.NewStyle(&k.style)
		if err != nil {
			return st, err
		}
		st.kind[k.kind] = id
	}
	return st, nil
}

// writeSheet writes table t into sheet: the head, the rows, the number
// formats, the column widths, the frozen head and the filter.
func writeSheet(wb *excelize.File, sheet string, t *Table, st sheetStyles) error {
	width := make([]int, len(t.Head))
	for j, h := range t.Head {
		cell, _ := excelize.CoordinatesToCellName(j+1, 1)
		if err := wb.SetCellStr(sheet, cell, h); err != nil {
			return err
		}
		width[j] = utf8.RuneCountInString(h) + 2 // room for the filter button
	}
	for i, row := range t.Rows {
		for j, c := range row {
			if j >= len(t.Head) || c == "" {
				continue
			}
			if err := writeCell(wb, sheet, j+1, i+2, t.KindOf(j), c); err != nil {
				return fmt.Errorf("row %d, column %s: %w", i+2, t.Head[j], err)
			}
			width[j] = max(width[j], utf8.RuneCountInString(c)+numberPad(t.KindOf(j)))
		}
	}
	last, _ := excelize.CoordinatesToCellName(max(len(t.Head), 1), max(len(t.Rows)+1, 1))
	if err := wb.SetCellStyle(sheet, "A1", headEnd(len(t.Head)), st.head); err != nil {
		return err
	}
	for j := range t.Head {
		col, _ := excelize.ColumnNumberToName(j + 1)
		if id, ok := st.kind[t.KindOf(j)]; ok && len(t.Rows) > 0 {
			if err := wb.SetCellStyle(sheet, col+"2", col+strconv.Itoa(len(t.Rows)+1), id); err != nil {
				return err
			}
		}
		if err := wb.SetColWidth(sheet, col, col, float64(min(max(width[j], minColWidth), maxColWidth))); err != nil {
			return err
		}
	}
	if err := wb.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft",
		Selection: []excelize.Selection{{SQRef: "A2", ActiveCell: "A2", Pane: "bottomLeft"}}}); err != nil {
		return err
	}
	if err := wb.AutoFilter(sheet, "A1:"+last, nil); err != nil {
		return err
	}
	// Readers that size a sheet from its dimension see every row.
	return wb.SetSheetDimension(sheet, "A1:"+last)
}

// headEnd is the name of the head's last cell.
func headEnd(n int) string {
	c, _ := excelize.CoordinatesToCellName(max(n, 1), 1)
	return c
}

// numberPad is the room a number of kind k takes beyond its CSV text:
// thousands separators and the percent sign.
func numberPad(k Kind) int {
	switch k {
	case Quantity, Count:
		return 4
	case Share, Percent:
		return 2
	}
	return 1
}

// writeCell writes text c into the cell at column col and row row: as
// text for a Label, else as a number (a Percent divided by 100), left
// empty when not finite.
func writeCell(wb *excelize.File, sheet string, col, row int, k Kind, c string) error {
	cell, err := excelize.CoordinatesToCellName(col, row)
	if err != nil {
		return err
	}
	if k == Label {
		return wb.SetCellStr(sheet, cell, c)
	}
	v, err := strconv.ParseFloat(c, 64)
	if err != nil {
		return fmt.Errorf("%q is not a number", c)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	if k == Percent {
		v /= 100
	}
	return wb.SetCellFloat(sheet, cell, v, -1, 64)
}
