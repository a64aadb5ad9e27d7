package main

import (
	"errors"
	"fmt"
	"forelay/scenario/bounds"
	"io"

	"github.com/spf13/cobra"

	"forelay/forecast"
	"forelay/scenario/data"
	"forelay/scenario/report"
)

// FitOptions are the settings of "forelay fit".
type FitOptions struct {
	IO       *IOStreams
	Shared   *sharedFlags
	History  string
	Series   string
	Period   string
	Fill     string
	Units    string
	JSON     bool
	Workers  int
	Baseline baselineFlags
	// Format is --sheet and --decimal.
	Format formatFlags
	// Shard, when set, is K/N: fit shard K of N of the history's series
	// into Out; Args are the flags given, for its manifest.
	Shard, Out string
	Args       []string
}

func newCmdFit(f *Factory, runF func(*FitOptions) error) *cobra.Command {
	opts := &FitOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "fit --history FILE [flags]",
		Short: "Fit a baseline forecast to a history and report its accuracy",
		Long:  helpText("fit"),
		Example: `  forelay fit --history examples/dairy/history.csv --series bottled-l
  forelay fit --history sales.csv --method holt-winters-additive --horizon 18 --coverage 0.9
  forelay fit --history sales.csv --json > fits.jsonl`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if opts.History == "" {
				return flagErrorf("--history is required")
			}
			if cmd.Flags().Changed("workers") && opts.Workers < 1 {
				return flagErrorf("--workers %d: must be at least 1 (leave it out for one worker per core)", opts.Workers)
			}
			if err := opts.Format.check(); err != nil {
				return err
			}
			if l := opts.Shared.limits(); int64(opts.Baseline.Horizon) > l.Get("horizon") {
				return &flagError{err: l.Exceeded("--horizon", "horizon", int64(opts.Baseline.Horizon))}
			}
			opts.Baseline.record(cmd)
			opts.Args = givenFlags(cmd)
			if runF != nil {
				return runF(opts)
			}
			return fitRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.History, "history", "", "history file, CSV or workbook (.xlsx) (required)")
	fl.StringVar(&opts.Series, "series", "", "fit only this series (default: every series in the file)")
	fl.StringVar(&opts.Period, "period", "", "force the frequency: day, week, month, quarter or year (default: inferred)")
	fl.StringVar(&opts.Fill, "fill", "none", "missing periods: none (an error), zero or interpolate")
	fl.StringVar(&opts.Units, "units", "", "unit of the values, for the tables (e.g. litres)")
	fl.BoolVar(&opts.JSON, "json", false, "print one JSON object per series per line")
	fl.IntVar(&opts.Workers, "workers", 0, "series fitted in parallel, at least 1 (default: one per core)")
	fl.StringVar(&opts.Shard, "shard", "", "fit shard K of N (K from 0): the series whose FNV-1a hash of the name mod N is K, as JSON lines into --out; forelay merge joins the shards")
	fl.StringVar(&opts.Out, "out", "", "with --shard, the directory to write the shard into")
	opts.Baseline.register(fl)
	opts.Format.register(fl, "history")
	return cmd
}

// loadHistory reads a history file with the period and fill flags, in
// format, under the size limits.
func loadHistory(path, period, fill string, format data.Format, l bounds.Set) (*data.History, error) {
	return loadHistoryKeep(path, period, fill, format, l, nil)
}

// loadHistoryKeep is loadHistory keeping whole only the series keep says
// (nil: all; see data.ReadOptions.Keep).
func loadHistoryKeep(path, period, fill string, format data.Format, l bounds.Set, keep func(string) bool) (*data.History, error) {
	freq, err := forecast.ParseFrequency(period)
	if err != nil {
		return nil, &flagError{err: fmt.Errorf("--period: %w", err)}
	}
	fm, err := data.ParseFillMode(fill)
	if err != nil {
		return nil, &flagError{err: fmt.Errorf("--fill: %w", err)}
	}
	h, err := data.ReadFile(path, data.ReadOptions{Freq: freq, Fill: fm, Format: format, Keep: keep}, l.Input(), int(l.Get("name-length")))
	if err != nil {
		return nil, &inputError{err: err}
	}
	return h, nil
}

func fitRun(opts *FitOptions) error {
	if s, ok, err := parseShard(opts.Shard, opts.Out); err != nil || ok {
		if err != nil {
			return err
		}
		return fitShardRun(opts, s)
	}
	if opts.Out != "" {
		return flagErrorf("--out %s: fit writes to standard output; --out goes with --shard", opts.Out)
	}
	spec, bands, err := opts.Baseline.spec()
	if err != nil {
		return err
	}
	h, err := loadHistory(opts.History, opts.Period, opts.Fill, opts.Format.format(data.DecimalPoint), opts.Shared.limits())
	if err != nil {
		return err
	}
	series := h.Series
	if opts.Series != "" {
		s, err := h.Lookup(opts.Series)
		if err != nil {
			return &inputError{err: fmt.Errorf("%s: %w", opts.History, err)}
		}
		series = []forecast.Series{s}
	}
	if h.Read != "" {
		fmt.Fprintf(opts.IO.ErrOut, "note: %s: read with %s\n", opts.History, h.Read)
	}
	for _, fl := range h.Filled {
		if opts.Series == "" || fl.Series == opts.Series {
			fmt.Fprintf(opts.IO.ErrOut, "note: %s\n", report.FillNote(opts.History, opts.Fill, fl))
		}
	}
	outcomes := forecast.FitAllProgress(series, spec, opts.Workers, opts.Shared.progress("fitting series"))
	var warns []string
	for _, oc := range outcomes {
		if oc.Err == nil {
			warns = append(warns, oc.Result.Warnings()...)
		}
	}
	if err := warnings(opts.IO, opts.Shared, warns); err != nil {
		return err
	}
	out, failed, err := report.Fits(opts.History, series, outcomes, spec.Horizon, bands, opts.Units, opts.JSON)
	if err != nil {
		return err
	}
	if _, err := io.WriteString(opts.IO.Out, out.String()); err != nil {
		return err
	}
	if len(failed) > 0 {
		joined := errors.Join(failed...)
		if errors.Is(joined, forecast.ErrInternal) {
			return joined // exit code 1: a bug, not the user's data
		}
		return &inputError{err: joined}
	}
	return nil
}
