package sim

import (
	"fmt"
	"forelay/scenario/internal/testplan"
	"forelay/scenario/plan"
	"testing"

	"forelay/scenario/internal/plantest"
)

// testHistory is plantest.History.
func testHistory(n int) []float64 { return plantest.History(n) }

// buildTestPlan is testplan.Build.
func buildTestPlan(tb testing.TB, body string, hist []float64) *plan.Plan {
	tb.Helper()
	return testplan.Build(tb, body, hist)
}

// sprintf is fmt.Sprintf, short for the test tables.
func sprintf(format string, a ...any) string { return fmt.Sprintf(format, a...) }
