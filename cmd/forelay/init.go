package main

import (
	"embed"
	"errors"
	"fmt"
	"forelay/scenario/report"
	"io/fs"
	"os"
	"path/filepath"

	"github.com/spf13/cobra"
)

//go:embed starter/plan.yaml starter/history.csv starter/deals.csv
var starterFiles embed.FS

// InitOptions are the settings of "forelay init".
type InitOptions struct {
	IO     *IOStreams
	Shared *sharedFlags
	Dir    string
	Force  bool
	JSON   bool
}

func newCmdInit(f *Factory, runF func(*InitOptions) error) *cobra.Command {
	opts := &InitOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:     "init DIR",
		Short:   "Write a starter scenario, history and events table to edit",
		Long:    helpText("init"),
		Example: `  forelay init my-plan && forelay plan my-plan/plan.yaml`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.Dir = args[0]
			if runF != nil {
				return runF(opts)
			}
			return initRun(opts)
		},
	}
	cmd.Flags().BoolVar(&opts.Force, "force", false, "overwrite existing files")
	cmd.Flags().BoolVar(&opts.JSON, "json", false, "print the files written as JSON")
	return cmd
}

func initRun(opts *InitOptions) error {
	names := []string{"plan.yaml", "history.csv", "deals.csv"}
	if !opts.Force {
		for _, n := range names {
			p := filepath.Join(opts.Dir, n)
			if _, err := os.Stat(p); err == nil {
				return &inputError{err: fmt.Errorf("%s already exists; use --force to overwrite it", p)}
			} else if !errors.Is(err, fs.ErrNotExist) {
				return err
			}
		}
	}
	set := report.NewFiles(opts.Dir)
	defer set.Discard()
	for _, n := range names {
		b, err := starterFiles.ReadFile("starter/" + n)
		if err != nil {
			return err
		}
		set.Add(n, b)
	}
	paths, err := set.Commit()
	if err != nil {
		return err
	}
	rep := &report.Report{Name: "init", Compact: true, Doc: map[string]any{"written": paths}}
	for _, p := range paths {
		fmt.Fprintf(&rep.Text, "wrote %s\n", p)
	}
	starter := filepath.Join(opts.Dir, "plan.yaml")
	fmt.Fprintf(&rep.Text, "next: forelay check %s, then forelay plan %s --out %s\n", starter, starter, filepath.Join(opts.Dir, "out"))
	return emit(opts.IO, opts.Shared, "", opts.JSON, true, false, rep)
}
