package forecast

import (
	"errors"
	"fmt"
	"math"
	"strings"
)

// Errors returned by the tracking functions, matched with errors.Is.
var (
	// ErrLengthMismatch: two sequences that pair up period by period
	// (actuals and plan, say) have different lengths.
	ErrLengthMismatch = errors.New("lengths differ")
	// ErrBadSetting: a tracking setting is out of its range.
	ErrBadSetting = errors.New("bad setting")
)

// Signal chooses the tracking signal Track computes.
type Signal int

// The tracking signals.
const (
	// SignalCumulative is the cumulative error over the smoothed MAD,
	// TS_t = C_t / MAD_t (see Track). It is the zero value.
	SignalCumulative Signal = iota
	// SignalSmoothed is Trigg's (1964) smoothed signal, T_t = E_t / MAD_t
	// (see TriggSignal), which always lies in [-1, 1].
	SignalSmoothed
)

var signalNames = [...]string{"cumulative", "smoothed"}

// String returns "cumulative" or "smoothed".
func (s Signal) String() string {
	if s < 0 || int(s) >= len(signalNames) {
		return fmt.Sprintf("Signal(%d)", int(s))
	}
	return signalNames[s]
}

// MarshalText writes the signal's name.
func (s Signal) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// ParseSignal reads a signal name, "cumulative" or "smoothed"
// (case-insensitive). Anything else, the empty string included, is an
// error wrapping ErrBadSetting.
func ParseSignal(s string) (Signal, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	for i, n := range signalNames {
		if n == t {
			return Signal(i), nil
		}
	}
	return SignalCumulative, fmt.Errorf("%w: unknown signal %q (want cumulative or smoothed)", ErrBadSetting, s)
}

// Verdict is the judgement Track passes on one tracked period.
type Verdict int

// The verdicts.
const (
	// InControl: no rule fired; the errors look like the plan's history.
	// It is the zero value.
	InControl Verdict = iota
	// Bias: the errors have drifted to one side. The tracking signal is
	// beyond its limit also with the errors beyond the control limits left
	// out, or a run rule of drift (Western Electric rules 2, 3 or 4)
	// fired. The plan needs revising.
	Bias
	// Outlier: an error lies beyond the control limits (rule 1), or the
	// tracking signal is beyond its limit only because of such errors (it
	// is within its limit with them left out), and no run rule of drift
	// fired. Check for an unplanned event.
	Outlier
)

var verdictNames = [...]string{"in-control", "bias", "outlier"}

// String returns "in-control", "bias" or "outlier".
func (v Verdict) String() string {
	if v < 0 || int(v) >= len(verdictNames) {
		return fmt.Sprintf("Verdict(%d)", int(v))
	}
	return verdictNames[v]
}

// MarshalText writes the verdict's name.
func (v Verdict) MarshalText() ([]byte, error) { return []byte(v.String()), nil }

// TrackConfig holds the settings of Track. InitialMAD and MSE describe the
// plan's errors over its history and must be given; every other field has
// a usable zero value, noted on the field. Resolved fills the zeros in.
type TrackConfig struct {
	// InitialMAD is the mean absolute error of the plan over its history,
	// the starting value MAD_0 of the smoothed MAD. It must be positive.
	InitialMAD float64

	// MSE is the mean squared error of the plan over its history; the
	// control chart's sigma is sqrt(MSE). It must be positive.
	MSE float64

	// MADSmoothing is the smoothing constant a of the MAD (Brown's
	// smoothed MAD) and, for the smoothed signal, of the smoothed error:
	//
	//	MAD_t = a |e_t| + (1-a) MAD_{t-1}
	//	E_t   = a e_t   + (1-a) E_{t-1}
	//
	// It must lie in (0, 1]; zero means 0.1 (common practice).
	MADSmoothing float64

	// TSLimit is the limit of the tracking signal: a period whose |signal|
	// exceeds it is flagged. Zero means 4 for the cumulative signal
	// (common practice: 4 MADs) and TriggLimit(MADSmoothing, 0.95) for the
	// smoothed one, which then needs MADSmoothing in [0.01, 0.5]. It must
	// not be negative, and for the smoothed signal it must be below 1,
	// since that signal never exceeds 1.
	TSLimit float64

	// Z is the control limit of the chart in sigmas, and rule 1's limit.
	// Zero means 3; it must not be negative. 2 and 3 are common practice.
	Z float64

	// Signal chooses the tracking signal; the zero value is
	// SignalCumulative.
	Signal Signal
}

// Resolved returns the configuration with every zero default filled in,
// or an error wrapping ErrBadSetting naming the first field out of range.
// Track calls it; a command can call it too, to print the limits in force.
func (c TrackConfig) Resolved() (TrackConfig, error) {
	bad := func(field string, v float64, want string) (TrackConfig, error) {
		return TrackConfig{}, fmt.Errorf("%w: %s is %v; want %s", ErrBadSetting, field, v, want)
	}
	if !(c.InitialMAD > 0) || math.IsInf(c.InitialMAD, 1) {
		return bad("initial MAD", c.InitialMAD, "a positive number")
	}
	if !(c.MSE > 0) || math.IsInf(c.MSE, 1) {
		return bad("MSE", c.MSE, "a positive number")
	}
	if c.MADSmoothing == 0 {
		c.MADSmoothing = 0.1
	}
	if !(c.MADSmoothing > 0 && c.MADSmoothing <= 1) {
		return bad("MAD smoothing", c.MADSmoothing, "a number in (0, 1]")
	}
	if c.Z == 0 {
		c.Z = 3
	}
	if !(c.Z > 0) || math.IsInf(c.Z, 1) {
		return bad("z", c.Z, "a positive number")
	}
	switch c.Signal {
	case SignalCumulative:
		if c.TSLimit == 0 {
			c.TSLimit = 4
		}
		if !(c.TSLimit > 0) || math.IsInf(c.TSLimit, 1) {
			return bad("tracking signal limit", c.TSLimit, "a positive number")
		}
	case SignalSmoothed:
		if c.TSLimit == 0 {
			lim, err := TriggLimit(c.MADSmoothing, 0.95)
			if err != nil {
				return TrackConfig{}, fmt.Errorf("%w (or give the tracking signal limit)", err)
			}
			c.TSLimit = lim
		}
		if !(c.TSLimit > 0 && c.TSLimit < 1) {
			return bad("smoothed tracking signal limit", c.TSLimit, "a number in (0, 1)")
		}
	default:
		return TrackConfig{}, fmt.Errorf("%w: unknown signal %v", ErrBadSetting, c.Signal)
	}
	return c, nil
}

// TrackPoint is one tracked period.
type TrackPoint struct {
	Actual, Plan float64
	// Error is Actual - Plan: positive when the plan was too low.
	Error float64
	// CumError is the sum of the errors so far, from the first tracked
	// period.
	CumError float64
	// SmoothedError is E_t = a e_t + (1-a) E_{t-1}, E_0 = 0.
	SmoothedError float64
	// MAD is the smoothed MAD after this period, MAD_t.
	MAD float64
	// TrackingSignal is CumError/MAD for the cumulative signal and
	// SmoothedError/MAD for the smoothed one.
	TrackingSignal float64
	// SignalWithoutOutliers is the tracking signal computed as if the
	// periods up to this one whose error lies beyond the control limits
	// had not been tracked (see Track). It equals TrackingSignal when no
	// period so far is beyond the limits, and is 0 when every one is.
	SignalWithoutOutliers float64
	// Sigmas is the point's position on the control chart, Error/sigma
	// with sigma = sqrt(MSE).
	Sigmas float64
	// Rules lists the rules that fired at this period, in rule order;
	// nil when none did.
	Rules []Rule
	// Verdict sums the rules up.
	Verdict Verdict
}

// Track follows actuals against a plan period by period. For period t
// (t = 1, 2, ...), with e_t = actual_t - plan_t and a = MADSmoothing:
//
//	C_t   = C_{t-1} + e_t,                     C_0 = 0
//	E_t   = a e_t + (1-a) E_{t-1},             E_0 = 0
//	MAD_t = a |e_t| + (1-a) MAD_{t-1},         MAD_0 = InitialMAD
//	TS_t  = C_t / MAD_t     (SignalCumulative)
//	TS_t  = E_t / MAD_t     (SignalSmoothed, Trigg's signal)
//	z_t   = e_t / sqrt(MSE)
//
// The MAD is updated with the period's own error before the signal is
// formed. The run rules (see RunRules) are applied to z_1..z_t with the
// chart limit Z; RuleTrackingSignal is added when |TS_t| > TSLimit.
//
// A single error far beyond the control limits can push the signal past
// its limit by itself: with e_t large, C_t is close to e_t and MAD_t to
// a |e_t|, so TS_t nears 1/a (10 at a = 0.1), and C_t keeps the error for
// every later period. So Track also computes the signal without the
// outliers, TS'_t (SignalWithoutOutliers): the same recursions run over
// the periods 1..t with every period s <= t with |z_s| > Z (the periods
// where rule 1 fired) left out, all of them at once, as if they had not
// been tracked (C', E' and MAD' keep their values across a left-out
// period; MAD'_0 = InitialMAD, and TS'_t = 0 while no period is left
// in). The verdict is:
//
//	bias       if rule 2, 3 or 4 fired, or |TS_t| > TSLimit and |TS'_t| > TSLimit
//	outlier    else if rule 1 fired, or |TS_t| > TSLimit (then |TS'_t| <= TSLimit:
//	           the errors beyond the limits alone carry the signal past its limit)
//	in-control otherwise
//
// A steady drift stays bias: its errors move the signal whether or not a
// point beyond the limits is left out. A spike is an outlier at its own
// period and at the later periods where the signal stays beyond its limit
// only because of it. When a point is beyond the limits and drift is
// signalled too, the verdict is bias and Rules lists every rule that fired
// (rule 1 and the drift rules), so the planner can see both. Rules always
// lists RuleTrackingSignal when |TS_t| > TSLimit, whatever the verdict.
//
// Track returns an error wrapping ErrLengthMismatch if actual and plan
// differ in length, one wrapping ErrEmptyCell if an actual or plan value
// is NaN or infinite (giving the 1-based period), and one wrapping
// ErrBadSetting if cfg is out of range (see TrackConfig.Resolved). Empty
// inputs give an empty result.
func Track(actual, plan []float64, cfg TrackConfig) ([]TrackPoint, error) {
	if len(actual) != len(plan) {
		return nil, fmt.Errorf("%w: %d actuals, %d plan values", ErrLengthMismatch, len(actual), len(plan))
	}
	c, err := cfg.Resolved()
	if err != nil {
		return nil, err
	}
	for i := range actual {
		if err := finite("actual", i, actual[i]); err != nil {
			return nil, err
		}
		if err := finite("plan", i, plan[i]); err != nil {
			return nil, err
		}
	}
	lim := ControlLimits(c.MSE, c.Z)
	pts := make([]TrackPoint, len(actual))
	z := make([]float64, len(actual))
	all := newSignalState(c)   // every period
	clean := newSignalState(c) // periods within the limits only
	for i := range actual {
		e := actual[i] - plan[i]
		z[i] = e / lim.Sigma
		all.add(e)
		if math.Abs(z[i]) <= c.Z {
			clean.add(e)
		}
		pts[i] = TrackPoint{
			Actual: actual[i], Plan: plan[i], Error: e, CumError: all.cum,
			SmoothedError: all.sm, MAD: all.mad, TrackingSignal: all.signal(),
			SignalWithoutOutliers: clean.signal(), Sigmas: z[i],
		}
	}
	for i, rules := range RunRules(z, c.Z) {
		p := &pts[i]
		if math.Abs(p.TrackingSignal) > c.TSLimit {
			rules = append(rules, RuleTrackingSignal)
		}
		p.Rules = rules
		p.Verdict = verdict(rules, math.Abs(p.SignalWithoutOutliers) > c.TSLimit)
	}
	return pts, nil
}

// signalState holds the recursions of Track over the periods added.
type signalState struct {
	a, cum, sm, mad float64
	n               int
	smoothed        bool
}

func newSignalState(c TrackConfig) *signalState {
	return &signalState{a: c.MADSmoothing, mad: c.InitialMAD, smoothed: c.Signal == SignalSmoothed}
}

// add takes in the error of one more period.
func (s *signalState) add(e float64) {
	s.cum += e
	s.sm = s.a*e + (1-s.a)*s.sm
	s.mad = s.a*math.Abs(e) + (1-s.a)*s.mad
	s.n++
}

// signal returns the tracking signal over the periods added, 0 for none.
func (s *signalState) signal() float64 {
	if s.n == 0 {
		return 0
	}
	if s.smoothed {
		return s.sm / s.mad
	}
	return s.cum / s.mad
}

// verdict sums up the rules fired at one period: a run rule of drift, or
// the tracking signal's rule when the signal without the outliers is also
// beyond its limit (cleanBeyond), gives Bias; else rule 1 or the tracking
// signal's rule gives Outlier; else InControl.
func verdict(rules []Rule, cleanBeyond bool) Verdict {
	v := InControl
	for _, r := range rules {
		switch {
		case r == RuleTrackingSignal && !cleanBeyond:
			v = Outlier
		case r.Drift():
			return Bias
		case r == RuleBeyondLimit:
			v = Outlier
		}
	}
	return v
}

// finite returns an error wrapping ErrEmptyCell if v is NaN or infinite.
func finite(what string, i int, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%w: %s for period %d is %v", ErrEmptyCell, what, i+1, v)
	}
	return nil
}

// ValueAdded compares an adjusted plan with the plain baseline it was made
// from, on the same actuals (forecast value added). Errors are actual
// minus forecast.
type ValueAdded struct {
	// N is the number of periods compared.
	N int
	// PlanMAD and BaselineMAD are the mean absolute errors.
	PlanMAD, BaselineMAD float64
	// PlanBias and BaselineBias are the mean errors: positive when the
	// forecast was too low on average.
	PlanBias, BaselineBias float64
	// Improvement is BaselineMAD - PlanMAD: positive when the adjustments
	// made the plan more accurate, negative when they made it worse.
	Improvement float64
	// ImprovementShare is Improvement / BaselineMAD (0.25 = a quarter of
	// the baseline's error removed); NaN when BaselineMAD is zero.
	ImprovementShare float64
}

// ForecastValueAdded measures what the adjustments added to the baseline
// over the same periods:
//
//	PlanMAD     = (1/n) sum |actual_t - plan_t|
//	BaselineMAD = (1/n) sum |actual_t - baseline_t|
//	PlanBias    = (1/n) sum (actual_t - plan_t)
//	BaselineBias= (1/n) sum (actual_t - baseline_t)
//	Improvement = BaselineMAD - PlanMAD
//
// It returns an error wrapping ErrLengthMismatch if the three lengths
// differ, one wrapping ErrTooShort if they are empty, and one wrapping
// ErrEmptyCell if any value is NaN or infinite.
func ForecastValueAdded(actual, plan, baseline []float64) (ValueAdded, error) {
	if len(plan) != len(actual) || len(baseline) != len(actual) {
		return ValueAdded{}, fmt.Errorf("%w: %d actuals, %d plan values, %d baseline values",
			ErrLengthMismatch, len(actual), len(plan), len(baseline))
	}
	n := len(actual)
	if n == 0 {
		return ValueAdded{}, fmt.Errorf("%w: no periods to compare", ErrTooShort)
	}
	var v ValueAdded
	for i := range actual {
		for _, c := range [...]struct {
			what string
			x    float64
		}{{"actual", actual[i]}, {"plan", plan[i]}, {"baseline", baseline[i]}} {
			if err := finite(c.what, i, c.x); err != nil {
				return ValueAdded{}, err
			}
		}
		ep := actual[i] - plan[i]
		eb := actual[i] - baseline[i]
		v.PlanMAD += math.Abs(ep)
		v.BaselineMAD += math.Abs(eb)
		v.PlanBias += ep
		v.BaselineBias += eb
	}
	fn := float64(n)
	v.N = n
	v.PlanMAD /= fn
	v.BaselineMAD /= fn
	v.PlanBias /= fn
	v.BaselineBias /= fn
	v.Improvement = v.BaselineMAD - v.PlanMAD
	v.ImprovementShare = math.NaN()
	if v.BaselineMAD != 0 {
		v.ImprovementShare = v.Improvement / v.BaselineMAD
	}
	return v, nil
}
