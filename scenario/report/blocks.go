package report

import "bytes"

// Heading is a line that opens a part of a text report (a scenario's
// figures, say). The text report prints it as any other line; a writer
// with structure (HTML) makes it a heading.
type Heading string

func (h Heading) writeText(b *bytes.Buffer) { b.WriteString(string(h)); b.WriteByte('\n') }

// cautionBlock is the caution that ends a report (Caution): printed as its
// lines in the text report, and once, at the end, in a document that binds
// several reports together.
type cautionBlock struct{}

func (cautionBlock) writeText(b *bytes.Buffer) { b.WriteString(Caution); b.WriteByte('\n') }

// Heading appends a heading line. Any unfinished line is ended first.
func (t *Text) Heading(s string) {
	t.flush()
	t.blocks = append(t.blocks, Heading(s))
}

// caution appends the caution.
func (t *Text) caution() {
	t.flush()
	t.blocks = append(t.blocks, cautionBlock{})
}

// flush ends an unfinished line, so that a block added next comes after
// it.
func (t *Text) flush() {
	if t.partial.Len() > 0 {
		t.Write([]byte{'\n'})
	}
}
