// Command evaluate measures forelay's baselines out of sample and prints
// the report: band coverage per method, mean MASE per frequency and the
// realised service of a safety stock, on the open datasets that statsmodels
// ships (testdata/open) and on seeded synthetic series.
//
// Usage:
//
//	go run ./examples/evaluate [-open DIR] [-seed N] [-reps N] [-origins N] [-step N] [-workers N] [-json]
//
// Flags:
//
//	-open     directory of monthly.csv and quarterly.csv from
//	          testdata/open/gen_open.py; "" leaves the open data out
//	          (default testdata/open, run from the repository root)
//	-seed     seed of the synthetic series (default 1)
//	-reps     synthetic series per family and frequency; 0 leaves them out
//	          (default 20)
//	-origins  most origins per series (default 5)
//	-step     periods between origins; 0 means the held-out length H
//	          (default 0)
//	-workers  series evaluated at once; 0 means one per core (default 0)
//	-json     print the results as indented JSON instead of tables
//
// The output depends only on the flags and the data (not on -workers), so
// it can be compared byte for byte between releases; the time taken goes to
// standard error. The exit status is 0 on success, 2 for bad flags and 1
// when the data cannot be read or the evaluation fails.
package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"time"

	"forelay/forecast"
	"forelay/scenario/evaluate"
)

func main() { os.Exit(run(os.Args[1:], os.Stdout, os.Stderr)) }

// Exit statuses of the command.
const (
	exitOK    = 0
	exitFail  = 1
	exitUsage = 2
)

// options are the command-line settings after parsing.
type options struct {
	open    string
	seed    uint64
	reps    int
	origins int
	step    int
	workers int
	json    bool
	from    string
}

// parseFlags reads the command line. Errors are usage errors; flag's own
// messages go to errOut.
func parseFlags(args []string, errOut io.Writer) (options, error) {
	fs := flag.NewFlagSet("evaluate", flag.ContinueOnError)
	fs.SetOutput(errOut)
	var o options
	fs.StringVar(&o.open, "open", "testdata/open", `directory of the open data ("" leaves it out)`)
	fs.Uint64Var(&o.seed, "seed", 1, "seed of the synthetic series")
	fs.IntVar(&o.reps, "reps", 20, "synthetic series per family and frequency (0 leaves them out)")
	fs.IntVar(&o.origins, "origins", 5, "most origins per series")
	fs.IntVar(&o.step, "step", 0, "periods between origins (0: the held-out length)")
	fs.IntVar(&o.workers, "workers", 0, "series evaluated at once (0: one per core)")
	fs.BoolVar(&o.json, "json", false, "print JSON instead of tables")
	fs.StringVar(&o.from, "bands-from", "calibrated", "what the bands rest on: calibrated or model (the release before calibration)")
	if err := fs.Parse(args); err != nil {
		return o, err
	}
	switch {
	case fs.NArg() > 0:
		return o, fmt.Errorf("unexpected argument %q", fs.Arg(0))
	case o.reps < 0 || o.reps > 1000:
		return o, fmt.Errorf("-reps %d: want 0..1000", o.reps)
	case o.origins < 1 || o.origins > 100:
		return o, fmt.Errorf("-origins %d: want 1..100", o.origins)
	case o.step < 0:
		return o, fmt.Errorf("-step %d: want 0 or more", o.step)
	case o.workers < 0:
		return o, fmt.Errorf("-workers %d: want 0 or more", o.workers)
	case o.open == "" && o.reps == 0:
		return o, errors.New(`-open "" and -reps 0 leave nothing to evaluate`)
	}
	return o, nil
}

// run is the whole command; it returns the exit status.
func run(args []string, stdout, stderr io.Writer) int {
	o, err := parseFlags(args, stderr)
	if errors.Is(err, flag.ErrHelp) {
		return exitOK
	}
	if err != nil {
		fmt.Fprintln(stderr, "evaluate:", err)
		return exitUsage
	}
	var cases []evaluate.Case
	if o.open != "" {
		open, err := evaluate.ReadOpen(o.open)
		if err != nil {
			fmt.Fprintln(stderr, "evaluate:", err)
			return exitFail
		}
		cases = open
	}
	cases = append(cases, evaluate.Synthetic(o.seed, o.reps, nil)...)
	start := time.Now()
	from, err := forecast.ParseBandSource(o.from)
	if err != nil {
		fmt.Fprintln(stderr, "evaluate: -bands-from:", err)
		return exitUsage
	}
	cfg := evaluate.Config{MaxOrigins: o.origins, Step: o.step, Workers: o.workers, From: from}
	if from == forecast.FromModel {
		cfg.SafetyStock = evaluate.SigmaSqrtL
	}
	res, err := evaluate.Run(cases, cfg)
	if err != nil {
		fmt.Fprintln(stderr, "evaluate:", err)
		return exitFail
	}
	fmt.Fprintf(stderr, "evaluate: %d series in %.1f s\n", len(cases), time.Since(start).Seconds())
	if o.json {
		err = writeJSON(stdout, res)
	} else {
		err = writeReport(stdout, res, o)
	}
	if err != nil {
		fmt.Fprintln(stderr, "evaluate:", err)
		return exitFail
	}
	return exitOK
}

// writeJSON writes the results as one JSON object with one list element a
// line, so that two runs diff line by line and the file stays small.
func writeJSON(w io.Writer, res *evaluate.Results) error {
	st, err := json.Marshal(res.Settings)
	if err != nil {
		return err
	}
	var b bytes.Buffer
	fmt.Fprintf(&b, "{\n \"settings\": %s", st)
	err = errors.Join(
		writeList(&b, "cases", res.Cases),
		writeList(&b, "slices", res.Slices),
		writeList(&b, "groups", res.Groups),
		writeList(&b, "accuracy", res.Accuracy),
		writeList(&b, "failures", res.Failures),
	)
	if err != nil {
		return err
	}
	b.WriteString("\n}\n")
	_, err = w.Write(b.Bytes())
	return err
}

// writeList writes `,\n "key": [` and the elements, one a line.
func writeList[T any](b *bytes.Buffer, key string, list []T) error {
	fmt.Fprintf(b, ",\n %q: [", key)
	for i, v := range list {
		line, err := json.Marshal(v)
		if err != nil {
			return err
		}
		if i > 0 {
			b.WriteString(",")
		}
		fmt.Fprintf(b, "\n  %s", line)
	}
	if len(list) > 0 {
		b.WriteString("\n ")
	}
	b.WriteString("]")
	return nil
}
