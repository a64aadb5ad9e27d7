package main

import (
	"bytes"
	"maps"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"forelay/scenario"
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

// The starter scenario with its events-file line uncommented reads the
// starter events table: both its events, with their owners, and the
// starter's own.
func TestStarterDeals(t *testing.T) {
	dir := t.TempDir()
	var stdout, stderr bytes.Buffer
	ios := &IOStreams{In: strings.NewReader(""), Out: &stdout, ErrOut: &stderr}
	if code := run([]string{"init", dir}, ios, fixedNow); code != 0 {
		t.Fatalf("init: exit %d: %s", code, stderr.String())
	}
	path := filepath.Join(dir, "plan.yaml")
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	on := strings.Replace(string(src), "# events-file: deals.csv", "events-file: deals.csv", 1)
	if on == string(src) {
		t.Fatal("the starter plan.yaml has no '# events-file: deals.csv' line")
	}
	if err := os.WriteFile(path, []byte(on), 0o644); err != nil {
		t.Fatal(err)
	}
	f, err := scenario.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	owners := map[string]string{}
	for _, e := range f.Events {
		owners[e.ID] = e.Owner
	}
	want := map[string]string{"new-account": "", "line-upgrade": "", "cafe-chain-listing": "food-service sales", "county-fair-stand": "events team"}
	if !maps.Equal(owners, want) {
		t.Errorf("events and owners %v, want %v", owners, want)
	}
}
