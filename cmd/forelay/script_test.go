package main

import (
	"fmt"
	"os"
	"testing"
	"time"

	"github.com/rogpeppe/go-internal/testscript"
)

// fixedNow is the clock the end-to-end scripts run with.
func fixedNow() time.Time { return time.Date(2026, 11, 20, 9, 0, 0, 0, time.UTC) }

func TestMain(m *testing.M) {
	testscript.Main(m, map[string]func(){
		"forelay": func() {
			os.Exit(run(os.Args[1:], &IOStreams{In: os.Stdin, Out: os.Stdout, ErrOut: os.Stderr}, fixedNow))
		},
		// forelay-code runs forelay and ends its standard error with
		// "exit code N", exiting 0, so that a script can check the code.
		"forelay-code": func() {
			code := run(os.Args[1:], &IOStreams{In: os.Stdin, Out: os.Stdout, ErrOut: os.Stderr}, fixedNow)
			fmt.Fprintf(os.Stderr, "exit code %d\n", code)
			os.Exit(0)
		},
	})
}

// TestScripts runs the end-to-end scripts in testdata/script. Set
// FORELAY_UPDATE_SCRIPTS=1 to rewrite their expected output in place.
func TestScripts(t *testing.T) {
	testscript.Run(t, testscript.Params{
		Dir:                 "testdata/script",
		RequireExplicitExec: true,
		UpdateScripts:       os.Getenv("FORELAY_UPDATE_SCRIPTS") != "",
		Cmds:                scriptCmds,
		Setup: func(env *testscript.Env) error {
			env.Setenv("EXAMPLES", examplesDir())
			return nil
		},
	})
}

func examplesDir() string {
	wd, _ := os.Getwd()
	return wd + "/../../examples"
}
