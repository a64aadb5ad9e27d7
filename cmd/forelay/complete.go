package main

import (
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
	"forelay/scenario"
)

// registerCompletions gives the shells the values of the flags that take
// names: scenario names and event ids read from the scenario file on the
// command line, method names from the engine. It walks the commands, so a
// new command gets the same completions by naming its flags alike.
func registerCompletions(root *cobra.Command) {
	for _, c := range root.Commands() {
		if c.Flags().Lookup("scenario") != nil {
			c.RegisterFlagCompletionFunc("scenario", completeFromFile(scenarioNames))
		}
		if c.Flags().Lookup("event") != nil {
			c.RegisterFlagCompletionFunc("event", completeFromFile(fileEventIDs))
		}
		if c.Flags().Lookup("method") != nil {
			c.RegisterFlagCompletionFunc("method", cobra.FixedCompletions(forecast.Methods(), cobra.ShellCompDirectiveNoFileComp))
		}
	}
}

// completeFromFile completes a flag from the scenario file given as the
// first argument; without a readable file it offers nothing.
func completeFromFile(names func(*scenario.File) []string) cobra.CompletionFunc {
	return func(cmd *cobra.Command, args []string, prefix string) ([]string, cobra.ShellCompDirective) {
		if len(args) == 0 {
			return nil, cobra.ShellCompDirectiveNoFileComp
		}
		f, err := scenario.Load(args[0])
		if err != nil {
			return nil, cobra.ShellCompDirectiveNoFileComp
		}
		var out []string
		for _, n := range names(f) {
			if strings.HasPrefix(n, prefix) {
				out = append(out, n)
			}
		}
		return out, cobra.ShellCompDirectiveNoFileComp
	}
}

func scenarioNames(f *scenario.File) []string {
	var out []string
	for _, c := range f.Cases() {
		out = append(out, c.Name)
	}
	return out
}

func fileEventIDs(f *scenario.File) []string {
	var out []string
	for _, e := range f.Events {
		out = append(out, e.ID)
	}
	return out
}
