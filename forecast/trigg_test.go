package forecast

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestTriggSignal(t *testing.T) {
	for _, tc := range []struct {
		name        string
		errors      []float64
		alpha, mad0 float64
		want        []float64
		tol         float64
	}{
		{
			name:   "mixed errors, alpha 0.1",
			errors: []float64{5, 12, 8},
			alpha:  0.1, mad0: 10,
			// By hand, E_0 = 0, M_0 = 10:
			// t=1: E = 0.1*5 = 0.5;               M = 0.1*5 + 0.9*10 = 9.5;
			//      T = 0.5/9.5 = 0.0526316
			// t=2: E = 0.1*12 + 0.9*0.5 = 1.65;   M = 1.2 + 0.9*9.5 = 9.75;
			//      T = 1.65/9.75 = 0.1692308
			// t=3: E = 0.8 + 0.9*1.65 = 2.285;    M = 0.8 + 0.9*9.75 = 9.575;
			//      T = 2.285/9.575 = 0.2386423
			want: []float64{0.5 / 9.5, 1.65 / 9.75, 2.285 / 9.575},
			tol:  1e-12,
		},
		{
			name:   "errors of one sign push the signal towards -1",
			errors: []float64{-2, -2, -2},
			alpha:  0.5, mad0: 1,
			// By hand, E_0 = 0, M_0 = 1:
			// t=1: E = -1;                 M = 1 + 0.5 = 1.5;   T = -0.6666667
			// t=2: E = -1 - 0.5 = -1.5;    M = 1 + 0.75 = 1.75; T = -0.8571429
			// t=3: E = -1 - 0.75 = -1.75;  M = 1 + 0.875 = 1.875; T = -0.9333333
			want: []float64{-1 / 1.5, -1.5 / 1.75, -1.75 / 1.875},
			tol:  1e-12,
		},
	} {
		got := TriggSignal(tc.errors, tc.alpha, tc.mad0)
		if len(got) != len(tc.want) {
			t.Fatalf("%s: %d values, want %d", tc.name, len(got), len(tc.want))
		}
		for i := range got {
			if !scalar.EqualWithinAbsOrRel(got[i], tc.want[i], tc.tol, tc.tol) {
				t.Errorf("%s: T[%d] = %v, want %v", tc.name, i, got[i], tc.want[i])
			}
		}
	}
}

func TestTriggSignalPanics(t *testing.T) {
	for _, tc := range []struct {
		name        string
		alpha, mad0 float64
	}{
		{"alpha zero", 0, 1},
		{"alpha above one", 1.5, 1},
		{"mad zero", 0.1, 0},
		{"mad NaN", 0.1, math.NaN()},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			TriggSignal([]float64{1}, tc.alpha, tc.mad0)
		}()
	}
}

// normalTrigg is the normal approximation to Trigg's limit that
// TriggLimit's documentation describes: z * sqrt((pi/2) a/(2-a)).
func normalTrigg(a, z float64) float64 { return z * math.Sqrt(math.Pi/2*a/(2-a)) }

func TestTriggLimitValues(t *testing.T) {
	for _, tc := range []struct {
		name         string
		alpha, level float64
		want         float64
		tol          float64
	}{
		{
			name:  "small alpha, 90%",
			alpha: 0.01, level: 0.90,
			// As alpha goes to 0, M_t tends to sigma sqrt(2/pi) and E_t to
			// a normal variable of variance sigma^2 a/(2-a), so the normal
			// approximation becomes exact:
			// 1.644854 * sqrt(1.570796 * 0.01/1.99) = 1.644854 * 0.088844
			// = 0.146136 (1.644854: standard normal table, 95th
			// percentile). Relative tolerance 1% for what is left of the
			// dependence at alpha 0.01.
			want: normalTrigg(0.01, 1.644854),
			tol:  0.01,
		},
		{
			name:  "small alpha, 95%",
			alpha: 0.01, level: 0.95,
			// As above: 1.959964 * 0.088844 = 0.174131 (1.959964:
			// standard normal table, 97.5th percentile).
			want: normalTrigg(0.01, 1.959964),
			tol:  0.01,
		},
		{
			name:  "alpha 0.1, 95%",
			alpha: 0.1, level: 0.95,
			// Trigg (1964), table of approximate limits: 0.54 for alpha 0.1
			// at 95%. From memory, not looked up; hence the loose
			// tolerance of 0.01.
			want: 0.54,
			tol:  0.01,
		},
		{
			name:  "alpha 0.2, 95%",
			alpha: 0.2, level: 0.95,
			// Trigg (1964), table of approximate limits: 0.74 for alpha 0.2
			// at 95%. From memory, not looked up; tolerance 0.01.
			want: 0.74,
			tol:  0.01,
		},
	} {
		got, err := TriggLimit(tc.alpha, tc.level)
		if err != nil {
			t.Fatalf("%s: %v", tc.name, err)
		}
		if !scalar.EqualWithinAbsOrRel(got, tc.want, tc.tol, tc.tol) {
			t.Errorf("%s: TriggLimit(%v, %v) = %.4f, want %.4f (tol %v)", tc.name, tc.alpha, tc.level, got, tc.want, tc.tol)
		}
	}
}

// TestTriggLimitFalseAlarms runs Trigg's signal over seeded N(0,1) errors
// and checks that the share of periods beyond TriggLimit is the nominal
// 1-level. The standard error of the share, measured by batch means
// (100 batches of 20 000 periods) on these very runs, is at most 0.0011
// (alpha 0.015) and 0.0004 or less for the others, so the tolerance of
// 10% of 1-level is at least 4.5 standard errors. Points between table
// rows (0.015, 0.105) check the interpolation.
func TestTriggLimitFalseAlarms(t *testing.T) {
	const n = 2_000_000
	for _, tc := range []struct {
		alpha, level float64
	}{
		{0.015, 0.95},
		{0.1, 0.95},
		{0.105, 0.99},
		{0.2, 0.90},
		{0.2, 0.95},
		{0.35, 0.98},
		{0.5, 0.99},
	} {
		lim, err := TriggLimit(tc.alpha, tc.level)
		if err != nil {
			t.Fatal(err)
		}
		got := triggShare(tc.alpha, lim, n)
		want := 1 - tc.level
		if math.Abs(got-want) > 0.1*want {
			t.Errorf("alpha %v level %v: limit %.4f, share beyond %.5f, want %.3f +- %.4f",
				tc.alpha, tc.level, lim, got, want, 0.1*want)
		}
	}

	// The normal approximation is too wide, as TriggLimit's documentation
	// says: at alpha 0.1 and 95% its limit 0.5635 leaves about 3.8% of
	// periods beyond, clearly below 5%.
	if got := triggShare(0.1, normalTrigg(0.1, 1.959964), n); got > 0.042 {
		t.Errorf("normal approximation at alpha 0.1: share beyond %.4f, expected under 0.042", got)
	}
}

// triggShare returns the share of n steady-state periods in which Trigg's
// signal over seeded N(0,1) errors lies beyond lim.
func triggShare(alpha, lim float64, n int) float64 {
	rng := rand.New(rand.NewPCG(1, 1))
	burn := int(100 / alpha)
	e := make([]float64, n+burn)
	for i := range e {
		e[i] = rng.NormFloat64()
	}
	k := 0
	for _, v := range TriggSignal(e, alpha, math.Sqrt(2/math.Pi))[burn:] {
		if math.Abs(v) > lim {
			k++
		}
	}
	return float64(k) / float64(n)
}

func TestTriggLimitShape(t *testing.T) {
	// The limit grows with alpha and with the level and stays below 1.
	prev := 0.0
	for i := 2; i <= 100; i++ {
		a := float64(i) / 200
		lo := 0.0
		for _, lev := range TriggLevels() {
			l, err := TriggLimit(a, lev)
			if err != nil {
				t.Fatal(err)
			}
			if !(l > lo && l < 1) {
				t.Errorf("TriggLimit(%v, %v) = %v, not in (%v, 1)", a, lev, l, lo)
			}
			lo = l
			if lev == 0.95 {
				if !(l > prev) {
					t.Errorf("TriggLimit(%v, 0.95) = %v, not above %v", a, l, prev)
				}
				prev = l
			}
		}
	}
}

func TestTriggLimitErrors(t *testing.T) {
	for _, tc := range []struct {
		name         string
		alpha, level float64
	}{
		{"level not tabulated", 0.1, 0.97},
		{"alpha below the table", 0.005, 0.95},
		{"alpha above the table", 0.6, 0.95},
		{"alpha NaN", math.NaN(), 0.95},
	} {
		l, err := TriggLimit(tc.alpha, tc.level)
		if !errors.Is(err, ErrBadSetting) || !math.IsNaN(l) {
			t.Errorf("%s: got %v, %v; want NaN and ErrBadSetting", tc.name, l, err)
		}
	}
}
