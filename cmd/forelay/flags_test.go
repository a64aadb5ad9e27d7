package main

import (
	"bytes"
	"reflect"
	"strings"
	"testing"

	"github.com/spf13/cobra"
)

// checkOptions runs the command newCmd makes on args, with a run function
// that only keeps its options, and checks the outcome: an error holding
// wantErr (and the run function not called), or no error and options equal
// to want once clear has taken out what a test cannot compare (the
// streams).
func checkOptions[O any](t *testing.T, newCmd func(*Factory, func(*O) error) *cobra.Command, args []string, want O, wantErr string, clear func(*O)) {
	t.Helper()
	f, _, _ := testFactory()
	var got *O
	cmd := newCmd(f, func(o *O) error { got = o; return nil })
	cmd.SetArgs(args)
	cmd.SetOut(&bytes.Buffer{})
	cmd.SetErr(&bytes.Buffer{})
	err := cmd.Execute()
	if wantErr != "" {
		if err == nil || !strings.Contains(err.Error(), wantErr) {
			t.Fatalf("error %v, want %q", err, wantErr)
		}
		if got != nil {
			t.Error("runF was called despite the error")
		}
		return
	}
	if err != nil {
		t.Fatal(err)
	}
	clear(got)
	if !reflect.DeepEqual(*got, want) {
		t.Errorf("options\n got %+v\nwant %+v", *got, want)
	}
}
