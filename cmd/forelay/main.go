// Command forelay turns a baseline forecast plus known business events into
// an adjusted demand plan with error bands, stress-tests it and tracks
// actuals against it. Run "forelay --help" for the commands.
package main

import (
	"os"
	"time"
)

func main() {
	os.Exit(run(os.Args[1:], &IOStreams{In: os.Stdin, Out: os.Stdout, ErrOut: os.Stderr}, time.Now))
}
