package scenario

import (
	"testing"

	"forelay/scenario/internal/plantest"
)

// testHistory is plantest.History.
func testHistory(n int) []float64 { return plantest.History(n) }

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
	f, err := Load(plantest.Write(tb, body, hist, files))
	if err != nil {
		return nil, err
	}
	return Build(f)
}
