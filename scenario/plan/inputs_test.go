package plan

import (
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"forelay/scenario"
	"forelay/scenario/data"
)

// TestReadLimits: the history a file names is read under the file's
// limits: its size, its line length and its series names.
func TestReadLimits(t *testing.T) {
	dir := t.TempDir()
	hist := "period," + strings.Repeat("s", 30) + "\n2026-01,1\n2026-02,2\n2026-03,3\n"
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(hist), 0o644); err != nil {
		t.Fatal(err)
	}
	src := "plan: p\nhistory: {file: h.csv}\nhorizon: 3\n"
	for _, c := range []struct {
		l       scenario.Limits
		wantErr string
		is      error
	}{
		{scenario.Limits{NameLength: 20}, `h.csv: series "ssssssssssssssssssssssssssssss"...: a series name longer than 20 characters`, data.ErrTooLarge},
		{scenario.Limits{Input: data.SizeLimits{LineBytes: 30}}, "h.csv:1: a line longer than 30 bytes", data.ErrTooLarge},
		{scenario.Limits{Input: data.SizeLimits{Bytes: 50}}, "h.csv: larger than 50 bytes", data.ErrTooLarge},
	} {
		f, err := scenario.ParseLimited(strings.NewReader(src), dir+"/plan.yaml", c.l)
		if err != nil {
			t.Fatal(err)
		}
		_, err = Read(f)
		if err == nil || !strings.Contains(err.Error(), c.wantErr) {
			t.Errorf("limits %+v: err = %v, want %q", c.l, err, c.wantErr)
		}
		if c.is != nil && !errors.Is(err, c.is) {
			t.Errorf("limits %+v: %v does not wrap %v", c.l, err, c.is)
		}
	}
}

// TestInputChanges compares recorded digests with the files: the same
// file gives no warning; a changed file, a role with no digest and a file
// that cannot be read give one each, in the order of the files.
func TestInputChanges(t *testing.T) {
	dir := t.TempDir()
	same, changed := filepath.Join(dir, "plan.yaml"), filepath.Join(dir, "history.csv")
	for _, p := range []string{same, changed} {
		if err := os.WriteFile(p, []byte("a\n"), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	digest, err := data.Digest(same)
	if err != nil {
		t.Fatal(err)
	}
	recorded := map[string]string{"scenario": digest, "history": digest, "extra": digest}
	if err := os.WriteFile(changed, []byte("b\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	got := InputChanges("out/plan.json", recorded, []InputFile{
		{"scenario", same}, {"history", changed}, {"actuals", same}, {"extra", filepath.Join(dir, "none.csv")}})
	want := []string{
		changed + " has changed since out/plan.json was written",
		"out/plan.json records no digest of the actuals file; cannot tell whether " + same + " changed since",
		"cannot compare " + filepath.Join(dir, "none.csv") + " with the plan: ",
	}
	if len(got) != len(want) {
		t.Fatalf("warnings %q, want %d", got, len(want))
	}
	for i := range want {
		if !strings.HasPrefix(got[i], want[i]) {
			t.Errorf("warning %d: %q, want it to start %q", i, got[i], want[i])
		}
	}
}

// TestPortfolioExample: the portfolio example's scenario file decodes,
// selects every series of its history through its key and pattern, and
// its scopes and resources match series of that history (File.CheckSeries);
// Read then refuses it, since it takes one series.
func TestPortfolioExample(t *testing.T) {
	f, err := scenario.Load(filepath.Join("..", "..", "examples", "portfolio", "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	in, err := ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	if len(in.Selected) != 300 || len(in.Levels) != 3 {
		t.Fatalf("%d series selected, levels %v", len(in.Selected), in.Levels)
	}
	if err := f.CheckSeries(in.Selected, nil); err != nil {
		t.Errorf("CheckSeries: %v", err)
	}
	if _, err := Read(f); err == nil || !strings.Contains(err.Error(), "300 series selected") {
		t.Errorf("Read: %v, want the refusal of several series", err)
	}
}
