package plan

import (
	"os"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
)

// A Production is the production plan a frozen-production stress holds
// to: the series read from the production.plan CSV and the file it came
// from.
type Production struct {
	// Path is the CSV, as the scenario file resolves it.
	Path string
	// Series is the CSV's only series, or the one named like the planned
	// series.
	Series forecast.Series
}

// ReadProduction reads the production.plan CSV of p's file, under the
// file's limits, at the frequency of the planned series. It returns nil
// and no error when the file sets no frozen production mode or names no
// production plan: only a frozen plan is ever read.
//
// Errors are *data.ParseError values: naming the CSV and its line for a
// bad file, or the scenario file's production.plan key when the CSV
// cannot be opened or holds several series and none is named like the
// planned series.
func ReadProduction(p *Plan) (*Production, error) {
	f := p.File
	pr := f.Production
	if pr == nil || pr.Mode != scenario.Frozen || pr.Plan == "" {
		return nil, nil
	}
	fail := func(err error) error {
		return f.ValueError("production.plan", pr.Pos, "%v", err)
	}
	fh, err := os.Open(pr.Plan)
	if err != nil {
		return nil, fail(err)
	}
	defer fh.Close()
	limits := f.EffectiveLimits()
	h, err := data.ReadHistory(data.BoundedReader(fh, pr.Plan, limits.Input), pr.Plan,
		data.ReadOptions{Freq: p.History.Freq()})
	if err != nil {
		return nil, err
	}
	var ser forecast.Series
	if len(h.Series) == 1 {
		ser = h.Series[0]
	} else if ser, err = h.Lookup(p.History.Name); err != nil {
		return nil, fail(err)
	}
	return &Production{Path: pr.Plan, Series: ser}, nil
}
