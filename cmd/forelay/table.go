package main

import (
	"io"
	"strings"
	"unicode/utf8"
)

// table is a plain-text table: the first column left-aligned (labels), the
// others right-aligned (numbers) unless leftCols says otherwise. Columns
// are separated by two spaces; trailing spaces are trimmed.
type table struct {
	head     []string
	rows     [][]string
	leftCols map[int]bool
}

func newTable(head ...string) *table {
	return &table{head: head, leftCols: map[int]bool{0: true}}
}

// left marks columns to align left.
func (t *table) left(cols ...int) *table {
	for _, c := range cols {
		t.leftCols[c] = true
	}
	return t
}

func (t *table) add(cells ...string) { t.rows = append(t.rows, cells) }

func (t *table) write(w io.Writer) error {
	width := make([]int, len(t.head))
	all := append([][]string{t.head}, t.rows...)
	for _, r := range all {
		for i, c := range r {
			if i < len(width) {
				width[i] = max(width[i], utf8.RuneCountInString(c))
			}
		}
	}
	var b strings.Builder
	for _, r := range all {
		var line strings.Builder
		for i := range width {
			c := ""
			if i < len(r) {
				c = r[i]
			}
			pad := strings.Repeat(" ", width[i]-utf8.RuneCountInString(c))
			if i > 0 {
				line.WriteString("  ")
			}
			if t.leftCols[i] {
				line.WriteString(c + pad)
			} else {
				line.WriteString(pad + c)
			}
		}
		b.WriteString(strings.TrimRight(line.String(), " "))
		b.WriteByte('\n')
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// plural returns one when n is 1 and many otherwise.
func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
