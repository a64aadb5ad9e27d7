package forecast

import (
	"cmp"
	"math"
	"slices"
)

// This file holds the outer search of etsFitter over the smoothing
// parameters: the starting grid, the descents from several well-spread
// starts, the probes of the bounds, and the global search of a single
// free parameter.

// gridPoint is one point of the starting grid and its SSE; idx are its
// positions in the grid's value lists (alpha, beta, gamma, phi).
type gridPoint struct {
	par [4]float64
	idx [4]int
	u   []float64
	sse float64
}

// gridValues returns the starting grid's values for each parameter (gamma
// as a fraction of its upper bound 1-alpha): a full factorial design over
// the free smoothing parameters, finer when there are fewer of them. Held
// parameters get their value alone. With a season, phi, when free, is 0.9
// here and tried at 0.85 and 0.95 afterwards (see grid).
func (f *etsFitter) gridValues() (vals [4][]float64) {
	nfree := 0
	for _, i := range f.free {
		if i != etsPhi {
			nfree++
		}
	}
	if nfree >= 3 {
		vals[etsAlpha] = []float64{0.2, 0.5, 0.8}
		vals[etsBeta] = []float64{0.02, 0.2, 0.8}
	} else {
		vals[etsAlpha] = []float64{0.1, 0.3, 0.5, 0.7, 0.9}
		vals[etsBeta] = []float64{0.01, 0.1, 0.4, 0.9}
	}
	vals[etsGamma] = []float64{0.05, 0.35, 0.8}
	vals[etsPhi] = []float64{0.9}
	if nfree < 3 {
		vals[etsPhi] = []float64{0.8, 0.9, 0.98}
	}
	for i, v := range f.fixed {
		if !math.IsNaN(v) {
			vals[i] = []float64{v}
		}
	}
	return vals
}

// grid evaluates S(θ) on the starting grid (gridValues) and returns the
// points sorted by SSE, best first; with a season and phi free it then
// tries phi 0.85 and 0.95 at the best point. That is at most 60 points
// without a season and 29 with one. For an additive
// season S(θ) is exact and cheap (one linear pass, one solve). For a
// multiplicative season the points are ranked on the additive season
// model of the same data, whose smoothing parameters behave much alike,
// and the best few are then evaluated properly (see fit). The additive and
// multiplicative fits of the same data share one evaluation (etsGrids).
func (f *etsFitter) grid() []gridPoint {
	if f.sh.season == 0 {
		return f.evalGrid()
	}
	key := etsGridKeyOf(f)
	if pts := etsGrids.get(key, f.y); pts != nil {
		return pts
	}
	pts := f.evalGrid()
	etsGrids.put(key, f.y, pts)
	return pts
}

// evalGrid evaluates the grid that grid returns.
func (f *etsFitter) evalGrid() []gridPoint {
	lin := f
	if f.mult {
		sh := f.sh
		sh.mult = false
		lin = newETSFitter(sh, f.y, f.fixed)
		defer lin.release()
		lin.initialStates()
	}
	vals := f.gridValues()
	// Room for every grid point and the two tries of phi.
	pts := make([]gridPoint, 0, len(vals[etsAlpha])*len(vals[etsBeta])*len(vals[etsGamma])*len(vals[etsPhi])+2)
	// The points' free variables share one array, cut as they are kept.
	us := make([]float64, cap(pts)*len(lin.free))
	eval := func(par [4]float64, idx [4]int) {
		u := us[:len(lin.free):len(lin.free)]
		lin.freeTo(u, par)
		lin.setParams(u)
		sse := lin.passStatesLinear()
		pred, ok := lin.step()
		if ok && sse < math.Inf(1) {
			pts = append(pts, gridPoint{lin.par, idx, u, math.Max(sse-pred, 0)})
			us = us[len(u):]
		}
	}
	for ia, a := range vals[etsAlpha] {
		for ib, b := range vals[etsBeta] {
			for ig, g := range vals[etsGamma] {
				for ip, p := range vals[etsPhi] {
					par := [4]float64{a, b, g, p}
					if math.IsNaN(f.fixed[etsGamma]) {
						par[etsGamma] = g * math.Min(etsParamHi, 1-a)
					}
					eval(par, [4]int{ia, ib, ig, ip})
				}
			}
		}
	}
	if len(pts) == 0 {
		return nil
	}
	sortPts := func() {
		slices.SortStableFunc(pts, func(p, q gridPoint) int { return cmp.Compare(p.sse, q.sse) })
	}
	sortPts()
	if math.IsNaN(f.fixed[etsPhi]) && len(vals[etsPhi]) == 1 {
		best := pts[0]
		for _, p := range []float64{0.85, 0.95} {
			par := best.par
			par[etsPhi] = p
			eval(par, best.idx)
		}
		sortPts()
	}
	return pts
}

// etsStarts is the number of descents of a multi-parameter fit: from the
// best grid point and from up to etsStarts-1 others spread over the grid
// (see spreadStarts).
const etsStarts = 3

// fit runs the estimation and returns the parameters, the initial states
// and the number of estimated quantities.
//
// One free parameter: fit1D, a global search over its interval.
//
// Several: a multi-start local search.
//
//  1. S(θ) on a small grid (see grid); for a multiplicative season the
//     three best grid points are evaluated with the model itself, the
//     first with several starts of the inner solve (bestInner).
//  2. BFGS from the best point (descend). The sin² transform makes every
//     bound a stationary point of the free variables, so a parameter can
//     stop on a bound that the SSE would rather leave; when the gradient
//     in θ at the result points into the interval for such a parameter,
//     BFGS is restarted with it moved inside (at most twice).
//  3. The same from up to two more grid points spread away from the first
//     and from each other (spreadStarts), whatever their SSE (with
//     several starts of the inner solve for a multiplicative season): the
//     SSE of exponential smoothing often has several local minima, for
//     instance a trend that is smoothed hard against one damped or hardly
//     updated.
//  4. Probes of the bounds at the best point (probe): each free parameter
//     at either bound (and, damped or multiplicative, each pair at the
//     four corners), the others held; a descent from the best probe if it
//     beats the best point.
//
// All evaluations keep the best point seen, which is the result.
func (f *etsFitter) fit() (etsParams, etsStates, int) {
	f.initialStates()
	switch len(f.free) {
	case 0:
		if f.solveStates() {
			f.bestF = f.sseAt(f.x)
		} else {
			f.initialStates()
		}
		copy(f.bestX, f.x)
		f.bestPar = f.par
		return f.result()
	case 1:
		f.fit1D()
		return f.result()
	}
	pts := f.grid()
	starts := 1
	if f.mult {
		starts = 3
	}
	for i := 0; i < starts && i < len(pts); i++ {
		if f.mult && i == 0 {
			f.bestInner(pts[i].u)
		} else {
			f.evalStart(pts[i].u)
		}
	}
	if len(pts) == 0 || math.IsInf(f.bestF, 1) {
		// No grid point worked (a multiplicative season with wild data):
		// try the middle of the grid from the heuristic states.
		f.initialStates()
		u := f.freeFor([4]float64{0.3, 0.05, 0.1, 0.9}) // a middling start
		if math.IsInf(f.evalStart(u), 1) {
			f.initialStates()
			copy(f.bestX, f.x)
			f.setParams(u)
			f.bestPar = f.par
			return f.result()
		}
	}
	f.descend(f.bestU)
	more := etsStarts - 1
	if f.oneStart {
		more = 0
	}
	for _, p := range f.spreadStarts(pts, more) {
		copy(f.x, f.bestX)
		if f.mult {
			f.bestInner(p.u)
		}
		f.descendFrom(p.u, f.x)
	}
	f.probe()
	return f.result()
}

// spreadStarts returns up to k grid points after the first, in order of
// SSE, each two or more grid steps away, in some parameter, from the first
// and from the others returned.
func (f *etsFitter) spreadStarts(pts []gridPoint, k int) []gridPoint {
	if len(pts) == 0 {
		return nil
	}
	chosen := []gridPoint{pts[0]}
	for _, p := range pts[1:] {
		if len(chosen) > k {
			break
		}
		far := true
		for _, c := range chosen {
			d := 0
			for i := range c.idx {
				d = max(d, p.idx[i]-c.idx[i], c.idx[i]-p.idx[i])
			}
			far = far && d >= 2
		}
		if far {
			chosen = append(chosen, p)
		}
	}
	return chosen[1:]
}

// probe evaluates S at the best point with each free parameter moved to
// either bound and, for a damped trend or a multiplicative season, each
// pair of them moved to the four corners of their bounds, the others held
// (in θ). If the best of these points is lower
// than the best so far by more than a millionth, it descends from there.
// It reports whether the best point improved.
func (f *etsFitter) probe() bool {
	if math.IsInf(f.bestF, 1) {
		return false
	}
	best := f.bestF
	x0 := append([]float64(nil), f.bestX...)
	var cand, candX []float64
	candF := best * (1 - 1e-6)
	u := make([]float64, len(f.free)) // the point tried; cand keeps a copy
	try := func(par [4]float64) {
		f.freeTo(u, par)
		copy(f.x, x0)
		if f.mult {
			f.anchor = append(f.anchor[:0], x0...)
			f.maxGN = 3 // enough to tell a better point; S is overestimated, never under
		}
		v := f.value(u)
		f.anchor = f.anchor[:0]
		f.maxGN = 0
		if v < candF {
			candF = v
			cand = append(cand[:0], u...)
			candX = append(candX[:0], f.x...)
		}
	}
	// at returns par with free parameter q at fraction fr of its interval.
	at := func(par [4]float64, q int, fr float64) [4]float64 {
		f.freeTo(u, par) // sets f.par, on which gamma's interval depends
		iv, _, _ := f.paramInterval(f.free[q])
		par[f.free[q]] = iv.lo + fr*(iv.hi-iv.lo)
		return par
	}
	// Pairs only where they made a difference on the wide comparison:
	// with a damped trend (damping and trend smoothing trade off) or a
	// multiplicative season.
	pairs := f.sh.damped || f.mult
	for q := range f.free {
		for _, a := range []float64{0, 1} {
			try(at(f.bestPar, q, a))
		}
		for r := q + 1; r < len(f.free) && pairs; r++ {
			for _, a := range []float64{0, 1} {
				for _, b := range []float64{0, 1} {
					try(at(at(f.bestPar, q, a), r, b))
				}
			}
		}
	}
	if cand == nil {
		return false
	}
	copy(f.x, candX)
	f.descendFrom(cand, candX)
	return f.bestF < best
}

// fit1D estimates a single free parameter: S(θ) is minimised globally
// over the parameter's interval by minimizeGlobal1D (a grid of 49 points,
// both bounds included, then Brent's method around the best one). For a
// multiplicative season every inner solve starts from the heuristic
// states, so that S is the same function at every point.
func (f *etsFitter) fit1D() {
	iv, _, _ := f.paramInterval(f.free[0])
	if f.mult {
		f.anchor = append(f.anchor[:0], f.x...)
		defer func() { f.anchor = f.anchor[:0] }()
	}
	u := make([]float64, 1)
	minimizeGlobal1D(func(v float64) float64 {
		u[0] = iv.toFree(v)
		return f.value(u)
	}, iv.lo, iv.hi, 48, 1e-7)
	if math.IsInf(f.bestF, 1) {
		// Nothing finite: the middle of the interval from the heuristic
		// states (fitETS reports the failure).
		f.initialStates()
		copy(f.bestX, f.x)
		f.bestU = append(f.bestU[:0], iv.toFree((iv.lo+iv.hi)/2))
		f.setParams(f.bestU)
		f.bestPar = f.par
	}
}

// descend runs BFGS from u0, then up to two restarts from points moved off
// the bounds where the SSE would rather leave them (see leaveBounds). For
// a multiplicative season the inner solves start from the best states.
func (f *etsFitter) descend(u0 []float64) { f.descendFrom(u0, f.bestX) }

// descendFrom is descend with the inner solves of a multiplicative season
// anchored at x0 in the first run (at the best states in the restarts)
// and then at the states of each new iterate: every evaluation of one line
// search starts from the same states, so that S is one function for it
// (the inner problem can have several minima, and a warm start from the
// previous trial point could jump between them).
func (f *etsFitter) descendFrom(u0, x0 []float64) {
	x0 = append([]float64(nil), x0...)
	for restart := 0; restart < 3; restart++ {
		f.scale = f.bestF
		if !(f.scale > 0) || math.IsInf(f.scale, 1) {
			return // a perfect fit, or nothing to scale by
		}
		if f.mult {
			f.anchor = append(f.anchor[:0], x0...)
			x0 = f.bestX
		}
		set := smoothSettings{Step: 0.2}
		if f.mult {
			// Each line search starts its inner solves from the states
			// of the iterate it leaves (f.x holds them after a major
			// iteration): close to the solutions, and the same for the
			// whole line search.
			set.Major = func() { copy(f.anchor, f.x) }
		}
		minimizeSmooth(f.objective, u0, set)
		f.anchor = f.anchor[:0]
		u, moved := f.leaveBounds()
		if !moved {
			return
		}
		u0 = u
	}
}

// leaveBounds looks at the best point for free parameters on a bound
// whose SSE derivative points into the interval, and returns the free
// variables with each such parameter moved 5% of its interval inside, the
// others held in θ.
func (f *etsFitter) leaveBounds() (u []float64, moved bool) {
	u = append([]float64(nil), f.bestU...)
	copy(f.x, f.bestX)
	f.setParams(u)
	if !(f.passParams() < math.Inf(1)) {
		return u, false
	}
	par := f.bestPar
	for q, i := range f.free {
		iv, _, _ := f.paramInterval(i)
		w := iv.hi - iv.lo
		if !(w > 0) {
			continue
		}
		s := math.Sin(u[q])
		s *= s
		g := f.pgr[q] // ½ ∂SSE/∂θ_i, others held
		switch {
		case s < 1e-6 && g < 0:
			par[i] = iv.lo + 0.05*w
			moved = true
		case s > 1-1e-6 && g > 0:
			par[i] = iv.hi - 0.05*w
			moved = true
		}
	}
	if !moved {
		return u, false
	}
	// In θ, not u: moving alpha must not move gamma, whose free variable
	// is a fraction of an interval that depends on alpha.
	return f.freeFor(par), true
}
