package main

import (
	"bytes"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// clock is a fake clock that the test moves by hand.
type clock struct{ t time.Time }

func (c *clock) now() time.Time { return c.t }

// TestProgressBar checks the bar on a fake writer: nothing before the
// delay or for a step done at once, the label and the count while it runs,
// colour codes only when colour is allowed, and the line cleared at the
// end.
func TestProgressBar(t *testing.T) {
	for _, tc := range []struct {
		name     string
		colour   bool
		wait     time.Duration // time passed before the first update
		steps    []int         // done, of total 8
		drawn    bool
		finished bool
	}{
		{"short step", false, 0, []int{1, 2, 8}, false, false},
		{"done at once", false, time.Second, []int{8}, false, false},
		{"long step", false, time.Second, []int{1, 2, 3, 4, 5, 6, 7, 8}, true, true},
		{"long step, colour", true, time.Second, []int{1, 2, 3, 8}, true, true},
		{"long step, unfinished", false, time.Second, []int{1, 2, 3}, true, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var w bytes.Buffer
			c := &clock{t: time.Date(2026, 11, 20, 9, 0, 0, 0, time.UTC)}
			bar := newProgressBar(&w, "drawing paths", tc.colour, time.Second/2, c.now)
			bar.throttle = 0 // draw every update
			c.t = c.t.Add(tc.wait)
			for _, d := range tc.steps {
				bar.update(d, 8)
			}
			out := w.String()
			if !tc.drawn {
				if out != "" {
					t.Fatalf("drew %q, want nothing", out)
				}
				return
			}
			if !strings.Contains(out, "drawing paths") || !strings.Contains(out, "/8") {
				t.Errorf("no label or count in %q", out)
			}
			if esc := strings.Contains(out, "\x1b["); esc != tc.colour {
				t.Errorf("colour codes %v, want %v: %q", esc, tc.colour, out)
			}
			// Cleared: the last thing written is a carriage return after
			// blanks, leaving the line empty for what follows.
			cleared := strings.HasSuffix(out, "\r") && strings.TrimSpace(out[strings.LastIndex(out[:len(out)-1], "\r")+1:]) == ""
			if cleared != tc.finished {
				t.Errorf("line cleared %v, want %v: %q", cleared, tc.finished, out)
			}
		})
	}
}

// TestTerminals checks where bars and colour go: bars only on a terminal
// standard error, colour only when standard output is a terminal too and
// NO_COLOR is unset or empty (common practice, no-color.org).
func TestTerminals(t *testing.T) {
	out, errOut := &bytes.Buffer{}, &bytes.Buffer{}
	ios := &IOStreams{Out: out, ErrOut: errOut}
	for _, tc := range []struct {
		name          string
		outTTY, errTY bool
		noColor       string
		bars, colour  bool
	}{
		{"both terminals", true, true, "", true, true},
		{"NO_COLOR set", true, true, "1", true, false},
		{"stdout piped", false, true, "", true, false},
		{"stderr piped", true, false, "", false, false},
		{"nothing a terminal", false, false, "", false, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			isTerm := func(w io.Writer) bool { return (w == out && tc.outTTY) || (w == errOut && tc.errTY) }
			getenv := func(k string) string {
				if k == "NO_COLOR" {
					return tc.noColor
				}
				return ""
			}
			bars, colour := terminals(ios, getenv, isTerm)
			if (bars != nil) != tc.bars || colour != tc.colour {
				t.Errorf("bars %v, colour %v; want %v, %v", bars != nil, colour, tc.bars, tc.colour)
			}
			if bars != nil && bars != io.Writer(errOut) {
				t.Error("bars not on standard error")
			}
		})
	}
	if isTerminal(&bytes.Buffer{}) {
		t.Error("a buffer is a terminal")
	}
}

// TestQuiet checks that --quiet drops the "wrote" lines of --out and that
// nothing but them reaches a standard error that is no terminal: no bar.
func TestQuiet(t *testing.T) {
	for _, tc := range []struct {
		args  []string
		wrote bool
	}{
		{[]string{"plan", filepath.Join(examplesDir(), "dairy", "plan.yaml")}, true},
		{[]string{"plan", filepath.Join(examplesDir(), "dairy", "plan.yaml"), "--quiet"}, false},
		{[]string{"-q", "plan", filepath.Join(examplesDir(), "dairy", "plan.yaml")}, false},
	} {
		var out, errOut bytes.Buffer
		dir := t.TempDir()
		args := append(append([]string(nil), tc.args...), "--out", dir, "--no-chart")
		if code := run(args, &IOStreams{In: strings.NewReader(""), Out: &out, ErrOut: &errOut}, fixedNow); code != 0 {
			t.Fatalf("%v: exit %d: %s", args, code, errOut.String())
		}
		for _, line := range strings.Split(strings.TrimSpace(errOut.String()), "\n") {
			if line != "" && !strings.HasPrefix(line, "wrote ") {
				t.Errorf("%v: stderr line %q", args, line)
			}
		}
		if got := strings.Contains(errOut.String(), "wrote "); got != tc.wrote {
			t.Errorf("%v: wrote lines %v, want %v", args, got, tc.wrote)
		}
		if _, err := os.Stat(filepath.Join(dir, "plan.csv")); err != nil {
			t.Errorf("%v: %v", args, err)
		}
	}
}
