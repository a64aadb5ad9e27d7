package forecast

import (
	"math"

	"gonum.org/v1/gonum/floats"
)

// This file holds the passes of etsFitter through the data that propagate,
// along with the one-step errors e_t, their derivatives: with respect to
// the free initial states (the least-squares design of the inner problem)
// and with respect to the smoothing parameters (the gradient of the outer
// problem). Each derivative direction carries its own level, trend and m
// seasonal sensitivities, updated by differentiating the error-correction
// recursions of ets.go. Writing μ = l_{t-1} + φ b_{t-1} and s = s_{t-m},
// and d for the derivative along one direction, with (dα, dβ, dγ, dφ) the
// direction's change in the parameters (all zero for a state direction):
//
// additive season:
//
//	dμ = dl + φ db + dφ b
//	de = -(dμ + ds)
//	dl' = dμ + α de + dα e
//	db' = φ db + dφ b + αβ de + (β dα + α dβ) e
//	ds' = ds + γ de + dγ e
//
// multiplicative season, with u = e/s and v = e/μ:
//
//	de = -(dμ s + μ ds)
//	du = (de - u ds)/s,  dv = (de - v dμ)/μ
//	dl' = dμ + α du + dα u
//	db' = φ db + dφ b + αβ du + (β dα + α dβ) u
//	ds' = ds + γ dv + dγ v
//
// The passes allocate nothing.

// passStates runs the recursions from the states f.x with f.par, and
// builds the normal equations of the inner least-squares problem, the
// lower triangle of A = Σ J_tᵀ J_t into f.a and g = Σ J_tᵀ e_t into f.g,
// where J_t = ∂e_t/∂x. It returns the SSE at f.x. The columns of J and the
// errors are stored and multiplied at the end (vectorised dot products)
// rather than accumulated step by step.
func (f *etsFitter) passStates() float64 {
	k, m, n := f.k, f.m, len(f.y)
	dl, db, ds, a, g := f.dl[:k], f.db[:k], f.ds[:m*k], f.a[:k*k], f.g[:k]
	jm, ev := f.jm[:k*n], f.ev[:n]
	clear(dl)
	clear(db)
	clear(ds)
	dl[0] = 1
	if f.kb > 0 {
		db[f.kb] = 1
	}
	for j := 0; j < m-1; j++ {
		i := f.ks + j
		ds[j*k+i] = 1
		ds[(m-1)*k+i] = -1
	}
	alpha, gamma, phi := f.par[etsAlpha], f.par[etsGamma], f.par[etsPhi]
	ab := alpha * f.par[etsBeta]
	l, b := f.expand(f.x)
	seas := f.seas[:m]
	var sse float64
	c := 0
	for t, yt := range f.y {
		mu := l + phi*b
		so := seas[c]
		dsc := ds[c*k : c*k+k]
		var e float64
		if f.mult {
			e = yt - mu*so
			is, im := 1/so, 1/mu
			u, v := e*is, e*im
			l = mu + alpha*u
			b = phi*b + ab*u
			seas[c] = so + gamma*v
			for i := range dsc {
				dmu := dl[i] + phi*db[i]
				d := dsc[i]
				de := -(dmu*so + mu*d)
				du := (de - u*d) * is
				dv := (de - v*dmu) * im
				jm[i*n+t] = de
				dl[i] = dmu + alpha*du
				db[i] = phi*db[i] + ab*du
				dsc[i] = d + gamma*dv
			}
		} else {
			e = yt - mu - so
			l = mu + alpha*e
			b = phi*b + ab*e
			seas[c] = so + gamma*e
			for i := range dsc {
				dmu := dl[i] + phi*db[i]
				d := dsc[i]
				de := -(dmu + d)
				jm[i*n+t] = de
				dl[i] = dmu + alpha*de
				db[i] = phi*db[i] + ab*de
				dsc[i] = d + gamma*de
			}
		}
		ev[t] = e
		sse += e * e
		if c++; c == m {
			c = 0
		}
	}
	for i := 0; i < k; i++ {
		ci := jm[i*n : i*n+n]
		g[i] = dot(ci, ev)
		for j := 0; j <= i; j++ {
			a[i*k+j] = dot(ci, jm[j*n:j*n+n])
		}
	}
	if math.IsNaN(sse) {
		return math.Inf(1)
	}
	return sse
}

// passParams runs the recursions from the states f.x with f.par and
// returns the SSE; it leaves in f.pgr[q] the derivative of SSE/2,
// Σ e_t ∂e_t/∂θ, along the free parameter f.free[q].
func (f *etsFitter) passParams() float64 {
	m := f.m
	np := len(f.free)
	var dl, db, ca, cb, cg, cp [4]float64
	for q, i := range f.free {
		switch i {
		case etsAlpha:
			ca[q] = 1
		case etsBeta:
			cb[q] = 1
		case etsGamma:
			cg[q] = 1
		case etsPhi:
			cp[q] = 1
		}
	}
	ds := f.pds[:m*4]
	clear(ds)
	var gr [4]float64
	alpha, beta, gamma, phi := f.par[etsAlpha], f.par[etsBeta], f.par[etsGamma], f.par[etsPhi]
	ab := alpha * beta
	l, b := f.expand(f.x)
	seas := f.seas[:m]
	var sse float64
	c := 0
	for _, yt := range f.y {
		mu := l + phi*b
		so := seas[c]
		dsc := ds[c*4 : c*4+4]
		var e float64
		if f.mult {
			e = yt - mu*so
			u, v := e/so, e/mu
			for q := 0; q < np; q++ {
				dmu := dl[q] + phi*db[q] + cp[q]*b
				d := dsc[q]
				de := -(dmu*so + mu*d)
				du := (de - u*d) / so
				dv := (de - v*dmu) / mu
				gr[q] += e * de
				dl[q] = dmu + alpha*du + ca[q]*u
				db[q] = phi*db[q] + cp[q]*b + ab*du + (beta*ca[q]+alpha*cb[q])*u
				dsc[q] = d + gamma*dv + cg[q]*v
			}
			l = mu + alpha*u
			b = phi*b + ab*u
			seas[c] = so + gamma*v
		} else {
			e = yt - mu - so
			for q := 0; q < np; q++ {
				dmu := dl[q] + phi*db[q] + cp[q]*b
				d := dsc[q]
				de := -(dmu + d)
				gr[q] += e * de
				dl[q] = dmu + alpha*de + ca[q]*e
				db[q] = phi*db[q] + cp[q]*b + ab*de + (beta*ca[q]+alpha*cb[q])*e
				dsc[q] = d + gamma*de + cg[q]*e
			}
			l = mu + alpha*e
			b = phi*b + ab*e
			seas[c] = so + gamma*e
		}
		sse += e * e
		if c++; c == m {
			c = 0
		}
	}
	f.pgr = gr
	if math.IsNaN(sse) {
		return math.Inf(1)
	}
	return sse
}

// sseAt returns the SSE from the free states x with f.par.
func (f *etsFitter) sseAt(x []float64) float64 {
	alpha, gamma, phi := f.par[etsAlpha], f.par[etsGamma], f.par[etsPhi]
	ab := alpha * f.par[etsBeta]
	l, b := f.expand(x)
	seas := f.seas[:f.m]
	var sse float64
	c := 0
	for _, yt := range f.y {
		mu := l + phi*b
		so := seas[c]
		var e float64
		if f.mult {
			e = yt - mu*so
			l = mu + alpha*e/so
			b = phi*b + ab*e/so
			seas[c] = so + gamma*e/mu
		} else {
			e = yt - mu - so
			l = mu + alpha*e
			b = phi*b + ab*e
			seas[c] = so + gamma*e
		}
		sse += e * e
		if c++; c == len(seas) {
			c = 0
		}
	}
	if math.IsNaN(sse) {
		return math.Inf(1)
	}
	return sse
}

// passStatesLinear does what passStates does for an additive (or no)
// season, faster. With the parameters held the additive recursions are a
// linear time-invariant system, so the derivative of e_t with respect to
// the initial seasonal state first used at step j (0-based) is the one for
// step 0 delayed by j steps: ∂e_t/∂s_j = h_s(t-j), with h_s(t) = 0 for
// t < 0. Three impulse responses, h_l, h_b and h_s, of the errors to a
// unit initial level, trend and first seasonal state thus give the whole
// design, and the normal equations are sums of lagged products:
//
//	Σ_t h_s(t-i) h_s(t-j) = Σ_{τ=0..n-1-j} h_s(τ+j-i) h_s(τ)    (i <= j)
//	Σ_t h_l(t) h_s(t-j),  Σ_t h_b(t) h_s(t-j),  Σ_t e_t h_s(t-j)
//
// which take O(n m) operations instead of O(n m²). The free seasonal
// states are s_j - s_{m-1} (normalisation), so their rows are differences
// of these sums.
func (f *etsFitter) passStatesLinear() float64 {
	if f.m == 1 {
		return f.passNoSeason()
	}
	k, m, n := f.k, f.m, len(f.y)
	alpha, gamma, phi := f.par[etsAlpha], f.par[etsGamma], f.par[etsPhi]
	ab := alpha * f.par[etsBeta]
	hl, hb, hs, ev := f.hl[:n], f.hb[:n], f.hs[:n], f.ev[:n]
	// Seasonal sensitivities of the three directions, interleaved.
	ds := f.ds[:3*m]
	clear(ds)
	ds[2] = 1 // h_s: unit first seasonal state
	l, b := f.expand(f.x)
	seas := f.seas[:m]
	dl0, db0, dl1, db1, dl2, db2 := 1.0, 0.0, 0.0, 1.0, 0.0, 0.0
	var sse float64
	c := 0
	for t, yt := range f.y {
		mu := l + phi*b
		so := seas[c]
		e := yt - mu - so
		ev[t] = e
		sse += e * e
		l = mu + alpha*e
		b = phi*b + ab*e
		seas[c] = so + gamma*e
		d := ds[3*c : 3*c+3]
		// level direction
		dmu := dl0 + phi*db0
		de := -(dmu + d[0])
		hl[t] = de
		dl0 = dmu + alpha*de
		db0 = phi*db0 + ab*de
		d[0] += gamma * de
		// trend direction
		dmu = dl1 + phi*db1
		de = -(dmu + d[1])
		hb[t] = de
		dl1 = dmu + alpha*de
		db1 = phi*db1 + ab*de
		d[1] += gamma * de
		// seasonal direction
		dmu = dl2 + phi*db2
		de = -(dmu + d[2])
		hs[t] = de
		dl2 = dmu + alpha*de
		db2 = phi*db2 + ab*de
		d[2] += gamma * de
		if c++; c == m {
			c = 0
		}
	}
	a, g := f.a[:k*k], f.g[:k]
	clear(a)
	a[0] = dot(hl, hl)
	g[0] = dot(hl, ev)
	if f.kb > 0 {
		a[k] = dot(hb, hl)
		a[k+1] = dot(hb, hb)
		g[1] = dot(hb, ev)
	}
	if m > 1 {
		// Raw sums over the m seasonal states: p (level), q (trend),
		// r (seasonal x seasonal, r[i*m+j] for i <= j), gs (errors).
		p, q, gs, r := f.rp[:m], f.rq[:m], f.rg[:m], f.rr[:m*m]
		for j := 0; j < m; j++ {
			h := hs[:n-j]
			p[j] = dot(hl[j:], h)
			gs[j] = dot(ev[j:], h)
			if f.kb > 0 {
				q[j] = dot(hb[j:], h)
			}
		}
		for d := 0; d < m; d++ {
			// C_d(N) = Σ_{τ=0..N} h_s(τ+d) h_s(τ), from N = n-m up to n-1-d;
			// r[i][j] = C_{j-i}(n-1-j).
			cd := dot(hs[d:n-m+1+d], hs[:n-m+1])
			for j := m - 1; j >= d; j-- {
				if j < m-1 {
					tau := n - 1 - j
					cd += hs[tau+d] * hs[tau]
				}
				r[(j-d)*m+j] = cd
			}
		}
		rr := func(i, j int) float64 {
			if i > j {
				i, j = j, i
			}
			return r[i*m+j]
		}
		last := m - 1
		for i := 0; i < m-1; i++ {
			row := (f.ks + i) * k
			a[row] = p[i] - p[last]
			if f.kb > 0 {
				a[row+1] = q[i] - q[last]
			}
			for j := 0; j <= i; j++ {
				a[row+f.ks+j] = rr(i, j) - rr(i, last) - rr(last, j) + rr(last, last)
			}
			g[f.ks+i] = gs[i] - gs[last]
		}
	}
	if math.IsNaN(sse) {
		return math.Inf(1)
	}
	return sse
}

// passNoSeason is passStatesLinear for a model without a season: the
// impulse responses of the errors to a unit initial level (h_l) and, with
// a trend, trend (h_b), and the 1×1 or 2×2 normal equations from them.
func (f *etsFitter) passNoSeason() float64 {
	n := len(f.y)
	alpha, phi := f.par[etsAlpha], f.par[etsPhi]
	ab := alpha * f.par[etsBeta]
	hl, ev := f.hl[:n], f.ev[:n]
	l, b := f.expand(f.x)
	var sse float64
	if f.kb == 0 {
		// Without a trend, h_l(t) = -(1-α)^t.
		dl := 1.0
		for t, yt := range f.y {
			e := yt - l
			ev[t] = e
			sse += e * e
			l += alpha * e
			hl[t] = -dl
			dl -= alpha * dl
		}
		f.a[0] = dot(hl, hl)
		f.g[0] = dot(hl, ev)
	} else {
		hb := f.hb[:n]
		dl0, db0, dl1, db1 := 1.0, 0.0, 0.0, 1.0
		for t, yt := range f.y {
			mu := l + phi*b
			e := yt - mu
			ev[t] = e
			sse += e * e
			l = mu + alpha*e
			b = phi*b + ab*e
			// de = -dμ for each direction.
			dmu := dl0 + phi*db0
			hl[t] = -dmu
			dl0 = dmu - alpha*dmu
			db0 = phi*db0 - ab*dmu
			dmu = dl1 + phi*db1
			hb[t] = -dmu
			dl1 = dmu - alpha*dmu
			db1 = phi*db1 - ab*dmu
		}
		k := f.k
		f.a[0] = dot(hl, hl)
		f.a[k] = dot(hb, hl)
		f.a[k+1] = dot(hb, hb)
		f.g[0] = dot(hl, ev)
		f.g[1] = dot(hb, ev)
	}
	if math.IsNaN(sse) {
		return math.Inf(1)
	}
	return sse
}

// dot returns Σ x_i y_i over len(x) terms (gonum's assembly kernel); y
// must be at least as long as x.
func dot(x, y []float64) float64 { return floats.Dot(x, y[:len(x)]) }
