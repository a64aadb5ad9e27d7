package forecast

import "math"

// VarianceFactors returns c_1..c_h with Var(e_{n+h|n}) = σ² c_h, σ² being
// the one-step error variance, from Hyndman, Koehler, Ord & Snyder (2008),
// "Forecasting with Exponential Smoothing" (HKOS), ch. 6. It always
// returns ok = true (with c_1 = 1) except for a multiplicative season
// whose fit left no relative error to measure (see below). It panics if
// h < 0.
//
// Additive and no season (HKOS class 1, exact). In innovations form the
// parameters are α, β_I = αβ and γ (see etsModel), and
//
//	c_h = 1 + Σ_{j=1..h-1} ψ_j²
//	ψ_j = α + β_I φ_j + γ d_{j,m}
//	φ_j = φ + φ² + ... + φ^j  (= j for an undamped trend)
//	d_{j,m} = 1 if j is a multiple of m, else 0
//
// which sums to HKOS Table 6.1's closed forms, e.g. for ETS(A,N,N)
// c_h = 1 + α²(h-1).
//
// Multiplicative season (HKOS class 3 approximation, with a correction).
// The point forecasts are those of ETS(M,A,M) or ETS(M,Ad,M) with
// innovations β_I = αβ and γ, whose one-step error is relative:
// y_t = ŷ_t (1 + ε_t), Var ε_t = σ_r². With μ̃_h = l_n + φ_h b_n the forecast
// without season, s_h the seasonal state it is multiplied by,
// k = ⌊(h-1)/m⌋ and c_j = α + β_I φ_j, HKOS's class 3 gives (written from
// memory; for h <= m it checks against simulation, see the tests)
//
//	θ_1 = μ̃_1²,   θ_h = μ̃_h² + σ_r² Σ_{j=1..h-1} c_j² θ_{h-j}
//	v_h ≈ s_h² [θ_h (1 + σ_r²)(1 + γ² σ_r²)^k - μ̃_h²]
//
// exact for h <= m, where the seasonal states are known. Beyond m it
// treats the seasonal factor as independent of the level, but the
// innovations that update the season also move the level; their
// covariance enters at order σ_r² (derived below), so we add it:
//
//	v_h ≈ s_h² [θ_h (1 + σ_r²)(1 + γ² σ_r²)^k - μ̃_h²]
//	      + 2 σ_r² γ s_h² μ̃_h Σ_{i=1..k} c_{im} μ̃_{h-im}
//	c_h = v_h / v_1
//
// (Without the added term the factors came out 2-6% low against
// simulation for h > m; with it they agree within the simulation error;
// see TestETSClass3Factors.) σ_r² is the mean of (e_t/ŷ_t)² over the fit.
// Because v_1 = σ_r² ŷ_{n+1}², σ² c_h reproduces v_h when σ² is the
// one-step variance at the end of the data; under this model the one-step
// variance grows with the level. If σ_r² is zero or not finite, ok is
// false.
//
// Derivation of the added term. Write y_{n+h} = M S (1 + ε_{n+h}) with M
// the random level-plus-trend and S = s_h Π_{i=1..k} (1 + γ ε_{n+h-im}).
// M = μ̃_h + Σ_{j<h} c_{h-j} M_j ε_{n+j}, so to first order in σ_r²
// E[M ε_{n+h-im}] = c_{im} μ̃_{h-im} σ_r² and E[M² ε_{n+h-im}] =
// 2 μ̃_h c_{im} μ̃_{h-im} σ_r². Then with C = Σ_i c_{im} μ̃_{h-im},
// E[M²S²] ≈ s_h² (θ_h (1+γ²σ_r²)^k + 4 γ σ_r² μ̃_h C) and
// E[MS]² ≈ s_h² (μ̃_h² + 2 γ σ_r² μ̃_h C); Var y = (1+σ_r²) E[M²S²] - E[MS]²
// exceeds the class 3 value by 2 γ σ_r² s_h² μ̃_h C to first order.
func (md *etsModel) VarianceFactors(h int) (c []float64, ok bool) {
	if h < 0 {
		panic("forecast: negative horizon")
	}
	if md.shape.mult {
		return etsClass3Factors(md.par, md.last, md.relVar, h)
	}
	return etsClass1Factors(md.par, len(md.last.season), h), true
}

// etsClass1Factors returns the class 1 factors c_1..c_h for component-form
// parameters p and season length m (0 for none); see VarianceFactors.
func etsClass1Factors(p etsParams, m, h int) []float64 {
	c := make([]float64, h)
	bI := p.alpha * p.beta
	var sum, phiJ float64
	pk := 1.0
	for j := 1; j <= h; j++ {
		c[j-1] = 1 + sum
		pk *= p.phi
		phiJ += pk
		psi := p.alpha + bI*phiJ
		if m > 0 && j%m == 0 {
			psi += p.gamma
		}
		sum += psi * psi
	}
	return c
}

// etsClass3Factors returns the class 3 factors c_1..c_h for parameters p,
// states st after the last observation and relative one-step variance
// sigma2; see VarianceFactors.
func etsClass3Factors(p etsParams, st etsStates, sigma2 float64, h int) ([]float64, bool) {
	if !(sigma2 > 0) || math.IsInf(sigma2, 0) {
		return nil, false
	}
	m := len(st.season)
	bI := p.alpha * p.beta
	mu := make([]float64, h+1)   // μ̃_j, j = 1..h
	cj := make([]float64, h+1)   // c_j = α + β_I φ_j, j = 1..h
	psi2 := make([]float64, h+1) // c_j²
	theta := make([]float64, h+1)
	// The factors are ratios of variances, so the level and trend may be
	// taken in any unit: in units of the level's power of two, μ̃² stays in
	// range for data near 1e160.
	sc := dataScale([]float64{st.level})
	level, trend := st.level/sc, st.trend/sc
	var phiJ float64
	pk := 1.0
	for j := 1; j <= h; j++ {
		pk *= p.phi
		phiJ += pk
		mu[j] = level + phiJ*trend
		cj[j] = p.alpha + bI*phiJ
		psi2[j] = cj[j] * cj[j]
	}
	c := make([]float64, h)
	var v1 float64
	for j := 1; j <= h; j++ {
		t := mu[j] * mu[j]
		for i := 1; i < j; i++ {
			t += sigma2 * psi2[i] * theta[j-i]
		}
		theta[j] = t
		k := (j - 1) / m
		s := st.season[(j-1)%m]
		v := s * s * (t*(1+sigma2)*math.Pow(1+p.gamma*p.gamma*sigma2, float64(k)) - mu[j]*mu[j])
		// First-order covariance of level and season (see VarianceFactors).
		var cs float64
		for i := 1; i <= k; i++ {
			cs += cj[i*m] * mu[j-i*m]
		}
		v += 2 * sigma2 * p.gamma * s * s * mu[j] * cs
		if j == 1 {
			v1 = v
		}
		c[j-1] = v / v1
	}
	if h > 0 && !(v1 > 0) {
		return nil, false
	}
	return c, true
}
