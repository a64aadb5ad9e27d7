package main

import (
	"bytes"
	"errors"
	"fmt"
	"forelay/scenario/data"
	"forelay/scenario/report"
	"io"
	"math"
	"os"
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
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
}

func newCmdFit(f *Factory, runF func(*FitOptions) error) *cobra.Command {
	opts := &FitOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "fit --history FILE [flags]",
		Short: "Fit a baseline forecast to a history and report its accuracy",
		Long: `Fit a statistical baseline to each series of a history file and show the
method, its parameters, its accuracy (in-sample and in a rolling-origin
backtest) and the forecast with error bands.

The history is a CSV file, either wide (a "period" column, then one column per
series) or long (columns "series", "period" and "value"). Periods look like
2026-03 (month), 2026-03-15 (day, or week when 7 days apart), 2026-W11 (ISO
week), 2026-Q1 (quarter) or 2026 (year).

With --method auto (the default) every suitable method is backtested and the
one with the lowest error on --metric wins; the table shows every candidate.`,
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
			if l := opts.Shared.limits(); int64(opts.Baseline.Horizon) > l.get("horizon") {
				return l.exceeded("--horizon", "horizon", int64(opts.Baseline.Horizon))
			}
			opts.Baseline.record(cmd)
			if runF != nil {
				return runF(opts)
			}
			return fitRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.History, "history", "", "history CSV file (required)")
	fl.StringVar(&opts.Series, "series", "", "fit only this series (default: every series in the file)")
	fl.StringVar(&opts.Period, "period", "", "force the frequency: day, week, month, quarter or year (default: inferred)")
	fl.StringVar(&opts.Fill, "fill", "none", "missing periods: none (an error), zero or interpolate")
	fl.StringVar(&opts.Units, "units", "", "unit of the values, for the tables (e.g. litres)")
	fl.BoolVar(&opts.JSON, "json", false, "print one JSON object per series per line")
	fl.IntVar(&opts.Workers, "workers", 0, "series fitted in parallel, at least 1 (default: one per core)")
	opts.Baseline.register(fl)
	return cmd
}

// loadHistory reads a history file with the period and fill flags, under
// the size limits.
func loadHistory(path, period, fill string, l limits) (*data.History, error) {
	freq, err := forecast.ParseFrequency(period)
	if err != nil {
		return nil, &flagError{err: fmt.Errorf("--period: %w", err)}
	}
	fm, err := data.ParseFillMode(fill)
	if err != nil {
		return nil, &flagError{err: fmt.Errorf("--fill: %w", err)}
	}
	fh, err := os.Open(path)
	if err != nil {
		return nil, &inputError{err: err}
	}
	defer fh.Close()
	h, err := data.ReadHistory(data.BoundedReader(fh, path, l.input()), path, data.ReadOptions{Freq: freq, Fill: fm})
	if err != nil {
		return nil, &inputError{err: err}
	}
	if err := h.CheckNameLength(int(l.get("name-length"))); err != nil {
		return nil, &inputError{err: err}
	}
	return h, nil
}

func fitRun(opts *FitOptions) error {
	spec, bands, err := opts.Baseline.spec()
	if err != nil {
		return err
	}
	h, err := loadHistory(opts.History, opts.Period, opts.Fill, opts.Shared.limits())
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
	for _, fl := range h.Filled {
		if opts.Series == "" || fl.Series == opts.Series {
			fmt.Fprintf(opts.IO.ErrOut, "note: %s: series %q has no value for %s; filled with %s (--fill %s)\n",
				fileLine(opts.History, fl.Line), fl.Series, fl.Period, fmtNum(fl.Value, 2), opts.Fill)
		}
	}
	outcomes := forecast.FitAll(series, spec, opts.Workers)
	var warns []string
	for _, oc := range outcomes {
		if oc.Err == nil {
			warns = append(warns, oc.Result.Warnings()...)
		}
	}
	if err := warnings(opts.IO, opts.Shared, warns); err != nil {
		return err
	}
	var out bytes.Buffer
	var failed []error
	for i, oc := range outcomes {
		horizon := spec.Horizon
		if horizon == 0 {
			horizon = series[i].Freq().DefaultHorizon()
		}
		if oc.Err != nil {
			err := fmt.Errorf("%s: %w", opts.History, oc.Err)
			failed = append(failed, err)
			if opts.JSON {
				line, _ := marshalLine(map[string]string{"series": series[i].Name, "error": err.Error()})
				out.Write(line)
			}
			continue
		}
		if opts.JSON {
			line, err := marshalLine(report.Fit(oc.Result, horizon, bands))
			if err != nil {
				return err
			}
			out.Write(line)
			continue
		}
		if i > 0 {
			out.WriteString("\n")
		}
		if err := writeFitText(&out, oc.Result, horizon, bands, opts.Units); err != nil {
			return err
		}
	}
	if _, err := opts.IO.Out.Write(out.Bytes()); err != nil {
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

// writeFitText writes the human report of one fitted series.
func writeFitText(w io.Writer, r *forecast.Result, horizon int, b bandSettings, units string) error {
	s := r.Series
	unit := ""
	if units != "" {
		unit = " (" + units + ")"
	}
	fmt.Fprintf(w, "Series %s: %d %s periods, %s to %s\n", s.Name, s.Len(), s.Freq(), s.Start, s.Period(s.Len()-1))
	how := "as asked"
	if r.Auto {
		if r.Select == forecast.SelectAICc {
			how = "chosen by lowest AICc"
		} else {
			how = fmt.Sprintf("chosen by lowest backtest %s", strings.ToUpper(r.Metric.String()))
		}
	}
	fmt.Fprintf(w, "Method %s (%s)", r.Method, how)
	if d := r.Model.Describe(); d != "" {
		fmt.Fprintf(w, ", %s", d)
	}
	fmt.Fprintln(w)
	if p := report.ParamText(r.Model.Params()); p != "" {
		fmt.Fprintf(w, "Parameters %s (final fit on all %d periods)\n", p, s.Len())
	}
	if err := writeMembers(w, r); err != nil {
		return err
	}
	fmt.Fprintln(w)

	if err := writeAccuracy(w, r, unit); err != nil {
		return err
	}
	if len(r.Candidates) > 0 {
		fmt.Fprintln(w)
		ct := newTable("candidate", "settings", "MAD", "MSE", "MAPE %", "MASE", "AICc").Left(1)
		for _, c := range r.Candidates {
			mark := "  "
			if c.Chosen {
				mark = "* "
			}
			if c.Skipped != "" {
				ct.AddRow(mark+c.Method.String(), "skipped: "+c.Skipped)
				continue
			}
			p := report.ParamText(c.Params)
			if c.Describe != "" {
				p = strings.TrimSpace(p + " " + c.Describe)
			}
			mad, mse, mape, mase := "-", "-", "-", "-"
			if a := c.Backtest; a != nil {
				mad, mse, mape, mase = fmtNum(a.MAD, 1), fmtNum(a.MSE, 0), fmtNum(a.MAPE, 2), fmtNum(a.MASE, 3)
			}
			ct.AddRow(mark+c.Method.String(), p, mad, mse, mape, mase, fmtNum(c.AICc, 1))
		}
		if err := writeTable(w, ct); err != nil {
			return err
		}
		switch {
		case !r.Auto:
			fmt.Fprintf(w, "* = asked for: the mean of the best %d candidates by backtest %s (errors pooled over every origin and lead time).\n",
				len(forecast.Members(r.Model)), strings.ToUpper(r.Metric.String()))
			fmt.Fprintln(w, candidateNote(r))
		case r.Select == forecast.SelectAICc:
			fmt.Fprintln(w, "* = chosen: lowest AICc of the in-sample fit; settings and parameters are those of the fit on all the data.")
		default:
			fmt.Fprintf(w, "* = chosen: lowest backtest %s (errors pooled over every origin and lead time).\n", strings.ToUpper(r.Metric.String()))
			if note := penaltyNote(r); note != "" {
				fmt.Fprintln(w, note)
			}
			fmt.Fprintln(w, candidateNote(r))
		}
	}

	fmt.Fprintln(w)
	pts := r.ForecastFrom(horizon, b.Z, b.Mode, b.From)
	_, src := r.VarianceFrom(horizon, b.Mode, b.From)
	fmt.Fprintf(w, "Forecast%s; band = forecast +- %.3g x standard error (%s; %.1f%% if errors are normal)\n",
		unit, b.Z, report.BandSourceText(src, r.Calibration()), 100*forecast.Coverage(b.Z))
	ft := newTable("period", "forecast", "lower", "upper")
	for _, p := range pts {
		ft.AddRow(p.Period.String(), fmtNum(p.Value, 1), fmtNum(p.Lower, 1), fmtNum(p.Upper, 1))
	}
	return writeTable(w, ft)
}

// writeAccuracy writes the accuracy table with its bias tests, its notes
// and the flags on the fit ("Check: ..." lines).
func writeAccuracy(w io.Writer, r *forecast.Result, unit string) error {
	acc := newTable("accuracy"+unit, "points", "MAD", "MSE (/"+r.Accuracy.Divisor.String()+")", "RMSE", "MAPE %", "MASE", "bias", "one-step bias", "t", "p")
	accRow(acc, "in-sample, one step ahead", r.Accuracy, r.Bias)
	if bt := r.Backtest; bt != nil {
		accRow(acc, fmt.Sprintf("backtest, %d origins", bt.Origins), bt.Accuracy, bt.Bias)
	}
	if err := writeTable(w, acc); err != nil {
		return err
	}
	fmt.Fprintln(w, "bias: mean error (actual - forecast), over every lead time in the backtest. Bias test: t = one-step bias / its")
	fmt.Fprintln(w, "Newey-West (1987) standard error, p two-sided from Student's t; the backtest's one-step errors, one per origin, do not overlap.")
	if r.Accuracy.MAPESkipped > 0 {
		fmt.Fprintf(w, "MAPE leaves out %d period(s) with zero actuals.\n", r.Accuracy.MAPESkipped)
	}
	writeFlags(w, r)
	return nil
}

func accRow(t *table, label string, a forecast.Accuracy, b forecast.BiasTest) {
	p := "-"
	switch {
	case math.IsNaN(b.P):
	case b.P < 0.001:
		p = "<0.001"
	default:
		p = fmt.Sprintf("%.3f", b.P)
	}
	t.AddRow(label, fmt.Sprint(a.N), fmtNum(a.MAD, 1), fmtNum(a.MSE, 0),
		fmtNum(a.RMSE, 1), fmtNum(a.MAPE, 2), fmtNum(a.MASE, 3), fmtNum(a.Bias, 1), fmtNum(b.Mean, 1), signedT(b.T), p)
}

// signedT formats a t statistic with a sign and two decimals, "-" for NaN.
func signedT(t float64) string {
	if math.IsNaN(t) {
		return "-"
	}
	return report.Signed(t, 2)
}

// writeMembers lists the members of a combination with their settings and
// parameters, one line each; nothing for a single method.
func writeMembers(w io.Writer, r *forecast.Result) error {
	members := forecast.Members(r.Model)
	if len(members) == 0 {
		return nil
	}
	fmt.Fprintf(w, "Members, averaged with equal weights (each a final fit on all %d periods):\n", r.Series.Len())
	width := 0
	for _, md := range members {
		width = max(width, len(md.Method().String()))
	}
	for _, md := range members {
		line := fmt.Sprintf("  %-*s  %s", width, md.Method(), memberSettings(md))
		if _, err := fmt.Fprintln(w, strings.TrimRight(line, " ")); err != nil {
			return err
		}
	}
	return nil
}

// memberSettings joins a model's parameters and settings.
func memberSettings(md forecast.Model) string {
	return strings.TrimSpace(report.ParamText(md.Params()) + " " + md.Describe())
}

// penaltyNote says by how much a single method's backtest error counted
// more than the combination's in the selection; "" when it did not.
func penaltyNote(r *forecast.Result) string {
	bt := r.Backtest
	if bt == nil {
		return ""
	}
	k := forecast.FewOriginsFactor(bt.Origins)
	if k == 1 {
		return ""
	}
	return fmt.Sprintf("With %d origins (fewer than 36) a single method's %s counted %.3f times: it had to beat the combination by that margin.",
		bt.Origins, strings.ToUpper(r.Metric.String()), k)
}

// candidateNote says where the candidates' figures come from, so that
// they do not seem to contradict the final fit shown above the table.
func candidateNote(r *forecast.Result) string {
	n := r.Series.Len()
	if bt := r.Backtest; bt != nil {
		s := r.Series
		return fmt.Sprintf("Candidate settings and parameters are fitted on the backtest's first training window (%s to %s, %d periods) "+
			"and its errors scored over %d origins; the parameters at the top are the final fit on all %d periods.",
			s.Start, s.Period(bt.Train-1), bt.Train, bt.Origins, n)
	}
	return fmt.Sprintf("Candidate settings and parameters are fitted on the backtest's first training window; "+
		"the parameters at the top are the final fit on all %d periods.", n)
}

// fileLine formats "file:line", or just the file when line is 0.
func fileLine(file string, line int) string {
	if line > 0 {
		return fmt.Sprintf("%s:%d", file, line)
	}
	return file
}

// writeFlags writes what may make the baseline weak, one "Check:" line
// each (see forecast.Result.Flags).
func writeFlags(w io.Writer, r *forecast.Result) {
	for _, s := range r.Flags() {
		fmt.Fprintf(w, "Check: %s\n", s)
	}
}
