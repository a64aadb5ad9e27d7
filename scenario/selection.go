package scenario

import (
	"fmt"
	"strings"
	"unicode/utf8"

	"forelay/scenario/series"

	"gopkg.in/yaml.v3"
)

// seriesSelection decodes history.series: one name, one pattern, or a list
// of names and patterns. One name without a wildcard goes to h.Series, as
// it always has; anything else to h.Select.
func (d *decoder) seriesSelection(m *mapping, h *HistoryRef) {
	v, ok := m.vals["series"]
	if !ok {
		return
	}
	field := m.field("series")
	v = deref(v)
	switch {
	case v.Kind == yaml.ScalarNode && v.Tag != "!!null":
		if !series.IsPattern(v.Value) {
			m.str("series", &h.Series)
			return
		}
		if s, ok := d.selector(v, field); ok {
			h.Select = []Selector{s}
			d.pos[field] = s.Pos
		}
	case v.Kind == yaml.SequenceNode:
		if len(v.Content) == 0 {
			d.fail(d.position(v), field, ErrValue, "an empty list; give at least one series name or pattern, or leave the key out")
			return
		}
		sel := make([]Selector, 0, len(v.Content))
		for i, n := range v.Content {
			if s, ok := d.selector(n, index(field, i)); ok {
				sel = append(sel, s)
			}
		}
		if len(sel) == len(v.Content) {
			h.Select = sel
			d.pos[field] = d.position(v)
		}
	default:
		d.fail(d.position(v), field, ErrType, "want a series name, a pattern or a list of them, got %s", got(v))
	}
}

// selector decodes one series name or pattern.
func (d *decoder) selector(n *yaml.Node, field string) (Selector, bool) {
	n = d.scalar(n, field, "a series name or pattern")
	if n == nil {
		return Selector{}, false
	}
	at := d.position(n)
	if err := series.Check(n.Value); err != nil {
		d.fail(at, field, ErrValue, "%v", err)
		return Selector{}, false
	}
	if c := utf8.RuneCountInString(n.Value); c > d.limits.NameLength {
		d.fail(at, field, ErrValue, "a name of %s", limitError(c, d.limits.NameLength, "characters", "name-length"))
		return Selector{}, false
	}
	d.pos[field] = at
	return Selector{Pattern: n.Value, Pos: at}, true
}

// names decodes a list of distinct, non-empty names without "/" under
// key (history.key or history.levels), or returns nil after recording a
// problem. what describes one entry. columns says the names are CSV
// columns, compared as the history reader compares header cells: trimmed
// and ignoring case, and never period or value.
func (d *decoder) names(m *mapping, key, what string, columns bool) []string {
	items, ok := m.list(key)
	if !ok {
		return nil
	}
	field := m.field(key)
	if len(items) == 0 {
		d.fail(d.at(field, Pos{}), field, ErrValue, "an empty list; give at least one %s, or leave the key out", what)
		delete(d.pos, field)
		return nil
	}
	out := make([]string, 0, len(items))
	seen := map[string]int{} // compared form -> index
	for i, n := range items {
		f := index(field, i)
		n = d.scalar(n, f, what)
		if n == nil {
			continue
		}
		at := d.position(n)
		name, cmpd := n.Value, n.Value
		if columns {
			name = strings.TrimSpace(name)
			cmpd = strings.ToLower(name)
		}
		switch j, dup := seen[cmpd]; {
		case name == "":
			d.fail(at, f, ErrValue, "must not be empty")
		case strings.Contains(name, "/"):
			d.fail(at, f, ErrValue, "%q holds a /, which separates the levels of a series name", name)
		case columns && (cmpd == "period" || cmpd == "value"):
			d.fail(at, f, ErrValue, "%q is the %s column; the key names the columns that make the series name", name, cmpd)
		case dup:
			d.fail(at, f, ErrValue, "%q is already %s", name, index(field, j))
		default:
			seen[cmpd] = i
			out = append(out, name)
			continue
		}
	}
	if len(out) != len(items) {
		delete(d.pos, field)
		return nil
	}
	return out
}

// count names n things: "1 level", "2 levels".
func count(n int, thing string) string {
	if n == 1 {
		return "1 " + thing
	}
	return fmt.Sprintf("%d %ss", n, thing)
}
