package plan

import (
	"forelay/scenario"
	"math"
	"path/filepath"
	"strings"
	"testing"
)

// zigzag returns n invented monthly values 90, 110, 90, ...: the naive
// baseline after an even count is 110 in every period, with a one-step
// error of ±20.
func zigzag(n int) []float64 {
	y := make([]float64, n)
	for t := range y {
		y[t] = 90 + 20*float64(t%2)
	}
	return y
}

// checkRows checks f <= lower <= adjusted <= upper and f <= risk-weighted
// in every row of every scenario (f = -Inf without a floor).
func checkRows(t *testing.T, p *Plan) {
	t.Helper()
	f := math.Inf(-1)
	if p.Floor != nil {
		f = *p.Floor
	}
	for _, sp := range p.Scenarios {
		for k := range p.Periods {
			lo, adj, up, rw := sp.Lower[k], sp.Adjusted[k], sp.Upper[k], sp.RiskWeighted[k]
			if !(f <= lo && lo <= adj && adj <= up && f <= rw) {
				t.Errorf("%s %s: floor %g lower %g adjusted %g upper %g risk-weighted %g", sp.Name, p.Periods[k], f, lo, adj, up, rw)
			}
		}
	}
}

func TestFloorClipsOverLargeLoss(t *testing.T) {
	// History 2022-01 to 2023-12 (24 months); naive baseline 110 from
	// 2024-01. The loss of 150 a month from 2024-03 is typed too large:
	// 110 − 150 − 5 = −45 < 0 in 2024-03 to 2024-06, so the plan is
	// clipped at 0 there, and both losses (negative contributions) are
	// named; the gain is not.
	body := "plan: p\nhorizon: 6\nbaseline: {method: naive}\nunits: litres\nevents:\n" +
		"  - {id: gain, kind: step, start: 2024-02, effect: {units: 20}, probability: 0.5}\n" +
		"  - {id: loss, kind: step, start: 2024-03, effect: {units: -150}, range: {low: -160, high: -140}}\n" +
		"  - {id: small, kind: step, start: 2024-03, effect: {units: -5}}\n" +
		"scenarios:\n  - {name: none, events: []}\n  - {name: all, events: [gain, loss, small]}\n"
	p := buildTestPlan(t, body, zigzag(24))
	checkRows(t, p)
	all := p.Scenarios[1]
	for k, b := range p.Baseline {
		// naive forecast of 90, 110, ..., 110 (common practice: the last value).
		if math.Abs(b-110) > 1e-9 {
			t.Fatalf("baseline %v, want 110 throughout", p.Baseline)
		}
		// adjusted = max(110 + 20 [from Feb] − 155 [from Mar], 0):
		// 110, 130, 0, 0, 0, 0; risk-weighted max(110 + 10 − 155, 0) = 0
		// from March too.
		want, wantRW := 110.0, 110.0
		switch {
		case k == 1:
			want, wantRW = 130, 120
		case k >= 2:
			want, wantRW = 0, 0
		}
		if all.Adjusted[k] != want || all.RiskWeighted[k] != wantRW {
			t.Errorf("%s: adjusted %g risk-weighted %g, want %g and %g", p.Periods[k], all.Adjusted[k], all.RiskWeighted[k], want, wantRW)
		}
		// The variance is not clipped: the baseline's plus the loss's
		// sd², sd = 20/3.2897 (a 90 % range spans 2 × 1.6449 sd).
		v := p.BaselineVar[k]
		if k >= 2 {
			v += math.Pow(20/(2*1.6448536269514722), 2)
		}
		if math.Abs(all.Var[k]-v) > 1e-9 {
			t.Errorf("%s: variance %g, want %g", p.Periods[k], all.Var[k], v)
		}
	}
	if all.Clipped != 4 || len(all.Clips) != 2 || p.Scenarios[0].Clipped != 0 {
		t.Fatalf("clipped %d, clips %+v; baseline-only clipped %d", all.Clipped, all.Clips, p.Scenarios[0].Clipped)
	}
	c := all.Clips[0]
	// The loss takes 150 in each of the periods 2 to 5, baseline 110.
	if c.Event.ID != "loss" || len(c.Periods) != 4 || c.Periods[0] != 2 || c.Least != 150 || c.Most != 150 || c.Baseline != 110 {
		t.Errorf("clip %+v", c)
	}
	want := []string{
		"scenario all: event loss takes 150.0 litres a month off a baseline of about 110.0 in 2024-03 to 2024-06 (4 periods); the plan is clipped at the floor 0 there. " +
			"Check the units (typed for another series or period?), or set bands.floor: none if demand can be negative.",
		"scenario all: event small takes 5.0 litres a month off a baseline of about 110.0 in 2024-03 to 2024-06 (4 periods); the plan is clipped at the floor 0 there. " +
			"Check the units (typed for another series or period?), or set bands.floor: none if demand can be negative.",
	}
	if strings.Join(p.Warnings, "\n") != strings.Join(want, "\n") {
		t.Errorf("warnings:\n%s\nwant:\n%s", strings.Join(p.Warnings, "\n"), strings.Join(want, "\n"))
	}
}

func TestFloorNoneKeepsNegatives(t *testing.T) {
	// The same loss with floor: none: 110 − 150 = −40 stays, the band
	// around it too, and nothing is said.
	body := "plan: p\nhorizon: 4\nbaseline: {method: naive}\nbands: {floor: none}\nevents:\n" +
		"  - {id: returns, kind: step, start: 2024-03, effect: {units: -150}}\n"
	p := buildTestPlan(t, body, zigzag(24))
	checkRows(t, p)
	sp := p.Scenarios[0]
	if sp.Adjusted[3] != -40 || !(sp.Lower[3] < -40) || sp.Clipped != 0 || sp.Floored != 0 || len(p.Warnings) != 0 || p.Floor != nil {
		t.Errorf("adjusted %v lower %v clipped %d floored %d warnings %q", sp.Adjusted, sp.Lower, sp.Clipped, sp.Floored, p.Warnings)
	}
}

func TestFloorBandOnlyIsANote(t *testing.T) {
	// A loss of 100 leaves 10 above the floor; the band around it
	// (±2 × the naive error of about 20, widening) reaches below 0: the
	// lower band is cut there, with a note and no warning.
	body := "plan: p\nhorizon: 3\nbaseline: {method: naive}\nevents:\n" +
		"  - {id: loss, kind: step, start: 2024-01, effect: {units: -100}}\n"
	p := buildTestPlan(t, body, zigzag(24))
	checkRows(t, p)
	sp := p.Scenarios[0]
	if sp.Adjusted[0] != 10 || sp.Lower[0] != 0 || sp.Floored != 3 || sp.Clipped != 0 || len(p.Warnings) != 0 {
		t.Errorf("adjusted %v lower %v floored %d clipped %d warnings %q", sp.Adjusted, sp.Lower, sp.Floored, sp.Clipped, p.Warnings)
	}
	if !strings.Contains(strings.Join(p.Notes, "\n"), `scenario "plan": the lower band was cut at the floor 0 in 3 period(s)`) {
		t.Errorf("notes %q", p.Notes)
	}
}

func TestFloorUnderBaseline(t *testing.T) {
	// A floor of 200 above the baseline of 110: the baseline itself is
	// below it, so the plan is clipped with one warning and no event is
	// blamed (the loss only lowers what is already below).
	body := "plan: p\nhorizon: 3\nbaseline: {method: naive}\nbands: {floor: 200}\nevents:\n" +
		"  - {id: loss, kind: step, start: 2024-02, effect: {units: -10}}\n"
	p := buildTestPlan(t, body, zigzag(24))
	checkRows(t, p)
	sp := p.Scenarios[0]
	if sp.Adjusted[1] != 200 || sp.Clipped != 3 || len(sp.Clips) != 0 {
		t.Errorf("adjusted %v clipped %d clips %+v", sp.Adjusted, sp.Clipped, sp.Clips)
	}
	want := "the baseline itself falls below the floor 200 in 2024-01 to 2024-03 (3 periods), down to 110.0; the plan is clipped at the floor there. " +
		"Choose a baseline method that does not trend below it (baseline.method), or set bands.floor: none if demand can be negative."
	if len(p.Warnings) != 1 || p.Warnings[0] != want {
		t.Errorf("warnings %q", p.Warnings)
	}
}

func TestPeriodList(t *testing.T) {
	p := buildTestPlan(t, "plan: p\nhorizon: 12\nbaseline: {method: naive}\n", zigzag(24))
	for _, tc := range []struct {
		ts   []int
		want string // written by hand from the periods 2024-01 on
	}{
		{[]int{4}, "2024-05"},
		{[]int{0, 1, 2}, "2024-01 to 2024-03 (3 periods)"},
		{[]int{0, 2, 3, 7}, "2024-01, 2024-03 to 2024-04 and 2024-08 (4 periods)"},
	} {
		if got := p.periodList(tc.ts); got != tc.want {
			t.Errorf("periodList(%v) = %q, want %q", tc.ts, got, tc.want)
		}
	}
}

func TestFloorTestdataOverLargeLoss(t *testing.T) {
	// testdata/scenario/overlarge-loss.yaml: a loss of 900,000 litres a
	// month on an invented baseline of about 500,000 from 2027-05; the
	// horizon ends 2028-04, so 12 periods are clipped, in the scenario
	// with the loss only.
	f, err := scenario.Load(filepath.Join("..", "..", "testdata", "scenario", "overlarge-loss.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := Load(f)
	if err != nil {
		t.Fatal(err)
	}
	checkRows(t, p)
	if p.Scenarios[0].Clipped != 0 || len(p.Scenarios[1].Clips) != 1 || len(p.Warnings) != 1 {
		t.Fatalf("clipped %d, clips %+v, warnings %q", p.Scenarios[0].Clipped, p.Scenarios[1].Clips, p.Warnings)
	}
	for _, frag := range []string{"scenario contract-and-loss: event grocer-exit takes 900,000 litres a month off a baseline of about ",
		" in 2027-05 to 2028-04 (12 periods); the plan is clipped at the floor 0 there. Check the units"} {
		if !strings.Contains(p.Warnings[0], frag) {
			t.Errorf("warning %q lacks %q", p.Warnings[0], frag)
		}
	}
	sp := p.Scenarios[1]
	for k := 6; k < 18; k++ {
		if sp.Adjusted[k] != 0 || sp.Lower[k] != 0 {
			t.Errorf("%s: adjusted %g lower %g, want 0", p.Periods[k], sp.Adjusted[k], sp.Lower[k])
		}
	}

	// With floor: none the same plan goes below zero and nothing is said.
	f.Bands.Floor = nil
	if p, err = Load(f); err != nil {
		t.Fatal(err)
	}
	checkRows(t, p)
	if len(p.Warnings) != 0 || p.Scenarios[1].Adjusted[6] >= 0 {
		t.Errorf("without a floor: adjusted %g, warnings %q", p.Scenarios[1].Adjusted[6], p.Warnings)
	}
}
