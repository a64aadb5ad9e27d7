package report

import (
	"bytes"
	_ "embed"
	"fmt"
	"html/template"
	"strings"
	"unicode"
)

// bookTemplate is the page of a Book, and bookCSS its style sheet, whose
// {{PAPER}} is replaced by the page size.
var (
	//go:embed html/book.tmpl
	bookTemplateText string
	//go:embed html/book.css
	bookCSS      string
	bookTemplate = template.Must(template.New("book").Parse(bookTemplateText))
)

// htmlBook is what the page template is given.
type htmlBook struct {
	Title    string
	Lead     []string
	CSS      template.CSS
	Sections []htmlSection
	Warnings []string
	Caution  []string
}

type htmlSection struct {
	ID, Title, Intro string
	Items            []htmlItem
	Figures          []htmlFigure
}

// An htmlItem is one element of a section's text: a paragraph ("p"), a
// note ("note"), a subheading ("h3"), a list of indented lines ("list"),
// a table ("table") or a chart ("figure").
type htmlItem struct {
	Kind   string
	Text   string
	Lines  []string
	Table  *htmlTable
	Figure *htmlFigure
	// closed is set by a blank line after the item: no line goes on it.
	closed bool
}

type htmlTable struct {
	Head []htmlCell
	Rows [][]htmlCell
	// Wide tables are set in a smaller type so that they fit the page.
	Wide bool
}

// An htmlCell is a table cell: Num aligns it right (a number), Row makes
// it the header of its row.
type htmlCell struct {
	Text     string
	Num, Row bool
}

type htmlFigure struct {
	ID, Caption string
	SVG         template.HTML
}

// wideColumns is the number of columns from which a table is set small.
const wideColumns = 8

// HTML returns the book as one self-contained HTML page laid out for
// paper: the style sheet is in the page, each chart is inline SVG with its
// caption as its title and text alternative, and nothing refers to
// another file or to the network, so the page can be mailed or archived
// alone. The same book gives the same bytes. It returns the error of a
// chart that cannot be drawn.
func (b *Book) HTML(paper Paper) ([]byte, error) {
	doc := htmlBook{Title: b.Title, Lead: b.Lead, Warnings: b.Warnings,
		CSS:     template.CSS(strings.ReplaceAll(bookCSS, "{{PAPER}}", paper.Name)),
		Caution: []string{strings.ReplaceAll(Caution, "\n", " ")}}
	for _, s := range b.Sections {
		hs := htmlSection{ID: s.ID, Title: s.Title, Intro: s.Intro}
		var items []htmlItem
		if s.Text != nil {
			items = htmlItems(s.Text)
		}
		var figs []htmlFigure
		for i, c := range s.Charts {
			id := fmt.Sprintf("%s-fig%d", s.ID, i+1)
			fig, err := inlineSVG(c, id)
			if err != nil {
				return nil, fmt.Errorf("chart %s: %w", c.Name, err)
			}
			figs = append(figs, fig)
		}
		if s.ChartPerHeading {
			items, figs = underHeadings(items, figs)
		}
		hs.Items, hs.Figures = items, figs
		doc.Sections = append(doc.Sections, hs)
	}
	var out bytes.Buffer
	if err := bookTemplate.Execute(&out, doc); err != nil {
		return nil, err
	}
	return out.Bytes(), nil
}

// underHeadings places figure k at the end of the part that the k-th
// subheading of items opens (before any notes), and returns the figures left over (those past
// the last subheading).
func underHeadings(items []htmlItem, figs []htmlFigure) ([]htmlItem, []htmlFigure) {
	var out []htmlItem
	k, seen := 0, 0
	for i, it := range items {
		out = append(out, it)
		if it.Kind == "h3" {
			seen++
		}
		// A part ends before the next subheading, or before the notes
		// that close the text, which are about the whole section.
		end := i == len(items)-1 || items[i+1].Kind == "h3" || (items[i+1].Kind == "note" && it.Kind != "note")
		if end && k < len(figs) && seen == k+1 {
			out = append(out, htmlItem{Kind: "figure", Figure: &figs[k]})
			k++
		}
	}
	return out, figs[k:]
}

// htmlItems walks the blocks of a text report: each heading becomes a
// subheading, each table a table, each "Note: " line a note, each run of
// indented lines a list, and every other line a paragraph; blank lines
// only separate, and the caution is left to the end of the book.
func htmlItems(t *Text) []htmlItem {
	var items []htmlItem
	blocks := t.blocks
	if t.partial.Len() > 0 {
		blocks = append(blocks[:len(blocks):len(blocks)], Line(t.partial.String()))
	}
	for _, bl := range blocks {
		switch v := bl.(type) {
		case Heading:
			items = append(items, htmlItem{Kind: "h3", Text: string(v)})
		case *Table:
			items = append(items, htmlItem{Kind: "table", Table: htmlTableOf(v)})
		case Line:
			items = lineItem(items, string(v))
		}
	}
	return items
}

// lineItem adds one line of text to items.
func lineItem(items []htmlItem, s string) []htmlItem {
	trimmed := strings.TrimSpace(s)
	switch {
	case trimmed == "":
		if n := len(items); n > 0 {
			items[n-1].closed = true
		}
		return items
	case strings.HasPrefix(s, " "):
		line := strings.Join(strings.Fields(trimmed), " ")
		if n := len(items); n > 0 && items[n-1].Kind == "list" {
			items[n-1].Lines = append(items[n-1].Lines, line)
			return items
		}
		return append(items, htmlItem{Kind: "list", Lines: []string{line}})
	case strings.HasPrefix(s, "Note: "):
		return append(items, htmlItem{Kind: "note", Text: s})
	case continues(items, s):
		items[len(items)-1].Text += " " + s
		return items
	}
	return append(items, htmlItem{Kind: "p", Text: s})
}

// continues reports whether line s goes on the paragraph that ends items,
// a sentence the text report broke across lines: no blank line comes
// between them, s starts with a lower-case letter and the paragraph ends
// in a letter or a comma.
func continues(items []htmlItem, s string) bool {
	n := len(items)
	if n == 0 || items[n-1].Kind != "p" || items[n-1].closed || s == "" || !unicode.IsLower(rune(s[0])) {
		return false
	}
	prev := items[n-1].Text
	last := rune(prev[len(prev)-1])
	return unicode.IsLetter(last) || last == ','
}

// htmlTableOf lays out a table: the columns the text report aligns left
// are text, the others numbers, and the first cell of each row heads it.
func htmlTableOf(t *Table) *htmlTable {
	ht := &htmlTable{Wide: len(t.Head) >= wideColumns}
	for i, h := range t.Head {
		ht.Head = append(ht.Head, htmlCell{Text: h, Num: !t.LeftCols[i]})
	}
	for _, r := range t.Rows {
		row := make([]htmlCell, len(t.Head))
		for i := range row {
			c := ""
			if i < len(r) {
				c = strings.TrimSpace(r[i])
			}
			row[i] = htmlCell{Text: c, Num: !t.LeftCols[i], Row: i == 0}
		}
		ht.Rows = append(ht.Rows, row)
	}
	return ht
}
