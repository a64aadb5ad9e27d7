package data

import (
	"errors"
	"forelay/forecast"
	"strings"
	"testing"
)

// The expected series are read off the inputs by hand: the name is the key
// cells joined by "/", the values those of the rows, in file order.
func TestReadHistoryKey(t *testing.T) {
	tests := []struct {
		name  string
		input string
		opt   ReadOptions
		want  []wantSeries
	}{
		{
			name: "three levels, key columns out of header order, extra series column",
			input: "period,Customer,value,family,product,series\n" +
				"2026-01, grocer-north ,120,milk,whole-1l,ignored\n" +
				"2026-01,grocer-south,80,milk,whole-1l,\n" +
				"2026-02,grocer-north,131,milk,whole-1l,\n" +
				"2026-02,grocer-south,82,milk,whole-1l,\n",
			opt: ReadOptions{Key: []string{"family", "product", "customer"}},
			want: []wantSeries{
				{"milk/whole-1l/grocer-north", "2026-01", []float64{120, 131}},
				{"milk/whole-1l/grocer-south", "2026-01", []float64{80, 82}},
			},
		},
		{
			name:  "one key column",
			input: "sku,period,value\nbutter-250g,2026-Q1,7\nbutter-250g,2026-Q2,9\n",
			opt:   ReadOptions{Key: []string{"sku"}},
			want:  []wantSeries{{"butter-250g", "2026-Q1", []float64{7, 9}}},
		},
		{
			// Without a key the series column's names are paths as they are.
			name:  "paths in the series column",
			input: "series,period,value\ncream/pot-200ml,2026-01,4\ncream/pot-200ml,2026-02,5\n",
			want:  []wantSeries{{"cream/pot-200ml", "2026-01", []float64{4, 5}}},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			h, err := ReadHistory(strings.NewReader(tc.input), "h.csv", tc.opt)
			if err != nil {
				t.Fatal(err)
			}
			freq := h.Series[0].Freq()
			checkHistory(t, h, "long", freq, tc.want, nil, 0)
		})
	}
}

func TestReadHistoryKeyErrors(t *testing.T) {
	key := ReadOptions{Key: []string{"family", "product"}}
	tests := []struct {
		name  string
		input string // with a position marker, see mark
		opt   ReadOptions
		want  error
		field string
		msg   string
	}{
		{
			// encoding/csv, with TrimLeadingSpace, places a cell after its leading spaces.
			name:  "empty key cell",
			input: "family,product,period,value\nmilk,whole-1l,2026-01,1\nmilk, §,2026-02,2\n",
			opt:   key, want: ErrEmptyCell, field: "product", msg: "no product",
		},
		{
			name:  "slash in a key cell",
			input: "family,product,period,value\nmilk,§whole/1l,2026-01,1\n",
			opt:   key, want: ErrBadKey, field: "product", msg: `"whole/1l" holds a /`,
		},
		{
			// The label comes first in the row, so it is reported first.
			name:  "earliest cell first",
			input: "period,family,product,value\n§2026-13,,whole-1l,1\n",
			opt:   key, want: forecast.ErrBadPeriod, field: "period",
		},
		{
			// The key lists family first, but product is the leftmost
			// bad cell of the row.
			name:  "key cells checked in column order",
			input: "product,family,period,value\n§whole/1l,,2026-01,1\n",
			opt:   key, want: ErrBadKey, field: "product",
		},
		{
			// The value comes before the key cells in the row.
			name:  "value before the key cells",
			input: "period,value,family,product\n2026-01,§1_000,,whole/1l\n",
			opt:   key, want: ErrBadNumber, field: "value",
		},
		{
			name:  "missing key column",
			input: "§family,period,value\nmilk,2026-01,1\n",
			opt:   key, want: ErrMissingColumn, msg: `no key column "product"`,
		},
		{
			name:  "wide file read with a key",
			input: "§period,milk,cream\n2026-01,1,2\n",
			opt:   key, want: ErrMissingColumn, msg: "no value column",
		},
		{
			name:  "key names the period column",
			input: "§family,period,value\nmilk,2026-01,1\n",
			opt:   ReadOptions{Key: []string{"family", "Period"}}, want: ErrDuplicateColumn, msg: "names the period column",
		},
		{
			name:  "key names a column twice",
			input: "§family,period,value\nmilk,2026-01,1\n",
			opt:   ReadOptions{Key: []string{"family", "FAMILY"}}, want: ErrDuplicateColumn, msg: `column "FAMILY" twice`,
		},
		{
			name:  "key column repeated in the header",
			input: "family,product,period,value,§Product\nmilk,whole-1l,2026-01,1,x\n",
			opt:   key, want: ErrDuplicateColumn, msg: `"Product" is already column 2`,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			input, line, col := mark(tc.input)
			_, err := ReadHistory(strings.NewReader(input), "h.csv", tc.opt)
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v (%T) is not a *ParseError", err, err)
			}
			if !errors.Is(err, tc.want) {
				t.Errorf("error %q does not wrap %q", err, tc.want)
			}
			if pe.Line != line || pe.Column != col {
				t.Errorf("error at %d:%d, want %d:%d (%v)", pe.Line, pe.Column, line, col, err)
			}
			if pe.Field != tc.field {
				t.Errorf("Field = %q, want %q", pe.Field, tc.field)
			}
			if !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("error %q does not contain %q", err, tc.msg)
			}
		})
	}
}
