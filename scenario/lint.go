package scenario

import (
	"errors"
	"fmt"
	"strconv"

	"forelay/forecast"
)

// Lint returns warnings about input that is legal but almost certainly not
// meant, for a file that Parse and Resolve accepted; hist is its history
// (hist.Next() is the first forecast period). For each event, in file
// order, it warns of:
//
//   - an event that lies wholly outside the history and the horizon, whose
//     past occurrences (if any) do not touch the history either: it adds
//     nothing;
//   - else, a past occurrence that lies wholly before the history: there
//     is nothing to clean and nothing to learn from;
//   - an event that starts inside the history, lies wholly before the
//     forecast and gives an effect in units or percent: it is treated as a
//     past event, taken out of the history, and its effect is not used (a
//     past event is declared by leaving out its effect). When the date one
//     year after its start lies in the horizon, the warning offers it;
//   - a percent effect (the event's or a scope entry's) below 1 in
//     absolute value (not 0): 0.4 means 0.4 %, not 40 %.
//
// Each warning is one sentence ending with the fix, starting with the
// file, the line and column and the key path as errors do:
//
//	plan.yaml:14:12: event "fair": effect.percent: 0.4 means 0.4 %, not 40 %. For 40 % write 40.
//
// Lint reads f and hist and changes neither; it returns nil when there is
// nothing to say.
func (f *File) Lint(hist forecast.Series) []string {
	if hist.Len() == 0 {
		return nil
	}
	var out []string
	l := linter{f: f, first: hist.Start, next: hist.Next()}
	l.end = l.next.Add(max(f.Horizon, 1) - 1)
	for _, e := range f.Events {
		notes := []*lintNote{l.outside(e)}
		if notes[0] == nil {
			notes = append(notes, l.oldOccurrences(e)...)
		}
		notes = append(notes, l.pastTypo(e), l.smallPercent(e, e.Effect, "effect.percent"))
		for i, s := range e.Scope {
			if s.Effect != nil {
				notes = append(notes, l.smallPercent(e, *s.Effect, join(index("scope", i), "effect.percent")))
			}
		}
		for _, w := range notes {
			if w != nil {
				out = append(out, f.warning(w))
			}
		}
	}
	return out
}

// linter holds what Lint compares events with: the history's first
// period, the first forecast period and the horizon's last one.
type linter struct {
	f                *File
	first, next, end forecast.Period
}

// lintNote is one warning before it is given its place.
type lintNote struct {
	at    Pos
	field string
	msg   string
}

// warning prints a note the way errors are printed.
func (f *File) warning(n *lintNote) string {
	return n.at.errorIn(f.Path, n.field, errors.New(n.msg)).Error()
}

// place returns the position and key path of an event's key, or the
// event's own position when the key was not decoded from a file.
func (l *linter) place(e *Event, key string, w When) (Pos, string) {
	field := e.field(key)
	at := w.Pos
	if at == (Pos{}) {
		at = e.Pos
		if p, ok := l.f.pos[field]; ok {
			at = p
		}
	}
	return at, field
}

// outside warns of an event wholly after the horizon or wholly before the
// history.
func (l *linter) outside(e *Event) *lintNote {
	if e.Start.IsZero() {
		return nil
	}
	first, last, open := e.Window(l.next)
	switch {
	case l.end.Before(first):
		for _, o := range e.Occurrences() {
			if _, ol, _ := o.Window(l.next); !ol.Before(l.first) {
				return nil // cleaned out of the history
			}
		}
		at, field := l.place(e, "start", e.Start)
		return &lintNote{at, field, fmt.Sprintf("%s lies after the horizon (%s), so the event adds nothing to the plan. Check the year, or lengthen horizon to reach it.",
			e.Start, spanText(l.next, l.end))}
	case !open && last.Before(l.first):
		at, field := l.place(e, "start", e.Start)
		if e.HasEnd {
			at, field = l.place(e, "end", e.End)
		}
		return &lintNote{at, field, fmt.Sprintf("the event (%s) lies before the history (%s), so it is neither cleaned out of the history nor in the plan. Check the dates, or remove the event.",
			spanText(first, last), spanText(l.first, l.next.Add(-1)))}
	}
	return nil
}

// oldOccurrences warns of each past occurrence wholly before the history.
func (l *linter) oldOccurrences(e *Event) []*lintNote {
	var out []*lintNote
	for j, o := range e.Occurrences() {
		if _, last, open := o.Window(l.next); open || !last.Before(l.first) {
			continue
		}
		at, field := l.place(e, "past", o.Start)
		field = index(field, j)
		out = append(out, &lintNote{at, field, fmt.Sprintf("%s lies before the history (%s), so there is nothing to clean out and nothing to learn from it. Remove it, or check the year.",
			o.Start, spanText(l.first, l.next.Add(-1)))})
	}
	return out
}

// pastTypo warns of an event with an effect that starts inside the history
// and is therefore treated as past.
func (l *linter) pastTypo(e *Event) *lintNote {
	ef := e.Effect
	if e.Start.IsZero() || ef.FromPast || (!ef.IsPercent && ef.Units == 0) || !e.IsPast(l.next) ||
		e.Start.From.Before(l.first.Start()) {
		return nil
	}
	size := forecast.FormatNumber(ef.Units, -1)
	if u := l.f.Units; u != "" {
		size += " " + u
	}
	if ef.IsPercent {
		size = forecast.FormatNumber(ef.Percent, -1) + " %"
	}
	hint := ""
	if w, ok := yearLater(e.Start); ok && !w.From.Before(l.next.Start()) && w.From.Before(l.end.End()) {
		hint = fmt.Sprintf("Did you mean %s? ", w)
	}
	at, field := l.place(e, "start", e.Start)
	return &lintNote{at, field, fmt.Sprintf("%s lies inside the history (%s), so the event is treated as a past event: it is taken out of the history and its effect of %s is not used in the plan. %s"+
		"Put the start of a coming event in the horizon (%s), or leave out the effect of a past one.",
		e.Start, spanText(l.first, l.next.Add(-1)), size, hint, spanText(l.next, l.end))}
}

// smallPercent warns of a percent effect between -1 and 1 (not 0): the
// event's effect or a scope entry's, whose percent stands at key.
func (l *linter) smallPercent(e *Event, ef Effect, key string) *lintNote {
	p := ef.Percent
	if !ef.IsPercent || p == 0 || p <= -1 || p >= 1 {
		return nil
	}
	at, field := l.place(e, key, When{})
	meant := strconv.FormatFloat(p*100, 'g', 10, 64)
	return &lintNote{at, field, fmt.Sprintf("%s means %s %%, not %s %%. For %s %% write %s.",
		strconv.FormatFloat(p, 'g', -1, 64), strconv.FormatFloat(p, 'g', -1, 64), meant, meant, meant)}
}

// yearLater returns the label one year after w, in the same form (2026-03
// gives 2027-03, 2026-Q1 gives 2027-Q1, 2026-03-14 gives 2027-03-14), and
// false when that label does not exist (29 February, week 53).
func yearLater(w When) (When, bool) {
	if len(w.Label) < 4 {
		return When{}, false
	}
	y, err := strconv.Atoi(w.Label[:4])
	if err != nil {
		return When{}, false
	}
	next, err := ParseWhen(fmt.Sprintf("%04d%s", y+1, w.Label[4:]))
	if err != nil || next.Unit != w.Unit {
		return When{}, false
	}
	return next, true
}

// spanText names a stretch of periods: "2019-01 to 2026-10".
func spanText(first, last forecast.Period) string {
	return first.String() + " to " + last.String()
}
