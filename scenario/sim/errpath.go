package sim

import (
	"math"

	"forelay/forecast"
)

// A shockResponse is an impulse response of the form
//
//	psi_j = a_{j mod m} + b_{j mod m} φ_j,   φ_j = φ + φ² + ... + φ^j,   j >= 1,
//
// which every model of package forecast has (forecast.ShockForm). It lets
// an error path run forward through a recursion instead of a convolution
// (see errorFilter).
type shockResponse struct {
	m    int
	phi  float64
	a, b []float64 // by residue class r = j mod m
	// active lists the classes whose a or b is not zero; trend says that
	// some b is not zero.
	active []int
	trend  bool
}

// phiSums returns φ_1..φ_L: out[j−1] = φ + ... + φ^j.
func phiSums(phi float64, L int) []float64 {
	out := make([]float64, L)
	s, pk := 0.0, 1.0
	for j := range out {
		pk *= phi
		s += pk
		out[j] = s
	}
	return out
}

// fitResponse finds a and b of season m and damping phi from the weights
// psi (psi[j−1] = psi_j) of each residue class: with j1 the first and j2
// the last lag of the class in 1..len(psi),
//
//	b_r = (psi_{j2} − psi_{j1}) / (φ_{j2} − φ_{j1}),   a_r = psi_{j1} − b_r φ_{j1},
//
// (b_r = 0 when the class has one lag, or when the two weights differ by
// at most tol). ok says whether the form gives back every weight within
// tol; the response's own weights are then the ones to simulate with.
func fitResponse(psi []float64, m int, phi, tol float64) (r *shockResponse, ok bool) {
	L := len(psi)
	r = &shockResponse{m: m, phi: phi, a: make([]float64, m), b: make([]float64, m)}
	ph := phiSums(phi, L)
	for k := range m {
		j1 := k
		if j1 == 0 {
			j1 = m
		}
		if j1 > L {
			continue
		}
		j2 := j1 + (L-j1)/m*m
		p1, p2 := psi[j1-1], psi[j2-1]
		if j2 > j1 && math.Abs(p2-p1) > tol {
			r.b[k] = (p2 - p1) / (ph[j2-1] - ph[j1-1])
		}
		r.a[k] = p1 - r.b[k]*ph[j1-1]
		if r.a[k] != 0 || r.b[k] != 0 {
			r.active = append(r.active, k)
		}
		r.trend = r.trend || r.b[k] != 0
	}
	for j, w := range r.weights(L + 1) {
		if !(math.Abs(w-psi[j]) <= tol) {
			return r, false
		}
	}
	return r, true
}

// weights returns the response's psi_1..psi_{h−1} (empty for h <= 1).
func (r *shockResponse) weights(h int) []float64 {
	if h <= 1 {
		return []float64{}
	}
	ph := phiSums(r.phi, h-1)
	w := make([]float64, h-1)
	for j := range w {
		k := (j + 1) % r.m
		w[j] = r.a[k] + r.b[k]*ph[j]
	}
	return w
}

// modelResponse returns the impulse response of model md over h periods
// (fitted to y) as a shockResponse when the model's form is known and
// reproduces ImpulseWeights, and nil otherwise; psi are the weights to
// simulate with: the response's own, or ImpulseWeights' when it is nil.
//
// The tolerance allows for the rounding of ImpulseWeights, a difference of
// two forecasts: 1e-9 relative to the weights plus 1e-12 relative to the
// forecasts' size.
func modelResponse(md forecast.Model, y []float64, h int) (r *shockResponse, psi []float64) {
	psi, size := forecast.ImpulseResponse(md, y, h)
	m, phi, ok := forecast.ShockForm(md)
	if !ok || h <= 1 {
		return nil, psi
	}
	big := 1.0
	for _, w := range psi {
		big = math.Max(big, math.Abs(w))
	}
	r, ok = fitResponse(psi, m, phi, 1e-9*big+1e-12*size)
	if !ok {
		return nil, psi
	}
	return r, r.weights(h)
}

// An errorFilter runs one path's shocks eps_1, eps_2, ... through a
// shockResponse and returns the unscaled errors
//
//	u_t = eps_t + sum_{i<t} psi_{t−i} eps_i
//
// in O(m) operations per period. With the shocks grouped by class
// c = i mod m, G_c the sum of the class's shocks so far and D_c their sum
// weighted by φ_{t−i}, the lag t − i has class (t − c) mod m, so
//
//	u_t = eps_t + sum_c a_{(t−c) mod m} G_c + b_{(t−c) mod m} D_c,
//
// and after adding eps_t to G_{t mod m} every D_c moves on by
// D_c = φ (G_c + D_c), since φ_{j+1} = φ (1 + φ_j).
type errorFilter struct {
	r    *shockResponse
	g, d []float64
	tm   int // t mod m
}

func newErrorFilter(r *shockResponse) *errorFilter {
	return &errorFilter{r: r, g: make([]float64, r.m), d: make([]float64, r.m)}
}

// next takes the next period's shock and returns its error u_t.
func (f *errorFilter) next(eps float64) float64 {
	r, g, d := f.r, f.g, f.d
	u := eps
	for _, k := range r.active {
		c := f.tm - k
		if c < 0 {
			c += r.m
		}
		u += r.a[k]*g[c] + r.b[k]*d[c]
	}
	g[f.tm] += eps
	if r.trend {
		for c := range d {
			d[c] = r.phi * (g[c] + d[c])
		}
	}
	if f.tm++; f.tm == r.m {
		f.tm = 0
	}
	return u
}

// A laneFilter runs the shocks of up to lanes paths through a
// shockResponse side by side, period by period: errorFilter's recursion
// with one lane per path, each lane doing the arithmetic of
// errorFilter.next in the same order (so the same numbers), the lanes'
// independent sums giving the processor work to overlap.
type laneFilter struct {
	r     *shockResponse
	lanes int
	g, d  []float64 // m × lanes: class c of lane i at c*lanes + i
	eps   []float64 // one period's shocks
}

func newLaneFilter(r *shockResponse, lanes int) *laneFilter {
	return &laneFilter{r: r, lanes: lanes, g: make([]float64, r.m*lanes), d: make([]float64, r.m*lanes), eps: make([]float64, lanes)}
}

// run turns the shocks in buf into the unscaled errors u_t of B paths
// (B <= lanes) over the periods buf holds: period t of path i is
// buf[t*lanes + i], shock in and error out.
func (f *laneFilter) run(buf []float64, B int) {
	r, L := f.r, f.lanes
	clear(f.g)
	clear(f.d)
	eps := f.eps[:B]
	tm := 0
	for t0 := 0; t0+L <= len(buf); t0 += L {
		u := buf[t0 : t0+B]
		copy(eps, u)
		for _, k := range r.active {
			c := tm - k
			if c < 0 {
				c += r.m
			}
			a, b := r.a[k], r.b[k]
			g, d := f.g[c*L:c*L+B], f.d[c*L:c*L+B]
			if r.trend {
				for i := range u {
					u[i] += a*g[i] + b*d[i]
				}
			} else {
				for i := range u {
					u[i] += a * g[i]
				}
			}
		}
		g := f.g[tm*L : tm*L+B]
		for i, e := range eps {
			g[i] += e
		}
		if r.trend {
			for c := range r.m {
				g, d := f.g[c*L:c*L+B], f.d[c*L:c*L+B]
				for i := range d {
					d[i] = r.phi * (g[i] + d[i])
				}
			}
		}
		if tm++; tm == r.m {
			tm = 0
		}
	}
}
