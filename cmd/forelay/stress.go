package main

import (
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/supply"

	"github.com/spf13/cobra"
)

// StressOptions are the settings of "forelay stress".
type StressOptions struct {
	IO           *IOStreams
	Shared       *sharedFlags
	File         string
	Out          string
	JSON         bool
	NoChart      bool
	Sim          simFlags
	Resources    resourceFlags
	Breach       float64
	OpeningStock float64
	Scenario     string
	// XLSX also writes the workbook into Out.
	XLSX bool
	// Shard, when set, is K/N: simulate shard K of N of a portfolio.
	Shard string
}

func newCmdStress(f *Factory, runF func(*StressOptions) error) *cobra.Command {
	opts := &StressOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "stress FILE [--paths N] [--seed S] [--out DIR] [--json]",
		Short: "Monte Carlo risk of each scenario against capacity",
		Long:  helpText("stress"),
		Example: `  forelay stress examples/dairy/plan.yaml --out out/dairy
  forelay stress plan.yaml --paths 50000 --seed 7 --breach 0.05
  forelay stress plan.yaml --json | jq '.scenarios[] | {name, first_breach}'`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if err := opts.check(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return stressRun(opts)
		},
	}
	fl := cmd.Flags()
	registerChartSize(fl, f.Shared)
	fl.StringVar(&opts.Out, "out", "", "directory to write stress.csv, stress.json and the charts into")
	fl.BoolVar(&opts.JSON, "json", false, "print stress.json to standard output instead of the tables")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "with --out, skip the charts")
	addXLSXFlag(fl, &opts.XLSX, "stress")
	opts.Sim.register(fl)
	opts.Resources.register(fl)
	fl.Float64Var(&opts.Breach, "breach", 0.1, "report the first period whose probability of demand above capacity exceeds this")
	fl.Float64Var(&opts.OpeningStock, "opening-stock", 0, "stock before the first period, for frozen production")
	fl.StringVar(&opts.Shard, "shard", "", shardFlagHelp)
	fl.StringVar(&opts.Scenario, "scenario", "", "scenario to chart (default: the last one in the file)")
	return cmd
}

// check validates the flags.
func (o *StressOptions) check() error {
	if err := o.Sim.check(o.Shared.limits()); err != nil {
		return err
	}
	if err := checkUnit("breach", o.Breach); err != nil {
		return err
	}
	if err := checkXLSX(o.XLSX, o.Out, "stress"); err != nil {
		return err
	}
	return checkStock("opening-stock", o.OpeningStock)
}

// stressRun loads the plan, simulates it, sets it against capacity and
// frozen production, and emits the report.
func stressRun(opts *StressOptions) error {
	if s, ok, err := parseShard(opts.Shard, opts.Out); err != nil || ok {
		if err != nil {
			return err
		}
		return stressShardRun(opts, s)
	}
	if err := opts.Resources.check(opts.File, opts.Shared); err != nil {
		return err
	}
	p, pf, err := buildPlanOrPortfolio(opts.File, opts.Shared, opts.Sim.Workers)
	if err != nil {
		return err
	}
	if pf != nil {
		return portfolioStressRun(opts, pf)
	}
	if err := opts.Resources.single(opts.File); err != nil {
		return err
	}
	chart, err := pickScenario(p, opts.Scenario)
	if err != nil {
		return err
	}
	prod, err := plan.ReadProduction(p)
	if err != nil {
		return &inputError{err: err}
	}
	mc, err := simulate(p, &opts.Sim, opts.Shared)
	if err != nil {
		return err
	}
	run, err := supply.Stress(mc, supply.StressSettings{Breach: opts.Breach, Opening: opts.OpeningStock, Production: prod})
	if err != nil {
		return &inputError{err: err}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.Stress(run, chart))
}

// portfolioStressRun simulates the total and the resources' loads of a
// portfolio and sets the loads against their capacities.
func portfolioStressRun(opts *StressOptions, pf *plan.Portfolio) error {
	chart, err := pickScenario(pf.Plans[0], opts.Scenario)
	if err != nil {
		return err
	}
	if err := supply.CheckPortfolioProduction(pf); err != nil {
		return &inputError{err: err}
	}
	res, err := opts.Resources.portfolio(pf)
	if err != nil {
		return err
	}
	mc, err := simulatePortfolio(pf, supply.PortfolioSums(pf, res), &opts.Sim, opts.Shared)
	if err != nil {
		return err
	}
	run, err := supply.PortfolioStress(mc, res, supply.StressSettings{Breach: opts.Breach, Opening: opts.OpeningStock})
	if err != nil {
		return &inputError{err: err}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.PortfolioStress(run, chart))
}
