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
