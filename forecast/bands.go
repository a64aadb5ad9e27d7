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
)

// Variance returns the forecast error variance for horizons 1..h and where
// it came from. Flat gives the in-sample MSE for every horizon. Widening
// gives MSE * c_h when the model has analytic variance factors
// (Model.VarianceFactors); otherwise the backtest's per-horizon MSE, where a
// horizon the backtest did not reach takes the last reached one's value
// scaled by h/h_last; with no backtest at all, MSE * h (random-walk growth,
// a deliberately wide fallback).
func (r *Result) Variance(h int, mode BandMode) ([]float64, VarianceSource) {
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

// Forecast returns h forecast points with bands of half-width z sqrt(v_h),
// v from Variance.
func (r *Result) Forecast(h int, z float64, mode BandMode) []Point {
	f := r.Model.Forecast(h)
	v, _ := r.Variance(h, mode)
	pts := make([]Point, h)
	for i := range pts {
		w := z * math.Sqrt(v[i])
		pts[i] = Point{Period: r.Series.Next().Add(i), Value: f[i], Lower: f[i] - w, Upper: f[i] + w}
	}
	return pts
}
