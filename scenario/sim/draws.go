package sim

import (
	"math"
	"math/rand/v2"

	"forelay/scenario"

	"gonum.org/v1/gonum/stat/distuv"
)

// draws holds what every block of a simulation is drawn with; workers
// share it and only read it.
type draws struct {
	s      *Simulation
	key    string         // the series name, key of the shock streams
	pool   []float64      // centred in-sample errors (Bootstrap)
	sd     float64        // sqrt(S2) (Normal)
	resp   *shockResponse // the error recursion, nil for the sums
	lags   []int          // the lags of the non-zero psi weights (sums)
	events []eventDraw    // by event of Plan.Future
}

// An eventDraw is how one event's occurrence and size are drawn.
type eventDraw struct {
	id     string
	prob   float64
	effect float64
	tri    *distuv.Triangle // the size's distribution; nil: always effect
}

// newDraws prepares the drawing of s's blocks: pool is the shock pool of
// Bootstrap, resp the model's error recursion (nil: the direct sums).
func (s *Simulation) newDraws(pool []float64, resp *shockResponse) *draws {
	d := &draws{s: s, key: s.Plan.History.Name, pool: pool, sd: math.Sqrt(s.S2), resp: resp}
	if resp == nil {
		// Only the non-zero weights cost time.
		for j, w := range s.Psi {
			if w != 0 {
				d.lags = append(d.lags, j+1)
			}
		}
	}
	for _, e := range s.Plan.Future {
		d.events = append(d.events, newEventDraw(e))
	}
	return d
}

// newEventDraw returns how event e is drawn: its probability, and its
// size from the triangular distribution over its range, or its effect.
func newEventDraw(e *scenario.Event) eventDraw {
	ed := eventDraw{id: e.ID, prob: e.Probability, effect: e.Effect.Value()}
	if rg := e.Range; rg != nil && rg.Low < rg.High {
		t := distuv.NewTriangle(rg.Low, rg.High, math.Min(math.Max(ed.effect, rg.Low), rg.High), nil)
		ed.tri = &t
	}
	return ed
}

// pathChunk is the number of paths a blockWorker runs through the error
// recursion before writing them to Simulation.Error, a row per period.
const pathChunk = 32

// A blockWorker draws whole blocks of paths with its own generator and
// scratch space; one goroutine uses it.
type blockWorker struct {
	*draws
	rng *blockRand
	f   *laneFilter
	buf []float64 // H × pathChunk: the chunk's shocks, then errors
	eps []float64 // one path's shocks (sums)
}

// worker returns a new blockWorker.
func (d *draws) worker() *blockWorker {
	H := len(d.s.Error)
	w := &blockWorker{draws: d, rng: newBlockRand(d.s.Seed)}
	if d.resp != nil {
		w.f = newLaneFilter(d.resp, pathChunk)
		w.buf = make([]float64, H*pathChunk)
	} else {
		w.eps = make([]float64, H)
	}
	return w
}

// block draws the paths of block b, StreamBlock × b up to the next block
// or the last path: their errors from the block's shock stream and each
// event's draws from the block's stream of that event.
func (w *blockWorker) block(b int) {
	i0 := b * StreamBlock
	i1 := min(i0+StreamBlock, w.s.Paths)
	r := w.rng.at(shockStream, w.key, b)
	if w.f != nil {
		w.filterErrors(r, i0, i1)
	} else {
		w.convolveErrors(r, i0, i1)
	}
	for k, e := range w.events {
		e.draw(w.rng.at(eventStream, e.id, b), w.s.Amount[k][i0:i1])
	}
}

// shock draws one shock from r: a resampled in-sample error, or a normal
// draw for the Normal error model.
func (w *blockWorker) shock(r *rand.Rand) float64 {
	if w.s.Errors == Normal {
		return w.sd * r.NormFloat64()
	}
	return w.pool[r.IntN(len(w.pool))]
}

// filterErrors fills the errors of paths i0..i1−1, by chunks of
// pathChunk paths: the chunk's shocks are drawn from r path by path, each
// path's periods in order, into buf; the chunk runs through the model's
// error recursion side by side (laneFilter), and the errors, rescaled,
// are written to Simulation.Error row by row.
func (w *blockWorker) filterErrors(r *rand.Rand, i0, i1 int) {
	s, buf := w.s, w.buf
	for c0 := i0; c0 < i1; c0 += pathChunk {
		B := min(pathChunk, i1-c0)
		for b := range B {
			for t := range s.Scale {
				buf[t*pathChunk+b] = w.shock(r)
			}
		}
		w.f.run(buf, B)
		for t, row := range s.Error {
			k, u := s.Scale[t], buf[t*pathChunk:t*pathChunk+B]
			for i, v := range u {
				row[c0+i] = k * v
			}
		}
	}
}

// convolveErrors fills the errors of paths i0..i1−1 with the psi-weighted
// sums of shocks drawn from r, H per path in period order; this costs
// O(H²) per path and serves models whose response has no known form.
func (w *blockWorker) convolveErrors(r *rand.Rand, i0, i1 int) {
	s, eps := w.s, w.eps
	for i := i0; i < i1; i++ {
		for t := range eps {
			eps[t] = w.shock(r)
		}
		for t := range eps {
			v := eps[t]
			for _, j := range w.lags {
				if j > t {
					break
				}
				v += s.Psi[j-1] * eps[t-j]
			}
			s.Error[t][i] = s.Scale[t] * v
		}
	}
}

// draw fills amt with the event's size on each path of a block (0 where
// it does not occur) from r, the block's stream of the event: two uniform
// numbers per path, occurrence then size, whether or not it occurs.
func (e *eventDraw) draw(r *rand.Rand, amt []float64) {
	for i := range amt {
		occ, u := r.Float64(), r.Float64()
		amt[i] = e.size(occ, u)
	}
}

// size returns the event's size for the uniform numbers occ (occurrence)
// and u (size): 0 when occ >= the probability, else the u-quantile of
// the size's distribution (the effect without a range).
func (e *eventDraw) size(occ, u float64) float64 {
	switch {
	case occ >= e.prob:
		return 0
	case e.tri != nil:
		return e.tri.Quantile(u)
	}
	return e.effect
}
