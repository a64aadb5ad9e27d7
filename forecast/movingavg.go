package forecast

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// movingAverageModel is a moving average of the last k observations, plain
// or weighted. With weights w_1..w_k, oldest first, non-negative and summing
// to one,
//
//	yhat_{t+1|t} = w_1 y_{t-k+1} + w_2 y_{t-k+2} + ... + w_k y_t,
//
// and the plain moving average has w_j = 1/k. The forecast is flat: every
// horizon gets the average of the last k observations (common practice).
type movingAverageModel struct {
	method  Method
	weights []float64 // oldest first, summing to one
	fit     bool      // weights estimated from the data
	y       []float64
	fitted  []float64
}

// fitMovingAverage fits the plain moving average with window
// k = cfg.Window (0 means 3). Fitted[t] is NaN for t < k and the mean of
// y[t-k..t-1] after.
//
// It returns an error if cfg.Window is negative, an error wrapping
// ErrBadNumber if y holds a NaN or an infinity and a *TooShortError if y
// has fewer than k+1 points.
func fitMovingAverage(y []float64, cfg Config) (Model, error) {
	if cfg.Window < 0 {
		return nil, fmt.Errorf("%v: window must be at least 1, got %d", MovingAverage, cfg.Window)
	}
	if err := simpleCheck(y, MovingAverage, simpleMinPoints(MovingAverage, cfg)); err != nil {
		return nil, err
	}
	k := simpleWindow(cfg)
	w := make([]float64, k)
	for i := range w {
		w[i] = 1 / float64(k)
	}
	return newMovingAverageModel(MovingAverage, w, false, y), nil
}

// fitWeightedMovingAverage fits the weighted moving average.
//
// With cfg.Weights set (oldest first) the window k is len(cfg.Weights) and
// the weights are scaled to sum to one; cfg.Window, if not zero, must equal
// k. With cfg.Weights nil or empty the k = cfg.Window (0 means 3) weights
// are fitted: they are the non-negative weights summing to one that
// minimise the in-sample squared one-step error
//
//	SSE(w) = sum_{t=k+1..n} (y_t - sum_{j=1..k} w_j y_{t-k-1+j})^2,
//
// a small convex quadratic programme solved exactly by a primal active-set
// method (Nocedal & Wright, Numerical Optimization, 2nd ed., Algorithm
// 16.3, cited from memory). A ridge of 1e-10 times the mean diagonal of
// the normal matrix keeps the problem strictly convex, so collinear windows
// (a constant series, say) get a unique answer.
//
// Fitted[t] is NaN for t < k. It returns an error if cfg.Window is
// negative, if a weight is negative, NaN or infinite, if all weights are
// zero or if their count differs from a non-zero cfg.Window; an error
// wrapping ErrBadNumber if y holds a NaN or an infinity; and a
// *TooShortError if y has fewer than k+1 points (given weights) or 2k
// points (fitted weights).
func fitWeightedMovingAverage(y []float64, cfg Config) (Model, error) {
	const m = WeightedMovingAverage
	if cfg.Window < 0 {
		return nil, fmt.Errorf("%v: window must be at least 1, got %d", m, cfg.Window)
	}
	var w []float64
	if len(cfg.Weights) > 0 {
		var err error
		if w, err = wmaScaleWeights(cfg.Weights, cfg.Window); err != nil {
			return nil, err
		}
	}
	if err := simpleCheck(y, m, simpleMinPoints(m, cfg)); err != nil {
		return nil, err
	}
	if w != nil {
		return newMovingAverageModel(m, w, false, y), nil
	}
	// The weights do not depend on the scale of y; fitting them on y
	// scaled near 1 keeps the normal equations in range.
	w, err := wmaFitWeights(scaleBy(y, dataScale(y)), simpleWMAWindow(cfg))
	if err != nil {
		return nil, err
	}
	return newMovingAverageModel(m, w, true, y), nil
}

// simpleWMAWindow returns the weighted moving average's window: the
// number of given weights, else cfg.Window (0 -> 3, negative counted as 1).
func simpleWMAWindow(cfg Config) int {
	if len(cfg.Weights) > 0 && cfg.Window == 0 {
		return len(cfg.Weights)
	}
	return simpleWindow(cfg)
}

// wmaScaleWeights checks user weights and scales them to sum to one.
func wmaScaleWeights(weights []float64, window int) ([]float64, error) {
	const m = WeightedMovingAverage
	if window != 0 && len(weights) != window {
		return nil, fmt.Errorf("%v: %d weights given for a window of %d", m, len(weights), window)
	}
	sum := 0.0
	for i, v := range weights {
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
			return nil, fmt.Errorf("%v: weight %d is %v; weights must be non-negative numbers", m, i+1, v)
		}
		sum += v
	}
	if sum == 0 {
		return nil, errors.New("weighted-moving-average: all weights are zero")
	}
	w := make([]float64, len(weights))
	for i, v := range weights {
		w[i] = v / sum
	}
	return w, nil
}

func newMovingAverageModel(method Method, w []float64, fit bool, y []float64) *movingAverageModel {
	m := &movingAverageModel{method: method, weights: w, fit: fit, y: append([]float64(nil), y...)}
	m.fitted = m.Filter(m.y)
	return m
}

func (m *movingAverageModel) Method() Method    { return m.method }
func (m *movingAverageModel) Params() Params    { return simpleNoParams() }
func (m *movingAverageModel) Fitted() []float64 { return append([]float64(nil), m.fitted...) }

// Describe gives "window k" for the plain average and "weights
// w1/w2/.../wk" (oldest first, three decimals with trailing zeros dropped,
// ", fitted" when estimated) for the weighted one.
func (m *movingAverageModel) Describe() string {
	if m.method == MovingAverage {
		return fmt.Sprintf("window %d", len(m.weights))
	}
	parts := make([]string, len(m.weights))
	for i, v := range m.weights {
		p := strings.TrimRight(strconv.FormatFloat(v, 'f', 3, 64), "0")
		parts[i] = strings.TrimSuffix(p, ".")
	}
	s := "weights " + strings.Join(parts, "/")
	if m.fit {
		s += ", fitted"
	}
	return s
}

// NumParams is k-1 for fitted weights (they sum to one) and 0 otherwise.
func (m *movingAverageModel) NumParams() int {
	if m.fit {
		return len(m.weights) - 1
	}
	return 0
}

// Forecast returns h copies of the average of the last k observations.
func (m *movingAverageModel) Forecast(h int) []float64 {
	simpleCheckHorizon(h)
	v := m.average(m.y[len(m.y)-len(m.weights):])
	f := make([]float64, h)
	for i := range f {
		f[i] = v
	}
	return f
}

// Filter returns the one-step predictions over y with the model's weights:
// NaN for t < k, the average of y[t-k..t-1] after. It accepts any length.
func (m *movingAverageModel) Filter(y []float64) []float64 {
	k := len(m.weights)
	p := make([]float64, len(y))
	for t := range p {
		if t < k {
			p[t] = math.NaN()
		} else {
			p[t] = m.average(y[t-k : t])
		}
	}
	return p
}

// average returns the (weighted) average of x, len(x) == k. The plain
// average is computed as sum/k, so that it is exact where it can be.
func (m *movingAverageModel) average(x []float64) float64 {
	s := 0.0
	if m.method == MovingAverage {
		for _, v := range x {
			s += v
		}
		return s / float64(len(x))
	}
	for j, v := range x {
		s += m.weights[j] * v
	}
	return s
}

// VarianceFactors returns ok = false: moving averages have no error model,
// so bands come from backtest errors.
func (m *movingAverageModel) VarianceFactors(h int) ([]float64, bool) {
	simpleCheckHorizon(h)
	return nil, false
}

// wmaFitWeights returns the k non-negative weights, summing to one, that
// minimise the one-step SSE of the weighted moving average over y (see
// fitWeightedMovingAverage). len(y) must be more than k.
//
// With rows a_t = (y_{t-k}, ..., y_{t-1}) and targets y_t, it minimises
//
//	f(w) = w'Gw - 2c'w,  G = sum a_t a_t' + eps I,  c = sum a_t y_t,
//
// subject to 1'w = 1 and w >= 0 by a primal active-set method: on the set
// F of free weights the equality-constrained minimiser is
//
//	u = G_FF^{-1} c_F,  v = G_FF^{-1} 1,  mu = (1'u - 1)/(1'v),  z = u - mu v;
//
// if z >= 0 the method moves there and frees the held-at-zero weight j with
// the most negative multiplier nu_j = (Gw - c)_j + mu (stopping when none is
// negative), otherwise it steps towards z until the first weight reaches
// zero and holds that weight at zero. It returns an error only if the
// normal matrix cannot be factorised despite the ridge (data so extreme
// that squares overflow, say).
func wmaFitWeights(y []float64, k int) ([]float64, error) {
	n := len(y)
	g := mat.NewSymDense(k, nil)
	c := make([]float64, k)
	for t := k; t < n; t++ {
		a := y[t-k : t]
		for i := 0; i < k; i++ {
			c[i] += a[i] * y[t]
			for j := i; j < k; j++ {
				g.SetSym(i, j, g.At(i, j)+a[i]*a[j])
			}
		}
	}
	scale := 0.0
	for i := 0; i < k; i++ {
		scale += g.At(i, i)
	}
	scale /= float64(k)
	if scale == 0 {
		scale = 1
	}
	for i := 0; i < k; i++ {
		g.SetSym(i, i, g.At(i, i)+1e-10*scale)
	}
	tol := 1e-12 * scale

	w := make([]float64, k)
	free := make([]bool, k)
	for i := range w {
		w[i] = 1 / float64(k)
		free[i] = true
	}
	z := make([]float64, k)
	for iter := 0; iter < 100*k+100; iter++ {
		if !wmaSubproblem(g, c, free, z) {
			return nil, errors.New("weighted-moving-average: cannot fit the weights: the lagged values are numerically singular")
		}
		feasible := true
		for i := range z {
			if free[i] && z[i] < 0 {
				feasible = false
				break
			}
		}
		if feasible {
			copy(w, z)
			// Multipliers of the weights held at zero.
			mu, jmin, numin := math.NaN(), -1, -tol
			grad := make([]float64, k)
			for i := 0; i < k; i++ {
				for j := 0; j < k; j++ {
					grad[i] += g.At(i, j) * w[j]
				}
				grad[i] -= c[i]
				if free[i] && math.IsNaN(mu) {
					mu = -grad[i]
				}
			}
			for j := 0; j < k; j++ {
				if !free[j] {
					if nu := grad[j] + mu; nu < numin {
						jmin, numin = j, nu
					}
				}
			}
			if jmin < 0 {
				return w, nil
			}
			free[jmin] = true
			continue
		}
		// Step from w towards z until the first free weight hits zero.
		alpha, block := 1.0, -1
		for i := range z {
			if free[i] && z[i] < 0 {
				if a := w[i] / (w[i] - z[i]); a < alpha {
					alpha, block = a, i
				}
			}
		}
		for i := range w {
			if free[i] {
				w[i] += alpha * (z[i] - w[i])
			}
		}
		if block >= 0 {
			free[block] = false
			w[block] = 0
		}
		for i := range w {
			if free[i] && w[i] <= 0 {
				free[i] = false
				w[i] = 0
			}
		}
	}
	// Not reached for a strictly convex problem; w is feasible anyway.
	return wmaNormalise(w), nil
}

// wmaSubproblem writes into z the minimiser of w'Gw - 2c'w subject to
// sum_{i in F} w_i = 1 and w_i = 0 outside F (the free set). It reports
// false if G_FF cannot be factorised.
func wmaSubproblem(g *mat.SymDense, c []float64, free []bool, z []float64) bool {
	var idx []int
	for i, f := range free {
		if f {
			idx = append(idx, i)
		}
	}
	nf := len(idx)
	gf := mat.NewSymDense(nf, nil)
	cf := mat.NewVecDense(nf, nil)
	ones := mat.NewVecDense(nf, nil)
	for a, i := range idx {
		for b := a; b < nf; b++ {
			gf.SetSym(a, b, g.At(i, idx[b]))
		}
		cf.SetVec(a, c[i])
		ones.SetVec(a, 1)
	}
	var ch mat.Cholesky
	if !ch.Factorize(gf) {
		return false
	}
	// A mat.Condition error is only a warning of ill-conditioning; the
	// ridge bounds the condition number, so the solution is used anyway.
	var u, v mat.VecDense
	var cond mat.Condition
	if err := ch.SolveVecTo(&u, cf); err != nil && !errors.As(err, &cond) {
		return false
	}
	if err := ch.SolveVecTo(&v, ones); err != nil && !errors.As(err, &cond) {
		return false
	}
	su, sv := mat.Sum(&u), mat.Sum(&v)
	mu := (su - 1) / sv
	for i := range z {
		z[i] = 0
	}
	for a, i := range idx {
		z[i] = u.AtVec(a) - mu*v.AtVec(a)
	}
	return !math.IsNaN(mu) && !math.IsInf(mu, 0)
}

// wmaNormalise clamps negative weights to zero and rescales to sum one.
func wmaNormalise(w []float64) []float64 {
	s := 0.0
	for i, v := range w {
		if v < 0 {
			w[i] = 0
		}
		s += w[i]
	}
	for i := range w {
		w[i] /= s
	}
	return w
}
