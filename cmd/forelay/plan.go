package main

import (
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
	// Event, when set, adds the period-by-period account of one event.
	Event string
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
			if runF != nil {
				return runF(opts)
			}
			return planRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.Out, "out", "", "directory to write plan.csv, plan.json, plan.png and plan.svg into")
	fl.BoolVar(&opts.JSON, "json", false, "print plan.json to standard output instead of the tables")
	fl.BoolVar(&opts.Detail, "detail", false, "also print every period of every scenario")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "with --out, skip plan.png and plan.svg")
	fl.StringVar(&opts.Event, "event", "", "also show how this event adds up, period by period")
	return cmd
}

// buildPlan loads a scenario file and builds its plan; every failure is an
// input error (exit code 2).
func buildPlan(path string, shared *sharedFlags) (*plan.Plan, error) {
	f, err := scenario.LoadLimited(path, shared.limits().Scenario())
	if err != nil {
		return nil, &inputError{err: err}
	}
	p, err := plan.Load(f)
	if err != nil {
		return nil, &inputError{err: err}
	}
	return p, nil
}

func planRun(opts *PlanOptions) error {
	p, err := buildPlan(opts.File, opts.Shared)
	if err != nil {
		return err
	}
	var ev *scenario.Event
	if opts.Event != "" {
		if ev, err = p.FutureEvent(opts.Event); err != nil {
			return flagErrorf("--event %q: %v", opts.Event, err)
		}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, report.ForPlan(p, opts.Detail, ev))
}
