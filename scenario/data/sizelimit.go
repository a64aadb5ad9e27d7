package data

import (
	"errors"
	"fmt"
	"io"
	"unicode/utf8"
)

// ErrTooLarge: an input file, or one line of it, is larger than its limit.
var ErrTooLarge = errors.New("input too large")

// SizeLimits bound an input file, so that a wrong file (a database dump, a
// binary, a file with no line breaks) ends in a clear error instead of a
// run that exhausts memory. A zero field means no limit.
type SizeLimits struct {
	// Bytes is the most bytes the whole file may hold.
	Bytes int64
	// LineBytes is the most bytes one line may hold, its line break not
	// counted.
	LineBytes int64
}

// A SizeError says which limit an input broke. It wraps ErrTooLarge.
type SizeError struct {
	// Limit names the limit broken: "bytes", "line-bytes" or
	// "name-length".
	Limit string
	// Max is the limit in bytes.
	Max int64
}

func (e *SizeError) Error() string {
	switch e.Limit {
	case "line-bytes":
		return fmt.Sprintf("a line longer than %d bytes; is this the right file?", e.Max)
	case "name-length":
		return fmt.Sprintf("a series name longer than %d characters; is this the right column?", e.Max)
	}
	return fmt.Sprintf("larger than %d bytes; is this the right file?", e.Max)
}

// Unwrap returns ErrTooLarge.
func (e *SizeError) Unwrap() error { return ErrTooLarge }

// BoundedReader returns a reader of r that fails, with a *ParseError
// naming the file (and the line, for the line limit) and wrapping a
// *SizeError, as soon as more bytes than the limits allow have come
// through. Nothing past the limit is read from r.
func BoundedReader(r io.Reader, name string, l SizeLimits) io.Reader {
	return &boundedReader{r: r, name: name, l: l, line: 1}
}

type boundedReader struct {
	r       io.Reader
	name    string
	l       SizeLimits
	total   int64 // bytes passed on so far
	line    int   // 1-based number of the current line
	lineLen int64 // bytes of the current line passed on so far
	err     error
}

func (b *boundedReader) Read(p []byte) (int, error) {
	if b.err != nil {
		return 0, b.err
	}
	if b.l.Bytes > 0 {
		// Read at most one byte past the limit, to tell "exactly at the
		// limit" from "over it".
		if room := b.l.Bytes - b.total + 1; int64(len(p)) > room {
			p = p[:room]
		}
	}
	n, err := b.r.Read(p)
	for i := 0; i < n; i++ {
		if p[i] == '\n' {
			b.line++
			b.lineLen = 0
			continue
		}
		b.lineLen++
		if b.l.LineBytes > 0 && b.lineLen > b.l.LineBytes && p[i] != '\r' {
			b.err = &ParseError{File: b.name, Line: b.line, Err: &SizeError{Limit: "line-bytes", Max: b.l.LineBytes}}
			return 0, b.err
		}
	}
	b.total += int64(n)
	if b.l.Bytes > 0 && b.total > b.l.Bytes {
		b.err = &ParseError{File: b.name, Err: &SizeError{Limit: "bytes", Max: b.l.Bytes}}
		return 0, b.err
	}
	return n, err
}

// CheckNameLength returns a *ParseError wrapping a *SizeError for the first
// series whose name has more than max characters (runes), nil when every
// name is within the limit. Every series of the file is checked, those
// whose values were not kept (ReadOptions.Keep) included.
func (h *History) CheckNameLength(max int) error {
	x := h.extents()
	for i := range x.Len() {
		if name := x.Name(i); utf8.RuneCountInString(name) > max {
			return &ParseError{File: h.File, Field: fmt.Sprintf("series %.40q...", name), Err: &SizeError{Limit: "name-length", Max: int64(max)}}
		}
	}
	return nil
}
