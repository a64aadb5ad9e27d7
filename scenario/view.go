package scenario

// SharesOf resolves the scope of every event of f against names, the
// plan's series (Event.Shares), and returns them keyed by series name and
// then by event id: what each event does to each series it moves, for
// the series want says (nil: every one; the others still count towards
// each split). weight gives a series' weight for an event whose effect is
// split by baseline (Event.SpanWeight of the series' baseline); it is
// called only for such events. The error is that of the first event whose
// shares cannot be made.
func (f *File) SharesOf(names []string, weight func(e *Event, series string) float64, want func(series string) bool) (map[string]map[string]SeriesShare, error) {
	out := map[string]map[string]SeriesShare{} // the series some event moves
	for _, e := range f.Events {
		shares, err := e.sharesOf(names, func(s string) float64 { return weight(e, s) }, want)
		if err != nil {
			return nil, err
		}
		for _, s := range shares {
			if out[s.Series] == nil {
				out[s.Series] = map[string]SeriesShare{}
			}
			out[s.Series][e.ID] = s
		}
	}
	return out, nil
}

// ForSeries returns the file as one series of a portfolio sees it: a
// plan of that series alone, which the planner of one series can build.
// shares are the series' shares keyed by event id (an entry of SharesOf);
// the view holds, in file order, a copy of each event with a share,
// carrying the series' effect and range (SeriesShare.Effect and Range)
// and no scope; each
// scenario keeps its name and position and holds the copies of its events
// that the view has, in its own order; history.series is the series'
// name. Everything else, positions and limits included, is f's: errors
// about the view point into f. f itself is not changed.
func (f *File) ForSeries(name string, shares map[string]SeriesShare) *File {
	v := *f
	v.History.Series, v.History.Select = name, nil
	v.Events = nil
	copies := make(map[*Event]*Event, len(shares))
	for _, e := range f.Events {
		s, ok := shares[e.ID]
		if !ok {
			continue
		}
		c := *e
		c.Effect, c.Range, c.Scope = s.Effect, s.Range, nil
		copies[e] = &c
		v.Events = append(v.Events, &c)
	}
	if f.Scenarios != nil {
		v.Scenarios = make([]Case, len(f.Scenarios))
		for i, cs := range f.Scenarios {
			v.Scenarios[i] = Case{Name: cs.Name, Pos: cs.Pos, Events: []*Event{}}
			for _, e := range cs.Events {
				if c, ok := copies[e]; ok {
					v.Scenarios[i].Events = append(v.Scenarios[i].Events, c)
				}
			}
		}
	}
	return &v
}
