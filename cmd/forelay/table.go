package main

import (
	"io"

	"forelay/scenario/report"
)

// table is a text table (see report.Table).
type table = report.Table

func newTable(head ...string) *table { return report.NewTable(head...) }

// writeTable adds t to w when w is a report's text, and writes it laid out
// otherwise.
func writeTable(w io.Writer, t *table) error {
	if tw, ok := w.(*report.Text); ok {
		tw.Add(t)
		return nil
	}
	var tw report.Text
	tw.Add(t)
	_, err := io.WriteString(w, tw.String())
	return err
}
