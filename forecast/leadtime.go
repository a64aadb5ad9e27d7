package forecast

import "math"

// LeadTimeVariance returns the variance of the sum of the forecast errors
// of the first L periods ahead: the spread of demand over a replenishment
// lead time of L periods around its forecast. The variance at each lead
// time is VarianceFrom's, and the errors of different lead times are
// correlated as the model carries a surprise forward (ImpulseWeights psi,
// psi_0 = 1), the same error model as the Monte Carlo's: with
// e_h = g_h sum_{j<h} psi_j eps_{h-j} for unit shocks eps,
//
//	g_h = sqrt(v_h / sum_{j=0}^{h-1} psi_j^2)
//	Var(e_1 + ... + e_L) = sum_{t=1}^{L} (sum_{h=t}^{L} g_h psi_{h-t})^2.
//
// For errors that do not carry over (psi_j = 0 for j >= 1) it is the sum
// of the v_h; for the naive forecast (psi_j = 1, v_h = h s^2) it is
// s^2 sum_t (L-t+1)^2. A fractional L interpolates linearly between the
// whole numbers around it (and from 0 below 1). It returns NaN for L < 0
// or a non-finite L, and 0 for L = 0.
func (r *Result) LeadTimeVariance(L float64, mode BandMode, from BandSource) float64 {
	if !(L >= 0) || math.IsInf(L, 0) {
		return math.NaN()
	}
	n := int(math.Ceil(L))
	if n == 0 {
		return 0
	}
	v, _ := r.VarianceFrom(n, mode, from)
	psi := append([]float64{1}, ImpulseWeights(r.Model, r.Series.Values, n)...)
	cum := cumulativeVariance(v, psi)
	lo := int(math.Floor(L))
	below := 0.0
	if lo > 0 {
		below = cum[lo-1]
	}
	if lo == n {
		return cum[n-1]
	}
	return below + (L-float64(lo))*(cum[n-1]-below)
}

// cumulativeVariance returns, for l = 1..len(v), the variance of
// e_1 + ... + e_l under LeadTimeVariance's error model; psi[0] is 1.
func cumulativeVariance(v, psi []float64) []float64 {
	n := len(v)
	g := make([]float64, n)
	ss := 0.0
	for h := range g {
		ss += psi[h] * psi[h]
		if ss > 0 && v[h] > 0 {
			g[h] = math.Sqrt(v[h] / ss)
		}
	}
	out := make([]float64, n)
	for l := 1; l <= n; l++ {
		total := 0.0
		for t := 1; t <= l; t++ {
			w := 0.0
			for h := t; h <= l; h++ {
				w += g[h-1] * psi[h-t]
			}
			total += w * w
		}
		out[l-1] = total
	}
	return out
}
