package plan

import (
	"fmt"
	"os"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
)

// Inputs are what a plan is built from besides its scenario file: the
// history the file names, read, and the digests of the scenario and
// history files (keyed "scenario" and "history").
type Inputs struct {
	History *data.History
	Series  forecast.Series
	Digests map[string]string
}

// Read reads the inputs of f, under f's limits, and makes the checks of f
// that need the history (File.Resolve). Errors name the history file and
// line, or the scenario file's history key.
func Read(f *scenario.File) (*Inputs, error) {
	h, ser, err := readHistory(f)
	if err != nil {
		return nil, err
	}
	if err := f.Resolve(ser.Next()); err != nil {
		return nil, err
	}
	in := &Inputs{History: h, Series: ser, Digests: map[string]string{}}
	for role, path := range map[string]string{"scenario": f.Path, "history": f.History.File} {
		if d, err := data.Digest(path); err == nil {
			in.Digests[role] = d
		}
	}
	return in, nil
}

// Load reads the inputs of f and builds its plan: Read, then Build.
func Load(f *scenario.File) (*Plan, error) {
	in, err := Read(f)
	if err != nil {
		return nil, err
	}
	return Build(f, in)
}

// readHistory reads the series the file's history block names.
func readHistory(f *scenario.File) (*data.History, forecast.Series, error) {
	fh, err := os.Open(f.History.File)
	if err != nil {
		return nil, forecast.Series{}, f.ErrorAt(f.History.Pos, "history.file", err)
	}
	defer fh.Close()
	limits := f.EffectiveLimits()
	h, err := data.ReadHistory(data.BoundedReader(fh, f.History.File, limits.Input), f.History.File,
		data.ReadOptions{Freq: f.History.Period, Fill: f.History.Fill})
	if err != nil {
		return nil, forecast.Series{}, err
	}
	if err := h.CheckNameLength(limits.NameLength); err != nil {
		return nil, forecast.Series{}, err
	}
	name := f.History.Series
	if name == "" {
		if len(h.Series) != 1 {
			names := make([]string, len(h.Series))
			for i, s := range h.Series {
				names[i] = s.Name
			}
			return nil, forecast.Series{}, f.ErrorAt(f.History.Pos, "history.series",
				fmt.Errorf("%s holds %d series (%v); name one", f.History.File, len(h.Series), names))
		}
		return h, h.Series[0], nil
	}
	s, err := h.Lookup(name)
	if err != nil {
		return nil, forecast.Series{}, f.ErrorAt(f.History.Pos, "history.series", err)
	}
	return h, s, nil
}
