package shard

import (
	"errors"
	"fmt"
	"slices"

	"forelay/scenario/report"
	"forelay/scenario/sim"
	"forelay/scenario/supply"
)

// MergeStress merges the shards of a portfolio stress run in dirs (the
// --out directories of "forelay stress --shard K/N") into stress.csv of
// one run over every series: each sum's paths are added path by path over
// the shards (the random streams depend only on the seed, the block of
// paths and the event, so a series draws the same paths in any shard),
// then its mean, quantiles and breach risks are worked out as in one run.
// Errors wrap ErrApart when the shards do not belong together.
func MergeStress(dirs []string) (*Merged, error) {
	dirs, ms, err := readShards(dirs, "stress")
	if err != nil {
		return nil, err
	}
	var total *StressSums
	series := 0
	for _, d := range dirs {
		var s StressSums
		if err := readJSON(d, "sums.json", &s); err != nil {
			return nil, err
		}
		if s.Version != SumsVersion || s.Kind != "stress" {
			return nil, fmt.Errorf("%s: sums.json of version %d, kind %q; this forelay merges version %d of a stress run", d, s.Version, s.Kind, SumsVersion)
		}
		if err := checkShape(&s); err != nil {
			return nil, fmt.Errorf("%s: %w", d, err)
		}
		if total == nil {
			total = &s
			series = s.Fitted
			continue
		}
		if !slices.Equal(s.Periods, total.Periods) || !slices.Equal(s.Scenarios, total.Scenarios) || s.Paths != total.Paths || s.Seed != total.Seed ||
			len(s.Sums) != len(total.Sums) || s.Breach != total.Breach || s.Series != total.Series || s.Freq != total.Freq ||
			s.Chart != total.Chart || s.Frozen != total.Frozen || s.Opening != total.Opening {
			return nil, fmt.Errorf("%w: %s and %s simulate different runs", ErrApart, dirs[0], d)
		}
		if s.Fitted > 0 {
			if total.Window > 0 && s.Window != total.Window {
				return nil, fmt.Errorf("%w: %s and %s draw errors over %d and %d periods", ErrApart, dirs[0], d, total.Window, s.Window)
			}
			total.Window = s.Window
		}
		series += s.Fitted
		for j, sum := range s.Sums {
			total.Sums[j].Members += sum.Members
			if s.Frozen {
				addTo(total.Sums[j].Baseline, sum.Baseline)
				for k := range sum.Planned {
					addTo(total.Sums[j].Planned[k], sum.Planned[k])
				}
			}
		}
		for k := range s.Demand {
			for j := range s.Demand[k] {
				for t := range s.Demand[k][j] {
					addTo(total.Demand[k][j][t], s.Demand[k][j][t])
				}
			}
		}
	}
	total.Fitted = series
	m, err := stressSummary(total)
	if err != nil {
		return nil, err
	}
	if total.Chart < 0 || total.Chart >= len(total.Scenarios) {
		return nil, fmt.Errorf("%s: sums.json charts scenario %d of %d", dirs[0], total.Chart, len(total.Scenarios))
	}
	rep := report.StressSummaryReport(m, total.Chart)
	return &Merged{Report: rep, Shards: ms[0].Shard.N}, nil
}

// checkShape checks that the paths of s have the lengths its settings say.
func checkShape(s *StressSums) error {
	if len(s.Demand) != len(s.Scenarios) {
		return errors.New("paths of the wrong number of scenarios")
	}
	for _, row := range s.Demand {
		if len(row) != len(s.Sums) {
			return errors.New("paths of the wrong number of sums")
		}
		for _, sum := range row {
			if len(sum) != len(s.Periods) {
				return errors.New("paths of the wrong number of periods")
			}
			for _, d := range sum {
				if len(d) != s.Paths {
					return errors.New("the wrong number of paths")
				}
			}
		}
	}
	for j, sum := range s.Sums {
		if len(sum.Capacity) > 0 && len(sum.Capacity) != len(s.Periods) {
			return errors.New("capacity of the wrong number of periods")
		}
		if !s.Frozen || j == 0 {
			continue
		}
		if len(sum.Baseline) != len(s.Periods) || len(sum.Planned) != len(s.Scenarios) {
			return errors.New("baseline loads of the wrong shape")
		}
		for _, p := range sum.Planned {
			if len(p) != len(s.Periods) {
				return errors.New("planned loads of the wrong number of periods")
			}
		}
	}
	if len(s.Sums) == 0 || len(s.Scenarios) == 0 || len(s.Periods) == 0 {
		return errors.New("no sums, scenarios or periods")
	}
	return nil
}

// stressSummary works out the risks of the added paths: each sum's mean,
// quantiles and breach risks against its capacity (supply.CapacityRisk)
// and, when the file freezes production, each resource's stock projected
// with production held at its baseline load (supply.ProjectStock).
func stressSummary(s *StressSums) (*report.StressSummary, error) {
	m := &report.StressSummary{Plan: s.Plan, Units: s.Units, Series: s.Series, Fitted: s.Fitted, Paths: s.Paths, Window: s.Window,
		Seed: s.Seed, Breach: s.Breach, Inputs: s.Inputs, Warnings: s.Warnings, Scenarios: s.Scenarios, CaseEvents: s.CaseEvents}
	var err error
	if m.Periods, err = parsePeriods(s.Freq, s.Periods); err != nil {
		return nil, err
	}
	for _, sum := range s.Sums[1:] {
		m.Resources = append(m.Resources, report.StressResource{ID: sum.Name, Units: sum.Units, PerUnit: sum.PerUnit, Capacity: sum.Capacity.orNil(), Series: sum.Members})
	}
	for k, name := range s.Scenarios {
		var risks []supply.Risk
		var stocks []supply.StockProjection
		for j, sum := range s.Sums {
			demand := make([][]float64, len(s.Periods))
			for t := range demand {
				demand[t] = s.Demand[k][j][t]
			}
			capacity := sum.Capacity.orNil()
			ps := sim.NewPathSet(name, demand)
			rk := supply.CapacityRisk(ps, capacity, s.Breach)
			if j == 0 {
				rk.Name = name
				m.Total = append(m.Total, rk)
				continue
			}
			risks = append(risks, rk)
			if s.Frozen {
				prod, planned := perUnit(sum.Baseline, sum.PerUnit), perUnit(sum.Planned[k], sum.PerUnit)
				stocks = append(stocks, supply.ProjectStock(prod, planned, capacity, s.Opening, ps))
			}
		}
		m.Risks = append(m.Risks, risks)
		if s.Frozen {
			m.Frozen = append(m.Frozen, stocks)
		}
	}
	return m, nil
}

// perUnit returns demand times a resource's load per unit.
func perUnit(demand []float64, per float64) []float64 {
	out := make([]float64, len(demand))
	for t, d := range demand {
		out[t] = d * per
	}
	return out
}
