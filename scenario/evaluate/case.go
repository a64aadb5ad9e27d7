package evaluate

import (
	"fmt"
	"forelay/scenario/data"
	"os"
	"path/filepath"

	"forelay/forecast"
)

// The sources of the cases.
const (
	SourceOpen      = "open"
	SourceSynthetic = "synthetic"
	// SourceAll labels aggregates over every source (and FreqAll over
	// every frequency).
	SourceAll = "all"
	FreqAll   = "all"
)

// Case is one series to evaluate.
type Case struct {
	// Series holds the whole series; the origins are chosen inside it.
	Series forecast.Series
	// Source is SourceOpen or SourceSynthetic (any label is accepted).
	Source string
	// Group is the label the per-group results use: the series name for
	// open data, the family for synthetic series.
	Group string
}

// OpenFiles are the files ReadOpen reads, in that order.
var OpenFiles = []string{"monthly.csv", "quarterly.csv"}

// ReadOpen reads the open series exported by testdata/open/gen_open.py from
// dir (the monthly.csv and quarterly.csv there) and returns one case per
// series, in file order, with Source SourceOpen and Group the series name.
// Errors name the file (and, for its content, the line and column).
func ReadOpen(dir string) ([]Case, error) {
	var out []Case
	for _, name := range OpenFiles {
		path := filepath.Join(dir, name)
		f, err := os.Open(path)
		if err != nil {
			return nil, fmt.Errorf("open data: %w (run /usr/bin/python3 testdata/open/gen_open.py to write it)", err)
		}
		h, err := data.ReadHistory(f, path, data.ReadOptions{})
		f.Close()
		if err != nil {
			return nil, err
		}
		for _, s := range h.Series {
			out = append(out, Case{Series: s, Source: SourceOpen, Group: s.Name})
		}
	}
	return out, nil
}
