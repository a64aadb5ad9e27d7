package supply

import (
	"math"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/series"
)

// CapacityResource is the id of the resource the scenario file's capacity
// block describes.
const CapacityResource = "capacity"

// A Resource is something the plan's demand uses and whose capacity is
// limited, keyed by its id: a line, a warehouse, a fleet. Its load is
// PerUnit times the demand of the series it serves. Today a plan has at
// most one, the scenario file's capacity block: the resource "capacity"
// over the plan's series with one unit per unit of demand.
type Resource struct {
	ID string
	// Units labels the load (line-hours); empty for none.
	Units string
	// Series names the series whose demand loads the resource.
	Series []string
	// PerUnit is the resource used per unit of demand.
	PerUnit float64
	// Capacity is the capacity in each of the plan's periods; nil when
	// the resource has none (its load is reported without a limit).
	Capacity []float64
}

// Resources returns the plan's resources in file order, keyed by id; none
// without a capacity block.
func Resources(p *plan.Plan) []Resource {
	c := p.File.Capacity
	if c == nil {
		return nil
	}
	capacity := make([]float64, len(p.Periods))
	for t, per := range p.Periods {
		capacity[t] = c.At(per)
	}
	return []Resource{{ID: CapacityResource, Series: []string{p.History.Name}, PerUnit: 1, Capacity: capacity}}
}

// ResourceOf returns the plan's resource called id, or nil.
func ResourceOf(p *plan.Plan, id string) *Resource {
	for _, r := range Resources(p) {
		if r.ID == id {
			return &r
		}
	}
	return nil
}

// Load returns the resource's load in each of n periods: PerUnit times the
// sum, over the resource's Series, of the demand that demand returns for
// the series (nil for a series the scenario does not plan, which adds
// nothing; periods beyond a shorter demand add nothing either).
func (r Resource) Load(n int, demand func(series string) []float64) []float64 {
	load := make([]float64, n)
	for _, s := range r.Series {
		d := demand(s)
		for t := range min(len(d), len(load)) {
			load[t] += d[t]
		}
	}
	for t := range load {
		load[t] *= r.PerUnit
	}
	return load
}

// Utilisation returns load / capacity in each period, NaN where the
// resource has no capacity (none given, or not above 0).
func (r Resource) Utilisation(load []float64) []float64 {
	u := make([]float64, len(load))
	for t, l := range load {
		u[t] = math.NaN()
		if t < len(r.Capacity) && r.Capacity[t] > 0 {
			u[t] = l / r.Capacity[t]
		}
	}
	return u
}

// PortfolioResources returns the resources of a portfolio's file
// (scenario.File.AllResources: its resources, or the one its top-level
// capacity stands for), in file order, each with the portfolio's series
// its pattern matches, in the order of Portfolio.Names, and its capacity
// in each plan period.
func PortfolioResources(pf *plan.Portfolio) []Resource {
	return PortfolioResourcesOf(pf, pf.File.AllResources())
}

// PortfolioResourcesOf returns the resources rs of a portfolio's file (some
// of AllResources, scenario.File.PickResources), each as
// PortfolioResources gives it.
func PortfolioResourcesOf(pf *plan.Portfolio, rs []scenario.Resource) []Resource {
	periods := pf.Plans[0].Periods
	var out []Resource
	for _, r := range rs {
		res := Resource{ID: r.ID, Units: r.Units, PerUnit: r.PerUnit}
		for _, n := range pf.Names {
			if series.Match(r.Series, n) {
				res.Series = append(res.Series, n)
			}
		}
		if r.Capacity != nil {
			res.Capacity = make([]float64, len(periods))
			for t, per := range periods {
				res.Capacity[t] = r.Capacity.At(per)
			}
		}
		out = append(out, res)
	}
	return out
}

// PortfolioLoad returns the load of resource r in scenario k of the
// portfolio: Load over the series' plans (the floored adjusted plans).
func PortfolioLoad(pf *plan.Portfolio, r Resource, k int) []float64 {
	return r.Load(len(pf.Plans[0].Periods), func(s string) []float64 {
		if p := pf.PlanOf(s); p != nil {
			return p.Scenarios[k].Adjusted
		}
		return nil
	})
}
