package main

import (
	"errors"
	"fmt"

	"github.com/spf13/cobra"

	"forelay/scenario/report"
	"forelay/scenario/shard"
)

// MergeOptions are the settings of "forelay merge".
type MergeOptions struct {
	IO      *IOStreams
	Shared  *sharedFlags
	Out     string
	Shards  []string
	JSON    bool
	NoChart bool
}

func newCmdMerge(f *Factory, runF func(*MergeOptions) error) *cobra.Command {
	opts := &MergeOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:   "merge --out DIR SHARD_DIR...",
		Short: "Join the shards of a plan, stress or fit run into the files of one run",
		Long:  helpText("merge"),
		Example: `  forelay plan plan.yaml --shard 0/2 --out shards/0
  forelay plan plan.yaml --shard 1/2 --out shards/1
  forelay merge --out out shards/0 shards/1`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.Shards = args
			if opts.Out == "" {
				return flagErrorf("merge: give --out, the directory to write the merged files into")
			}
			if runF != nil {
				return runF(opts)
			}
			return mergeRun(opts)
		},
	}
	fl := cmd.Flags()
	fl.StringVar(&opts.Out, "out", "", "directory to write the merged files into")
	fl.BoolVar(&opts.JSON, "json", false, "print the merged plan.json or stress.json to standard output instead of the tables")
	fl.BoolVar(&opts.NoChart, "no-chart", false, "skip the charts")
	registerChartSize(fl, f.Shared)
	return cmd
}

func mergeRun(opts *MergeOptions) error {
	command, err := shard.Command(opts.Shards[0])
	if err != nil {
		return &inputError{err: err}
	}
	if opts.JSON && command == "fit" {
		return flagErrorf("merge --json: shards of forelay fit have no JSON document; fit.jsonl is their output")
	}
	var m *shard.Merged
	switch command {
	case "plan":
		m, err = shard.MergePlan(opts.Shards)
	case "stress":
		m, err = shard.MergeStress(opts.Shards)
	case "fit":
		m, err = shard.MergeFit(opts.Shards)
	default:
		err = fmt.Errorf("%s: shards of forelay %s cannot be merged by this version", opts.Shards[0], command)
	}
	if err != nil {
		return &inputError{err: err}
	}
	if m.Report != nil {
		err := emit(opts.IO, opts.Shared, opts.Out, opts.JSON, opts.NoChart || m.NoChart, false, m.Report)
		if errors.Is(err, shard.ErrCorrupt) {
			return &inputError{err: err}
		}
		return err
	}
	set := report.NewFiles(opts.Out)
	defer set.Discard()
	for _, f := range m.Files {
		set.Add(f.Name, f.Data)
	}
	paths, err := set.Commit()
	if err != nil {
		return err
	}
	for _, p := range paths {
		if !opts.Shared.quiet() {
			fmt.Fprintf(opts.IO.ErrOut, "wrote %s\n", p)
		}
	}
	_, err = fmt.Fprint(opts.IO.Out, m.Text)
	return err
}
