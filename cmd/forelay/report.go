package main

import (
	"github.com/spf13/cobra"

	"forelay/scenario/report"
)

// reportPaths is the default number of Monte Carlo paths of a report: a
// modest run, enough for the risks it prints to the tenth of a percent in
// a few seconds; --paths raises it.
const reportPaths = 2000

// ReportOptions are the settings of "forelay report".
type ReportOptions struct {
	IO       *IOStreams
	Shared   *sharedFlags
	File     string
	Out      string
	PDF      bool
	Paper    string
	Actuals  string
	Scenario string
	Sim      simFlags
	Service  float64
	Breach   float64
	// Charts is how many of a portfolio's most-changed series get a
	// chart.
	Charts int
	// Format is --sheet and --decimal for the actuals; without --decimal
	// the scenario file's history.decimal applies.
	Format formatFlags
}

func newCmdReport(f *Factory, runF func(*ReportOptions) error) *cobra.Command {
	opts := &ReportOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "report FILE --out DIR [--pdf] [--paper a4|letter] [--actuals CSV] [--scenario NAME]",
		Short: "Write the plan, its risks and its tracking as one document to hand over (HTML, and PDF)",
		Long:  helpText("report"),
		Example: `  forelay report examples/dairy/plan.yaml --out out/dairy
  forelay report examples/dairy/plan.yaml --out out/dairy --pdf --paper letter
  forelay report plan.yaml --out out --actuals new.csv --scenario with-contract`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if err := opts.check(); err != nil {
				return err
			}
			if err := opts.Format.check(); err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return reportRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.Out, "out", "", "directory to write report.html (and report.pdf) into; required")
	fl.BoolVar(&opts.PDF, "pdf", false, "also write report.pdf, printed by a headless Chromium")
	fl.StringVar(&opts.Paper, "paper", "a4", "page size of the document: a4 or letter")
	fl.StringVar(&opts.Actuals, "actuals", "", "new actuals to track against the plan, CSV or workbook (.xlsx) in the history layouts")
	opts.Format.register(fl, "actuals file")
	fl.StringVar(&opts.Scenario, "scenario", "", "scenario to chart the risks of, size the pre-build for and track (default: the last one in the file)")
	opts.Sim.registerWith(fl, reportPaths)
	fl.Float64Var(&opts.Service, "service", 0.95, "cycle service level of the pre-build, between 0 and 1")
	fl.Float64Var(&opts.Breach, "breach", 0.1, "report the first period whose probability of demand above capacity exceeds this")
	fl.IntVar(&opts.Charts, "charts", 5, "in a plan of several series, chart this many of the most-changed series")
	cmd.RegisterFlagCompletionFunc("paper", cobra.FixedCompletions([]string{"a4", "letter"}, cobra.ShellCompDirectiveNoFileComp))
	return cmd
}

// check validates the flags.
func (o *ReportOptions) check() error {
	if o.Out == "" {
		return flagErrorf("--out is required: name the directory to write report.html into")
	}
	if _, err := report.ParsePaper(o.Paper); err != nil {
		return flagErrorf("--paper: %v", err)
	}
	if o.Charts < 0 {
		return flagErrorf("--charts %d: want a number of at least 0", o.Charts)
	}
	if err := o.Sim.check(o.Shared.limits()); err != nil {
		return err
	}
	if err := checkUnit("service", o.Service); err != nil {
		return err
	}
	return checkUnit("breach", o.Breach)
}

// reportRun finds the browser when a PDF is asked for, builds the plan,
// runs the comparison, the stress test, the buffer and the tracking,
// binds their reports into one document and writes it.
func reportRun(opts *ReportOptions) error {
	paper, _ := report.ParsePaper(opts.Paper)
	exe, err := findBrowser(opts.PDF)
	if err != nil {
		return err
	}
	p, pf, err := buildPlanOrPortfolio(opts.File, opts.Shared, opts.Sim.Workers)
	if err != nil {
		return err
	}
	var book *report.Book
	if pf != nil {
		book, err = portfolioBook(opts, pf)
	} else {
		book, err = planBook(opts, p)
	}
	if err != nil {
		return err
	}
	if err := warnings(opts.IO, opts.Shared, book.Warnings); err != nil {
		return err
	}
	return writeBook(opts.IO, opts.Out, book, paper, exe)
}
