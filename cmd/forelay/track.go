package main

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/plan"
	"forelay/scenario/report"
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
	// XLSX also writes track.xlsx into Out.
	XLSX bool
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
	// Workers plans the series of a portfolio in parallel; 0: one per
	// core.
	Workers int
	// Format is --sheet and --decimal for the actuals; without --decimal
	// the scenario file's history.decimal applies.
	Format formatFlags
}

func newCmdTrack(f *Factory, runF func(*TrackOptions) error) *cobra.Command {
	opts := &TrackOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "track FILE --actuals CSV [--scenario NAME] [--plan DIR]",
		Short: "Follow new actuals against a plan: tracking signal, control chart, verdict",
		Long:  helpText("track"),
		Example: `  forelay track examples/dairy/plan.yaml --actuals examples/dairy/actuals.csv --scenario with-contract
  forelay track plan.yaml --actuals new.csv --plan out --fail-on bias
  forelay track plan.yaml --actuals new.csv --signal smoothed --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if opts.Actuals == "" {
				return flagErrorf("--actuals is required")
			}
			if cmd.Flags().Changed("workers") && opts.Workers < 1 {
				return flagErrorf("--workers %d: must be at least 1 (leave it out for one worker per core)", opts.Workers)
			}
			if err := opts.Format.check(); err != nil {
				return err
			}
			if err := checkXLSX(opts.XLSX, opts.Out, "track"); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return trackRun(opts)
		},
	}
	fl := cmd.Flags()
	registerChartSize(fl, f.Shared)
	fl.StringVar(&opts.Actuals, "actuals", "", "new actuals, CSV or workbook (.xlsx) in the history layouts, starting at the first plan period")
	fl.StringVar(&opts.Scenario, "scenario", "", `scenario to track (default: the only one, or the one called "plan")`)
	fl.StringVar(&opts.PlanDir, "plan", "", "read the plan from DIR/plan.json instead of building it again")
	fl.StringVar(&opts.Out, "out", "", "directory to write track.csv, control.png/.svg and signal.png/.svg into (and track-rollups.csv, track-summary.csv for several series)")
	fl.BoolVar(&opts.JSON, "json", false, "print the report as JSON instead of the tables")
	addXLSXFlag(fl, &opts.XLSX, "track")
	fl.Float64Var(&opts.TSLimit, "ts-limit", 0, "tracking signal limit (default 4 for cumulative, Trigg's 95% limit for smoothed)")
	fl.StringVar(&opts.Signal, "signal", "cumulative", "tracking signal: cumulative or smoothed (Trigg)")
	fl.Float64Var(&opts.Z, "z", 3, "control limits in sigmas")
	fl.Float64Var(&opts.MADSmoothing, "mad-smoothing", 0.1, "smoothing constant of the running MAD, in (0, 1]")
	fl.StringVar(&opts.FailOn, "fail-on", "", "exit with code 3 when the latest verdict (of any series, in a plan of several) is bias, outlier or any of the two")
	fl.IntVar(&opts.Workers, "workers", 0, "series planned in parallel in a plan of several series, at least 1 (default: one per core); the report is the same for any number")
	opts.Format.register(fl, "actuals file")
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
	f, in, portfolio, err := trackFile(opts)
	if err != nil {
		return err
	}
	if portfolio {
		return portfolioTrackRun(opts, f, in, cfg, failOn)
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
	actual, err := readActuals(opts, tp, opts.Format.format(f.History.Decimal))
	if err != nil {
		return err
	}
	tr, err := tp.Track(line.Name, actual, cfg)
	if err != nil {
		return &inputError{err: err}
	}
	rep := report.ForTrack(report.Track{Plan: tp, Tracking: tr, Source: source, DefaultLimit: opts.TSLimit == 0, Warnings: warns})
	if err := emit(opts.IO, opts.Shared, opts.Out, opts.JSON, false, opts.XLSX, rep); err != nil {
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

// trackFile loads the scenario file and says whether it plans a
// portfolio: with --plan DIR, whether DIR/plan.json is a portfolio's;
// without, whether the series it selects make one (in is then read).
func trackFile(opts *TrackOptions) (f *scenario.File, in *plan.Inputs, portfolio bool, err error) {
	if f, err = loadFile(opts.File, opts.Shared); err != nil {
		return nil, nil, false, err
	}
	if opts.PlanDir != "" {
		return f, nil, report.IsPortfolioPlan(opts.PlanDir), nil
	}
	if in, err = plan.ReadSelection(f); err != nil {
		return nil, nil, false, &inputError{err: err}
	}
	return f, in, plan.WantsPortfolio(f, in), nil
}

// portfolioTrackRun tracks every series of a portfolio and its roll-ups.
func portfolioTrackRun(opts *TrackOptions, f *scenario.File, in *plan.Inputs, cfg forecast.TrackConfig, failOn []forecast.Verdict) error {
	pt, source, warns, err := loadPortfolioTrackPlan(opts, f, in)
	if err != nil {
		return err
	}
	acts, err := pt.ReadActualsFile(opts.Actuals, f.History.Key, opts.Format.format(f.History.Decimal), opts.Shared.limits().Input())
	if err != nil {
		return &inputError{err: err}
	}
	tr, err := pt.Track(opts.Scenario, acts, cfg)
	if errors.Is(err, plan.ErrScenarioChoice) {
		return flagErrorf("--scenario: %v", err)
	}
	if err != nil {
		return &inputError{err: err}
	}
	rep := report.ForPortfolioTrack(report.PortfolioTrack{Plan: pt, Tracking: tr, Source: source,
		DefaultLimit: opts.TSLimit == 0, Warnings: append(warns, acts.Warnings...)})
	if err := emit(opts.IO, opts.Shared, opts.Out, opts.JSON, false, opts.XLSX, rep); err != nil {
		return err
	}
	if msg := report.PortfolioAlert(tr, failOn, strings.ToLower(opts.FailOn)); msg != "" {
		return &alertError{msg: msg}
	}
	return nil
}

// loadPortfolioTrackPlan builds the portfolio from f and in, or reads it
// from DIR/plan.json, and says which; warns are the portfolio's warnings,
// or those about the inputs plan.json was made from.
func loadPortfolioTrackPlan(opts *TrackOptions, f *scenario.File, in *plan.Inputs) (*plan.PortfolioTrackPlan, string, []string, error) {
	if opts.PlanDir != "" {
		pt, source, warns, err := report.SavedPortfolioTrackPlan(f, opts.PlanDir)
		if err != nil {
			return nil, "", nil, &inputError{err: err}
		}
		return pt, source, warns, nil
	}
	pf, err := plan.BuildPortfolioProgress(f, in, opts.Workers, opts.Shared.progress("planning series"))
	if err != nil {
		return nil, "", nil, &inputError{err: err}
	}
	pt, err := pf.TrackPlan()
	if err != nil {
		return nil, "", nil, &inputError{err: err}
	}
	return pt, "recomputed from " + opts.File, pf.Warnings, nil
}

// loadTrackPlan builds the plan from the scenario file or reads it from
// plan.json (report.SavedTrackPlan), and says which; warns are the plan's
// warnings, or those about the inputs plan.json was made from.
func loadTrackPlan(opts *TrackOptions) (tp plan.TrackPlan, source string, warns []string, err error) {
	if opts.PlanDir == "" {
		p, err := buildPlan(opts.File, opts.Shared)
		if err != nil {
			return plan.TrackPlan{}, "", nil, err
		}
		return p.TrackPlan(), "recomputed from " + opts.File, p.Warnings, nil
	}
	tp, source, warns, err = report.SavedTrackPlan(opts.File, opts.PlanDir)
	if err != nil {
		return plan.TrackPlan{}, "", nil, &inputError{err: err}
	}
	return tp, source, warns, nil
}

// readActuals reads the actuals file under the size limits, aligned with
// the plan's periods (see plan.TrackPlan.ReadActualsFile).
func readActuals(opts *TrackOptions, tp plan.TrackPlan, format data.Format) ([]float64, error) {
	actual, err := tp.ReadActualsFile(opts.Actuals, format, opts.Shared.limits().Input())
	if err != nil {
		return nil, &inputError{err: err}
	}
	return actual, nil
}
