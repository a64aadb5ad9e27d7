package shard

import (
	"encoding/json"
	"fmt"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/series"
	"forelay/scenario/sim"
	"forelay/scenario/supply"
)

// StressSums is sums.json of a shard of a portfolio stress run: the paths
// of the shard's part of each sum (the total, then each resource's load),
// per scenario, sum and period, to be added path by path.
type StressSums struct {
	Version int    `json:"version"`
	Kind    string `json:"kind"`
	// Plan, Units, Inputs and CaseEvents (each scenario's events) are
	// what stress.json says of the whole run.
	Plan       string            `json:"plan"`
	Units      string            `json:"units"`
	Inputs     map[string]string `json:"inputs"`
	CaseEvents [][]string        `json:"case_events"`
	Series     int               `json:"series"`
	Periods    []string          `json:"periods"`
	Scenarios  []string          `json:"scenarios"`
	Paths      int               `json:"paths"`
	Seed       uint64            `json:"seed"`
	Window     int               `json:"window"`
	Fitted     int               `json:"fitted"`
	Breach     float64           `json:"breach"`
	Warnings   []string          `json:"warnings"`
	// Freq is the name of the periods; Chart the index of the scenario
	// whose band the charts draw (stress --scenario).
	Freq  string `json:"freq"`
	Chart int    `json:"chart"`
	// Frozen tells whether the file freezes production, and Opening is
	// the stock before the first period (stress --opening-stock).
	Frozen  bool    `json:"frozen"`
	Opening float64 `json:"opening"`
	// Sums names the sums: sim.TotalSum, then each resource's id, with
	// its capacity per period (empty for the total or without one).
	Sums []StressSum `json:"sums"`
	// Demand[k][j][t] holds the paths of sum j in scenario k and period t.
	Demand [][][]Floats `json:"demand"`
}

// A StressSum is one sum of a stress run.
type StressSum struct {
	Name     string `json:"name"`
	Capacity Floats `json:"capacity"`
	// Units and PerUnit are a resource's, Members the number of the
	// shard's series it loads.
	Units   string  `json:"units"`
	PerUnit float64 `json:"per_unit"`
	Members int     `json:"members"`
	// Baseline is the demand of the shard's series on a resource under
	// their baselines, per period, and Planned[k] under their plans in
	// scenario k (both before per_unit): the parts of the loads that
	// frozen production holds production at and projects stock against.
	// Empty unless the file freezes production.
	Baseline Floats   `json:"baseline,omitempty"`
	Planned  []Floats `json:"planned,omitempty"`
}

// A StressRun is what a stress run in shards simulates besides the
// portfolio: the Monte Carlo's options, the settings (Breach and, when the
// file freezes production, Opening), the index of the scenario whose band
// the charts draw, and the file's resources to report on (some of
// AllResources, scenario.File.PickResources).
type StressRun struct {
	Options   sim.SimOptions
	Settings  supply.StressSettings
	Chart     int
	Resources []scenario.Resource
}

// NewStressSums simulates the shard's part of each sum of a portfolio
// stress (supply.PortfolioSums of run's resources) as run says. A shard
// without series of its own adds zeros. It returns the error of
// supply.CheckPortfolioProduction.
func NewStressSums(pf *plan.Portfolio, run StressRun) (*StressSums, error) {
	opt, st, chart := run.Options, run.Settings, run.Chart
	f := pf.File
	if pf.Shard == nil {
		return nil, fmt.Errorf("shard: the portfolio is not that of a shard")
	}
	if err := supply.CheckPortfolioProduction(pf); err != nil {
		return nil, err
	}
	s := &StressSums{Version: SumsVersion, Kind: "stress", Series: len(pf.Shard.All), Paths: opt.Paths, Seed: opt.Seed, Breach: st.Breach,
		Warnings: []string{}, Freq: pf.Shard.First.Freq.String(), Chart: chart}
	if pr := f.Production; pr != nil && pr.Mode == scenario.Frozen {
		s.Frozen, s.Opening = true, st.Opening
	}
	if s.Paths == 0 {
		s.Paths = sim.DefaultPaths
	}
	hz := f.Horizon
	for t := range hz {
		s.Periods = append(s.Periods, pf.Shard.First.Add(t).String())
	}
	for _, c := range f.Cases() {
		s.Scenarios = append(s.Scenarios, c.Name)
		ids := []string{}
		for _, e := range c.Events {
			ids = append(ids, e.ID)
		}
		s.CaseEvents = append(s.CaseEvents, ids)
	}
	s.Plan, s.Units, s.Inputs = f.Plan, f.Units, pf.Shard.Inputs
	s.Sums = append(s.Sums, StressSum{Name: sim.TotalSum, Members: len(pf.Plans)})
	for _, r := range run.Resources {
		ss := StressSum{Name: r.ID, Units: r.Units, PerUnit: r.PerUnit}
		var own []string
		for _, n := range pf.Names {
			if series.Match(r.Series, n) {
				ss.Members++
				own = append(own, n)
			}
		}
		if r.Capacity != nil {
			for t := range hz {
				ss.Capacity = append(ss.Capacity, r.Capacity.At(pf.Shard.First.Add(t)))
			}
		}
		if s.Frozen {
			demand := func(pick func(p *plan.Plan) []float64) Floats {
				return supply.Resource{Series: own, PerUnit: 1}.Load(hz, func(name string) []float64 {
					if p := pf.PlanOf(name); p != nil {
						return pick(p)
					}
					return nil
				})
			}
			ss.Baseline = demand(func(p *plan.Plan) []float64 { return p.Baseline })
			for k := range f.Cases() {
				ss.Planned = append(ss.Planned, demand(func(p *plan.Plan) []float64 { return p.Scenarios[k].Adjusted }))
			}
		}
		s.Sums = append(s.Sums, ss)
	}
	s.Warnings = append(s.Warnings, pf.Warnings...)
	if len(pf.Plans) == 0 {
		for range s.Scenarios {
			var row [][]Floats
			for range s.Sums {
				var sum []Floats
				for range hz {
					sum = append(sum, make(Floats, s.Paths))
				}
				row = append(row, sum)
			}
			s.Demand = append(s.Demand, row)
		}
		return s, nil
	}
	mc, err := sim.SimulatePortfolio(pf, supply.PortfolioSums(pf, supply.PortfolioResourcesOf(pf, run.Resources)), opt)
	if err != nil {
		return nil, err
	}
	s.Window, s.Fitted = mc.Window, mc.Fitted
	for _, sets := range mc.Scenarios {
		var row [][]Floats
		for _, ps := range sets {
			var sum []Floats
			for _, d := range ps.Demand {
				sum = append(sum, d)
			}
			row = append(row, sum)
		}
		s.Demand = append(s.Demand, row)
	}
	return s, nil
}

// StressFiles returns the files of a shard of a portfolio stress run:
// sums.json (NewStressSums).
func StressFiles(pf *plan.Portfolio, run StressRun) ([]File, error) {
	s, err := NewStressSums(pf, run)
	if err != nil {
		return nil, err
	}
	js, err := json.Marshal(s)
	if err != nil {
		return nil, err
	}
	return []File{{"sums.json", append(js, '\n')}}, nil
}
