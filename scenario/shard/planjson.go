package shard

import (
	"encoding/json"

	"forelay/scenario/report"
)

// The types below are plan.json of a portfolio (report.ForPortfolio), as
// the merge writes it: the same fields in the same order, so that the
// merged file is the whole run's.
type mergedPlanJSON struct {
	Version   int                  `json:"version"`
	Kind      string               `json:"kind"`
	Plan      string               `json:"plan"`
	Units     string               `json:"units,omitempty"`
	Series    int                  `json:"series"`
	Levels    []string             `json:"levels"`
	History   mergedHistoryJSON    `json:"history"`
	Inputs    map[string]string    `json:"inputs"`
	Periods   []string             `json:"periods"`
	Baselines []mergedBaselineJSON `json:"series_baselines"`
	Scenarios []mergedScenarioJSON `json:"scenarios"`
	Notes     []string             `json:"notes"`
	Caution   string               `json:"caution"`
	Warnings  []string             `json:"warnings"`
}

type mergedHistoryJSON struct {
	Period string `json:"period"`
	End    string `json:"end"`
}

type mergedBaselineJSON struct {
	Series   string       `json:"series"`
	New      bool         `json:"new"`
	MAD      report.Num   `json:"mad"`
	MSE      report.Num   `json:"mse"`
	Baseline []report.Num `json:"baseline"`
}

type mergedScenarioJSON struct {
	Name      string               `json:"name"`
	Events    []string             `json:"events"`
	Rollups   []mergedRollupJSON   `json:"rollups"`
	Resources []mergedResourceJSON `json:"resources,omitempty"`
	Series    []mergedSeriesJSON   `json:"series"`
}

type mergedRollupJSON struct {
	Level        string       `json:"level"`
	Group        string       `json:"group"`
	Members      int          `json:"members"`
	Baseline     []report.Num `json:"baseline"`
	Adjusted     []report.Num `json:"adjusted"`
	RiskWeighted []report.Num `json:"risk_weighted"`
	Lower        []report.Num `json:"lower"`
	Upper        []report.Num `json:"upper"`
	Var          []report.Num `json:"var"`
}

type mergedResourceJSON struct {
	ID          string       `json:"id"`
	Units       string       `json:"units,omitempty"`
	Series      int          `json:"series"`
	Load        []report.Num `json:"load"`
	Capacity    []report.Num `json:"capacity"`
	Utilisation []report.Num `json:"utilisation"`
	LoadSD      []report.Num `json:"load_sd"`
	PBreach     []report.Num `json:"p_breach"`
	Shortfall   []report.Num `json:"expected_shortfall"`
}

type mergedSeriesJSON struct {
	Series          string       `json:"series"`
	Baseline        report.Num   `json:"baseline"`
	Adjusted        report.Num   `json:"adjusted"`
	Change          report.Num   `json:"change"`
	AdjustedPeriods []report.Num `json:"adjusted_periods"`
}

// planJSON returns plan.json of the merged portfolio.
func planJSON(s0 *PlanSums, own []OwnSeries, groups []*mergedGroup, loads [][]resourceLoad, warnings []string) ([]byte, error) {
	doc := mergedPlanJSON{Version: report.PortfolioVersion, Kind: "portfolio", Plan: s0.Plan, Units: s0.Units, Series: s0.Series,
		Levels: report.List(s0.Levels), History: mergedHistoryJSON{Period: s0.Freq, End: s0.End}, Inputs: s0.Inputs,
		Periods: s0.Periods, Notes: report.List(s0.Notes), Caution: report.Caution, Warnings: report.List(warnings)}
	for _, o := range own {
		doc.Baselines = append(doc.Baselines, mergedBaselineJSON{Series: o.Name, New: o.New, MAD: report.Num(o.MAD), MSE: report.Num(o.MSE),
			Baseline: report.Nums(o.BaselinePeriods)})
	}
	for k, name := range s0.Scenarios {
		sj := mergedScenarioJSON{Name: name, Events: s0.CaseEvents[k]}
		for _, g := range groups {
			ru, err := g.rollup(s0, k)
			if err != nil {
				return nil, err
			}
			sj.Rollups = append(sj.Rollups, mergedRollupJSON{Level: ru.Level, Group: ru.Group, Members: g.Members,
				Baseline: report.Nums(ru.Baseline), Adjusted: report.Nums(ru.Adjusted), RiskWeighted: report.Nums(ru.RiskWeighted),
				Lower: report.Nums(ru.Lower), Upper: report.Nums(ru.Upper), Var: report.Nums(ru.Var)})
		}
		for j, res := range s0.Resources {
			l := loads[k][j]
			rj := mergedResourceJSON{ID: res.ID, Units: res.Units, Series: l.members, Load: report.Nums(l.load), Utilisation: report.Nums(l.util),
				LoadSD: report.Nums(l.sd), PBreach: report.Nums(l.pBreach), Shortfall: report.Nums(l.shortfall)}
			if len(res.Capacity) > 0 {
				rj.Capacity = report.Nums(res.Capacity)
			}
			sj.Resources = append(sj.Resources, rj)
		}
		for _, o := range own {
			sj.Series = append(sj.Series, mergedSeriesJSON{Series: o.Name, Baseline: report.Num(o.Baseline), Adjusted: report.Num(o.Adjusted[k]),
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
