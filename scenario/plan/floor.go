package plan

import (
	"fmt"
	"forelay/forecast"
	"forelay/scenario"
	"math"
	"strings"
)

// A Clip says which event pushed a scenario's plan below the floor, and
// where. An event pushes the plan below the floor in a period when the
// baseline alone is at or above the floor, the baseline plus the
// scenario's events (adjusted or risk-weighted) is below it, and the event's
// contribution there is negative.
type Clip struct {
	// Event is the event; it is one of the scenario's events.
	Event *scenario.Event
	// Periods are the indexes into Plan.Periods of the periods it pushed
	// below the floor, in order.
	Periods []int
	// Baseline is the mean baseline over those periods, and Least and
	// Most the smallest and the largest fall the event causes in them, in
	// units (positive numbers: 900000 is a fall of 900,000).
	Baseline    float64
	Least, Most float64
}

// clip raises the plan of sp to the floor and records why. With f the
// floor, in every period
//
//	adjusted      = max(adjusted, f)
//	risk-weighted = max(risk-weighted, f)
//	lower         = max(min(lower, adjusted), f)
//	upper         = max(upper, adjusted)
//
// so that f <= lower <= adjusted <= upper holds in every row; the variance
// is left as it was. Periods where only the lower band was raised (the
// plan itself above the floor, the usual case near zero) are counted in
// Floored; the events that pushed the plan itself below go into Clips.
func (p *Plan) clip(sp *ScenarioPlan) {
	if p.Floor == nil {
		return
	}
	f := *p.Floor
	pushed := map[*scenario.Event][]int{}
	for t := range sp.Adjusted {
		adj, rw := sp.Adjusted[t], sp.RiskWeighted[t]
		// A plan within rounding of the floor (a -100 % effect leaves
		// baseline - baseline*100/100, which may differ from 0 in the last
		// bits) is set to it without counting as pushed below.
		tol := 1e-9 * max(1, math.Abs(p.Baseline[t]))
		below := adj < f-tol || rw < f-tol
		if below {
			sp.Clipped++
			if p.Baseline[t] >= f {
				for _, e := range p.Future {
					if sp.Contrib[e.ID][t] < 0 {
						pushed[e] = append(pushed[e], t)
					}
				}
			}
		}
		sp.Adjusted[t], sp.RiskWeighted[t] = max(adj, f), max(rw, f)
		adj = sp.Adjusted[t]
		if sp.Lower[t] > adj {
			sp.Lower[t] = adj
		}
		if sp.Lower[t] < f {
			sp.Lower[t] = f
			if !below {
				sp.Floored++
			}
		}
		if sp.Upper[t] < adj {
			sp.Upper[t] = adj
		}
	}
	for _, e := range p.Future {
		if ts := pushed[e]; len(ts) > 0 {
			sp.Clips = append(sp.Clips, p.newClip(e, sp, ts))
		}
	}
}

// newClip sums up how event e pushed sp below the floor in periods ts.
func (p *Plan) newClip(e *scenario.Event, sp *ScenarioPlan, ts []int) Clip {
	c := Clip{Event: e, Periods: ts}
	for k, t := range ts {
		fall := -sp.Contrib[e.ID][t]
		c.Baseline += p.Baseline[t]
		if k == 0 || fall < c.Least {
			c.Least = fall
		}
		if k == 0 || fall > c.Most {
			c.Most = fall
		}
	}
	c.Baseline /= float64(len(ts))
	return c
}

// floorWarnings returns the warnings about the floor: the periods where
// the baseline itself is below it, then one warning per scenario and event
// that pushed the plan below it, in scenario order and, within a
// scenario, in file order.
func (p *Plan) floorWarnings() []string {
	if p.Floor == nil {
		return nil
	}
	d := forecast.Decimals(p.Baseline)
	floor := forecast.FormatNumber(*p.Floor, -1)
	var out []string
	var low []int
	for t, b := range p.Baseline {
		if b < *p.Floor {
			low = append(low, t)
		}
	}
	if len(low) > 0 {
		least := p.Baseline[low[0]]
		for _, t := range low {
			least = min(least, p.Baseline[t])
		}
		out = append(out, fmt.Sprintf("the baseline itself falls below the floor %s in %s, down to %s; the plan is clipped at the floor there. "+
			"Choose a baseline method that does not trend below it (baseline.method), or set bands.floor: none if demand can be negative.",
			floor, p.periodList(low), forecast.FormatNumber(least, d)))
	}
	units := ""
	if u := p.File.Units; u != "" {
		units = " " + u
	}
	per := "a " + p.History.Freq().String()
	for _, sp := range p.Scenarios {
		for _, c := range sp.Clips {
			size := forecast.FormatNumber(c.Most, d)
			if forecast.FormatNumber(c.Least, d) != size {
				size = "up to " + size
			}
			out = append(out, fmt.Sprintf("scenario %s: event %s takes %s%s %s off a baseline of about %s in %s; the plan is clipped at the floor %s there. "+
				"Check the units (typed for another series or period?), or set bands.floor: none if demand can be negative.",
				sp.Name, c.Event.ID, size, units, per, forecast.FormatNumber(c.Baseline, d), p.periodList(c.Periods), floor))
		}
	}
	return out
}

// periodList names the periods ts (indexes into p.Periods, in order) as
// runs: "2027-05 to 2028-06 (14 periods)", "2027-05, 2027-07 to 2027-08
// and 2027-11 (4 periods)", or "2027-05" for a single one.
func (p *Plan) periodList(ts []int) string {
	var runs []string
	for k := 0; k < len(ts); {
		j := k
		for j+1 < len(ts) && ts[j+1] == ts[j]+1 {
			j++
		}
		r := p.Periods[ts[k]].String()
		if j > k {
			r += " to " + p.Periods[ts[j]].String()
		}
		runs = append(runs, r)
		k = j + 1
	}
	s := runs[len(runs)-1]
	if len(runs) > 1 {
		s = strings.Join(runs[:len(runs)-1], ", ") + " and " + s
	}
	if len(ts) > 1 {
		s += fmt.Sprintf(" (%d periods)", len(ts))
	}
	return s
}
