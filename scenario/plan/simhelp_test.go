package plan

import (
	"testing"

	"forelay/scenario"
	"forelay/scenario/internal/plantest"
)

// testHistory is plantest.History.
func testHistory(n int) []float64 { return plantest.History(n) }

// buildTestPlan writes the history and the scenario file body (without
// its history key) and builds the plan.
func buildTestPlan(tb testing.TB, body string, hist []float64) *Plan {
	tb.Helper()
	f, err := scenario.Load(plantest.Write(tb, body, hist, nil))
	if err != nil {
		tb.Fatal(err)
	}
	p, err := Load(f)
	if err != nil {
		tb.Fatal(err)
	}
	return p
}
