package forecast

// Extend methods of the simple models: each returns a copy of the model,
// parameters held, positioned at the end of y (see Model.Extend).

// Extend returns the naive model over y.
func (m *naiveModel) Extend(y []float64) Model {
	c := &naiveModel{y: append([]float64(nil), y...)}
	c.fitted = c.Filter(c.y)
	return c
}

// Extend returns the seasonal naive model over y.
func (m *seasonalNaiveModel) Extend(y []float64) Model {
	c := *m
	c.y = append([]float64(nil), y...)
	c.fitted = c.Filter(c.y)
	return &c
}

// Extend returns the moving average, weights held, over y.
func (m *movingAverageModel) Extend(y []float64) Model {
	return newMovingAverageModel(m.method, m.weights, m.fit, y)
}

// Extend returns the regression line, coefficients held, over len(y)
// periods; the values of y do not enter (see Filter), and Fitted computes
// the line when asked.
func (m *linearTrendModel) Extend(y []float64) Model {
	c := *m
	c.n = len(y)
	return &c
}

// Extend runs Croston's recursion, alpha and initial state held, over y.
func (m *crostonModel) Extend(y []float64) Model {
	c := *m
	c.fitted, c.z, c.p = c.run(y, c.alpha)
	return &c
}
