package data

import (
	"bytes"
	"encoding/csv"
	"testing"

	"github.com/xuri/excelize/v2"
)

// workbookOf writes the rows of a CSV file into a workbook's first sheet,
// numbers as numbers, with excelize's stream writer.
func workbookOf(b *testing.B, src []byte) []byte {
	b.Helper()
	rows, err := csv.NewReader(bytes.NewReader(src)).ReadAll()
	if err != nil {
		b.Fatal(err)
	}
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		b.Fatal(err)
	}
	for r, row := range rows {
		cells := make([]any, len(row))
		for i, c := range row {
			cells[i] = c
			if x, err := ParseDecimal(c); err == nil {
				cells[i] = x
			}
		}
		if err := sw.SetRow(CellName(1, r+1), cells); err != nil {
			b.Fatal(err)
		}
	}
	if err := sw.Flush(); err != nil {
		b.Fatal(err)
	}
	out, err := f.WriteToBuffer()
	if err != nil {
		b.Fatal(err)
	}
	return out.Bytes()
}

// BenchmarkReadWorkbookLong reads, as a workbook, the long history of 301
// series of 93 months that BenchmarkReadLong reads as CSV.
func BenchmarkReadWorkbookLong(b *testing.B) {
	src := workbookOf(b, longHistory(301, 93, true))
	opt := ReadOptions{Key: []string{"family", "product", "customer"}}
	b.SetBytes(int64(len(src)))
	b.ResetTimer()
	for b.Loop() {
		if _, err := ReadHistory(bytes.NewReader(src), "h.xlsx", opt); err != nil {
			b.Fatal(err)
		}
	}
}
