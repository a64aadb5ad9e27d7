package main

import (
	"forelay/scenario/plan"
	"forelay/scenario/report"

	"github.com/spf13/cobra"
)

// CheckOptions are the settings of "forelay check".
type CheckOptions struct {
	IO     *IOStreams
	Shared *sharedFlags
	File   string
	JSON   bool
}

func newCmdCheck(f *Factory, runF func(*CheckOptions) error) *cobra.Command {
	opts := &CheckOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:     "check FILE",
		Short:   "Validate a scenario file and its history without computing a plan",
		Long:    helpText("check"),
		Example: `  forelay check examples/dairy/plan.yaml`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if runF != nil {
				return runF(opts)
			}
			return checkRun(opts)
		},
	}
	cmd.Flags().BoolVar(&opts.JSON, "json", false, "print the summary as JSON")
	return cmd
}

func checkRun(opts *CheckOptions) error {
	f, in, err := loadSelection(opts.File, opts.Shared)
	if err != nil {
		return err
	}
	if plan.WantsPortfolio(f, in) {
		series, warnings, err := plan.CheckPortfolio(f, in)
		if err != nil {
			return &inputError{err: err}
		}
		rep := report.CheckPortfolio(opts.File, f, in, series, append(warnings, f.Lint(series[0])...))
		return emit(opts.IO, opts.Shared, "", opts.JSON, true, false, rep)
	}
	if err := in.One(f); err != nil {
		return &inputError{err: err}
	}
	rep := report.Check(opts.File, f, in.Series, f.Lint(in.Series))
	return emit(opts.IO, opts.Shared, "", opts.JSON, true, false, rep)
}
