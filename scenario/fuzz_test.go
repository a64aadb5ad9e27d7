package scenario

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"forelay/forecast"
)

// FuzzParse checks that no input makes Parse or Resolve panic, and that a
// file that parses resolves and profiles without panicking.
func FuzzParse(f *testing.F) {
	full, err := os.ReadFile(filepath.Join("..", "testdata", "scenario", "full.yaml"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(string(full))
	f.Add(head)
	f.Add(head + "events:\n  - {id: a, kind: pulse, start: 2027-08-14, end: 2027-08-23, effect: {percent: 5}, payback: {share: 1}}\n")
	f.Add("plan: p\nhistory: {file: h.csv\n")
	f.Add("- a\n- *b\n")
	f.Fuzz(func(t *testing.T, src string) {
		file, err := Parse(strings.NewReader(src), "f.yaml")
		if err != nil {
			return
		}
		next := period("2027-01", forecast.Monthly)
		if file.Resolve(next) != nil {
			return
		}
		for _, e := range file.Events {
			e.Contribution(next, make([]float64, 24))
			e.Sigma(next, make([]float64, 24))
			e.Window(next)
			e.Prorated(next)
		}
	})
}
