package scenario

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"

	"forelay/forecast"
)

// prefix returns the start of the key paths of the event's errors.
func (e *Event) prefix() string {
	if e.path != "" {
		return e.path
	}
	return fmt.Sprintf("event %q: ", e.ID)
}

// field returns the key path of one of the event's keys.
func (e *Event) field(key string) string { return join(e.prefix(), key) }

// grainName names a label's grain with its article: "a date", "a month".
func grainName(f forecast.Frequency) string {
	switch f {
	case forecast.Daily:
		return "a date"
	case forecast.Weekly:
		return "a week"
	case forecast.Monthly:
		return "a month"
	case forecast.Quarterly:
		return "a quarter"
	case forecast.Yearly:
		return "a year"
	}
	return "a label"
}

// plural names n periods of frequency f: "1 month", "3 months".
func plural(n int, f forecast.Frequency) string {
	if n == 1 {
		return fmt.Sprintf("1 %s", f)
	}
	return fmt.Sprintf("%d %ss", n, f)
}

// validate checks the decoded file: ranges, keys that exclude or need each
// other, and the links between scenarios and events. Checks skip values
// that failed to decode (they are already reported).
func (d *decoder) validate(f *File) {
	if d.given("plan") && !idPattern.MatchString(f.Plan) {
		d.fail(d.at("plan", Pos{}), "plan", ErrValue, "%q is not a valid plan name; use lower-case letters, digits and hyphens", f.Plan)
	}
	if d.given("history.file") && f.History.File == "" {
		d.fail(d.at("history.file", Pos{}), "history.file", ErrValue, "must not be empty")
	}
	d.atLeast("horizon", f.Horizon, 1)
	d.checkLimits(f)
	d.checkBaseline(&f.Baseline)
	d.checkBands(&f.Bands)
	for _, e := range f.Events {
		d.checkEvent(e)
	}
	d.link(f)
	if f.Capacity != nil {
		d.checkCapacity(f.Capacity, "capacity")
	}
	d.checkResources(f)
}

// maxCount bounds every count of periods in a file (horizon, periods,
// ramp, payback, window, season, holdout): 100000 days is over 270 years,
// and the bound keeps period arithmetic far from overflow.
const maxCount = 100000

// atLeast reports a whole number below min or above maxCount.
func (d *decoder) atLeast(field string, v, min int) {
	if !d.given(field) {
		return
	}
	if v < min {
		d.fail(d.at(field, Pos{}), field, ErrValue, "must be at least %d, got %d", min, v)
	} else if v > maxCount {
		d.fail(d.at(field, Pos{}), field, ErrValue, "must be at most %d, got %d", maxCount, v)
	}
}

// between reports a number outside [lo, hi] (or (lo, hi] when openLow).
func (d *decoder) between(field string, v, lo, hi float64, openLow bool) {
	if !d.given(field) {
		return
	}
	if v < lo || v > hi || (openLow && v == lo) {
		lb := "["
		if openLow {
			lb = "("
		}
		d.fail(d.at(field, Pos{}), field, ErrValue, "must be in %s%g, %g], got %g", lb, lo, hi, v)
	}
}

// checkBaseline checks the baseline settings.
func (d *decoder) checkBaseline(b *Baseline) {
	d.atLeast("baseline.season", b.Config.Season, 1)
	fx := b.Config.Fixed
	for _, p := range []struct {
		key     string
		v       *float64
		openLow bool
	}{
		{"alpha", fx.Alpha, false}, {"beta", fx.Beta, false}, {"gamma", fx.Gamma, false}, {"phi", fx.Phi, true},
	} {
		if p.v != nil {
			d.between("baseline."+p.key, *p.v, 0, 1, p.openLow)
		}
	}
	d.atLeast("baseline.window", b.Config.Window, 1)
	d.atLeast("baseline.holdout", b.Holdout, 1)
	if d.given("baseline.weights") {
		at := d.at("baseline.weights", Pos{})
		sum := 0.0
		for i, w := range b.Config.Weights {
			if w < 0 {
				f := index("baseline.weights", i)
				d.fail(d.at(f, at), f, ErrValue, "must not be negative, got %g", w)
			}
			sum += w
		}
		switch {
		case len(b.Config.Weights) == 0:
			d.fail(at, "baseline.weights", ErrValue, "must list at least one weight")
		case sum <= 0:
			d.fail(at, "baseline.weights", ErrValue, "must not all be zero")
		case d.given("baseline.window") && b.Config.Window != len(b.Config.Weights):
			d.fail(d.at("baseline.window", at), "baseline.window", ErrConflict,
				"window %d does not match the %d weights; give one or the other", b.Config.Window, len(b.Config.Weights))
		}
	}
}

// checkBands checks the band settings and works out Z and Coverage.
func (d *decoder) checkBands(b *Bands) {
	hasZ, hasC := d.given("bands.z"), d.given("bands.coverage")
	switch {
	case hasZ && hasC:
		d.fail(d.at("bands.coverage", Pos{}), "bands.coverage", ErrConflict, "give z or coverage, not both")
		return
	case hasZ:
		if b.Z <= 0 {
			d.fail(d.at("bands.z", Pos{}), "bands.z", ErrValue, "must be above 0, got %g", b.Z)
			return
		}
	case hasC:
		if b.Coverage <= 0 || b.Coverage >= 1 {
			d.fail(d.at("bands.coverage", Pos{}), "bands.coverage", ErrValue,
				"must be between 0 and 1 (0.9 means 90%%), got %g", b.Coverage)
			return
		}
		b.Z = ZOfCoverage(b.Coverage)
		return
	default:
		b.Z = 2
	}
	b.Coverage = CoverageOfZ(b.Z)
}

// ZOfCoverage returns the multiple z of the standard deviation such that a
// normal variable lies within ±z of its mean with probability c:
//
//	z = Φ⁻¹((1 + c)/2),
//
// so 0.95 gives 1.96. It returns NaN for c outside (0, 1).
func ZOfCoverage(c float64) float64 {
	if !(c > 0 && c < 1) {
		return math.NaN()
	}
	return distuv.UnitNormal.Quantile((1 + c) / 2)
}

// CoverageOfZ returns the probability that a normal variable lies within
// ±z standard deviations of its mean, 2Φ(z) − 1; it is the inverse of
// ZOfCoverage (2 gives 0.9545).
func CoverageOfZ(z float64) float64 {
	return 2*distuv.UnitNormal.CDF(z) - 1
}

// checkEvent checks one event.
func (d *decoder) checkEvent(e *Event) {
	f := e.field
	if d.given(f("id")) && !idPattern.MatchString(e.ID) {
		d.fail(d.at(f("id"), e.Pos), f("id"), ErrValue,
			"%q is not a valid id; use lower-case letters, digits and hyphens, starting with a letter or digit", e.ID)
	}
	switch e.Kind {
	case Step:
		if d.given(f("periods")) {
			d.fail(d.at(f("periods"), e.Pos), f("periods"), ErrValue, "only a pulse has periods; give end to stop a step")
		}
		if d.given(f("payback")) {
			d.fail(d.at(f("payback"), e.Pos), f("payback"), ErrValue, "only a pulse can be paid back")
		}
	case Pulse:
		if d.given(f("ramp")) {
			d.fail(d.at(f("ramp"), e.Pos), f("ramp"), ErrValue, "only a step ramps up; a pulse is at full size over its periods")
		}
		if d.given(f("periods")) && d.given(f("end")) {
			d.fail(d.at(f("end"), e.Pos), f("end"), ErrConflict, "give periods or end, not both")
		}
		if !d.given(f("periods")) && !d.given(f("end")) {
			e.Periods = 1
		}
	}
	d.atLeast(f("periods"), e.Periods, 1)
	if d.given(f("start")) && d.given(f("end")) && !e.End.To.After(e.Start.From) {
		d.fail(d.at(f("end"), e.Pos), f("end"), ErrValue, "end %s is before start %s", e.End, e.Start)
	}
	d.checkEffect(e)
	d.checkScope(e)
	if d.given(f("ramp")) {
		rp, rs := f("ramp.periods"), f("ramp.shape")
		switch {
		case d.given(rp) && d.given(rs) && e.Ramp.Shape == Immediate:
			d.fail(d.at(rp, e.Pos), rp, ErrConflict, "an immediate ramp has no periods")
		case d.given(rp):
			d.atLeast(rp, e.Ramp.Periods, 1)
		case e.Ramp.Shape != Immediate:
			d.fail(d.at(f("ramp"), e.Pos), rp, ErrMissing, "required for a %s ramp", e.Ramp.Shape)
		}
	}
	d.checkProbability(e)
	if e.Payback != nil {
		d.between(f("payback.share"), e.Payback.Share, 0, 1, false)
		d.atLeast(f("payback.periods"), e.Payback.Periods, 1)
	}
	if e.Kind == Step && !e.HasEnd && len(e.Past) > 0 && !d.given(f("end")) {
		d.fail(d.at(f("past"), e.Pos), f("past"), ErrValue, "a step without end has no past occurrences (it would last until now); give end")
	}
	if d.given(f("past")) && d.given(f("start")) {
		seen := map[string]bool{}
		for j, w := range e.Past {
			pf := index(f("past"), j)
			switch {
			case w.Unit != e.Start.Unit:
				d.fail(w.Pos, pf, ErrValue, "%s is %s but start %s is %s; write past occurrences in the form of start",
					w, grainName(w.Unit), e.Start, grainName(e.Start.Unit))
			case w.To.After(e.Start.From):
				d.fail(w.Pos, pf, ErrValue, "past occurrence %s does not come before start %s", w, e.Start)
			}
			if seen[w.Label] {
				d.fail(w.Pos, pf, ErrDuplicate, "%s is listed twice", w)
			}
			seen[w.Label] = true
		}
	}
}

// checkProbability checks an event's probability; a value that reads as a
// percentage (above 1, at most 100) gets a hint.
func (d *decoder) checkProbability(e *Event) {
	field := e.field("probability")
	if !d.given(field) || (e.Probability >= 0 && e.Probability <= 1) {
		return
	}
	hint := ""
	if e.Probability > 1 && e.Probability <= 100 {
		hint = fmt.Sprintf("; did you mean %g?", e.Probability/100)
	}
	d.fail(d.at(field, e.Pos), field, ErrValue, "must be in [0, 1], got %g%s", e.Probability, hint)
}

// checkEffectKeys checks the effect mapping at key path base (an event's
// or a scope entry's): exactly one of units, percent and from, and a
// percent of at least -100. It returns the key paths of those given.
func (d *decoder) checkEffectKeys(base string, ef *Effect, at Pos) []string {
	units, pct, from := join(base, "units"), join(base, "percent"), join(base, "from")
	var set []string
	for _, k := range []string{units, pct, from} {
		if d.given(k) {
			set = append(set, k)
		}
	}
	if d.given(base) {
		switch len(set) {
		case 0:
			if !d.failedUnder(base) {
				d.fail(d.at(base, at), base, ErrMissing, "give units, percent or from: past")
			}
		case 1:
		default:
			second := set[1]
			if d.at(set[0], Pos{}).Line > d.at(set[1], Pos{}).Line {
				second = set[0]
			}
			d.fail(d.at(second, at), second, ErrConflict, "give one of units, percent or from: past, not several")
		}
	}
	if d.given(pct) && ef.Percent < -100 {
		d.fail(d.at(pct, at), pct, ErrValue, "must be at least -100 (a fall to zero), got %g", ef.Percent)
	}
	return set
}

// checkEffect checks an event's effect and range.
func (d *decoder) checkEffect(e *Event) {
	f := e.field
	from := f("effect.from")
	set := d.checkEffectKeys(f("effect"), &e.Effect, e.Pos)
	if e.Effect.FromPast && len(e.Past) == 0 && !d.failedUnder(f("past")) {
		d.fail(d.at(from, e.Pos), from, ErrMissing, "from: past needs the past occurrences (past: [...])")
	}
	if e.Range == nil {
		return
	}
	rf := f("range")
	at := d.at(rf, e.Pos)
	if e.Range.Low > e.Range.High {
		d.fail(d.at(f("range.low"), at), f("range.low"), ErrValue, "low %g is above high %g", e.Range.Low, e.Range.High)
		return
	}
	if len(set) != 1 || e.Effect.FromPast {
		if len(set) == 1 || !d.given(f("effect")) {
			d.fail(at, rf, ErrValue, "a range needs an effect in units or percent")
		}
		return
	}
	if v := e.Effect.Value(); v < e.Range.Low || v > e.Range.High {
		d.fail(at, rf, ErrValue, "%g to %g does not contain the effect %g", e.Range.Low, e.Range.High, v)
	}
}

// failedUnder reports whether a problem was already found at a key path or
// under it.
func (d *decoder) failedUnder(field string) bool {
	for _, e := range d.errs {
		if e.Field == field || len(e.Field) > len(field) && e.Field[:len(field)] == field &&
			(e.Field[len(field)] == '.' || e.Field[len(field)] == '[') {
			return true
		}
	}
	return false
}

// link resolves the event ids of each scenario.
func (d *decoder) link(f *File) {
	ids := make([]string, len(f.Events))
	for i, e := range f.Events {
		ids[i] = e.ID
	}
	for _, r := range d.refs {
		c := &f.Scenarios[r.c]
		for j, id := range r.ids {
			field := index(r.path, j)
			e := f.Event(id)
			if e == nil {
				d.fail(r.pos[j], field, ErrUnknownEvent, "unknown event %q%s", id, didYouMean(id, ids))
				continue
			}
			dup := false
			for _, prev := range c.Events {
				dup = dup || prev == e
			}
			if dup {
				d.fail(r.pos[j], field, ErrDuplicate, "event %q is listed twice", id)
				continue
			}
			c.Events = append(c.Events, e)
		}
		if nf := join(r.prefix, "name"); d.given(nf) && !idPattern.MatchString(c.Name) {
			d.fail(d.at(nf, c.Pos), nf, ErrValue, "%q is not a valid scenario name; use lower-case letters, digits and hyphens", c.Name)
		}
	}
}

// checkCapacity checks a capacity block at key path path (the top-level
// capacity or a resource's).
func (d *decoder) checkCapacity(c *Capacity, path string) {
	if uf := join(path, "units"); d.given(uf) && c.Units <= 0 {
		d.fail(d.at(uf, c.Pos), uf, ErrValue, "must be above 0, got %g", c.Units)
	}
	if !d.given(join(path, "changes")) {
		return
	}
	for j, ch := range c.Changes {
		field := index(join(path, "changes"), j)
		if ch.Units <= 0 {
			uf := join(field, "units")
			d.fail(d.at(uf, ch.Pos), uf, ErrValue, "must be above 0, got %g", ch.Units)
		}
		if j == 0 {
			continue
		}
		prev := c.Changes[j-1]
		ff := join(field, "from")
		switch {
		case ch.From.Label == prev.From.Label:
			d.fail(ch.From.Pos, ff, ErrDuplicate, "%s is the same as changes[%d]", ch.From, j-1)
		case ch.From.From.Before(prev.From.From):
			d.fail(ch.From.Pos, ff, ErrValue, "%s comes before changes[%d] (%s); sort the changes by from", ch.From, j-1, prev.From)
		case ch.From.From.Before(prev.From.To):
			d.fail(ch.From.Pos, ff, ErrValue, "%s overlaps changes[%d] (%s)", ch.From, j-1, prev.From)
		}
	}
}

// Resolve makes the checks that need the history: next is the first period
// after it (forecast.Series.Next), which gives the frequency, the grid of
// the periods (for weeks, the weekday they start on) and the line between
// past and future. It reports, with positions:
//
//   - a history.period that differs from next's frequency;
//   - a pulse given by periods (or a past occurrence of one) whose start
//     is coarser than the data or falls inside a period;
//   - a ramp longer than its step (counted in periods of the data);
//   - an event that reaches the forecast but has no effect (an effect is
//     needed unless the event lies wholly before next, is learnt with
//     from: past, or every entry of its scope has an effect of its own);
//   - a past occurrence that, payback included, does not end before next;
//   - a capacity change (of the top-level capacity or of a resource) that
//     falls inside a period.
//
// The checks that need the names of the plan's series are File.CheckSeries'.
//
// Resolve sets History.Period to next's frequency when it was not given
// and changes nothing else. Errors are as for Parse. It panics if next is
// the zero Period.
func (f *File) Resolve(next forecast.Period) error {
	if next.IsZero() {
		panic("scenario: Resolve with the zero Period")
	}
	r := &reporter{file: f.Path, pos: f.pos}
	freq := next.Freq
	if f.History.Period != forecast.FreqUnknown && f.History.Period != freq {
		r.fail(r.at("history.period", f.History.Pos), "history.period", ErrValue,
			"says %s but the history's periods are %ss", f.History.Period, freq)
	}
	for _, e := range f.Events {
		resolveEvent(r, e, next)
	}
	if f.Capacity != nil {
		resolveCapacity(r, f.Capacity, "capacity", next)
	}
	for _, res := range f.Resources {
		if res.Capacity != nil {
			resolveCapacity(r, res.Capacity, res.field("capacity"), next)
		}
	}
	if err := r.err(); err != nil {
		return err
	}
	if f.History.Period == forecast.FreqUnknown {
		f.History.Period = freq
	}
	return nil
}

// resolveCapacity reports the changes of a capacity block (at key path
// path) that fall inside a period.
func resolveCapacity(r *reporter, c *Capacity, path string, next forecast.Period) {
	freq := next.Freq
	for j, ch := range c.Changes {
		if !aligned(next, ch.From.From) {
			field := join(index(join(path, "changes"), j), "from")
			r.fail(r.at(field, ch.Pos), field, ErrValue,
				"%s falls inside %s; capacity changes apply from whole %ss", ch.From, grainName(freq), freq)
		}
	}
}

// resolveEvent makes Resolve's checks for one event.
func resolveEvent(r *reporter, e *Event, next forecast.Period) {
	freq := next.Freq
	f := e.field
	if e.Kind == Pulse && !e.HasEnd {
		starts := append([]When{e.Start}, e.Past...)
		for j, w := range starts {
			field := f("start")
			if j > 0 {
				field = index(f("past"), j-1)
			}
			at := w.Pos
			if at == (Pos{}) {
				at = r.at(field, e.Pos)
			}
			switch {
			case finer(freq, w.Unit):
				r.fail(at, field, ErrValue, "%s is %s but the data are %ss; a pulse given by periods needs a start no coarser than the data, or give end",
					w, grainName(w.Unit), freq)
			case !aligned(next, w.From):
				r.fail(at, field, ErrValue, "%s falls inside %s; a pulse given by periods covers whole %ss: start it on one, or give end (dates are then prorated)",
					w, grainName(freq), freq)
			}
		}
	}
	if e.Kind == Step && e.HasEnd && e.Ramp.Shape != Immediate && e.Ramp.Periods > 0 {
		first := containing(next, e.Start.From)
		last := containing(next, e.End.Last())
		if m := last.Sub(first) + 1; e.Ramp.Periods > m {
			field := f("ramp.periods")
			r.fail(r.at(field, e.Pos), field, ErrValue, "a ramp of %s is longer than the event (%s, %s to %s)",
				plural(e.Ramp.Periods, freq), plural(m, freq), first, last)
		}
	}
	if !e.IsPast(next) {
		learnt := e.Effect.FromPast && len(e.Past) > 0
		if !r.given(f("effect")) && !learnt && !e.Effect.IsPercent && e.Effect.Units == 0 && !e.coveredByScope() {
			resolveMissingEffect(r, e, next)
		}
	}
	for j, o := range e.Occurrences() {
		if _, last, open := o.Window(next); open || !last.Before(next) {
			field := index(f("past"), j)
			at := o.Start.Pos
			if at == (Pos{}) {
				at = r.at(field, e.Pos)
			}
			reach := "never ends"
			if !open {
				reach = "reaches " + last.String()
			}
			r.fail(at, field, ErrValue, "past occurrence %s %s (payback included), not before the forecast starts at %s",
				o.Start, reach, next)
		}
	}
}

// resolveMissingEffect reports an event that reaches the forecast without
// an effect: at the event, or at the first scope entry without an effect
// of its own when others have one.
func resolveMissingEffect(r *reporter, e *Event, next forecast.Period) {
	for i, s := range e.Scope {
		if s.Effect != nil {
			continue
		}
		for _, o := range e.Scope {
			if o.Effect != nil {
				r.fail(s.Pos, e.scopeField(i, "effect"), ErrMissing,
					"required: the event reaches the forecast (%s on) and gives no effect for this entry to share; give the entry or the event an effect", next)
				return
			}
		}
		break
	}
	r.fail(e.Pos, e.field("effect"), ErrMissing, "required: the event reaches the forecast (%s on); give units, percent or from: past", next)
}
