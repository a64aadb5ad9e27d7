package main

import (
	"bytes"
	"encoding/csv"
)

// encodeCSV writes rows as CSV and returns the bytes, or the first error
// the CSV writer reports (a Write error, or Error after Flush).
func encodeCSV(rows [][]string) ([]byte, error) {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	for _, r := range rows {
		if err := w.Write(r); err != nil {
			return nil, err
		}
	}
	w.Flush()
	if err := w.Error(); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}
