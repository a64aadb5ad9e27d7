package forecast

import "math"

// ImpulseWeights returns psi_1..psi_{h−1}, the impulse response of model m
// (fitted to y and positioned at its end): how much a one-unit surprise in
// the first forecast period moves the forecasts of the periods after it.
// With yhat the model's first forecast,
//
//	m0 = m.Extend(y, yhat),  m1 = m.Extend(y, yhat + 1)
//	psi_j = m1.Forecast(j) − m0.Forecast(j),   j = 1..h−1,
//
// which for the linear forecasting methods is exact: psi_j = 1 for every
// j for the naive forecast (a random walk), alpha for simple exponential
// smoothing, 1 at multiples of the season for the seasonal naive
// forecast. It returns an empty slice for h <= 1. y is not changed.
func ImpulseWeights(m Model, y []float64, h int) []float64 {
	psi, _ := ImpulseResponse(m, y, h)
	return psi
}

// ImpulseResponse returns ImpulseWeights and the largest absolute forecast
// of the two runs, the size that bounds the rounding of the differences.
func ImpulseResponse(m Model, y []float64, h int) (psi []float64, size float64) {
	if h <= 1 {
		return []float64{}, 0
	}
	yhat := m.Forecast(1)[0]
	ext := make([]float64, len(y)+1)
	copy(ext, y)
	ext[len(y)] = yhat
	f0 := m.Extend(ext).Forecast(h - 1)
	ext[len(y)] = yhat + 1
	f1 := m.Extend(ext).Forecast(h - 1)
	psi = make([]float64, h-1)
	size = math.Abs(yhat) + 1
	for j := range psi {
		psi[j] = f1[j] - f0[j]
		size = math.Max(size, math.Max(math.Abs(f0[j]), math.Abs(f1[j])))
	}
	return psi, size
}
