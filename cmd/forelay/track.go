package main

import (
	"fmt"
	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"io"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
)

// TrackOptions are the settings of "forelay track".
type TrackOptions struct {
	IO     *IOStreams
	Shared *sharedFlags
	// File is the scenario file; Actuals the CSV of new actuals.
	File, Actuals string
	// Scenario names the scenario to track; empty picks the only one, or
	// the one called "plan".
	Scenario string
	// PlanDir, when set, holds the plan.json to read instead of building
	// the plan again.
	PlanDir string
	// Out, when set, is the directory for track.csv and the charts.
	Out string
	// JSON prints the JSON report instead of the tables.
	JSON bool
	// TSLimit is the tracking signal's limit; zero means the signal's
	// default (4, or Trigg's 95% limit for the smoothed signal).
	TSLimit float64
	// Signal is "cumulative" or "smoothed".
	Signal string
	// Z is the control limit in sigmas; MADSmoothing the smoothing
	// constant of the MAD.
	Z, MADSmoothing float64
	// FailOn is "", "bias", "outlier" or "any".
	FailOn string
}

func newCmdTrack(f *Factory, runF func(*TrackOptions) error) *cobra.Command {
	opts := &TrackOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "track FILE --actuals CSV [--scenario NAME] [--plan DIR]",
		Short: "Follow new actuals against a plan: tracking signal, control chart, verdict",
		Long: `Compare new actuals with the adjusted plan of one scenario, period by period:
the error (actual minus plan), the cumulative error, a running MAD, the tracking
signal, the error's position on a control chart, and a verdict:

  in-control  the errors look like the plan's usual noise
  bias        the tracking signal is beyond its limit (also with the errors
              beyond the control limits left out), or a Western Electric
              run rule of drift fired: re-forecast
  outlier     an error beyond the control limits, and no drift: the signal
              is within its limit once such errors are left out; check for
              an unplanned event

The plan is built again from FILE, or read from DIR/plan.json with --plan
(written earlier by "forelay plan --out DIR"). The actuals use the history
layouts, hold the plan's series, start at the first plan period and run
without gaps.

The running MAD starts at the baseline's in-sample MAD and is updated with
each new error e_t as MAD_t = a |e_t| + (1-a) MAD_t-1, a = --mad-smoothing.
The control limits are +-z sqrt(MSE), with the baseline's in-sample MSE.

With --out DIR it also writes track.csv, control.png/.svg and signal.png/.svg.
Exit codes: 0 done, 1 internal failure, 2 bad flags or input files, 3 when the
latest period's verdict is one --fail-on names (the report is printed first).`,
		Example: `  forelay track examples/dairy/plan.yaml --actuals examples/dairy/actuals.csv --scenario with-contract
  forelay track plan.yaml --actuals new.csv --plan out --fail-on bias
  forelay track plan.yaml --actuals new.csv --signal smoothed --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if opts.Actuals == "" {
				return flagErrorf("--actuals is required")
			}
			if runF != nil {
				return runF(opts)
			}
			return trackRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.Actuals, "actuals", "", "CSV of new actuals (history layouts), starting at the first plan period")
	fl.StringVar(&opts.Scenario, "scenario", "", `scenario to track (default: the only one, or the one called "plan")`)
	fl.StringVar(&opts.PlanDir, "plan", "", "read the plan from DIR/plan.json instead of building it again")
	fl.StringVar(&opts.Out, "out", "", "directory to write track.csv, control.png/.svg and signal.png/.svg into")
	fl.BoolVar(&opts.JSON, "json", false, "print the report as JSON instead of the tables")
	fl.Float64Var(&opts.TSLimit, "ts-limit", 0, "tracking signal limit (default 4 for cumulative, Trigg's 95% limit for smoothed)")
	fl.StringVar(&opts.Signal, "signal", "cumulative", "tracking signal: cumulative or smoothed (Trigg)")
	fl.Float64Var(&opts.Z, "z", 3, "control limits in sigmas")
	fl.Float64Var(&opts.MADSmoothing, "mad-smoothing", 0.1, "smoothing constant of the running MAD, in (0, 1]")
	fl.StringVar(&opts.FailOn, "fail-on", "", "exit with code 3 when the latest verdict is bias, outlier or any of the two")
	return cmd
}

// trackSettings checks the flags and returns the tracking configuration
// (without the plan's MAD and MSE) and the verdicts --fail-on names.
func trackSettings(opts *TrackOptions) (forecast.TrackConfig, []forecast.Verdict, error) {
	var cfg forecast.TrackConfig
	sig, err := forecast.ParseSignal(opts.Signal)
	if err != nil {
		return cfg, nil, flagErrorf("--signal: unknown signal %q (want cumulative or smoothed)", opts.Signal)
	}
	cfg.Signal = sig
	switch {
	case !(opts.TSLimit >= 0) || math.IsInf(opts.TSLimit, 0):
		return cfg, nil, flagErrorf("--ts-limit must be positive (or 0 for the default), got %v", opts.TSLimit)
	case sig == forecast.SignalSmoothed && opts.TSLimit >= 1:
		return cfg, nil, flagErrorf("--ts-limit must be below 1 for the smoothed signal, which never exceeds 1; got %v", opts.TSLimit)
	case !(opts.Z > 0) || math.IsInf(opts.Z, 0):
		return cfg, nil, flagErrorf("--z must be positive, got %v", opts.Z)
	case !(opts.MADSmoothing > 0 && opts.MADSmoothing <= 1):
		return cfg, nil, flagErrorf("--mad-smoothing must lie in (0, 1], got %v", opts.MADSmoothing)
	}
	cfg.TSLimit, cfg.Z, cfg.MADSmoothing = opts.TSLimit, opts.Z, opts.MADSmoothing
	// The rest (Trigg's limit needs the smoothing in its table's range)
	// is checked by Resolved; the MAD and MSE here only stand in for the
	// plan's.
	probe := cfg
	probe.InitialMAD, probe.MSE = 1, 1
	if _, err := probe.Resolved(); err != nil {
		return cfg, nil, flagErrorf("--mad-smoothing %v: %v", opts.MADSmoothing, err)
	}
	var fail []forecast.Verdict
	switch strings.ToLower(opts.FailOn) {
	case "":
	case "bias":
		fail = []forecast.Verdict{forecast.Bias}
	case "outlier":
		fail = []forecast.Verdict{forecast.Outlier}
	case "any":
		fail = []forecast.Verdict{forecast.Bias, forecast.Outlier}
	default:
		return cfg, nil, flagErrorf("--fail-on: unknown verdict %q (want bias, outlier or any)", opts.FailOn)
	}
	return cfg, fail, nil
}

func trackRun(opts *TrackOptions) error {
	cfg, failOn, err := trackSettings(opts)
	if err != nil {
		return err
	}
	tp, source, warns, err := loadTrackPlan(opts)
	if err != nil {
		return err
	}
	line, err := tp.Choose(opts.Scenario)
	if err != nil {
		if opts.Scenario != "" {
			return flagErrorf("--scenario: %v", err)
		}
		return flagErrorf("%v (with --scenario)", err)
	}
	fh, err := os.Open(opts.Actuals)
	if err != nil {
		return &inputError{err: err}
	}
	actual, err := tp.ReadActuals(data.BoundedReader(fh, opts.Actuals, opts.Shared.limits().input()), opts.Actuals)
	fh.Close()
	if err != nil {
		return &inputError{err: err}
	}
	tr, err := tp.Track(line.Name, actual, cfg)
	if err != nil {
		return &inputError{err: err}
	}
	rep := trackReport{tp: tp, tr: tr, source: source, defaultLimit: opts.TSLimit == 0, warnings: warns}
	control, signal := trackCharts(rep)
	out := &report.Report{Name: "track", NoJSONFile: true, Warnings: warns, Doc: trackJSON(rep), CSV: trackCSV(rep),
		Charts: []report.Chart{{Name: "control", Plot: control}, {Name: "signal", Plot: signal}}}
	writeTrackText(&out.Text, rep)
	err = emit(opts.IO, opts.Shared, opts.Out, opts.JSON, false, out)
	if err != nil {
		return err
	}
	per, last := tr.Latest()
	for _, v := range failOn {
		if last.Verdict == v {
			return &alertError{msg: fmt.Sprintf("--fail-on %s: the latest period, %s, is %s", strings.ToLower(opts.FailOn), per, v)}
		}
	}
	return nil
}

// trackReport is what the outputs of a tracking run are made from.
type trackReport struct {
	tp     plan.TrackPlan
	tr     *plan.Tracking
	source string // "read from out/plan.json" or "recomputed from plan.yaml"
	// defaultLimit is true when the tracking signal limit is the signal's
	// default rather than --ts-limit.
	defaultLimit bool
	// warnings are the plan's warnings, or those about plan.json's inputs.
	warnings []string
}

// loadTrackPlan builds the plan from the scenario file or reads it from
// plan.json, and says which; warns are the plan's warnings, or those about
// the inputs plan.json was made from.
func loadTrackPlan(opts *TrackOptions) (tp plan.TrackPlan, source string, warns []string, err error) {
	if opts.PlanDir == "" {
		p, err := buildPlan(opts.File, opts.Shared)
		if err != nil {
			return plan.TrackPlan{}, "", nil, err
		}
		return p.TrackPlan(), "recomputed from " + opts.File, p.Warnings, nil
	}
	path := filepath.Join(opts.PlanDir, "plan.json")
	tp, inputs, err := report.ReadPlan(path)
	if err != nil {
		return plan.TrackPlan{}, "", nil, &inputError{err: err}
	}
	if warns, err = checkInputs(opts.File, path, inputs); err != nil {
		return plan.TrackPlan{}, "", nil, err
	}
	return tp, "read from " + path, warns, nil
}

// checkInputs compares the digests plan.json records of the scenario and
// history files with the files as they are now, and returns a warning
// for each that differs or cannot be checked. A scenario file that does
// not load is an input error.
func checkInputs(file, planPath string, inputs map[string]string) ([]string, error) {
	f, err := scenario.Load(file)
	if err != nil {
		return nil, &inputError{err: err}
	}
	var warns []string
	for _, in := range []struct{ role, path string }{{"scenario", file}, {"history", f.History.File}} {
		want, ok := inputs[in.role]
		if !ok {
			warns = append(warns, fmt.Sprintf("%s records no digest of the %s file; cannot tell whether %s changed since", planPath, in.role, in.path))
			continue
		}
		got, err := data.Digest(in.path)
		if err != nil {
			warns = append(warns, fmt.Sprintf("cannot compare %s with the plan: %v", in.path, err))
			continue
		}
		if got != want {
			warns = append(warns, fmt.Sprintf("%s has changed since %s was written; the plan read may not match it (run forelay plan again, or leave out --plan)", in.path, planPath))
		}
	}
	return warns, nil
}

// writeTrackText writes the human report of a tracking run.
func writeTrackText(w io.Writer, r trackReport) {
	tp, tr := r.tp, r.tr
	c := tr.Config
	units := ""
	if tp.Units != "" {
		units = " " + tp.Units
	}
	dec := forecast.SpreadDecimals(tp.MAD)
	n := len(tr.Points)
	fmt.Fprintf(w, "Tracking %s against scenario %s of plan %s: %d %s period(s) %s to %s%s\n",
		tp.Series, tr.Scenario, tp.Name, n, tr.Periods[0].Freq, tr.Periods[0], tr.Periods[n-1], report.InUnits(tp.Units))
	fmt.Fprintf(w, "plan: %s\n", r.source)
	fmt.Fprintln(w, "Limits in force:")
	for _, l := range [...][2]string{
		{"tracking signal", signalText(r)},
		{"MAD", fmt.Sprintf("starts at %s%s (the baseline's in-sample MAD), then MAD_t = %s |error_t| + %s MAD_t-1",
			fmtNum(tp.MAD, dec), units, report.G3(c.MADSmoothing), report.G3(1-c.MADSmoothing))},
		{"control chart", fmt.Sprintf("sigma = sqrt(MSE) = %s%s; UCL %s, LCL %s%s (z = %s)",
			fmtNum(tr.Limits.Sigma, dec), units, report.Signed(tr.Limits.UCL, dec), report.Signed(tr.Limits.LCL, dec), units, report.G3(c.Z))},
	} {
		fmt.Fprintf(w, "  %-15s  %s\n", l[0], l[1])
	}
	fmt.Fprintln(w)

	sdec := 2
	if c.Signal == forecast.SignalSmoothed {
		sdec = 3
	}
	t := newTable("period", "actual", "plan", "error", "cum. error", "MAD", "tracking signal", "sigmas", "verdict", "rules")
	t.Left(8, 9)
	for i, p := range tr.Points {
		t.AddRow(tr.Periods[i].String(), fmtNum(p.Actual, dec), fmtNum(p.Plan, dec), report.Signed(p.Error, dec), report.Signed(p.CumError, dec),
			fmtNum(p.MAD, dec), report.Signed(p.TrackingSignal, sdec), report.Signed(p.Sigmas, 2), p.Verdict.String(), rulesText(p.Rules))
	}
	writeTable(w, t)
	fmt.Fprintln(w)

	va := tr.ValueAdded
	fmt.Fprintf(w, "Forecast value added over %d period(s) (error = actual - forecast):\n", va.N)
	ft := newTable("", "MAD", "bias")
	ft.AddRow("  adjusted plan", fmtNum(va.PlanMAD, dec), report.Signed(va.PlanBias, dec))
	ft.AddRow("  baseline", fmtNum(va.BaselineMAD, dec), report.Signed(va.BaselineBias, dec))
	writeTable(w, ft)
	fmt.Fprintln(w, fvaText(r, dec))
	fmt.Fprintln(w)
	fmt.Fprintln(w, latestText(r))
}

// signalText describes the tracking signal and its limit.
func signalText(r trackReport) string {
	c := r.tr.Config
	if c.Signal == forecast.SignalSmoothed {
		s := fmt.Sprintf("Trigg's smoothed error / MAD (smoothing %s); alarm beyond +-%s", report.G3(c.MADSmoothing), report.G3(c.TSLimit))
		if r.defaultLimit {
			s += " (the 95% limit for this smoothing)"
		}
		return s
	}
	return fmt.Sprintf("cumulative error / MAD; alarm beyond +-%s", report.G3(c.TSLimit))
}

// fvaText says whether the events helped.
func fvaText(r trackReport, dec int) string {
	tr := r.tr
	line, _ := r.tp.Choose(tr.Scenario)
	same := true
	for i := range tr.Points {
		if line.Adjusted[i] != tr.Baseline[i] {
			same = false
		}
	}
	va := tr.ValueAdded
	units := ""
	if r.tp.Units != "" {
		units = " " + r.tp.Units
	}
	share := ""
	if !math.IsNaN(va.ImprovementShare) {
		share = fmt.Sprintf(" (%s%% of the baseline's)", fmtNum(100*math.Abs(va.ImprovementShare), 1))
	}
	switch {
	case same:
		return fmt.Sprintf("Scenario %s changes nothing on these periods: the adjusted plan is the baseline.", tr.Scenario)
	case va.Improvement > 0:
		return fmt.Sprintf("The events helped: they cut the MAD by %s%s%s.", fmtNum(va.Improvement, dec), units, share)
	case va.Improvement < 0:
		return fmt.Sprintf("The events did not help: they raised the MAD by %s%s%s.", fmtNum(-va.Improvement, dec), units, share)
	}
	return "The events made no difference to the MAD on these periods."
}

// latestText is the verdict on the latest period in plain words.
func latestText(r trackReport) string {
	per, p := r.tr.Latest()
	c := r.tr.Config
	sdec := 2
	if c.Signal == forecast.SignalSmoothed {
		sdec = 3
	}
	var why []string
	side := p.Sigmas
	for _, rule := range p.Rules {
		switch rule {
		case forecast.RuleTrackingSignal:
			w := fmt.Sprintf("tracking signal %s beyond +-%s", report.Signed(p.TrackingSignal, sdec), report.G3(c.TSLimit))
			if p.Verdict == forecast.Outlier {
				w += fmt.Sprintf(", but %s without the %s", report.Signed(p.SignalWithoutOutliers, sdec), outlierPeriods(r))
			}
			why = append(why, w)
			side = p.TrackingSignal
		case forecast.RuleBeyondLimit:
			why = append(why, fmt.Sprintf("error %s sigma, beyond the %s-sigma limit", report.Signed(p.Sigmas, 2), report.G3(c.Z)))
		case forecast.RuleTwoOfThree:
			why = append(why, "two of the last three errors beyond 2 sigma on one side (we2)")
		case forecast.RuleFourOfFive:
			why = append(why, "four of the last five errors beyond 1 sigma on one side (we3)")
		case forecast.RuleEightInARow:
			why = append(why, "eight errors in a row on one side (we4)")
		}
	}
	dir := "actuals above the plan"
	if side < 0 {
		dir = "actuals below the plan"
	}
	switch p.Verdict {
	case forecast.Bias:
		return fmt.Sprintf("%s: bias: %s (%s); re-forecast.", per, strings.Join(why, "; "), dir)
	case forecast.Outlier:
		return fmt.Sprintf("%s: outlier: %s (%s) with no sign of drift; check for an unplanned event.", per, strings.Join(why, "; "), dir)
	}
	return fmt.Sprintf("%s: in-control: tracking signal %s within +-%s, error %s sigma; no action needed.",
		per, report.Signed(p.TrackingSignal, sdec), report.G3(c.TSLimit), report.Signed(p.Sigmas, 2))
}

// outlierPeriods names the tracked periods whose error lies beyond the
// control limits: "error beyond the limits in 2027-01" or "errors beyond
// the limits in 2027-01, 2027-03".
func outlierPeriods(r trackReport) string {
	var per []string
	for i, p := range r.tr.Points {
		if slices.Contains(p.Rules, forecast.RuleBeyondLimit) {
			per = append(per, r.tr.Periods[i].String())
		}
	}
	if len(per) == 1 {
		return "error beyond the limits in " + per[0]
	}
	return "errors beyond the limits in " + strings.Join(per, ", ")
}

// rulesText lists rule names, "-" for none.
func rulesText(rules []forecast.Rule) string {
	if len(rules) == 0 {
		return "-"
	}
	s := make([]string, len(rules))
	for i, r := range rules {
		s[i] = r.String()
	}
	return strings.Join(s, ", ")
}
