package scenario

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"forelay/forecast"
	"forelay/scenario/series"
)

// A SeriesShare is what an event does to one series of its scope.
type SeriesShare struct {
	// Series is the series' name.
	Series string
	// Entry is the index of the scope entry that matches the series.
	Entry int
	// New says the entry creates the series (new: true).
	New bool
	// Share is the series' part of the event's units effect when the
	// event's effect is split (SplitBaseline or SplitEqual); 1 without a
	// split, for a percent effect, and under an entry's own effect.
	Share float64
	// Effect is the effect on the series: the entry's own effect in full,
	// else the event's effect with its units multiplied by Share. Its
	// Split is SplitNone, so Contribution and Sigma of an event carrying
	// it give the series' own change.
	Effect Effect
	// Range is the range of Effect: the event's range times Share for a
	// series sharing the event's effect; for an entry's own effect, the
	// event's range scaled by the ratio of the two effects when both are
	// in units or both in percent (the same relative uncertainty), else
	// nil. Nil when the event has no range.
	Range *Range
}

// ErrNoSplitBase is the error of Shares when an effect split by baseline
// has nothing to split by: every series sharing it has a zero baseline
// over the event's span.
var ErrNoSplitBase = errors.New("no baseline to split by")

// A SplitError is the error of Event.Shares for an effect split by
// baseline among series without baseline over the event's span. It wraps
// ErrNoSplitBase.
type SplitError struct {
	// Event is the event, and Sharing the number of series sharing its
	// effect.
	Event   *Event
	Sharing int
}

func (e *SplitError) Error() string {
	return fmt.Sprintf("event %q: %v: the %d series sharing its effect have no baseline over its span; use split: equal, or give scope entries their own effects", e.Event.ID, ErrNoSplitBase, e.Sharing)
}

// Unwrap returns ErrNoSplitBase.
func (e *SplitError) Unwrap() error { return ErrNoSplitBase }

// Shares resolves the event's scope against names, the plan's series
// (those history.series selects and those new: true creates; see
// File.CheckSeries), and returns one SeriesShare per series the scope
// moves, in the order of names:
//
//   - a series matched by an entry with its own effect takes that effect
//     in full;
//   - the series matched by entries without one share the event's effect:
//     with SplitNone each takes it in full (so does each under a percent
//     effect), with SplitEqual each takes Units/n, and with SplitBaseline
//     each takes Units * w_s / Σw, the sum running over the sharing
//     series.
//
// weight gives a series' weight for SplitBaseline, its baseline over the
// event's span (SpanWeight); it is called only under SplitBaseline, and a
// negative weight counts as 0. A series matched by several entries takes
// the first (File.CheckSeries refuses such a scope). An event without a
// scope moves every series of names in full. Shares returns a *SplitError
// when the weights of the sharing series sum to 0.
func (e *Event) Shares(names []string, weight func(series string) float64) ([]SeriesShare, error) {
	return e.sharesOf(names, weight, nil)
}

// sharesOf is Shares returning the shares of the series want says only
// (nil: all): the others count towards the split all the same, but a
// plan that needs the shares of a few of many series does not hold those
// of every one.
func (e *Event) sharesOf(names []string, weight func(series string) float64, want func(series string) bool) ([]SeriesShare, error) {
	var out []SeriesShare
	var w []float64 // weights of out under SplitBaseline
	split := e.Effect.Split
	if e.Effect.IsPercent || e.Effect.FromPast {
		split = SplitNone
	}
	sharing := 0 // series taking the event's effect
	total := 0.0 // their weights under SplitBaseline
	for _, n := range names {
		s := SeriesShare{Series: n, Entry: -1, Share: 1, Effect: e.Effect}
		for i, en := range e.Scope {
			if en.moves(n) {
				s.Entry, s.New = i, en.New
				if en.Effect != nil {
					s.Effect = *en.Effect
				}
				break
			}
		}
		if s.Entry < 0 && len(e.Scope) > 0 {
			continue
		}
		wn := 0.0
		if e.shared(s) {
			sharing++
			if split == SplitBaseline {
				wn = max(weight(n), 0)
				total += wn
			}
		}
		if want == nil || want(n) {
			s.Effect.Split = SplitNone
			out, w = append(out, s), append(w, wn)
		}
	}
	if sharing == 0 {
		split = SplitNone
	}
	switch split {
	case SplitEqual:
		for i := range out {
			if e.shared(out[i]) {
				out[i].Share = 1 / float64(sharing)
			}
		}
	case SplitBaseline:
		if !(total > 0) || math.IsInf(total, 0) {
			return nil, &SplitError{Event: e, Sharing: sharing}
		}
		for i := range out {
			if e.shared(out[i]) {
				out[i].Share = w[i] / total
			}
		}
	}
	for i := range out {
		if e.shared(out[i]) && out[i].Share != 1 {
			out[i].Effect.Units = e.Effect.Units * out[i].Share
		}
		out[i].Range = e.rangeOf(out[i].Effect, e.shared(out[i]), out[i].Share)
	}
	return out, nil
}

// shared reports whether the series of s shares the event's effect: it
// is matched by no entry (the event has no scope), or by one without an
// effect of its own.
func (e *Event) shared(s SeriesShare) bool { return s.Entry < 0 || e.Scope[s.Entry].Effect == nil }

// rangeOf returns the range of ef, a series' effect (see
// SeriesShare.Range): shared says the series shares the event's effect,
// with share its part.
func (e *Event) rangeOf(ef Effect, shared bool, share float64) *Range {
	switch {
	case e.Range == nil:
		return nil
	case shared:
		return &Range{Low: e.Range.Low * share, High: e.Range.High * share}
	case ef.IsPercent != e.Effect.IsPercent || ef.FromPast || e.Effect.FromPast || e.Effect.Value() == 0:
		return nil
	}
	k := ef.Value() / e.Effect.Value()
	lo, hi := e.Range.Low*k, e.Range.High*k
	return &Range{Low: min(lo, hi), High: max(lo, hi)}
}

// SpanWeight returns a series' weight for an effect split by baseline:
// the sum of its baseline (whose first period is first), clipped at 0, over
// the periods where the event's step or pulse is under way (a positive
// profile; payback periods do not count).
func (e *Event) SpanWeight(first forecast.Period, baseline []float64) float64 {
	w := 0.0
	for i, p := range e.Profile(first, len(baseline)) {
		if p > 0 && baseline[i] > 0 {
			w += baseline[i]
		}
	}
	return w
}

// A scopeOverlap is a series that two entries of one scope match.
type scopeOverlap struct {
	first, second int // the entries, first < second
	series        string
}

// scopeOverlaps returns, for each series of names matched by more than one
// entry of the event's scope, the first two such entries, ordered by the
// second entry and then by names; each pair of entries once.
func (e *Event) scopeOverlaps(names []string) []scopeOverlap {
	var out []scopeOverlap
	for _, n := range names {
		first := -1
		for i, en := range e.Scope {
			if !en.moves(n) {
				continue
			}
			if first < 0 {
				first = i
				continue
			}
			if !slices.ContainsFunc(out, func(o scopeOverlap) bool { return o.first == first && o.second == i }) {
				out = append(out, scopeOverlap{first, i, n})
			}
			break
		}
	}
	slices.SortStableFunc(out, func(a, b scopeOverlap) int { return a.second - b.second })
	return out
}

// moves reports whether the scope entry moves the series called name: the
// series it creates, or one its name or pattern matches.
func (en ScopeEntry) moves(name string) bool {
	return en.Series == name || (!en.New && series.Match(en.Series, name))
}
