package main

import (
	"bytes"
	"os"
	"testing"
)

// The starter history is the demo history; keep the two in step.
func TestStarterHistoryIsTheDemo(t *testing.T) {
	demo, err := os.ReadFile("../../examples/dairy/history.csv")
	if err != nil {
		t.Fatal(err)
	}
	starter, err := starterFiles.ReadFile("starter/history.csv")
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(demo, starter) {
		t.Error("cmd/forelay/starter/history.csv differs from examples/dairy/history.csv; copy the demo over")
	}
}
