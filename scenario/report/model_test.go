package report

import (
	"bytes"
	"fmt"
	"math"
	"testing"
)

// TestReportWriters builds a small report and checks each writer: the
// text lays out lines and tables in order, the CSV writes the table's
// cells as they are, the JSON writes the document indented.
func TestReportWriters(t *testing.T) {
	r := &Report{Name: "demo", Doc: map[string]any{"total": Num(1234.5), "missing": Num(nan())}}
	fmt.Fprintf(&r.Text, "Plan demo: %d periods\n\n", 2)
	tb := NewTable("period", "plan")
	tb.AddRow("2027-01", "1,200")
	tb.AddRow("2027-02", "34.5")
	r.Text.Add(tb)
	fmt.Fprint(&r.Text, "Note: invented.\n")
	r.CSV = &Table{Head: []string{"period", "plan"}, Rows: [][]string{{"2027-01", "1200.00"}, {"2027-02", "34.50"}}}

	var text bytes.Buffer
	if err := r.WriteText(&text); err != nil {
		t.Fatal(err)
	}
	// The numbers column is right-aligned to the widest cell ("plan" is
	// 4 wide, "1,200" 5); columns are two spaces apart.
	want := "Plan demo: 2 periods\n\nperiod    plan\n2027-01  1,200\n2027-02   34.5\nNote: invented.\n"
	if text.String() != want {
		t.Errorf("text:\n%q\nwant\n%q", text.String(), want)
	}
	if got := r.Text.String(); got != want {
		t.Errorf("Text.String() = %q", got)
	}
	csv, err := r.CSVBytes()
	if err != nil || string(csv) != "period,plan\n2027-01,1200.00\n2027-02,34.50\n" {
		t.Errorf("CSV %q, %v", csv, err)
	}
	js, err := r.JSON()
	if err != nil || string(js) != "{\n  \"missing\": null,\n  \"total\": 1234.5\n}\n" {
		t.Errorf("JSON %q, %v", js, err)
	}
}

func nan() float64 { return math.NaN() }
