package forecast

// A roller carries a fitted model's states forward one observation at a
// time, parameters and initial states held, without running the model
// again from the first observation. Backtests use it: after rollOn(y) its
// Forecast equals, bit for bit, that of Model.Extend(y), because it does
// the same arithmetic on the same states in the same order.
type roller interface {
	// rollOn takes in the observation y[len(y)-1]; y[:len(y)-1] are the
	// observations the roller is positioned after. The roller may keep y
	// until the next call and must not change it.
	rollOn(y []float64)
	// Forecast returns the point forecasts for the h periods after the
	// last observation taken in.
	Forecast(h int) []float64
}

// rollable is implemented by the models that can start a roller: y are
// the observations the model was fitted on (or extended over), and the
// roller starts positioned after them. Models that do not implement it
// are rolled forward with Model.Extend.
type rollable interface {
	roller(y []float64) roller
}

// etsRoller steps the exponential smoothing recursions (etsRun) over one
// observation at a time from the model's final states.
type etsRoller struct{ md etsModel }

func (md *etsModel) roller([]float64) roller {
	r := &etsRoller{md: *md}
	r.md.last = md.last.clone()
	r.md.y = nil
	return r
}

func (r *etsRoller) rollOn(y []float64) {
	md := &r.md
	etsRun(md.shape, md.par, &md.last, y[len(y)-1:], nil)
}

func (r *etsRoller) Forecast(h int) []float64 { return r.md.Forecast(h) }

// windowRoller serves the models whose forecast reads only the last
// observations of their data (naive, seasonal naive, the moving
// averages) or its length (linear trend): rolling on is pointing the
// model at the longer data, with no copy and no fitted values.
type windowRoller struct {
	at  func(y []float64) // positions the model at the end of y
	mod interface{ Forecast(h int) []float64 }
}

func (r *windowRoller) rollOn(y []float64)       { r.at(y) }
func (r *windowRoller) Forecast(h int) []float64 { return r.mod.Forecast(h) }

func (m *naiveModel) roller(y []float64) roller {
	c := &naiveModel{y: y}
	return &windowRoller{at: func(y []float64) { c.y = y }, mod: c}
}

func (m *seasonalNaiveModel) roller(y []float64) roller {
	c := &seasonalNaiveModel{season: m.season, y: y}
	return &windowRoller{at: func(y []float64) { c.y = y }, mod: c}
}

func (m *movingAverageModel) roller(y []float64) roller {
	c := &movingAverageModel{method: m.method, weights: m.weights, fit: m.fit, y: y}
	return &windowRoller{at: func(y []float64) { c.y = y }, mod: c}
}

func (m *linearTrendModel) roller(y []float64) roller {
	c := *m
	c.n = len(y)
	return &windowRoller{at: func(y []float64) { c.n = len(y) }, mod: &c}
}

// crostonRoller steps Croston's recursion (crostonModel.run) over one
// observation at a time. q, the periods since the last demand, is not
// kept by the model; it is the number of trailing zeros of the data
// (all of it when there is no demand), as run leaves it.
type crostonRoller struct {
	m crostonModel
	q float64
}

func (m *crostonModel) roller(y []float64) roller {
	r := &crostonRoller{m: *m}
	r.m.fitted = nil
	for t := len(y) - 1; t >= 0 && y[t] == 0; t-- {
		r.q++
	}
	return r
}

func (r *crostonRoller) rollOn(y []float64) {
	m := &r.m
	r.q++
	if v := y[len(y)-1]; v != 0 {
		m.z += m.alpha * (v - m.z)
		m.p += m.alpha * (r.q - m.p)
		r.q = 0
	}
}

func (r *crostonRoller) Forecast(h int) []float64 { return r.m.Forecast(h) }
