package supply

import (
	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/sim"
)

// PortfolioSums returns what a portfolio's Monte Carlo follows: the total
// of every series, then the load of each resource (its series weighted by
// PerUnit; a resource with no planned series is a sum of nothing, zero on
// every path).
func PortfolioSums(pf *plan.Portfolio, res []Resource) []sim.Sum {
	sums := []sim.Sum{sim.TotalOf(pf)}
	for _, r := range res {
		s := sim.Sum{Name: r.ID}
		for _, name := range r.Series {
			if i := pf.IndexOf(name); i >= 0 {
				s.Members = append(s.Members, i)
				s.Weights = append(s.Weights, r.PerUnit)
			}
		}
		sums = append(sums, s)
	}
	return sums
}

// CheckPortfolioProduction returns an error naming the file's
// production.plan key when the file freezes a portfolio's production at a
// plan read from a file: a production plan file gives one series, not
// each resource's production. Call it before drawing paths, to fail
// before the work.
func CheckPortfolioProduction(pf *plan.Portfolio) error {
	pr := pf.File.Production
	if pr != nil && pr.Mode == scenario.Frozen && pr.Plan != "" {
		return pf.File.ValueError("production.plan", pr.Pos,
			"%s: a production plan file gives one series; in a plan of several series each resource's production is held at its baseline load (leave production.plan out)", pr.Plan)
	}
	return nil
}

// A PortfolioStressRun is a portfolio's simulated total and resource loads
// set against each resource's capacity and, when the scenario file
// freezes production, each resource's stock projected under each
// scenario.
type PortfolioStressRun struct {
	// Portfolio is the portfolio simulated and Sim its simulation, whose
	// sums are PortfolioSums(Portfolio, Resources).
	Portfolio *plan.Portfolio
	Sim       *sim.PortfolioSimulation
	// Resources are the portfolio's resources (PortfolioResources).
	Resources []Resource
	// Settings are those the run was made with (Production unused: a
	// portfolio's production is frozen at each resource's baseline load).
	Settings StressSettings
	// Total holds each scenario's simulated total demand, without a
	// capacity (CapacityRisk with none), in file order; its Name is the
	// scenario's.
	Total []Risk
	// Risks[k][j] is the capacity risk of Resources[j] in scenario k: its
	// simulated load against its capacity; its Name is the resource's id.
	Risks [][]Risk
	// Frozen[k][j] is the stock projection of Resources[j] in scenario k
	// when production is frozen (production held at the resource's load
	// under the baseline, in the resource's units); nil otherwise.
	Frozen [][]StockProjection
	// Warnings are the portfolio's warnings.
	Warnings []string
}

// PortfolioStress sets the simulated loads of mc (made with the sums of
// PortfolioSums(mc.Portfolio, res)) against each resource's capacity
// (CapacityRisk with s.Breach) and, when the file sets production:
// {mode: frozen}, projects each resource's stock from s.Opening with
// production held at its baseline load (the resource's use of the
// baseline forecasts). The stock of a resource is in its units: the load
// of the goods built ahead.
//
// It returns the error of CheckPortfolioProduction.
func PortfolioStress(mc *sim.PortfolioSimulation, res []Resource, s StressSettings) (*PortfolioStressRun, error) {
	pf := mc.Portfolio
	r := &PortfolioStressRun{Portfolio: pf, Sim: mc, Resources: res, Settings: s, Warnings: pf.Warnings}
	if err := CheckPortfolioProduction(pf); err != nil {
		return nil, err
	}
	pr := pf.File.Production
	frozen := pr != nil && pr.Mode == scenario.Frozen
	for k, sets := range mc.Scenarios {
		total := CapacityRisk(sets[0], nil, s.Breach)
		total.Name = pf.Plans[0].Scenarios[k].Name
		r.Total = append(r.Total, total)
		var risks []Risk
		var stocks []StockProjection
		for j, res := range res {
			ps := sets[j+1]
			risks = append(risks, CapacityRisk(ps, res.Capacity, s.Breach))
			if frozen {
				prod := res.Load(len(ps.Demand), func(name string) []float64 {
					if p := pf.PlanOf(name); p != nil {
						return p.Baseline
					}
					return nil
				})
				stocks = append(stocks, ProjectStock(prod, PortfolioLoad(pf, res, k), res.Capacity, s.Opening, ps))
			}
		}
		r.Risks = append(r.Risks, risks)
		if frozen {
			r.Frozen = append(r.Frozen, stocks)
		}
	}
	return r, nil
}
