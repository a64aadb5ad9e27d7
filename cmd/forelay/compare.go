package main

import (
	"forelay/scenario/report"
	"forelay/scenario/supply"

	"github.com/spf13/cobra"
)

// CompareOptions are the settings of "forelay compare".
type CompareOptions struct {
	IO        *IOStreams
	Shared    *sharedFlags
	File      string
	Out       string
	JSON      bool
	NoChart   bool
	Sim       simFlags
	Resources resourceFlags
	Service   float64
	// XLSX also writes the workbook into Out.
	XLSX bool
}

func newCmdCompare(f *Factory, runF func(*CompareOptions) error) *cobra.Command {
	opts := &CompareOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "compare FILE [--out DIR] [--json]",
		Short: "Set the scenarios of a scenario file side by side",
		Long:  helpText("compare"),
		Example: `  forelay compare examples/dairy/plan.yaml
  forelay compare plan.yaml --out out --service 0.9
  forelay compare plan.yaml --json | jq '.scenarios[] | {name, breach_probability}'`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if err := opts.check(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return compareRun(opts)
		},
	}
	fl := cmd.Flags()
	registerChartSize(fl, f.Shared)
	fl.StringVar(&opts.Out, "out", "", "directory to write compare.csv, compare.json and the charts into")
	fl.BoolVar(&opts.JSON, "json", false, "print compare.json to standard output instead of the tables")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "with --out, skip the charts")
	addXLSXFlag(fl, &opts.XLSX, "compare")
	opts.Sim.register(fl)
	opts.Resources.register(fl)
	fl.Float64Var(&opts.Service, "service", 0.95, "cycle service level of the pre-build need, between 0 and 1")
	return cmd
}

// check validates the flags.
func (o *CompareOptions) check() error {
	if err := o.Sim.check(o.Shared.limits()); err != nil {
		return err
	}
	if err := checkXLSX(o.XLSX, o.Out, "compare"); err != nil {
		return err
	}
	return checkUnit("service", o.Service)
}

// compareRun loads the plan, simulates it, compares its scenarios and
// emits the report.
func compareRun(opts *CompareOptions) error {
	if err := opts.Resources.check(opts.File, opts.Shared); err != nil {
		return err
	}
	p, pf, err := buildPlanOrPortfolio(opts.File, opts.Shared, opts.Sim.Workers)
	if err != nil {
		return err
	}
	if pf != nil {
		res, err := opts.Resources.portfolio(pf)
		if err != nil {
			return err
		}
		mc, err := simulatePortfolio(pf, supply.PortfolioSums(pf, res), &opts.Sim, opts.Shared)
		if err != nil {
			return err
		}
		return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.PortfolioCompare(supply.ComparePortfolio(mc, res, opts.Service)))
	}
	if err := opts.Resources.single(opts.File); err != nil {
		return err
	}
	mc, err := simulate(p, &opts.Sim, opts.Shared)
	if err != nil {
		return err
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.Compare(supply.CompareScenarios(mc, opts.Service)))
}
