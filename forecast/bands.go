package forecast

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"
)

// BandMode is how the width of the error band changes with the horizon.
type BandMode int

// The band modes. Widening is the zero value and the default.
const (
	// Widening uses a horizon-dependent variance: the analytic formula of
	// the model class where it has one, else the backtest's per-horizon
	// mean squared error.
	Widening BandMode = iota
	// Flat uses the in-sample MSE for every horizon: plus or minus
	// z sqrt(MSE).
	Flat
)

// String returns horizon or flat, the words the scenario file uses.
func (b BandMode) String() string {
	if b == Flat {
		return "flat"
	}
	return "horizon"
}

// ParseBandMode reads horizon (or widening) or flat; "" gives Widening.
func ParseBandMode(s string) (BandMode, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "horizon", "widening":
		return Widening, nil
	case "flat":
		return Flat, nil
	}
	return Widening, fmt.Errorf("unknown band mode %q (want horizon or flat)", s)
}

// ZForCoverage returns the two-sided standard normal multiplier for a
// central interval holding share c of outcomes:
//
//	z = Phi^-1((1 + c) / 2)
//
// so ZForCoverage(0.95) = 1.959964. It returns an error unless 0 < c < 1.
func ZForCoverage(c float64) (float64, error) {
	if !(c > 0 && c < 1) {
		return 0, fmt.Errorf("coverage %v must lie strictly between 0 and 1", c)
	}
	return distuv.UnitNormal.Quantile((1 + c) / 2), nil
}

// Coverage returns the central share of a normal distribution within
// plus or minus z standard deviations: 2 Phi(z) - 1.
func Coverage(z float64) float64 { return 2*distuv.UnitNormal.CDF(z) - 1 }

// Point is one forecast period with its band.
type Point struct {
	Period Period  `json:"period"`
	Value  float64 `json:"value"`
	Lower  float64 `json:"lower"`
	Upper  float64 `json:"upper"`
}

// VarianceSource says where a band's variance came from.
type VarianceSource string

// The variance sources.
const (
	VarFlat       VarianceSource = "flat-mse"
	VarAnalytic   VarianceSource = "analytic"
	VarBacktest   VarianceSource = "backtest"
	VarRandomWalk VarianceSource = "mse-times-h"
	// VarCalibrated: the errors of forecasts from earlier origins (see
	// CalibrateVariance); VarFlatCalibrated: their one-step variance at
	// every lead time.
	VarCalibrated     VarianceSource = "calibrated"
	VarFlatCalibrated VarianceSource = "flat-calibrated"
)

// Variance returns the calibrated forecast error variance for horizons
// 1..h and where it came from: VarianceFrom with Calibrated.
func (r *Result) Variance(h int, mode BandMode) ([]float64, VarianceSource) {
	return r.VarianceFrom(h, mode, Calibrated)
}

// VarianceFrom returns the forecast error variance for horizons 1..h and
// where it came from. With from Calibrated (the default) the variance is
// the backtest errors' (CalibrateVariance), shrunk toward the model's
// variance (ModelVariance with Widening) where they are few; Flat then
// gives the calibrated one-step variance at every horizon. Without any
// backtest error it is ModelVariance. With FromModel it is ModelVariance.
func (r *Result) VarianceFrom(h int, mode BandMode, from BandSource) ([]float64, VarianceSource) {
	if from == Calibrated && h > 0 {
		if v, _ := r.calibrated(h); v != nil {
			if mode == Flat {
				for i := range v {
					v[i] = v[0]
				}
				return v, VarFlatCalibrated
			}
			return v, VarCalibrated
		}
	}
	return r.ModelVariance(h, mode)
}

// Calibration says what the calibrated variance rests on; the zero value
// when the fit has no backtest.
func (r *Result) Calibration() Calibration {
	if r.Backtest == nil {
		return Calibration{}
	}
	_, cal := r.calibrated(1)
	return cal
}

// calibrated returns the calibrated variance at lead times 1..h, nil when
// the backtest has no error; the shape is the model's analytic variance,
// or none. The calibration always spans every lead time the backtest
// scored, so the variance at a lead time does not depend on h.
func (r *Result) calibrated(h int) ([]float64, Calibration) {
	if r.Backtest == nil {
		return nil, Calibration{}
	}
	H := max(h, len(r.Backtest.HorizonMSE))
	var shape []float64
	if c, ok := r.Model.VarianceFactors(H); ok {
		base := r.residualVariance()
		shape = make([]float64, H)
		for i := range shape {
			shape[i] = base * c[i]
		}
	}
	errs := r.Backtest.Errors
	if r.selErrors != nil {
		errs = r.selErrors
	}
	v, cal := CalibrateVariance(errs, shape)
	cal.Selection = r.selErrors != nil
	cal.Shaped = shape != nil
	if v == nil {
		return nil, cal
	}
	v = extendShape(v, H)[:h]
	// The variance is an estimate resting on few degrees of freedom when
	// the backtest has few origins: one per origin (the errors of one
	// origin at its several lead times move together), plus the weight
	// the pooled ratio gives the model's own variance. A forecast error
	// divided by such an estimate follows Student's t with that many
	// degrees of freedom, whose variance is df/(df-2) times the
	// estimate's.
	cal.DF = cal.Origins + poolPrior
	inflate := float64(cal.DF) / float64(cal.DF-2)
	if cal.DF < 3 {
		inflate = 3
	}
	for i := range v {
		v[i] *= inflate
	}
	return v, cal
}

// dof is the number of in-sample one-step errors less the model's
// estimated parameters and initial states, at least 0.
func (r *Result) dof() int {
	n := 0
	for _, e := range r.Residuals() {
		if !math.IsNaN(e) {
			n++
		}
	}
	return max(n-r.Model.NumParams(), 0)
}

// extendShape returns v cut or grown to h values, growing in proportion to
// the lead time past its end.
func extendShape(v []float64, h int) []float64 {
	out := make([]float64, h)
	last := len(v)
	for i := range out {
		if i < last {
			out[i] = v[i]
		} else {
			out[i] = v[last-1] * float64(i+1) / float64(last)
		}
	}
	return out
}

// ModelVariance returns the forecast error variance the model implies for
// horizons 1..h and where it came from. Flat gives the in-sample MSE for every horizon. Widening
// gives MSE * c_h when the model has analytic variance factors
// (Model.VarianceFactors); otherwise the backtest's per-horizon MSE, where a
// horizon the backtest did not reach takes the last reached one's value
// scaled by h/h_last; with no backtest at all, MSE * h (random-walk growth,
// a deliberately wide fallback).
func (r *Result) ModelVariance(h int, mode BandMode) ([]float64, VarianceSource) {
	v := make([]float64, h)
	mse := r.Accuracy.MSE
	if mode == Flat {
		for i := range v {
			v[i] = mse
		}
		return v, VarFlat
	}
	if c, ok := r.Model.VarianceFactors(h); ok {
		for i := range v {
			v[i] = mse * c[i]
		}
		return v, VarAnalytic
	}
	if bt := r.Backtest; bt != nil {
		last, lastH := math.NaN(), 0
		for i := range v {
			if i < len(bt.HorizonMSE) && bt.HorizonCount[i] > 0 {
				last, lastH = bt.HorizonMSE[i], i+1
				v[i] = last
			} else if lastH > 0 {
				v[i] = last * float64(i+1) / float64(lastH)
			} else {
				v[i] = math.NaN()
			}
		}
		if lastH > 0 {
			return v, VarBacktest
		}
	}
	for i := range v {
		v[i] = mse * float64(i+1)
	}
	return v, VarRandomWalk
}

// Forecast returns h forecast points with calibrated bands:
// ForecastFrom with Calibrated.
func (r *Result) Forecast(h int, z float64, mode BandMode) []Point {
	return r.ForecastFrom(h, z, mode, Calibrated)
}

// ForecastFrom returns h forecast points with bands of half-width
// z sqrt(v_h), v from VarianceFrom.
func (r *Result) ForecastFrom(h int, z float64, mode BandMode, from BandSource) []Point {
	f := r.Model.Forecast(h)
	v, _ := r.VarianceFrom(h, mode, from)
	pts := make([]Point, h)
	for i := range pts {
		w := z * math.Sqrt(v[i])
		pts[i] = Point{Period: r.Series.Next().Add(i), Value: f[i], Lower: f[i] - w, Upper: f[i] + w}
	}
	return pts
}

// residualVariance is the one-step error variance the calibration leans on
// where out-of-sample errors are few: the sum of squared in-sample errors
// over the degrees of freedom the fit leaves, n - p (p the model's
// estimated parameters and initial states), so that a model with many
// parameters on a short history is not taken at its in-sample word. With
// n - p below 1 it is the in-sample SSE itself.
func (r *Result) residualVariance() float64 {
	return r.SSE / float64(max(r.dof(), 1))
}
