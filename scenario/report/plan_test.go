package report

import (
	"encoding/json"
	"errors"
	"forelay/scenario"
	"forelay/scenario/plan"
	"math"
	"os"
	"path/filepath"
	"testing"
)

// TestPlanRoundTrip writes plan.json for a plan and reads it back: the
// plan to track against must come back as the plan gives it, to the 10
// significant digits Num writes.
func TestPlanRoundTrip(t *testing.T) {
	f, err := scenario.Load("../../testdata/scenario/overlarge-loss.yaml")
	if err != nil {
		t.Fatal(err)
	}
	p, err := plan.Load(f)
	if err != nil {
		t.Fatal(err)
	}
	doc := Plan(p)
	if doc.Version != PlanVersion {
		t.Errorf("version %d, want %d", doc.Version, PlanVersion)
	}
	b, err := json.Marshal(doc)
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "plan.json")
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	got, inputs, err := ReadPlan(path)
	if err != nil {
		t.Fatal(err)
	}
	want := p.TrackPlan()
	if got.Name != want.Name || got.Units != want.Units || got.Series != want.Series || got.HistoryEnd != want.HistoryEnd {
		t.Errorf("header %+v, want %+v", got, want)
	}
	close10 := func(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b)) }
	if !close10(got.MAD, want.MAD) || !close10(got.MSE, want.MSE) {
		t.Errorf("MAD, MSE %v, %v; want %v, %v", got.MAD, got.MSE, want.MAD, want.MSE)
	}
	if len(got.Periods) != len(want.Periods) || len(got.Scenarios) != len(want.Scenarios) {
		t.Fatalf("%d periods, %d scenarios; want %d, %d", len(got.Periods), len(got.Scenarios), len(want.Periods), len(want.Scenarios))
	}
	for i := range want.Periods {
		if got.Periods[i] != want.Periods[i] || !close10(got.Baseline[i], want.Baseline[i]) {
			t.Errorf("period %d: %v %v, want %v %v", i, got.Periods[i], got.Baseline[i], want.Periods[i], want.Baseline[i])
		}
	}
	for s := range want.Scenarios {
		g, w := got.Scenarios[s], want.Scenarios[s]
		for i := range w.Adjusted {
			if g.Name != w.Name || !close10(g.Adjusted[i], w.Adjusted[i]) {
				t.Errorf("scenario %s period %d: %v, want %s %v", g.Name, i, g.Adjusted[i], w.Name, w.Adjusted[i])
			}
		}
	}
	if inputs["scenario"] != p.Digests["scenario"] || inputs["history"] != p.Digests["history"] {
		t.Errorf("inputs %v, want %v", inputs, p.Digests)
	}
}

// TestReadPlanVersion: a plan.json of a newer form than this package
// writes is refused with the reason; one without a version (form 0, before
// the field) is read.
func TestReadPlanVersion(t *testing.T) {
	dir := t.TempDir()
	newer := filepath.Join(dir, "newer.json")
	if err := os.WriteFile(newer, []byte(`{"version": 99, "plan": "p"}`), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, _, err := ReadPlan(newer); !errors.Is(err, ErrNotAPlan) {
		t.Errorf("version 99: %v, want ErrNotAPlan", err)
	}
}
