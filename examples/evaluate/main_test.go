package main

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// runOK runs the command and fails the test unless it exits 0.
func runOK(t *testing.T, args ...string) string {
	t.Helper()
	var out, errOut bytes.Buffer
	if code := run(args, &out, &errOut); code != exitOK {
		t.Fatalf("run(%q) = %d, stderr %q", args, code, errOut.String())
	}
	return out.String()
}

// small is a quick run: the open data at 2 origins a series and one
// synthetic series per family and frequency.
var small = []string{"-open", "../../testdata/open", "-reps", "1", "-origins", "2"}

func TestReport(t *testing.T) {
	a := runOK(t, append(small, "-workers", "1")...)
	for _, want := range []string{
		"Band coverage, open data", "Band coverage, synthetic data", "Band coverage, all data",
		"Band coverage of auto by lead time", "Mean MASE of the H-step forecasts",
		"auto against seasonal-naive and the best single method", "Realised service of a 95 % safety stock",
		"Methods auto chose", "macrodata.realgdp", "level-shift",
	} {
		if !strings.Contains(a, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	// The open data: 17 series, 2 origins each = 34 origins, of
	// 3*2*12 + 14*2*8 = 296 held-out values.
	if !strings.Contains(a, "open           17        3         14       34              296") {
		t.Errorf("report's open data line is wrong:\n%s", a[:min(len(a), 800)])
	}
	if b := runOK(t, append(small, "-workers", "2")...); a != b {
		t.Error("the report depends on the number of workers")
	}
}

func TestJSON(t *testing.T) {
	out := runOK(t, append(small, "-json")...)
	var doc map[string]json.RawMessage
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("not JSON: %v", err)
	}
	for _, k := range []string{"settings", "cases", "slices", "groups", "accuracy", "failures"} {
		if _, ok := doc[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
	var cases []json.RawMessage
	if err := json.Unmarshal(doc["cases"], &cases); err != nil || len(cases) != 17+14 {
		t.Errorf("%d cases (%v), want 17 open + 7 families x 2 frequencies", len(cases), err)
	}
}

func TestBadFlags(t *testing.T) {
	tests := [][]string{
		{"-reps", "-1"},
		{"-origins", "0"},
		{"-step", "-2"},
		{"-workers", "-1"},
		{"-open", "", "-reps", "0"},
		{"extra"},
		{"-nosuchflag"},
	}
	for _, args := range tests {
		var out, errOut bytes.Buffer
		if code := run(args, &out, &errOut); code != exitUsage {
			t.Errorf("run(%q) = %d, want %d", args, code, exitUsage)
		}
	}
	var out, errOut bytes.Buffer
	if code := run([]string{"-open", "no/such/dir", "-reps", "0"}, &out, &errOut); code != exitFail ||
		!strings.Contains(errOut.String(), "gen_open.py") {
		t.Errorf("missing data: exit %d, stderr %q; want %d and a hint", code, errOut.String(), exitFail)
	}
}
