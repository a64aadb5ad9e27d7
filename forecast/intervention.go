package forecast

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// Intervention is a known event in the history whose size is estimated
// while the baseline is fitted (Box & Tiao 1975, "Intervention analysis
// with applications to economic and environmental problems", JASA 70).
type Intervention struct {
	// Name labels the estimate in errors and reports.
	Name string
	// Shape is the event's effect on each observation per unit of size:
	// 1 in the periods of a pulse, 0 elsewhere; for a step, the ramp share
	// from its start on. It has the series' length.
	Shape []float64
}

// InterventionFit is a baseline fitted to a series cleaned of known events.
type InterventionFit struct {
	// Fit is the baseline fitted to the cleaned series.
	Fit *Result
	// Effect[j] is the estimated size of intervention j (units per period
	// at full size) and StdErr[j] its standard error.
	Effect, StdErr []float64
	// Cleaned is the series with the events taken out:
	//
	//	cleaned_t = y_t - sum_j Effect_j * Shape_j,t
	Cleaned []float64
	// Iterations is the number of estimate-and-refit rounds run.
	Iterations int
}

// ErrCollinear is returned when two interventions (or one and the model)
// cannot be told apart in the data.
var ErrCollinear = errors.New("the events cannot be told apart in the history")

// FitInterventions fits spec to s while estimating the size of each
// intervention. It alternates two steps until the sizes settle (at most
// maxIter rounds; 0 means 6):
//
//  1. fit the baseline to the cleaned series y - A w;
//  2. with the smoothing parameters held, take a Gauss-Newton step for w on
//     the one-step errors e(w) of the cleaned series: G[:,j] = -de/dw_j is
//     found by refitting the initial states (parameters held) to the series
//     with shape j removed, and dw solves min ||e - G dw||.
//
// For the linear (additive) models the errors are affine in w and in the
// initial states, so one step is the exact joint least-squares solution for
// the held parameters; the later rounds account for the smoothing
// parameters moving as the events come out. Standard errors come from the
// last step: Cov(w) = s^2 (G'G)^-1 with s^2 = SSE / (m - k - p), m the
// number of one-step errors, k the number of interventions and p the
// model's estimated quantities (Model.NumParams). For linear-trend this is
// exactly ordinary least squares with the event dummies as regressors.
//
// Auto selection runs in the first round only; later rounds keep its
// choice, and refit only the model (no backtest) until the last round. An intervention whose shape is zero at every observation is an
// error, and so are interventions that cannot be told apart (ErrCollinear).
func FitInterventions(s Series, spec Spec, ivs []Intervention, maxIter int) (*InterventionFit, error) {
	n, k := s.Len(), len(ivs)
	for _, iv := range ivs {
		if len(iv.Shape) != n {
			panic("forecast: intervention shape length differs from the series")
		}
		nz := false
		for _, v := range iv.Shape {
			nz = nz || v != 0
		}
		if !nz {
			return nil, fmt.Errorf("event %q does not touch the history", iv.Name)
		}
	}
	if maxIter <= 0 {
		maxIter = 6
	}
	y := s.Values
	w := make([]float64, k)
	cleaned := append([]float64(nil), y...)
	clean := func() {
		for t := range cleaned {
			v := y[t]
			for j, iv := range ivs {
				v -= w[j] * iv.Shape[t]
			}
			cleaned[t] = v
		}
	}
	out := &InterventionFit{Effect: w, StdErr: make([]float64, k)}
	spec = spec.resolve(s)
	fit := func() (*Result, error) {
		cs := s
		cs.Values = append([]float64(nil), cleaned...)
		return Fit(cs, spec)
	}
	first, err := fit()
	if err != nil {
		return nil, err
	}
	spec.Method, spec.Config = first.Method, first.Config
	if ms := first.memberMethods(); ms != nil {
		spec.Candidates = ms // a combination keeps its members
	}
	res := first
	out.Iterations = 1
	// refit fits the kept method to the cleaned series: in full (with its
	// backtest) in the last round, and only the model in the rounds
	// before, whose results serve the next Gauss-Newton step alone (it
	// reads the model, never the backtest). A combination goes through
	// Fit every round, as its members' backtests weigh them.
	refit := func(last bool) (*Result, error) {
		if last || spec.Method == Combination {
			return fit()
		}
		model, err := FitMethod(append([]float64(nil), cleaned...), spec.Method, spec.Config)
		if err != nil {
			return nil, nameSeries(err, s.Name)
		}
		return &Result{Series: s, Method: spec.Method, Config: spec.Config, Model: model}, nil
	}
	for it := 1; it < maxIter && k > 0; it++ {
		step, se, err := gaussNewtonStep(heldPredictor(res, spec), cleaned, ivs, res.Model.NumParams())
		if err != nil {
			return nil, err
		}
		moved := 0.0
		for j := range w {
			w[j] += step[j]
			out.StdErr[j] = se[j]
			moved = math.Max(moved, math.Abs(step[j])/math.Max(se[j], 1e-12))
		}
		clean()
		last := moved < 1e-3 || it == maxIter-1
		if res, err = refit(last); err != nil {
			return nil, err
		}
		out.Iterations = it + 1
		if last {
			break
		}
	}
	// Report the selection made in the first round.
	res.Auto, res.Candidates, res.Metric, res.Select = first.Auto, first.Candidates, first.Metric, first.Select
	out.Fit = res
	out.Cleaned = cleaned
	return out, nil
}

// heldPredictor returns a function giving the one-step predictions of the
// fitted model's method over other data with the smoothing parameters held
// and the initial states estimated afresh, so that the Gauss-Newton step
// accounts for the states moving with the events. Methods whose parameters
// cannot be held through Config (fitted moving-average weights) roll the
// model forward instead.
func heldPredictor(r *Result, spec Spec) func(z []float64) []float64 {
	cfg := spec.Config
	p := r.Model.Params()
	hold := func(v float64, dst **float64) {
		if !math.IsNaN(v) {
			x := v
			*dst = &x
		}
	}
	hold(p.Alpha, &cfg.Fixed.Alpha)
	hold(p.Beta, &cfg.Fixed.Beta)
	hold(p.Gamma, &cfg.Fixed.Gamma)
	hold(p.Phi, &cfg.Fixed.Phi)
	if r.Method == WeightedMovingAverage && len(cfg.Weights) == 0 {
		return func(z []float64) []float64 { return r.Model.Extend(z).Fitted() }
	}
	return func(z []float64) []float64 {
		m, err := FitMethod(z, r.Method, cfg)
		if err != nil {
			return r.Model.Extend(z).Fitted()
		}
		return m.Fitted()
	}
}

// gaussNewtonStep returns the least-squares step for the intervention sizes
// and their standard errors, with model m held, at the cleaned series yc.
func gaussNewtonStep(predict func([]float64) []float64, yc []float64, ivs []Intervention, modelParams int) (step, se []float64, err error) {
	n, k := len(yc), len(ivs)
	p0 := predict(yc)
	// Rows where the model makes a prediction.
	var rows []int
	for t := 0; t < n; t++ {
		if !math.IsNaN(p0[t]) {
			rows = append(rows, t)
		}
	}
	dof := len(rows) - k - modelParams
	if dof < 1 {
		return nil, nil, fmt.Errorf("%w: %d usable points for %d events", ErrCollinear, len(rows), k)
	}
	G := mat.NewDense(len(rows), k, nil)
	e := mat.NewVecDense(len(rows), nil)
	shifted := make([]float64, n)
	for j, iv := range ivs {
		for t := range yc {
			shifted[t] = yc[t] - iv.Shape[t]
		}
		pj := predict(shifted)
		// e(w + d) = yc - d x - pred(yc - d x); per unit d the error falls
		// by x - (pred(yc) - pred(yc - x)).
		for r, t := range rows {
			G.Set(r, j, iv.Shape[t]-(p0[t]-pj[t]))
		}
	}
	for r, t := range rows {
		e.SetVec(r, yc[t]-p0[t])
	}
	var qr mat.QR
	qr.Factorize(G)
	if c := qr.Cond(); c > 1e10 || math.IsNaN(c) {
		return nil, nil, fmt.Errorf("%w (condition number %.3g)", ErrCollinear, c)
	}
	var x mat.VecDense
	if err := qr.SolveVecTo(&x, false, e); err != nil {
		return nil, nil, fmt.Errorf("%w: %v", ErrCollinear, err)
	}
	var gtg, inv mat.Dense
	gtg.Mul(G.T(), G)
	if err := inv.Inverse(&gtg); err != nil {
		return nil, nil, fmt.Errorf("%w: %v", ErrCollinear, err)
	}
	var fit mat.VecDense
	fit.MulVec(G, &x)
	sse := 0.0
	for r := range rows {
		d := e.AtVec(r) - fit.AtVec(r)
		sse += d * d
	}
	s2 := sse / float64(dof)
	step, se = make([]float64, k), make([]float64, k)
	for j := 0; j < k; j++ {
		step[j] = x.AtVec(j)
		se[j] = math.Sqrt(s2 * inv.At(j, j))
	}
	return step, se, nil
}
