package forecast

import (
	"fmt"
	"math"
)

// Limits are the lines of a control chart of forecast errors.
type Limits struct {
	// Center is the centre line, always 0: an unbiased plan has errors
	// that average zero.
	Center float64
	// UCL and LCL are the upper and lower control limits, +z*Sigma and
	// -z*Sigma. LCL is negative and is never cut at zero, because errors
	// (unlike demand) are signed.
	UCL, LCL float64
	// Sigma is the standard deviation of the errors, sqrt(MSE).
	Sigma float64
}

// ControlLimits returns the limits of a control chart of forecast errors
// whose in-control standard deviation is estimated from the mean squared
// error of the plan's history:
//
//	sigma  = sqrt(mse)
//	centre = 0
//	UCL    = +z * sigma
//	LCL    = -z * sigma
//
// A zero z means 3. Common practice uses 3 (about 0.27% of in-control
// points outside) or 2 (about 4.6%).
//
// ControlLimits panics if mse is negative or NaN, or if z is negative or
// NaN: callers check user input first, as Track does.
func ControlLimits(mse, z float64) Limits {
	if !(mse >= 0) || math.IsInf(mse, 1) {
		panic(fmt.Sprintf("forecast: ControlLimits: mse %v not a finite non-negative number", mse))
	}
	if z == 0 {
		z = 3
	}
	if !(z > 0) || math.IsInf(z, 1) {
		panic(fmt.Sprintf("forecast: ControlLimits: z %v not a finite positive number", z))
	}
	s := math.Sqrt(mse)
	return Limits{Center: 0, UCL: z * s, LCL: -z * s, Sigma: s}
}

// Rule names a reason a tracked period was flagged: one of the four run
// rules of the Western Electric Statistical Quality Control Handbook
// (1956), or the tracking signal crossing its limit. The zero value is not
// a rule.
type Rule int

// The rules, in the order they are listed on a tracked period.
const (
	// RuleBeyondLimit (rule 1): the point lies beyond the chart's control
	// limits, |z_t| > limit. The handbook uses 3 sigma; here the limit is
	// the chart's own z.
	RuleBeyondLimit Rule = iota + 1
	// RuleTwoOfThree (rule 2): two of three consecutive points lie beyond
	// 2 sigma on the same side of the centre.
	RuleTwoOfThree
	// RuleFourOfFive (rule 3): four of five consecutive points lie beyond
	// 1 sigma on the same side of the centre.
	RuleFourOfFive
	// RuleEightInARow (rule 4): eight consecutive points lie on the same
	// side of the centre.
	RuleEightInARow
	// RuleTrackingSignal: the tracking signal is beyond its limit. It is
	// not a run rule; Track lists it beside them.
	RuleTrackingSignal
)

var ruleNames = [...]string{
	"none", "we1-beyond-limit", "we2-two-of-three", "we3-four-of-five",
	"we4-eight-in-a-row", "ts-beyond-limit",
}

// String returns the rule's name: we1-beyond-limit, we2-two-of-three,
// we3-four-of-five, we4-eight-in-a-row or ts-beyond-limit.
func (r Rule) String() string {
	if r < 0 || int(r) >= len(ruleNames) {
		return fmt.Sprintf("Rule(%d)", int(r))
	}
	return ruleNames[r]
}

// MarshalText writes the rule's name.
func (r Rule) MarshalText() ([]byte, error) { return []byte(r.String()), nil }

// Drift reports whether the rule points to a lasting shift of the errors
// (rules 2 to 4 and the tracking signal) rather than a single odd point
// (rule 1).
func (r Rule) Drift() bool {
	return r == RuleTwoOfThree || r == RuleFourOfFive || r == RuleEightInARow || r == RuleTrackingSignal
}

// RunRules applies the four Western Electric run rules to a sequence of
// errors in sigma units, z_t = e_t / sigma, and returns for each point the
// rules that fire there, in rule order (nil when none does). limit is the
// chart's control limit in sigmas for rule 1; zero means 3.
//
// A rule fires at the point that completes its pattern, and only if that
// point itself is part of the pattern, so a pattern is not reported again
// at later points that do not add to it:
//
//	rule 1: |z_t| > limit
//	rule 2: z_t > 2 and at least 2 of z_{t-2}, z_{t-1}, z_t are > 2
//	        (or the same with < -2)
//	rule 3: z_t > 1 and at least 4 of z_{t-4} .. z_t are > 1
//	        (or the same with < -1)
//	rule 4: z_{t-7} .. z_t are all > 0 (or all < 0)
//
// "Beyond" is strict: a point exactly on a line is not beyond it, and a
// point exactly at the centre is on neither side. Near the start the
// windows hold only the points there are, so rule 2 can fire at the second
// point; rule 4 needs eight points. Rules 2 and 3 use 2 and 1 sigma
// whatever the limit. A NaN point is beyond nothing and on neither side.
//
// RunRules panics if limit is negative or NaN.
func RunRules(z []float64, limit float64) [][]Rule {
	if limit == 0 {
		limit = 3
	}
	if !(limit > 0) {
		panic(fmt.Sprintf("forecast: RunRules: limit %v not positive", limit))
	}
	out := make([][]Rule, len(z))
	for t, v := range z {
		var rules []Rule
		if math.Abs(v) > limit {
			rules = append(rules, RuleBeyondLimit)
		}
		if sameSide(z, t, 3, 2, 2) {
			rules = append(rules, RuleTwoOfThree)
		}
		if sameSide(z, t, 5, 4, 1) {
			rules = append(rules, RuleFourOfFive)
		}
		if t >= 7 && sameSide(z, t, 8, 8, 0) {
			rules = append(rules, RuleEightInARow)
		}
		out[t] = rules
	}
	return out
}

// sameSide reports whether z[t] is beyond +k (or -k) and at least need of
// the last window points up to and including t are beyond it on the same
// side.
func sameSide(z []float64, t, window, need int, k float64) bool {
	from := max(t-window+1, 0)
	for _, sign := range [2]float64{1, -1} {
		if !(sign*z[t] > k) {
			continue
		}
		n := 0
		for i := from; i <= t; i++ {
			if sign*z[i] > k {
				n++
			}
		}
		if n >= need {
			return true
		}
	}
	return false
}
