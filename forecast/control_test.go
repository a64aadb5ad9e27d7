package forecast

import (
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestControlLimits(t *testing.T) {
	for _, tc := range []struct {
		name   string
		mse, z float64
		want   Limits
		tol    float64
	}{
		{
			name: "mse 400, z 3",
			mse:  400, z: 3,
			// Common practice: sigma = sqrt(400) = 20, UCL = 3*20 = 60,
			// LCL = -60, centre 0.
			want: Limits{Center: 0, UCL: 60, LCL: -60, Sigma: 20},
			tol:  1e-12,
		},
		{
			name: "zero z means 3",
			mse:  400, z: 0,
			// As above: the default z is 3 (common practice).
			want: Limits{Center: 0, UCL: 60, LCL: -60, Sigma: 20},
			tol:  1e-12,
		},
		{
			name: "mse 2.25, z 2",
			mse:  2.25, z: 2,
			// sigma = sqrt(2.25) = 1.5, UCL = 2*1.5 = 3, LCL = -3: the
			// lower limit stays negative, never cut at zero.
			want: Limits{Center: 0, UCL: 3, LCL: -3, Sigma: 1.5},
			tol:  1e-12,
		},
	} {
		got := ControlLimits(tc.mse, tc.z)
		for _, c := range []struct {
			field     string
			got, want float64
		}{
			{"Center", got.Center, tc.want.Center},
			{"UCL", got.UCL, tc.want.UCL},
			{"LCL", got.LCL, tc.want.LCL},
			{"Sigma", got.Sigma, tc.want.Sigma},
		} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, tc.tol, tc.tol) {
				t.Errorf("%s: %s = %v, want %v", tc.name, c.field, c.got, c.want)
			}
		}
	}
}

func TestControlLimitsPanics(t *testing.T) {
	for _, tc := range []struct {
		name   string
		mse, z float64
	}{
		{"negative mse", -1, 3},
		{"negative z", 1, -3},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			ControlLimits(tc.mse, tc.z)
		}()
	}
}

// TestRunRules checks each Western Electric run rule (Western Electric
// Statistical Quality Control Handbook, 1956, rules as commonly stated,
// from memory: 1 one point beyond the limit; 2 two of three consecutive
// beyond 2 sigma on the same side; 3 four of five beyond 1 sigma on the
// same side; 4 eight in a row on one side of the centre) on constructed
// sequences, firing and not firing. want gives, for each point that
// fires, the rules; unlisted points fire nothing.
func TestRunRules(t *testing.T) {
	for _, tc := range []struct {
		name  string
		z     []float64
		limit float64
		want  map[int][]Rule
	}{
		{
			name: "rule 1 fires above and below",
			z:    []float64{0.5, 3.2, -0.4, -3.1},
			// |3.2| > 3 and |-3.1| > 3 (rule 2 needs two beyond 2 on the
			// same side, and these are on opposite sides).
			want: map[int][]Rule{1: {RuleBeyondLimit}, 3: {RuleBeyondLimit}},
		},
		{
			name: "rule 1 strict: a point on the limit is not beyond",
			z:    []float64{3, -3},
			want: nil,
		},
		{
			name:  "rule 1 uses the chart's limit",
			z:     []float64{2.5, 0, 0},
			limit: 2,
			// |2.5| > 2; rule 2 needs a second point beyond 2.
			want: map[int][]Rule{0: {RuleBeyondLimit}},
		},
		{
			name: "rule 2 fires: two of three beyond 2, same side",
			z:    []float64{0, 2.1, 0.3, 2.4},
			// At index 3 the window is 2.1, 0.3, 2.4: two beyond +2.
			want: map[int][]Rule{3: {RuleTwoOfThree}},
		},
		{
			name: "rule 2 fires on consecutive points below",
			z:    []float64{-2.2, -2.5},
			// The window at index 1 holds both points, both below -2.
			want: map[int][]Rule{1: {RuleTwoOfThree}},
		},
		{
			name: "rule 2 counts each side on its own",
			z:    []float64{2.5, -2.5, 2.5, -2.5},
			// Index 1: 2.5, -2.5 is one point beyond each side: no.
			// Index 2: 2.5, -2.5, 2.5 has two beyond +2: fires.
			// Index 3: -2.5, 2.5, -2.5 has two beyond -2: fires.
			want: map[int][]Rule{2: {RuleTwoOfThree}, 3: {RuleTwoOfThree}},
		},
		{
			name: "rule 2 does not fire when the pair is split by two points",
			z:    []float64{2.5, 0, 0, 2.5},
			// Window at index 3 is 0, 0, 2.5: one beyond.
			want: nil,
		},
		{
			name: "rule 2 does not fire on opposite sides",
			z:    []float64{0, 2.5, -2.5},
			// Window 0, 2.5, -2.5: one beyond +2 and one beyond -2.
			want: nil,
		},
		{
			name: "rule 2 not repeated when the current point is inside",
			z:    []float64{2.5, 2.5, 0},
			// Index 1 completes the pattern; index 2 is not beyond 2.
			want: map[int][]Rule{1: {RuleTwoOfThree}},
		},
		{
			name: "rule 3 fires: four of five beyond 1, same side",
			z:    []float64{1.5, 1.2, 0.4, 1.8, 1.1},
			// Window 1.5, 1.2, 0.4, 1.8, 1.1: four beyond +1.
			want: map[int][]Rule{4: {RuleFourOfFive}},
		},
		{
			name: "rule 3 below",
			z:    []float64{-1.5, -1.2, -1.3, -1.8},
			// Four points, all below -1.
			want: map[int][]Rule{3: {RuleFourOfFive}},
		},
		{
			name: "rule 3 does not fire with three of five",
			z:    []float64{1.5, 1.2, 0.4, 0.9, 1.1},
			// Only 1.5, 1.2, 1.1 beyond +1; 0.9 is inside.
			want: nil,
		},
		{
			name: "rule 3 does not fire on mixed sides",
			z:    []float64{1.5, -1.2, 1.4, -1.8, 1.1},
			// Three beyond +1, two beyond -1.
			want: nil,
		},
		{
			name: "rule 4 fires: eight in a row above",
			z:    []float64{0.1, 0.5, 0.2, 0.9, 0.3, 0.4, 0.2, 0.6, 0.1},
			// Indexes 0..7 and 1..8 are all above 0; none beyond 1.
			want: map[int][]Rule{7: {RuleEightInARow}, 8: {RuleEightInARow}},
		},
		{
			name: "rule 4 does not fire with seven in a row",
			z:    []float64{-0.1, -0.5, -0.2, -0.9, -0.3, -0.4, -0.2, 0.6},
			// Seven below, then one above.
			want: nil,
		},
		{
			name: "rule 4: a point at the centre breaks the run",
			z:    []float64{0.1, 0.5, 0.2, 0, 0.3, 0.4, 0.2, 0.6},
			want: nil,
		},
		{
			name: "several rules at one point",
			z:    []float64{0.5, 1.5, 1.2, 0.4, 2.5, 1.4, 2.2, 3.5},
			// Index 4: window 0.5,1.5,1.2,0.4,2.5 has three beyond +1
			// (rule 3 needs four) and 1.2,0.4,2.5 one beyond +2: none.
			// Index 5: 1.5,1.2,0.4,2.5,1.4 has four beyond 1: rule 3.
			// Index 6: 2.5,1.4,2.2 two beyond 2: rule 2; 1.2,0.4,2.5,1.4,2.2
			// four beyond 1: rule 3.
			// Index 7: 3.5 > 3: rule 1; 1.4,2.2,3.5 two beyond 2: rule 2;
			// 0.4,2.5,1.4,2.2,3.5 four beyond 1: rule 3; indexes 0..7 all
			// above 0: rule 4.
			want: map[int][]Rule{
				5: {RuleFourOfFive},
				6: {RuleTwoOfThree, RuleFourOfFive},
				7: {RuleBeyondLimit, RuleTwoOfThree, RuleFourOfFive, RuleEightInARow},
			},
		},
	} {
		got := RunRules(tc.z, tc.limit)
		if len(got) != len(tc.z) {
			t.Fatalf("%s: %d results for %d points", tc.name, len(got), len(tc.z))
		}
		for i := range tc.z {
			if !slices.Equal(got[i], tc.want[i]) {
				t.Errorf("%s: point %d (z %v): rules %v, want %v", tc.name, i, tc.z[i], got[i], tc.want[i])
			}
		}
	}
}

// TestRunRulesFalseAlarms checks the per-point firing rates of the rules on
// in-control N(0,1) points against rates worked out from the standard
// normal table (P(Z > 1) = 0.158655, P(Z > 2) = 0.022750,
// P(Z > 3) = 0.001350; standard normal table).
func TestRunRulesFalseAlarms(t *testing.T) {
	if testing.Short() {
		t.Skip("Monte Carlo over 2e6 points")
	}
	const n = 2_000_000
	rng := rand.New(rand.NewPCG(1, 1))
	z := make([]float64, n)
	for i := range z {
		z[i] = rng.NormFloat64()
	}
	counts := map[Rule]int{}
	for i, rules := range RunRules(z, 3) {
		if i < 8 {
			continue // the windows are not full yet
		}
		for _, r := range rules {
			counts[r]++
		}
	}
	const p1, p2, p3 = 0.158655, 0.022750, 0.001350
	for _, tc := range []struct {
		rule Rule
		want float64
	}{
		// Rule 1: 2 * P(Z > 3) = 2 * 0.001350 = 0.002700.
		{RuleBeyondLimit, 2 * p3},
		// Rule 2: the point is beyond +2 and at least one of the two
		// before it is: 2 * p2 * (1 - (1-p2)^2)
		// = 2 * 0.02275 * 0.044982 = 0.0020467.
		{RuleTwoOfThree, 2 * p2 * (1 - (1-p2)*(1-p2))},
		// Rule 3: the point is beyond +1 and at least 3 of the 4 before
		// it are: 2 * p1 * (4 p1^3 (1-p1) + p1^4)
		// = 2 * 0.158655 * (0.013440 + 0.000634) = 0.0044657.
		{RuleFourOfFive, 2 * p1 * (4*p1*p1*p1*(1-p1) + p1*p1*p1*p1)},
		// Rule 4: eight points on one side: 2 * 0.5^8 = 1/128 = 0.0078125.
		{RuleEightInARow, 2.0 / 256},
	} {
		got := float64(counts[tc.rule]) / float64(n-8)
		// Relative tolerance 6%: over 2e6 points the rarest rate (rule 2,
		// 0.0020) fires about 4 000 times, a relative standard error near
		// 1.6%; firings of rules 3 and 4 come in clusters (a long run fires
		// at each extra point), which raises theirs to about 2%. So 6% is
		// about three standard errors.
		const tol = 0.06
		if !scalar.EqualWithinRel(got, tc.want, tol) {
			t.Errorf("%v: rate %.5f, want %.5f (rel tol %v)", tc.rule, got, tc.want, tol)
		}
	}
}

func TestRuleStrings(t *testing.T) {
	for _, tc := range []struct {
		r    Rule
		want string
	}{
		{RuleBeyondLimit, "we1-beyond-limit"},
		{RuleTwoOfThree, "we2-two-of-three"},
		{RuleFourOfFive, "we3-four-of-five"},
		{RuleEightInARow, "we4-eight-in-a-row"},
		{RuleTrackingSignal, "ts-beyond-limit"},
		{Rule(99), "Rule(99)"},
	} {
		if got := tc.r.String(); got != tc.want {
			t.Errorf("Rule(%d).String() = %q, want %q", int(tc.r), got, tc.want)
		}
		b, _ := tc.r.MarshalText()
		if string(b) != tc.want {
			t.Errorf("Rule(%d).MarshalText() = %q, want %q", int(tc.r), b, tc.want)
		}
	}
}
