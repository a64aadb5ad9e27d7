package scenario

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// testHistory returns n invented monthly values: a level of 1000 rising
// by 5 a month, a yearly swing of ±60 and noise with standard deviation
// 20 (seeded, so every run sees the same numbers).
func testHistory(n int) []float64 {
	r := rand.New(rand.NewPCG(1, 1))
	y := make([]float64, n)
	for t := range y {
		y[t] = 1000 + 5*float64(t) + 60*math.Sin(2*math.Pi*float64(t)/12) + 20*r.NormFloat64()
	}
	return y
}

// buildTestPlan writes the history (monthly from 2022-01) and the
// scenario file body into a temporary directory and builds the plan. body
// is the scenario file without its history key, which is added.
func buildTestPlan(tb testing.TB, body string, hist []float64) *Plan {
	tb.Helper()
	p, err := buildWithFiles(tb, body, hist, nil)
	if err != nil {
		tb.Fatal(err)
	}
	return p
}

// buildWithFiles is buildTestPlan with more files written beside the
// scenario (name -> content); it returns the error of Load or Build.
func buildWithFiles(tb testing.TB, body string, hist []float64, files map[string]string) (*Plan, error) {
	tb.Helper()
	dir := tb.TempDir()
	var b strings.Builder
	b.WriteString("period,demand\n")
	for t, v := range hist {
		fmt.Fprintf(&b, "%d-%02d,%.4f\n", 2022+t/12, t%12+1, v)
	}
	files2 := map[string]string{"history.csv": b.String(), "plan.yaml": "history: {file: history.csv}\n" + body}
	for k, v := range files {
		files2[k] = v
	}
	for name, content := range files2 {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(content), 0o644); err != nil {
			tb.Fatal(err)
		}
	}
	f, err := Load(filepath.Join(dir, "plan.yaml"))
	if err != nil {
		return nil, err
	}
	return Build(f)
}

// sprintf is fmt.Sprintf, short for the test tables.
func sprintf(format string, a ...any) string { return fmt.Sprintf(format, a...) }
