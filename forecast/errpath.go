package forecast

// ShockForm returns the shape of the impulse response of a fitted model of
// this package: how a surprise of one unit in the first period after the
// data moves the forecasts j periods later. For every method here that
// response has the form
//
//	psi_j = a_{j mod m} + b_{j mod m} φ_j,   φ_j = φ + φ² + ... + φ^j  (= j when φ = 1),
//
// with season m >= 1 and damping φ in (0, 1], a and b depending on the
// model's parameters and states. ShockForm gives m and φ; a and b follow
// from two weights of each residue class (see ImpulseWeights).
// The forecast errors the model implies then obey a recursion of O(m)
// operations per period, instead of a sum over all earlier shocks:
//
//	naive, moving averages, Croston, SBA   m = 1, b = 0 (flat forecasts: psi_j constant)
//	linear-trend                           m = 1, a = b = 0 (the line ignores new values)
//	seasonal-naive                         m = the season, a_0 = 1, the rest 0
//	ses, holt, damped-holt                 m = 1, a = α, b = αβ, φ the damping
//	holt-winters-additive                  m = the season, a_0 = α + γ, a_r = α, b = αβ
//	holt-winters-multiplicative            m = the season; a and b scale with the seasonal states
//	combination                            m = the least common multiple of the members' m,
//	                                       φ that of the members with a trend (the mean of
//	                                       the members' psi_j; ok = false when two differ)
//
// (the additive exponential smoothing weights are those of Hyndman,
// Koehler, Ord & Snyder 2008, "Forecasting with Exponential Smoothing",
// ch. 6: psi_j = α + αβ φ_j + γ d_{j,m}; for the multiplicative season the
// one-unit response, level and trend change times the seasonal state plus
// the seasonal change times the level and trend, is again of this form).
// ok is false for a model of another package, whose response has no known
// form.
func ShockForm(md Model) (season int, phi float64, ok bool) {
	switch m := md.(type) {
	case *naiveModel, *movingAverageModel, *linearTrendModel, *crostonModel:
		return 1, 1, true
	case *seasonalNaiveModel:
		return max(1, m.season), 1, true
	case *etsModel:
		return max(1, len(m.last.season)), m.par.phi, true
	case *combinationModel:
		return combinationShockForm(m)
	}
	return 0, 0, false
}

// combinationShockForm returns the form of a combination's response, the
// mean of its members': each member's psi_j repeats with its season, so
// the mean repeats with their least common multiple; only the members
// with a trend (b not zero) bring their φ, which must then be shared.
func combinationShockForm(c *combinationModel) (season int, phi float64, ok bool) {
	season, phi = 1, 1
	trend := false
	for _, md := range c.members {
		m, p, ok := ShockForm(md)
		if !ok {
			return 0, 0, false
		}
		season = season / gcd(season, m) * m
		if e, isETS := md.(*etsModel); isETS && e.shape.trend {
			if trend && p != phi {
				return 0, 0, false
			}
			phi, trend = p, true
		}
	}
	return season, phi, true
}

// gcd returns the greatest common divisor of two positive integers.
func gcd(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	return a
}
