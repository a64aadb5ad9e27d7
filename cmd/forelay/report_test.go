package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"forelay/internal/htmlcheck"
)

func TestNewCmdReport(t *testing.T) {
	def := ReportOptions{File: "plan.yaml", Paper: "a4", Sim: simFlags{Paths: reportPaths, Seed: 1, Errors: "bootstrap"},
		Service: 0.95, Breach: 0.1, Charts: 5, Out: "o"}
	flags := def
	flags.PDF, flags.Paper, flags.Actuals, flags.Scenario, flags.Sim.Paths = true, "letter", "new.csv", "committed", 500
	for _, tc := range []struct {
		name    string
		args    []string
		want    ReportOptions
		wantErr string
	}{
		{"defaults", []string{"plan.yaml", "--out", "o"}, def, ""},
		{"flags", []string{"plan.yaml", "--out", "o", "--pdf", "--paper", "letter", "--actuals", "new.csv", "--scenario", "committed", "--paths", "500"}, flags, ""},
		{"no out", []string{"plan.yaml"}, def, "--out is required"},
		{"paper", []string{"plan.yaml", "--out", "o", "--paper", "a3"}, def, `--paper: unknown paper "a3" (want a4 or letter)`},
		{"paths", []string{"plan.yaml", "--out", "o", "--paths", "10"}, def, "--paths 10: at least 100"},
		{"charts", []string{"plan.yaml", "--out", "o", "--charts", "-1"}, def, "--charts -1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			checkOptions(t, newCmdReport, tc.args, tc.want, tc.wantErr, func(o *ReportOptions) { o.IO = nil })
		})
	}
}

// runReport runs "forelay report" with args and the output directory
// dir, and returns report.html; the run must succeed.
func runReport(t *testing.T, dir string, args ...string) []byte {
	t.Helper()
	var out, errOut bytes.Buffer
	args = append([]string{"report"}, append(args, "--out", dir)...)
	if code := run(args, &IOStreams{In: strings.NewReader(""), Out: &out, ErrOut: &errOut}, fixedNow); code != exitOK {
		t.Fatalf("exit code %d; stderr %s", code, errOut.String())
	}
	page, err := os.ReadFile(filepath.Join(dir, "report.html"))
	if err != nil {
		t.Fatal(err)
	}
	return page
}

// TestReportExamples writes the report of the dairy and the portfolio
// examples, with their actuals, and checks that each page stands alone,
// draws each chart as one svg, heads every table and holds every section
// section 1 of the report asks for.
func TestReportExamples(t *testing.T) {
	ex := examplesDir()
	for _, tc := range []struct {
		name     string
		dir      string
		sections []string
		// figures is the number of charts, counted by hand: the dairy
		// has 3 scenarios (a chart each), the comparison and a waterfall
		// per scenario (4), the fan of the stress test, the buffer, and
		// the control and signal charts of tracking (2): 3+4+1+1+2 = 11.
		// The portfolio: the total in each of 3 scenarios, its 2
		// resources and 5 most-changed series (10), the comparison and 3
		// waterfalls (4), the stress test's total and 2 resources (3), no
		// buffer chart, and the tracking of the total (2): 10+4+3+2 = 19.
		figures int
	}{
		{"dairy", "dairy", []string{"planned", "baseline", "events", "scenarios", "comparison", "capacity", "prebuild", "tracking"}, 11},
		{"portfolio", "portfolio", []string{"planned", "baseline", "events", "levels", "scenarios", "comparison", "capacity", "prebuild", "tracking", "series"}, 19},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if testing.Short() && tc.name == "portfolio" {
				t.Skip("the portfolio plans 301 series")
			}
			out := filepath.Join(t.TempDir(), "out")
			page := runReport(t, out, filepath.Join(ex, tc.dir, "plan.yaml"), "--actuals", filepath.Join(ex, tc.dir, "actuals.csv"))
			sum, problems := htmlcheck.Check(page)
			for _, p := range problems {
				t.Error(p)
			}
			if sum.Figures != tc.figures || sum.SVGs != tc.figures {
				t.Errorf("%d figures and %d svgs, want %d of each", sum.Figures, sum.SVGs, tc.figures)
			}
			for _, id := range tc.sections {
				if !sum.Sections[id] {
					t.Errorf("no section %q", id)
				}
			}
			if !bytes.Contains(page, []byte("sha256:")) || !bytes.Contains(page, []byte("Caution: this plan is a statistical estimate.")) {
				t.Error("the page lacks the input digests or the caution")
			}
			// The page holds no CSV file, so its text points to none
			// (the input files it names are those it was made from).
			for _, f := range []string{"summary.csv", "rollup.csv", "resources.csv", "track-summary.csv", "stress.csv", "buffer.csv"} {
				if bytes.Contains(page, []byte(" "+f)) || bytes.Contains(page, []byte(">"+f)) {
					t.Errorf("the page points to %s, which it does not hold", f)
				}
			}
		})
	}
}

// TestReportSameBytes: the same inputs give the same page whatever the
// number of workers.
func TestReportSameBytes(t *testing.T) {
	plan := filepath.Join(examplesDir(), "dairy", "plan.yaml")
	a := runReport(t, filepath.Join(t.TempDir(), "a"), plan, "--workers", "1")
	b := runReport(t, filepath.Join(t.TempDir(), "b"), plan, "--workers", "3")
	if !bytes.Equal(a, b) {
		t.Error("report.html differs with the number of workers")
	}
}

// TestReportNoBrowser: --pdf without a browser is an input error (exit
// code 2) that says how to install one, and nothing is written.
func TestReportNoBrowser(t *testing.T) {
	t.Setenv("FORELAY_CHROMIUM", filepath.Join(t.TempDir(), "no-such-browser"))
	dir := filepath.Join(t.TempDir(), "out")
	var out, errOut bytes.Buffer
	code := run([]string{"report", filepath.Join(examplesDir(), "dairy", "plan.yaml"), "--out", dir, "--pdf"},
		&IOStreams{In: strings.NewReader(""), Out: &out, ErrOut: &errOut}, fixedNow)
	if code != exitInput {
		t.Fatalf("exit code %d, want %d; stderr %s", code, exitInput, errOut.String())
	}
	if !strings.Contains(errOut.String(), "apt-get install chromium") {
		t.Errorf("stderr %q does not say how to install the browser", errOut.String())
	}
	if _, err := os.Stat(dir); err == nil {
		t.Error("a failed run wrote its output directory")
	}
}
