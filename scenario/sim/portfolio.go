package sim

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"forelay/scenario"
	"forelay/scenario/plan"
)

// ErrPortfolioNormal is returned by SimulatePortfolio for the Normal error
// model: drawing each series' shocks from its own normal distribution would
// lose the correlation of the series' errors, which the portfolio keeps by
// resampling whole historical periods.
var ErrPortfolioNormal = errors.New("normal errors draw every series on its own and lose the series' correlation; a portfolio resamples whole historical periods (use --errors bootstrap)")

// portfolioChunks is the most groups of series SimulatePortfolio splits a
// portfolio into: each group's part of every sum is added up on its own,
// then the groups' parts in group order, so the sums do not depend on the
// number of workers. It is part of the definition of the sums' rounding,
// so it is a constant.
const portfolioChunks = 64

// A Sum is a weighted sum of a portfolio's series that SimulatePortfolio
// follows path by path: the total (every series, weight 1) or the load of
// a resource (its series, weight its use per unit of demand).
type Sum struct {
	// Name names the sum (TotalSum, or a resource's id).
	Name string
	// Members are indexes into Portfolio.Plans and Weights their weights,
	// one per member.
	Members []int
	Weights []float64
}

// TotalSum is the name of the sum of every series (the id no resource
// takes, scenario.TotalResource).
const TotalSum = scenario.TotalResource

// TotalOf returns the sum of every series of pf with weight 1.
func TotalOf(pf *plan.Portfolio) Sum {
	s := Sum{Name: TotalSum, Members: make([]int, len(pf.Plans)), Weights: make([]float64, len(pf.Plans))}
	for i := range s.Members {
		s.Members[i], s.Weights[i] = i, 1
	}
	return s
}

// A PortfolioSimulation holds sample paths of weighted sums of a
// portfolio's series (the total, the loads of its resources) under every
// scenario. Like Simulation, the scenarios share the error paths and the
// event draws.
//
// # Error model
//
// Each series' forecast errors follow its own model as in Simulation
// (psi weights, rescaled per horizon to the series' band variance
// BaselineVar), but the shocks of all the series are drawn together: on
// each path and in each period one historical period is drawn, uniformly
// with replacement, and every series takes its own centred one-step error
// of that period as its shock. This is the residual bootstrap applied to
// whole vectors of residuals (common practice for several series), so the
// paths carry the series' correlation without a covariance matrix: two
// series with the same errors add up to twice the spread of one, two
// series with uncorrelated errors to the square root of two times.
//
// The series end in the same period but may start apart. A series' errors
// are those of its last N_s periods with a finite one-step error (its
// window, counted back from the end), centred; s2 is their mean square.
// The period drawn is a lag j back from the end, uniform over the N_max
// periods the longest selected history covers (Portfolio.Span: fixed by
// the file, not by the series of the run), with a second uniform number
// v: a series whose
// window holds lag j takes that period's error, and a shorter one takes
// the error at lag floor(v N_s) of its own window. Each series thus
// resamples its own errors uniformly, and any two series share the
// period drawn whenever it lies in both windows: the correlation is kept
// over the periods they have in common, and a short series does not cut
// the errors of the others down to its own. A series without a baseline
// (a new series) has no error: its paths are its events.
//
// # Events
//
// Each event is drawn once per path, for every series it moves: the
// uniform numbers of its occurrence and size come from the event's own
// stream, so the event happens on the same paths for all of them, and
// each series takes the size at the same quantile of its own share's
// triangular range (comonotone shares). Each series' demand is raised to
// its floor before it is added to a sum, as the plan's series are.
//
// # Random streams
//
// Paths come in blocks of StreamBlock as in Simulation. The periods drawn
// in block b come from the stream ("period", "", b): for each path in
// order and each of its periods in order, the lag j (an IntN over N_max)
// then the uniform v; the draws of each event come from ("event", its id,
// b), two uniform numbers per path as in Simulation. So the random
// numbers depend on the seed, the path and the event only, and the lags
// drawn on N_max, which the file fixes: a series' paths do not depend on
// which other series of the file are in the run.
type PortfolioSimulation struct {
	// Portfolio is the portfolio simulated.
	Portfolio *plan.Portfolio
	// Paths and Seed are the settings used.
	Paths int
	Seed  uint64
	// Window is N_max, the number of periods the lags are drawn over:
	// Portfolio.Span, the reach of the longest history history.series
	// selects (or the longest window of errors, if longer), and Fitted
	// the number of series with a baseline, whose errors are drawn; both
	// zero when no series has a baseline.
	Window, Fitted int
	// Sums are the sums followed, in the order given.
	Sums []Sum
	// Scenarios[k][j] holds the paths of Sums[j] under scenario k (in
	// the order of the plans' Scenarios).
	Scenarios [][]*PathSet
}

// seriesDraw is what one series adds to the sums: its errors' recursion
// and scales, its events' draws and shapes, and its sums.
type seriesDraw struct {
	plan   *plan.Plan
	col    []float64      // its centred errors by lag back from the end; nil: no errors
	resp   *shockResponse // nil: the direct sums with psi
	psi    []float64
	lags   []int
	scale  []float64
	events []eventDraw // by event of Plan.Future
	global []int       // index of each event in the run's event list
	shapes [][]float64 // contribution per unit of each event
	in     [][]bool    // in[k][q]: scenario k has event q
	sums   []int       // the sums it is a member of
	weight []float64   // its weight in each
}

// SimulatePortfolio draws sample paths of the sums of pf's series under
// every scenario (see PortfolioSimulation for the model and the streams).
// It returns an error wrapping ErrTooFewPaths for too few paths,
// ErrPortfolioNormal for the Normal error model, and an error naming the
// series when a series with a baseline has no finite one-step error at
// the end of its history or a band variance that is not finite. It panics
// if pf has no plans.
//
// Memory does not grow with the number of series times paths: each block
// of paths is drawn series by series and only the sums are kept, 8 ×
// Paths × H × scenarios × sums bytes, plus 8 × StreamBlock × H ×
// scenarios × sums bytes per group of series (at most portfolioChunks).
// The groups of one block are drawn by opt.Workers goroutines; the result
// does not depend on their number.
func SimulatePortfolio(pf *plan.Portfolio, sums []Sum, opt SimOptions) (*PortfolioSimulation, error) {
	n := opt.Paths
	if n == 0 {
		n = DefaultPaths
	}
	if n < MinPaths {
		return nil, fmt.Errorf("%w: %d paths asked for, at least %d are needed", ErrTooFewPaths, n, MinPaths)
	}
	if opt.Errors == Normal {
		return nil, ErrPortfolioNormal
	}
	if len(pf.Plans) == 0 {
		panic("sim: SimulatePortfolio on a portfolio without plans")
	}
	ps := &PortfolioSimulation{Portfolio: pf, Paths: n, Seed: opt.Seed, Sums: sums}
	ids, draws, err := ps.prepare(opt.Workers)
	if err != nil {
		return nil, err
	}
	H := len(pf.Plans[0].Periods)
	K := len(pf.Plans[0].Scenarios)
	ps.Scenarios = make([][]*PathSet, K)
	for k := range K {
		for _, s := range sums {
			ps.Scenarios[k] = append(ps.Scenarios[k], &PathSet{Name: s.Name, Demand: matrix(H, n), Spread: make([]Spread, H)})
		}
	}
	run := &portfolioRun{ps: ps, draws: draws, ids: ids, H: H, K: K, tick: opt.Progress.Counter((n + StreamBlock - 1) / StreamBlock)}
	run.draw(opt.Workers)
	var all []*PathSet
	for _, row := range ps.Scenarios {
		all = append(all, row...)
	}
	inParallel(opt.Workers, len(all)*H, func() func(int) {
		scratch := make([]float64, n)
		return func(j int) {
			set, t := all[j/H], j%H
			copy(scratch, set.Demand[t])
			set.Spread[t] = spreadOf(scratch)
		}
	})
	return ps, nil
}

// prepare aligns the series' errors and works out each series' draw; it
// returns the ids of the events of the run, in the order of the file.
func (ps *PortfolioSimulation) prepare(workers int) ([]string, []seriesDraw, error) {
	pf := ps.Portfolio
	cols := make([][]float64, len(pf.Plans))
	for i, p := range pf.Plans {
		if p.Fit == nil {
			continue
		}
		cols[i] = errorWindow(p.Fit.Residuals())
		if len(cols[i]) == 0 {
			return nil, nil, fmt.Errorf("series %q: %w: the baseline made no one-step prediction in the last period of the history", p.History.Name, ErrNoResiduals)
		}
		ps.Window = max(ps.Window, len(cols[i]))
		ps.Fitted++
	}
	if ps.Fitted > 0 {
		ps.Window = max(ps.Window, pf.Span)
	}
	var ids []string
	index := map[string]int{}
	for _, p := range pf.Plans {
		for _, e := range p.Future {
			if _, ok := index[e.ID]; !ok {
				index[e.ID] = len(ids)
				ids = append(ids, e.ID)
			}
		}
	}
	order := map[string]int{}
	for i, e := range pf.File.Events {
		order[e.ID] = i
	}
	slices.SortStableFunc(ids, func(a, b string) int { return order[a] - order[b] })
	for i, id := range ids {
		index[id] = i
	}
	draws := make([]seriesDraw, len(pf.Plans))
	for j, s := range ps.Sums {
		for m, i := range s.Members {
			draws[i].sums = append(draws[i].sums, j)
			draws[i].weight = append(draws[i].weight, s.Weights[m])
		}
	}
	errs := make([]error, len(pf.Plans))
	inParallel(workers, len(pf.Plans), func() func(int) {
		return func(i int) {
			errs[i] = draws[i].prepare(pf.Plans[i], cols[i], index)
		}
	})
	for i, err := range errs {
		if err != nil {
			return nil, nil, fmt.Errorf("series %q: %w", pf.Plans[i].History.Name, err)
		}
	}
	return ids, draws, nil
}

// prepare works out the draw of plan p, whose centred errors by lag back
// from the end are col (nil without a baseline); index numbers the run's
// events.
func (d *seriesDraw) prepare(p *plan.Plan, col []float64, index map[string]int) error {
	H := len(p.Periods)
	d.plan = p
	if col != nil {
		s2 := 0.0
		for _, x := range col {
			s2 += x * x
		}
		s2 /= float64(len(col))
		d.resp, d.psi = modelResponse(p.Fit.Model, p.Cleaned, H)
		var err error
		if d.scale, err = ErrorScales(p.BaselineVar, s2, d.psi); err != nil {
			return err
		}
		d.col = col
		if d.resp == nil {
			for j, w := range d.psi {
				if w != 0 {
					d.lags = append(d.lags, j+1)
				}
			}
		}
	}
	first := p.Periods[0]
	for _, e := range p.Future {
		d.events = append(d.events, newEventDraw(e))
		d.global = append(d.global, index[e.ID])
		d.shapes = append(d.shapes, unitShape(e, first, p.Baseline))
	}
	d.in = make([][]bool, len(p.Scenarios))
	for k := range p.Scenarios {
		d.in[k] = make([]bool, len(p.Future))
		for q, e := range p.Future {
			d.in[k][q] = slices.Contains(p.Scenarios[k].Events, e)
		}
	}
	return nil
}

// errorWindow returns the one-step errors res from the last one back to
// the first of the finite run that ends the history, by lag (out[0] is
// the last period's), less their mean.
func errorWindow(res []float64) []float64 {
	var out []float64
	for i := len(res) - 1; i >= 0; i-- {
		if math.IsNaN(res[i]) || math.IsInf(res[i], 0) {
			break
		}
		out = append(out, res[i])
	}
	if len(out) == 0 {
		return nil
	}
	m := 0.0
	for _, x := range out {
		m += x
	}
	m /= float64(len(out))
	for i := range out {
		out[i] -= m
	}
	return out
}

// A portfolioRun draws the blocks of a PortfolioSimulation one after
// another, the groups of series of each block side by side.
type portfolioRun struct {
	ps    *PortfolioSimulation
	draws []seriesDraw
	ids   []string
	H, K  int
	tick  func() // after each block of paths
	// The block being drawn: the lag j and the uniform v of each path and
	// period (path-major), and each event's two uniform numbers per path.
	lag      []int
	spare    []float64
	occ, siz [][]float64
	// part[c] is group c's part of every sum: scenario k, sum j, period t,
	// path i at ((k*len(Sums)+j)*H+t)*StreamBlock + i.
	part [][]float64
}

// draw fills the path sets block by block.
func (r *portfolioRun) draw(workers int) {
	ps := r.ps
	nSeries := len(r.draws)
	chunks := min(portfolioChunks, nSeries)
	J := len(ps.Sums)
	r.part = make([][]float64, chunks)
	for c := range r.part {
		r.part[c] = make([]float64, r.K*J*r.H*StreamBlock)
	}
	r.lag, r.spare = make([]int, StreamBlock*r.H), make([]float64, StreamBlock*r.H)
	r.occ, r.siz = matrix(len(r.ids), StreamBlock), matrix(len(r.ids), StreamBlock)
	rng := newBlockRand(ps.Seed)
	for b := 0; b*StreamBlock < ps.Paths; b++ {
		i0 := b * StreamBlock
		B := min(StreamBlock, ps.Paths-i0)
		if ps.Window > 0 {
			g := rng.at(periodStream, "", b)
			for i := range B * r.H {
				r.lag[i], r.spare[i] = g.IntN(ps.Window), g.Float64()
			}
		}
		for q, id := range r.ids {
			g := rng.at(eventStream, id, b)
			for i := range B {
				r.occ[q][i], r.siz[q][i] = g.Float64(), g.Float64()
			}
		}
		inParallel(workers, chunks, func() func(int) {
			w := newSeriesWorker(r)
			return func(c int) {
				part := r.part[c]
				clear(part)
				for s := c * nSeries / chunks; s < (c+1)*nSeries/chunks; s++ {
					w.add(&r.draws[s], part, B)
				}
			}
		})
		for k, row := range ps.Scenarios {
			for j, set := range row {
				for t, dem := range set.Demand {
					out := dem[i0 : i0+B]
					off := ((k*J+j)*r.H + t) * StreamBlock
					copy(out, r.part[0][off:off+B])
					for c := 1; c < chunks; c++ {
						for i, v := range r.part[c][off : off+B] {
							out[i] += v
						}
					}
				}
			}
		}
		r.tick()
	}
}

// A seriesWorker adds series to a group's part of the sums, with its own
// scratch space; one goroutine uses it.
type seriesWorker struct {
	r   *portfolioRun
	f   *laneFilter
	buf []float64   // H × pathChunk: shocks, then unscaled errors
	eps []float64   // one path's shocks (direct sums)
	err []float64   // H × pathChunk: the scaled errors
	amt [][]float64 // by event of the series: size on each path of the chunk
	dem []float64   // one period's demand on the chunk's paths
}

func newSeriesWorker(r *portfolioRun) *seriesWorker {
	return &seriesWorker{r: r, buf: make([]float64, r.H*pathChunk), eps: make([]float64, r.H),
		err: make([]float64, r.H*pathChunk), dem: make([]float64, pathChunk)}
}

// add adds series d's demand on the block's first B paths, times its
// weights, to the sums in part.
func (w *seriesWorker) add(d *seriesDraw, part []float64, B int) {
	r := w.r
	H, J := r.H, len(r.ps.Sums)
	if len(d.sums) == 0 {
		return
	}
	for len(w.amt) < len(d.events) {
		w.amt = append(w.amt, make([]float64, pathChunk))
	}
	p := d.plan
	for c0 := 0; c0 < B; c0 += pathChunk {
		L := min(pathChunk, B-c0)
		w.errors(d, c0, L)
		for q, e := range d.events {
			g := d.global[q]
			for i := range L {
				w.amt[q][i] = e.size(r.occ[g][c0+i], r.siz[g][c0+i])
			}
		}
		for k := range r.K {
			for t := range H {
				dem := w.dem[:L]
				base, e := p.Baseline[t], w.err[t*pathChunk:t*pathChunk+L]
				for i := range dem {
					dem[i] = base + e[i]
				}
				for q := range d.events {
					if u := d.shapes[q][t]; d.in[k][q] && u != 0 {
						for i, a := range w.amt[q][:L] {
							dem[i] += a * u
						}
					}
				}
				if p.Floor != nil {
					floorRow(dem, *p.Floor)
				}
				for m, j := range d.sums {
					wt := d.weight[m]
					off := ((k*J+j)*H+t)*StreamBlock + c0
					out := part[off : off+L]
					for i, v := range dem {
						out[i] += wt * v
					}
				}
			}
		}
	}
}

// errors fills w.err with series d's scaled errors on the L paths of the
// block from path c0: zero without a baseline.
func (w *seriesWorker) errors(d *seriesDraw, c0, L int) {
	r := w.r
	if d.col == nil {
		clear(w.err)
		return
	}
	buf := w.buf
	if d.resp != nil {
		for i := range L {
			for t := range r.H {
				buf[t*pathChunk+i] = d.shock(r, (c0+i)*r.H+t)
			}
		}
		if w.f == nil || w.f.r.m < d.resp.m {
			w.f = newLaneFilter(d.resp, pathChunk)
		}
		w.f.r = d.resp
		w.f.run(buf, L)
		for t, k := range d.scale {
			for i := range L {
				w.err[t*pathChunk+i] = k * buf[t*pathChunk+i]
			}
		}
		return
	}
	for i := range L {
		for t := range w.eps {
			w.eps[t] = d.shock(r, (c0+i)*r.H+t)
		}
		for t := range w.eps {
			v := w.eps[t]
			for _, j := range d.lags {
				if j > t {
					break
				}
				v += d.psi[j-1] * w.eps[t-j]
			}
			w.err[t*pathChunk+i] = d.scale[t] * v
		}
	}
}

// shock returns the series' shock for draw k of the block: its error at
// the lag drawn when its window holds it, else at lag floor(v N_s).
func (d *seriesDraw) shock(r *portfolioRun, k int) float64 {
	if j := r.lag[k]; j < len(d.col) {
		return d.col[j]
	}
	return d.col[int(r.spare[k]*float64(len(d.col)))]
}
