package main

import (
	"errors"
	"fmt"
	"io"
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
		Long: `forelay helps demand planners turn a statistical baseline forecast and the
changes they hear about from sales and marketing (an account signed, a customer
leaving, a shutdown or a local event) into an adjusted plan with honest error
bands, and then watch actuals against it.

Start with "forelay fit" to see how well the history can be forecast, write a
scenario file for the known events ("forelay init" writes a starter), and run
"forelay plan" on it. "forelay stress", "buffer" and "compare" test the plan
against capacity and size the stock to build ahead; "forelay track" follows
new actuals against it.

The plan is a statistical estimate: where supply is safety-critical, defer to
the applicable reliability standards, local codes and licensed practice.`,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
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
	)
	return root
}

// run executes the command line args and returns the process exit code.
func run(args []string, io *IOStreams, now func() time.Time) int {
	f := &Factory{IO: io, Now: now}
	root := newRootCmd(f)
	root.SetArgs(args)
	err := root.Execute()
	if err == nil {
		return exitOK
	}
	fmt.Fprintln(io.ErrOut, "forelay: "+err.Error())
	var fe *flagError
	if errors.As(err, &fe) {
		fmt.Fprintln(io.ErrOut, "Run 'forelay --help' (or the command with --help) for usage.")
	}
	return exitCode(err)
}

func newCmdVersion(f *Factory) *cobra.Command {
	var asJSON bool
	cmd := &cobra.Command{
		Use:   "version",
		Short: "Print the forelay version",
		Args:  cobra.NoArgs,
		RunE: func(cmd *cobra.Command, args []string) error {
			if asJSON {
				b, err := marshalLine(map[string]string{"version": version})
				if err != nil {
					return err
				}
				_, err = f.IO.Out.Write(b)
				return err
			}
			_, err := fmt.Fprintf(f.IO.Out, "forelay %s\n", version)
			return err
		},
	}
	cmd.Flags().BoolVar(&asJSON, "json", false, "print the version as JSON")
	return cmd
}
