package plan

import (
	"fmt"
	"math"
	"strings"

	"forelay/forecast"
)

// TotalGroup is the group of the roll-up over every series.
const TotalGroup = "total"

// A Rollup is one scenario's plan summed over a group of series: every
// series at the level whose names start with Group (or all of them for
// the total).
type Rollup struct {
	// Scenario is the scenario's name. Level is the name of the level
	// (Portfolio.Levels, or TotalGroup), Depth its depth (1 for the widest
	// level, 0 for the total) and Group the first Depth levels of the
	// members' names joined by "/" (TotalGroup for the total).
	Scenario, Level string
	Depth           int
	Group           string
	// Members are the series summed, in the order of Portfolio.Names.
	Members []string
	// Baseline, Adjusted and RiskWeighted are the sums of the members'
	// baselines and (floored) scenario plans.
	Baseline, Adjusted, RiskWeighted []float64
	// Var is the variance of the sum, not a sum of variances: the
	// baseline errors' joint variance (forecast.SumVariance) plus, for
	// each event of the scenario, the square of the summed standard
	// deviations of its contributions (an event's outcome is one for every
	// series it moves). Lower and Upper are Adjusted -/+ z sqrt(Var),
	// clipped at the sum of the members' floors when the plan has a floor.
	Var, Lower, Upper []float64
}

// Rollups returns the roll-ups of scenario name: the total, then every
// group of each level from the widest, groups in the order their first
// member appears in Names. The deepest level, the series themselves, is
// not rolled up. It returns an error for
// an unknown scenario, and that of forecast.SumVariance when the members'
// errors cannot be set side by side.
func (pf *Portfolio) Rollups(name string) ([]Rollup, error) {
	if len(pf.Plans) == 0 {
		return nil, nil
	}
	k, err := pf.Plans[0].ScenarioIndex(name)
	if err != nil {
		return nil, err
	}
	depth := 0
	for _, n := range pf.Names {
		depth = max(depth, strings.Count(n, "/")+1)
	}
	var out []Rollup
	all := make([]int, len(pf.Plans))
	for i := range all {
		all[i] = i
	}
	r, err := pf.rollup(k, all)
	if err != nil {
		return nil, err
	}
	r.Level, r.Group = TotalGroup, TotalGroup
	out = append(out, r)
	for d := 1; d < depth; d++ {
		var order []string
		groups := map[string][]int{}
		for i, n := range pf.Names {
			g := prefix(n, d)
			if _, ok := groups[g]; !ok {
				order = append(order, g)
			}
			groups[g] = append(groups[g], i)
		}
		for _, g := range order {
			r, err := pf.rollup(k, groups[g])
			if err != nil {
				return nil, fmt.Errorf("group %q: %w", g, err)
			}
			r.Depth, r.Group = d, g
			r.Level = fmt.Sprintf("level%d", d)
			if d <= len(pf.Levels) {
				r.Level = pf.Levels[d-1]
			}
			out = append(out, r)
		}
	}
	return out, nil
}

// SumOf returns scenario k of the portfolio summed over the series called
// members (those it plans; names it does not plan are skipped), as a
// roll-up with Level and Group empty: the sum a resource's load is built
// on. It returns nil and no error when no member is planned.
func (pf *Portfolio) SumOf(k int, members []string) (*Rollup, error) {
	var idx []int
	for _, m := range members {
		if i := pf.IndexOf(m); i >= 0 {
			idx = append(idx, i)
		}
	}
	if len(idx) == 0 {
		return nil, nil
	}
	r, err := pf.rollup(k, idx)
	if err != nil {
		return nil, err
	}
	return &r, nil
}

// prefix returns the first d levels of name.
func prefix(name string, d int) string {
	parts := strings.SplitN(name, "/", d+1)
	return strings.Join(parts[:min(d, len(parts))], "/")
}

// rollup sums scenario k over the plans of members.
func (pf *Portfolio) rollup(k int, members []int) (Rollup, error) {
	p0 := pf.Plans[members[0]]
	hz := len(p0.Baseline)
	r := Rollup{Scenario: p0.Scenarios[k].Name, Baseline: make([]float64, hz), Adjusted: make([]float64, hz),
		RiskWeighted: make([]float64, hz), Lower: make([]float64, hz), Upper: make([]float64, hz)}
	var fits []*forecast.Result     // nil for new series: no baseline error
	sigma := map[string][]float64{} // summed sd of each event's contributions
	var events []string
	floor := 0.0
	for _, i := range members {
		p := pf.Plans[i]
		sp := &p.Scenarios[k]
		r.Members = append(r.Members, p.History.Name)
		if p.Fit != nil {
			fits = append(fits, p.Fit)
		}
		if p.Floor != nil {
			floor += *p.Floor
		}
		for t := range hz {
			r.Baseline[t] += p.Baseline[t]
			r.Adjusted[t] += sp.Adjusted[t]
			r.RiskWeighted[t] += sp.RiskWeighted[t]
		}
		for _, e := range sp.Events {
			if _, ok := sigma[e.ID]; !ok {
				sigma[e.ID] = make([]float64, hz)
				events = append(events, e.ID)
			}
			for t, s := range p.Effects[e.ID].Sigma {
				sigma[e.ID][t] += s
			}
		}
	}
	v := make([]float64, hz)
	if len(fits) > 0 {
		var err error
		if v, err = forecast.SumVariance(fits, hz, p0.Mode, p0.From, pf.Span); err != nil {
			return Rollup{}, err
		}
	}
	for _, id := range events {
		for t, s := range sigma[id] {
			v[t] += s * s
		}
	}
	r.Var = v
	for t := range hz {
		w := p0.Z * math.Sqrt(v[t])
		r.Lower[t], r.Upper[t] = r.Adjusted[t]-w, r.Adjusted[t]+w
		if p0.Floor != nil {
			r.Lower[t] = max(r.Lower[t], floor)
		}
	}
	return r, nil
}
