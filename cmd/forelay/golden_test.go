package main

import (
	"bytes"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"testing"
)

// goldenRuns are the command lines whose every output (standard output,
// standard error and each CSV and JSON file written) is kept under
// testdata/golden/outputs/NAME and must not change by a byte unless on
// purpose: the safety net of reshaping the code. Charts have golden images
// of their own in package plots. OUT stands for the --out directory.
var goldenRuns = []struct {
	name string
	args []string
}{
	{"fit-dairy", []string{"fit", "--history", "../../examples/dairy/history.csv", "--units", "litres"}},
	{"fit-dairy-json", []string{"fit", "--history", "../../examples/dairy/history.csv", "--json"}},
	{"check-dairy", []string{"check", "../../examples/dairy/plan.yaml", "--json"}},
	{"plan-dairy", []string{"plan", "../../examples/dairy/plan.yaml", "--detail", "--event", "grocer-exit", "--no-chart", "--out", "OUT"}},
	{"plan-dairy-json", []string{"plan", "../../examples/dairy/plan.yaml", "--json"}},
	{"plan-overlarge-loss", []string{"plan", "../../testdata/scenario/overlarge-loss.yaml", "--detail", "--no-chart", "--out", "OUT"}},
	{"plan-year-typo", []string{"plan", "../../testdata/scenario/year-typo.yaml", "--no-chart", "--out", "OUT"}},
	{"compare-dairy", []string{"compare", "../../examples/dairy/plan.yaml", "--paths", "2000", "--no-chart", "--out", "OUT"}},
	{"buffer-dairy", []string{"buffer", "../../examples/dairy/plan.yaml", "--scenario", "with-contract", "--lead-time", "2", "--paths", "2000", "--no-chart", "--out", "OUT"}},
	{"buffer-dairy-bands", []string{"buffer", "../../examples/dairy/plan.yaml", "--scenario", "with-contract", "--demand", "bands", "--json"}},
	{"stress-dairy", []string{"stress", "../../examples/dairy/plan.yaml", "--paths", "2000", "--no-chart", "--out", "OUT"}},
	{"track-dairy", []string{"track", "../../examples/dairy/plan.yaml", "--actuals", "../../examples/dairy/actuals.csv", "--scenario", "with-contract", "--out", "OUT"}},
	{"track-dairy-json", []string{"track", "../../examples/dairy/plan.yaml", "--actuals", "../../examples/dairy/actuals.csv", "--scenario", "with-contract", "--json"}},
}

// TestGoldenOutputs runs goldenRuns and compares every output with its
// golden copy. FORELAY_UPDATE_GOLDEN=1 rewrites the copies; review the diff.
func TestGoldenOutputs(t *testing.T) {
	if testing.Short() {
		t.Skip("fits the demo many times")
	}
	update := os.Getenv("FORELAY_UPDATE_GOLDEN") != ""
	for _, g := range goldenRuns {
		t.Run(g.name, func(t *testing.T) {
			got := goldenRun(t, g.args)
			dir := filepath.Join("testdata", "golden", "outputs", g.name)
			if update {
				if err := os.RemoveAll(dir); err != nil {
					t.Fatal(err)
				}
				if err := os.MkdirAll(dir, 0o755); err != nil {
					t.Fatal(err)
				}
				for name, b := range got {
					if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
						t.Fatal(err)
					}
				}
			}
			want := readGoldenDir(t, dir)
			for _, name := range sortedKeys(want, got) {
				if !bytes.Equal(got[name], want[name]) {
					t.Errorf("%s/%s differs from its golden copy (FORELAY_UPDATE_GOLDEN=1 rewrites it)\ngot:\n%s", g.name, name, firstLines(got[name], 20))
				}
			}
		})
	}
}

// goldenRun runs one command line with OUT replaced by a temporary
// directory and returns its outputs by name: stdout.txt, stderr.txt,
// exit.txt and every .csv and .json file written.
func goldenRun(t *testing.T, args []string) map[string][]byte {
	t.Helper()
	out := filepath.Join(t.TempDir(), "out")
	argv := make([]string, len(args))
	for i, a := range args {
		argv[i] = strings.ReplaceAll(a, "OUT", out)
	}
	var stdout, stderr bytes.Buffer
	code := run(argv, &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow)
	files := map[string][]byte{
		"stdout.txt": stdout.Bytes(),
		"stderr.txt": []byte(strings.ReplaceAll(stderr.String(), out, "OUT")),
		"exit.txt":   []byte{byte('0' + code), '\n'},
	}
	ents, _ := os.ReadDir(out)
	for _, e := range ents {
		if ext := filepath.Ext(e.Name()); ext == ".csv" || ext == ".json" {
			b, err := os.ReadFile(filepath.Join(out, e.Name()))
			if err != nil {
				t.Fatal(err)
			}
			files["out-"+e.Name()] = b
		}
	}
	return files
}

func readGoldenDir(t *testing.T, dir string) map[string][]byte {
	t.Helper()
	ents, err := os.ReadDir(dir)
	if err != nil {
		t.Fatalf("%v (FORELAY_UPDATE_GOLDEN=1 writes the golden copies)", err)
	}
	m := map[string][]byte{}
	for _, e := range ents {
		b, err := os.ReadFile(filepath.Join(dir, e.Name()))
		if err != nil {
			t.Fatal(err)
		}
		m[e.Name()] = b
	}
	return m
}

// sortedKeys returns the names in either map, sorted.
func sortedKeys(a, b map[string][]byte) []string {
	seen := map[string]bool{}
	var out []string
	for _, m := range []map[string][]byte{a, b} {
		for k := range m {
			if !seen[k] {
				seen[k] = true
				out = append(out, k)
			}
		}
	}
	sort.Strings(out)
	return out
}

func firstLines(b []byte, n int) string {
	lines := strings.SplitN(string(b), "\n", n+1)
	if len(lines) > n {
		lines = lines[:n]
	}
	return strings.Join(lines, "\n")
}
