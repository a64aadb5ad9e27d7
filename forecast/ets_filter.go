package forecast

import "math"

// etsRun runs the exponential smoothing recursions (see ets.go) with
// parameters p over y, starting from the states st, and leaves in st the
// states after the last observation (st.season is updated in place and
// ends oldest first again). When pred is not nil it receives the one-step
// predictions ŷ_t; it must then be as long as y. A NaN in y is a missing
// value: the error is taken as zero, so the states move on as the forecast
// would. etsRun returns the sum of squared one-step errors over the values
// present. It allocates nothing.
//
// It panics if pred is not nil and shorter than y.
func etsRun(sh etsShape, p etsParams, st *etsStates, y, pred []float64) (sse float64) {
	if pred != nil {
		pred = pred[:len(y)]
	}
	alpha, gamma, phi := p.alpha, p.gamma, p.phi
	ab := p.alpha * p.beta
	l, b := st.level, st.trend
	seas := st.season
	m := len(seas)
	c := 0 // index in seas of s_{t-m}, the seasonal state used at t
	for t, yt := range y {
		mu := l + phi*b
		var yh float64
		switch {
		case m == 0:
			yh = mu
		case sh.mult:
			yh = mu * seas[c]
		default:
			yh = mu + seas[c]
		}
		if pred != nil {
			pred[t] = yh
		}
		e := yt - yh
		if math.IsNaN(yt) {
			e = 0
		}
		sse += e * e
		switch {
		case m == 0:
			l = mu + alpha*e
			b = phi*b + ab*e
		case sh.mult:
			so := seas[c]
			l = mu + alpha*e/so
			b = phi*b + ab*e/so
			seas[c] = so + gamma*e/mu
		default:
			l = mu + alpha*e
			b = phi*b + ab*e
			seas[c] += gamma * e
		}
		if c++; c == m {
			c = 0
		}
	}
	st.level, st.trend = l, b
	if m > 0 && c != 0 {
		rotateLeft(seas, c)
	}
	return sse
}

// rotateLeft rotates s left by k places in place (s[k] becomes s[0]),
// 0 <= k < len(s), by three reversals.
func rotateLeft(s []float64, k int) {
	reverse(s[:k])
	reverse(s[k:])
	reverse(s)
}

func reverse(s []float64) {
	for i, j := 0, len(s)-1; i < j; i, j = i+1, j-1 {
		s[i], s[j] = s[j], s[i]
	}
}
