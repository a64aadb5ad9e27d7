package main

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"io"
	"slices"
	"strings"

	"forelay/scenario"
)

// pickEvent returns the future event called id, nil for an empty id. An id
// that is not a future event of the plan is a flag error that says why.
func pickEvent(p *plan.Plan, id string) (*scenario.Event, error) {
	if id == "" {
		return nil, nil
	}
	var ids []string
	for _, e := range p.Future {
		if e.ID == id {
			return e, nil
		}
		ids = append(ids, e.ID)
	}
	if e := p.File.Event(id); e != nil {
		return nil, flagErrorf("--event %q: the event lies before the plan's first period %s, so it is only cleaned out of the history (see the cleaning estimates)", id, p.Periods[0])
	}
	return nil, flagErrorf("--event %q: %s has no such event (its future events: %s)", id, p.File.Path, strings.Join(ids, ", "))
}

// writeEventText writes how one event adds up: in every period it touches,
// its share of full size, its contribution to the plan and the standard
// deviation of that contribution (from its range), and which scenarios
// hold it.
func writeEventText(w io.Writer, p *plan.Plan, e *scenario.Event) {
	first := p.Periods[0]
	share := e.Profile(first, len(p.Periods))
	sigma := e.Sigma(first, p.Baseline)
	contrib := e.Contribution(first, p.Baseline)
	d := decimalsFor(p.Baseline)
	var in []string
	for _, sp := range p.Scenarios {
		if slices.Contains(sp.Events, e) {
			in = append(in, sp.Name)
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "Event %s, period by period (in scenarios: %s)\n", e.ID, report.OrNone(in))
	t := newTable("period", "share", "baseline", "contribution"+report.InUnits(p.File.Units), "std dev")
	for i, per := range p.Periods {
		if share[i] == 0 {
			continue
		}
		t.AddRow(per.String(), fmtNum(share[i], 3), fmtNum(p.Baseline[i], d), report.Signed(contrib[i], d), fmtNum(sigma[i], d))
	}
	if len(t.Rows) == 0 {
		fmt.Fprintln(w, "The event touches none of the plan's periods.")
		return
	}
	writeTable(w, t)
	if e.Probability < 1 {
		fmt.Fprintf(w, "Probability %s: the risk-weighted plan counts %s of each contribution.\n", fmtNum(e.Probability, 2), fmtNum(e.Probability, 2))
	}
}
