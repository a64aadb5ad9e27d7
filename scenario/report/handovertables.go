package report

import (
	"fmt"
	"strings"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/plan"
)

// An InputFile is a file a handed-over plan rests on: its role
// ("scenario", "history", "actuals"), its path as given, and the SHA-256
// digest of its bytes (empty when it could not be read).
type InputFile struct {
	Role, Path, Digest string
}

// inputFiles returns the files of f with the digests a plan recorded,
// then more.
func inputFiles(f *scenario.File, digests map[string]string, more []InputFile) []InputFile {
	var out []InputFile
	for _, in := range plan.InputFiles(f) {
		out = append(out, InputFile{Role: in.Role, Path: in.Path, Digest: digests[in.Role]})
	}
	return append(out, more...)
}

// filesTable lists the input files with their digests.
func filesTable(files []InputFile) *Table {
	t := NewTable("role", "file", "SHA-256").Left(1, 2)
	for _, f := range files {
		t.AddRow(f.Role, f.Path, OrNone([]string{f.Digest}))
	}
	return t
}

// factsTable is a two-column table of what a plan is: name and value.
func factsTable(rows ...[2]string) *Table {
	t := NewTable("item", "value").Left(1)
	for _, r := range rows {
		t.AddRow(r[0], r[1])
	}
	return t
}

// eventOwner returns who answers for an event: the owner the scenario file
// (or its events file) gives it, or "" when it gives none. When no event
// has an owner the events table has no owner column.
func eventOwner(e *scenario.Event) string {
	return e.Owner
}

// eventsTable lists the events of f in file order: id, kind, timing,
// effect, probability, range, scope and note, and the owner when any
// event has one. learnt maps an event id to the plan's copy of it that
// carries an effect learnt from its past occurrences; d is the number of
// decimals of the plan's numbers.
func eventsTable(f *scenario.File, learnt map[string]*scenario.Event, next forecast.Period, d int) *Table {
	owners := false
	for _, e := range f.Events {
		owners = owners || eventOwner(e) != ""
	}
	head := []string{"id", "kind", "timing", "effect", "probability", "range", "scope", "note"}
	if owners {
		head = append(head, "owner")
	}
	t := NewTable(head...).Left(1, 2, 3, 5, 6, 7, 8)
	for _, e := range f.Events {
		if c, ok := learnt[e.ID]; ok {
			e = c
		}
		row := []string{e.ID, e.Kind.String(), timingText(e, next), effectText(e, next, f.Units, d),
			probabilityText(e), rangeText(e, d), scopeText(e, d), e.Note}
		if owners {
			row = append(row, eventOwner(e))
		}
		t.AddRow(row...)
	}
	return t
}

// timingText says when an event acts: its start and end or length, its
// ramp, its past occurrences, and whether it lies in the history.
func timingText(e *scenario.Event, next forecast.Period) string {
	var s string
	switch {
	case e.HasEnd:
		s = fmt.Sprintf("%s to %s", e.Start, e.End)
	case e.Kind == scenario.Pulse:
		s = fmt.Sprintf("%s, %s", e.Start, periodsText(e.Periods))
	default:
		s = fmt.Sprintf("from %s on", e.Start)
	}
	if e.Ramp.Periods > 0 && e.Ramp.Shape != scenario.Immediate {
		s += fmt.Sprintf("; %s ramp over %s", e.Ramp.Shape, periodsText(e.Ramp.Periods))
	}
	if e.Payback != nil {
		s += fmt.Sprintf("; %.0f%% paid back over %s", 100*e.Payback.Share, periodsText(e.Payback.Periods))
	}
	if n := len(e.Past); n > 0 {
		s += fmt.Sprintf("; %d %s in the history", n, Plural(n, "past occurrence", "past occurrences"))
	}
	if e.IsPast(next) {
		s += "; in the history, taken out before fitting"
	}
	return s
}

// effectText is an event's effect at full size; a past event's, when the
// file gives none, is estimated while the history is cleaned.
func effectText(e *scenario.Event, next forecast.Period, units string, d int) string {
	if e.IsPast(next) && !e.Effect.IsPercent && e.Effect.Units == 0 {
		return "estimated from the history (see Scenarios)"
	}
	s := effectOf(e.Effect, units, d)
	if e.Effect.FromPast {
		s += " (learnt from the past occurrences)"
	}
	return s
}

// effectOf formats one effect: units per period, or a percentage of the
// baseline.
func effectOf(ef scenario.Effect, units string, d int) string {
	switch {
	case ef.IsPercent:
		return Signed(ef.Percent, 1) + "% of the baseline"
	case ef.FromPast && ef.Units == 0:
		return "learnt from the past occurrences"
	}
	return Signed(ef.Units, d) + unitsSuffix(units) + " per period"
}

// probabilityText is the chance an event happens, in percent.
func probabilityText(e *scenario.Event) string {
	return forecast.FormatNumber(100*e.Probability, 0) + "%"
}

// rangeText is an event's 90% range, or "-".
func rangeText(e *scenario.Event, d int) string {
	if e.Range == nil {
		return "-"
	}
	pct := ""
	if e.Effect.IsPercent {
		pct = "%"
	}
	return fmt.Sprintf("%s%s to %s%s", num(e.Range.Low, d), pct, num(e.Range.High, d), pct)
}

// scopeText lists the series an event moves: the plan's only series when
// it has no scope.
func scopeText(e *scenario.Event, d int) string {
	if len(e.Scope) == 0 {
		return "the plan's series"
	}
	parts := make([]string, len(e.Scope))
	for i, s := range e.Scope {
		p := s.Series
		var extra []string
		if s.New {
			extra = append(extra, "new")
		}
		if s.Effect != nil {
			extra = append(extra, effectOf(*s.Effect, "", d))
		}
		if len(extra) > 0 {
			p += " (" + strings.Join(extra, ", ") + ")"
		}
		parts[i] = p
	}
	return strings.Join(parts, "; ")
}

// periodsText is "1 period" or "n periods".
func periodsText(n int) string { return fmt.Sprintf("%d %s", n, Plural(n, "period", "periods")) }
