package scenario

import (
	"errors"
	"fmt"
	"reflect"
	"strings"
	"testing"

	"forelay/scenario/data"
)

// history wraps a history block in the smallest valid file.
func history(block string) string { return "plan: p\nhistory: " + block + "\nhorizon: 3\n" }

func TestParseSelection(t *testing.T) {
	for _, tc := range []struct {
		name   string
		block  string
		series string
		sel    []Selector
		key    []string
		levels []string
	}{
		{"one name, as before", "{file: h.csv, series: milk/whole-1l}", "milk/whole-1l", nil, nil, nil},
		// Positions: "history: " is 9 bytes, so the flow mapping opens at
		// column 10 of line 2 and each value's column is counted from there.
		{"one pattern", "{file: h.csv, series: 'milk/**'}", "", []Selector{{"milk/**", Pos{Line: 2, Column: 32}}}, nil, nil},
		{"a list", "{file: h.csv, series: [milk/whole-1l, '*/skim-*']}", "",
			[]Selector{{"milk/whole-1l", Pos{Line: 2, Column: 33}}, {"*/skim-*", Pos{Line: 2, Column: 48}}}, nil, nil},
		{"key and levels", "{file: h.csv, key: [family, product], levels: [family, product]}", "", nil,
			[]string{"family", "product"}, []string{"family", "product"}},
		{"key trimmed", "{file: h.csv, key: [' Family ']}", "", nil, []string{"Family"}, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Parse(strings.NewReader(history(tc.block)), "plan.yaml")
			if err != nil {
				t.Fatal(err)
			}
			h := f.History
			if h.Series != tc.series || !reflect.DeepEqual(h.Select, tc.sel) ||
				!reflect.DeepEqual(h.Key, tc.key) || !reflect.DeepEqual(h.Levels, tc.levels) {
				t.Errorf("got series %q select %v key %q levels %q; want %q %v %q %q",
					h.Series, h.Select, h.Key, h.Levels, tc.series, tc.sel, tc.key, tc.levels)
			}
		})
	}
}

func TestParseSelectionErrors(t *testing.T) {
	for _, tc := range []struct {
		name  string
		block string // § marks the expected position
		kind  error
		want  string
	}{
		{"series mapping", "{file: h.csv, series: §{a: b}}", ErrType, "history.series: want a series name, a pattern or a list of them, got a mapping"},
		{"series empty list", "{file: h.csv, series: §[]}", ErrValue, "history.series: an empty list"},
		{"series item not text", "{file: h.csv, series: [a, §[b]]}", ErrType, "history.series[1]: want a series name or pattern, got a list"},
		{"series empty level", "{file: h.csv, series: [a, §'milk//*']}", ErrValue, `history.series[1]: bad series pattern: "milk//*" has an empty level (level 2)`},
		{"series bad **", "{file: h.csv, series: §'milk**'}", ErrValue, "history.series: bad series pattern"},
		{"key not a list", "{file: h.csv, key: §family}", ErrType, "history.key: want a list"},
		{"key empty", "{file: h.csv, key: §[]}", ErrValue, "history.key: an empty list"},
		{"key twice", "{file: h.csv, key: [family, §FAMILY]}", ErrValue, `history.key[1]: "FAMILY" is already history.key[0]`},
		{"key period", "{file: h.csv, key: [family, §period]}", ErrValue, `history.key[1]: "period" is the period column`},
		{"key slash", "{file: h.csv, key: [§a/b]}", ErrValue, `history.key[0]: "a/b" holds a /`},
		{"level empty", "{file: h.csv, levels: [§'']}", ErrValue, "history.levels[0]: must not be empty"},
		{"levels and key", "{file: h.csv, key: [family, product], levels: §[family]}", ErrValue,
			"history.levels: names 1 level, but the key has 2 columns"},
		{"unknown key", "{file: h.csv, §level: [a]}", ErrUnknownKey, "history.level: unknown key; did you mean levels?"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src, line, col := marked(history(tc.block))
			_, err := Parse(strings.NewReader(src), "plan.yaml")
			if _, ok := err.(*data.ParseError); !ok {
				t.Fatalf("want exactly one *data.ParseError, got %T:\n%v", err, err)
			}
			prefix := fmt.Sprintf("plan.yaml:%d:%d: ", line, col)
			if msg := err.Error(); !strings.HasPrefix(msg, prefix) || !strings.Contains(msg, tc.want) {
				t.Errorf("error\n  %s\nwant prefix %q and fragment %q", msg, prefix, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("error %v does not wrap %v", err, tc.kind)
			}
		})
	}
}
