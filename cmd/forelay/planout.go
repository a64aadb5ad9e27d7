package main

import (
	"encoding/json"
	"strconv"

	"forelay/forecast"
	"forelay/scenario"
)

// marshalIndent encodes v as indented JSON with a final newline.
func marshalIndent(v any) ([]byte, error) {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// fmtCSV formats a value for CSV files: two decimals, fixed notation, so
// files are stable and easy to read in a spreadsheet.
func fmtCSV(v float64) string { return strconv.FormatFloat(v, 'f', 2, 64) }

// planCSV renders plan.csv: one row per scenario and period with the
// columns scenario, period, baseline, adjusted, risk_weighted, lower, upper
// and then one column per future event holding its contribution.
func planCSV(p *scenario.Plan) ([]byte, error) {
	var rows [][]string
	head := []string{"scenario", "period", "baseline", "adjusted", "risk_weighted", "lower", "upper"}
	for _, e := range p.Future {
		head = append(head, e.ID)
	}
	rows = append(rows, head)
	for _, sp := range p.Scenarios {
		for t, per := range p.Periods {
			row := []string{sp.Name, per.String(), fmtCSV(p.Baseline[t]), fmtCSV(sp.Adjusted[t]),
				fmtCSV(sp.RiskWeighted[t]), fmtCSV(sp.Lower[t]), fmtCSV(sp.Upper[t])}
			for i := range p.Future {
				row = append(row, fmtCSV(sp.Contrib[i][t]))
			}
			rows = append(rows, row)
		}
	}
	return encodeCSV(rows)
}

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
	Z           num              `json:"z"`
	Coverage    num              `json:"coverage"`
	Widen       string           `json:"widen"`
	From        string           `json:"from"`
	Variance    string           `json:"variance"`
	Calibration *calibrationJSON `json:"calibration"`
	Floor       *num             `json:"floor"`
}

type cleanedJSON struct {
	ID       string `json:"id"`
	When     string `json:"when"`
	Kind     string `json:"kind"`
	Estimate num    `json:"estimate"`
	StdError num    `json:"std_error"`
}

type eventJSON struct {
	ID          string `json:"id"`
	Kind        string `json:"kind"`
	Start       string `json:"start"`
	End         string `json:"end,omitempty"`
	Units       *num   `json:"units,omitempty"`
	Percent     *num   `json:"percent,omitempty"`
	FromPast    bool   `json:"from_past,omitempty"`
	Low         *num   `json:"low,omitempty"`
	High        *num   `json:"high,omitempty"`
	Probability num    `json:"probability"`
	Prorated    bool   `json:"prorated"`
	Total       num    `json:"total"`
	Note        string `json:"note,omitempty"`
}

type planPeriodJSON struct {
	Period       string         `json:"period"`
	Baseline     num            `json:"baseline"`
	Adjusted     num            `json:"adjusted"`
	RiskWeighted num            `json:"risk_weighted"`
	Lower        num            `json:"lower"`
	Upper        num            `json:"upper"`
	Events       map[string]num `json:"events"`
}

type peakJSON struct {
	Period string `json:"period"`
	Value  num    `json:"value"`
}

type scenarioJSON struct {
	Name          string           `json:"name"`
	Events        []string         `json:"events"`
	Total         num              `json:"total"`
	BaselineTotal num              `json:"baseline_total"`
	Change        num              `json:"change"`
	ChangePct     num              `json:"change_pct"`
	RiskWeighted  num              `json:"risk_weighted_total"`
	Peak          peakJSON         `json:"peak"`
	Contributions map[string]num   `json:"contributions"`
	Periods       []planPeriodJSON `json:"periods"`
}

type planOutJSON struct {
	Plan      string            `json:"plan"`
	Units     string            `json:"units,omitempty"`
	Horizon   int               `json:"horizon"`
	History   planHistoryJSON   `json:"history"`
	Inputs    map[string]string `json:"inputs"`
	Baseline  fitOutJSON        `json:"baseline"`
	Bands     planBandsJSON     `json:"bands"`
	Cleaned   []cleanedJSON     `json:"cleaned"`
	Events    []eventJSON       `json:"events"`
	Scenarios []scenarioJSON    `json:"scenarios"`
	Notes     []string          `json:"notes"`
	Warnings  []string          `json:"warnings"`
	Caution   string            `json:"caution"`
}

func planJSON(p *scenario.Plan) planOutJSON {
	f := p.File
	h := p.History
	o := planOutJSON{Plan: f.Plan, Units: f.Units, Horizon: len(p.Periods),
		History: planHistoryJSON{File: f.History.File, Series: h.Name, Period: h.Freq().String(),
			Start: h.Start.String(), End: h.Period(h.Len() - 1).String(), N: h.Len(), Filled: len(p.Filled)},
		Inputs:  p.Digests,
		Cleaned: []cleanedJSON{}, Events: []eventJSON{}, Notes: append([]string{}, p.Notes...),
		Warnings: warningList(p.Warnings), Caution: cautionText,
	}
	bs := bandSettings{Z: p.Z, Mode: p.Mode}
	o.Baseline = fitJSON(p.Fit, len(p.Periods), bs)
	o.Baseline.Forecast = nil // the plan's periods carry the baseline
	o.Bands = planBandsJSON{Z: num(p.Z), Coverage: num(forecast.Coverage(p.Z)), Widen: p.Mode.String(), From: p.From.String(),
		Variance: string(p.VarSource), Calibration: toCalibrationJSON(p.Fit, p.VarSource)}
	if p.Floor != nil {
		v := num(*p.Floor)
		o.Bands.Floor = &v
	}
	for _, c := range p.Cleaning {
		o.Cleaned = append(o.Cleaned, cleanedJSON{ID: c.ID, When: c.When, Kind: c.Kind.String(), Estimate: num(c.Effect), StdError: num(c.StdErr)})
	}
	first := p.Periods[0]
	for _, e := range p.Future {
		ej := eventJSON{ID: e.ID, Kind: e.Kind.String(), Start: e.Start.Label, Probability: num(e.Probability),
			Prorated: e.Prorated(first), FromPast: e.Effect.FromPast, Note: e.Note}
		if e.HasEnd {
			ej.End = e.End.Label
		}
		v := num(e.Effect.Value())
		if e.Effect.IsPercent {
			ej.Percent = &v
		} else {
			ej.Units = &v
		}
		if e.Range != nil {
			lo, hi := num(e.Range.Low), num(e.Range.High)
			ej.Low, ej.High = &lo, &hi
		}
		ej.Total = num(scenario.Total(e.Contribution(first, p.Baseline)))
		o.Events = append(o.Events, ej)
	}
	base := scenario.Total(p.Baseline)
	for _, sp := range p.Scenarios {
		sj := scenarioJSON{Name: sp.Name, Events: []string{}, BaselineTotal: num(base), Contributions: map[string]num{}}
		for _, e := range sp.Events {
			sj.Events = append(sj.Events, e.ID)
		}
		adj := scenario.Total(sp.Adjusted)
		sj.Total, sj.Change = num(adj), num(adj-base)
		sj.ChangePct = num(100 * (adj - base) / base)
		sj.RiskWeighted = num(scenario.Total(sp.RiskWeighted))
		i, v := scenario.Peak(sp.Adjusted)
		sj.Peak = peakJSON{Period: p.Periods[i].String(), Value: num(v)}
		for k, e := range p.Future {
			sj.Contributions[e.ID] = num(scenario.Total(sp.Contrib[k]))
		}
		for t, per := range p.Periods {
			pj := planPeriodJSON{Period: per.String(), Baseline: num(p.Baseline[t]), Adjusted: num(sp.Adjusted[t]),
				RiskWeighted: num(sp.RiskWeighted[t]), Lower: num(sp.Lower[t]), Upper: num(sp.Upper[t]), Events: map[string]num{}}
			for k, e := range p.Future {
				pj.Events[e.ID] = num(sp.Contrib[k][t])
			}
			sj.Periods = append(sj.Periods, pj)
		}
		o.Scenarios = append(o.Scenarios, sj)
	}
	return o
}
