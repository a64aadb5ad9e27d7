package main

import (
	"strings"

	"github.com/spf13/cobra"

	"forelay/forecast"
	"forelay/scenario"
)

// registerCompletions gives the shells the values of the flags that take
// names: scenario names, event ids and resource ids read from the
// scenario file on the command line, method names from the engine; and
// the files and folders of the arguments and flags that take them: a
// scenario file (*.yaml, *.yml) for FILE, a CSV file or workbook for
// --history and --actuals, a folder for --out and --plan. It walks the commands, so a
// new command gets the same completions by naming its flags and its
// argument alike.
func registerCompletions(root *cobra.Command) {
	for _, c := range root.Commands() {
		fileCompletions(c)
		if c.Flags().Lookup("scenario") != nil {
			c.RegisterFlagCompletionFunc("scenario", completeFromFile(scenarioNames))
		}
		if c.Flags().Lookup("event") != nil {
			c.RegisterFlagCompletionFunc("event", completeFromFile(fileEventIDs))
		}
		if c.Flags().Lookup("resource") != nil {
			c.RegisterFlagCompletionFunc("resource", completeFromFile(resourceIDs))
		}
		if c.Flags().Lookup("method") != nil {
			c.RegisterFlagCompletionFunc("method", cobra.FixedCompletions(forecast.Methods(), cobra.ShellCompDirectiveNoFileComp))
		}
		if c.Flags().Lookup("decimal") != nil {
			c.RegisterFlagCompletionFunc("decimal", cobra.FixedCompletions([]string{"point", "comma"}, cobra.ShellCompDirectiveNoFileComp))
		}
	}
}

// fileCompletions completes the file and folder arguments of c: the
// scenario file of a command whose usage names FILE, CSV files and
// workbooks for the flags that read one, folders for those that name one.
func fileCompletions(c *cobra.Command) {
	if strings.Contains(c.Use, " FILE") && c.ValidArgsFunction == nil {
		c.ValidArgsFunction = func(cmd *cobra.Command, args []string, prefix string) ([]string, cobra.ShellCompDirective) {
			if len(args) > 0 {
				return nil, cobra.ShellCompDirectiveNoFileComp
			}
			return []string{"yaml", "yml"}, cobra.ShellCompDirectiveFilterFileExt
		}
	}
	for _, name := range []string{"history", "actuals"} {
		if c.Flags().Lookup(name) != nil {
			c.MarkFlagFilename(name, "csv", "xlsx")
		}
	}
	for _, name := range []string{"out", "plan"} {
		if c.Flags().Lookup(name) != nil {
			c.MarkFlagDirname(name)
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

// resourceIDs are the ids of the file's resources, the one a top-level
// capacity stands for included (scenario.File.AllResources).
func resourceIDs(f *scenario.File) []string {
	var out []string
	for _, r := range f.AllResources() {
		out = append(out, r.ID)
	}
	return out
}
