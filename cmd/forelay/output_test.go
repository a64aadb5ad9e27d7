package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestOutputSetStaged checks that a run's files land all together or not at
// all: with a directory where one output file should go, nothing is
// written and the files already there are left as they were.
func TestOutputSetStaged(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if err := os.MkdirAll(filepath.Join(dir, "plan.svg"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "plan.csv"), []byte("old\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	set := newOutputSet(dir)
	set.add("plan.csv", []byte("new\n"))
	set.add("plan.json", []byte("{}\n"))
	set.add("plan.svg", []byte("<svg/>\n"))
	if _, err := set.commit(); err == nil || !strings.Contains(err.Error(), "directory is in the way") {
		t.Fatalf("commit with a directory in the way: err = %v, want 'directory is in the way'", err)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "plan.csv")); string(b) != "old\n" {
		t.Errorf("plan.csv = %q after a failed run, want the old content", b)
	}
	if _, err := os.Stat(filepath.Join(dir, "plan.json")); !os.IsNotExist(err) {
		t.Errorf("plan.json was written by a failed run (stat err %v)", err)
	}
	assertNoStage(t, filepath.Dir(dir))
}

// TestOutputSetReplaces checks a successful run into a new and into an
// existing directory: every file written, old ones replaced, other files
// kept, no staging directory left behind.
func TestOutputSetReplaces(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "a", "out")
	for round, content := range []string{"first\n", "second\n"} {
		set := newOutputSet(dir)
		set.add("plan.csv", []byte(content))
		set.add("plan.json", []byte(content))
		paths, err := set.commit()
		if err != nil {
			t.Fatalf("round %d: %v", round, err)
		}
		if len(paths) != 2 || paths[0] != filepath.Join(dir, "plan.csv") {
			t.Errorf("round %d: paths = %v", round, paths)
		}
		for _, n := range []string{"plan.csv", "plan.json"} {
			if b, _ := os.ReadFile(filepath.Join(dir, n)); string(b) != content {
				t.Errorf("round %d: %s = %q, want %q", round, n, b, content)
			}
		}
		if round == 0 {
			if err := os.WriteFile(filepath.Join(dir, "notes.txt"), []byte("mine"), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "notes.txt")); string(b) != "mine" {
		t.Errorf("a file that is not an output was touched: %q", b)
	}
	assertNoStage(t, filepath.Dir(dir))
}

// TestOutputSetNotADirectory: --out naming a file is refused before
// anything is written.
func TestOutputSetNotADirectory(t *testing.T) {
	file := filepath.Join(t.TempDir(), "out")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	set := newOutputSet(file)
	set.add("plan.csv", []byte("new\n"))
	if _, err := set.commit(); err == nil || !strings.Contains(err.Error(), "not a directory") {
		t.Fatalf("err = %v, want 'not a directory'", err)
	}
}

func assertNoStage(t *testing.T, dir string) {
	t.Helper()
	ents, _ := os.ReadDir(dir)
	for _, e := range ents {
		if strings.Contains(e.Name(), ".stage-") {
			t.Errorf("staging directory %s left behind", e.Name())
		}
	}
}

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
