package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
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
			f, _, _ := testFactory()
			var got *CompareOptions
			cmd := newCmdCompare(f, func(o *CompareOptions) error { got = o; return nil })
			cmd.SetArgs(tc.args)
			cmd.SetOut(&bytes.Buffer{})
			cmd.SetErr(&bytes.Buffer{})
			err := cmd.Execute()
			if tc.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
					t.Fatalf("error %v, want %q", err, tc.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			got.IO = nil
			if !reflect.DeepEqual(*got, tc.want) {
				t.Errorf("options\n got %+v\nwant %+v", *got, tc.want)
			}
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
		BaselineTotal float64 `json:"baseline_total"`
		Scenarios     []struct {
			Name              string  `json:"name"`
			Total             float64 `json:"total"`
			Change            float64 `json:"change"`
			BreachProbability float64 `json:"breach_probability"`
			Contributions     []struct {
				Event string  `json:"event"`
				Total float64 `json:"total"`
			} `json:"contributions"`
		} `json:"scenarios"`
	}
	if err := json.Unmarshal(out.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Scenarios) != 3 {
		t.Fatalf("%d scenarios", len(doc.Scenarios))
	}
	for _, s := range doc.Scenarios {
		sum := 0.0
		for _, c := range s.Contributions {
			sum += c.Total
		}
		// The waterfall adds up: baseline + contributions = total.
		if math.Abs(doc.BaselineTotal+sum-s.Total) > 1e-3 || math.Abs(s.Change-sum) > 1e-3 {
			t.Errorf("%s: baseline %v + %v != total %v", s.Name, doc.BaselineTotal, sum, s.Total)
		}
		if s.BreachProbability < 0 || s.BreachProbability > 1 {
			t.Errorf("%s: breach probability %v", s.Name, s.BreachProbability)
		}
	}
}

// TestCompareCSVCells checks that compare.csv has a number in every number
// cell, as plan.csv does: 0 for an event outside a scenario, and 0 breach
// probability and pre-build without a capacity. Only prebuild_before, a
// period, may be empty.
func TestCompareCSVCells(t *testing.T) {
	path := stressFixture(t, "compare_run.txtar", "nocap.yaml")
	f, _, _ := testFactory()
	dir := filepath.Join(filepath.Dir(path), "out")
	opts := &CompareOptions{IO: f.IO, File: path, Out: dir, NoChart: true, Sim: simFlags{Paths: 200, Seed: 1, Errors: "bootstrap"}, Service: 0.95}
	if err := compareRun(opts); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(filepath.Join(dir, "compare.csv"))
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(b)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	head := rows[0]
	col := map[string]int{}
	for j, h := range head {
		col[h] = j
	}
	for _, row := range rows[1:] {
		for j, cell := range row {
			if cell == "" && head[j] != "prebuild_before" {
				t.Errorf("scenario %s: %s is empty", row[0], head[j])
			}
		}
		if row[col["breach_probability"]] != "0.0000" || row[col["prebuild"]] != "0.00" {
			t.Errorf("scenario %s without capacity: breach %q, prebuild %q; want 0.0000 and 0.00",
				row[0], row[col["breach_probability"]], row[col["prebuild"]])
		}
	}
	// The committed scenario has only summer-promo: new-store adds 0.
	if got := rows[1][col["new-store"]]; rows[1][0] != "committed" || got != "0.00" {
		t.Errorf("committed, new-store = %q, want 0.00", got)
	}
}
