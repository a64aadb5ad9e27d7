package report

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"forelay/scenario"
	"os"
	"path/filepath"

	"forelay/forecast"
	"forelay/scenario/data"
	"forelay/scenario/plan"
)

// ErrNotAPlan marks a plan.json that lacks what tracking needs.
var ErrNotAPlan = errors.New("not a usable plan.json")

// savedPlan holds the fields of plan.json (see PlanDoc) that
// tracking reads; the rest is ignored.
type savedPlan struct {
	Version int    `json:"version"`
	Plan    string `json:"plan"`
	Units   string `json:"units"`
	History struct {
		Series string `json:"series"`
		Period string `json:"period"`
		End    string `json:"end"`
	} `json:"history"`
	Inputs   map[string]string `json:"inputs"`
	Baseline struct {
		Accuracy struct {
			MAD *float64 `json:"mad"`
			MSE *float64 `json:"mse"`
		} `json:"accuracy"`
	} `json:"baseline"`
	Scenarios []struct {
		Name    string `json:"name"`
		Periods []struct {
			Period   string   `json:"period"`
			Baseline *float64 `json:"baseline"`
			Adjusted *float64 `json:"adjusted"`
		} `json:"periods"`
	} `json:"scenarios"`
}

// ReadPlan reads a plan.json written by "forelay plan --out" and
// returns the plan to track against and the input digests it records.
// Errors are *data.ParseError naming the file (with the line and
// column of a JSON syntax or type error) and the field at fault.
func ReadPlan(path string) (plan.TrackPlan, map[string]string, error) {
	var tp plan.TrackPlan
	src, err := os.ReadFile(path)
	if err != nil {
		return tp, nil, err
	}
	var sp savedPlan
	if err := json.Unmarshal(src, &sp); err != nil {
		return tp, nil, jsonError(path, src, err)
	}
	bad := func(field, format string, a ...any) error {
		return &data.ParseError{File: path, Field: field, Err: fmt.Errorf("%w: "+format, append([]any{ErrNotAPlan}, a...)...)}
	}
	if sp.Version > PlanVersion {
		return tp, nil, bad("version", "form %d, newer than the form %d this forelay reads; use a newer forelay or run forelay plan again", sp.Version, PlanVersion)
	}
	freq, err := forecast.ParseFrequency(sp.History.Period)
	if err != nil || freq == forecast.FreqUnknown {
		return tp, nil, bad("history.period", "%q is not a period length", sp.History.Period)
	}
	if tp.HistoryEnd, err = forecast.ParsePeriod(sp.History.End, freq); err != nil {
		return tp, nil, bad("history.end", "%v", err)
	}
	if sp.History.Series == "" {
		return tp, nil, bad("history.series", "no series name")
	}
	if sp.Baseline.Accuracy.MAD == nil || sp.Baseline.Accuracy.MSE == nil {
		return tp, nil, bad("baseline.accuracy", "no in-sample MAD and MSE")
	}
	if len(sp.Scenarios) == 0 {
		return tp, nil, bad("scenarios", "no scenarios")
	}
	tp.Name, tp.Units, tp.Series = sp.Plan, sp.Units, sp.History.Series
	tp.MAD, tp.MSE = *sp.Baseline.Accuracy.MAD, *sp.Baseline.Accuracy.MSE
	for i, s := range sp.Scenarios {
		line := plan.PlanLine{Name: s.Name}
		if i > 0 && len(s.Periods) != len(tp.Periods) {
			return tp, nil, bad(fmt.Sprintf("scenarios[%d].periods", i), "%d periods; the first scenario has %d", len(s.Periods), len(tp.Periods))
		}
		for k, p := range s.Periods {
			field := fmt.Sprintf("scenarios[%d].periods[%d]", i, k)
			per, err := forecast.ParsePeriod(p.Period, freq)
			if err != nil {
				return tp, nil, bad(field+".period", "%v", err)
			}
			if p.Adjusted == nil || p.Baseline == nil {
				return tp, nil, bad(field, "no adjusted or baseline value")
			}
			if i == 0 {
				tp.Periods = append(tp.Periods, per)
				tp.Baseline = append(tp.Baseline, *p.Baseline)
			} else if per.String() != tp.Periods[k].String() {
				return tp, nil, bad(field+".period", "%s; the first scenario has %s here", per, tp.Periods[k])
			}
			line.Adjusted = append(line.Adjusted, *p.Adjusted)
		}
		tp.Scenarios = append(tp.Scenarios, line)
	}
	if err := tp.Check(); err != nil {
		return tp, nil, &data.ParseError{File: path, Err: err}
	}
	return tp, sp.Inputs, nil
}

// jsonError turns an error of json.Unmarshal on src, the content of
// path, into a *data.ParseError with the line and column of a syntax or
// type error and the field of a type error.
func jsonError(path string, src []byte, err error) error {
	pe := &data.ParseError{File: path, Err: err}
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.As(err, &se):
		pe.Line, pe.Column = offsetPos(src, se.Offset)
	case errors.As(err, &te):
		pe.Line, pe.Column = offsetPos(src, te.Offset)
		pe.Field, pe.Err = te.Field, fmt.Errorf("%w: %s where %s was expected", ErrNotAPlan, te.Value, te.Type)
	}
	return pe
}

// offsetPos turns a byte offset of src into a 1-based line and column.
func offsetPos(src []byte, off int64) (line, col int) {
	off = min(max(off, 0), int64(len(src)))
	before := src[:off]
	line = bytes.Count(before, []byte("\n")) + 1
	col = int(off) - bytes.LastIndexByte(before, '\n')
	return line, col
}

// SavedTrackPlan reads the plan to track against from DIR/plan.json,
// written for the scenario file at file, and compares the digests it
// records of the scenario and history files with the files as they are
// now: a warning for each that changed or cannot be checked. source says
// where the plan came from ("read from DIR/plan.json"). A scenario file
// that does not load and a plan.json that cannot be read are errors.
func SavedTrackPlan(file, dir string) (tp plan.TrackPlan, source string, warns []string, err error) {
	path := filepath.Join(dir, "plan.json")
	tp, inputs, err := ReadPlan(path)
	if err != nil {
		return plan.TrackPlan{}, "", nil, err
	}
	f, err := scenario.Load(file)
	if err != nil {
		return plan.TrackPlan{}, "", nil, err
	}
	return tp, "read from " + path, plan.InputChanges(path, inputs, plan.InputFiles(f)), nil
}
