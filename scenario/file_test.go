package scenario

import (
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"forelay/forecast"
)

// dump writes every decoded value of f, one per line, in a fixed order.
func dump(f *File) string {
	var b strings.Builder
	p := func(format string, args ...any) { fmt.Fprintf(&b, format+"\n", args...) }
	opt := func(x *float64) string {
		if x == nil {
			return "-"
		}
		return fmt.Sprint(*x)
	}
	p("plan %s, horizon %d, units %q", f.Plan, f.Horizon, f.Units)
	h := f.History
	p("history %s series %q period %s fill %s at %s", filepath.ToSlash(h.File), h.Series, h.Period, h.Fill, h.Pos)
	bl, c := f.Baseline, f.Baseline.Config
	p("baseline %s season %d metric %s select %s alpha %s beta %s gamma %s phi %s window %d weights %v dummies %v damped %v divisor %s refit %v holdout %d at %s",
		bl.Method, c.Season, bl.Metric, bl.Select, opt(c.Fixed.Alpha), opt(c.Fixed.Beta), opt(c.Fixed.Gamma), opt(c.Fixed.Phi),
		c.Window, c.Weights, c.Dummies, c.Damped, bl.MSEDivisor, bl.Refit, bl.Holdout, bl.Pos)
	p("bands z %.6f coverage %.6f widen %s floor %s", f.Bands.Z, f.Bands.Coverage, f.Bands.Widen, opt(f.Bands.Floor))
	for _, e := range f.Events {
		end := "-"
		if e.HasEnd {
			end = e.End.Label
		}
		rng, pb := "-", "-"
		if e.Range != nil {
			rng = fmt.Sprintf("%g..%g", e.Range.Low, e.Range.High)
		}
		if e.Payback != nil {
			pb = fmt.Sprintf("%g over %d", e.Payback.Share, e.Payback.Periods)
		}
		p("event %s at %s: %s %s..%s periods %d effect %+v ramp %d %s p %g range %s payback %s past %v note %q",
			e.ID, e.Pos, e.Kind, e.Start, end, e.Periods, e.Effect, e.Ramp.Periods, e.Ramp.Shape, e.Probability, rng, pb, e.Past, e.Note)
	}
	for _, cs := range f.Cases() {
		ids := make([]string, len(cs.Events))
		for i, e := range cs.Events {
			ids[i] = e.ID
		}
		p("scenario %s at %s: %s", cs.Name, cs.Pos, strings.Join(ids, ", "))
	}
	if f.Capacity != nil {
		p("capacity %g", f.Capacity.Units)
		for _, ch := range f.Capacity.Changes {
			p("  from %s (%s) %g", ch.From, ch.From.Pos, ch.Units)
		}
	}
	if f.Production != nil {
		p("production %s plan %s", f.Production.Mode, filepath.ToSlash(f.Production.Plan))
	}
	return b.String()
}

func TestLoadFull(t *testing.T) {
	// testdata/scenario/full.yaml uses every key; the values below are
	// read off the file (positions counted in it). Coverage 0.95 gives
	// z = 1.959964 (standard normal table).
	f, err := Load(filepath.Join("..", "testdata", "scenario", "full.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	want := `plan north-plant-2027, horizon 18, units "litres"
history ../testdata/scenario/history.csv series "bottled-l" period month fill interpolate at 3:10
baseline holt-winters-additive season 12 metric mase select aicc alpha 0.3 beta - gamma - phi 0.98 window 0 weights [] dummies false damped true divisor n refit true holdout 12 at 6:3
bands z 1.959964 coverage 0.950000 widen flat floor 0
event school-contract at 19:5: step 2027-02..2028-01 periods 0 effect {Units:35000 Percent:0 IsPercent:false FromPast:false Split:none} ramp 3 linear p 0.7 range 25000..42000 payback - past [] note "signed letter of intent, owner sales-east"
event fair-week at 28:5: pulse 2027-08..- periods 1 effect {Units:0 Percent:20 IsPercent:true FromPast:false Split:none} ramp 0 immediate p 1 range - payback 0.5 over 2 past [2024-08 2025-08] note ""
event storm-2025 at 35:5: pulse 2025-07..- periods 2 effect {Units:0 Percent:0 IsPercent:false FromPast:false Split:none} ramp 0 immediate p 1 range - payback - past [] note ""
event depot-closing at 39:5: step 2027-05-15..- periods 0 effect {Units:0 Percent:-4 IsPercent:true FromPast:false Split:none} ramp 4 s-curve p 1 range - payback - past [] note ""
scenario committed at 45:5: fair-week
scenario with-contract at 46:5: fair-week, school-contract
capacity 540000
  from 2027-06 (49:20) 600000
  from 2028-01 (49:52) 620000
production frozen plan ../testdata/scenario/previous-plan.csv
`
	if got := dump(f); got != want {
		t.Errorf("dump:\n%s\nwant:\n%s", got, want)
	}
	if err := f.Resolve(period("2026-11", forecast.Monthly)); err != nil {
		t.Fatal(err)
	}
	// Parsing the same bytes twice gives the same result.
	g, err := Load(filepath.Join("..", "testdata", "scenario", "full.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	if err := g.Resolve(period("2026-11", forecast.Monthly)); err != nil {
		t.Fatal(err)
	}
	if dump(f) != dump(g) {
		t.Error("two loads differ")
	}
	// The fixture's events on the 18 forecast months from 2026-11.
	next := period("2026-11", forecast.Monthly)
	for _, tc := range []struct {
		id   string
		want []float64
	}{
		// Linear ramp of 3 from 2027-02 (index 3) to 2028-01 (index 14):
		// 1/3, 2/3, then 1; 0 from 2028-02.
		{"school-contract", []float64{0, 0, 0, 1.0 / 3, 2.0 / 3, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0}},
		// One month at 1 in 2027-08 (index 9), then −0.5*1/2 twice.
		{"fair-week", []float64{0, 0, 0, 0, 0, 0, 0, 0, 0, 1, -0.25, -0.25, 0, 0, 0, 0, 0, 0}},
		{"storm-2025", make([]float64, 18)},
		// S-curve of 4 from 15 May 2027 (index 6): May has 17 of 31 days
		// at s(1) = 0.1049935854, so 0.0575771275; then 0.5, s(3), 1.
		{"depot-closing", []float64{0, 0, 0, 0, 0, 0, sc41 * 17 / 31, 0.5, sc43, 1, 1, 1, 1, 1, 1, 1, 1, 1}},
	} {
		equalSlices(t, tc.id, f.Event(tc.id).Profile(next, 18), tc.want, 1e-12)
	}
	if f.Event("storm-2025").IsPast(next) != true || f.Event("depot-closing").Prorated(next) != true || f.Event("fair-week").Prorated(next) {
		t.Error("IsPast or Prorated wrong on the fixture")
	}
	if f.Event("nope") != nil {
		t.Error("Event of an unknown id is not nil")
	}
}

func TestCapacityAt(t *testing.T) {
	c := &Capacity{Units: 540000, Changes: []CapacityChange{
		{From: when("2027-06"), Units: 600000},
		{From: when("2027-Q4"), Units: 620000},
	}}
	for _, tc := range []struct {
		p    forecast.Period
		want float64
	}{
		{period("2027-05", forecast.Monthly), 540000},
		{period("2027-06", forecast.Monthly), 600000},
		{period("2027-09", forecast.Monthly), 600000},
		{period("2027-10", forecast.Monthly), 620000},
		{period("2027-06-15", forecast.Daily), 600000},
		{period("2027-Q2", forecast.Quarterly), 540000},
	} {
		if got := c.At(tc.p); got != tc.want {
			t.Errorf("At(%s) = %g; want %g", tc.p, got, tc.want)
		}
	}
}

func TestKindShapeStrings(t *testing.T) {
	for _, tc := range []struct {
		got, want string
	}{
		{Step.String(), "step"}, {Pulse.String(), "pulse"}, {KindUnknown.String(), "unknown"}, {Kind(9).String(), "Kind(9)"},
		{Immediate.String(), "immediate"}, {Linear.String(), "linear"}, {SCurve.String(), "s-curve"}, {Shape(-1).String(), "Shape(-1)"},
		{Pos{Line: 7, Column: 5}.String(), "7:5"},
	} {
		if tc.got != tc.want {
			t.Errorf("got %q, want %q", tc.got, tc.want)
		}
	}
}
