package main

import (
	"fmt"
	"forelay/scenario/plan"

	"github.com/spf13/cobra"

	"forelay/scenario"
)

// CheckOptions are the settings of "forelay check".
type CheckOptions struct {
	IO     *IOStreams
	Shared *sharedFlags
	File   string
	JSON   bool
}

func newCmdCheck(f *Factory, runF func(*CheckOptions) error) *cobra.Command {
	opts := &CheckOptions{IO: f.IO, Shared: f.Shared}
	cmd := &cobra.Command{
		Use:     "check FILE",
		Short:   "Validate a scenario file and its history without computing a plan",
		Long:    helpText("check"),
		Example: `  forelay check examples/dairy/plan.yaml`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			opts.File = args[0]
			if runF != nil {
				return runF(opts)
			}
			return checkRun(opts)
		},
	}
	cmd.Flags().BoolVar(&opts.JSON, "json", false, "print the summary as JSON")
	return cmd
}

func checkRun(opts *CheckOptions) error {
	f, err := scenario.LoadLimited(opts.File, opts.Shared.limits().Scenario())
	if err != nil {
		return &inputError{err: err}
	}
	in, err := plan.Read(f)
	if err != nil {
		return &inputError{err: err}
	}
	ser := in.Series
	lint := f.Lint(ser)
	if err := warnings(opts.IO, opts.Shared, lint); err != nil {
		return err
	}
	past := 0
	for _, e := range f.Events {
		if e.IsPast(ser.Next()) {
			past++
		}
	}
	if opts.JSON {
		b, err := marshalLine(map[string]any{"file": opts.File, "ok": true, "plan": f.Plan, "series": ser.Name,
			"period": ser.Freq().String(), "n": ser.Len(), "events": len(f.Events), "past_events": past,
			"scenarios": len(f.Cases()), "horizon": f.Horizon, "warnings": warningList(lint)})
		if err != nil {
			return err
		}
		_, err = opts.IO.Out.Write(b)
		return err
	}
	_, err = fmt.Fprintf(opts.IO.Out, "%s: ok: plan %s, series %s (%d %s periods, %s to %s), %d event(s) of which %d past, %d scenario(s), horizon %d\n",
		opts.File, f.Plan, ser.Name, ser.Len(), ser.Freq(), ser.Start, ser.Period(ser.Len()-1), len(f.Events), past, len(f.Cases()), f.Horizon)
	return err
}
