package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/rogpeppe/go-internal/txtar"
)

// stressFixture copies the files of a test script (the invented crate
// plan and its history) into a temporary directory and returns the path
// of name in it.
func stressFixture(t *testing.T, script, name string) string {
	t.Helper()
	a, err := txtar.ParseFile(filepath.Join("testdata", "script", script))
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	for _, f := range a.Files {
		if err := os.WriteFile(filepath.Join(dir, f.Name), f.Data, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return filepath.Join(dir, name)
}

// testFactory returns a factory writing into buffers.
func testFactory() (*Factory, *bytes.Buffer, *bytes.Buffer) {
	out, errOut := &bytes.Buffer{}, &bytes.Buffer{}
	return &Factory{IO: &IOStreams{In: strings.NewReader(""), Out: out, ErrOut: errOut}, Now: fixedNow}, out, errOut
}

func TestNewCmdStress(t *testing.T) {
	def := StressOptions{File: "plan.yaml", Sim: simFlags{Paths: 10000, Seed: 1, Errors: "bootstrap"}, Breach: 0.1}
	with := func(f func(*StressOptions)) StressOptions { o := def; f(&o); return o }
	for _, tc := range []struct {
		name    string
		args    []string
		want    StressOptions
		wantErr string
	}{
		{"defaults", []string{"plan.yaml"}, def, ""},
		{"all flags", []string{"plan.yaml", "--paths", "500", "--seed", "9", "--errors", "normal", "--out", "o", "--json",
			"--no-chart", "--breach", "0.05", "--opening-stock", "12.5", "--scenario", "upside"},
			with(func(o *StressOptions) {
				o.Sim = simFlags{Paths: 500, Seed: 9, Errors: "normal"}
				o.Out, o.JSON, o.NoChart, o.Breach, o.OpeningStock, o.Scenario = "o", true, true, 0.05, 12.5, "upside"
			}), ""},
		{"too few paths", []string{"plan.yaml", "--paths", "99"}, def, "--paths 99: at least 100 paths are needed"},
		{"breach 0", []string{"plan.yaml", "--breach", "0"}, def, "--breach 0: must be between 0 and 1"},
		{"breach 1", []string{"plan.yaml", "--breach", "1"}, def, "--breach 1: must be between 0 and 1"},
		{"bad errors", []string{"plan.yaml", "--errors", "t"}, def, `--errors: unknown error model "t"`},
		{"negative stock", []string{"plan.yaml", "--opening-stock", "-2"}, def, "--opening-stock -2: must be a number of at least 0"},
		{"no file", []string{}, def, "accepts 1 arg(s), received 0"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			checkOptions(t, newCmdStress, tc.args, tc.want, tc.wantErr, func(o *StressOptions) { o.IO = nil })
		})
	}
}

func TestStressRun(t *testing.T) {
	path := stressFixture(t, "stress_run.txtar", "plan.yaml")
	f, out, errOut := testFactory()
	dir := filepath.Join(filepath.Dir(path), "out")
	opts := &StressOptions{IO: f.IO, File: path, Out: dir, JSON: true, Sim: simFlags{Paths: 300, Seed: 4, Errors: "bootstrap"}, Breach: 0.1}
	if err := stressRun(opts); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"stress.csv", "stress.json", "fan.png", "fan.svg", "stock.png", "stock.svg"} {
		if !strings.Contains(errOut.String(), filepath.Join(dir, name)) {
			t.Errorf("stderr does not report %s: %s", name, errOut)
		}
	}
	disk, err := os.ReadFile(filepath.Join(dir, "stress.json"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(disk, out.Bytes()) {
		t.Error("stdout and stress.json differ")
	}
	var doc map[string]any
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if scs := doc["scenarios"].([]any); len(scs) != 3 {
		t.Fatalf("%d scenarios", len(scs))
	}

	// Text: the same numbers, and again the same bytes for the same seed.
	f2, out2, _ := testFactory()
	opts2 := *opts
	opts2.IO, opts2.Out, opts2.JSON = f2.IO, "", false
	if err := stressRun(&opts2); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Stress test crate-test", "300 paths, seed 4", "Frozen production held at the baseline", "Caution:"} {
		if !strings.Contains(out2.String(), want) {
			t.Errorf("text lacks %q:\n%s", want, out2)
		}
	}
	f3, out3, _ := testFactory()
	opts2.IO = f3.IO
	if err := stressRun(&opts2); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(out2.Bytes(), out3.Bytes()) {
		t.Error("two runs with the same seed printed different reports")
	}
}

// TestStressExitCodes runs the whole command line: bad input is exit code
// 2 with the file and line named, and nothing is written.
func TestStressExitCodes(t *testing.T) {
	good := stressFixture(t, "stress_run.txtar", "plan.yaml")
	bad := stressFixture(t, "stress_bad.txtar", "cap-overlap.yaml")
	for _, tc := range []struct {
		name string
		args []string
		code int
		want string
	}{
		{"good", []string{"stress", good, "--paths", "100"}, exitOK, ""},
		{"paths", []string{"stress", good, "--paths", "50"}, exitInput, "--paths 50"},
		{"overlap", []string{"stress", bad, "--paths", "100"}, exitInput, "cap-overlap.yaml:31:50: capacity.changes[1].from"},
		{"service", []string{"buffer", good, "--service", "1"}, exitInput, "--service 1:"},
		{"lead time", []string{"buffer", good, "--lead-time", "0"}, exitInput, "--lead-time 0:"},
		{"compare paths", []string{"compare", good, "--paths", "1"}, exitInput, "--paths 1:"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "out")
			var out, errOut bytes.Buffer
			args := tc.args
			if tc.code != exitOK {
				args = append(args, "--out", dir)
			}
			code := run(args, &IOStreams{In: strings.NewReader(""), Out: &out, ErrOut: &errOut}, fixedNow)
			if code != tc.code {
				t.Fatalf("exit code %d, want %d; stderr %s", code, tc.code, errOut.String())
			}
			if !strings.Contains(errOut.String(), tc.want) {
				t.Errorf("stderr %q, want it to contain %q", errOut.String(), tc.want)
			}
			if _, err := os.Stat(dir); err == nil {
				t.Error("a failed run wrote its output directory")
			}
		})
	}
}

// TestResourcePicked runs stress and buffer on the generated portfolio
// with --resource cup-filler and checks that the picked resource and the
// total are reported as in the run over every resource: the Monte Carlo's
// random numbers depend only on the seed, the paths and the events, so
// leaving a resource out changes none of the others' numbers. The same
// stress run in 2 shards merges to the picked run's files and text.
func TestResourcePicked(t *testing.T) {
	dir := portfolioCopy(t)
	keep := func(csv []byte, col int, ids ...string) []string {
		var out []string
		for i, line := range strings.Split(strings.TrimSpace(string(csv)), "\n") {
			cells := strings.Split(line, ",")
			if i == 0 || slices.Contains(ids, cells[col]) {
				out = append(out, line)
			}
		}
		return out
	}
	for _, c := range []struct {
		command, file string
		col           int // of the resource
	}{{"stress", "stress.csv", 1}, {"buffer", "buffer.csv", 0}} {
		runOK(t, dir, c.command, "plan.yaml", "--paths", "300", "--out", "all-"+c.command, "--no-chart")
		runOK(t, dir, c.command, "plan.yaml", "--paths", "300", "--resource", "cup-filler", "--out", "one-"+c.command, "--no-chart")
		want := keep(readFile(t, dir, "all-"+c.command, c.file), c.col, "total", "cup-filler")
		got := keep(readFile(t, dir, "one-"+c.command, c.file), c.col, "total", "cup-filler", "bottling-line")
		if strings.Join(got, "\n") != strings.Join(want, "\n") {
			t.Errorf("%s --resource cup-filler: %d rows differ from the run over every resource's %d", c.command, len(got), len(want))
		}
	}
	whole := runOK(t, dir, "stress", "plan.yaml", "--paths", "300", "--resource", "cup-filler", "--out", "one")
	var shards []string
	for k := range 2 {
		out := fmt.Sprintf("s%d", k)
		runOK(t, dir, "stress", "plan.yaml", "--paths", "300", "--resource", "cup-filler", "--shard", fmt.Sprintf("%d/2", k), "--out", out)
		shards = append(shards, out)
	}
	text := runOK(t, dir, append([]string{"merge", "--out", "merged"}, shards...)...)
	sameRun(t, dir, "one", "merged", whole, text)
}
