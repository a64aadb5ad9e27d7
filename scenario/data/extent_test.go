package data

import (
	"errors"
	"strings"
	"testing"

	"forelay/forecast"
)

// TestKeepReadsExtents reads a long file keeping one series whole: the
// others keep their first and last period (counted by hand from the rows
// below) and zeros, and a series with no values is still an error.
func TestKeepReadsExtents(t *testing.T) {
	src := "series,period,value\n" +
		"a,2024-01,1\nb,2024-02,\nb,2024-03,5\na,2024-02,2\nb,2024-04,6\nb,2024-05,7\nc,2024-01,3\n"
	h, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{Keep: func(n string) bool { return n == "a" }})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name, start string
		values      []float64
	}{
		{"a", "2024-01", []float64{1, 2}},
		{"b", "2024-03", []float64{0, 0, 0}}, // 2024-03 to 2024-05, the empty 2024-02 trimmed
		{"c", "2024-01", []float64{0}},
	} {
		s, err := h.Lookup(c.name)
		if err != nil {
			t.Fatal(err)
		}
		if s.Start.String() != c.start || len(s.Values) != len(c.values) {
			t.Errorf("%s: from %s, %d values; want from %s, %d", c.name, s.Start, len(s.Values), c.start, len(c.values))
			continue
		}
		for i, v := range c.values {
			if s.Values[i] != v {
				t.Errorf("%s[%d] = %v, want %v", c.name, i, s.Values[i], v)
			}
		}
	}
	_, err = ReadHistory(strings.NewReader("series,period,value\na,2024-01,1\nb,2024-01,\n"), "h.csv", ReadOptions{Keep: func(n string) bool { return n == "a" }})
	if err == nil || !strings.Contains(err.Error(), `series "b" has no values`) {
		t.Errorf("error %v, want series b has no values", err)
	}
}

// TestExtentsListEverySeries checks History.Extents after a read keeping
// one series whole: every series in file order, where it starts and
// ends, and which are in Series.
func TestExtentsListEverySeries(t *testing.T) {
	src := "series,period,value\n" +
		"a,2024-01,1\nb,2024-02,\nb,2024-03,5\na,2024-02,2\nb,2024-04,6\nb,2024-05,\nc,2023-12,3\n"
	h, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{Keep: func(n string) bool { return n == "b" }})
	if err != nil {
		t.Fatal(err)
	}
	if len(h.Series) != 1 || h.Series[0].Name != "b" {
		t.Fatalf("Series = %v, want b only", h.Series)
	}
	x := &h.Extents
	want := []struct {
		name, start, next string
		series            int
	}{
		// a: rows 2024-01 and 2024-02; b: values from 2024-03 to 2024-04 (the
		// empty cells before and after are not part of it); c: one row.
		{"a", "2024-01", "2024-03", -1},
		{"b", "2024-03", "2024-05", 0},
		{"c", "2023-12", "2024-01", -1},
	}
	if x.Len() != len(want) {
		t.Fatalf("Extents.Len() = %d, want %d", x.Len(), len(want))
	}
	for i, w := range want {
		got := []string{x.Name(i), x.Start(i).String(), x.Next(i).String()}
		if got[0] != w.name || got[1] != w.start || got[2] != w.next || x.Series(i) != w.series {
			t.Errorf("extent %d = %v, series %d; want %v", i, got, x.Series(i), w)
		}
	}
	if x.Periods(1) != 2 {
		t.Errorf("Periods(1) = %d, want 2", x.Periods(1))
	}
}

// TestExtentsOfWeeks reads dates 7 days apart, the only series kept
// whole having a single row: the steps between the rows of the other
// series make the dates weeks, and their extents count weeks.
func TestExtentsOfWeeks(t *testing.T) {
	src := "series,period,value\n" +
		"a,2026-01-05,1\na,2026-01-12,2\na,2026-01-19,3\nb,2026-01-26,4\n"
	for _, keep := range []func(string) bool{nil, func(n string) bool { return n == "b" }} {
		h, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{Keep: keep})
		if err != nil {
			t.Fatal(err)
		}
		x := &h.Extents
		// a runs over the weeks of 5, 12 and 19 January; b over that of 26 January.
		if x.Start(0).Freq != forecast.Weekly || x.Periods(0) != 3 || x.Next(0).String() != "2026-01-26" || x.Start(1).String() != "2026-01-26" {
			t.Errorf("keep %v: a from %v (%v), %d periods, to %v; b from %v", keep != nil, x.Start(0), x.Start(0).Freq, x.Periods(0), x.Next(0), x.Start(1))
		}
	}
}

// TestKeepFindsErrors reads bad long files keeping no series whole, and
// every series whole: both report the same error at the same cell. The
// extents of series not kept are checked for order and for values, not
// for gaps.
func TestKeepFindsErrors(t *testing.T) {
	none := func(string) bool { return false }
	for _, src := range []string{
		"series,period,value\na,2024-01,1\nb,2024-01,2\na,2024-01,3\n",              // duplicate of the row before
		"series,period,value\na,2024-02,1\nb,2024-01,2\na,2024-01,3\nb,2024-01,4\n", // out of order, then a duplicate
		"series,period,value\na,2024-01,1\nb,2024-01,\nb,2024-02,\n",                // no values
		"series,period,value\na,2024-01,\na,2024-02,\nb,2024-01,1\nb,2024-01,1\n",   // no values after a duplicate
		"series,period,value\na,2026-01-05,1\na,2026-01-12,2\nb,2026-01-13,1\n",     // weeks on another weekday
		"series,period,value\na,2024-01,1\na,2024-02,x\n",                           // a bad number
		"series,period,value\na,2024-01,1\nb,2024-03,1\nb,2024-02,1\na,2023-12,1\n", // the earliest of two
		"family,product,period,value\nmilk,whole,2024-01,1\nmilk,whole,2023-01,1\n", // in a composite key
	} {
		opt := ReadOptions{}
		if strings.HasPrefix(src, "family") {
			opt.Key = []string{"family", "product"}
		}
		_, whole := ReadHistory(strings.NewReader(src), "h.csv", opt)
		opt.Keep = none
		_, extent := ReadHistory(strings.NewReader(src), "h.csv", opt)
		if whole == nil || extent == nil || whole.Error() != extent.Error() {
			t.Errorf("%q:\nwhole  %v\nextent %v", src, whole, extent)
		}
	}
	// A period that repeats one before the latest row is out of order
	// for a series not kept, whose earlier rows are gone.
	src := "series,period,value\na,2024-01,1\na,2024-02,1\na,2024-01,1\n"
	_, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{Keep: none})
	if !errors.Is(err, ErrUnsorted) || !strings.Contains(err.Error(), "h.csv:4:3: period: periods out of order: 2024-01 of series \"a\" comes after 2024-02 (line 3)") {
		t.Errorf("error %v, want 2024-01 out of order at 4:3", err)
	}
}

// TestKeepChecksEveryName: the names of the series not kept count
// towards the limit of name lengths, as when every series is kept.
func TestKeepChecksEveryName(t *testing.T) {
	src := "series,period,value\na,2024-01,1\nmilk-whole-1l,2024-01,2\n"
	for _, keep := range []func(string) bool{nil, func(n string) bool { return n == "a" }} {
		h, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{Keep: keep})
		if err != nil {
			t.Fatal(err)
		}
		var se *SizeError
		if err := h.CheckNameLength(5); !errors.As(err, &se) || !strings.Contains(err.Error(), `series "milk-whole-1l"`) {
			t.Errorf("keep %v: CheckNameLength(5) = %v, want milk-whole-1l too long", keep != nil, err)
		}
	}
}

// TestExtentsOfWideFile: the extents of a wide file are its columns, each
// from its first value to its last (the empty cells around them are not
// part of the series).
func TestExtentsOfWideFile(t *testing.T) {
	src := "period,north,south\n2026-01,120,\n2026-02,131,88\n2026-03,,90\n"
	h, err := ReadHistory(strings.NewReader(src), "h.csv", ReadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	x := &h.Extents
	// north: 2026-01 and 2026-02; south: 2026-02 and 2026-03.
	if x.Len() != 2 || x.Name(1) != "south" || x.Series(1) != 1 || x.Start(0).String() != "2026-01" || x.Next(0).String() != "2026-03" ||
		x.Start(1).String() != "2026-02" || x.Next(1).String() != "2026-04" {
		t.Errorf("extents %q from %v to %v and %v to %v", x.Names(), x.Start(0), x.Next(0), x.Start(1), x.Next(1))
	}
}
