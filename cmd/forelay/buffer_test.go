package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestNewCmdBuffer(t *testing.T) {
	def := BufferOptions{File: "plan.yaml", Sim: simFlags{Paths: 10000, Seed: 1, Errors: "bootstrap"}, Service: 0.95,
		LeadTime: 1, Demand: "mc"}
	with := func(f func(*BufferOptions)) BufferOptions { o := def; f(&o); return o }
	for _, tc := range []struct {
		name    string
		args    []string
		want    BufferOptions
		wantErr string
	}{
		{"defaults", []string{"plan.yaml"}, def, ""},
		{"all flags", []string{"plan.yaml", "--service", "0.98", "--lead-time", "2.5", "--opening-stock", "400", "--demand", "bands",
			"--scenario", "upside", "--out", "o", "--json", "--no-chart", "--paths", "200", "--seed", "3"},
			with(func(o *BufferOptions) {
				o.Service, o.LeadTime, o.OpeningStock, o.Demand, o.Scenario = 0.98, 2.5, 400, "bands", "upside"
				o.Out, o.JSON, o.NoChart, o.Sim.Paths, o.Sim.Seed = "o", true, true, 200, 3
			}), ""},
		// With --demand bands no paths are drawn, so --paths is not checked.
		{"bands ignores paths", []string{"plan.yaml", "--demand", "bands", "--paths", "5"},
			with(func(o *BufferOptions) { o.Demand, o.Sim.Paths = "bands", 5 }), ""},
		{"service 1", []string{"plan.yaml", "--service", "1"}, def, "--service 1: must be between 0 and 1"},
		{"service 0", []string{"plan.yaml", "--service", "0"}, def, "--service 0: must be between 0 and 1"},
		{"service above 1", []string{"plan.yaml", "--service", "95"}, def, "--service 95: must be between 0 and 1"},
		{"lead time below 1", []string{"plan.yaml", "--lead-time", "0.9"}, def, "--lead-time 0.9: must be at least 1 period"},
		{"paths", []string{"plan.yaml", "--paths", "99"}, def, "--paths 99: at least 100"},
		{"demand", []string{"plan.yaml", "--demand", "x"}, def, `--demand "x": want mc or bands`},
		{"stock", []string{"plan.yaml", "--opening-stock", "-1"}, def, "--opening-stock -1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			checkOptions(t, newCmdBuffer, tc.args, tc.want, tc.wantErr, func(o *BufferOptions) { o.IO = nil })
		})
	}
}

func TestBufferRun(t *testing.T) {
	path := stressFixture(t, "buffer_run.txtar", "plan.yaml")
	f, out, _ := testFactory()
	dir := filepath.Join(filepath.Dir(path), "out")
	opts := &BufferOptions{IO: f.IO, File: path, Out: dir, JSON: true, Sim: simFlags{Paths: 300, Seed: 1, Errors: "bootstrap"},
		Service: 0.95, LeadTime: 4, Demand: "mc", Scenario: "committed"}
	if err := bufferRun(opts); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"buffer.csv", "buffer.json", "buffer.png", "buffer.svg"} {
		if _, err := os.Stat(filepath.Join(dir, name)); err != nil {
			t.Error(err)
		}
	}
	var doc struct {
		Scenario     string `json:"scenario"`
		DemandSource string `json:"demand_source"`
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Scenario != "committed" || doc.DemandSource != "monte-carlo" {
		t.Errorf("scenario %q, demand from %q", doc.Scenario, doc.DemandSource)
	}

	// Text says which service definition it uses.
	f2, out2, _ := testFactory()
	opts.IO, opts.Out, opts.JSON = f2.IO, "", false
	if err := bufferRun(opts); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"cycle service level, not fill rate", "Pre-build: hold", "Safety stock for a lead time of 4 months"} {
		if !strings.Contains(out2.String(), want) {
			t.Errorf("text lacks %q:\n%s", want, out2)
		}
	}
}
