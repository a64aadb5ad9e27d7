package sim

import (
	"errors"
	"fmt"
	"forelay/scenario"
	"forelay/scenario/plan"
	"math"
	"slices"
	"strings"

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
	// Seed seeds the random streams (math/rand/v2 PCG, one stream per
	// block of StreamBlock paths; see Simulation); every seed, zero
	// included, is valid. The same plan, options and seed give the same
	// paths, bit for bit.
	Seed uint64
	// Errors is how the forecast-error shocks are drawn.
	Errors ErrorModel
	// Workers is the number of goroutines that draw the blocks of paths
	// and summarise the periods; zero (or less) means one per core
	// (GOMAXPROCS). The results are the same, bit for bit, whatever the
	// number of workers.
	Workers int
	// Progress, when not nil, is told of each block of StreamBlock paths
	// drawn (see forecast.Progress); it does not change the paths.
	Progress forecast.Progress
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
// (see errorFilter; laneFilter runs 32 paths side by side), the shocks
// drawn in the same order. A model whose response has no known form falls
// back to the sums.
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
// The paths are split into blocks of StreamBlock (1,024) paths: path i is
// in block i / StreamBlock. Every block has its own streams, math/rand/v2
// PCG generators seeded with (seed, streamID(kind, key, block)), streamID
// being the 64-bit FNV-1a hash of kind + "\x00" + key + "\x00" + the block
// index in decimal:
//
//   - the shocks of block b come from the stream ("shock", series, b),
//     series being the name of the history series (Plan.History.Name), H
//     draws per path, the paths in order and each path's periods in order;
//   - the draws of each event in block b come from the stream ("event",
//     its id, b), two uniform numbers per path (occurrence, then size)
//     whether or not it occurs.
//
// So path i's numbers depend only on the seed, the series name, the block
// of i and i's place in it (and, for an event's draws, the event's id):
// not on the number of paths that follow, on the other events (adding,
// removing or reweighting one leaves the others' draws as they were), nor
// on the number of workers. A run of N paths gives the first N paths of a
// run of more paths with the same seed, and the blocks can be drawn apart
// and put together.
type Simulation struct {
	// Plan is the plan simulated.
	Plan *plan.Plan
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
// NewPathSet returns the path set of demand (demand[t][i]: period t of
// path i) with its spread per period worked out, as Simulate makes them.
func NewPathSet(name string, demand [][]float64) *PathSet {
	ps := &PathSet{Name: name, Demand: demand, Spread: make([]Spread, len(demand))}
	ps.summarise()
	return ps
}

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
func unitShape(e *scenario.Event, first forecast.Period, baseline []float64) []float64 {
	u := *e
	if u.Effect.IsPercent {
		u.Effect = scenario.Effect{Percent: 1, IsPercent: true}
	} else {
		u.Effect = scenario.Effect{Units: 1}
	}
	return u.Contribution(first, baseline)
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
// the model and the random streams). It returns an error wrapping
// ErrTooFewPaths when opt.Paths is below MinPaths (and not zero),
// ErrNoResiduals when there are no in-sample errors to draw from, and an
// error when the plan's baseline variance is not finite. It panics if p
// has no periods.
//
// The blocks of paths are drawn, and then the periods of every scenario
// summarised, by opt.Workers goroutines, each writing its own part of the
// result. The cost grows linearly with the number of paths and with the
// horizon, and so does the memory: 8 × Paths × (H × (1 + scenarios) +
// events) bytes for the error, demand and event draws of every path, and
// 8 × (Paths + 32 H) bytes of scratch space per worker.
func Simulate(p *plan.Plan, opt SimOptions) (*Simulation, error) {
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
	s.Amount = matrix(len(p.Future), n)
	d := s.newDraws(pool, resp)
	blocks := (n + StreamBlock - 1) / StreamBlock
	tick := opt.Progress.Counter(blocks)
	inParallel(opt.Workers, blocks, func() func(int) {
		w := d.worker()
		return func(b int) {
			w.block(b)
			tick()
		}
	})
	s.scenarioPaths(opt.Workers)
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

// scenarioPaths fills s.Scenarios with the demand paths of every scenario
// of the plan, summarised, one period of one scenario per job on workers
// goroutines (see demandRow).
func (s *Simulation) scenarioPaths(workers int) {
	p := s.Plan
	H := len(p.Periods)
	first := p.Periods[0]
	shapes := make([][]float64, len(p.Future))
	for k, e := range p.Future {
		shapes[k] = unitShape(e, first, p.Baseline)
	}
	s.Scenarios = make([]*PathSet, len(p.Scenarios))
	members := make([][]bool, len(p.Scenarios))
	for i := range p.Scenarios {
		sp := &p.Scenarios[i]
		s.Scenarios[i] = &PathSet{Name: sp.Name, Demand: matrix(H, s.Paths), Spread: make([]Spread, H)}
		members[i] = make([]bool, len(p.Future))
		for k, e := range p.Future {
			members[i][k] = slices.Contains(sp.Events, e)
		}
	}
	inParallel(workers, len(s.Scenarios)*H, func() func(int) {
		scratch := make([]float64, s.Paths)
		return func(j int) {
			sc, t := j/H, j%H
			s.demandRow(s.Scenarios[sc], t, members[sc], shapes, scratch)
		}
	})
}

// demandRow fills period t of ps: the baseline, the error paths and the
// draws of the scenario's events (those with in[k] set) times their
// contributions per unit (shapes, by event of Plan.Future), raised to the
// plan's floor where they fall below it; then its Spread, through
// scratch (Paths values).
func (s *Simulation) demandRow(ps *PathSet, t int, in []bool, shapes [][]float64, scratch []float64) {
	p := s.Plan
	row := ps.Demand[t]
	b, e := p.Baseline[t], s.Error[t]
	for i := range row {
		row[i] = b + e[i]
	}
	for k, amt := range s.Amount {
		if !in[k] || t >= len(shapes[k]) || shapes[k][t] == 0 {
			continue
		}
		u := shapes[k][t]
		for i, a := range amt {
			row[i] += a * u
		}
	}
	if p.Floor != nil {
		floorRow(row, *p.Floor)
	}
	copy(scratch, row)
	ps.Spread[t] = spreadOf(scratch)
}

// floorRow raises every path value below floor to it: simulated demand,
// like the plan, never goes below the floor (see Bands.Floor).
func floorRow(row []float64, floor float64) {
	for i, v := range row {
		if v < floor {
			row[i] = floor
		}
	}
}
