package supply

import "forelay/scenario/plan"

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
	// Series names the series whose demand loads the resource.
	Series []string
	// PerUnit is the resource used per unit of demand.
	PerUnit float64
	// Capacity is the capacity in each of the plan's periods.
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
