package plan

import (
	"fmt"
	"strings"

	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/series"
)

// nearestNames is how many names an error offers for a selector that
// matches nothing.
const nearestNames = 3

// selectSeries returns the names of the series of h that f's
// history.series selects, in file order: the one it names, every series
// of the file when it names none, or those its names and patterns match (see
// package scenario/series). A name or pattern that matches nothing is an
// error at its position, offering the nearest names of the file.
func selectSeries(f *scenario.File, h *data.History) ([]string, error) {
	ref := f.History
	if ref.Select == nil {
		if ref.Series == "" {
			return names(h), nil // every series of the file
		}
		s, err := h.Lookup(ref.Series)
		if err != nil {
			return nil, f.ErrorAt(ref.Pos, "history.series", err)
		}
		return []string{s.Name}, nil
	}
	all := names(h)
	patterns := make([]string, len(ref.Select))
	for i, s := range ref.Select {
		patterns[i] = s.Pattern
	}
	selected, unmatched := series.Select(patterns, all)
	if len(unmatched) == 0 {
		return selected, nil
	}
	for i, s := range ref.Select {
		if s.Pattern != unmatched[0] {
			continue
		}
		key := "history.series"
		if len(ref.Select) > 1 || !series.IsPattern(s.Pattern) {
			key = fmt.Sprintf("history.series[%d]", i)
		}
		what := "no series is called %q"
		if series.IsPattern(s.Pattern) {
			what = "the pattern %q matches no series"
		}
		return nil, f.ValueError(key, s.Pos, what+" of %s; the nearest are %s",
			s.Pattern, ref.File, quoteAll(series.Nearest(s.Pattern, all, nearestNames)))
	}
	return nil, nil // not reached: every unmatched pattern is one of ref.Select
}

// levels returns the names of the levels of the selected series:
// history.levels, which must have as many as every selected name, or
// level1, level2, ... up to the deepest one.
func levels(f *scenario.File, selected []string) ([]string, error) {
	if given := f.History.Levels; given != nil {
		for _, name := range selected {
			if d := series.Depth(name); d != len(given) {
				return nil, f.ValueError("history.levels", f.History.Pos,
					"names %s (%s), but series %q has %d; give one name per level of every selected series",
					levelCount(len(given)), strings.Join(given, ", "), name, d)
			}
		}
		return given, nil
	}
	depth := 0
	for _, name := range selected {
		depth = max(depth, series.Depth(name))
	}
	out := make([]string, depth)
	for i := range out {
		out[i] = fmt.Sprintf("level%d", i+1)
	}
	return out, nil
}

// one returns nil when in holds one series to plan (or was built by hand,
// with Selected nil), and otherwise an error at history.series listing
// the first few selected.
func (in *Inputs) one(f *scenario.File) error {
	if len(in.Selected) <= 1 {
		return notYetPlanned(f)
	}
	const shown = 5
	list := quoteAll(in.Selected[:min(shown, len(in.Selected))])
	if len(in.Selected) > shown {
		list += ", ..."
	}
	return f.ValueError("history.series", f.History.Pos,
		"%d series selected (%s): plan, stress, buffer and compare take several series, but this command takes one so far; select one", len(in.Selected), list)
}

// One returns the error of Read for inputs read by ReadSelection: at
// history.series when they hold several series, or for what a plan of one
// series does not take yet (resources, new series); nil otherwise.
func (in *Inputs) One(f *scenario.File) error { return in.one(f) }

// names returns the names of the series of h, in file order.
func names(h *data.History) []string { return h.Extents.Names() }

// quoteAll quotes each word and joins them with commas.
func quoteAll(words []string) string {
	q := make([]string, len(words))
	for i, w := range words {
		q[i] = fmt.Sprintf("%q", w)
	}
	return strings.Join(q, ", ")
}

// levelCount names n levels: "1 level", "2 levels".
func levelCount(n int) string {
	if n == 1 {
		return "1 level"
	}
	return fmt.Sprintf("%d levels", n)
}

// notYetPlanned refuses what the file format reads but the planner does
// not use yet (resources, series that new: true creates), rather than
// ignoring it: a plan never leaves out part of its input without a word.
// A plan of several series (BuildPortfolio) notes its resources instead.
func notYetPlanned(f *scenario.File) error {
	if err := noNewSeries(f); err != nil {
		return err
	}
	if len(f.Resources) > 0 {
		return f.ValueError("resources", f.Resources[0].Pos, "resources come with the stress of plans of several series, which this version does not run yet; use capacity for one line over the series")
	}
	return nil
}
