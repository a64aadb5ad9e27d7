package supply

import (
	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"slices"
)

// StressSettings are the settings of a stress run. The zero value reports
// every period with any chance of breach as the first breach and projects
// frozen production from an empty stock.
type StressSettings struct {
	// Breach is the breach threshold: FirstBreach of each scenario is the
	// first period whose probability of demand above capacity exceeds it.
	Breach float64
	// Opening is the stock before the first period, for frozen
	// production.
	Opening float64
	// Production is the frozen production plan (plan.ReadProduction);
	// nil holds production at the baseline. A file that names a frozen
	// production plan needs it read here (see FrozenProduction).
	Production *plan.Production
}

// A StressRun is a simulated plan set against its capacity and, when the
// scenario file freezes production, the stock projected under each
// scenario.
type StressRun struct {
	// Plan is the plan simulated and Sim its simulation.
	Plan *plan.Plan
	Sim  *sim.Simulation
	// Settings are those the run was made with.
	Settings StressSettings
	// Risks holds each scenario's capacity risk (CapacityRisk), in file
	// order.
	Risks []Risk
	// Frozen holds each scenario's stock projection (ProjectStock) when
	// production is frozen, in file order; nil otherwise.
	Frozen []StockProjection
	// Source says where frozen production comes from: the production
	// plan's file, or "baseline" (see FrozenProduction); empty when
	// production is not frozen.
	Source string
	// Notes are the run's own remarks, one sentence each, besides those
	// of the plan and the simulation.
	Notes []string
	// Warnings are the plan's warnings and, under frozen production, one
	// per period where the frozen plan asks for more than capacity
	// (OverloadWarnings).
	Warnings []string
}

// Stress sets the simulated demand of every scenario of mc's plan against
// the plan's capacity (CapacityRisk with the Breach threshold) and, when
// the file sets production: {mode: frozen}, projects the stock of each
// scenario under the frozen production from the Opening stock
// (FrozenProduction with s.Production, ProjectStock). A production plan
// named without the frozen mode is not used, and a note says so.
//
// It returns the error of FrozenProduction for a production plan that
// does not cover the plan or was not read.
func Stress(mc *sim.Simulation, s StressSettings) (*StressRun, error) {
	p := mc.Plan
	r := &StressRun{Plan: p, Sim: mc, Settings: s, Warnings: p.Warnings}
	capacity := CapacityPerPeriod(p)
	for _, ps := range mc.Scenarios {
		r.Risks = append(r.Risks, CapacityRisk(ps, capacity, s.Breach))
	}
	pr := p.File.Production
	switch {
	case pr != nil && pr.Mode == scenario.Frozen:
		prod, src, err := FrozenProduction(p, s.Production)
		if err != nil {
			return nil, err
		}
		r.Source = src
		r.Warnings = append(slices.Clip(r.Warnings), OverloadWarnings(p, prod, src)...)
		for k, sp := range p.Scenarios {
			r.Frozen = append(r.Frozen, ProjectStock(prod, sp.Adjusted, capacity, s.Opening, mc.Scenarios[k]))
		}
	case pr != nil && pr.Plan != "":
		r.Notes = append(r.Notes, "production.plan is read only with production mode frozen")
	}
	return r, nil
}
