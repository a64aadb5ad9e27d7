// Package plantest writes the small invented plans the tests of the
// planning packages build: a monthly history and a scenario file in a
// temporary directory. It imports none of them, so that any of their
// in-package tests can use it.
package plantest

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// History returns n invented monthly values: a level of 1000 rising by 5
// a month, a yearly swing of ±60 and noise with standard deviation 20
// (seeded, so every run sees the same numbers).
func History(n int) []float64 {
	r := rand.New(rand.NewPCG(1, 1))
	y := make([]float64, n)
	for t := range y {
		y[t] = 1000 + 5*float64(t) + 60*math.Sin(2*math.Pi*float64(t)/12) + 20*r.NormFloat64()
	}
	return y
}

// Walsh returns 49 monthly values from 1000 whose month-on-month changes
// repeat the pattern: the naive method's one-step errors are then the
// pattern itself, whole cycles of it when its length divides 48. The
// patterns (10, 10, −10, −10) and (10, −10, −10, 10) have mean zero and
// are orthogonal over whole cycles (Walsh functions), so two series built
// on them have uncorrelated errors: a known answer, worked by hand.
func Walsh(pattern ...float64) []float64 {
	y := []float64{1000}
	for t := 1; t < 49; t++ {
		y = append(y, y[t-1]+pattern[(t-1)%len(pattern)])
	}
	return y
}

// Write writes the history hist (monthly from 2022-01, series "demand")
// as history.csv and the scenario file body as plan.yaml, with
// "history: {file: history.csv}" put first, plus the other files (name to
// content), into a temporary directory, and returns plan.yaml's path.
func Write(tb testing.TB, body string, hist []float64, files map[string]string) string {
	tb.Helper()
	dir := tb.TempDir()
	var b strings.Builder
	b.WriteString("period,demand\n")
	for t, v := range hist {
		fmt.Fprintf(&b, "%d-%02d,%.4f\n", 2022+t/12, t%12+1, v)
	}
	all := map[string]string{"history.csv": b.String(), "plan.yaml": "history: {file: history.csv}\n" + body}
	for k, v := range files {
		all[k] = v
	}
	for name, content := range all {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(content), 0o644); err != nil {
			tb.Fatal(err)
		}
	}
	return filepath.Join(dir, "plan.yaml")
}

// WriteWide writes a wide monthly history from 2022-01 with one column
// per series (names, values in the same order; a shorter series leaves its
// later cells empty, and a NaN value its cell) as h.csv, and a scenario file reading every series
// of it with the naive method over 12 months, then body, as plan.yaml, in
// a temporary directory; it returns plan.yaml's path.
func WriteWide(tb testing.TB, series []string, values [][]float64, body string) string {
	tb.Helper()
	dir := tb.TempDir()
	var b strings.Builder
	b.WriteString("period," + strings.Join(series, ",") + "\n")
	for i := range values[0] {
		fmt.Fprintf(&b, "%d-%02d", 2022+i/12, i%12+1)
		for _, v := range values {
			if i < len(v) && !math.IsNaN(v[i]) {
				fmt.Fprintf(&b, ",%.4f", v[i])
			} else {
				b.WriteString(",")
			}
		}
		b.WriteString("\n")
	}
	if err := os.WriteFile(filepath.Join(dir, "h.csv"), []byte(b.String()), 0o644); err != nil {
		tb.Fatal(err)
	}
	path := filepath.Join(dir, "plan.yaml")
	if err := os.WriteFile(path, []byte("plan: p\nhistory: {file: h.csv, series: \"**\"}\nhorizon: 12\nbaseline: {method: naive}\n"+body), 0o644); err != nil {
		tb.Fatal(err)
	}
	return path
}

// EqualSlices reports, as test errors, the values of got that differ from
// want by more than tol (absolute or relative), and a length that differs
// as a fatal error.
func EqualSlices(tb testing.TB, what string, got, want []float64, tol float64) {
	tb.Helper()
	if len(got) != len(want) {
		tb.Fatalf("%s: len %d, want %d (%v)", what, len(got), len(want), got)
	}
	for i := range want {
		if !scalar.EqualWithinAbsOrRel(got[i], want[i], tol, tol) {
			tb.Errorf("%s[%d] = %.12g, want %.12g (all: %v)", what, i, got[i], want[i], got)
		}
	}
}

// Same reports a test error when got differs from want by more than tol
// (absolute or relative); a NaN want asks for a NaN.
func Same(tb testing.TB, what string, got, want, tol float64) {
	tb.Helper()
	if math.IsNaN(want) {
		if !math.IsNaN(got) {
			tb.Errorf("%s = %v, want NaN", what, got)
		}
		return
	}
	if !scalar.EqualWithinAbsOrRel(got, want, tol, tol) {
		tb.Errorf("%s = %.12g, want %.12g", what, got, want)
	}
}
