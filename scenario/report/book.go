package report

import (
	"fmt"
	"strings"
)

// A Book binds the reports of one plan (the plan, its comparison, its
// stress test, its buffer and its tracking) into one document to hand
// over: a title, sections in order, the warnings of every report once,
// and the caution once at the end. Book.HTML writes it.
type Book struct {
	// Title is the document's heading, and Lead the lines under it.
	Title string
	Lead  []string
	// Sections are the parts of the document, in order.
	Sections []Section
	// Warnings are the warnings of every report bound in, each once, in
	// the order first met.
	Warnings []string
}

// A Section is one part of a Book: a heading, an optional opening
// paragraph, a text report (lines and tables, walked block by block) and
// the charts drawn under it.
type Section struct {
	// ID is the section's anchor in the document: lower-case letters,
	// digits and hyphens, unique in the book.
	ID string
	// Title is the section's heading.
	Title string
	// Intro is a paragraph that says what the section holds; empty for
	// none.
	Intro string
	// Text is the section's text report; nil for none.
	Text *Text
	// Charts are drawn after the text, one figure each; with
	// ChartPerHeading, chart k is drawn at the end of the part the text's
	// k-th heading opens (a scenario's chart under its figures), and the
	// charts past the last heading after the text.
	Charts          []Chart
	ChartPerHeading bool
}

// add appends a section made of a report's text and charts, and takes its
// warnings.
func (b *Book) add(id, title, intro string, r *Report) {
	b.Sections = append(b.Sections, Section{ID: id, Title: title, Intro: intro, Text: &r.Text, Charts: r.Charts})
	b.warn(r.Warnings)
}

// warn adds the warnings not yet in the book.
func (b *Book) warn(list []string) {
	for _, w := range list {
		dup := false
		for _, have := range b.Warnings {
			if have == w {
				dup = true
				break
			}
		}
		if !dup {
			b.Warnings = append(b.Warnings, w)
		}
	}
}

// A Paper is the page size a document is laid out and printed on.
type Paper struct {
	// Name is the size as the flag and CSS's @page name it: "A4" or
	// "letter".
	Name string
	// Width and Height are the page's size in millimetres, portrait.
	Width, Height float64
}

// The paper sizes a report can be printed on (ISO 216 A4, 210 x 297 mm;
// US Letter, 8.5 x 11 inches = 215.9 x 279.4 mm).
var (
	A4     = Paper{Name: "A4", Width: 210, Height: 297}
	Letter = Paper{Name: "letter", Width: 215.9, Height: 279.4}
)

// ParsePaper returns the paper called s (a4 or letter, in any case), or
// an error that names both.
func ParsePaper(s string) (Paper, error) {
	switch strings.ToLower(s) {
	case "a4":
		return A4, nil
	case "letter":
		return Letter, nil
	}
	return Paper{}, fmt.Errorf("unknown paper %q (want a4 or letter)", s)
}

// Inches returns the page's width and height in inches, the unit of the
// browser's print settings.
func (p Paper) Inches() (w, h float64) { return p.Width / 25.4, p.Height / 25.4 }

// CSSPixels returns the page's width in CSS pixels (96 to the inch), the
// width of the browser's viewport when the page is laid out for print.
func (p Paper) CSSPixels() int { return int(p.Width / 25.4 * 96) }
