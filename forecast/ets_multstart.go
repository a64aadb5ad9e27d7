package forecast

import "math"

// seasonalIndexStates returns free initial states for a multiplicative
// season from a classical decomposition: the level and trend of
// initialStates, and seasonal factors that are the mean, over all full
// seasons, of each value divided by its season's mean, normalised to sum
// to m. It returns nil if a season's mean is not positive.
func (f *etsFitter) seasonalIndexStates() []float64 {
	m, y := f.m, f.y
	c := len(y) / m
	idx := make([]float64, m)
	for k := 0; k < c; k++ {
		var mean float64
		for j := 0; j < m; j++ {
			mean += y[k*m+j]
		}
		mean /= float64(m)
		if !(mean > 0) {
			return nil
		}
		for j := 0; j < m; j++ {
			idx[j] += y[k*m+j] / mean / float64(c)
		}
	}
	var sum float64
	for _, v := range idx {
		sum += v
	}
	f.initialStates()
	x := append([]float64(nil), f.x...)
	for j := 0; j < m-1; j++ {
		x[f.ks+j] = idx[j] * float64(m) / sum
	}
	return x
}

// bestInner evaluates S(θ(u)) for a multiplicative season with the inner
// solve started from the current states and from seasonalIndexStates,
// since its least-squares problem can have several minima, and leaves
// f.x at the better solution. It returns S there (+Inf if both failed).
// (The heuristic of initialStates and states converted from the additive
// season model were tried as well on the wide comparison and changed no
// result there.)
func (f *etsFitter) bestInner(u []float64) float64 {
	f.setParams(u)
	cands := [][]float64{append([]float64(nil), f.x...)}
	if x := f.seasonalIndexStates(); x != nil {
		cands = append(cands, x)
	}
	best, bestX := math.Inf(1), []float64(nil)
	for _, x := range cands {
		f.anchor = append(f.anchor[:0], x...)
		v := f.value(u)
		if v < best {
			best, bestX = v, append([]float64(nil), f.x...)
		}
	}
	f.anchor = f.anchor[:0]
	if bestX != nil {
		copy(f.x, bestX)
	}
	return best
}
