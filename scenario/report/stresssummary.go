package report

import (
	"forelay/forecast"
	"forelay/scenario/supply"
)

// StressSummary is what the report of a portfolio's stress run shows: the
// simulated total and each resource's load against its capacity, per
// scenario. A run over every series (PortfolioStress) and a merge of
// shards (package shard) both fill one, so the two write the same text,
// files and charts.
type StressSummary struct {
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
	Periods    []forecast.Period
	Scenarios  []string
	CaseEvents [][]string
	// Total holds each scenario's simulated total; Resources the
	// resources, and Risks[k][j] the risk of resource j in scenario k.
	Total     []supply.Risk
	Resources []StressResource
	Risks     [][]supply.Risk
	// Frozen[k][j] is the stock projection of resource j in scenario k
	// when the file freezes production; nil otherwise.
	Frozen [][]supply.StockProjection
	// MoreTables are the events and accuracy tables of the workbook;
	// empty when the series' plans are not at hand (a merge).
	MoreTables []CSVFile
}

// A StressResource is a resource of a stress run: its id, units, load
// per unit of demand, capacity per period (nil without one) and the
// number of series it loads.
type StressResource struct {
	ID, Units string
	PerUnit   float64
	Capacity  []float64
	Series    int
}

// stressSummary returns the summary of a run over every series.
func stressSummary(r *supply.PortfolioStressRun) *StressSummary {
	pf, mc := r.Portfolio, r.Sim
	p0 := pf.Plans[0]
	m := &StressSummary{Plan: pf.File.Plan, Units: pf.File.Units, Series: len(pf.Plans), Fitted: mc.Fitted, Paths: mc.Paths,
		Window: mc.Window, Seed: mc.Seed, Breach: r.Settings.Breach, Inputs: p0.Digests, Warnings: r.Warnings,
		Periods: p0.Periods, Total: r.Total, Risks: r.Risks, Frozen: r.Frozen, MoreTables: portfolioTables(pf)}
	for k, c := range pf.File.Cases() {
		m.Scenarios = append(m.Scenarios, r.Total[k].Name)
		m.CaseEvents = append(m.CaseEvents, eventIDList(c.Events))
	}
	for _, res := range r.Resources {
		m.Resources = append(m.Resources, StressResource{ID: res.ID, Units: res.Units, PerUnit: res.PerUnit, Capacity: res.Capacity, Series: len(res.Series)})
	}
	return m
}

// freq is the name of the summary's periods ("month").
func (m *StressSummary) freq() string { return m.Periods[0].Freq.String() }
