package supply

import (
	"forelay/scenario"
	"forelay/scenario/plan"
	"testing"

	"forelay/scenario/internal/plantest"
)

// testHistory is plantest.History.
func testHistory(n int) []float64 { return plantest.History(n) }

// buildTestPlan writes the history and the scenario file body (without
// its history key) and builds the plan.
func buildTestPlan(tb testing.TB, body string, hist []float64) *plan.Plan {
	tb.Helper()
	f, err := scenario.Load(plantest.Write(tb, body, hist, nil))
	if err != nil {
		tb.Fatal(err)
	}
	p, err := plan.Load(f)
	if err != nil {
		tb.Fatal(err)
	}
	return p
}

// buildWithFiles is buildTestPlan with more files written beside the
// scenario (name -> content); it returns the error of Load or Build.
func buildWithFiles(tb testing.TB, body string, hist []float64, files map[string]string) (*plan.Plan, error) {
	tb.Helper()
	f, err := scenario.Load(plantest.Write(tb, body, hist, files))
	if err != nil {
		return nil, err
	}
	return plan.Load(f)
}
