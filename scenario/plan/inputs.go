package plan

import (
	"fmt"
	"os"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
)

// Inputs are what a plan is built from besides its scenario file: the
// history the file names, read, the series it selects, and the digests of
// the scenario and history files (keyed "scenario" and "history").
type Inputs struct {
	History *data.History
	// Series is the series planned: the only one selected. It is the zero
	// Series when ReadSelection selects several.
	Series forecast.Series
	// Selected names the series history.series selects, in file order
	// (the one of Series when it names one series or none).
	Selected []string
	// Levels names the levels of the selected names: history.levels, or
	// level1, level2, ... up to the deepest selected name.
	Levels  []string
	Digests map[string]string

	// shard, when set, says which series a portfolio plans (ReadShard).
	shard func(name string) bool
}

// Read reads the inputs of f, under f's limits, and makes the checks of f
// that need the history (File.Resolve). Errors name the history file and
// line, or the scenario file's history key. It is ReadSelection, then an
// error at history.series when it selects more than one series, since a
// plan is of one series still.
func Read(f *scenario.File) (*Inputs, error) {
	in, err := ReadSelection(f)
	if err != nil {
		return nil, err
	}
	if err := in.one(f); err != nil {
		return nil, err
	}
	return in, nil
}

// ReadSelection reads the inputs of f like Read, but lets history.series
// select several series: Inputs.Selected names them all, and Series is set
// only when there is one. File.Resolve is checked against the first one
// selected (all series of a file share their frequency).
func ReadSelection(f *scenario.File) (*Inputs, error) {
	return readSelection(f, nil)
}

// readSelection is ReadSelection, keeping whole only the series keep says
// (nil: all of them; see data.ReadOptions.Keep).
func readSelection(f *scenario.File, keep func(string) bool) (*Inputs, error) {
	h, err := readHistory(f, keep)
	if err != nil {
		return nil, err
	}
	in := &Inputs{History: h, Digests: map[string]string{}}
	if in.Selected, err = selectSeries(f, h); err != nil {
		return nil, err
	}
	if in.Levels, err = levels(f, in.Selected); err != nil {
		return nil, err
	}
	first, _ := h.Lookup(in.Selected[0])
	if len(in.Selected) == 1 {
		in.Series = first
	}
	if err := f.Resolve(first.Next()); err != nil {
		return nil, err
	}
	for _, file := range InputFiles(f) {
		if d, err := data.Digest(file.Path); err == nil {
			in.Digests[file.Role] = d
		}
	}
	return in, nil
}

// An InputFile is a file a plan is built from and its role: "scenario",
// "history" or "events" (the keys of Plan.Digests).
type InputFile struct{ Role, Path string }

// InputFiles returns the files a plan of f is built from: the scenario
// file, the history, then the events file when f names one.
func InputFiles(f *scenario.File) []InputFile {
	files := []InputFile{{"scenario", f.Path}, {"history", f.History.File}}
	if f.EventsFile != "" {
		files = append(files, InputFile{"events", f.EventsFile})
	}
	return files
}

// InputChanges compares the digests a saved plan records (keyed by role,
// as Plan.Digests) with the files as they are now, and returns a warning
// for each file that differs or cannot be checked, in the order of files.
// saved names the saved plan in the warnings.
func InputChanges(saved string, recorded map[string]string, files []InputFile) []string {
	var warns []string
	for _, in := range files {
		want, ok := recorded[in.Role]
		if !ok {
			warns = append(warns, fmt.Sprintf("%s records no digest of the %s file; cannot tell whether %s changed since", saved, in.Role, in.Path))
			continue
		}
		got, err := data.Digest(in.Path)
		if err != nil {
			warns = append(warns, fmt.Sprintf("cannot compare %s with the plan: %v", in.Path, err))
			continue
		}
		if got != want {
			warns = append(warns, fmt.Sprintf("%s has changed since %s was written; the plan read may not match it (run forelay plan again, or leave out --plan)", in.Path, saved))
		}
	}
	return warns
}

// Load reads the inputs of f and builds its plan: Read, then Build.
func Load(f *scenario.File) (*Plan, error) {
	in, err := Read(f)
	if err != nil {
		return nil, err
	}
	return Build(f, in)
}

// readHistory reads the history file f names, under f's limits.
func readHistory(f *scenario.File, keep func(string) bool) (*data.History, error) {
	fh, err := os.Open(f.History.File)
	if err != nil {
		return nil, f.ErrorAt(f.History.Pos, "history.file", err)
	}
	defer fh.Close()
	limits := f.EffectiveLimits()
	h, err := data.ReadHistory(data.BoundedReader(fh, f.History.File, limits.Input), f.History.File,
		data.ReadOptions{Freq: f.History.Period, Fill: f.History.Fill, Key: f.History.Key, Keep: keep,
			Format: data.Format{Sheet: f.History.Sheet, Decimal: f.History.Decimal}})
	if err != nil {
		return nil, err
	}
	if err := h.CheckNameLength(limits.NameLength); err != nil {
		return nil, err
	}
	return h, nil
}
