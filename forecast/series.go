package forecast

// A Series is a run of equally spaced observations of one quantity.
// Values[i] belongs to period Start.Add(i). A Series holds no gaps: missing
// periods are filled (or rejected) when the history is read.
type Series struct {
	Name   string
	Start  Period
	Values []float64
}

// Freq returns the series' frequency.
func (s Series) Freq() Frequency { return s.Start.Freq }

// Len returns the number of observations.
func (s Series) Len() int { return len(s.Values) }

// Period returns the period of observation i (i may run past the end, which
// gives the forecast periods).
func (s Series) Period(i int) Period { return s.Start.Add(i) }

// Next returns the first period after the last observation.
func (s Series) Next() Period { return s.Start.Add(len(s.Values)) }

// Index returns the position of period p in the series; it is negative
// before the start and Len() or more after the end.
func (s Series) Index(p Period) int { return p.Sub(s.Start) }
