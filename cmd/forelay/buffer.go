package main

import (
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/sim"
	"forelay/scenario/supply"
	"math"

	"github.com/spf13/cobra"
)

// BufferOptions are the settings of "forelay buffer".
type BufferOptions struct {
	IO           *IOStreams
	Shared       *sharedFlags
	File         string
	Out          string
	JSON         bool
	NoChart      bool
	Sim          simFlags
	Resources    resourceFlags
	Service      float64
	LeadTime     float64
	OpeningStock float64
	Demand       string
	Scenario     string
	// XLSX also writes the workbook into Out.
	XLSX bool
}

// The demand sources of --demand.
const (
	demandMC    = "mc"
	demandBands = "bands"
)

func newCmdBuffer(f *Factory, runF func(*BufferOptions) error) *cobra.Command {
	opts := &BufferOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "buffer FILE --service 0.95 [--lead-time L] [--opening-stock S]",
		Short: "Size the stock to build ahead of a disruption, and the safety stock",
		Long:  helpText("buffer"),
		Example: `  forelay buffer examples/dairy/plan.yaml --service 0.95 --scenario with-contract
  forelay buffer plan.yaml --service 0.98 --lead-time 2 --opening-stock 40000 --out out
  forelay buffer plan.yaml --service 0.9 --demand bands --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if err := opts.check(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return bufferRun(opts)
		},
	}
	fl := cmd.Flags()
	registerChartSize(fl, f.Shared)
	fl.StringVar(&opts.Out, "out", "", "directory to write buffer.csv, buffer.json and the chart into")
	fl.BoolVar(&opts.JSON, "json", false, "print buffer.json to standard output instead of the tables")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "with --out, skip buffer.png and buffer.svg")
	addXLSXFlag(fl, &opts.XLSX, "buffer")
	opts.Sim.register(fl)
	opts.Resources.register(fl)
	fl.Float64Var(&opts.Service, "service", 0.95, "cycle service level, between 0 and 1 (not a fill rate)")
	fl.Float64Var(&opts.LeadTime, "lead-time", 1, "replenishment lead time in periods, at least 1, for the safety stock")
	fl.Float64Var(&opts.OpeningStock, "opening-stock", 0, "stock at the start of the first period")
	fl.StringVar(&opts.Demand, "demand", demandMC, "demand at the service quantile from: mc (Monte Carlo) or bands (normal bands)")
	fl.StringVar(&opts.Scenario, "scenario", "", "scenario to plan for (default: the last one in the file)")
	return cmd
}

// check validates the flags.
func (o *BufferOptions) check() error {
	if err := checkUnit("service", o.Service); err != nil {
		return err
	}
	if err := checkXLSX(o.XLSX, o.Out, "buffer"); err != nil {
		return err
	}
	if math.IsNaN(o.LeadTime) || math.IsInf(o.LeadTime, 0) || o.LeadTime < 1 {
		return flagErrorf("--lead-time %v: must be at least 1 period", o.LeadTime)
	}
	if err := checkStock("opening-stock", o.OpeningStock); err != nil {
		return err
	}
	if o.Demand != demandMC && o.Demand != demandBands {
		return flagErrorf("--demand %q: want mc or bands", o.Demand)
	}
	if o.Demand == demandMC {
		return o.Sim.check(o.Shared.limits())
	}
	return nil
}

// bufferRun loads the plan, checks it has a capacity, simulates it (with
// --demand mc), sizes the buffer and emits the report.
func bufferRun(opts *BufferOptions) error {
	if err := opts.Resources.check(opts.File, opts.Shared); err != nil {
		return err
	}
	p, pf, err := buildPlanOrPortfolio(opts.File, opts.Shared, opts.Sim.Workers)
	if err != nil {
		return err
	}
	if pf != nil {
		return portfolioBufferRun(opts, pf)
	}
	if err := opts.Resources.single(opts.File); err != nil {
		return err
	}
	sc, err := pickScenario(p, opts.Scenario)
	if err != nil {
		return err
	}
	if _, err := supply.BufferCapacity(p); err != nil {
		return &inputError{err: err}
	}
	var mc *sim.Simulation
	if opts.Demand == demandMC {
		if mc, err = simulate(p, &opts.Sim, opts.Shared); err != nil {
			return err
		}
	}
	run, err := supply.SizeBuffer(p, mc, supply.BufferSettings{Scenario: sc, Service: opts.Service,
		LeadTime: opts.LeadTime, Opening: opts.OpeningStock})
	if err != nil {
		return &inputError{err: err}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.Buffer(run))
}

// portfolioBufferRun sizes the buffer of each resource of a portfolio
// that has a capacity.
func portfolioBufferRun(opts *BufferOptions, pf *plan.Portfolio) error {
	sc, err := pickScenario(pf.Plans[0], opts.Scenario)
	if err != nil {
		return err
	}
	res, err := opts.Resources.portfolio(pf)
	if err != nil {
		return err
	}
	if err := supply.PortfolioBufferCapacity(pf, res); err != nil {
		return &inputError{err: err}
	}
	var mc *sim.PortfolioSimulation
	if opts.Demand == demandMC {
		if mc, err = simulatePortfolio(pf, supply.PortfolioSums(pf, res), &opts.Sim, opts.Shared); err != nil {
			return err
		}
	}
	run, err := supply.SizePortfolioBuffers(pf, res, mc, supply.BufferSettings{Scenario: sc, Service: opts.Service,
		LeadTime: opts.LeadTime, Opening: opts.OpeningStock})
	if err != nil {
		return &inputError{err: err}
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, opts.XLSX, report.PortfolioBuffer(run))
}
