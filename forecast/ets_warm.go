package forecast

import "math"

// This file holds the warm start of an exponential smoothing fit: the
// final fits of auto's chosen methods on all the data start from the
// parameters those methods were fitted with on the backtest's first
// training window, and run one local descent instead of the full search.

// fitFrom estimates the parameters and initial states like fit, but with
// one descent (BFGS with its restarts off the bounds, see descend) from
// the better of two points, the parameters start and the best point of
// the starting grid (see grid), instead of fit's three descents and its
// probes of the bounds. start is usually the fit of the same method on
// most of the same data, so the minimum is most often close to it; the
// grid's best point is there for data whose pattern changed after that
// window (a level shift, say), where a descent from start alone stopped
// at a worse minimum and auto's mean MASE on the README's evaluation got
// 0.7 % worse. The result can differ slightly from fit's.
//
// With fewer than two free parameters, or when start gives no finite
// in-sample error, it runs fit: the global search of one parameter is
// cheap, and a failed start needs the grid.
func (f *etsFitter) fitFrom(start etsParams) (etsParams, etsStates, int) {
	if len(f.free) < 2 {
		return f.fit()
	}
	f.initialStates()
	u := f.freeFor([4]float64{start.alpha, start.beta, start.gamma, start.phi})
	if f.mult {
		f.bestInner(u)
	} else {
		f.evalStart(u)
	}
	if pts := f.grid(); len(pts) > 0 {
		copy(f.x, f.bestX)
		if f.mult {
			f.bestInner(pts[0].u)
		} else {
			f.evalStart(pts[0].u)
		}
	}
	if math.IsInf(f.bestF, 1) {
		return f.fit()
	}
	f.descend(f.bestU)
	return f.result()
}

// fitWarm fits method m to y with cfg, as FitMethod does, except that an
// exponential smoothing method starts from the parameters of from (a model
// of the same method fitted to a window of the same data) and runs one
// local descent (see etsFitter.fitFrom). Other methods, and a from that is
// nil or not such a model, get FitMethod's fit.
func fitWarm(y []float64, m Method, cfg Config, from Model) (Model, error) {
	md, ok := from.(*etsModel)
	if !ok || md.Method() != m {
		return FitMethod(y, m, cfg)
	}
	if cfg.Season < 1 {
		cfg.Season = 1
	}
	if need := MinPoints(m, cfg); len(y) < need {
		return nil, &TooShortError{Method: m, Need: need, Have: len(y)}
	}
	start := md.par
	return fitETSFrom(y, m, cfg, &start, false)
}

// fitScoring fits method m to y with cfg for auto's scoring of the
// candidates (their backtests): as FitMethod does, except that
// holt-winters-multiplicative runs its descent from the best of the grid
// points it evaluates and not the two further descents from grid points
// spread away from it (see etsFitter.fit). Its inner solves make it the
// dearest candidate by far; the further descents rarely change the ranking
// of the candidates, and the winner's final fit on all the data starts
// from this one (fitWarm).
func fitScoring(y []float64, m Method, cfg Config) (Model, error) {
	if m != HoltWintersMultiplicative {
		return FitMethod(y, m, cfg)
	}
	if cfg.Season < 1 {
		cfg.Season = 1
	}
	if need := MinPoints(m, cfg); len(y) < need {
		return nil, &TooShortError{Method: m, Need: need, Have: len(y)}
	}
	return fitETSFrom(y, m, cfg, nil, true)
}
