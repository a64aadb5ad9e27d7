package forecast

import (
	"math"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/optimize"
)

// This file holds small helpers for bounded smooth minimisation: a transform
// that keeps a parameter inside a closed interval, a Cholesky solve for the
// small normal equations of inner least-squares problems, and a wrapper that
// runs gonum's BFGS on a function that returns its value and gradient in one
// call.

// interval is a closed interval [lo, hi] an estimated parameter must stay in.
// An interval with lo == hi pins the parameter; lo > hi is not allowed.
type interval struct{ lo, hi float64 }

// fromFree maps a free (unbounded) variable u into the interval by
//
//	v = lo + (hi - lo) sin²(u)
//
// and returns v and dv/du = (hi - lo) sin(2u). The map is smooth and
// periodic, and it reaches both ends at finite u (u = 0 and u = π/2), where
// dv/du = 0; a minimum on the boundary is therefore a stationary point in u
// and a gradient method converges to it in a few steps instead of chasing
// u to infinity as it would with a logistic map. The other side of this:
// every bound is a stationary point, also one the function would rather
// leave, so a caller should check the sign of the derivative in v at a
// result on a bound.
func (iv interval) fromFree(u float64) (v, dv float64) {
	s, c := math.Sincos(u)
	w := iv.hi - iv.lo
	return iv.lo + w*s*s, 2 * w * s * c
}

// toFree is the inverse of fromFree on [0, π/2]: it returns u with
// fromFree(u) = v, clamping v into the interval first.
func (iv interval) toFree(v float64) float64 {
	w := iv.hi - iv.lo
	if !(w > 0) {
		return 0
	}
	r := (v - iv.lo) / w
	r = math.Max(0, math.Min(1, r))
	return math.Asin(math.Sqrt(r))
}

// cholSolve solves A x = b for a symmetric positive definite k×k matrix A
// given by its lower triangle in row-major order (a[i*k+j], j <= i; the
// upper triangle is not read). It overwrites a with the Cholesky factor L
// (A = L Lᵀ) and b with x, and reports whether A was positive definite; on
// false, a and b hold partial results. It allocates nothing.
//
// It panics if len(a) < k*k or len(b) < k.
func cholSolve(a []float64, k int, b []float64) bool {
	a = a[:k*k]
	b = b[:k]
	for j := 0; j < k; j++ {
		rj := a[j*k : j*k+j+1]
		d := rj[j]
		for _, v := range rj[:j] {
			d -= v * v
		}
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		rj[j] = d
		for i := j + 1; i < k; i++ {
			ri := a[i*k : i*k+j+1]
			s := ri[j]
			for p, v := range rj[:j] {
				s -= ri[p] * v
			}
			ri[j] = s / d
		}
	}
	// L z = b.
	for i := 0; i < k; i++ {
		ri := a[i*k : i*k+i+1]
		s := b[i]
		for p, v := range ri[:i] {
			s -= v * b[p]
		}
		b[i] = s / ri[i]
	}
	// Lᵀ x = z.
	for i := k - 1; i >= 0; i-- {
		s := b[i]
		for p := i + 1; p < k; p++ {
			s -= a[p*k+i] * b[p]
		}
		b[i] = s / a[i*k+i]
	}
	return true
}

// smoothSettings are the stopping rules of minimizeSmooth. Zero fields take
// the defaults noted.
type smoothSettings struct {
	// GradTol stops when the largest gradient component is below it
	// (default 1e-7).
	GradTol float64
	// RelTol stops when the function has not dropped by more than
	// RelTol*|f| over three iterations (default 1e-10).
	RelTol float64
	// MaxIter caps the number of major iterations (default 200).
	MaxIter int
	// Step is the length of the first step, along the negative gradient
	// (default 1). The variables are scaled by it, so GradTol applies to
	// the gradient in the scaled variables x/Step.
	Step float64
	// Major, if not nil, is called after each major iteration, when the
	// last point evaluated is the new iterate.
	Major func()
}

// smoothResult is what minimizeSmooth found.
type smoothResult struct {
	X     []float64 // best point seen
	F     float64   // function value there
	Evals int       // number of calls of the function
	Iter  int       // number of major iterations
	Err   error     // gonum's line-search error, if it stopped on one (X is still the best point)
}

// minimizeSmooth minimises a smooth function of len(x0) free variables with
// gonum's BFGS direction and bisection line search (strong Wolfe
// conditions) from x0. fg returns f(x) and writes the gradient into grad.
// It stops when the largest gradient component falls below GradTol, when
// f has not dropped by more than RelTol*|f| for three major iterations, at
// MaxIter, or when the line search fails; the best point seen over all
// evaluations is returned, so a line-search failure near convergence costs
// nothing. A non-finite value counts as +Inf and makes the line search
// step back. x0 is not modified.
//
// It drives optimize.LinesearchMethod synchronously instead of calling
// optimize.Minimize, whose goroutine hand-offs cost more than the
// evaluations of a small problem.
func minimizeSmooth(fg func(x, grad []float64) float64, x0 []float64, set smoothSettings) smoothResult {
	if set.GradTol == 0 {
		set.GradTol = 1e-7
	}
	if set.RelTol == 0 {
		set.RelTol = 1e-10
	}
	if set.MaxIter == 0 {
		set.MaxIter = 200
	}
	if set.Step == 0 {
		set.Step = 1
	}
	d := len(x0)
	res := smoothResult{X: append([]float64(nil), x0...), F: math.Inf(1)}
	// BFGS's first step has length 1: run it on v = x/Step.
	sc := set.Step
	xs := make([]float64, d)
	loc := &optimize.Location{X: make([]float64, d), Gradient: make([]float64, d)}
	for i, v := range x0 {
		loc.X[i] = v / sc
	}
	// The line search may ask for the value and then the gradient at one
	// point; fg gives both, so evaluate each point once.
	lastV := make([]float64, d)
	lastF, lastG := math.NaN(), make([]float64, d)
	eval := func() {
		if !math.IsNaN(lastF) && floats.Equal(lastV, loc.X) {
			loc.F = lastF
			copy(loc.Gradient, lastG)
			return
		}
		for i, v := range loc.X {
			xs[i] = v * sc
		}
		f := fg(xs, loc.Gradient)
		if math.IsNaN(f) {
			f = math.Inf(1)
		}
		for i := range loc.Gradient {
			loc.Gradient[i] *= sc
		}
		loc.F = f
		copy(lastV, loc.X)
		lastF = f
		copy(lastG, loc.Gradient)
		res.Evals++
		if f < res.F {
			res.F = f
			copy(res.X, xs)
		}
	}
	eval()
	if math.IsInf(loc.F, 1) {
		return res
	}
	ls := &optimize.LinesearchMethod{NextDirectioner: &optimize.BFGS{}, Linesearcher: &optimize.Bisection{}}
	best, stall := loc.F, 0
	op, err := ls.Init(loc)
	for err == nil {
		switch {
		case op == optimize.MajorIteration:
			res.Iter++
			if set.Major != nil {
				set.Major()
			}
			if floats.Norm(loc.Gradient, math.Inf(1)) < set.GradTol || res.Iter >= set.MaxIter {
				return res
			}
			if best-loc.F > set.RelTol*math.Abs(best) {
				best, stall = loc.F, 0
			} else if stall++; stall >= 3 {
				return res
			}
		case op&(optimize.FuncEvaluation|optimize.GradEvaluation) != 0:
			eval()
		}
		op, err = ls.Iterate(loc)
	}
	res.Err = err
	return res
}

// minimizeGlobal1D minimises a function of one variable over the closed
// interval [lo, hi] globally, up to the resolution of a grid: it evaluates
// f at the n+1 points
//
//	x_j = lo + (hi - lo) sin²(π j / (2n)),  j = 0..n
//
// (both bounds included; the points are closer together near the bounds,
// where the SSE of a smoothing parameter changes fastest), takes the best
// one, x_b, and refines it by Brent's method on [x_{b-1}, x_{b+1}] to an
// absolute tolerance tol in x. The result is the best point evaluated,
// grid or refinement, the smaller x on a tie. A minimum in a basin
// narrower than the grid spacing can be missed; every basin that holds a
// grid point lower than all the others is found.
//
// A non-finite value counts as +Inf; if every value is, x is NaN and fx is
// +Inf. lo == hi gives that point alone. It panics if n < 2 or lo > hi.
func minimizeGlobal1D(f func(float64) float64, lo, hi float64, n int, tol float64) (x, fx float64) {
	if n < 2 || lo > hi {
		panic("forecast: bad grid for minimizeGlobal1D")
	}
	eval := func(v float64) float64 {
		y := f(v)
		if math.IsNaN(y) {
			return math.Inf(1)
		}
		return y
	}
	if lo == hi {
		return lo, eval(lo)
	}
	w := hi - lo
	at := func(j int) float64 {
		if j >= n {
			return hi // exactly, whatever the rounding of sin²
		}
		s := math.Sin(math.Pi * float64(j) / float64(2*n))
		return lo + w*s*s
	}
	x, fx = math.NaN(), math.Inf(1)
	b := -1
	for j := 0; j <= n; j++ {
		v := at(j)
		if y := eval(v); y < fx {
			x, fx, b = v, y, j
		}
	}
	if b < 0 {
		return x, fx
	}
	a, c := at(max(b-1, 0)), at(min(b+1, n))
	if xr, fr := brentMin(eval, a, c, x, fx, tol); fr < fx {
		x, fx = xr, fr
	}
	return x, fx
}

// brentMin minimises f on [a, b] from the point x inside it (fx = f(x)) by
// Brent's method: golden-section steps, with a parabola through the three
// best points whenever it falls well inside the bracket and shrinks the
// step (R. P. Brent, "Algorithms for Minimization without Derivatives",
// 1973, ch. 5). It stops when the bracket around the best point is within
// 2*tol (plus a relative term for rounding) and returns the best point and
// its value. At most 100 evaluations.
func brentMin(f func(float64) float64, a, b, x, fx, tol float64) (float64, float64) {
	const cg = 0.3819660112501051 // (3 - √5)/2, the golden section
	v, w := x, x
	fv, fw := fx, fx
	var d, e float64
	for it := 0; it < 100; it++ {
		m := (a + b) / 2
		t1 := 1e-10*math.Abs(x) + tol/2
		t2 := 2 * t1
		if math.Abs(x-m) <= t2-(b-a)/2 {
			break
		}
		golden := true
		if math.Abs(e) > t1 {
			// Parabola through (v, fv), (w, fw), (x, fx).
			r := (x - w) * (fx - fv)
			q := (x - v) * (fx - fw)
			p := (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			if math.Abs(p) < math.Abs(q*e/2) && p > q*(a-x) && p < q*(b-x) {
				e, d = d, p/q
				golden = false
				if u := x + d; u-a < t2 || b-u < t2 {
					d = math.Copysign(t1, m-x)
				}
			}
		}
		if golden {
			if x < m {
				e = b - x
			} else {
				e = a - x
			}
			d = cg * e
		}
		u := x + d
		if math.Abs(d) < t1 {
			u = x + math.Copysign(t1, d)
		}
		fu := f(u)
		switch {
		case fu <= fx:
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv, w, fw, x, fx = w, fw, x, fx, u, fu
		default:
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, fv, w, fw = w, fw, u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x, fx
}

// dataScale returns the power of two nearest (in log scale) to the mean
// absolute value of the finite values of y, or 1 if that mean is zero or
// there are none. Dividing by a power of two is exact (within the range of
// normal numbers), so a fit on y/dataScale(y) is the same as on y up to
// the scale, while its sums of squares stay far from overflow (values near
// 1e160 square past the largest float64) and from underflow (near 1e-160).
func dataScale(y []float64) float64 {
	var mean float64
	k := 0
	for _, v := range y {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		k++
		mean += (math.Abs(v) - mean) / float64(k) // running mean, no overflow
	}
	if !(mean > 0) || math.IsInf(mean, 0) {
		return 1
	}
	return math.Exp2(math.Round(math.Log2(mean)))
}

// scaleBy returns y divided by c, or y itself when c is 1.
func scaleBy(y []float64, c float64) []float64 {
	if c == 1 {
		return y
	}
	out := make([]float64, len(y))
	for i, v := range y {
		out[i] = v / c
	}
	return out
}
