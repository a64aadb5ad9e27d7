package scenario

import (
	"errors"
	"fmt"
	"hash/fnv"
	"math"
	"math/rand/v2"
	"slices"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"forelay/forecast"
)

// Monte Carlo settings.
const (
	// DefaultPaths is the number of sample paths Simulate draws when
	// SimOptions.Paths is zero.
	DefaultPaths = 10000
	// MinPaths is the fewest paths Simulate accepts: with fewer, the P5 and
	// P95 quantiles rest on fewer than five paths each.
	MinPaths = 100
)

// Errors returned by Simulate.
var (
	// ErrTooFewPaths: SimOptions.Paths is below MinPaths.
	ErrTooFewPaths = errors.New("too few paths")
	// ErrNoResiduals: the baseline has no in-sample one-step errors to
	// resample (or, for normal errors, no finite mean squared error).
	ErrNoResiduals = errors.New("no in-sample errors to draw from")
)

// ErrorModel says how Simulate draws the one-step shocks of the baseline's
// forecast errors.
type ErrorModel int

// The error models. Bootstrap is the zero value and the default.
const (
	// Bootstrap draws each shock with replacement from the baseline's
	// in-sample one-step errors, centred (their mean taken out).
	Bootstrap ErrorModel = iota
	// Normal draws each shock from N(0, MSE), MSE being the baseline's
	// in-sample mean squared one-step error.
	Normal
)

var errorModelNames = [...]string{"bootstrap", "normal"}

// String returns bootstrap or normal, the words of the --errors flag.
func (m ErrorModel) String() string {
	if m < 0 || int(m) >= len(errorModelNames) {
		return fmt.Sprintf("ErrorModel(%d)", int(m))
	}
	return errorModelNames[m]
}

// ParseErrorModel reads bootstrap or normal (case ignored); "" gives
// Bootstrap. Any other word is an error.
func ParseErrorModel(s string) (ErrorModel, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "bootstrap":
		return Bootstrap, nil
	case "normal":
		return Normal, nil
	}
	return Bootstrap, fmt.Errorf("unknown error model %q (want bootstrap or normal)", s)
}

// SimOptions are the settings of a Monte Carlo run. The zero value draws
// DefaultPaths bootstrapped paths with seed 0.
type SimOptions struct {
	// Paths is the number of sample paths; zero means DefaultPaths, and
	// any other value below MinPaths is an error.
	Paths int
	// Seed seeds the random streams (math/rand/v2 PCG); every seed,
	// zero included, is valid. The same plan, options and seed give the
	// same paths, bit for bit.
	Seed uint64
	// Errors is how the forecast-error shocks are drawn.
	Errors ErrorModel
}

// A Simulation holds sample paths of the demand of every scenario of a
// plan. All scenarios share the same error paths and the same event draws
// (common random numbers), so differences between scenarios come from
// their events alone.
//
// # Error model
//
// Path i's demand in period h (h = 1..H) is the baseline forecast plus a
// forecast error e_h and the contributions of the events that occur on the
// path. The errors follow the fitted model's own propagation of a shock:
// with psi_j the model's impulse response (see ImpulseWeights) and eps_1,
// eps_2, ... independent one-step shocks,
//
//	e_h = k_h (eps_h + sum_{j=1}^{h−1} psi_j eps_{h−j}),
//
// the moving-average (psi-weight) form of the forecast error (Box, Jenkins
// & Reinsel, Time Series Analysis, ch. 5). The shocks come from the
// baseline's centred in-sample one-step errors, drawn with replacement
// (Bootstrap), or from N(0, MSE) (Normal); s2 is their variance (the mean
// of the squared centred errors, or the MSE). Each horizon is then
// rescaled by
//
//	k_h = sqrt(V_h / (s2 (1 + sum_{j=1}^{h−1} psi_j²))),
//
// V_h being the plan's BaselineVar, so that the variance of e_h is exactly
// the variance behind the plan's bands while the paths keep the model's
// correlation across horizons. With zero s2 or zero V_h the errors of that
// horizon are zero.
//
// The sums are not formed as written, which would cost O(H²) per path:
// every method of package forecast has an impulse response of the form
// psi_j = a_{j mod m} + b_{j mod m} φ_j (forecast.ShockForm), and each path
// runs forward through the matching recursion, O(m) operations per period
// (see errorFilter), the shocks drawn in the same order. A model whose
// response has no known form falls back to the sums.
//
// # Events
//
// Each future event of the plan is drawn once per path: it occurs with its
// Probability and, when it has a Range, its full size is drawn from the
// triangular distribution with minimum Range.Low, mode the effect and
// maximum Range.High (mean (low + effect + high)/3); without a Range the
// size is the effect. The event then adds size × its contribution per unit
// of effect (Event.Contribution at an effect of 1 unit or 1 percent), so
// ramps, paybacks, prorating and percent effects act as in the plan. Note
// that the plan's bands read a Range as a 90% normal interval, while the
// simulation takes its ends as the least and the most the event can be.
//
// # Random streams
//
// The shocks come from PCG(seed, 0) and each event's draws from its own
// stream PCG(seed, FNV-1a hash of its id), two uniform numbers per path
// (occurrence, then size) whether or not it occurs, so an event's draws do
// not change when other events are added, removed or given another
// probability.
type Simulation struct {
	// Plan is the plan simulated.
	Plan *Plan
	// Paths, Seed and Errors are the settings used.
	Paths  int
	Seed   uint64
	Errors ErrorModel
	// Pool is the number of in-sample errors the shocks are resampled
	// from (Bootstrap) and S2 the shocks' variance.
	Pool int
	S2   float64
	// Psi holds psi_1..psi_{H−1}: Psi[j−1] = psi_j, the weights the paths
	// follow (those of the recursion, equal to ImpulseWeights up to
	// rounding).
	Psi []float64
	// Scale holds k_1..k_H: Scale[h−1] = k_h.
	Scale []float64
	// Error[t][i] is path i's baseline forecast error in period t
	// (Plan.Periods[t]).
	Error [][]float64
	// Amount[k][i] is the full size drawn for Plan.Future[k] on path i,
	// in the effect's unit (units or percent), and 0 when the event does
	// not occur on that path.
	Amount [][]float64
	// Scenarios holds the paths of each of Plan.Scenarios, in order.
	Scenarios []*PathSet
}

// A PathSet is the simulated demand of one scenario.
type PathSet struct {
	// Name is the scenario's name.
	Name string
	// Demand[t][i] is path i's demand in period t.
	Demand [][]float64
	// Spread[t] is the mean and the quantiles of Demand[t].
	Spread []Spread
}

// summarise fills Spread from Demand; Spread must be allocated.
func (ps *PathSet) summarise() {
	if len(ps.Demand) == 0 {
		return
	}
	scratch := make([]float64, len(ps.Demand[0]))
	for t, row := range ps.Demand {
		copy(scratch, row)
		ps.Spread[t] = spreadOf(scratch)
	}
}

// Quantile returns the p-quantile (Quantile, definition 7) of the demand
// in period t. It panics if p is outside [0, 1] or t out of range.
func (ps *PathSet) Quantile(t int, p float64) float64 {
	return QuantileOf(slices.Clone(ps.Demand[t]), p)
}

// QuantileDemand returns the p-quantile of the demand in every period.
func (ps *PathSet) QuantileDemand(p float64) []float64 {
	out := make([]float64, len(ps.Demand))
	if len(out) == 0 {
		return out
	}
	scratch := make([]float64, len(ps.Demand[0]))
	for t, row := range ps.Demand {
		copy(scratch, row)
		out[t] = QuantileOf(scratch, p)
	}
	return out
}

// ErrorScales returns k_1..k_H for horizon variances v, shock variance s2
// and psi weights psi (at least len(v) − 1 of them):
//
//	k_h = sqrt(v_h / (s2 (1 + sum_{j=1}^{h−1} psi_j²))),
//
// and 0 where v_h or s2 is 0. It returns an error for a negative or
// non-finite v_h or s2.
func ErrorScales(v []float64, s2 float64, psi []float64) ([]float64, error) {
	if math.IsNaN(s2) || math.IsInf(s2, 0) || s2 < 0 {
		return nil, fmt.Errorf("%w: shock variance %v", ErrNoResiduals, s2)
	}
	k := make([]float64, len(v))
	sum := 1.0
	for h := range v {
		if h > 0 {
			sum += psi[h-1] * psi[h-1]
		}
		if math.IsNaN(v[h]) || math.IsInf(v[h], 0) || v[h] < 0 {
			return nil, fmt.Errorf("the baseline has no usable error variance at horizon %d (%v)", h+1, v[h])
		}
		if v[h] == 0 || s2 == 0 {
			continue
		}
		k[h] = math.Sqrt(v[h] / (s2 * sum))
	}
	return k, nil
}

// shockPool returns the centred in-sample one-step errors (NaN dropped)
// and their variance, the mean of their squares.
func shockPool(res []float64) (pool []float64, s2 float64) {
	for _, r := range res {
		if !math.IsNaN(r) && !math.IsInf(r, 0) {
			pool = append(pool, r)
		}
	}
	if len(pool) == 0 {
		return nil, math.NaN()
	}
	m := mean(pool)
	for i := range pool {
		pool[i] -= m
		s2 += pool[i] * pool[i]
	}
	return pool, s2 / float64(len(pool))
}

// unitShape returns an event's contribution per unit of its effect (1 unit,
// or 1 percent) in each period of the baseline.
func unitShape(e *Event, first forecast.Period, baseline []float64) []float64 {
	u := *e
	if u.Effect.IsPercent {
		u.Effect = Effect{Percent: 1, IsPercent: true}
	} else {
		u.Effect = Effect{Units: 1}
	}
	return u.Contribution(first, baseline)
}

// eventStream returns the seed stream of an event: the FNV-1a hash of its
// id, never 0 (the shocks' stream).
func eventStream(id string) uint64 {
	h := fnv.New64a()
	h.Write([]byte(id))
	if s := h.Sum64(); s != 0 {
		return s
	}
	return 1
}

// matrix returns rows slices of n values each, backed by one array.
func matrix(rows, n int) [][]float64 {
	back := make([]float64, rows*n)
	m := make([][]float64, rows)
	for t := range m {
		m[t] = back[t*n : (t+1)*n : (t+1)*n]
	}
	return m
}

// Simulate draws sample paths of every scenario of p (see Simulation for
// the model). It returns an error wrapping ErrTooFewPaths when opt.Paths
// is below MinPaths (and not zero), ErrNoResiduals when there are no
// in-sample errors to draw from, and an error when the plan's baseline
// variance is not finite. It panics if p has no periods.
//
// The cost grows linearly with the number of paths and with the horizon,
// and so does the memory: 8 × Paths × (H × (1 + scenarios) + events)
// bytes for the error, demand and event draws of every path.
func Simulate(p *Plan, opt SimOptions) (*Simulation, error) {
	n := opt.Paths
	if n == 0 {
		n = DefaultPaths
	}
	if n < MinPaths {
		return nil, fmt.Errorf("%w: %d paths asked for, at least %d are needed", ErrTooFewPaths, n, MinPaths)
	}
	H := len(p.Periods)
	if H == 0 {
		panic("scenario: Simulate on a plan without periods")
	}
	s := &Simulation{Plan: p, Paths: n, Seed: opt.Seed, Errors: opt.Errors}
	pool, err := s.shocks()
	if err != nil {
		return nil, err
	}
	var resp *shockResponse
	resp, s.Psi = modelResponse(p.Fit.Model, p.Cleaned, H)
	if s.Scale, err = ErrorScales(p.BaselineVar, s.S2, s.Psi); err != nil {
		return nil, err
	}

	s.Error = matrix(H, n)
	s.drawErrors(pool, resp)
	s.Amount = matrix(len(p.Future), n)
	for k, e := range p.Future {
		drawEvent(e, opt.Seed, s.Amount[k])
	}
	first := p.Periods[0]
	shapes := make([][]float64, len(p.Future))
	for k, e := range p.Future {
		shapes[k] = unitShape(e, first, p.Baseline)
	}
	for i := range p.Scenarios {
		s.Scenarios = append(s.Scenarios, s.scenarioPaths(&p.Scenarios[i], shapes))
	}
	return s, nil
}

// shocks sets S2 (and Pool) for the error model and returns the pool of
// centred in-sample errors to resample (nil for normal shocks).
func (s *Simulation) shocks() ([]float64, error) {
	p := s.Plan
	if s.Errors == Normal {
		s.S2 = p.Fit.Accuracy.MSE
		if math.IsNaN(s.S2) || math.IsInf(s.S2, 0) || s.S2 < 0 {
			return nil, fmt.Errorf("%w: the baseline's mean squared error is %v", ErrNoResiduals, s.S2)
		}
		return nil, nil
	}
	pool, s2 := shockPool(p.Fit.Residuals())
	if len(pool) == 0 {
		return nil, fmt.Errorf("%w: the baseline made no one-step prediction over the history", ErrNoResiduals)
	}
	s.S2, s.Pool = s2, len(pool)
	return pool, nil
}

// scenarioPaths returns the demand paths of scenario sp: the baseline,
// the error paths and the draws of the scenario's events times their
// contributions per unit (shapes, by event of p.Future), raised to the
// plan's floor where they fall below it, summarised.
func (s *Simulation) scenarioPaths(sp *ScenarioPlan, shapes [][]float64) *PathSet {
	p := s.Plan
	H := len(p.Periods)
	ps := &PathSet{Name: sp.Name, Demand: matrix(H, s.Paths), Spread: make([]Spread, H)}
	for t, row := range ps.Demand {
		b, e := p.Baseline[t], s.Error[t]
		for i := range row {
			row[i] = b + e[i]
		}
	}
	for k, e := range p.Future {
		if !slices.Contains(sp.Events, e) {
			continue
		}
		amt := s.Amount[k]
		for t, u := range shapes[k] {
			if u == 0 {
				continue
			}
			row := ps.Demand[t]
			for i, a := range amt {
				row[i] += a * u
			}
		}
	}
	if p.Floor != nil {
		floorPaths(ps.Demand, *p.Floor)
	}
	ps.summarise()
	return ps
}

// floorPaths raises every path value below floor to it: simulated demand,
// like the plan, never goes below the floor (see Bands.Floor).
func floorPaths(demand [][]float64, floor float64) {
	for _, row := range demand {
		for i, v := range row {
			if v < floor {
				row[i] = floor
			}
		}
	}
}

// drawErrors fills s.Error path by path: each period's shock is drawn and
// run through the model's error recursion (resp), then rescaled. Without
// a recursion (a model whose response has no known form) the psi-weighted
// sums are formed directly, which costs O(H²) per path.
func (s *Simulation) drawErrors(pool []float64, resp *shockResponse) {
	H, n := len(s.Error), s.Paths
	r := rand.New(rand.NewPCG(s.Seed, 0))
	sd := math.Sqrt(s.S2)
	draw := func() float64 { return pool[r.IntN(len(pool))] }
	if s.Errors == Normal {
		draw = func() float64 { return sd * r.NormFloat64() }
	}
	if resp == nil {
		s.convolveErrors(draw)
		return
	}
	// Paths go by blocks of pathBlock, through a buffer with one row of the
	// block's paths per period, so that s.Error is written row by row.
	f := newErrorFilter(resp)
	buf := make([]float64, H*pathBlock)
	for i0 := 0; i0 < n; i0 += pathBlock {
		B := min(pathBlock, n-i0)
		for b := range B {
			f.reset()
			for t := 0; t < H; t++ {
				buf[t*pathBlock+b] = s.Scale[t] * f.next(draw())
			}
		}
		for t, row := range s.Error {
			copy(row[i0:i0+B], buf[t*pathBlock:t*pathBlock+B])
		}
	}
}

// pathBlock is the number of paths drawErrors runs before writing them.
const pathBlock = 32

// convolveErrors fills s.Error with the psi-weighted sums of the shocks
// that draw gives, H per path in period order.
func (s *Simulation) convolveErrors(draw func() float64) {
	H, n := len(s.Error), s.Paths
	// Only the non-zero weights cost time.
	var lags []int
	for j, w := range s.Psi {
		if w != 0 {
			lags = append(lags, j+1)
		}
	}
	eps := make([]float64, H)
	for i := 0; i < n; i++ {
		for t := range eps {
			eps[t] = draw()
		}
		for t := 0; t < H; t++ {
			v := eps[t]
			for _, j := range lags {
				if j > t {
					break
				}
				v += s.Psi[j-1] * eps[t-j]
			}
			s.Error[t][i] = s.Scale[t] * v
		}
	}
}

// drawEvent fills amt with event e's size on each path (0 where it does
// not occur), from the event's own stream.
func drawEvent(e *Event, seed uint64, amt []float64) {
	r := rand.New(rand.NewPCG(seed, eventStream(e.ID)))
	effect := e.Effect.Value()
	var tri *distuv.Triangle
	if rg := e.Range; rg != nil && rg.Low < rg.High {
		t := distuv.NewTriangle(rg.Low, rg.High, math.Min(math.Max(effect, rg.Low), rg.High), nil)
		tri = &t
	}
	for i := range amt {
		occ, u := r.Float64(), r.Float64()
		if occ >= e.Probability {
			amt[i] = 0
			continue
		}
		if tri != nil {
			amt[i] = tri.Quantile(u)
		} else {
			amt[i] = effect
		}
	}
}
