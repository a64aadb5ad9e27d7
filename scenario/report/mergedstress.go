package report

import (
	"forelay/scenario/sim"
	"forelay/scenario/supply"
)

// MergedStress is a portfolio's stress run put together from shards (see
// package shard): what stress.json says, with the risks worked out on
// the added paths.
type MergedStress struct {
	// Plan and Units are the scenario file's; Series is the number of
	// series planned, Fitted of those with a baseline; Paths, Seed, Window
	// (the periods errors are drawn over) and Breach the run's settings.
	Plan, Units           string
	Series, Fitted, Paths int
	Window                int
	Seed                  uint64
	Breach                float64
	// Inputs are the digests of the input files, Warnings the run's.
	Inputs   map[string]string
	Warnings []string
	// Periods are the plan's periods; Scenarios and CaseEvents each
	// scenario's name and event ids.
	Periods    []string
	Scenarios  []string
	CaseEvents [][]string
	// Total holds each scenario's simulated total; Resources the
	// resources, and Risks[k][j] the risk of resource j in scenario k.
	Total     []supply.Risk
	Resources []MergedResource
	Risks     [][]supply.Risk
}

// A MergedResource is a resource of a merged stress run and the number of
// series it loads.
type MergedResource struct {
	ID, Units string
	PerUnit   float64
	Series    int
}

// MergedStressDoc returns stress.json of a merged stress run: the document
// PortfolioStress writes for a run over every series (without frozen
// production, which shards do not take).
func MergedStressDoc(m *MergedStress) PortfolioStressDoc {
	o := PortfolioStressDoc{Plan: m.Plan, Kind: "portfolio", Units: m.Units, Series: m.Series, Paths: m.Paths,
		Seed: m.Seed, Errors: portfolioErrors, ErrorWindow: m.Window, Quantiles: quantileDefinition,
		BreachThreshold: Num(m.Breach), Inputs: m.Inputs, Notes: portfolioStressNotes(m.Window, m.Fitted), Warnings: List(m.Warnings), Caution: Caution}
	sum := func(rk supply.Risk) ([]stressPeriodJSON, *string) {
		var ps []stressPeriodJSON
		for t, pr := range rk.Periods {
			ps = append(ps, stressPeriodJSON{Period: m.Periods[t], Mean: Num(pr.Mean),
				P5: Num(pr.P5), P10: Num(pr.P10), P50: Num(pr.P50), P90: Num(pr.P90), P95: Num(pr.P95),
				Capacity: Num(pr.Capacity), PBreach: Num(pr.PBreach), ExpectedShortfall: Num(pr.ExpectedShortfall),
				ShortfallIfBreach: Num(pr.ShortfallIfBreach), UtilP50: Num(pr.UtilP50), UtilP90: Num(pr.UtilP90)})
		}
		if rk.FirstBreach < 0 {
			return ps, nil
		}
		s := m.Periods[rk.FirstBreach]
		return ps, &s
	}
	for k, tot := range m.Total {
		ps, first := sum(tot)
		sj := portfolioStressScenarioJSON{Name: m.Scenarios[k], Events: List(m.CaseEvents[k]),
			Total: portfolioStressSumJSON{Resource: sim.TotalSum, Units: m.Units, Series: m.Series, Periods: ps, FirstBreach: first,
				TotalExpectedShortfall: Num(tot.TotalExpectedShortfall), PAnyBreach: Num(tot.PAnyBreach)},
			Resources: []portfolioStressSumJSON{}}
		for j, res := range m.Resources {
			rk := m.Risks[k][j]
			ps, first := sum(rk)
			sj.Resources = append(sj.Resources, portfolioStressSumJSON{Resource: res.ID, Units: res.Units, PerUnit: Num(res.PerUnit), Series: res.Series,
				Periods: ps, FirstBreach: first, TotalExpectedShortfall: Num(rk.TotalExpectedShortfall), PAnyBreach: Num(rk.PAnyBreach)})
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}
