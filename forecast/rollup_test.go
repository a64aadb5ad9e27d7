package forecast

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// TestSumVarianceFormula works SumVariance's formula through by hand on
// aligned errors.
func TestSumVarianceFormula(t *testing.T) {
	r2 := math.Sqrt2
	for _, c := range []struct {
		name   string
		errs   [][]float64
		counts []int // the errors of each series are its last counts[i]; nil: all
		v      [][]float64
		psi    [][]float64
		want   []float64
	}{
		// One series gets back its own variance: s² = 1; lead 1:
		// k = sqrt(2/1), 2·1 = 2; lead 2: k = sqrt(5/(1·1.25)) = 2,
		// 2²·1 + (2·0.5)²·1 = 5.
		{"one series", [][]float64{{1, -1}}, nil, [][]float64{{2, 5}}, [][]float64{{1, 0.5}}, []float64{2, 5}},
		// Identical errors (rho = 1), variance 1 at both lead times, the
		// first series a random walk (psi 1, 1), the second white noise
		// (psi 1, 0). Lead 1: k = 1, 1, mean((e + e)²) = 4. Lead 2:
		// k1 = sqrt(1/2), k2 = 1; j = 0: (1/√2 + 1)² = 1.5 + √2;
		// j = 1: (1/√2 · 1)² = 0.5; total 2 + √2, less than the 4 of
		// sqrt(v1 v2) rho summed, because the series carry a surprise
		// forward differently.
		{"different carry-over", [][]float64{{1, -1}, {1, -1}}, nil, [][]float64{{1, 1}, {1, 1}}, [][]float64{{1, 1}, {1, 0}}, []float64{4, 2 + r2}},
		// Errors at right angles (rho = 0): the variances add, 1 + 4.
		{"uncorrelated", [][]float64{{1, -1, 1, -1}, {1, 1, -1, -1}}, nil, [][]float64{{1}, {4}}, [][]float64{{1}, {1}}, []float64{5}},
		// A series whose errors are all zero is taken as independent:
		// 2 + 3.
		{"zero errors", [][]float64{{1, -1}, {0, 0}}, nil, [][]float64{{2}, {3}}, [][]float64{{1}, {1}}, []float64{5}},
		// Opposite errors of equal variance cancel: 0.
		{"opposite", [][]float64{{2, -2}, {-2, 2}}, nil, [][]float64{{3, 6}}, nil, []float64{0, 0}},
		// The second series has errors in the last two periods only
		// (n_b = 2 of N = 4), where they equal the first's: s² = 1 for
		// both, k = 1. Covariance (1/4)(1·1 + (−1)(−1)) = 0.5, so the
		// variance is 1 + 1 + 2·0.5 = 3; by the formula, the squared sums
		// 1, 1, 4, 4 over 4 give 2.5, and b's own draws, with chance
		// (4 − 2)/4, add (1/2)(1 + 1)/2 = 0.5.
		{"shorter window", [][]float64{{1, -1, 1, -1}, {0, 0, 1, -1}}, []int{4, 2}, [][]float64{{1}, {1}}, [][]float64{{1}, {1}}, []float64{3}},
		// Two identical series with errors in the last two of N = 3
		// periods (a method that makes no prediction for the first
		// period): s² = 1, k = 1. Shared draws: (1/3)(0 + 4 + 4) = 8/3;
		// draws taken apart (chance 1/3) take the same place in both:
		// (1/3)(1/2)(4 + 4) = 4/3. Variance 4: twice one series' sd, as
		// identical errors must give.
		{"identical, shorter", [][]float64{{0, 1, -1}, {0, 1, -1}}, []int{2, 2}, [][]float64{{1}, {1}}, [][]float64{{1}, {1}}, []float64{4}},
	} {
		t.Run(c.name, func(t *testing.T) {
			v, psi := c.v, c.psi
			if psi == nil { // the opposite case: two random walks alike
				v = [][]float64{c.v[0], c.v[0]}
				psi = [][]float64{{1, 1}, {1, 1}}
			}
			own := make([][]float64, len(c.errs))
			for i, e := range c.errs {
				n := len(e)
				if c.counts != nil {
					n = c.counts[i]
				}
				for k := len(e) - 1; k >= len(e)-n; k-- {
					own[i] = append(own[i], e[k])
				}
			}
			got := sumVariance(c.errs, own, len(c.errs[0]), v, psi)
			for l := range c.want {
				if !scalar.EqualWithinAbsOrRel(got[l], c.want[l], 1e-12, 1e-12) {
					t.Errorf("lead %d: got %v, want %v", l+1, got[l], c.want[l])
				}
			}
		})
	}
}

// rollupWalk returns n points of a random walk from 1000 whose steps are
// the given shocks.
func rollupWalk(steps []float64) []float64 {
	y := make([]float64, len(steps))
	level := 1000.0
	for i, s := range steps {
		level += s
		y[i] = level
	}
	return y
}

// fitRollupNaive fits the naive method to y from start, failing the test on an
// error.
func fitRollupNaive(t *testing.T, name string, start Period, y []float64) *Result {
	t.Helper()
	r, err := Fit(Series{Name: name, Start: start, Values: y}, Spec{Method: Naive, Config: Config{Season: 1}})
	if err != nil {
		t.Fatal(err)
	}
	return r
}

// rollupNormals returns n standard normal draws from the seeded generator.
func rollupNormals(rng *rand.Rand, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = rng.NormFloat64()
	}
	return out
}

// TestSumVarianceKnownAnswers checks the sum of fitted series against the
// cases whose answer is known: identical errors give twice one series'
// standard deviation, opposite errors zero, independent errors the sum of
// the variances (sqrt(2) times one series' standard deviation when the
// variances are equal).
func TestSumVarianceKnownAnswers(t *testing.T) {
	const h = 6
	start, _ := ParsePeriod("2020-01", Monthly)
	rng := rand.New(rand.NewPCG(7, 11))
	y := rollupWalk(rollupNormals(rng, 200))
	neg := make([]float64, len(y))
	for i, x := range y {
		neg[i] = -x
	}
	a, b, n := fitRollupNaive(t, "a", start, y), fitRollupNaive(t, "b", start, y), fitRollupNaive(t, "minus-a", start, neg)
	one, _ := a.Variance(h, Widening)

	// Identical errors: sd of the sum = 2 sd, variance 4 v (exact up to
	// rounding: the scaled errors of the two series are the same numbers).
	v, err := SumVariance([]*Result{a, b}, h, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	for l := range h {
		if got, want := math.Sqrt(v[l]), 2*math.Sqrt(one[l]); !scalar.EqualWithinRel(got, want, 1e-12) {
			t.Errorf("identical, lead %d: sd %v, want 2 × %v", l+1, got, math.Sqrt(one[l]))
		}
	}

	// One series alone: its own variance (k² s² sum psi² = v by
	// construction).
	v, err = SumVariance([]*Result{a}, h, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	for l := range h {
		if !scalar.EqualWithinRel(v[l], one[l], 1e-12) {
			t.Errorf("alone, lead %d: variance %v, want %v", l+1, v[l], one[l])
		}
	}

	// A series and its negative: the sum is known exactly, sd 0.
	v, err = SumVariance([]*Result{a, n}, h, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	for l := range h {
		if !(math.Abs(v[l]) <= 1e-12*one[l]) {
			t.Errorf("opposite, lead %d: variance %v, want 0", l+1, v[l])
		}
	}
}

// TestSumVarianceIndependent checks two independent random walks of 5,000
// points. Each series is rescaled to its own variance, so only the sample
// correlation r of the errors is left to chance: Var(sum) = (v1 + v2) +
// 2 sqrt(v1 v2) r, and r of independent normal samples has standard error
// about 1/sqrt(n) (from memory: Var(r) = 1/(n-1) under independence). The
// tolerance is four standard errors: |Var(sum)/(v1+v2) - 1| <= 4/sqrt(n),
// and for equal variances |sd(sum)/sd(one) - sqrt(2)| <= sqrt(2)·2/sqrt(n)
// (sd(sum) = sqrt(2) sd sqrt(1 + r), sqrt(1 + r) ≈ 1 + r/2).
func TestSumVarianceIndependent(t *testing.T) {
	if testing.Short() {
		t.Skip("5,000-point fits")
	}
	const n, h = 5000, 4
	start, _ := ParsePeriod("2000-01-03", Daily)
	rng := rand.New(rand.NewPCG(3, 5))
	a := fitRollupNaive(t, "a", start, rollupWalk(rollupNormals(rng, n)))
	b := fitRollupNaive(t, "b", start, rollupWalk(rollupNormals(rng, n)))
	v, err := SumVariance([]*Result{a, b}, h, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	c, err := AlignErrors([]*Result{a, b})
	if err != nil {
		t.Fatal(err)
	}
	va, _ := a.Variance(h, Widening)
	vb, _ := b.Variance(h, Widening)
	tol := 4 / math.Sqrt(float64(len(c.Periods)))
	for l := range h {
		if ratio := v[l] / (va[l] + vb[l]); math.Abs(ratio-1) > tol {
			t.Errorf("lead %d: Var(sum)/(v1+v2) = %v, want 1 within %v", l+1, ratio, tol)
		}
	}

	// Equal variances by construction: the same errors with equal v.
	vEq := [][]float64{{1, 2, 3, 4}, {1, 2, 3, 4}} // a random walk's v_h = h (unit shocks)
	psi := [][]float64{{1, 1, 1, 1}, {1, 1, 1, 1}}
	s := sumVariance(c.Errors, c.Errors, len(c.Periods), vEq, psi)
	for l := range h {
		got := math.Sqrt(s[l]) / math.Sqrt(vEq[0][l])
		if math.Abs(got-math.Sqrt2) > math.Sqrt2*tol/2 {
			t.Errorf("lead %d: sd(sum)/sd(one) = %v, want sqrt(2) within %v", l+1, got, math.Sqrt2*tol/2)
		}
	}
}

// TestAlignErrorsUnequalLengths aligns a series with a shorter one that
// is a stretch of it: the errors on the shared periods are identical, so
// the sum's sd is the sum of the two sds at every lead time (both are
// naive forecasts, psi_j = 1), which holds only if the periods line up.
func TestAlignErrorsUnequalLengths(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	rng := rand.New(rand.NewPCG(1, 9))
	y := rollupWalk(rollupNormals(rng, 60)) // 2020-01 .. 2024-12
	a := fitRollupNaive(t, "long", start, y)
	b := fitRollupNaive(t, "short", start.Add(12), y[12:48]) // 2021-01 .. 2023-12
	c, err := AlignErrors([]*Result{a, b})
	if err != nil {
		t.Fatal(err)
	}
	// Errors: long from 2020-02 (59), short from 2021-02 (35); shared
	// 2021-02 .. 2023-12 = 35, the other 24 of long's are skipped.
	if len(c.Periods) != 35 || c.Skipped != 24 || c.Periods[0].String() != "2021-02" || c.Periods[34].String() != "2023-12" {
		t.Fatalf("periods %d (%v .. %v), skipped %d; want 35 (2021-02 .. 2023-12), 24",
			len(c.Periods), c.Periods[0], c.Periods[len(c.Periods)-1], c.Skipped)
	}
	for t0 := range c.Periods {
		if d := c.Errors[0][t0] - c.Errors[1][t0]; math.Abs(d) > 1e-9 {
			t.Fatalf("period %v: errors differ by %v", c.Periods[t0], d)
		}
	}
}

// TestSumVarianceWindows checks series with errors in different periods
// against a case worked by hand. The long series' naive errors are the
// pattern 1, 1, −1, −1 over 48 months (2020-02 to 2024-01), mean 0; the
// short one is months 13 to 36 of it, so its 24 errors (2021-01 to
// 2022-12, six whole cycles, mean 0) equal the long one's in those
// months. Periods drawn over N = 48 months: the two share the period
// drawn with chance 24/48, so at lead 1 the correlation is 1/2 and
// Var(sum) = v_a + v_b + 2 · (1/2) sqrt(v_a v_b). If the periods did not
// line up by date, the shared errors would not match.
func TestSumVarianceWindows(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	steps := make([]float64, 49)
	for i := 1; i < 49; i++ {
		steps[i] = []float64{1, 1, -1, -1}[(i-1)%4]
	}
	y := rollupWalk(steps)
	a := fitRollupNaive(t, "long", start, y)
	b := fitRollupNaive(t, "short", start.Add(12), y[12:37])
	v, err := SumVariance([]*Result{a, b}, 1, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	va, _ := a.VarianceFrom(1, Widening, Calibrated)
	vb, _ := b.VarianceFrom(1, Widening, Calibrated)
	if want := va[0] + vb[0] + math.Sqrt(va[0]*vb[0]); !scalar.EqualWithinRel(v[0], want, 1e-9) {
		t.Errorf("variance %v, want v_a + v_b + sqrt(v_a v_b) = %v", v[0], want)
	}
	// Drawn over 96 months instead (span), the chance of sharing is 1/4.
	v, err = SumVariance([]*Result{a, b}, 1, Widening, Calibrated, 96)
	if err != nil {
		t.Fatal(err)
	}
	if want := va[0] + vb[0] + 0.5*math.Sqrt(va[0]*vb[0]); !scalar.EqualWithinRel(v[0], want, 1e-9) {
		t.Errorf("span 96: variance %v, want v_a + v_b + sqrt(v_a v_b)/2 = %v", v[0], want)
	}
}

// TestAlignErrorsRejects checks the errors for input that cannot be summed.
func TestAlignErrorsRejects(t *testing.T) {
	m, _ := ParsePeriod("2020-01", Monthly)
	q, _ := ParsePeriod("2020-Q1", Quarterly)
	y := rollupWalk(rollupNormals(rand.New(rand.NewPCG(2, 2)), 12))
	a := fitRollupNaive(t, "a", m, y)
	if _, err := AlignErrors(nil); err == nil {
		t.Error("no series: want an error")
	}
	if _, err := AlignErrors([]*Result{a, fitRollupNaive(t, "q", q, y)}); err == nil {
		t.Error("monthly with quarterly: want an error")
	}
	far := fitRollupNaive(t, "later", m.Add(12), y)
	if _, err := AlignErrors([]*Result{a, far}); !errors.Is(err, ErrFewCommonPeriods) {
		t.Errorf("no shared period: got %v, want ErrFewCommonPeriods", err)
	}
	if _, err := SumVariance([]*Result{a}, 0, Widening, Calibrated, 0); err == nil {
		t.Error("lead time 0: want an error")
	}
}

// TestDrawKeepsCorrelation draws whole periods from two series whose
// shocks have correlation 0.6 and checks that every draw is one period's
// pair and that the drawn pairs keep the errors' correlation. With N draws
// the sample correlation has standard error about (1 - rho²)/sqrt(N)
// (from memory, the large-sample variance of Pearson's r for normal
// data): 0.64/sqrt(100,000) ≈ 0.002, and the tolerance is 0.01.
func TestDrawKeepsCorrelation(t *testing.T) {
	const n, draws, rho = 500, 100_000, 0.6
	start, _ := ParsePeriod("2020-01", Monthly)
	rng := rand.New(rand.NewPCG(4, 4))
	z1, z2 := rollupNormals(rng, n), rollupNormals(rng, n)
	for i := range z2 {
		z2[i] = rho*z1[i] + math.Sqrt(1-rho*rho)*z2[i]
	}
	c, err := AlignErrors([]*Result{fitRollupNaive(t, "a", start, rollupWalk(z1)), fitRollupNaive(t, "b", start, rollupWalk(z2))})
	if err != nil {
		t.Fatal(err)
	}
	want := correlation(c.Errors[0], c.Errors[1])
	xs, ys := make([]float64, draws), make([]float64, draws)
	dst := make([]float64, 2)
	pick := rand.New(rand.NewPCG(8, 8))
	for k := range xs {
		p := c.Draw(pick, dst)
		if dst[0] != c.Errors[0][p] || dst[1] != c.Errors[1][p] {
			t.Fatalf("draw %d: got %v, want period %d's pair", k, dst, p)
		}
		xs[k], ys[k] = dst[0], dst[1]
	}
	if got := correlation(xs, ys); math.Abs(got-want) > 0.01 {
		t.Errorf("drawn correlation %v, errors' correlation %v: want within 0.01", got, want)
	}
}

// correlation returns Pearson's correlation of x and y.
func correlation(x, y []float64) float64 {
	var mx, my float64
	for i := range x {
		mx += x[i]
		my += y[i]
	}
	mx /= float64(len(x))
	my /= float64(len(y))
	var sxy, sxx, syy float64
	for i := range x {
		sxy += (x[i] - mx) * (y[i] - my)
		sxx += (x[i] - mx) * (x[i] - mx)
		syy += (y[i] - my) * (y[i] - my)
	}
	return sxy / math.Sqrt(sxx*syy)
}

// TestSumVarianceMatchesDraws runs the Monte Carlo's error model by hand
// on whole-period draws for a naive forecast (psi_j = 1) and simple
// exponential smoothing (psi_j = alpha) of two series with correlated
// shocks, and compares the variance of the sum of the two paths' errors
// with SumVariance at every lead time. The sample variance of N draws of
// a near-normal error has relative standard error about sqrt(2/N) (from
// memory: Var(s²) = 2σ⁴/(N-1) for normal data), 0.01 at N = 20,000; the
// tolerance is five of them.
func TestSumVarianceMatchesDraws(t *testing.T) {
	const n, paths, h, rho = 400, 20_000, 5, 0.7
	start, _ := ParsePeriod("2020-01-06", Weekly)
	rng := rand.New(rand.NewPCG(6, 1))
	z1, z2 := rollupNormals(rng, n), rollupNormals(rng, n)
	level := make([]float64, n)
	for i := range z2 {
		z2[i] = rho*z1[i] + math.Sqrt(1-rho*rho)*z2[i]
		level[i] = 500 + 3*z2[i] // noise around a level: SES
	}
	a := fitRollupNaive(t, "walk", start, rollupWalk(z1))
	b, err := Fit(Series{Name: "level", Start: start, Values: level}, Spec{Method: SES, Config: Config{Season: 1}})
	if err != nil {
		t.Fatal(err)
	}
	want, err := SumVariance([]*Result{a, b}, h, Widening, Calibrated, 0)
	if err != nil {
		t.Fatal(err)
	}
	c, err := AlignErrors([]*Result{a, b})
	if err != nil {
		t.Fatal(err)
	}
	// The error model of each series: e_h = k_h sum_{j<h} psi_j eps_{h-j}.
	var k, psi [2][]float64
	for i, r := range []*Result{a, b} {
		v, _ := r.Variance(h, Widening)
		psi[i] = append([]float64{1}, ImpulseWeights(r.Model, r.Series.Values, h)...)
		s2 := 0.0
		for _, x := range c.Errors[i] {
			s2 += x * x / float64(len(c.Errors[i]))
		}
		k[i] = make([]float64, h)
		ss := 0.0
		for l := range h {
			ss += psi[i][l] * psi[i][l]
			k[i][l] = math.Sqrt(v[l] / (s2 * ss))
		}
	}
	pick := rand.New(rand.NewPCG(9, 9))
	eps := make([][]float64, h) // eps[period][series]
	sum, sumSq := make([]float64, h), make([]float64, h)
	for range paths {
		for p := range eps {
			eps[p] = make([]float64, 2)
			c.Draw(pick, eps[p])
		}
		for l := range h {
			e := 0.0
			for i := range 2 {
				for j := 0; j <= l; j++ {
					e += k[i][l] * psi[i][j] * eps[l-j][i]
				}
			}
			sum[l] += e
			sumSq[l] += e * e
		}
	}
	for l := range h {
		m := sum[l] / paths
		got := (sumSq[l] - paths*m*m) / (paths - 1)
		if !scalar.EqualWithinRel(got, want[l], 5*math.Sqrt(2.0/paths)) {
			t.Errorf("lead %d: variance of the drawn sums %v, SumVariance %v", l+1, got, want[l])
		}
	}
}
