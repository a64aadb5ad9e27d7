package data

import (
	"errors"
	"io"
	"strings"
	"testing"
	"testing/iotest"
)

func TestBoundedReader(t *testing.T) {
	for _, c := range []struct {
		name    string
		in      string
		l       SizeLimits
		wantErr string // "" for no error
	}{
		{"no limits", "a,b\n1,2\n", SizeLimits{}, ""},
		{"exactly at the byte limit", "a,b\n1,2\n", SizeLimits{Bytes: 8}, ""},
		{"one byte over", "a,b\n1,2\n", SizeLimits{Bytes: 7}, "h.csv: larger than 7 bytes"},
		{"line at the limit", "abc\nabc\n", SizeLimits{LineBytes: 3}, ""},
		{"line at the limit with CRLF", "abc\r\nabc\r\n", SizeLimits{LineBytes: 3}, ""},
		{"second line too long", "abc\nabcd\n", SizeLimits{LineBytes: 3}, "h.csv:2: a line longer than 3 bytes"},
		{"no line breaks at all", strings.Repeat("x", 100), SizeLimits{LineBytes: 10}, "h.csv:1: a line longer than 10 bytes"},
	} {
		// One byte at a time and all at once must agree.
		for _, chunk := range []func(io.Reader) io.Reader{iotest.OneByteReader, func(r io.Reader) io.Reader { return r }} {
			got, err := io.ReadAll(BoundedReader(chunk(strings.NewReader(c.in)), "h.csv", c.l))
			if c.wantErr == "" {
				if err != nil || string(got) != c.in {
					t.Errorf("%s: got %q, %v; want the input back", c.name, got, err)
				}
				continue
			}
			if err == nil || !strings.HasPrefix(err.Error(), c.wantErr) {
				t.Errorf("%s: err = %v, want prefix %q", c.name, err, c.wantErr)
			}
			var se *SizeError
			if !errors.Is(err, ErrTooLarge) || !errors.As(err, &se) {
				t.Errorf("%s: %v does not wrap ErrTooLarge and *SizeError", c.name, err)
			}
		}
	}
}
