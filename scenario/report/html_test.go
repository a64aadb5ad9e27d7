package report

import (
	"bytes"
	"fmt"
	"strings"
	"testing"

	"forelay/internal/htmlcheck"
	"forelay/plots"
)

// testBook is a small book by hand: a text with every kind of block and
// two charts in one section, a section without charts, and a warning.
func testBook() *Book {
	var t Text
	fmt.Fprintln(&t, "Plan demo: series milk, 3 month periods 2027-01 to 2027-03 (litres)")
	fmt.Fprintln(&t, "Taken out of the history before fitting:")
	fmt.Fprintln(&t, "  fair   added 10 litres")
	fmt.Fprintln(&t, "  outage took away 20 litres")
	t.Heading("Scenario base (baseline only)")
	tb := NewTable("", "total litres", "share")
	tb.AddRow("baseline", "1,000", "")
	tb.AddRow("<adjusted> & more", "1,100", "+10.0%")
	t.Add(tb)
	writeNotesAndCaution(&t, []string{"a note about the plan"})
	chart := plots.PlanChart{Title: "Totals", Units: "litres", Labels: []string{"2027-01", "2027-02", "2027-03"},
		History: plots.Curve{Values: []float64{1, 2, 3}}}
	return &Book{
		Title: "Plan demo", Lead: []string{"series milk"},
		Sections: []Section{
			{ID: "one", Title: "One", Intro: "What one holds.", Text: &t,
				Charts: []Chart{{Name: "c1", Plot: chart, Caption: "The totals."}, {Name: "c2", Plot: chart}}},
			{ID: "two", Title: "Two"},
		},
		Warnings: []string{"a warning with the fix"},
	}
}

func TestBookHTML(t *testing.T) {
	b := testBook()
	page, err := b.HTML(A4)
	if err != nil {
		t.Fatal(err)
	}
	sum, problems := htmlcheck.Check(page)
	for _, p := range problems {
		t.Error(p)
	}
	// Two charts drawn: two figures, each with one svg (counted by hand
	// from testBook).
	if sum.Figures != 2 || sum.SVGs != 2 {
		t.Errorf("figures %d, svgs %d; want 2 and 2", sum.Figures, sum.SVGs)
	}
	if sum.Tables != 1 {
		t.Errorf("tables %d, want 1", sum.Tables)
	}
	for _, id := range []string{"one", "two", "warnings"} {
		if !sum.Sections[id] {
			t.Errorf("no section %q", id)
		}
	}
	s := string(page)
	for _, want := range []string{
		"@page { size: A4;",
		"<h3>Scenario base (baseline only)</h3>",
		"<li>fair added 10 litres</li>", // indented lines become a list, spaces collapsed
		`<p class="note">Note: a note about the plan.</p>`,
		"&lt;adjusted&gt; &amp; more", // cells are escaped
		"<title id=\"one-fig1-title\">The totals.</title>",
		"<figcaption>Totals</figcaption>", // no caption: the chart's title
		"a warning with the fix",
	} {
		if !strings.Contains(s, want) {
			t.Errorf("page lacks %q", want)
		}
	}
	// The caution is written once, at the end, though the text holds it.
	if n := strings.Count(s, "Caution: this plan is a statistical estimate."); n != 1 {
		t.Errorf("caution %d times, want once", n)
	}
	if strings.Contains(s, "<?xml") || strings.Contains(s, "<!--") {
		t.Error("the inline svg keeps its XML prologue or comments")
	}
	again, err := testBook().HTML(A4)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(page, again) {
		t.Error("the same book gives different pages")
	}
	letter, err := testBook().HTML(Letter)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(letter), "@page { size: letter;") {
		t.Error("the Letter page does not set its size")
	}
}

// TestBookHTMLChartError: a chart that cannot be drawn is an error that
// names it.
func TestBookHTMLChartError(t *testing.T) {
	b := &Book{Title: "x", Sections: []Section{{ID: "s", Title: "S", Charts: []Chart{{Name: "empty", Plot: plots.PlanChart{}}}}}}
	_, err := b.HTML(A4)
	if err == nil || !strings.Contains(err.Error(), "chart empty") {
		t.Errorf("error %v, want one naming chart empty", err)
	}
}

func TestLineItem(t *testing.T) {
	tests := []struct {
		lines []string
		want  []htmlItem
	}{
		{[]string{"a", "", "b"}, []htmlItem{{Kind: "p", Text: "a", closed: true}, {Kind: "p", Text: "b"}}},
		{[]string{"head:", "  x   1", "  y 2"}, []htmlItem{{Kind: "p", Text: "head:"}, {Kind: "list", Lines: []string{"x 1", "y 2"}}}},
		{[]string{"Note: n."}, []htmlItem{{Kind: "note", Text: "Note: n."}}},
		{[]string{"  "}, nil},
		// A sentence broken across lines is one paragraph; a line after
		// a closed one starts its own.
		{[]string{"the spread of the", "sum, in units"}, []htmlItem{{Kind: "p", Text: "the spread of the sum, in units"}}},
		{[]string{"Tracking (litres)", "plan: from file"}, []htmlItem{{Kind: "p", Text: "Tracking (litres)"}, {Kind: "p", Text: "plan: from file"}}},
	}
	for _, tc := range tests {
		var got []htmlItem
		for _, l := range tc.lines {
			got = lineItem(got, l)
		}
		if fmt.Sprint(got) != fmt.Sprint(tc.want) {
			t.Errorf("%q: got %v, want %v", tc.lines, got, tc.want)
		}
	}
}

func TestParsePaper(t *testing.T) {
	tests := []struct {
		in     string
		want   Paper
		pixels int // page width at 96 CSS pixels to the inch
		fails  bool
	}{
		// ISO 216: A4 is 210 mm wide; 210 / 25.4 * 96 = 793.7.
		{"a4", A4, 793, false},
		{"A4", A4, 793, false},
		// US Letter is 8.5 inches wide: 8.5 * 96 = 816.
		{"Letter", Letter, 816, false},
		{"a3", Paper{}, 0, true},
	}
	for _, tc := range tests {
		got, err := ParsePaper(tc.in)
		if (err != nil) != tc.fails {
			t.Errorf("%s: error %v", tc.in, err)
			continue
		}
		if got != tc.want || (!tc.fails && got.CSSPixels() != tc.pixels) {
			t.Errorf("%s: got %+v (%d px), want %+v (%d px)", tc.in, got, got.CSSPixels(), tc.want, tc.pixels)
		}
	}
}

// TestUnderHeadings: with two headings and three charts, the first chart
// ends the first heading's part, the second the second's (before the
// closing note), and the third is left for after the text.
func TestUnderHeadings(t *testing.T) {
	items := []htmlItem{{Kind: "p", Text: "intro"}, {Kind: "h3", Text: "a"}, {Kind: "p", Text: "a1"},
		{Kind: "h3", Text: "b"}, {Kind: "p", Text: "b1"}, {Kind: "note", Text: "n"}}
	figs := []htmlFigure{{ID: "f1"}, {ID: "f2"}, {ID: "f3"}}
	got, left := underHeadings(items, figs)
	var order []string
	for _, it := range got {
		if it.Kind == "figure" {
			order = append(order, it.Figure.ID)
		} else {
			order = append(order, it.Text)
		}
	}
	if want := "intro a a1 f1 b b1 f2 n"; strings.Join(order, " ") != want {
		t.Errorf("order %q, want %q", strings.Join(order, " "), want)
	}
	if len(left) != 1 || left[0].ID != "f3" {
		t.Errorf("left %v, want f3", left)
	}
}
