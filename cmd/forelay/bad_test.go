package main

import (
	"bufio"
	"bytes"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// badDir is the catalogue of bad input: testdata/bad/cases.tsv lists each
// case (name, exit code, arguments, a fragment of standard error), run in
// a copy of testdata/bad/common with the case's own files (if any) over it.
const badDir = "../../testdata/bad"

// lineOf100MB is the case whose history holds one line of 100 MB, made by
// the test rather than committed.
const lineOf100MB = "history-line-100mb"

// TestBadInput runs every case of the catalogue of bad input and checks
// its exit code, that standard error holds the fragment, and that nothing
// was written: no output directory, no new file beside the inputs.
func TestBadInput(t *testing.T) {
	f, err := os.Open(filepath.Join(badDir, "cases.tsv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	n := 0
	for sc.Scan() {
		line := sc.Text()
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		parts := strings.Split(line, "\t")
		if len(parts) != 4 {
			t.Fatalf("cases.tsv: %q: want 4 tab-separated fields", line)
		}
		name, args, frag := parts[0], strings.Fields(parts[2]), parts[3]
		code, err := strconv.Atoi(parts[1])
		if err != nil {
			t.Fatalf("cases.tsv: %s: exit code %q", name, parts[1])
		}
		n++
		t.Run(name, func(t *testing.T) { runBadCase(t, name, args, code, frag) })
	}
	if n < 40 {
		t.Errorf("the catalogue has %d cases, want at least 40", n)
	}
}

func runBadCase(t *testing.T, name string, args []string, code int, frag string) {
	dir := t.TempDir()
	copyDir(t, filepath.Join(badDir, "common"), dir)
	if _, err := os.Stat(filepath.Join(badDir, name)); err == nil {
		copyDir(t, filepath.Join(badDir, name), dir)
	}
	if name == lineOf100MB {
		var b bytes.Buffer
		b.WriteString("period,shop/curd\n2023-01,")
		b.Write(bytes.Repeat([]byte("7"), 100<<20))
		b.WriteString("\n")
		if err := os.WriteFile(filepath.Join(dir, "h.csv"), b.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	before := listDir(t, dir)
	t.Chdir(dir)
	var stdout, stderr bytes.Buffer
	got := run(args, &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow)
	t.Logf("exit %d: %s", got, strings.TrimSpace(stderr.String()))
	if got != code {
		t.Errorf("exit code %d, want %d; stderr:\n%s", got, code, stderr.String())
	}
	if !strings.Contains(stderr.String(), frag) {
		t.Errorf("stderr does not hold %q:\n%s", frag, stderr.String())
	}
	if after := listDir(t, dir); !slices.Equal(before, after) {
		t.Errorf("files written: before %v, after %v", before, after)
	}
}

// copyDir copies the regular files of src into dst, and its folders (the
// shards of a merge case) with theirs.
func copyDir(t *testing.T, src, dst string) {
	t.Helper()
	entries, err := os.ReadDir(src)
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if e.IsDir() {
			if err := os.MkdirAll(filepath.Join(dst, e.Name()), 0o755); err != nil {
				t.Fatal(err)
			}
			copyDir(t, filepath.Join(src, e.Name()), filepath.Join(dst, e.Name()))
			continue
		}
		if !e.Type().IsRegular() {
			continue
		}
		b, err := os.ReadFile(filepath.Join(src, e.Name()))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dst, e.Name()), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// listDir returns every path under dir, relative and sorted.
func listDir(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	err := filepath.WalkDir(dir, func(p string, d os.DirEntry, err error) error {
		if err != nil {
			return err
		}
		rel, _ := filepath.Rel(dir, p)
		out = append(out, rel)
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	slices.Sort(out)
	return out
}
