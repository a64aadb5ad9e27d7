package scenario

import (
	"math"
	"time"

	"gonum.org/v1/gonum/stat/distuv"

	"forelay/forecast"
)

// Share returns the part of full size a ramp has reached in the k-th
// period of a step (k = 1 is the period holding the step's start). With P
// the ramp's periods:
//
//	immediate, or P = 0:  s(k) = 1
//	linear:               s(k) = k/P                                   for 1 <= k <= P
//	s-curve:              s(k) = (tanh(4k/P − 2) + tanh 2) / (2 tanh 2) for 1 <= k <= P
//
// and s(k) = 1 for k > P, s(k) = 0 for k < 1. The s-curve is the logistic
// L(x) = 1/(1 + e^(−x)) with steepness 8/P centred on P/2,
//
//	s(k) = (L(8(k − P/2)/P) − L(−4)) / (L(4) − L(−4)),
//
// rescaled so that s(0) = 0 and s(P) = 1 exactly; the two forms agree
// because L(x) = (1 + tanh(x/2))/2. Centred on P/2 it is symmetric,
// s(k) + s(P−k) = 1, like the linear ramp, so both ramps add the same total
// over the ramp (sum of s(k) for k = 1..P is (P+1)/2) and differ only in
// timing.
func (r Ramp) Share(k int) float64 {
	if k < 1 {
		return 0
	}
	P := r.Periods
	if r.Shape == Immediate || P <= 0 || k >= P {
		return 1
	}
	switch r.Shape {
	case Linear:
		return float64(k) / float64(P)
	case SCurve:
		t2 := math.Tanh(2)
		return (math.Tanh(4*float64(k)/float64(P)-2) + t2) / (2 * t2)
	}
	return 1
}

// extent is the shape of an event on a grid of periods, worked out once:
// the period holding its first day, the length of the step or pulse
// itself, and its payback.
type extent struct {
	start  forecast.Period
	length int     // periods of the step or pulse; unused for an open step
	open   bool    // a step without end
	back   int     // payback periods after the pulse
	backAt float64 // the profile in each payback period
}

// extent works out the event's extent on grid's grid.
func (e *Event) extent(grid forecast.Period) extent {
	x := extent{start: containing(grid, e.Start.From)}
	switch {
	case e.HasEnd:
		x.length = containing(grid, e.End.Last()).Sub(x.start) + 1
	case e.Kind == Step:
		x.open = true
	default:
		x.length = max(e.Periods, 1)
	}
	if pb := e.Payback; e.Kind == Pulse && pb != nil && pb.Periods > 0 && x.length > 0 {
		// The lift is the sum of the pulse's profile: the first and last
		// periods may be partial, the ones between are whole.
		lift := float64(x.length)
		if e.HasEnd {
			lift = e.share(x.start)
			if x.length > 1 {
				lift += e.share(x.start.Add(x.length-1)) + float64(x.length-2)
			}
		}
		x.back = pb.Periods
		x.backAt = -pb.Share * lift / float64(pb.Periods)
	}
	return x
}

// share returns the part of period p's days inside [Start.From, End.To)
// (no end when HasEnd is false).
func (e *Event) share(p forecast.Period) float64 {
	var to time.Time
	if e.HasEnd {
		to = e.End.To
	}
	return overlap(p, e.Start.From, to)
}

// at returns the profile in period x.start+j.
func (e *Event) at(x extent, j int) float64 {
	switch {
	case j < 0:
		return 0
	case e.Kind == Step && (x.open || j < x.length):
		return e.Ramp.Share(j+1) * e.share(x.start.Add(j))
	case e.Kind == Pulse && j < x.length:
		if e.HasEnd {
			return e.share(x.start.Add(j))
		}
		return 1
	case e.Kind == Pulse && j < x.length+x.back:
		return x.backAt
	}
	return 0
}

// Profile returns the event's share of full size in each of the n periods
// first, first+1, ..., first+n−1 (the frequency, and for weeks the weekday,
// come from first). Let p_i be the i-th period, [a, b) the days the event
// covers (a = Start.From; b = End.To, or no end) and
//
//	f_i = days of p_i inside [a, b) / days of p_i,
//
// the share of p_i's days the event covers (so dates finer than the periods
// are prorated: 2027-08-14 to 2027-08-23 on monthly data gives 10/31 in
// August). With k_i = 1 + (p_i − the period holding a) counted in periods:
//
//	step:   profile_i = Ramp.Share(k_i) * f_i                  (0 before a, 0 after an end)
//	pulse:  profile_i = f_i                                  given an end
//	        profile_i = 1 for k_i = 1..Periods, else 0       given periods
//
// A pulse's payback of share s over Q periods then adds, in each of the Q
// periods after the pulse's last period,
//
//	profile = −s * (sum of the pulse's profile) / Q,
//
// the sum running over the whole pulse even where it lies outside the n
// periods asked for. An event of unknown kind has a zero profile. Profile
// ignores Probability. It panics if n < 0 or first is the zero Period.
func (e *Event) Profile(first forecast.Period, n int) []float64 {
	if n < 0 {
		panic("scenario: Profile with n < 0")
	}
	out := make([]float64, n)
	x := e.extent(first)
	for i := range out {
		out[i] = e.at(x, first.Add(i).Sub(x.start))
	}
	return out
}

// Contribution returns the event's change of demand in each period of the
// baseline, whose first period is first:
//
//	units effect:    c_i = Units * profile_i
//	percent effect:  c_i = Percent/100 * baseline_i * profile_i   in the step or pulse
//
// (so a ramp scales a percent effect too). A payback takes back units, not
// a percentage of the payback periods' own baseline: with L the pulse's
// total lift in units (the sum of its c_i over the whole pulse), a payback
// of share s over Q periods gives, in each of the Q periods after the
// pulse,
//
//	c_i = −s * L / Q.
//
// For a units effect this is Units * profile_i again. For a percent effect
// L needs the baseline of every pulse period; pulse periods that lie
// before the first period given count at the first period's baseline, and
// those after the last period at the last one's. c_i is 0 wherever
// profile_i is 0, even if baseline_i is NaN. An effect to be learnt from
// the past contributes only once the caller has set its Units or Percent.
// Contribution ignores Probability.
func (e *Event) Contribution(first forecast.Period, baseline []float64) []float64 {
	c := e.perUnit(first, baseline)
	v := e.Effect.Value()
	for i := range c {
		if c[i] != 0 {
			c[i] *= v
		}
	}
	return c
}

// perUnit returns the event's contribution per unit of effect (1 unit or 1
// percent) in each period of the baseline: Contribution at Units = 1 or
// Percent = 1.
func (e *Event) perUnit(first forecast.Period, baseline []float64) []float64 {
	prof := e.Profile(first, len(baseline))
	if !e.Effect.IsPercent {
		return prof
	}
	x := e.extent(first)
	off := x.start.Sub(first) // index of the event's first period in baseline
	back := 0.0               // payback per period per percent of effect
	if x.back > 0 {
		lift := 0.0
		for j := 0; j < x.length; j++ {
			lift += e.at(x, j) * nearest(baseline, off+j) / 100
		}
		back = -e.Payback.Share * lift / float64(x.back)
	}
	for i, p := range prof {
		switch {
		case p == 0:
		case x.back > 0 && i-off >= x.length:
			prof[i] = back
		default:
			prof[i] = baseline[i] / 100 * p
		}
	}
	return prof
}

// nearest returns v[i], or the first or last element when i lies before or
// after v; 0 for an empty v.
func nearest(v []float64, i int) float64 {
	if len(v) == 0 {
		return 0
	}
	return v[min(max(i, 0), len(v)-1)]
}

// z95 is the standard normal 95% quantile, Φ⁻¹(0.95) ≈ 1.6449: a 90%
// interval of a normal variable spans 2*z95 ≈ 3.29 standard deviations.
var z95 = distuv.UnitNormal.Quantile(0.95)

// Sigma returns the standard deviation of the event's contribution in
// each period of the baseline, reading Range as a 90% interval of a normal
// effect at full size:
//
//	sd = (High − Low) / (2 * 1.6449)  ≈ (High − Low)/3.29
//	sigma_i = sd * |u_i|,
//
// where u_i is the contribution per unit of effect (Contribution with an
// effect of 1 unit or 1 percent): |profile_i| for a units effect,
// |baseline_i * profile_i| / 100 for a percent one in the step or pulse,
// and s * |L_1| / Q in a payback period, L_1 being the pulse's lift at an
// effect of 1 percent. It returns zeros when the event has no Range. Like
// Contribution it is 0 wherever the profile is 0, and it ignores
// Probability.
func (e *Event) Sigma(first forecast.Period, baseline []float64) []float64 {
	if e.Range == nil {
		return make([]float64, len(baseline))
	}
	u := e.perUnit(first, baseline)
	sd := (e.Range.High - e.Range.Low) / (2 * z95)
	for i := range u {
		if u[i] != 0 {
			u[i] = sd * math.Abs(u[i])
		}
	}
	return u
}

// Prorated reports whether a date of the event, or of one of its past
// occurrences, falls inside a period of grid's grid (any period of the
// data: only its frequency, and for weeks its weekday, matter), so that
// Profile shares out that period by days. The start of a pulse given by
// periods does not count: such a pulse covers whole periods.
func (e *Event) Prorated(grid forecast.Period) bool {
	for _, o := range append([]*Event{e}, e.Occurrences()...) {
		if o.Kind == Pulse && !o.HasEnd {
			continue
		}
		if !aligned(grid, o.Start.From) || (o.HasEnd && !aligned(grid, o.End.To)) {
			return true
		}
	}
	return false
}

// Window returns the first and the last period (inclusive) on grid's grid
// where the event's profile is not zero (payback included). For a step
// without end, open is true and last is the zero Period.
func (e *Event) Window(grid forecast.Period) (first, last forecast.Period, open bool) {
	x := e.extent(grid)
	if x.open {
		return x.start, forecast.Period{}, true
	}
	return x.start, x.start.Add(x.length + x.back - 1), false
}

// IsPast reports whether the event lies wholly before next, the first
// forecast period: it has an end and its window, payback included, ends
// before next.
func (e *Event) IsPast(next forecast.Period) bool {
	_, last, open := e.Window(next)
	return !open && last.Before(next)
}

// Occurrences returns the event's past occurrences as events of the same
// shape: copies of e (same ID, kind, effect, ramp, range, payback and
// Periods) with Start set to each entry of Past, no Past of their own, and
// Pos set to the entry's position. When e has an end, each copy's end is
// moved by the same number of End.Unit steps as its start: with
// start 2027-08-14, end 2027-08-23 and a past date 2024-08-16, the copy
// ends 2024-08-25; with start 2027-02, end 2028-01 and a past 2024-03, it
// ends 2025-02. It returns nil when Past is empty.
func (e *Event) Occurrences() []*Event {
	var out []*Event
	for _, w := range e.Past {
		o := *e
		o.Past = nil
		o.Start = w
		o.Pos = w.Pos
		if e.Range != nil {
			r := *e.Range
			o.Range = &r
		}
		if e.Payback != nil {
			p := *e.Payback
			o.Payback = &p
		}
		if e.HasEnd {
			u := e.End.Unit
			shift := forecast.PeriodOf(u, e.End.From).Sub(forecast.PeriodOf(u, e.Start.From))
			o.End = whenOf(forecast.PeriodOf(u, w.From).Add(shift))
			o.End.Pos = e.End.Pos
		}
		out = append(out, &o)
	}
	return out
}
