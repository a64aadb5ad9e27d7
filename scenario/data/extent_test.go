package data

import (
	"strings"
	"testing"
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
