package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"testing"
)

func TestNewCmdCompare(t *testing.T) {
	def := CompareOptions{File: "plan.yaml", Sim: simFlags{Paths: 10000, Seed: 1, Errors: "bootstrap"}, Service: 0.95}
	for _, tc := range []struct {
		name    string
		args    []string
		want    CompareOptions
		wantErr string
	}{
		{"defaults", []string{"plan.yaml"}, def, ""},
		{"flags", []string{"plan.yaml", "--service", "0.9", "--out", "o", "--json", "--no-chart", "--paths", "100", "--errors", "normal"},
			CompareOptions{File: "plan.yaml", Sim: simFlags{Paths: 100, Seed: 1, Errors: "normal"}, Service: 0.9, Out: "o", JSON: true, NoChart: true}, ""},
		{"service", []string{"plan.yaml", "--service", "1.1"}, def, "--service 1.1: must be between 0 and 1"},
		{"paths", []string{"plan.yaml", "--paths", "0"}, def, "--paths 0: at least 100"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			checkOptions(t, newCmdCompare, tc.args, tc.want, tc.wantErr, func(o *CompareOptions) { o.IO = nil })
		})
	}
}

func TestCompareRun(t *testing.T) {
	path := stressFixture(t, "compare_run.txtar", "plan.yaml")
	f, out, _ := testFactory()
	dir := filepath.Join(filepath.Dir(path), "out")
	opts := &CompareOptions{IO: f.IO, File: path, Out: dir, JSON: true, Sim: simFlags{Paths: 300, Seed: 1, Errors: "bootstrap"}, Service: 0.95}
	if err := compareRun(opts); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"compare.csv", "compare.json", "compare.png", "compare.svg",
		"waterfall-committed.png", "waterfall-upside.svg", "waterfall-downside.png"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Error(err)
		}
	}
	var doc struct {
		Scenarios []struct {
			Name string `json:"name"`
		} `json:"scenarios"`
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Scenarios) != 3 {
		t.Fatalf("%d scenarios", len(doc.Scenarios))
	}
	disk, err := os.ReadFile(filepath.Join(dir, "compare.json"))
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(disk, out.Bytes()) {
		t.Error("stdout and compare.json differ")
	}
}
