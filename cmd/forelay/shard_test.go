package main

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// portfolioDir holds the generated portfolio (go run ./examples/generate
// -kind portfolio) and its scenario file.
const portfolioDir = "../../examples/portfolio"

// runOK runs forelay with args in dir and fails the test on a non-zero
// exit.
func runOK(t *testing.T, dir string, args ...string) string {
	t.Helper()
	t.Chdir(dir)
	var stdout, stderr bytes.Buffer
	if code := run(args, &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}, fixedNow); code != 0 {
		t.Fatalf("forelay %s: exit %d\n%s", strings.Join(args, " "), code, stderr.String())
	}
	return stdout.String()
}

// portfolioCopy copies the example portfolio into a fresh directory.
func portfolioCopy(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	for _, name := range []string{"plan.yaml", "history.csv"} {
		b, err := os.ReadFile(filepath.Join(portfolioDir, name))
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(filepath.Join(dir, name), b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// TestShardsMergeToWhole plans the generated portfolio whole, then as N
// shards merged, for N = 1, 2, 3 and 7, and checks that the merge writes
// the files of the whole run and prints its text (sameRun).
func TestShardsMergeToWhole(t *testing.T) {
	dir := portfolioCopy(t)
	whole := runOK(t, dir, "plan", "plan.yaml", "--out", "whole", "--charts", "3")
	for _, n := range []int{1, 2, 3, 7} {
		t.Run(fmt.Sprint(n), func(t *testing.T) {
			var shards []string
			for k := range n {
				out := fmt.Sprintf("s%d-%d", n, k)
				runOK(t, dir, "plan", "plan.yaml", "--shard", fmt.Sprintf("%d/%d", k, n), "--out", out, "--charts", "3")
				shards = append(shards, out)
			}
			merged := fmt.Sprintf("merged%d", n)
			text := runOK(t, dir, append([]string{"merge", "--out", merged}, shards...)...)
			sameRun(t, dir, "whole", merged, whole, text)
		})
	}
}

// sameRun checks that directory got holds the files of directory want and
// that text is the whole run's: every file identical byte for byte (the
// per-series files, plan.json and stress.json, whose numbers have 10
// significant digits, and the charts), but the CSV files of sums
// (rollup.csv, resources.csv, stress.csv), which are equal within 1e-9
// relative or half a cent (they hold two decimals, so a sum that differs
// in its 16th digit may round the other way).
func sameRun(t *testing.T, dir, want, got, wantText, gotText string) {
	t.Helper()
	names := func(d string) []string {
		es, err := os.ReadDir(filepath.Join(dir, d))
		if err != nil {
			t.Fatal(err)
		}
		var out []string
		for _, e := range es {
			out = append(out, e.Name())
		}
		return out
	}
	wn, gn := names(want), names(got)
	if !slices.Equal(wn, gn) {
		t.Fatalf("files %q, want those of the whole run: %q", gn, wn)
	}
	for _, name := range wn {
		w, g := readFile(t, dir, want, name), readFile(t, dir, got, name)
		switch name {
		case "rollup.csv", "resources.csv", "stress.csv":
			sameNumbers(t, name, w, g)
		default:
			if !bytes.Equal(w, g) {
				t.Errorf("%s differs from the whole run's", name)
			}
		}
	}
	if gotText != wantText {
		t.Errorf("the merge prints\n%s\nthe whole run\n%s", gotText, wantText)
	}
}

// TestShardsWithoutSeries plans 74 series of the generated portfolio in
// 20 shards, some of which get no series at all (the hash puts none of the
// 74 in shard 5): an empty shard adds nothing, and the merge is still the
// whole run's, byte for byte.
func TestShardsWithoutSeries(t *testing.T) {
	dir := portfolioCopy(t)
	yml := string(readFile(t, dir, "plan.yaml"))
	sel := `series: ["milk/*/grocer-hill", "milk/*/cafe-*", "cream/*/cafe-*", "yoghurt/*/farm-shop", "*/*/grocer-east"]`
	if !strings.Contains(yml, `series: "**"`) {
		t.Fatal(`plan.yaml: no series: "**" to narrow`)
	}
	if err := os.WriteFile(filepath.Join(dir, "plan.yaml"), []byte(strings.Replace(yml, `series: "**"`, sel, 1)), 0o644); err != nil {
		t.Fatal(err)
	}
	whole := runOK(t, dir, "plan", "plan.yaml", "--out", "whole")
	const n = 20
	var shards []string
	empty := 0
	for k := range n {
		out := fmt.Sprintf("s%d", k)
		runOK(t, dir, "plan", "plan.yaml", "--shard", fmt.Sprintf("%d/%d", k, n), "--out", out)
		if bytes.Count(readFile(t, dir, out, "plan.csv"), []byte("\n")) == 1 {
			empty++
		}
		shards = append(shards, out)
	}
	if empty == 0 {
		t.Fatal("no shard is empty: the test does not test what it says")
	}
	text := runOK(t, dir, append([]string{"merge", "--out", "merged"}, shards...)...)
	sameRun(t, dir, "whole", "merged", whole, text)
}

// TestShardsAgreeOnStaleSeries plans a long history of 9 invented series
// in which one ends a year early and two start late, whole and in 3
// shards: every shard leaves the stale series out with the whole run's
// warning (it learns the series' extent without keeping its values), plans
// to the same end, and the merge gives the whole run's files and warning.
func TestShardsAgreeOnStaleSeries(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("series,period,value\n")
	for i := range 9 {
		first, last := 0, 48
		switch i {
		case 4:
			last = 36 // stale: ends a year before the others
		case 2, 7:
			first = 12 + 6*i/7 // start late
		}
		for m := first; m < last; m++ {
			v := 300 + 20*float64(i) + 30*math.Sin(float64(m)*0.52+float64(i)) + float64((m*5+i*7)%13)
			fmt.Fprintf(&b, "dairy/line-%d,%d-%02d,%.0f\n", i, 2021+m/12, m%12+1, v)
		}
	}
	yml := "plan: stale\nhistory: {file: h.csv, series: \"dairy/*\"}\nhorizon: 6\nbaseline: {method: ses}\n"
	for name, text := range map[string]string{"h.csv": b.String(), "p.yaml": yml} {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	var stderr bytes.Buffer
	t.Chdir(dir)
	if code := run([]string{"plan", "p.yaml", "--out", "whole", "--charts", "none"}, &IOStreams{In: strings.NewReader(""), Out: &bytes.Buffer{}, ErrOut: &stderr}, fixedNow); code != 0 {
		t.Fatalf("whole: exit %d: %s", code, stderr.String())
	}
	warn := stderr.String()
	if !strings.Contains(warn, `1 of 9 series end before`) {
		t.Fatalf("no stale warning in the whole run: %s", warn)
	}
	var shards []string
	for k := range 3 {
		out := fmt.Sprintf("s%d", k)
		stderr.Reset()
		if code := run([]string{"plan", "p.yaml", "--shard", fmt.Sprintf("%d/3", k), "--out", out}, &IOStreams{In: strings.NewReader(""), Out: &bytes.Buffer{}, ErrOut: &stderr}, fixedNow); code != 0 {
			t.Fatalf("shard %d: exit %d: %s", k, code, stderr.String())
		}
		if !strings.Contains(stderr.String(), `1 of 9 series end before 2024-12, the last period of the others`) {
			t.Errorf("shard %d: no stale warning: %s", k, stderr.String())
		}
		shards = append(shards, out)
	}
	stderr.Reset()
	if code := run(append([]string{"merge", "--out", "merged"}, shards...), &IOStreams{In: strings.NewReader(""), Out: &bytes.Buffer{}, ErrOut: &stderr}, fixedNow); code != 0 {
		t.Fatalf("merge: exit %d: %s", code, stderr.String())
	}
	if !strings.Contains(stderr.String(), `1 of 9 series end before 2024-12`) {
		t.Errorf("merge: no stale warning: %s", stderr.String())
	}
	for _, name := range []string{"plan.csv", "summary.csv", "rollup.csv", "plan.json"} {
		if !bytes.Equal(readFile(t, dir, "whole", name), readFile(t, dir, "merged", name)) {
			t.Errorf("%s differs from the whole run's", name)
		}
	}
}

// TestStressShardsMergeToWhole simulates the generated portfolio whole,
// then as N shards merged, for N = 1, 2, 3 and 7, and checks that the
// merge writes the whole run's files and text (sameRun): the paths of
// each sum are added path by path, so the quantiles are the same up to
// the order of the additions. With production frozen (N = 3), each
// resource's stock is projected from the added baseline and planned loads
// as the whole run projects it.
func TestStressShardsMergeToWhole(t *testing.T) {
	dir := portfolioCopy(t)
	yml := string(readFile(t, dir, "plan.yaml"))
	frozen := strings.Replace(yml, "\nhorizon:", "\nproduction: {mode: frozen}\nhorizon:", 1)
	if frozen == yml {
		t.Fatal("plan.yaml: no horizon line to put production before")
	}
	if err := os.WriteFile(filepath.Join(dir, "frozen.yaml"), []byte(frozen), 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		file string
		n    int
		args []string
	}{
		{"plan.yaml", 1, nil}, {"plan.yaml", 2, nil}, {"plan.yaml", 3, nil}, {"plan.yaml", 7, nil},
		{"frozen.yaml", 3, []string{"--opening-stock", "40", "--scenario", "committed"}},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%s-%d", c.file, c.n), func(t *testing.T) {
			args := append([]string{"stress", c.file, "--paths", "500"}, c.args...)
			whole := fmt.Sprintf("whole-%s-%d", c.file, c.n)
			wantText := runOK(t, dir, append(args, "--out", whole)...)
			var shards []string
			for k := range c.n {
				out := fmt.Sprintf("s-%s-%d-%d", c.file, c.n, k)
				runOK(t, dir, append(args, "--shard", fmt.Sprintf("%d/%d", k, c.n), "--out", out)...)
				shards = append(shards, out)
			}
			merged := fmt.Sprintf("merged-%s-%d", c.file, c.n)
			text := runOK(t, dir, append([]string{"merge", "--out", merged}, shards...)...)
			sameRun(t, dir, whole, merged, wantText, text)
			if c.file == "frozen.yaml" && !bytes.Contains(readFile(t, dir, merged, "stress.csv"), []byte(",production,stock,")) {
				t.Error("stress.csv of frozen production has no stock columns")
			}
		})
	}
}

// TestFitShardsMergeToWhole fits a long history of 12 invented series
// whole (--json) and as N shards merged, for N = 1, 2, 3 and 7: the merged
// fit.jsonl is the whole run's standard output, byte for byte.
func TestFitShardsMergeToWhole(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("series,period,value\n")
	for i := range 12 {
		for m := range 36 {
			v := 100 + 10*float64(i) + 20*math.Sin(float64(m)*0.5+float64(i)) + float64((m*7+i*3)%11)
			fmt.Fprintf(&b, "farm-%02d,%d-%02d,%.0f\n", i, 2022+m/12, m%12+1, v)
		}
	}
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	whole := runOK(t, dir, "fit", "--history", "h.csv", "--json", "--method", "ses")
	for _, n := range []int{1, 2, 3, 7} {
		var shards []string
		for k := range n {
			out := fmt.Sprintf("f%d-%d", n, k)
			runOK(t, dir, "fit", "--history", "h.csv", "--method", "ses", "--shard", fmt.Sprintf("%d/%d", k, n), "--out", out)
			shards = append(shards, out)
		}
		merged := fmt.Sprintf("merged%d", n)
		runOK(t, dir, append([]string{"merge", "--out", merged}, shards...)...)
		if got := readFile(t, dir, merged, "fit.jsonl"); string(got) != whole {
			t.Errorf("N = %d: fit.jsonl differs from the whole run's output", n)
		}
	}
}

func readFile(t *testing.T, parts ...string) []byte {
	t.Helper()
	b, err := os.ReadFile(filepath.Join(parts...))
	if err != nil {
		t.Fatal(err)
	}
	return b
}

// sameNumbers compares two CSV files cell by cell: text cells equal, number
// cells within 1e-9 relative or 0.005 absolute (two decimals rounded).
func sameNumbers(t *testing.T, name string, want, got []byte) {
	t.Helper()
	w, err1 := csv.NewReader(bytes.NewReader(want)).ReadAll()
	g, err2 := csv.NewReader(bytes.NewReader(got)).ReadAll()
	if err1 != nil || err2 != nil {
		t.Fatalf("%s: %v %v", name, err1, err2)
	}
	if len(w) != len(g) {
		t.Fatalf("%s: %d rows, want %d", name, len(g), len(w))
	}
	for i := range w {
		if len(w[i]) != len(g[i]) {
			t.Fatalf("%s row %d: %d cells, want %d", name, i+1, len(g[i]), len(w[i]))
		}
		for j := range w[i] {
			a, errA := strconv.ParseFloat(w[i][j], 64)
			b, errB := strconv.ParseFloat(g[i][j], 64)
			if errA != nil || errB != nil {
				if w[i][j] != g[i][j] {
					t.Errorf("%s row %d col %d: %q, want %q", name, i+1, j+1, g[i][j], w[i][j])
				}
				continue
			}
			if d := math.Abs(a - b); d > 0.005+1e-9 && d > 1e-9*math.Abs(a) {
				t.Errorf("%s row %d col %d: %v, want %v", name, i+1, j+1, b, a)
			}
		}
	}
}
