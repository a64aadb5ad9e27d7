package sim

import (
	"forelay/scenario/internal/plantest"
	"math"
	"math/rand/v2"
	"testing"

	"forelay/forecast"
)

// convolve returns u_t = eps_t + sum_{i<t} psi_{t-i} eps_i directly, the
// O(h²) sum the error recursion replaces.
func convolve(psi, eps []float64) []float64 {
	u := make([]float64, len(eps))
	for t := range eps {
		u[t] = eps[t]
		for i := 0; i < t; i++ {
			u[t] += psi[t-i-1] * eps[i]
		}
	}
	return u
}

// filterAll runs eps through an errorFilter of r.
func filterAll(r *shockResponse, eps []float64) []float64 {
	f := newErrorFilter(r)
	u := make([]float64, len(eps))
	for t, e := range eps {
		u[t] = f.next(e)
	}
	return u
}

func TestErrorFilterByHand(t *testing.T) {
	eps := []float64{1, 2, 3, 4, 5}
	for _, tc := range []struct {
		name string
		r    *shockResponse
		// want: by hand from u_t = eps_t + sum_{i<t} psi_{t-i} eps_i.
		want []float64
	}{
		// Random walk, psi_j = 1: the running sums 1, 3, 6, 10, 15.
		{"naive", &shockResponse{m: 1, phi: 1, a: []float64{1}, b: []float64{0}, active: []int{0}}, []float64{1, 3, 6, 10, 15}},
		// Season 2, psi_j = 1 for even j: u = 1, 2, 3+1, 4+2, 5+3+1.
		{"seasonal naive", &shockResponse{m: 2, phi: 1, a: []float64{1, 0}, b: []float64{0, 0}, active: []int{0}}, []float64{1, 2, 4, 6, 9}},
		// Holt with alpha = 0.5, alpha*beta = 0.1: psi_j = 0.5 + 0.1 j =
		// 0.6, 0.7, 0.8, 0.9; u_2 = 2 + 0.6 = 2.6; u_3 = 3 + 0.6*2 + 0.7*1
		// = 4.9; u_4 = 4 + 1.8 + 1.4 + 0.8 = 8; u_5 = 5 + 2.4 + 2.1 + 1.6
		// + 0.9 = 12.
		{"holt", &shockResponse{m: 1, phi: 1, a: []float64{0.5}, b: []float64{0.1}, active: []int{0}, trend: true}, []float64{1, 2.6, 4.9, 8, 12}},
		// Damped, phi = 0.5, a = 0, b = 1: psi_j = phi_j = 0.5, 0.75,
		// 0.875, 0.9375; u_3 = 3 + 0.5*2 + 0.75*1 = 4.75; u_4 = 4 + 1.5
		// + 1.5 + 0.875 = 7.875; u_5 = 5 + 2 + 2.25 + 1.75 + 0.9375 =
		// 11.9375.
		{"damped", &shockResponse{m: 1, phi: 0.5, a: []float64{0}, b: []float64{1}, active: []int{0}, trend: true}, []float64{1, 2.5, 4.75, 7.875, 11.9375}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			plantest.EqualSlices(t, "u", filterAll(tc.r, eps), tc.want, 1e-12)
		})
	}
}

// TestErrorFilterMatchesConvolution runs random shocks through a response
// with a season, a damped trend and arbitrary coefficients, and compares
// with the direct sum (tolerance: rounding of sums of 60 terms).
func TestErrorFilterMatchesConvolution(t *testing.T) {
	r := rand.New(rand.NewPCG(4, 4))
	const m, h = 4, 60
	resp := &shockResponse{m: m, phi: 0.9, a: make([]float64, m), b: make([]float64, m), trend: true}
	for k := range m {
		resp.a[k], resp.b[k] = r.NormFloat64(), 0.2*r.NormFloat64()
		resp.active = append(resp.active, k)
	}
	eps := make([]float64, h)
	for i := range eps {
		eps[i] = r.NormFloat64()
	}
	plantest.EqualSlices(t, "u", filterAll(resp, eps), convolve(resp.weights(h+1), eps), 1e-10)
}

func TestFitResponse(t *testing.T) {
	// psi_j = 1/j has no such form: rejected.
	psi := make([]float64, 20)
	for j := range psi {
		psi[j] = 1 / float64(j+1)
	}
	if _, ok := fitResponse(psi, 1, 1, 1e-9); ok {
		t.Error("psi_j = 1/j was taken for a response of the form a + b phi_j")
	}
	// psi_j = 2 + 3 phi_j with phi = 0.8 on even j, 1 on odd j (m = 2):
	// found back exactly.
	ph := phiSums(0.8, 20)
	for j := range psi {
		if (j+1)%2 == 0 {
			psi[j] = 2 + 3*ph[j]
		} else {
			psi[j] = 1
		}
	}
	r, ok := fitResponse(psi, 2, 0.8, 1e-9)
	if !ok {
		t.Fatal("the form was not found")
	}
	plantest.EqualSlices(t, "a", r.a, []float64{2, 1}, 1e-12)
	plantest.EqualSlices(t, "b", r.b, []float64{3, 0}, 1e-12)
}

// intermittent returns invented intermittent demand: zero in two periods
// of three, 5 to 14 otherwise.
func intermittent(n int) []float64 {
	y := make([]float64, n)
	for t := range y {
		if t%3 == 1 {
			y[t] = float64(5 + (7*t)%10)
		}
	}
	return y
}

// TestModelResponses checks that every method's impulse response has the
// form forecast.ShockForm gives, so that no method falls back to the
// O(h²) sums, and that the recursion's weights are ImpulseWeights.
func TestModelResponses(t *testing.T) {
	y := testHistory(60)
	fixed := func(v float64) *float64 { return &v }
	for _, tc := range []struct {
		name string
		m    forecast.Method
		cfg  forecast.Config
		y    []float64
	}{
		{"naive", forecast.Naive, forecast.Config{}, y},
		{"seasonal-naive", forecast.SeasonalNaive, forecast.Config{Season: 12}, y},
		{"moving-average", forecast.MovingAverage, forecast.Config{Window: 4}, y},
		{"weighted-moving-average", forecast.WeightedMovingAverage, forecast.Config{Window: 3}, y},
		{"ses", forecast.SES, forecast.Config{}, y},
		{"holt", forecast.Holt, forecast.Config{}, y},
		{"damped-holt", forecast.DampedHolt, forecast.Config{}, y},
		{"holt-winters-additive", forecast.HoltWintersAdditive, forecast.Config{Season: 12}, y},
		{"holt-winters-additive damped", forecast.HoltWintersAdditive, forecast.Config{Season: 12, Damped: true}, y},
		{"holt-winters-multiplicative", forecast.HoltWintersMultiplicative, forecast.Config{Season: 12}, y},
		{"holt-winters-multiplicative damped", forecast.HoltWintersMultiplicative, forecast.Config{Season: 12, Damped: true,
			Fixed: forecast.Fixed{Gamma: fixed(0.3)}}, y},
		{"linear-trend", forecast.LinearTrend, forecast.Config{Season: 12, Dummies: true}, y},
		{"croston", forecast.Croston, forecast.Config{}, intermittent(60)},
		{"sba", forecast.SBA, forecast.Config{}, intermittent(60)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			md, err := forecast.FitMethod(tc.y, tc.m, tc.cfg)
			if err != nil {
				t.Fatal(err)
			}
			const h = 40
			r, psi := modelResponse(md, tc.y, h)
			if r == nil {
				t.Fatal("no recursion: the simulation would fall back to the O(h²) sums")
			}
			// The weights differ from ImpulseWeights by rounding only.
			plantest.EqualSlices(t, "psi", psi, forecast.ImpulseWeights(md, tc.y, h), 1e-9)
		})
	}
}

// TestModelResponseETS checks the recovered coefficients of additive
// Holt-Winters against the innovations-form weights of Hyndman, Koehler,
// Ord & Snyder (2008), "Forecasting with Exponential Smoothing", ch. 6:
// psi_j = α + αβ φ_j + γ [j mod m = 0], so a_0 = α + γ, a_r = α and
// b_r = αβ.
func TestModelResponseETS(t *testing.T) {
	y := testHistory(60)
	md, err := forecast.FitMethod(y, forecast.HoltWintersAdditive, forecast.Config{Season: 12, Damped: true})
	if err != nil {
		t.Fatal(err)
	}
	par := md.Params()
	r, _ := modelResponse(md, y, 40)
	if r == nil || r.m != 12 || math.Abs(r.phi-par.Phi) > 0 {
		t.Fatalf("response %+v, want season 12 and phi %v", r, par.Phi)
	}
	for k := range 12 {
		wantA := par.Alpha
		if k == 0 {
			wantA += par.Gamma
		}
		plantest.Same(t, sprintf("a[%d]", k), r.a[k], wantA, 1e-9)
		plantest.Same(t, sprintf("b[%d]", k), r.b[k], par.Alpha*par.Beta, 1e-9)
	}
}

// opaqueModel hides a model's type, so that forecast.ShockForm does not
// know its form and Simulate sums the psi-weighted shocks directly.
type opaqueModel struct{ forecast.Model }

// TestSimulateRecursionMatchesSums draws the same plan through the
// recursion and through the direct sums: the shocks are the same draws,
// so the errors agree up to rounding.
func TestSimulateRecursionMatchesSums(t *testing.T) {
	for _, method := range []string{"holt-winters-additive, damped: true", "naive", "seasonal-naive"} {
		t.Run(method, func(t *testing.T) {
			p := buildTestPlan(t, sprintf("plan: x\nhorizon: 30\nbaseline: {method: %s}\n", method), testHistory(48))
			a, err := Simulate(p, SimOptions{Paths: 500, Seed: 3})
			if err != nil {
				t.Fatal(err)
			}
			p.Fit.Model = opaqueModel{p.Fit.Model}
			b, err := Simulate(p, SimOptions{Paths: 500, Seed: 3})
			if err != nil {
				t.Fatal(err)
			}
			for tt := range a.Error {
				tol := 1e-9 * math.Sqrt(p.BaselineVar[tt])
				for i, v := range a.Error[tt] {
					if d := math.Abs(v - b.Error[tt][i]); d > tol {
						t.Fatalf("period %d path %d: recursion %v, sums %v", tt, i, v, b.Error[tt][i])
					}
				}
			}
		})
	}
}
