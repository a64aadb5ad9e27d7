package shard

import (
	"encoding/json"
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
			len(s.Sums) != len(total.Sums) || s.Breach != total.Breach || s.Series != total.Series {
			return nil, fmt.Errorf("%w: %s and %s simulate different runs", ErrApart, dirs[0], d)
		}
		if s.Fitted > 0 {
			if total.Window > 0 && s.Window != total.Window {
				return nil, fmt.Errorf("%w: %s and %s draw errors over %d and %d periods", ErrApart, dirs[0], d, total.Window, s.Window)
			}
			total.Window = s.Window
		}
		series += s.Fitted
		for j := range s.Sums {
			total.Sums[j].Members += s.Sums[j].Members
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
	run := stressRun(total)
	b, err := stressTable(total, run).CSVBytes()
	if err != nil {
		return nil, err
	}
	js, err := json.MarshalIndent(report.MergedStressDoc(run), "", "  ")
	if err != nil {
		return nil, err
	}
	text := fmt.Sprintf("merged %d shards of forelay stress: %d series, %d paths, seed %d, errors drawn over %d periods\n",
		ms[0].Shard.N, total.Series, total.Paths, total.Seed, total.Window)
	return &Merged{Files: []File{{"stress.csv", b}, {"stress.json", append(js, '\n')}}, Text: text, Warnings: total.Warnings}, nil
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
	for _, sum := range s.Sums {
		if len(sum.Capacity) > 0 && len(sum.Capacity) != len(s.Periods) {
			return errors.New("capacity of the wrong number of periods")
		}
	}
	return nil
}

// stressRun works out the risks of the added paths: each sum's mean,
// quantiles and breach risks against its capacity (supply.CapacityRisk).
func stressRun(s *StressSums) *report.MergedStress {
	m := &report.MergedStress{Plan: s.Plan, Units: s.Units, Series: s.Series, Fitted: s.Fitted, Paths: s.Paths, Window: s.Window,
		Seed: s.Seed, Breach: s.Breach, Inputs: s.Inputs, Warnings: s.Warnings, Periods: s.Periods, Scenarios: s.Scenarios, CaseEvents: s.CaseEvents}
	for _, sum := range s.Sums[1:] {
		m.Resources = append(m.Resources, report.MergedResource{ID: sum.Name, Units: sum.Units, PerUnit: sum.PerUnit, Series: sum.Members})
	}
	for k, name := range s.Scenarios {
		var risks []supply.Risk
		for j, sum := range s.Sums {
			demand := make([][]float64, len(s.Periods))
			for t := range demand {
				demand[t] = s.Demand[k][j][t]
			}
			var capacity []float64
			if len(sum.Capacity) > 0 {
				capacity = sum.Capacity
			}
			rk := supply.CapacityRisk(sim.NewPathSet(name, demand), capacity, s.Breach)
			if j == 0 {
				m.Total = append(m.Total, rk)
			} else {
				risks = append(risks, rk)
			}
		}
		m.Risks = append(m.Risks, risks)
	}
	return m
}

// stressTable is stress.csv of a portfolio (report's portfolioStressCSV,
// without frozen production) of the merged run.
func stressTable(s *StressSums, m *report.MergedStress) *report.Table {
	tb := &report.Table{Head: []string{"scenario", "resource", "period", "mean", "p5", "p10", "p50", "p90", "p95", "capacity", "p_breach",
		"expected_shortfall", "shortfall_if_breach", "util_p50", "util_p90"}}
	for k, name := range s.Scenarios {
		for j, sum := range s.Sums {
			rk := m.Total[k]
			if j > 0 {
				rk = m.Risks[k][j-1]
			}
			for t, pr := range rk.Periods {
				tb.AddRow(name, sum.Name, s.Periods[t], report.CSVNum(pr.Mean, 2), report.CSVNum(pr.P5, 2), report.CSVNum(pr.P10, 2),
					report.CSVNum(pr.P50, 2), report.CSVNum(pr.P90, 2), report.CSVNum(pr.P95, 2), report.CSVNum(pr.Capacity, 2), report.CSVNum(pr.PBreach, 4),
					report.CSVNum(pr.ExpectedShortfall, 2), report.CSVNum(pr.ShortfallIfBreach, 2), report.CSVNum(pr.UtilP50, 4), report.CSVNum(pr.UtilP90, 4))
			}
		}
	}
	return tb
}
