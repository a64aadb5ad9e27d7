package report

import (
	"forelay/forecast"
	"forelay/scenario/plan"
)

// PlanVersion is the form of plan.json this package writes: 1 since the
// field was added; a plan.json without it is of form 0, which ReadPlan
// reads too (the fields tracking needs are the same).
const PlanVersion = 1

// The JSON shape of plan.json (and "forelay plan --json"). Field names are
// documented in the README; keep them stable.

type planHistoryJSON struct {
	File   string `json:"file"`
	Series string `json:"series"`
	Period string `json:"period"`
	Start  string `json:"start"`
	End    string `json:"end"`
	N      int    `json:"n"`
	Filled int    `json:"filled"`
}

type planBandsJSON struct {
	Z           Num              `json:"z"`
	Coverage    Num              `json:"coverage"`
	Widen       string           `json:"widen"`
	From        string           `json:"from"`
	Variance    string           `json:"variance"`
	Calibration *calibrationJSON `json:"calibration"`
	Floor       *Num             `json:"floor"`
}

type cleanedJSON struct {
	ID       string `json:"id"`
	When     string `json:"when"`
	Kind     string `json:"kind"`
	Estimate Num    `json:"estimate"`
	StdError Num    `json:"std_error"`
}

type eventJSON struct {
	ID          string `json:"id"`
	Kind        string `json:"kind"`
	Start       string `json:"start"`
	End         string `json:"end,omitempty"`
	Units       *Num   `json:"units,omitempty"`
	Percent     *Num   `json:"percent,omitempty"`
	FromPast    bool   `json:"from_past,omitempty"`
	Low         *Num   `json:"low,omitempty"`
	High        *Num   `json:"high,omitempty"`
	Probability Num    `json:"probability"`
	Prorated    bool   `json:"prorated"`
	Total       Num    `json:"total"`
	Note        string `json:"note,omitempty"`
	Owner       string `json:"owner,omitempty"`
}

type planPeriodJSON struct {
	Period       string         `json:"period"`
	Baseline     Num            `json:"baseline"`
	Adjusted     Num            `json:"adjusted"`
	RiskWeighted Num            `json:"risk_weighted"`
	Lower        Num            `json:"lower"`
	Upper        Num            `json:"upper"`
	Events       map[string]Num `json:"events"`
}

// PeakDoc is a period and its value, such as a plan's peak.
type PeakDoc struct {
	Period string `json:"period"`
	Value  Num    `json:"value"`
}

type scenarioJSON struct {
	Name          string           `json:"name"`
	Events        []string         `json:"events"`
	Total         Num              `json:"total"`
	BaselineTotal Num              `json:"baseline_total"`
	Change        Num              `json:"change"`
	ChangePct     Num              `json:"change_pct"`
	RiskWeighted  Num              `json:"risk_weighted_total"`
	Peak          PeakDoc          `json:"peak"`
	Contributions map[string]Num   `json:"contributions"`
	Periods       []planPeriodJSON `json:"periods"`
}

// PlanDoc is plan.json's document. Version says which form it has (see
// PlanVersion); ReadPlan reads it back.
type PlanDoc struct {
	Version   int               `json:"version"`
	Plan      string            `json:"plan"`
	Units     string            `json:"units,omitempty"`
	Horizon   int               `json:"horizon"`
	History   planHistoryJSON   `json:"history"`
	Inputs    map[string]string `json:"inputs"`
	Baseline  FitDoc            `json:"baseline"`
	Bands     planBandsJSON     `json:"bands"`
	Cleaned   []cleanedJSON     `json:"cleaned"`
	Events    []eventJSON       `json:"events"`
	Scenarios []scenarioJSON    `json:"scenarios"`
	Notes     []string          `json:"notes"`
	Warnings  []string          `json:"warnings"`
	Caution   string            `json:"caution"`
}

// Plan returns plan.json's document of p.
func Plan(p *plan.Plan) PlanDoc {
	f := p.File
	h := p.History
	o := PlanDoc{Version: PlanVersion, Plan: f.Plan, Units: f.Units, Horizon: len(p.Periods),
		History: planHistoryJSON{File: f.History.File, Series: h.Name, Period: h.Freq().String(),
			Start: h.Start.String(), End: h.Period(h.Len() - 1).String(), N: h.Len(), Filled: len(p.Filled)},
		Inputs:  p.Digests,
		Cleaned: []cleanedJSON{}, Events: []eventJSON{}, Notes: append([]string{}, p.Notes...),
		Warnings: List(p.Warnings), Caution: Caution,
	}
	o.Baseline = Fit(p.Fit, len(p.Periods), Bands{Z: p.Z, Mode: p.Mode, From: p.From})
	o.Baseline.Forecast = nil // the plan's periods carry the baseline
	o.Bands = planBandsJSON{Z: Num(p.Z), Coverage: Num(forecast.Coverage(p.Z)), Widen: p.Mode.String(), From: p.From.String(),
		Variance: string(p.VarSource), Calibration: toCalibrationJSON(p.Fit, p.VarSource)}
	if p.Floor != nil {
		v := Num(*p.Floor)
		o.Bands.Floor = &v
	}
	for _, c := range p.Cleaning {
		o.Cleaned = append(o.Cleaned, cleanedJSON{ID: c.ID, When: c.When, Kind: c.Kind.String(), Estimate: Num(c.Effect), StdError: Num(c.StdErr)})
	}
	first := p.Periods[0]
	for _, e := range p.Future {
		ej := eventJSON{ID: e.ID, Kind: e.Kind.String(), Start: e.Start.Label, Probability: Num(e.Probability),
			Prorated: e.Prorated(first), FromPast: e.Effect.FromPast, Note: e.Note, Owner: e.Owner}
		if e.HasEnd {
			ej.End = e.End.Label
		}
		v := Num(e.Effect.Value())
		if e.Effect.IsPercent {
			ej.Percent = &v
		} else {
			ej.Units = &v
		}
		if e.Range != nil {
			lo, hi := Num(e.Range.Low), Num(e.Range.High)
			ej.Low, ej.High = &lo, &hi
		}
		ej.Total = Num(plan.Total(p.Effects[e.ID].Contrib))
		o.Events = append(o.Events, ej)
	}
	base := plan.Total(p.Baseline)
	for _, sp := range p.Scenarios {
		sj := scenarioJSON{Name: sp.Name, Events: []string{}, BaselineTotal: Num(base), Contributions: map[string]Num{}}
		for _, e := range sp.Events {
			sj.Events = append(sj.Events, e.ID)
		}
		adj := plan.Total(sp.Adjusted)
		sj.Total, sj.Change = Num(adj), Num(adj-base)
		sj.ChangePct = Num(100 * (adj - base) / base)
		sj.RiskWeighted = Num(plan.Total(sp.RiskWeighted))
		i, v := plan.Peak(sp.Adjusted)
		sj.Peak = PeakDoc{Period: p.Periods[i].String(), Value: Num(v)}
		for _, e := range p.Future {
			sj.Contributions[e.ID] = Num(plan.Total(sp.Contrib[e.ID]))
		}
		for t, per := range p.Periods {
			pj := planPeriodJSON{Period: per.String(), Baseline: Num(p.Baseline[t]), Adjusted: Num(sp.Adjusted[t]),
				RiskWeighted: Num(sp.RiskWeighted[t]), Lower: Num(sp.Lower[t]), Upper: Num(sp.Upper[t]), Events: map[string]Num{}}
			for _, e := range p.Future {
				pj.Events[e.ID] = Num(sp.Contrib[e.ID][t])
			}
			sj.Periods = append(sj.Periods, pj)
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}
