// Package testplan builds the small invented plans the tests of the
// packages after scenario/plan use (sim, supply, report): the files
// plantest writes, loaded and built.
package testplan

import (
	"testing"

	"forelay/scenario"
	"forelay/scenario/internal/plantest"
	"forelay/scenario/plan"
)

// Build writes the history hist and the scenario file body (without its
// history key) with plantest.Write and builds the plan; a failure fails
// the test.
func Build(tb testing.TB, body string, hist []float64) *plan.Plan {
	tb.Helper()
	p, err := BuildWithFiles(tb, body, hist, nil)
	if err != nil {
		tb.Fatal(err)
	}
	return p
}

// BuildWithFiles is Build with more files written beside the scenario
// (name to content); it returns the error of loading or building.
func BuildWithFiles(tb testing.TB, body string, hist []float64, files map[string]string) (*plan.Plan, error) {
	tb.Helper()
	f, err := scenario.Load(plantest.Write(tb, body, hist, files))
	if err != nil {
		return nil, err
	}
	return plan.Load(f)
}

// Portfolio writes the wide history of the series (names, values) and a
// scenario file reading them all (plantest.WriteWide, then body) and
// builds the portfolio on one worker; a failure fails the test.
func Portfolio(tb testing.TB, series []string, values [][]float64, body string) *plan.Portfolio {
	tb.Helper()
	f, err := scenario.Load(plantest.WriteWide(tb, series, values, body))
	if err != nil {
		tb.Fatal(err)
	}
	in, err := plan.ReadSelection(f)
	if err != nil {
		tb.Fatal(err)
	}
	pf, err := plan.BuildPortfolio(f, in, 1)
	if err != nil {
		tb.Fatal(err)
	}
	return pf
}
