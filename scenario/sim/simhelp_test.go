package sim

import (
	"fmt"
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

// sprintf is fmt.Sprintf, short for the test tables.
func sprintf(format string, a ...any) string { return fmt.Sprintf(format, a...) }
