package main

import (
	"fmt"
	"strconv"

	"forelay/scenario"
	"forelay/scenario/plan"
	"forelay/scenario/report"
	"forelay/scenario/shard"
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

// readShard loads a scenario file and reads the inputs of shard s of its
// portfolio; a file that plans one series is refused.
func readShard(path string, shared *sharedFlags, s shard.Spec) (*scenario.File, *plan.Inputs, error) {
	f, err := scenario.LoadLimited(path, shared.limits().Scenario())
	if err != nil {
		return nil, nil, &inputError{err: err}
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
	f, in, err := readShard(opts.File, opts.Shared, s)
	if err != nil {
		return err
	}
	pf, err := plan.BuildPortfolio(f, in, opts.Workers)
	if err != nil {
		return &inputError{err: err}
	}
	files, err := shard.PlanFiles(pf)
	if err != nil {
		return &inputError{err: err}
	}
	m := shard.NewManifest(version, "plan", s, in.Digests, []string{"plan", opts.File})
	return writeShard(opts.IO, opts.Shared, opts.Out, m, pf.Warnings, files)
}

// stressShardRun simulates shard s of the portfolio of opts.File.
func stressShardRun(opts *StressOptions, s shard.Spec) error {
	f, in, err := readShard(opts.File, opts.Shared, s)
	if err != nil {
		return err
	}
	if opts.Sim.Errors != "bootstrap" {
		return flagErrorf("--errors %s: a plan of several series draws bootstrap errors only", opts.Sim.Errors)
	}
	pf, err := plan.BuildPortfolio(f, in, opts.Sim.Workers)
	if err != nil {
		return &inputError{err: err}
	}
	o := opts.Sim.options()
	files, err := shard.StressFiles(pf, o, opts.Breach)
	if err != nil {
		return &inputError{err: err}
	}
	m := shard.NewManifest(version, "stress", s, in.Digests, []string{"stress", opts.File, "--breach", strconv.FormatFloat(opts.Breach, 'g', -1, 64)})
	m.Seed, m.Paths = o.Seed, o.Paths
	return writeShard(opts.IO, opts.Shared, opts.Out, m, pf.Warnings, files)
}
