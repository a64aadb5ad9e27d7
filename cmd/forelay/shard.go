package main

import (
	"errors"
	"fmt"
	"forelay/forecast"
	"forelay/scenario/data"
	"github.com/spf13/cobra"
	"github.com/spf13/pflag"
	"strconv"
	"strings"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/shard"
	"forelay/scenario/supply"
)

// shardFlagHelp is the help of --shard on every command that takes it.
const shardFlagHelp = "run shard K of N (K from 0) of a plan of several series: the series whose FNV-1a hash of the name mod N is K; needs --out; forelay merge joins the shards"

// parseShard reads --shard, which needs --out; the zero Spec and false
// when it is not set.
func parseShard(value, out string) (shard.Spec, bool, error) {
	if value == "" {
		return shard.Spec{}, false, nil
	}
	s, err := shard.Parse(value)
	if err != nil {
		return shard.Spec{}, false, flagErrorf("--shard %v", err)
	}
	if out == "" {
		return shard.Spec{}, false, flagErrorf("--shard %s: give --out, the directory the shard's rows and sums go to", value)
	}
	return s, true, nil
}

// A mergeFlag is a flag that shapes the report a merge writes, whether
// it was given to a shard, and whether forelay merge takes it.
type mergeFlag struct {
	given bool
	flag  string
	merge bool
}

// refuseInShard refuses the first flag given to a shard that shapes the
// report: a shard writes its rows and sums, and forelay merge the report.
func refuseInShard(flags ...mergeFlag) error {
	for _, f := range flags {
		if !f.given {
			continue
		}
		if f.merge {
			return flagErrorf("%s: not taken with --shard; a shard writes its rows and sums, and forelay merge writes the report: give %s to the merge", f.flag, f.flag)
		}
		return flagErrorf("%s: not taken with --shard; a shard writes its rows and sums, and forelay merge writes the report, which has no %s (run the portfolio whole for it)", f.flag, f.flag)
	}
	return nil
}

// readShard loads a scenario file and reads the inputs of shard s of its
// portfolio; a file that plans one series is refused.
func readShard(path string, shared *sharedFlags, s shard.Spec) (*scenario.File, *plan.Inputs, error) {
	f, err := loadFile(path, shared)
	if err != nil {
		return nil, nil, err
	}
	in, err := plan.ReadShard(f, s.Owns)
	if err != nil {
		return nil, nil, &inputError{err: err}
	}
	if !plan.WantsPortfolio(f, in) {
		return nil, nil, flagErrorf("--shard %s: %s plans one series; shards split a plan of several series (history.series selecting several)", s, path)
	}
	return f, in, nil
}

// writeShard writes a shard's files and its manifest into out, all or
// nothing, after the run's warnings.
func writeShard(ios *IOStreams, shared *sharedFlags, out string, m *shard.Manifest, warns []string, files []shard.File) error {
	if err := warnings(ios, shared, warns); err != nil {
		return err
	}
	mj, err := m.JSON()
	if err != nil {
		return err
	}
	set := report.NewFiles(out)
	defer set.Discard()
	for _, f := range files {
		set.Add(f.Name, f.Data)
	}
	set.Add("manifest.json", mj)
	paths, err := set.Commit()
	if err != nil {
		return err
	}
	for _, p := range paths {
		fmt.Fprintf(ios.ErrOut, "wrote %s\n", p)
	}
	fmt.Fprintf(ios.Out, "shard %d/%d of forelay %s written to %s; forelay merge joins the shards\n", m.Shard.K, m.Shard.N, m.Command, out)
	return nil
}

// planShardRun plans shard s of the portfolio of opts.File.
func planShardRun(opts *PlanOptions, s shard.Spec) error {
	if err := refuseInShard(mergeFlag{opts.JSON, "--json", true}, mergeFlag{opts.XLSX, "--xlsx", false}, mergeFlag{opts.Detail, "--detail", false},
		mergeFlag{opts.Event != "", "--event", false}, mergeFlag{opts.NoChart, "--no-chart", true}, mergeFlag{opts.Shared.ChartSize.W > 0, "--chart-size", true}); err != nil {
		return err
	}
	f, in, err := readShard(opts.File, opts.Shared, s)
	if err != nil {
		return err
	}
	charts, noChart, err := chartCount(opts.Charts)
	if err != nil {
		return err
	}
	if noChart {
		charts = shard.NoCharts
	}
	pf, err := plan.BuildPortfolio(f, in, opts.Workers)
	if err != nil {
		return &inputError{err: err}
	}
	files, err := shard.PlanFiles(pf, charts)
	if err != nil {
		return &inputError{err: err}
	}
	m := shard.NewManifest(version, "plan", s, in.Digests, []string{"plan", "--charts=" + opts.Charts})
	return writeShard(opts.IO, opts.Shared, opts.Out, m, pf.Warnings, files)
}

// stressShardRun simulates shard s of the portfolio of opts.File.
func stressShardRun(opts *StressOptions, s shard.Spec) error {
	if err := refuseInShard(mergeFlag{opts.JSON, "--json", true}, mergeFlag{opts.XLSX, "--xlsx", false}, mergeFlag{opts.NoChart, "--no-chart", true},
		mergeFlag{opts.Shared.ChartSize.W > 0, "--chart-size", true}); err != nil {
		return err
	}
	f, in, err := readShard(opts.File, opts.Shared, s)
	if err != nil {
		return err
	}
	if opts.Sim.Errors != "bootstrap" {
		return flagErrorf("--errors %s: a plan of several series draws bootstrap errors only", opts.Sim.Errors)
	}
	chart, err := plan.CaseIndex(f, opts.Scenario)
	if err != nil {
		return flagErrorf("--scenario %v", err)
	}
	rs, err := opts.Resources.file(f)
	if err != nil {
		return err
	}
	pf, err := plan.BuildPortfolio(f, in, opts.Sim.Workers)
	if err != nil {
		return &inputError{err: err}
	}
	o := opts.Sim.options(opts.Shared)
	files, err := shard.StressFiles(pf, shard.StressRun{Options: o, Settings: supply.StressSettings{Breach: opts.Breach, Opening: opts.OpeningStock},
		Chart: chart, Resources: rs})
	if err != nil {
		return &inputError{err: err}
	}
	m := shard.NewManifest(version, "stress", s, in.Digests, []string{"stress", "--breach=" + strconv.FormatFloat(opts.Breach, 'g', -1, 64),
		"--scenario=" + f.Cases()[chart].Name, "--opening-stock=" + strconv.FormatFloat(opts.OpeningStock, 'g', -1, 64),
		"--resource=" + strings.Join(opts.Resources.IDs, ",")})
	m.Seed, m.Paths = o.Seed, o.Paths
	return writeShard(opts.IO, opts.Shared, opts.Out, m, pf.Warnings, files)
}

// givenFlags returns the flags given to cmd, as --name=value, less those
// that do not change a shard's output (--out, --shard, --workers).
func givenFlags(cmd *cobra.Command) []string {
	var out []string
	cmd.Flags().Visit(func(f *pflag.Flag) {
		switch f.Name {
		case "out", "shard", "workers":
			return
		}
		out = append(out, "--"+f.Name+"="+f.Value.String())
	})
	return out
}

// fitShardRun fits shard s of the series of opts.History.
func fitShardRun(opts *FitOptions, s shard.Spec) error {
	if opts.Series != "" {
		return flagErrorf("--series %s: --shard fits a slice of every series of the file; leave out one of them", opts.Series)
	}
	spec, bands, err := opts.Baseline.spec()
	if err != nil {
		return err
	}
	h, err := loadHistoryKeep(opts.History, opts.Period, opts.Fill, opts.Format.format(data.DecimalPoint), opts.Shared.limits(), s.Owns)
	if err != nil {
		return err
	}
	var series []forecast.Series
	var own []int
	for i := range h.Extents.Len() {
		if k := h.Extents.Series(i); k >= 0 {
			series = append(series, h.Series[k])
			own = append(own, i)
		}
	}
	outcomes := forecast.FitAll(series, spec, opts.Workers)
	var warns []string
	for _, oc := range outcomes {
		if oc.Err == nil {
			warns = append(warns, oc.Result.Warnings()...)
		}
	}
	out, failed, err := report.Fits(opts.History, series, outcomes, spec.Horizon, bands, opts.Units, true)
	if err != nil {
		return err
	}
	files, err := shard.FitFiles([]byte(out.String()), h.Extents.Len(), own)
	if err != nil {
		return err
	}
	digest, err := data.Digest(opts.History)
	if err != nil {
		return &inputError{err: err}
	}
	m := shard.NewManifest(version, "fit", s, map[string]string{"history": digest}, append([]string{"fit"}, opts.Args...))
	if err := writeShard(opts.IO, opts.Shared, opts.Out, m, warns, files); err != nil {
		return err
	}
	if len(failed) > 0 {
		return &inputError{err: errors.Join(failed...)}
	}
	return nil
}
