package supply

import (
	"testing"

	"forelay/scenario/internal/plantest"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
)

// testHistory is plantest.History.
func testHistory(n int) []float64 { return plantest.History(n) }

// buildTestPlan is testplan.Build.
func buildTestPlan(tb testing.TB, body string, hist []float64) *plan.Plan {
	tb.Helper()
	return testplan.Build(tb, body, hist)
}

// buildWithFiles is testplan.BuildWithFiles.
func buildWithFiles(tb testing.TB, body string, hist []float64, files map[string]string) (*plan.Plan, error) {
	tb.Helper()
	return testplan.BuildWithFiles(tb, body, hist, files)
}
