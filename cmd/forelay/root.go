package main

import (
	"errors"
	"fmt"
	"forelay/scenario/bounds"
	"forelay/scenario/report"
	"io"
	"os"
	"runtime/debug"
	"time"

	"github.com/spf13/cobra"
)

// IOStreams are the streams a command reads and writes: data and plans on
// Out, progress, notes and warnings on ErrOut.
type IOStreams struct {
	In          io.Reader
	Out, ErrOut io.Writer
}

// Factory carries what every command needs from its surroundings.
type Factory struct {
	IO  *IOStreams
	Now func() time.Time
	// Shared holds the flags every command takes (--strict, --limit); they
	// are set when the command line is parsed.
	Shared *sharedFlags
}

// sharedFlags are the settings every command takes.
type sharedFlags struct {
	// Strict turns every warning into an input error (exit code 2).
	Strict bool
	// Limits bound the size of a run.
	Limits bounds.Set
	// ChartSize is the size of the charts written with --out (zero: the
	// default), for the commands that take --chart-size.
	ChartSize chartSize
	// Quiet drops the progress bars and the "wrote ..." lines.
	Quiet bool
	// bars is where progress bars go (standard error when it is a
	// terminal; nil: nowhere), and colour whether they may use colour
	// (see terminals in progress.go).
	bars   io.Writer
	colour bool
}

// strict reports whether --strict is set; a nil s (a command built in a
// test without a root) is not strict.
func (s *sharedFlags) strict() bool { return s != nil && s.Strict }

// limits returns the limits in force: the defaults when s is nil.
func (s *sharedFlags) limits() bounds.Set {
	if s == nil || s.Limits == nil {
		return bounds.Defaults()
	}
	return s.Limits
}

// Exit codes.
const (
	exitOK       = 0
	exitInternal = 1 // an unexpected failure: a file could not be written, say
	exitInput    = 2 // bad flags or bad input files
	exitAlert    = 3 // track --fail-on found what it was told to fail on
)

// version is set at build time with -ldflags "-X main.version=...".
var version = "0.1.0-dev"

func newRootCmd(f *Factory) *cobra.Command {
	root := &cobra.Command{
		Use:   "forelay",
		Short: "Adjusted demand plans from a baseline forecast and known events",
		Long: helpText("forelay") + bounds.Help() + `

The plan is a statistical estimate: where supply is safety-critical, defer to
the applicable reliability standards, local codes and licensed practice.`,
		Version:       version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	root.SetVersionTemplate("forelay {{.Version}}\n")
	if f.Shared == nil {
		f.Shared = &sharedFlags{}
	}
	f.Shared.Limits = bounds.Defaults()
	pf := root.PersistentFlags()
	pf.BoolVar(&f.Shared.Strict, "strict", false, "treat every warning as an error (exit code 2) and write nothing")
	pf.Var(&bounds.Value{L: f.Shared.Limits}, "limit", "raise or lower a limit, NAME=N (repeatable); see 'forelay --help' for the limits")
	pf.BoolVarP(&f.Shared.Quiet, "quiet", "q", false, "print no progress bar and no \"wrote ...\" lines (warnings and errors still)")
	f.Shared.bars, f.Shared.colour = terminals(f.IO, os.Getenv, isTerminal)
	root.SetOut(f.IO.Out)
	root.SetErr(f.IO.ErrOut)
	root.SetIn(f.IO.In)
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return &flagError{err: err}
	})
	root.AddCommand(
		newCmdVersion(f),
		newCmdFit(f, nil),
		newCmdPlan(f, nil),
		newCmdCheck(f, nil),
		newCmdInit(f, nil),
		newCmdStress(f, nil),
		newCmdBuffer(f, nil),
		newCmdCompare(f, nil),
		newCmdTrack(f, nil),
		newCmdSchema(f, nil),
		newCmdReport(f, nil),
		newCmdMerge(f, nil),
	)
	registerCompletions(root)
	return root
}

// run executes the command line args and returns the process exit code.
func run(args []string, io *IOStreams, now func() time.Time) int {
	return guard(io.ErrOut, func() int {
		f := &Factory{IO: io, Now: now}
		root := newRootCmd(f)
		root.SetArgs(args)
		err := root.Execute()
		if err == nil {
			return exitOK
		}
		fmt.Fprintln(io.ErrOut, "forelay: "+err.Error()+bounds.Hint(err))
		var fe *flagError
		if errors.As(err, &fe) {
			fmt.Fprintln(io.ErrOut, "Run 'forelay --help' (or the command with --help) for usage.")
		}
		return exitCode(err)
	})
}

// guard runs body and turns a panic into an internal error: a panic is a
// bug in forelay, never the user's fault, so it exits with code 1 and
// never with the input-error code 2.
func guard(errOut io.Writer, body func() int) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(errOut, "forelay: internal error: %v\n%s\nThis is a bug in forelay; please report it with the command line and the input files.\n", r, debug.Stack())
			code = exitInternal
		}
	}()
	return body()
}

func newCmdVersion(f *Factory) *cobra.Command {
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "version",
		Short: "Print the forelay version",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			rep := &report.Report{Name: "version", Compact: true, Doc: map[string]string{"version": version}}
			fmt.Fprintf(&rep.Text, "forelay %s\n", version)
			return emit(f.IO, f.Shared, "", asJSON, true, false, rep)
		},
	}
	cmd.Flags().BoolVar(&asJSON, "json", false, "print the version as JSON")
	return cmd
}
