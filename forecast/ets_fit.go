package forecast

import (
	"math"
	"sync"
)

// Bounds of the estimated smoothing parameters (component form, see
// ets.go). They are the usual region of HKOS (2008) for the innovations
// form, 0 < α < 1, 0 < β_I < α, 0 < γ < 1 - α (from memory), which for
// the component form means 0 < β < 1; the open ends are moved 0.0001
// inside. The damping is held in 0.8 <= φ <= 0.98 (common practice: a
// smaller φ damps the trend away within a few periods, a larger one is
// hard to tell from an undamped trend).
const (
	etsParamLo = 0.0001
	etsParamHi = 0.9999
	etsPhiLo   = 0.8
	etsPhiHi   = 0.98
)

// Indexes of the smoothing parameters in etsFitter's arrays.
const (
	etsAlpha = iota
	etsBeta
	etsGamma
	etsPhi
)

// etsFitter estimates an exponential smoothing model by least squares: it
// minimises the sum of squared one-step errors
//
//	SSE(θ, x0) = Σ_{t=1..n} (y_t - ŷ_t)²
//
// over the smoothing parameters θ that are not held and the initial states
// x0, nested as
//
//	S(θ) = min over x0 of SSE(θ, x0)
//
// Bounds: α, β in [0.0001, 0.9999], γ in [0.0001, 1-α] (both ends capped
// by 0.9999 and 1-α), φ in [0.8, 0.98]; a held γ lowers α's upper bound
// to 1-γ.
//
// Initial states. Seasonal initial states are normalised, which loses no
// fit (adding c to the level and -c to every additive seasonal state, or
// scaling level and trend by c and the multiplicative states by 1/c,
// leaves every prediction unchanged):
//
//	additive:        Σ_{j=1..m} s_{j-m} = 0
//	multiplicative:  Σ_{j=1..m} s_{j-m} = m
//
// so the free states are the level, the trend and m-1 seasonal states.
//
// Inner problem. For an additive (or no) season the errors are affine in
// x0 when θ is fixed, so the best x0 is a linear least-squares solution:
// one pass through the data gives the errors and the impulse responses
// from which the normal equations follow (passStatesLinear), solved by
// Cholesky. For the multiplicative season the errors are not affine in
// x0; the sensitivities ∂e_t/∂x0, propagated through the recursions
// (passStates), give Gauss-Newton steps with step halving from the
// previous solution (or from the anchor states, see descendFrom), until
// a step gains less than 1e-11 of the SSE, or is predicted to gain less
// than 1e-9, or is small (1e-5) and gains what was predicted to a
// thousandth. That problem can have several minima; at the starts of the
// outer search it is solved from several initial states (bestInner).
//
// Outer problem. S(θ) is smooth, and its gradient is ∂SSE/∂θ at the inner
// solution (envelope theorem), propagated through the recursions in a
// second pass (passParams). Each free parameter is kept in its bounds by
// the transform of interval.fromFree, and gonum's BFGS (minimizeSmooth)
// minimises S over the free variables, scaled by its value at the start,
// from several starts (see fit in ets_search.go). A single free parameter
// is searched globally instead (fit1D).
type etsFitter struct {
	sh   etsShape
	y    []float64
	m    int  // season length used by the passes: sh.season, or 1 (held at 0)
	mult bool // multiplicative season
	// oneStart skips the descents from further grid points (step 3 of
	// fit): auto's scoring of the multiplicative season (see fitScoring).
	oneStart bool

	// Free initial states x: x[0] = l0, x[kb] = b0 when kb > 0, and
	// x[ks+j] = s_{j+1-m} for j < m-1; s_0 follows from the normalisation.
	k, kb, ks int
	x         []float64

	fixed [4]float64    // held values (NaN = free); structural 0/1 included
	free  []int         // indexes (etsAlpha...) of the free parameters
	par   [4]float64    // current parameter values
	dpar  [4][4]float64 // dpar[i][j] = ∂par[i]/∂u_j for the free variables u
	ia    int           // position of alpha among the free variables, or -1
	scale float64       // objective scale: SSE at the start

	// Work space for the passes.
	seas   []float64 // m seasonal states (circular)
	dl, db []float64 // k state sensitivities of level and trend
	ds     []float64 // m*k seasonal sensitivities, ds[c*k+i]
	jm     []float64 // k*n: columns of J = ∂e/∂x (multiplicative season)
	a, a2  []float64 // k*k normal matrix and a copy
	g      []float64 // k: Σ e_t ∂e_t/∂x, then the step
	xTry   []float64 // k
	pds    []float64 // m*4 seasonal sensitivities to the parameters
	// passStatesLinear: impulse responses, errors and raw sums.
	hl, hb, hs, ev []float64 // n
	rp, rq, rg, rr []float64 // m, m, m, m*m
	pgr            [4]float64

	bestF   float64
	bestX   []float64
	bestPar [4]float64
	bestU   []float64

	maxGN int // caps the Gauss-Newton steps of an inner solve (0: 50)

	// anchor, when not nil, is where every inner solve of a
	// multiplicative season starts (see solveStates).
	anchor []float64

	// work backs the slices above (from etsWorkPool; see release).
	work *[]float64
}

// etsWorkPool holds the work space of finished fits for the next ones: a
// fit of a multiplicative season needs k*n numbers for its design, and a
// portfolio runs several fits per series.
var etsWorkPool sync.Pool

// getETSWork returns a zeroed work space of size numbers, as make would.
func getETSWork(size int) *[]float64 {
	if w, ok := etsWorkPool.Get().(*[]float64); ok && cap(*w) >= size {
		*w = (*w)[:size]
		clear(*w)
		return w
	}
	w := make([]float64, size)
	return &w
}

// release hands the fitter's work space back to etsWorkPool. The fitter
// must not be used after it; what it returned (result, grid points) does
// not share the work space.
func (f *etsFitter) release() {
	if f.work != nil {
		etsWorkPool.Put(f.work)
		f.work = nil
	}
}

// newETSFitter prepares the estimation of a model of shape sh on y (which
// it keeps, unmodified). fixed holds the held parameter values, NaN for
// the ones to estimate, as etsCheckFixed returns them.
func newETSFitter(sh etsShape, y []float64, fixed [4]float64) *etsFitter {
	f := &etsFitter{sh: sh, y: y, m: max(sh.season, 1), mult: sh.mult, fixed: fixed, ia: -1}
	if !sh.trend {
		f.fixed[etsBeta] = 0
	}
	if sh.season == 0 {
		f.fixed[etsGamma] = 0
	}
	if !sh.damped {
		f.fixed[etsPhi] = 1
	}
	for i, v := range f.fixed {
		if math.IsNaN(v) {
			if i == etsAlpha {
				f.ia = len(f.free)
			}
			f.free = append(f.free, i)
		} else {
			f.par[i] = v
		}
	}
	f.k, f.kb, f.ks = 1, 0, 1
	if sh.trend {
		f.kb = 1
		f.k, f.ks = 2, 2
	}
	f.k += f.m - 1
	k, m := f.k, f.m
	n := len(y)
	nds := m * k
	if !f.mult {
		nds = max(nds, 3*m)
	}
	size := 6*k + 2*k*k + m + nds + 4*m + n
	if f.mult {
		size += k * n
	} else {
		size += 3*n + 3*m + m*m
	}
	f.work = getETSWork(size)
	w := *f.work
	take := func(l int) []float64 {
		s := w[:l:l]
		w = w[l:]
		return s
	}
	f.x = take(k)
	f.seas = take(m)
	f.dl = take(k)
	f.db = take(k)
	f.ds = take(nds)
	f.a = take(k * k)
	f.a2 = take(k * k)
	f.g = take(k)
	f.xTry = take(k)
	f.pds = take(m * 4)
	f.ev = take(n)
	if f.mult {
		f.jm = take(k * n)
	} else {
		f.hl, f.hb, f.hs = take(n), take(n), take(n)
		f.rp, f.rq, f.rg, f.rr = take(m), take(m), take(m), take(m*m)
	}
	f.bestX = take(k)
	f.bestF = math.Inf(1)
	return f
}

// expand writes the full initial states for the free states x: it returns
// l0 and b0 and fills f.seas with s_{1-m}..s_0.
func (f *etsFitter) expand(x []float64) (l0, b0 float64) {
	l0 = x[0]
	if f.kb > 0 {
		b0 = x[f.kb]
	}
	m := f.m
	var sum float64
	for j := 0; j < m-1; j++ {
		v := x[f.ks+j]
		f.seas[j] = v
		sum += v
	}
	if f.mult {
		f.seas[m-1] = float64(m) - sum
	} else {
		f.seas[m-1] = -sum
	}
	return l0, b0
}

// initialStates sets x to a heuristic start: the level and trend from the
// means of the first two seasons (first two values without a season) and
// seasonal states from the first season around that line, normalised.
func (f *etsFitter) initialStates() {
	y, m, x := f.y, f.sh.season, f.x
	if m == 0 {
		x[0] = y[0]
		if f.kb > 0 {
			x[f.kb] = y[1] - y[0]
		}
		return
	}
	var m1, m2 float64
	for j := 0; j < m; j++ {
		m1 += y[j]
		m2 += y[m+j]
	}
	m1 /= float64(m)
	m2 /= float64(m)
	b0 := (m2 - m1) / float64(m)
	l0 := m1 - b0*float64(m+1)/2
	if f.mult && (l0 <= 0 || l0+float64(m)*b0 <= 0) {
		b0, l0 = 0, m1
	}
	x[0] = l0
	x[f.kb] = b0
	// Seasonal states around the line, normalised.
	var sum float64
	for j := 0; j < m; j++ {
		base := l0 + float64(j+1)*b0
		if f.mult {
			f.seas[j] = y[j] / base
		} else {
			f.seas[j] = y[j] - base
		}
		sum += f.seas[j]
	}
	for j := 0; j < m-1; j++ {
		if f.mult {
			x[f.ks+j] = f.seas[j] * float64(m) / sum
		} else {
			x[f.ks+j] = f.seas[j] - sum/float64(m)
		}
	}
}

// paramInterval returns the bounds of free parameter i given the current
// alpha (for gamma), and the derivatives of the ends with respect to alpha.
func (f *etsFitter) paramInterval(i int) (iv interval, dlo, dhi float64) {
	switch i {
	case etsAlpha:
		hi := etsParamHi
		if g := f.fixed[etsGamma]; !math.IsNaN(g) && f.sh.season > 0 {
			hi = math.Min(hi, 1-g)
		}
		return interval{math.Min(etsParamLo, hi), hi}, 0, 0
	case etsGamma:
		hi, dh := etsParamHi, 0.0
		if 1-f.par[etsAlpha] < hi {
			hi, dh = 1-f.par[etsAlpha], -1
		}
		lo, dl := etsParamLo, 0.0
		if hi < lo {
			lo, dl = hi, dh
		}
		return interval{lo, hi}, dl, dh
	case etsPhi:
		return interval{etsPhiLo, etsPhiHi}, 0, 0
	}
	return interval{etsParamLo, etsParamHi}, 0, 0
}

// setParams sets f.par and f.dpar from the free variables u.
func (f *etsFitter) setParams(u []float64) {
	f.dpar = [4][4]float64{}
	for j, i := range f.free {
		iv, dlo, dhi := f.paramInterval(i)
		v, dv := iv.fromFree(u[j])
		f.par[i] = v
		f.dpar[i][j] = dv
		if i == etsGamma && f.ia >= 0 {
			// γ = lo(α) + (hi(α) - lo(α)) sin²u: chain through α.
			r := 0.0
			if w := iv.hi - iv.lo; w > 0 {
				r = (v - iv.lo) / w
			}
			f.dpar[i][f.ia] = (dlo + (dhi-dlo)*r) * f.dpar[etsAlpha][f.ia]
		}
	}
}

// freeFor returns the free variables for the parameter values par
// (clamped into their bounds); it sets f.par on the way.
func (f *etsFitter) freeFor(par [4]float64) []float64 {
	u := make([]float64, len(f.free))
	f.freeTo(u, par)
	return u
}

// freeTo is freeFor writing the free variables into u (len(f.free) long).
func (f *etsFitter) freeTo(u []float64, par [4]float64) {
	for j, i := range f.free {
		iv, _, _ := f.paramInterval(i)
		v := math.Max(iv.lo, math.Min(iv.hi, par[i]))
		u[j] = iv.toFree(v)
		f.par[i], _ = iv.fromFree(u[j])
	}
}

// solveStates replaces f.x by the best initial states for the current
// parameters and reports whether that worked (finite SSE).
func (f *etsFitter) solveStates() bool {
	if !f.mult {
		f.passStatesLinear()
		if _, ok := f.step(); !ok {
			return false
		}
		for i, d := range f.g {
			f.x[i] += d
		}
		return true
	}
	if len(f.anchor) == f.k {
		copy(f.x, f.anchor)
	}
	iters := 50
	if f.maxGN > 0 {
		iters = f.maxGN
	}
	for it := 0; it < iters; it++ {
		sse := f.passStates()
		if !(sse < math.Inf(1)) {
			return false
		}
		pred, ok := f.step()
		if !ok {
			return false
		}
		t := 1.0
		moved := false
		for try := 0; try < 20; try++ {
			for i, d := range f.g {
				f.xTry[i] = f.x[i] + t*d
			}
			if s := f.sseAt(f.xTry); s < sse {
				copy(f.x, f.xTry)
				moved = true
				// Stop when the step gained next to nothing, or when it
				// was small and gained what the linearisation predicted
				// to a thousandth (the problem is locally linear, so
				// another step would gain less than about 1e-8 of the SSE).
				gain := sse - s
				if gain <= 1e-11*sse || (t == 1 && (pred <= 1e-9*sse ||
					(pred <= 1e-5*sse && math.Abs(gain-pred) <= 1e-3*pred))) {
					return true
				}
				break
			}
			t /= 2
		}
		if !moved {
			return true // no descent left: converged to rounding
		}
	}
	return true
}

// step solves the normal equations left in f.a and f.g by passStates for
// the Gauss-Newton step δ (A δ = -g), written into f.g, and returns the
// decrease of the SSE the linearisation predicts for it, -gᵀδ. If A is
// not positive definite to working precision it retries with a small
// ridge; ok is false if that fails too or δ is not finite.
func (f *etsFitter) step() (pred float64, ok bool) {
	k := f.k
	copy(f.a2, f.a)
	for i := range f.g {
		f.g[i] = -f.g[i]
	}
	copy(f.xTry, f.g)
	var dmax float64
	for i := 0; i < k; i++ {
		dmax = math.Max(dmax, f.a[i*k+i])
	}
	ridge := 1e-12 * dmax
	for try := 0; try < 6; try++ {
		if cholSolve(f.a, k, f.g) {
			for i, v := range f.g {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					return 0, false
				}
				pred += f.xTry[i] * v
			}
			return pred, true
		}
		copy(f.a, f.a2)
		copy(f.g, f.xTry)
		for i := 0; i < k; i++ {
			f.a[i*k+i] += ridge
		}
		ridge *= 100
	}
	return 0, false
}

// objective is the function the outer optimiser minimises: S(θ(u)) /
// scale, with its gradient in u written into grad.
func (f *etsFitter) objective(u, grad []float64) float64 {
	f.setParams(u)
	if !f.solveStates() {
		f.restoreStates()
		clear(grad)
		return math.Inf(1)
	}
	sse := f.passParams()
	if !(sse < math.Inf(1)) {
		f.restoreStates()
		clear(grad)
		return math.Inf(1)
	}
	for j := range grad {
		var s float64
		for q, i := range f.free {
			s += f.pgr[q] * f.dpar[i][j]
		}
		grad[j] = 2 * s / f.scale
		if math.IsNaN(grad[j]) || math.IsInf(grad[j], 0) {
			f.restoreStates()
			clear(grad)
			return math.Inf(1)
		}
	}
	f.record(sse, u)
	return sse / f.scale
}

// value returns S(θ(u)), like objective without the gradient and the
// scale, and records the point if it is the best so far.
func (f *etsFitter) value(u []float64) float64 {
	f.setParams(u)
	var sse float64
	if f.mult {
		if !f.solveStates() {
			f.restoreStates()
			return math.Inf(1)
		}
		sse = f.sseAt(f.x)
	} else {
		// Linear least squares: the SSE at the solution is the SSE at the
		// start less the predicted decrease, exactly.
		s := f.passStatesLinear()
		pred, ok := f.step()
		if !ok {
			f.restoreStates()
			return math.Inf(1)
		}
		for i, d := range f.g {
			f.x[i] += d
		}
		sse = math.Max(s-pred, 0)
	}
	if !(sse < math.Inf(1)) {
		f.restoreStates()
		return math.Inf(1)
	}
	f.record(sse, u)
	return sse
}

// record keeps the current states and parameters (free variables u) as
// the best point if sse is below the best so far.
func (f *etsFitter) record(sse float64, u []float64) {
	if sse < f.bestF {
		f.bestF = sse
		copy(f.bestX, f.x)
		f.bestPar = f.par
		f.bestU = append(f.bestU[:0], u...)
	}
}

// restoreStates resets f.x after a failed evaluation: to the best states
// so far, or to the heuristic start when there are none yet.
func (f *etsFitter) restoreStates() {
	if math.IsInf(f.bestF, 1) {
		f.initialStates()
		return
	}
	copy(f.x, f.bestX)
}

// evalStart evaluates the objective at u with scale 1 (recording the best
// point) and returns S(θ(u)).
func (f *etsFitter) evalStart(u []float64) float64 {
	f.scale = 1
	return f.objective(u, make([]float64, len(u)))
}

// result returns the best parameters and initial states found.
func (f *etsFitter) result() (etsParams, etsStates, int) {
	p := etsParams{f.bestPar[etsAlpha], f.bestPar[etsBeta], f.bestPar[etsGamma], f.bestPar[etsPhi]}
	l0, b0 := f.expand(f.bestX)
	init := etsStates{level: l0, trend: b0}
	if f.sh.season > 0 {
		init.season = append([]float64(nil), f.seas...)
	}
	return p, init, len(f.free) + f.k
}
