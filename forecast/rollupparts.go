package forecast

import (
	"errors"
	"fmt"
	"slices"
)

// VarianceParts are the partial sums behind SumVariance for some of the
// series of a sum: added over disjoint sets of series (Add), they give the
// variance of the sum over all of them (Variance), as SumVariance does on
// all the series at once, up to the order of the additions. They let
// several machines each sum the errors of their own series, and one
// machine finish the sum.
//
// With c_ij = k_ih psi_ij as in SumVariance, for each lead time l (h =
// l+1) and j <= l the parts hold
//
//	Z[l,j][t] = sum_i c_ij e_it           (t counted back from the last period, t < N)
//	O[L][l,j][k] = sum_{i: n_i = L} c_ij r_ik   (k < L, for L < N)
//	Indep[l] = sum of v_ih over the series with no usable errors,
//
// and Var(sum_i e_ih) = Indep[l] + sum_j [ (1/N) sum_t Z[l,j][t]²
// + sum_L ((N − L)/N) (1/L) sum_k O[L][l,j][k]² ].
type VarianceParts struct {
	// H is the number of lead times and N the number of periods the
	// shocks are drawn over (SumVariance's span).
	H, N int
	// Z holds the per-period sums, pair (l, j) at index l(l+1)/2 + j, each
	// of N values, t = 0 the last period of the history.
	Z [][]float64
	// Own holds, by number of errors L (< N), the sums of the series'
	// own errors counted back from their last, pair (l, j) as in Z, each
	// of L values.
	Own map[int][][]float64
	// Indep holds, per lead time, the variances of the series added as
	// independent.
	Indep []float64
}

// pairs returns the number of pairs (l, j), j <= l < h.
func pairs(h int) int { return h * (h + 1) / 2 }

// NewVarianceParts returns the parts of a sum of no series: h lead times,
// shocks drawn over n periods.
func NewVarianceParts(h, n int) *VarianceParts {
	p := &VarianceParts{H: h, N: n, Z: make([][]float64, pairs(h)), Own: map[int][][]float64{}, Indep: make([]float64, h)}
	for i := range p.Z {
		p.Z[i] = make([]float64, n)
	}
	return p
}

// SumVarianceParts returns the VarianceParts of the results for lead times
// 1..h, shocks drawn over span periods counted back from the last period
// of the history, which every series must end in (end is that period's
// successor). It returns an error when h < 1, span < 1, a series ends
// elsewhere, its errors reach back further than span, or its variance is
// negative or not finite.
func SumVarianceParts(results []*Result, h, span int, end Period, mode BandMode, from BandSource) (*VarianceParts, error) {
	if h < 1 || span < 1 {
		return nil, fmt.Errorf("lead times %d over %d periods: want at least 1 of each", h, span)
	}
	p := NewVarianceParts(h, span)
	for _, r := range results {
		if err := p.addSeries(r, end, mode, from); err != nil {
			return nil, err
		}
	}
	return p, nil
}

// addSeries adds one series' terms to p.
func (p *VarianceParts) addSeries(r *Result, end Period, mode BandMode, from BandSource) error {
	if r.Series.Next() != end {
		return fmt.Errorf("series %q ends in %s, not in %s with the others", r.Series.Name, r.Series.Next().Add(-1), end.Add(-1))
	}
	e := r.Residuals()
	m, c := finiteMean(e)
	var own []float64 // counted back from the last
	back := make([]int, 0, c)
	for k := len(e) - 1; k >= 0; k-- {
		if x := e[k]; isFinite(x) {
			t := len(r.Series.Values) - 1 - k
			if t >= p.N {
				return fmt.Errorf("series %q has errors %d periods back, beyond the %d the shocks are drawn over", r.Series.Name, t+1, p.N)
			}
			own = append(own, x-m)
			back = append(back, t)
		}
	}
	v, err := usableVariance(r, p.H, mode, from)
	if err != nil {
		return err
	}
	psi := append([]float64{1}, ImpulseWeights(r.Model, r.Series.Values, p.H)...)
	s2 := 0.0
	for _, x := range own {
		s2 += x * x
	}
	L := len(own)
	if L > 0 {
		s2 /= float64(L)
	}
	var ownSums [][]float64
	if L > 0 && L < p.N {
		if p.Own[L] == nil {
			p.Own[L] = make([][]float64, pairs(p.H))
			for i := range p.Own[L] {
				p.Own[L][i] = make([]float64, L)
			}
		}
		ownSums = p.Own[L]
	}
	for l := range p.H {
		k := errorScale([][]float64{v}, [][]float64{psi}, []float64{s2}, l)[0]
		if k == 0 && s2 == 0 {
			p.Indep[l] += v[l]
		}
		for j := 0; j <= l; j++ {
			cij := k * psi[j]
			if cij == 0 {
				continue
			}
			z := p.Z[l*(l+1)/2+j]
			for q, x := range own {
				z[back[q]] += cij * x
			}
			if ownSums != nil {
				o := ownSums[l*(l+1)/2+j]
				for q, x := range own {
					o[q] += cij * x
				}
			}
		}
	}
	return nil
}

// Add adds the parts of other series to p. It returns an error when the
// lead times or the periods differ.
func (p *VarianceParts) Add(o *VarianceParts) error {
	if p.H != o.H || p.N != o.N {
		return fmt.Errorf("parts of %d lead times over %d periods and of %d over %d do not add up", p.H, p.N, o.H, o.N)
	}
	for i, z := range o.Z {
		for t, x := range z {
			p.Z[i][t] += x
		}
	}
	for L, os := range o.Own {
		if p.Own[L] == nil {
			p.Own[L] = make([][]float64, len(os))
			for i := range os {
				p.Own[L][i] = make([]float64, L)
			}
		}
		for i, z := range os {
			for k, x := range z {
				p.Own[L][i][k] += x
			}
		}
	}
	for l, x := range o.Indep {
		p.Indep[l] += x
	}
	return nil
}

// Variance returns the variance of the sum at lead times 1..H (see
// VarianceParts).
func (p *VarianceParts) Variance() []float64 {
	out := make([]float64, p.H)
	n := float64(p.N)
	lens := slices.Sorted(func(yield func(int) bool) {
		for L := range p.Own {
			if !yield(L) {
				return
			}
		}
	})
	for l := range out {
		out[l] = p.Indep[l]
		for j := 0; j <= l; j++ {
			i := l*(l+1)/2 + j
			out[l] += partSquares(p.Z[i]) / n
			for _, L := range lens {
				out[l] += (n - float64(L)) / n / float64(L) * partSquares(p.Own[L][i])
			}
		}
	}
	return out
}

// Check returns an error when p is not well formed: lengths that do not
// match H and N (as a file read back may hold).
func (p *VarianceParts) Check() error {
	if p.H < 1 || p.N < 1 || len(p.Z) != pairs(p.H) || len(p.Indep) != p.H {
		return errors.New("variance parts: wrong number of lead times")
	}
	for _, z := range p.Z {
		if len(z) != p.N {
			return errors.New("variance parts: wrong number of periods")
		}
	}
	for L, os := range p.Own {
		if L < 1 || L >= p.N || len(os) != pairs(p.H) {
			return fmt.Errorf("variance parts: bad group of %d errors", L)
		}
		for _, z := range os {
			if len(z) != L {
				return fmt.Errorf("variance parts: bad group of %d errors", L)
			}
		}
	}
	return nil
}

func partSquares(z []float64) float64 {
	s := 0.0
	for _, x := range z {
		s += x * x
	}
	return s
}
