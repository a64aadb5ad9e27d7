package main

import (
	"fmt"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"io"
	"math"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
	"forelay/scenario"
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
		Long: `Read a scenario file, fit the baseline to the history after taking known past
events out of it, lay the future events on the baseline and report each
scenario: totals, peak, change against the baseline and each event's share.

With --out DIR it also writes plan.csv (one row per scenario and period),
plan.json (the same with the fitted model, accuracy, cleaning estimates and
input digests) and the chart plan.png / plan.svg. Files are written only when
the whole run succeeds.`,
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
	f, err := scenario.LoadLimited(path, shared.limits().scenario())
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
	ev, err := pickEvent(p, opts.Event)
	if err != nil {
		return err
	}
	rep := &report.Report{Name: "plan", Warnings: p.Warnings, Doc: report.Plan(p), CSV: planCSV(p),
		Charts: []report.Chart{{Name: "plan", Plot: planChart(p)}}}
	writePlanText(&rep.Text, p, opts.Detail)
	if ev != nil {
		writeEventText(&rep.Text, p, ev)
	}
	return emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart, rep)
}

// writePlanText writes the human summary of a plan.
func writePlanText(w io.Writer, p *plan.Plan, detail bool) {
	f := p.File
	d := decimalsFor(p.Baseline)
	units := ""
	if f.Units != "" {
		units = " " + f.Units
	}
	freq := p.History.Freq()
	last := p.Periods[len(p.Periods)-1]
	fmt.Fprintf(w, "Plan %s: series %s, %d %s periods %s to %s%s\n", f.Plan, p.History.Name, len(p.Periods), freq, p.Periods[0], last, report.InUnits(f.Units))
	r := p.Fit
	how := "as asked"
	if r.Auto {
		how = "chosen by lowest backtest " + strings.ToUpper(r.Metric.String())
		if r.Select == forecast.SelectAICc {
			how = "chosen by lowest AICc"
		}
	}
	fmt.Fprintf(w, "Baseline %s (%s)", r.Method, how)
	if pt := report.ParamText(r.Model.Params()); pt != "" {
		fmt.Fprintf(w, ", %s", pt)
	} else if r.Method == forecast.Combination {
		fmt.Fprintf(w, ", %s", r.Model.Describe())
	}
	fmt.Fprintf(w, "; fitted to %d periods %s to %s\n", p.History.Len(), p.History.Start, p.History.Period(p.History.Len()-1))
	fmt.Fprintf(w, "Baseline accuracy (one step, in-sample): MAD %s, MSE %s (/%s), MAPE %s%%\n",
		fmtNum(r.Accuracy.MAD, d), fmtNum(r.Accuracy.MSE, d), r.Accuracy.Divisor, fmtNum(r.Accuracy.MAPE, 2))
	writeFlags(w, r)
	fmt.Fprintf(w, "Bands: adjusted +- %.3g x standard error (%s; event ranges count as 90%% intervals)\n", p.Z, report.BandSourceText(p.VarSource, p.Fit.Calibration()))

	if len(p.Cleaning) > 0 {
		fmt.Fprintln(w)
		fmt.Fprintln(w, "Taken out of the history before fitting (estimate +- standard error):")
		for _, c := range p.Cleaning {
			verb := "added"
			if c.Effect < 0 {
				verb = "took away"
			}
			what := "per period in " + c.When
			if c.Kind == scenario.Step {
				what = "as a lasting level shift from " + c.When
			}
			fmt.Fprintf(w, "  %s %s %s +- %s%s %s\n", c.ID, verb, fmtNum(math.Abs(c.Effect), d), fmtNum(c.StdErr, d), units, what)
		}
	}

	for _, sp := range p.Scenarios {
		fmt.Fprintln(w)
		ids := make([]string, len(sp.Events))
		for i, e := range sp.Events {
			ids[i] = e.ID
		}
		evs := "baseline only"
		if len(ids) > 0 {
			evs = "events: " + strings.Join(ids, ", ")
		}
		fmt.Fprintf(w, "Scenario %s (%s)\n", sp.Name, evs)
		base := plan.Total(p.Baseline)
		t := newTable("", "total"+units, "vs baseline", "share")
		t.AddRow("baseline", fmtNum(base, d), "", "")
		for i, e := range p.Future {
			if !slices.Contains(sp.Events, e) {
				continue
			}
			c := plan.Total(sp.Contrib[i])
			label := e.ID
			if e.Probability < 1 {
				label += fmt.Sprintf(" (p=%.2g)", e.Probability)
			}
			t.AddRow(label, "", report.Signed(c, d), report.Pct(c, base))
		}
		adj := plan.Total(sp.Adjusted)
		t.AddRow("adjusted plan", fmtNum(adj, d), report.Signed(adj-base, d), report.Pct(adj-base, base))
		rw := plan.Total(sp.RiskWeighted)
		t.AddRow("risk-weighted", fmtNum(rw, d), report.Signed(rw-base, d), report.Pct(rw-base, base))
		writeTable(w, t)
		i, v := plan.Peak(sp.Adjusted)
		fmt.Fprintf(w, "Peak %s: %s%s (band %s to %s)\n", p.Periods[i], fmtNum(v, d), units, fmtNum(sp.Lower[i], d), fmtNum(sp.Upper[i], d))
		if detail {
			dt := newTable("period", "baseline", "adjusted", "risk-weighted", "lower", "upper")
			for k, per := range p.Periods {
				dt.AddRow(per.String(), fmtNum(p.Baseline[k], d), fmtNum(sp.Adjusted[k], d), fmtNum(sp.RiskWeighted[k], d),
					fmtNum(sp.Lower[k], d), fmtNum(sp.Upper[k], d))
			}
			fmt.Fprintln(w)
			writeTable(w, dt)
		}
	}
	if len(p.Notes) > 0 {
		fmt.Fprintln(w)
		for _, n := range p.Notes {
			fmt.Fprintf(w, "Note: %s.\n", strings.TrimSuffix(n, "."))
		}
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, report.Caution)
}

// decimalsFor picks the decimals for a table of values like v (see
// scenario.Decimals).
func decimalsFor(v []float64) int { return forecast.Decimals(v) }
