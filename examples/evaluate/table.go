package main

import (
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// textTable is a table of cells printed with the first column left-aligned
// and the others right-aligned, two spaces apart.
type textTable struct {
	rows [][]string
}

// add appends one row.
func (t *textTable) add(cells ...string) { t.rows = append(t.rows, cells) }

// write prints the table, a rule of dashes under the first row.
func (t *textTable) write(w io.Writer) error {
	var width []int
	for _, r := range t.rows {
		for j, c := range r {
			if j >= len(width) {
				width = append(width, 0)
			}
			width[j] = max(width[j], utf8.RuneCountInString(c))
		}
	}
	var b strings.Builder
	for i, r := range t.rows {
		for j, c := range r {
			pad := strings.Repeat(" ", width[j]-utf8.RuneCountInString(c))
			switch {
			case j == 0:
				b.WriteString(c + pad)
			default:
				b.WriteString("  " + pad + c)
			}
		}
		b.WriteString("\n")
		if i == 0 {
			total := 0
			for _, wd := range width {
				total += wd + 2
			}
			b.WriteString(strings.Repeat("-", total-2) + "\n")
		}
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// pct formats a share as a percentage with one decimal, or "-" when there
// is nothing behind it.
func pct(share float64, n int) string {
	if n == 0 {
		return "-"
	}
	return fmt.Sprintf("%.1f", 100*share)
}

// num3 formats a mean with three decimals, or "-" when there is nothing
// behind it.
func num3(x float64, n int) string {
	if n == 0 {
		return "-"
	}
	return fmt.Sprintf("%.3f", x)
}
