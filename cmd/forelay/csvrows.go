package main

import "forelay/scenario/report"

// csvTable turns rows, the head first, into the table of a CSV file.
func csvTable(rows [][]string) *report.Table {
	return &report.Table{Head: rows[0], Rows: rows[1:]}
}
