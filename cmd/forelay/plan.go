package main

import (
	"errors"
	"strconv"

	"github.com/spf13/cobra"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/report"
)

// PlanOptions are the settings of "forelay plan".
type PlanOptions struct {
	IO      *IOStreams
	Shared  *sharedFlags
	File    string
	Out     string
	JSON    bool
	Detail  bool
	NoChart bool
	// XLSX also writes plan.xlsx into Out.
	XLSX bool
	// Event, when set, adds the period-by-period account of one event.
	Event string
	// Workers plans the series of a portfolio in parallel; 0: one per
	// core.
	Workers int
	// Charts is how many of a portfolio's most-changed series get a
	// chart besides the total: a number, all or none.
	Charts string
	// Shard, when set, is K/N: plan shard K of N of a portfolio.
	Shard string
}

func newCmdPlan(f *Factory, runF func(*PlanOptions) error) *cobra.Command {
	opts := &PlanOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "plan FILE [--out DIR]",
		Short: "Build the adjusted plan from a scenario file",
		Long:  helpText("plan"),
		Example: `  forelay plan examples/dairy/plan.yaml --out out/dairy
  forelay plan plan.yaml --detail
  forelay plan plan.yaml --json | jq '.scenarios[].total'`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if cmd.Flags().Changed("workers") && opts.Workers < 1 {
				return flagErrorf("--workers %d: must be at least 1 (leave it out for one worker per core)", opts.Workers)
			}
			if err := checkXLSX(opts.XLSX, opts.Out, "plan"); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return planRun(opts)
		},
	}
	fl := cmd.Flags()
	registerChartSize(fl, f.Shared)
	fl.StringVar(&opts.Out, "out", "", "directory to write plan.csv, plan.json, plan.png and plan.svg into")
	fl.BoolVar(&opts.JSON, "json", false, "print plan.json to standard output instead of the tables")
	fl.BoolVar(&opts.Detail, "detail", false, "also print every period of every scenario")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "with --out, skip plan.png and plan.svg")
	addXLSXFlag(fl, &opts.XLSX, "plan")
	fl.StringVar(&opts.Event, "event", "", "also show how this event adds up, period by period")
	fl.StringVar(&opts.Charts, "charts", "5", "in a plan of several series, chart the total, each resource and this many of the most-changed series: a number, all or none (none also drops the total and the resources)")
	fl.StringVar(&opts.Shard, "shard", "", shardFlagHelp)
	fl.IntVar(&opts.Workers, "workers", 0, "series planned in parallel in a plan of several series, at least 1 (default: one per core); the plan is the same for any number")
	return cmd
}

// loadFile loads a scenario file under the run's limits; a failure is an
// input error (exit code 2).
func loadFile(path string, shared *sharedFlags) (*scenario.File, error) {
	f, err := scenario.LoadLimited(path, shared.limits().Scenario())
	if err != nil {
		return nil, &inputError{err: err}
	}
	return f, nil
}

// loadSelection loads a scenario file and reads its history and the
// series it selects (plan.ReadSelection); failures are input errors.
func loadSelection(path string, shared *sharedFlags) (*scenario.File, *plan.Inputs, error) {
	f, err := loadFile(path, shared)
	if err != nil {
		return nil, nil, err
	}
	in, err := plan.ReadSelection(f)
	if err != nil {
		return nil, nil, &inputError{err: err}
	}
	return f, in, nil
}

// buildPlan loads a scenario file and builds its plan; every failure is an
// input error (exit code 2).
func buildPlan(path string, shared *sharedFlags) (*plan.Plan, error) {
	f, err := loadFile(path, shared)
	if err != nil {
		return nil, err
	}
	p, err := plan.Load(f)
	if err != nil {
		return nil, &inputError{err: err}
	}
	return p, nil
}

// buildPlanOrPortfolio loads a scenario file and builds its plan, or its
// portfolio (on workers goroutines) when it plans several series; every
// failure is an input error (exit code 2).
func buildPlanOrPortfolio(path string, shared *sharedFlags, workers int) (*plan.Plan, *plan.Portfolio, error) {
	f, in, err := loadSelection(path, shared)
	if err != nil {
		return nil, nil, err
	}
	if plan.WantsPortfolio(f, in) {
		pf, err := plan.BuildPortfolioProgress(f, in, workers, shared.progress("planning series"))
		if err != nil {
			return nil, nil, &inputError{err: err}
		}
		return nil, pf, nil
	}
	p, err := plan.Build(f, in)
	if err != nil {
		return nil, nil, &inputError{err: err}
	}
	return p, nil, nil
}

func planRun(opts *PlanOptions) error {
	if s, ok, err := parseShard(opts.Shard, opts.Out); err != nil || ok {
		if err != nil {
			return err
		}
		return planShardRun(opts, s)
	}
	f, in, err := loadSelection(opts.File, opts.Shared)
	if err != nil {
		return err
	}
	if plan.WantsPortfolio(f, in) {
		return portfolioRun(opts, f, in)
	}
	p, err := plan.Build(f, in)
	if err != nil {
		return &inputError{err: err}
	}
	var ev *scenario.Event
	if opts.Event != "" {
		if ev, err = p.FutureEvent(opts.Event); err != nil {
			return flagErrorf("--event %q: %v", opts.Event, err)
		}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.ForPlan(p, opts.Detail, ev))
}

// portfolioRun plans the several series of f.
func portfolioRun(opts *PlanOptions, f *scenario.File, in *plan.Inputs) error {
	charts, noChart, err := chartCount(opts.Charts)
	if err != nil {
		return err
	}
	pf, err := plan.BuildPortfolioProgress(f, in, opts.Workers, opts.Shared.progress("planning series"))
	if err != nil {
		return &inputError{err: err}
	}
	r, err := report.ForPortfolio(pf, report.PortfolioOptions{Charts: charts, Detail: opts.Detail, Event: opts.Event})
	if errors.Is(err, report.ErrNoPortfolioEvent) {
		return flagErrorf("--event %q: %v", opts.Event, err)
	}
	if err != nil {
		return &inputError{err: err}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart || noChart, opts.XLSX, r)
}

// chartCount reads --charts: a count of series charts, all
// (report.AllCharts) or none (no chart at all).
func chartCount(s string) (n int, none bool, err error) {
	switch s {
	case "all":
		return report.AllCharts, false, nil
	case "none":
		return 0, true, nil
	}
	n, err = strconv.Atoi(s)
	if err != nil || n < 0 {
		return 0, false, flagErrorf("--charts %q: want a number of at least 0, all or none", s)
	}
	return n, false, nil
}
