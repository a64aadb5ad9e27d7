package scenario

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"forelay/scenario/series"
)

// A ScopeEntry is one item of an event's scope: the series it moves and,
// optionally, the effect it has on each of them.
type ScopeEntry struct {
	// Series is a series name or a pattern (see package scenario/series)
	// naming the series the entry moves. Without New, it must match at
	// least one series of the plan.
	Series string
	// Effect, when not nil, is the entry's own effect, applied in full to
	// every series the entry matches; nil means the series share the
	// event's effect (divided as its Split says).
	Effect *Effect
	// New says the entry creates a series the history does not hold (a
	// product the customer never bought): its baseline is zero and its
	// bands come from the event's range and probability alone. Series is
	// then one name, not a pattern, and must not be a series of the history
	// file.
	New bool
	// Pos is where the entry's list item stands.
	Pos Pos
}

// Split says how a units effect is shared among the series of a scope.
type Split int

// The ways of sharing a units effect. SplitNone, the zero value, gives
// every series the full effect.
const (
	SplitNone Split = iota
	// SplitBaseline divides the units in proportion to each series'
	// baseline over the event's span.
	SplitBaseline
	// SplitEqual divides the units evenly among the series.
	SplitEqual
)

var splitNames = [...]string{"none", "baseline", "equal"}

// String returns the split's name: none, baseline or equal (a file writes
// no split for none).
func (s Split) String() string {
	if s < 0 || int(s) >= len(splitNames) {
		return fmt.Sprintf("Split(%d)", int(s))
	}
	return splitNames[s]
}

// ParseSplit reads baseline or equal; "" and none give SplitNone.
func ParseSplit(s string) (Split, error) {
	switch s {
	case "", "none":
		return SplitNone, nil
	case "baseline":
		return SplitBaseline, nil
	case "equal":
		return SplitEqual, nil
	}
	return SplitNone, fmt.Errorf("unknown split %q (want baseline or equal)", s)
}

// The keys of a scope entry and the values of effect.split.
var (
	scopeKeys   = []string{"series", "effect", "new"}
	splitValues = []string{"baseline", "equal"}
)

// effect decodes an effect mapping (the event's or a scope entry's).
func (d *decoder) effect(m *mapping, ef *Effect) {
	m.num("units", &ef.Units)
	ef.IsPercent = m.num("percent", &ef.Percent)
	var from string
	ef.FromPast = m.enum("from", "source", fromValues, &from)
	typed(m, "split", "split", splitValues, ParseSplit, &ef.Split)
}

// scope decodes an event's scope list.
func (d *decoder) scope(items []*yaml.Node, m *mapping, e *Event) {
	field := m.field("scope")
	if len(items) == 0 {
		d.fail(d.at(field, e.Pos), field, ErrValue, "an empty list; give at least one series name or pattern, or leave the key out")
		delete(d.pos, field)
		return
	}
	seen := map[string]int{}
	for i, n := range items {
		path := index(field, i)
		sm := d.mapping(n, path, scopeKeys)
		if sm == nil {
			continue
		}
		s := ScopeEntry{Pos: d.position(sm.node)}
		sm.require("series")
		if v, ok := sm.vals["series"]; ok {
			if sel, ok := d.selector(v, sm.field("series")); ok {
				s.Series = sel.Pattern
				if j, dup := seen[s.Series]; dup {
					d.fail(sel.Pos, sm.field("series"), ErrDuplicate, "%q is already %s", s.Series, index(field, j))
				}
				seen[s.Series] = i
			}
		}
		if em := sm.sub("effect", effectKeys); em != nil {
			s.Effect = &Effect{}
			d.effect(em, s.Effect)
		}
		sm.boolean("new", &s.New)
		e.Scope = append(e.Scope, s)
	}
}

// scopeField returns the key path of a key of the i-th scope entry.
func (e *Event) scopeField(i int, key string) string {
	return join(index(e.field("scope"), i), key)
}

// checkScope checks an event's scope and the split of its effect: a new
// series is one name moved by units, an entry's own effect is one of
// units, percent or from: past, and split divides the event's units among
// the series of a scope.
func (d *decoder) checkScope(e *Event) {
	if sf := e.field("effect.split"); d.given(sf) {
		at := d.at(sf, e.Pos)
		switch {
		case e.Effect.IsPercent:
			d.fail(at, sf, ErrValue, "percent effects apply to each series in full; leave out split, or give the effect in units")
		case e.Effect.FromPast:
			d.fail(at, sf, ErrValue, "split divides an effect in units; give units, or leave out split")
		case !d.given(e.field("scope")) && !d.failedUnder(e.field("scope")):
			d.fail(at, sf, ErrValue, "split divides the effect among the series of the scope; give scope, or leave out split")
		}
	}
	for i := range e.Scope {
		s := &e.Scope[i]
		if s.Effect != nil {
			d.checkEntryEffect(e, i)
		}
		nf := e.scopeField(i, "new")
		if !s.New || !d.given(nf) {
			continue
		}
		if series.IsPattern(s.Series) {
			d.fail(d.at(nf, s.Pos), nf, ErrValue, "%q is a pattern, and new: true creates one series; give the new series' full name", s.Series)
			continue
		}
		ef := &e.Effect
		if s.Effect != nil {
			ef = s.Effect
		}
		switch {
		case ef.IsPercent:
			d.fail(d.at(nf, s.Pos), nf, ErrValue, "a new series has no baseline, so a percent effect adds nothing to it; give the effect in units")
		case s.Effect == nil && e.Effect.Split == SplitBaseline:
			d.fail(d.at(nf, s.Pos), nf, ErrValue, "a new series has no baseline, so split: baseline gives it nothing; give the entry its own effect ({units: N}), or use split: equal")
		}
	}
}

// checkEntryEffect checks the own effect of the i-th scope entry.
func (d *decoder) checkEntryEffect(e *Event, i int) {
	s := e.Scope[i]
	base := e.scopeField(i, "effect")
	d.checkEffectKeys(base, s.Effect, s.Pos)
	from := join(base, "from")
	if s.Effect.FromPast && len(e.Past) == 0 && !d.failedUnder(e.field("past")) {
		d.fail(d.at(from, s.Pos), from, ErrMissing, "from: past needs the event's past occurrences (past: [...])")
	}
	if sf := join(base, "split"); d.given(sf) {
		d.fail(d.at(sf, s.Pos), sf, ErrValue, "a scope entry's own effect applies in full to every series it matches; give split on the event's effect")
	}
}

// coveredByScope reports whether every entry of the event's scope has an
// effect of its own, so that the event needs none.
func (e *Event) coveredByScope() bool {
	if len(e.Scope) == 0 {
		return false
	}
	for _, s := range e.Scope {
		if s.Effect == nil {
			return false
		}
	}
	return true
}

// nearestNames is how many names an error offers for a pattern that
// matches nothing.
const nearestNames = 3

// CheckSeries makes the checks of scopes and resources that need the
// names of the series: selected are the plan's series (those
// history.series selects, in any order), history all those of the history
// file (nil means the same as selected). It reports, with positions:
//
//   - a scope entry without new: true whose name or pattern matches none
//     of the plan's series (nor a series another entry creates), naming
//     the nearest;
//   - a scope entry with new: true whose name is already a series of the
//     plan, or of the history file;
//   - a series that two entries of one scope match, at the second entry;
//   - a resource whose pattern matches no series, naming the nearest;
//   - when the plan has more than one series (the selected ones and those
//     new: true creates), an event without a scope.
//
// Errors are as for Parse. CheckSeries changes nothing.
func (f *File) CheckSeries(selected, history []string) error {
	r := &reporter{file: f.Path, pos: f.pos}
	all := f.seriesWithNew(selected)
	for _, e := range f.Events {
		for i, s := range e.Scope {
			field := e.scopeField(i, "series")
			switch {
			case s.New && slices.Contains(selected, s.Series):
				r.fail(r.at(field, s.Pos), field, ErrValue,
					"%q is already a series of the plan; leave out new: true to move it", s.Series)
			case s.New && slices.Contains(history, s.Series):
				r.fail(r.at(field, s.Pos), field, ErrValue,
					"%q is a series of %s that history.series does not select; select it and leave out new: true", s.Series, f.History.File)
			case !s.New && !matchesAny(s.Series, all):
				r.fail(r.at(field, s.Pos), field, ErrValue, "%s", noMatch(s.Series, all))
			}
		}
		for _, o := range e.scopeOverlaps(all) {
			s := e.Scope[o.second]
			field := e.scopeField(o.second, "series")
			r.fail(r.at(field, s.Pos), field, ErrValue,
				"%q is matched by %s too; an event moves each series once: narrow a pattern, or make two events",
				o.series, index(e.field("scope"), o.first))
		}
	}
	for _, res := range f.Resources {
		if field := res.field("series"); res.Series != "" && !matchesAny(res.Series, all) {
			r.fail(r.at(field, res.Pos), field, ErrValue, "%s", noMatch(res.Series, all))
		}
	}
	if len(all) > 1 {
		for _, e := range f.Events {
			if len(e.Scope) == 0 {
				r.fail(e.Pos, e.field("scope"), ErrMissing,
					"required: the plan has %d series; say which the event moves (scope: [{series: NAME or PATTERN}])", len(all))
			}
		}
	}
	return r.err()
}

// NewSeries returns the series the scopes create (new: true) that are not
// among names, each once, in file order.
func (f *File) NewSeries(names []string) []string {
	return f.seriesWithNew(names)[len(names):]
}

// seriesWithNew returns names followed by the names the scopes create
// that are not among them, each once: names itself when there are none,
// and otherwise a copy.
func (f *File) seriesWithNew(names []string) []string {
	all := slices.Clip(names) // the first append copies
	for _, e := range f.Events {
		for _, s := range e.Scope {
			if s.New && !slices.Contains(all, s.Series) {
				all = append(all, s.Series)
			}
		}
	}
	return all
}

// matchesAny reports whether pattern matches at least one of names.
func matchesAny(pattern string, names []string) bool {
	for _, n := range names {
		if series.Match(pattern, n) {
			return true
		}
	}
	return false
}

// noMatch is the message of a name or pattern that matches none of names.
func noMatch(pattern string, names []string) string {
	what := fmt.Sprintf("no series of the plan is called %q", pattern)
	if series.IsPattern(pattern) {
		what = fmt.Sprintf("the pattern %q matches no series of the plan", pattern)
	}
	near := series.Nearest(pattern, names, nearestNames)
	if len(near) == 0 {
		return what
	}
	q := make([]string, len(near))
	for i, n := range near {
		q[i] = strconv.Quote(n)
	}
	return what + "; the nearest are " + strings.Join(q, ", ")
}
