package main

import (
	"bytes"
	"fmt"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

// complete runs the shells' hidden completion request on root and returns
// the candidates and the directive line (":N").
func complete(t *testing.T, root *cobra.Command, args ...string) (cands []string, directive string) {
	t.Helper()
	var out bytes.Buffer
	root.SetOut(&out)
	root.SetErr(&bytes.Buffer{})
	root.SetArgs(append([]string{cobra.ShellCompRequestCmd}, args...))
	if err := root.Execute(); err != nil {
		t.Fatalf("%v: %v", args, err)
	}
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	return lines[:len(lines)-1], lines[len(lines)-1]
}

// TestCompletions checks the values the shells are offered, from the
// example files and the engine.
func TestCompletions(t *testing.T) {
	dairy := filepath.Join(examplesDir(), "dairy", "plan.yaml")
	portfolio := filepath.Join(examplesDir(), "portfolio", "plan.yaml")
	for _, tc := range []struct {
		name      string
		args      []string
		want      []string // among the candidates
		directive cobra.ShellCompDirective
	}{
		{"scenario names", []string{"stress", dairy, "--scenario", ""}, []string{"committed", "with-contract", "contract-and-loss"}, cobra.ShellCompDirectiveNoFileComp},
		{"scenario names of a portfolio", []string{"buffer", portfolio, "--scenario", "with"}, []string{"with-range"}, cobra.ShellCompDirectiveNoFileComp},
		{"event ids", []string{"plan", portfolio, "--event", "gro"}, []string{"grocer-hill-range", "grocer-east-leaves"}, cobra.ShellCompDirectiveNoFileComp},
		{"methods", []string{"fit", "--method", "holt"}, []string{"holt", "holt-winters-additive"}, cobra.ShellCompDirectiveNoFileComp},
		{"scenario file", []string{"plan", ""}, []string{"yaml", "yml"}, cobra.ShellCompDirectiveFilterFileExt},
		{"one file only", []string{"check", dairy, ""}, nil, cobra.ShellCompDirectiveNoFileComp},
		{"history CSV or workbook", []string{"fit", "--history", ""}, []string{"csv", "xlsx"}, cobra.ShellCompDirectiveFilterFileExt},
		{"actuals CSV or workbook", []string{"track", dairy, "--actuals", ""}, []string{"csv", "xlsx"}, cobra.ShellCompDirectiveFilterFileExt},
		{"decimal marks", []string{"fit", "--decimal", ""}, []string{"point", "comma"}, cobra.ShellCompDirectiveNoFileComp},
		{"out folder", []string{"buffer", dairy, "--out", ""}, nil, cobra.ShellCompDirectiveFilterDirs},
		{"no file, no names", []string{"stress", filepath.Join(t.TempDir(), "none.yaml"), "--scenario", ""}, nil, cobra.ShellCompDirectiveNoFileComp},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f := &Factory{IO: &IOStreams{In: strings.NewReader(""), Out: &bytes.Buffer{}, ErrOut: &bytes.Buffer{}}, Now: fixedNow}
			got, d := complete(t, newRootCmd(f), tc.args...)
			for _, w := range tc.want {
				if !slices.Contains(got, w) {
					t.Errorf("%q not among %q", w, got)
				}
			}
			if tc.want == nil && len(got) > 0 {
				t.Errorf("candidates %q, want none", got)
			}
			if want := fmt.Sprintf(":%d", tc.directive); d != want {
				t.Errorf("directive %s, want %s", d, want)
			}
		})
	}
}

// TestResourceCompletion checks the completion of --resource on the
// commands that take it: the ids of the file's resources, or "capacity"
// for a top-level capacity.
func TestResourceCompletion(t *testing.T) {
	for _, tc := range []struct {
		file string
		want []string
	}{
		{filepath.Join(examplesDir(), "portfolio", "plan.yaml"), []string{"bottling-line", "cup-filler"}},
		{filepath.Join(examplesDir(), "dairy", "plan.yaml"), []string{"capacity"}},
	} {
		for _, command := range []string{"stress", "buffer", "compare"} {
			f := &Factory{IO: &IOStreams{In: strings.NewReader(""), Out: &bytes.Buffer{}, ErrOut: &bytes.Buffer{}}, Now: fixedNow}
			got, _ := complete(t, newRootCmd(f), command, tc.file, "--resource", "")
			if !slices.Equal(got, tc.want) {
				t.Errorf("%s %s: %q, want %q", command, tc.file, got, tc.want)
			}
		}
	}
}

// TestCompletionScripts checks that cobra's completion command writes the
// script of each of the four shells.
func TestCompletionScripts(t *testing.T) {
	for _, tc := range []struct{ shell, marker string }{
		{"bash", "bash completion"},
		{"zsh", "#compdef forelay"},
		{"fish", "complete -c forelay"},
		{"powershell", "Register-ArgumentCompleter"},
	} {
		var out, errOut bytes.Buffer
		if code := run([]string{"completion", tc.shell}, &IOStreams{In: strings.NewReader(""), Out: &out, ErrOut: &errOut}, fixedNow); code != 0 {
			t.Fatalf("%s: exit %d: %s", tc.shell, code, errOut.String())
		}
		if !strings.Contains(out.String(), tc.marker) || errOut.Len() > 0 {
			t.Errorf("%s: no %q in the script (%d bytes), stderr %q", tc.shell, tc.marker, out.Len(), errOut.String())
		}
	}
}
