package shard

import (
	"encoding/json"

	"forelay/scenario/report"
)

// planJSON returns plan.json of the merged portfolio.
func planJSON(s0 *PlanSums, own []OwnSeries, groups []*mergedGroup, loads [][]resourceLoad, warnings []string) ([]byte, error) {
	doc := report.PortfolioDoc{Version: report.PortfolioVersion, Kind: "portfolio", Plan: s0.Plan, Units: s0.Units, Series: s0.Series,
		Levels: report.List(s0.Levels), History: report.PortfolioHistoryDoc{Period: s0.Freq, End: s0.End}, Inputs: s0.Inputs,
		Periods: s0.Periods, Notes: report.List(s0.Notes), Caution: report.Caution, Warnings: report.List(warnings)}
	for _, o := range own {
		doc.Baselines = append(doc.Baselines, report.SeriesBaselineDoc{Series: o.Name, New: o.New, MAD: report.Num(o.MAD), MSE: report.Num(o.MSE),
			Baseline: report.Nums(o.BaselinePeriods)})
	}
	for k, name := range s0.Scenarios {
		sj := report.PortfolioScenarioDoc{Name: name, Events: s0.CaseEvents[k]}
		for _, g := range groups {
			ru, err := g.rollup(s0, k)
			if err != nil {
				return nil, err
			}
			sj.Rollups = append(sj.Rollups, report.RollupDoc{Level: ru.Level, Group: ru.Group, Members: g.Members,
				Baseline: report.Nums(ru.Baseline), Adjusted: report.Nums(ru.Adjusted), RiskWeighted: report.Nums(ru.RiskWeighted),
				Lower: report.Nums(ru.Lower), Upper: report.Nums(ru.Upper), Var: report.Nums(ru.Var)})
		}
		for j, res := range s0.Resources {
			l := loads[k][j]
			rj := report.ResourceDoc{ID: res.ID, Units: res.Units, Series: l.members, Load: report.Nums(l.load), Utilisation: report.Nums(l.util),
				LoadSD: report.Nums(l.sd), PBreach: report.Nums(l.pBreach), Shortfall: report.Nums(l.shortfall)}
			if len(res.Capacity) > 0 {
				rj.Capacity = report.Nums(res.Capacity)
			}
			sj.Resources = append(sj.Resources, rj)
		}
		for _, o := range own {
			sj.Series = append(sj.Series, report.SeriesSumDoc{Series: o.Name, Baseline: report.Num(o.Baseline), Adjusted: report.Num(o.Adjusted[k]),
				Change: report.Num(o.Adjusted[k] - o.Baseline), AdjustedPeriods: report.Nums(o.AdjustedPeriods[k])})
		}
		doc.Scenarios = append(doc.Scenarios, sj)
	}
	b, err := json.MarshalIndent(doc, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}
