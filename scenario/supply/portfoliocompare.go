package supply

import (
	"math"

	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// A ResourceFigures holds one resource's key figures in one scenario.
type ResourceFigures struct {
	// ID is the resource's id.
	ID string
	// PAnyBreach is the share of simulated paths on which the load
	// exceeds capacity in at least one period; NaN without a capacity.
	PAnyBreach float64
	// Prebuild is the stock (in the resource's units) to hold at the start
	// of PrebuildAt, the first period whose load at the service quantile
	// exceeds capacity (PlanBuffer from an empty stock): 0 and -1 when no
	// period does, NaN and -1 without a capacity.
	Prebuild   float64
	PrebuildAt int
}

// A PortfolioCompareRun sets the scenarios of a simulated portfolio side
// by side: the total of its series, and each resource.
type PortfolioCompareRun struct {
	// Portfolio is the portfolio simulated and Sim its simulation (made
	// with the sums of PortfolioSums(Portfolio, Resources)).
	Portfolio *plan.Portfolio
	Sim       *sim.PortfolioSimulation
	Resources []Resource
	// Service is the cycle service level whose load quantile sizes the
	// pre-builds.
	Service float64
	// Rows holds each scenario's figures for the total, in file order:
	// as Compare's, summed over the series (Events are the scenario's
	// events that act on the plan's periods) (the peaks are those of the
	// summed plan and of the simulated total's P90; an event's
	// contribution is summed over the series it moves), with PAnyBreach
	// and Prebuild NaN (the total has no capacity).
	Rows []Comparison
	// Loads[k][j] holds the figures of Resources[j] in scenario k.
	Loads [][]ResourceFigures
	// Baseline is the sum of the series' baselines in each period and
	// Adjusted[k] that of their plans under scenario k.
	Baseline []float64
	Adjusted [][]float64
}

// ComparePortfolio returns the key figures of every scenario of mc's
// portfolio: the total and each resource of res (mc must have been drawn
// with PortfolioSums(mc.Portfolio, res)). It panics if service is outside
// [0, 1].
func ComparePortfolio(mc *sim.PortfolioSimulation, res []Resource, service float64) *PortfolioCompareRun {
	pf := mc.Portfolio
	p0 := pf.Plans[0]
	H := len(p0.Periods)
	r := &PortfolioCompareRun{Portfolio: pf, Sim: mc, Resources: res, Service: service}
	r.Baseline = make([]float64, H)
	for _, p := range pf.Plans {
		for t, v := range p.Baseline {
			r.Baseline[t] += v
		}
	}
	base := plan.Total(r.Baseline)
	cases := pf.File.Cases()
	for k, sp := range p0.Scenarios {
		adjusted := make([]float64, H)
		contrib := map[string]float64{}
		for _, p := range pf.Plans {
			s := &p.Scenarios[k]
			for t, v := range s.Adjusted {
				adjusted[t] += v
			}
			for id, c := range s.Contrib {
				contrib[id] += plan.Total(c)
			}
		}
		c := Comparison{Name: sp.Name, Total: plan.Total(adjusted), BaselineTotal: base,
			PAnyBreach: math.NaN(), Prebuild: math.NaN(), PrebuildAt: -1}
		c.Peak, c.PeakValue = plan.Peak(adjusted)
		total := mc.Scenarios[k][0]
		p90 := make([]float64, H)
		for t, sd := range total.Spread {
			p90[t] = sd.P90
		}
		c.P90Peak, c.P90PeakValue = plan.Peak(p90)
		for _, e := range cases[k].Events {
			if v, ok := contrib[e.ID]; ok {
				c.Events = append(c.Events, e)
				c.Contributions = append(c.Contributions, Contribution{ID: e.ID, Total: v})
			}
		}
		r.Rows = append(r.Rows, c)
		r.Adjusted = append(r.Adjusted, adjusted)
		var loads []ResourceFigures
		for j, rs := range res {
			f := ResourceFigures{ID: rs.ID, PAnyBreach: math.NaN(), Prebuild: math.NaN(), PrebuildAt: -1}
			if rs.Capacity != nil {
				ps := mc.Scenarios[k][j+1]
				f.PAnyBreach = CapacityRisk(ps, rs.Capacity, 1).PAnyBreach
				b := PlanBuffer(ps.QuantileDemand(service), rs.Capacity, 0)
				f.Prebuild, f.PrebuildAt = b.Prebuild, b.PrebuildAt
			}
			loads = append(loads, f)
		}
		r.Loads = append(r.Loads, loads)
	}
	return r
}
