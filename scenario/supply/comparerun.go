package supply

import (
	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// A CompareRun sets the scenarios of a simulated plan side by side.
type CompareRun struct {
	// Plan is the plan simulated and Sim its simulation.
	Plan *plan.Plan
	Sim  *sim.Simulation
	// Service is the cycle service level whose demand quantile sizes the
	// pre-build.
	Service float64
	// Rows holds each scenario's key figures (Compare), in file order.
	Rows []Comparison
}

// CompareScenarios returns the key figures of every scenario of mc's
// plan, the pre-build sized at the service quantile of the simulated
// demand (see Compare). It panics if service is outside [0, 1].
func CompareScenarios(mc *sim.Simulation, service float64) *CompareRun {
	return &CompareRun{Plan: mc.Plan, Sim: mc, Service: service, Rows: Compare(mc, service)}
}
