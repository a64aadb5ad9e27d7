package data

import (
	"errors"
	"fmt"
	"strings"
)

// ErrBadKey is returned (wrapped) when a key cell of a long file read with
// ReadOptions.Key holds a "/", which separates the levels of a series name.
var ErrBadKey = errors.New("bad series key")

// readKeyHeader reads the header of a long file whose series are named by
// the columns of ReadOptions.Key (see "Composite keys"). first maps each
// lower-case header text to the index of its first cell.
func (hr *historyReader) readKeyHeader(cells []cell, first map[string]int) error {
	at := cell{line: cells[0].line, col: 1}
	for _, need := range []string{"period", "value"} {
		if _, ok := first[need]; !ok {
			return hr.errAt(at, "", fmt.Errorf("%w: no %s column; a file read with a key (%s) is in the long layout, with the columns %s, period and value",
				ErrMissingColumn, need, strings.Join(hr.opt.Key, ", "), strings.Join(hr.opt.Key, ", ")))
		}
	}
	seen := map[string]bool{}
	for _, k := range hr.opt.Key {
		lk := strings.ToLower(strings.TrimSpace(k))
		switch {
		case lk == "period" || lk == "value":
			return hr.errAt(at, "", fmt.Errorf("%w: the key names the %s column; name the columns that make the series name", ErrDuplicateColumn, lk))
		case seen[lk]:
			return hr.errAt(at, "", fmt.Errorf("%w: the key names column %q twice", ErrDuplicateColumn, k))
		}
		seen[lk] = true
		i, ok := first[lk]
		if !ok {
			return hr.errAt(at, "", fmt.Errorf("%w: no key column %q in the header", ErrMissingColumn, k))
		}
		hr.keyCols = append(hr.keyCols, i)
		hr.keyFields = append(hr.keyFields, cells[i].text)
	}
	for _, key := range append([]string{"period", "value"}, hr.opt.Key...) {
		lk := strings.ToLower(strings.TrimSpace(key))
		for _, c := range cells[first[lk]+1:] {
			if strings.EqualFold(c.text, lk) {
				return hr.errAt(c, "", fmt.Errorf("%w: %q is already column %d", ErrDuplicateColumn, c.text, first[lk]+1))
			}
		}
	}
	hr.long = true
	hr.header = cells
	hr.seriesCol, hr.periodCol, hr.valueCol = hr.keyCols[0], first["period"], first["value"]
	hr.seriesField = hr.keyFields[0]
	hr.periodField = cells[hr.periodCol].text
	hr.valueField = cells[hr.valueCol].text
	return nil
}

// checkKeyCell checks key cell i of a row: a level of the series name.
func (hr *historyReader) checkKeyCell(c cell, i int) error {
	switch {
	case c.text == "":
		return hr.errAt(c, hr.keyFields[i], fmt.Errorf("%w: no %s (a level of the series name)", ErrEmptyCell, hr.keyFields[i]))
	case strings.Contains(c.text, "/"):
		return hr.errAt(c, hr.keyFields[i], fmt.Errorf("%w: %q holds a /, which separates the levels of a series name", ErrBadKey, c.text))
	}
	return nil
}

// appendKey appends a series name to b: the trimmed key cells of a row,
// in key order, joined by "/".
func appendKey(b []byte, keys []string) []byte {
	for i, k := range keys {
		if i > 0 {
			b = append(b, '/')
		}
		b = append(b, k...)
	}
	return b
}
