package plots

import (
	"fmt"
	"math"
)

// A Curve is one series on a chart, placed by x position: Values[j] is drawn
// at x = Start+j, the position of the period label Labels[Start+j] of the
// chart it belongs to. A curve may carry a band (for example a prediction
// interval), drawn as a light shaded area between Lower and Upper.
//
// The zero Curve has no values; charts either skip it or reject it, as each
// chart's documentation says.
type Curve struct {
	// Name is the text of the curve's legend entry. An empty Name gets the
	// chart's default ("History", "Baseline", "Scenario 2", ...).
	Name string

	// Start is the x position of Values[0]. It must be at least 0, and
	// Start+len(Values) must not exceed the number of labels of the chart.
	Start int

	// Values are the curve's points, one per period. NaN marks a missing
	// value and leaves a gap in the line; ±Inf is an error. Values beyond
	// about ±1e307 are drawn at the edge of the chart.
	Values []float64

	// Lower and Upper are the optional band: either both nil (no band) or
	// both as long as Values, and not ±Inf. NaN in either edge leaves a gap
	// in the band. The band need not contain Values[j], and where Lower[j]
	// lies above Upper[j] (a lower edge raised to a floor above the whole
	// band) the band has no width: it is drawn pinched at Upper[j].
	Lower, Upper []float64
}

// hasBand reports whether c carries a band.
func (c Curve) hasBand() bool { return c.Lower != nil || c.Upper != nil }

// check validates c against a chart with n labels. what names the curve in
// errors. An empty curve is valid here; the chart decides whether it may be
// empty.
func (c Curve) check(what string, n int) error {
	if len(c.Values) == 0 {
		if c.hasBand() {
			return fmt.Errorf("%s: band without values: %w", what, ErrLength)
		}
		return nil
	}
	if c.Start < 0 || c.Start+len(c.Values) > n {
		return fmt.Errorf("%s: positions %d to %d, but the chart has %d labels: %w",
			what, c.Start, c.Start+len(c.Values)-1, n, ErrRange)
	}
	if err := finiteOrNaN(what+": values", c.Values); err != nil {
		return err
	}
	if !c.hasBand() {
		return nil
	}
	if err := sameLength(what+": lower", c.Lower, len(c.Values), "value"); err != nil {
		return err
	}
	if err := sameLength(what+": upper", c.Upper, len(c.Values), "value"); err != nil {
		return err
	}
	if err := finiteOrNaN(what+": lower", c.Lower); err != nil {
		return err
	}
	return finiteOrNaN(what+": upper", c.Upper)
}

// A Window is a stretch of the x axis to shade and label, such as the periods
// an event of a scenario covers. Positions are x positions (label indexes),
// and fractions are allowed: to shade periods 30 to 32 whole, use From 29.5
// and To 32.5.
type Window struct {
	// Label is the short text written at the top of the window. It may be
	// empty.
	Label string

	// From and To bound the shaded region [From, To]. Both must be finite
	// and From <= To. Parts outside the chart's x range are not drawn.
	From, To float64
}

// check validates w; what names it in errors.
func (w Window) check(what string) error {
	if err := finiteScalar(what+": from", w.From); err != nil {
		return err
	}
	if err := finiteScalar(what+": to", w.To); err != nil {
		return err
	}
	if w.From > w.To {
		return fmt.Errorf("%s: from %v is after to %v: %w", what, w.From, w.To, ErrOrder)
	}
	return nil
}

// extent returns the smallest and largest finite value over vs (NaN is
// skipped). ok is false when there is none.
func extent(vs ...[]float64) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, s := range vs {
		for _, v := range s {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				continue
			}
			lo = math.Min(lo, v)
			hi = math.Max(hi, v)
			ok = true
		}
	}
	return lo, hi, ok
}

// checkScenarios checks each scenario curve against a chart of n labels
// (Curve.check), naming it by its name or else its place; with
// needValues, a scenario without values is an error wrapping ErrNoData.
func checkScenarios(scenarios []Curve, n int, needValues bool) error {
	for k, s := range scenarios {
		what := fmt.Sprintf("scenario %d", k+1)
		if s.Name != "" {
			what = fmt.Sprintf("scenario %q", s.Name)
		}
		if needValues && len(s.Values) == 0 {
			return fmt.Errorf("%s: %w", what, ErrNoData)
		}
		if err := s.check(what, n); err != nil {
			return err
		}
	}
	return nil
}

// checkCapacity checks a capacity per label: nil (none), or n values,
// each finite or NaN (no capacity in that period).
func checkCapacity(capacity []float64, n int) error {
	if capacity == nil {
		return nil
	}
	if err := sameLength("capacity", capacity, n, "label"); err != nil {
		return err
	}
	return finiteOrNaN("capacity", capacity)
}
