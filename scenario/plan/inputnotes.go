package plan

import (
	"fmt"

	"forelay/scenario"
	"forelay/scenario/data"
)

// inputNotes are the notes on how the inputs were read, when that is not
// the plain case: a history that is a workbook's sheet or a CSV file with
// semicolons, tabs or decimal commas, and the events read from an events
// file.
func inputNotes(f *scenario.File, h *data.History) []string {
	var notes []string
	if h != nil && h.Read != "" {
		notes = append(notes, fmt.Sprintf("%s: read with %s", h.File, h.Read))
	}
	if f.EventsFile != "" {
		n := 0
		for _, e := range f.Events {
			if e.Pos.File == f.EventsFile {
				n++
			}
		}
		notes = append(notes, fmt.Sprintf("%s: %d event(s) read from the events file", f.EventsFile, n))
	}
	return notes
}
