package supply

import (
	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
	"math"
	"slices"
)

// A Comparison holds one scenario's key figures, to be set side by side
// with the other scenarios'.
type Comparison struct {
	// Name is the scenario's name and Events its future events, in file
	// order.
	Name   string
	Events []*scenario.Event
	// Total is the sum of the adjusted plan over the plan's periods and
	// BaselineTotal the baseline's.
	Total, BaselineTotal float64
	// Peak is the period (index) of the adjusted plan's highest value,
	// PeakValue that value.
	Peak      int
	PeakValue float64
	// P90Peak is the period of the highest simulated P90 of demand,
	// P90PeakValue that P90.
	P90Peak      int
	P90PeakValue float64
	// PAnyBreach is the share of simulated paths on which demand exceeds
	// capacity in at least one period; NaN when the file sets no capacity.
	PAnyBreach float64
	// Prebuild is the stock to hold at the start of the first period whose
	// demand at the service quantile exceeds capacity, PrebuildAt that
	// period (see PlanBuffer): 0 and -1 when no period does, NaN and -1
	// without capacity.
	Prebuild   float64
	PrebuildAt int
	// Contributions lists each event of the scenario with its
	// contribution to Total, in file order; they add up to
	// Total − BaselineTotal.
	Contributions []Contribution
}

// A Contribution is one event's share of a scenario's total.
type Contribution struct {
	// ID is the event's id.
	ID string
	// Total is the sum of the event's contribution (at its full effect,
	// as in the adjusted plan) over the plan's periods.
	Total float64
}

// Compare returns the key figures of every scenario of the simulated plan,
// in file order. The pre-build need uses each scenario's simulated demand
// at the service quantile. It panics if service is outside [0, 1].
func Compare(sim *sim.Simulation, service float64) []Comparison {
	p := sim.Plan
	capacity := CapacityPerPeriod(p)
	base := plan.Total(p.Baseline)
	out := make([]Comparison, len(p.Scenarios))
	for s, sp := range p.Scenarios {
		ps := sim.Scenarios[s]
		c := Comparison{Name: sp.Name, Events: slices.Clone(sp.Events), Total: plan.Total(sp.Adjusted), BaselineTotal: base,
			PAnyBreach: math.NaN(), Prebuild: math.NaN(), PrebuildAt: -1}
		c.Peak, c.PeakValue = plan.Peak(sp.Adjusted)
		p90 := make([]float64, len(ps.Spread))
		for t, sd := range ps.Spread {
			p90[t] = sd.P90
		}
		c.P90Peak, c.P90PeakValue = plan.Peak(p90)
		if capacity != nil {
			c.PAnyBreach = CapacityRisk(ps, capacity, 1).PAnyBreach
			b := PlanBuffer(ps.QuantileDemand(service), capacity, 0)
			c.Prebuild, c.PrebuildAt = b.Prebuild, b.PrebuildAt
		}
		for _, e := range p.Future {
			if slices.Contains(sp.Events, e) {
				c.Contributions = append(c.Contributions, Contribution{ID: e.ID, Total: plan.Total(sp.Contrib[e.ID])})
			}
		}
		out[s] = c
	}
	return out
}
