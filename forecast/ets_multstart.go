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

// additiveStates returns free initial states for a multiplicative season
// from the best initial states of the additive season model with the
// current parameters: the same level and trend, and seasonal factors
// 1 + s_j / (l_0 + (j+1) b_0), normalised to sum to m. It returns nil if
// that fails or a factor is not positive.
func (f *etsFitter) additiveStates() []float64 {
	if f.lin == nil {
		sh := f.sh
		sh.mult = false
		f.lin = newETSFitter(sh, f.y, f.fixed)
	}
	lin := f.lin
	lin.initialStates()
	lin.par = f.par
	if !lin.solveStates() {
		return nil
	}
	l0, b0 := lin.expand(lin.x)
	fac := make([]float64, f.m)
	var sum float64
	for j := range fac {
		base := l0 + float64(j+1)*b0
		fac[j] = 1 + lin.seas[j]/base
		if !(fac[j] > 0) || math.IsInf(fac[j], 0) {
			return nil
		}
		sum += fac[j]
	}
	x := append([]float64(nil), lin.x...)
	for j := 0; j < f.m-1; j++ {
		x[f.ks+j] = fac[j] * float64(f.m) / sum
	}
	return x
}

// bestInner evaluates S(θ(u)) for a multiplicative season with the inner
// solve started from several initial states (the current ones, the
// heuristic of initialStates, seasonalIndexStates and additiveStates),
// since its least-squares problem can have several minima, and leaves
// f.x at the best solution. It returns S there (+Inf if all failed).
func (f *etsFitter) bestInner(u []float64) float64 {
	f.setParams(u)
	cands := [][]float64{append([]float64(nil), f.x...)}
	f.initialStates()
	cands = append(cands, append([]float64(nil), f.x...))
	if x := f.seasonalIndexStates(); x != nil {
		cands = append(cands, x)
	}
	if x := f.additiveStates(); x != nil {
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
