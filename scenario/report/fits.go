package report

import (
	"encoding/json"
	"fmt"

	"forelay/forecast"
)

// Fits lays out the fits of the series of the history file history, in
// input order: one JSON line per series
// (a series that failed gives {"series", "error"}), or the text reports
// separated by blank lines (a series that failed gives none). failed
// holds the error of each series that failed, naming the history file.
func Fits(history string, series []forecast.Series, outcomes []forecast.Outcome, horizon int, bands Bands, units string, asJSON bool) (out *Text, failed []error, err error) {
	out = &Text{}
	for i, oc := range outcomes {
		h := horizon
		if h == 0 {
			h = series[i].Freq().DefaultHorizon()
		}
		var line any
		switch {
		case oc.Err != nil:
			err := fmt.Errorf("%s: %w", history, oc.Err)
			failed = append(failed, err)
			line = map[string]string{"series": series[i].Name, "error": err.Error()}
		case asJSON:
			line = Fit(oc.Result, h, bands)
		default:
			if i > 0 {
				fmt.Fprintln(out)
			}
			FitText(out, oc.Result, h, bands, units)
			continue
		}
		if asJSON {
			b, err := json.Marshal(line)
			if err != nil {
				return out, nil, err
			}
			out.Write(append(b, '\n'))
		}
	}
	return out, failed, nil
}
