package main

import (
	"bytes"
	"strings"
	"testing"
)

// TestGuardPanic: a panic is reported as an internal error with exit code
// 1, never as bad input.
func TestGuardPanic(t *testing.T) {
	var errOut bytes.Buffer
	code := guard(&errOut, func() int { panic("index out of range") })
	if code != exitInternal {
		t.Errorf("exit code = %d, want %d", code, exitInternal)
	}
	if !strings.Contains(errOut.String(), "internal error: index out of range") {
		t.Errorf("stderr = %q, want the internal error", errOut.String())
	}
}

// TestWarningsStrict: warnings go to stderr; under --strict they stop the
// run with exit code 2.
func TestWarningsStrict(t *testing.T) {
	var out, errOut bytes.Buffer
	ios := &IOStreams{Out: &out, ErrOut: &errOut}
	if err := warnings(ios, &sharedFlags{}, []string{"a", "b"}); err != nil {
		t.Fatalf("not strict: %v", err)
	}
	if errOut.String() != "warning: a\nwarning: b\n" {
		t.Errorf("stderr = %q", errOut.String())
	}
	err := warnings(ios, &sharedFlags{Strict: true}, []string{"a"})
	if err == nil || exitCode(err) != exitInput {
		t.Errorf("strict: err = %v, want an input error", err)
	}
	if err := warnings(ios, &sharedFlags{Strict: true}, nil); err != nil {
		t.Errorf("strict without warnings: %v", err)
	}
}

// TestCountValue: whole numbers plainly or in scientific notation; nothing
// else.
func TestCountValue(t *testing.T) {
	for _, c := range []struct {
		in   string
		want int
		ok   bool
	}{
		{"20000", 20000, true},
		{"2e4", 20000, true},
		{"1e9", 1_000_000_000, true},
		{"1e300", 2147483647, true}, // clamped, so the limit check names it
		{"1.5", 0, false},
		{"10_000", 0, false},
		{"0x10", 0, false},
		{"NaN", 0, false},
		{"many", 0, false},
	} {
		var n int
		err := newCountValue(&n, 7).Set(c.in)
		if (err == nil) != c.ok || (c.ok && n != c.want) {
			t.Errorf("Set(%q) = %d, %v; want %d, ok %v", c.in, n, err, c.want, c.ok)
		}
	}
}
