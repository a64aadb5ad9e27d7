package report

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/plan"
)

// savedPortfolio holds the fields of a portfolio's plan.json (see
// portfolioJSON) that tracking reads; the rest is ignored.
type savedPortfolio struct {
	Version int    `json:"version"`
	Kind    string `json:"kind"`
	Plan    string `json:"plan"`
	Units   string `json:"units"`
	History *struct {
		Period string `json:"period"`
		End    string `json:"end"`
	} `json:"history"`
	Inputs    map[string]string `json:"inputs"`
	Periods   []string          `json:"periods"`
	Baselines []struct {
		Series   string     `json:"series"`
		New      bool       `json:"new"`
		MAD      *float64   `json:"mad"`
		MSE      *float64   `json:"mse"`
		Baseline []*float64 `json:"baseline"`
	} `json:"series_baselines"`
	Scenarios []struct {
		Name    string `json:"name"`
		Rollups []struct {
			Level string     `json:"level"`
			Group string     `json:"group"`
			Var   []*float64 `json:"var"`
		} `json:"rollups"`
		Series []struct {
			Series          string     `json:"series"`
			AdjustedPeriods []*float64 `json:"adjusted_periods"`
		} `json:"series"`
	} `json:"scenarios"`
}

// ReadPortfolioPlan reads a portfolio's plan.json written by "forelay
// plan --out" and returns the plan to track against and the input
// digests it records. Errors are *data.ParseError naming the file (with
// the line and column of a JSON syntax or type error) and the field at
// fault, wrapping ErrNotAPlan for a document that lacks what tracking
// needs (a plan.json of one series, or one written before plan.json held
// the series' plans per period).
func ReadPortfolioPlan(path string) (*plan.PortfolioTrackPlan, map[string]string, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, nil, err
	}
	var sp savedPortfolio
	if err := json.Unmarshal(src, &sp); err != nil {
		return nil, nil, jsonError(path, src, err)
	}
	bad := func(field, format string, a ...any) error {
		return &data.ParseError{File: path, Field: field, Err: fmt.Errorf("%w: "+format, append([]any{ErrNotAPlan}, a...)...)}
	}
	switch {
	case sp.Version > PortfolioVersion:
		return nil, nil, bad("version", "form %d, newer than the form %d this forelay reads; use a newer forelay or run forelay plan again", sp.Version, PortfolioVersion)
	case sp.Kind != "portfolio":
		return nil, nil, bad("kind", "%q, not a plan of several series; the scenario file selects several series, so run forelay plan --out again", sp.Kind)
	case sp.History == nil || len(sp.Baselines) == 0:
		return nil, nil, bad("series_baselines", "missing; this plan.json was written before it held what tracking needs: run forelay plan --out again")
	}
	freq, err := forecast.ParseFrequency(sp.History.Period)
	if err != nil || freq == forecast.FreqUnknown {
		return nil, nil, bad("history.period", "%q is not a period length", sp.History.Period)
	}
	pt := &plan.PortfolioTrackPlan{Name: sp.Plan, Units: sp.Units}
	if pt.HistoryEnd, err = forecast.ParsePeriod(sp.History.End, freq); err != nil {
		return nil, nil, bad("history.end", "%v", err)
	}
	for i, label := range sp.Periods {
		per, err := forecast.ParsePeriod(label, freq)
		if err != nil {
			return nil, nil, bad(fmt.Sprintf("periods[%d]", i), "%v", err)
		}
		if want := pt.HistoryEnd.Add(i + 1); per.String() != want.String() {
			return nil, nil, bad(fmt.Sprintf("periods[%d]", i), "%s; want %s (the periods follow the history, which ends %s)", per, want, pt.HistoryEnd)
		}
		pt.Periods = append(pt.Periods, per)
	}
	if len(pt.Periods) == 0 {
		return nil, nil, bad("periods", "no periods")
	}
	if len(sp.Scenarios) == 0 {
		return nil, nil, bad("scenarios", "no scenarios")
	}
	values := func(field string, v []*float64) ([]float64, error) {
		if len(v) != len(pt.Periods) {
			return nil, bad(field, "%d values for %d periods", len(v), len(pt.Periods))
		}
		out := make([]float64, len(v))
		for t, x := range v {
			if x == nil {
				return nil, bad(fmt.Sprintf("%s[%d]", field, t), "no value")
			}
			out[t] = *x
		}
		return out, nil
	}
	names := make([]string, len(sp.Baselines))
	for i, b := range sp.Baselines {
		field := fmt.Sprintf("series_baselines[%d]", i)
		if b.Series == "" || b.MAD == nil || b.MSE == nil {
			return nil, nil, bad(field, "a series needs its name, mad and mse")
		}
		base, err := values(field+".baseline", b.Baseline)
		if err != nil {
			return nil, nil, err
		}
		names[i] = b.Series
		s := plan.SeriesTrackPlan{New: b.New, TrackPlan: plan.TrackPlan{Name: sp.Plan, Units: sp.Units, Series: b.Series,
			HistoryEnd: pt.HistoryEnd, Periods: pt.Periods, Baseline: base, MAD: *b.MAD, MSE: *b.MSE}}
		pt.Series = append(pt.Series, s)
	}
	for k, sc := range sp.Scenarios {
		field := fmt.Sprintf("scenarios[%d]", k)
		if len(sc.Series) != len(pt.Series) {
			return nil, nil, bad(field+".series", "%d series; series_baselines has %d", len(sc.Series), len(pt.Series))
		}
		for i, s := range sc.Series {
			f := fmt.Sprintf("%s.series[%d]", field, i)
			if s.Series != names[i] {
				return nil, nil, bad(f+".series", "%q where series_baselines has %q", s.Series, names[i])
			}
			adj, err := values(f+".adjusted_periods", s.AdjustedPeriods)
			if err != nil {
				return nil, nil, err
			}
			pt.Series[i].Scenarios = append(pt.Series[i].Scenarios, plan.PlanLine{Name: sc.Name, Adjusted: adj})
		}
		var scales []plan.RollupScale
		for j, ru := range sc.Rollups {
			f := fmt.Sprintf("%s.rollups[%d]", field, j)
			depth := plan.GroupDepth(ru.Level, ru.Group)
			if depth > 1 {
				continue
			}
			if len(ru.Var) == 0 || ru.Var[0] == nil {
				return nil, nil, bad(f+".var", "missing; run forelay plan --out again")
			}
			scales = append(scales, plan.RollupScale{Level: ru.Level, Depth: depth, Group: ru.Group,
				Members: plan.GroupMembers(names, depth, ru.Group), Var: *ru.Var[0]})
		}
		pt.Rollups = append(pt.Rollups, scales)
	}
	return pt, sp.Inputs, nil
}

// SavedPortfolioTrackPlan reads the portfolio to track against from
// DIR/plan.json, as SavedTrackPlan reads the plan of one series, with
// the same warnings about changed inputs; f is the scenario file.
func SavedPortfolioTrackPlan(f *scenario.File, dir string) (pt *plan.PortfolioTrackPlan, source string, warns []string, err error) {
	path := filepath.Join(dir, "plan.json")
	pt, inputs, err := ReadPortfolioPlan(path)
	if err != nil {
		return nil, "", nil, err
	}
	return pt, "read from " + path, plan.InputChanges(path, inputs, plan.InputFiles(f)), nil
}

// IsPortfolioPlan reports whether DIR/plan.json is the plan of a
// portfolio (its kind is "portfolio"). A file that cannot be read or
// parsed is not; ReadPlan then reports why.
func IsPortfolioPlan(dir string) bool {
	src, err := os.ReadFile(filepath.Join(dir, "plan.json"))
	if err != nil {
		return false
	}
	var head struct {
		Kind string `json:"kind"`
	}
	return json.Unmarshal(src, &head) == nil && head.Kind == "portfolio"
}
