package report

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestFilesStaged checks that a run's files land all together or not at
// all: with a directory where one output file should go, nothing is
// written and the files already there are left as they were.
func TestFilesStaged(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	if err := os.MkdirAll(filepath.Join(dir, "plan.svg"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "plan.csv"), []byte("old\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	set := NewFiles(dir)
	set.Add("plan.csv", []byte("new\n"))
	set.Add("plan.json", []byte("{}\n"))
	set.Add("plan.svg", []byte("<svg/>\n"))
	if _, err := set.Commit(); err == nil || !strings.Contains(err.Error(), "directory is in the way") {
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

// TestFilesReplaces checks a successful run into a new and into an
// existing directory: every file written, old ones replaced, other files
// kept, no staging directory left behind.
func TestFilesReplaces(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "a", "out")
	for round, content := range []string{"first\n", "second\n"} {
		set := NewFiles(dir)
		set.Add("plan.csv", []byte(content))
		set.Add("plan.json", []byte(content))
		paths, err := set.Commit()
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

// TestFilesNotADirectory: --out naming a file is refused before
// anything is written.
func TestFilesNotADirectory(t *testing.T) {
	file := filepath.Join(t.TempDir(), "out")
	if err := os.WriteFile(file, []byte("x"), 0o644); err != nil {
		t.Fatal(err)
	}
	set := NewFiles(file)
	set.Add("plan.csv", []byte("new\n"))
	if _, err := set.Commit(); err == nil || !strings.Contains(err.Error(), "not a directory") {
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

// TestFilesWrittenAsProduced checks that each file is written into the
// staging directory when it is added, not kept until the end, that a run
// that stops without committing leaves nothing once discarded, and that a
// failure to write is returned by Commit with nothing moved.
func TestFilesWrittenAsProduced(t *testing.T) {
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	set := NewFiles(dir)
	assertNoStage(t, parent) // nothing on disk before the first file
	set.Add("plan.csv", []byte("a\n"))
	stages, _ := filepath.Glob(filepath.Join(parent, ".out.stage-*"))
	if len(stages) != 1 {
		t.Fatalf("staging directories %v after one Add, want one", stages)
	}
	if b, err := os.ReadFile(filepath.Join(stages[0], "plan.csv")); err != nil || string(b) != "a\n" {
		t.Fatalf("staged plan.csv = %q, %v; want it written at Add", b, err)
	}
	set.Discard()
	assertNoStage(t, parent)
	if _, err := os.Stat(dir); !os.IsNotExist(err) {
		t.Errorf("the output directory exists after Discard (stat err %v)", err)
	}

	bad := NewFiles(filepath.Join(parent, "out2"))
	bad.Add("sub/plan.csv", []byte("a\n")) // no such folder in the staging directory
	bad.Add("plan.json", []byte("{}\n"))
	if _, err := bad.Commit(); err == nil || !strings.Contains(err.Error(), "sub/plan.csv") {
		t.Fatalf("commit after a failed Add: err = %v, want the failure naming sub/plan.csv", err)
	}
	assertNoStage(t, parent)
	if _, err := os.Stat(filepath.Join(parent, "out2")); !os.IsNotExist(err) {
		t.Errorf("out2 exists after a failed run (stat err %v)", err)
	}
}

// TestFilesAddFrom checks a file streamed into the set: its bytes land
// with the others, and a writer that fails part-way leaves nothing
// written, the error returned by Commit.
func TestFilesAddFrom(t *testing.T) {
	dir := filepath.Join(t.TempDir(), "out")
	set := NewFiles(dir)
	set.Add("a.txt", []byte("a\n"))
	set.AddFrom("b.csv", func(w io.Writer) error {
		for i := range 3 {
			if _, err := fmt.Fprintf(w, "row %d\n", i); err != nil {
				return err
			}
		}
		return nil
	})
	if _, err := set.Commit(); err != nil {
		t.Fatal(err)
	}
	if b, err := os.ReadFile(filepath.Join(dir, "b.csv")); err != nil || string(b) != "row 0\nrow 1\nrow 2\n" {
		t.Fatalf("b.csv: %q, %v", b, err)
	}

	failed := filepath.Join(t.TempDir(), "out")
	set = NewFiles(failed)
	defer set.Discard()
	set.Add("a.txt", []byte("a\n"))
	set.AddFrom("b.csv", func(w io.Writer) error {
		fmt.Fprintln(w, "row 0")
		return errors.New("shard cut short")
	})
	if _, err := set.Commit(); err == nil || err.Error() != "shard cut short" {
		t.Fatalf("Commit: %v, want the writer's error", err)
	}
	if _, err := os.Stat(failed); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("%s exists after a failed write: %v", failed, err)
	}
}
