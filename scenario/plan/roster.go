package plan

import (
	"fmt"
	"slices"
	"strings"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
)

// A roster lists the series a portfolio plans, found in the extents of the
// history (data.History.Extents) rather than as series with values, so
// that a shard, which keeps the values of its own series only, spends a
// few bytes on each of the others.
type roster struct {
	h *data.History
	// names are the series planned, in the order of Inputs.Selected
	// (Inputs.Selected itself when none is left out), and at the index of
	// each in h.Extents.
	names []string
	at    []int32
	// first is the first plan period: the period after the latest last
	// one of the selected series.
	first forecast.Period
	// span is the number of periods from the earliest start of the
	// selected series (those left out included) to first.
	span int
}

// series returns the history of the i-th series planned: the series of
// h.Series, or when its values were not kept (a series of another shard)
// one with as many zeros as it has periods.
func (r *roster) series(i int) forecast.Series {
	x, j := &r.h.Extents, int(r.at[i])
	if k := x.Series(j); k >= 0 {
		return r.h.Series[k]
	}
	return forecast.Series{Name: x.Name(j), Start: x.Start(j), Values: make([]float64, x.Periods(j))}
}

// read reports whether the values of the i-th series planned were read.
func (r *roster) read(i int) bool { return r.h.Extents.Series(int(r.at[i])) >= 0 }

// newRoster finds the series in.Selected names in the history and leaves
// out, with a warning naming how many, those that end before the latest
// last period among them (see CheckPortfolio). A selected name that the
// history lacks is an error at history.series.
func newRoster(f *scenario.File, in *Inputs) (*roster, []string, error) {
	at, err := selectedExtents(f, in)
	if err != nil {
		return nil, nil, err
	}
	x := &in.History.Extents
	r := &roster{h: in.History}
	for _, j := range at {
		if next := x.Next(int(j)); r.first.IsZero() || r.first.Before(next) {
			r.first = next
		}
	}
	var stale []string // the first few
	left := 0
	for _, j := range at {
		r.span = max(r.span, r.first.Sub(x.Start(int(j))))
		if x.Next(int(j)) != r.first {
			if left++; len(stale) < staleShown {
				stale = append(stale, fmt.Sprintf("%q (to %s)", x.Name(int(j)), x.Next(int(j)).Add(-1)))
			}
		}
	}
	r.names, r.at = slices.Clip(in.Selected), at
	if left > 0 {
		r.names, r.at = make([]string, 0, len(at)-left), make([]int32, 0, len(at)-left)
		for _, j := range at {
			if x.Next(int(j)) == r.first {
				r.names, r.at = append(r.names, x.Name(int(j))), append(r.at, j)
			}
		}
	}
	var warnings []string
	if left > 0 {
		list := strings.Join(stale, ", ")
		if left > staleShown {
			list += ", ..."
		}
		warnings = append(warnings, fmt.Sprintf("%d of %d series end before %s, the last period of the others, and are left out of the plan: %s; bring their history up to date, or leave them out of history.series",
			left, len(at), r.first.Add(-1), list))
	}
	return r, warnings, nil
}

// staleShown is how many of the series left out as stale their warning
// names.
const staleShown = 3

// selectedExtents returns the index in in.History.Extents of each series
// in.Selected names, in its order. The names ReadSelection selects come
// in file order, each once, and are found in one walk through the
// history; others through a map of the history's names.
func selectedExtents(f *scenario.File, in *Inputs) ([]int32, error) {
	x := &in.History.Extents
	at := make([]int32, 0, len(in.Selected))
	for i := 0; i < x.Len() && len(at) < len(in.Selected); i++ {
		if x.Name(i) == in.Selected[len(at)] {
			at = append(at, int32(i))
		}
	}
	if len(at) == len(in.Selected) {
		return at, nil
	}
	byName := make(map[string]int, x.Len())
	for i := range x.Len() {
		byName[x.Name(i)] = i
	}
	at = at[:0]
	for _, name := range in.Selected {
		j, ok := byName[name]
		if !ok {
			_, err := in.History.Lookup(name) // the error naming the file's series
			return nil, f.ValueError("history.series", f.History.Pos, "%v", err)
		}
		at = append(at, int32(j))
	}
	return at, nil
}
