package scenario

import (
	"errors"
	"fmt"
	"forelay/scenario/data"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
)

func TestZOfCoverage(t *testing.T) {
	for _, tc := range []struct {
		c, z float64
		tol  float64
	}{
		// Standard normal quantiles, from a normal table (common practice)
		// and scipy 1.10.1 norm.ppf((1+c)/2): 1.6448536269514722,
		// 1.959963984540054, 2.5758293035489004.
		{0.90, 1.6448536269514722, 1e-9},
		{0.95, 1.959963984540054, 1e-9},
		{0.99, 2.5758293035489004, 1e-9},
		// Φ(1) = 0.8413447460685429, so ±1 holds 0.6826894921370859.
		{0.6826894921370859, 1, 1e-9},
	} {
		if got := ZOfCoverage(tc.c); !scalar.EqualWithinAbsOrRel(got, tc.z, tc.tol, tc.tol) {
			t.Errorf("ZOfCoverage(%g) = %.12g; want %.12g", tc.c, got, tc.z)
		}
		if got := CoverageOfZ(tc.z); !scalar.EqualWithinAbsOrRel(got, tc.c, tc.tol, tc.tol) {
			t.Errorf("CoverageOfZ(%g) = %.12g; want %.12g", tc.z, got, tc.c)
		}
	}
	for _, c := range []float64{0, 1, -0.5, 95} {
		if z := ZOfCoverage(c); z == z {
			t.Errorf("ZOfCoverage(%g) = %g; want NaN", c, z)
		}
	}
}

func TestParseBands(t *testing.T) {
	for _, tc := range []struct {
		body     string
		z, cover float64
	}{
		// Coverage 0.9: z = Φ⁻¹(0.95) = 1.6448536 (normal table).
		{"bands: {coverage: 0.9}\n", 1.6448536269514722, 0.9},
		// z 3: coverage 2Φ(3) − 1 = 0.9973002039 (normal table: Φ(3) = 0.99865).
		{"bands: {z: 3}\n", 3, 0.9973002039367398},
		{"", 2, 0.9544997361036416},
	} {
		f, err := Parse(strings.NewReader(head+tc.body), "p.yaml")
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(f.Bands.Z, tc.z, 1e-9, 1e-9) || !scalar.EqualWithinAbsOrRel(f.Bands.Coverage, tc.cover, 1e-9, 1e-9) {
			t.Errorf("%q: bands %+v; want z %g coverage %g", tc.body, f.Bands, tc.z, tc.cover)
		}
	}
}

func TestResolveErrors(t *testing.T) {
	month := period("2027-01", forecast.Monthly)
	sundays := period("2027-01-03", forecast.Weekly) // 2027-01-03 is a Sunday
	for _, tc := range []struct {
		name string
		src  string // § marks the expected position
		next forecast.Period
		kind error
		want string
	}{
		{"period mismatch", "plan: p\nhistory: {file: h.csv, period: §month}\nhorizon: 4\n", period("2027-Q1", forecast.Quarterly), ErrValue,
			"history.period: says month but the history's periods are quarters"},
		{"pulse by periods from a date", head + "events:\n  - {id: a, kind: pulse, start: §2027-08-14, effect: {units: 1}}\n", month, ErrValue,
			`event "a": start: 2027-08-14 falls inside a month; a pulse given by periods covers whole months`},
		{"pulse by periods from a quarter", head + "events:\n  - {id: a, kind: pulse, start: §2027-Q3, periods: 2, effect: {units: 1}}\n", month, ErrValue,
			`event "a": start: 2027-Q3 is a quarter but the data are months`},
		{"past pulse from a date", head + "events:\n  - {id: a, kind: pulse, start: 2027-08-01, effect: {units: 1}, past: [2026-08-01, §2025-08-14]}\n", month, ErrValue,
			`event "a": past[1]: 2025-08-14 falls inside a month`},
		{"iso week on sunday weeks", head + "events:\n  - {id: a, kind: pulse, start: §2027-W33, effect: {units: 1}}\n", sundays, ErrValue,
			`event "a": start: 2027-W33 falls inside a week`},
		// Feb and Mar: 2 months; a ramp of 3 does not fit.
		{"ramp longer than step", head + "events:\n  - {id: a, kind: step, start: 2027-02, end: 2027-03, effect: {units: 1}, ramp: {periods: §3}}\n", month, ErrValue,
			`event "a": ramp.periods: a ramp of 3 months is longer than the event (2 months, 2027-02 to 2027-03)`},
		// 15 Feb to 10 Mar touches 2 months.
		{"ramp longer than dated step", head + "events:\n  - {id: a, kind: step, start: 2027-02-15, end: 2027-03-10, effect: {units: 1}, ramp: {periods: §3, shape: s-curve}}\n", month, ErrValue,
			`a ramp of 3 months is longer than the event (2 months, 2027-02 to 2027-03)`},
		{"effect missing", head + "events:\n  - §{id: a, kind: pulse, start: 2027-08}\n", month, ErrMissing,
			`event "a": effect: required: the event reaches the forecast (2027-01 on)`},
		{"effect missing on a running step", head + "events:\n  - §id: a\n    kind: step\n    start: 2025-08\n", month, ErrMissing,
			`event "a": effect: required`},
		// Payback of a December pulse lands in January and February.
		{"past occurrence in forecast", head + "events:\n  - {id: a, kind: pulse, start: 2027-08, effect: {units: 1}, payback: {share: 0.5, periods: 2}, past: [2025-12, §2026-12]}\n", month, ErrValue,
			`event "a": past[1]: past occurrence 2026-12 reaches 2027-02 (payback included), not before the forecast starts at 2027-01`},
		{"capacity change inside a month", head + "capacity: {units: 5, changes: [{from: §2027-06-15, units: 6}]}\n", month, ErrValue,
			"capacity.changes[0].from: 2027-06-15 falls inside a month; capacity changes apply from whole months"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src, line, col := marked(tc.src)
			f, err := Parse(strings.NewReader(src), "plan.yaml")
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			err = f.Resolve(tc.next)
			if _, ok := err.(*data.ParseError); !ok {
				t.Fatalf("want exactly one problem, got %v", err)
			}
			prefix := fmt.Sprintf("plan.yaml:%d:%d: ", line, col)
			if msg := err.Error(); !strings.HasPrefix(msg, prefix) || !strings.Contains(msg, tc.want) {
				t.Errorf("error\n  %s\nwant prefix %q and fragment %q", msg, prefix, tc.want)
			}
			if !errors.Is(err, tc.kind) {
				t.Errorf("error %v does not wrap %v", err, tc.kind)
			}
		})
	}
}

func TestResolveAccepts(t *testing.T) {
	month := period("2027-01", forecast.Monthly)
	for _, tc := range []struct {
		name string
		body string
		next forecast.Period
	}{
		// Wholly past: cleaned out, no effect needed.
		{"past pulse without effect", "events:\n  - {id: storm, kind: pulse, start: 2025-07, periods: 2}\n", month},
		{"past step without effect", "events:\n  - {id: promo, kind: step, start: 2025-07, end: 2026-12}\n", month},
		{"learnt from the past", "events:\n  - {id: fair, kind: pulse, start: 2027-08, effect: {from: past}, past: [2025-08, 2026-08]}\n", month},
		{"date pulse with end", "events:\n  - {id: a, kind: pulse, start: 2027-08-14, end: 2027-08-23, effect: {units: 1}}\n", month},
		{"aligned date pulse", "events:\n  - {id: a, kind: pulse, start: 2027-08-01, effect: {units: 1}}\n", month},
		{"iso week on iso weeks", "events:\n  - {id: a, kind: pulse, start: 2027-W33, effect: {units: 1}}\n", period("2027-W01", forecast.Weekly)},
		{"month on quarters, step", "events:\n  - {id: a, kind: step, start: 2027-05, effect: {units: 1}}\n", period("2027-Q1", forecast.Quarterly)},
		// On daily data 15 Feb to 10 Mar is 24 days: a ramp of 3 fits.
		{"ramp on days", "events:\n  - {id: a, kind: step, start: 2027-02-15, end: 2027-03-10, effect: {units: 1}, ramp: {periods: 3}}\n", period("2027-01-01", forecast.Daily)},
		{"ramp as long as step", "events:\n  - {id: a, kind: step, start: 2027-02, end: 2027-04, effect: {units: 1}, ramp: {periods: 3}}\n", month},
		{"zero units given", "events:\n  - {id: a, kind: step, start: 2027-02, effect: {units: 0}}\n", month},
		{"capacity by quarter", "capacity: {units: 5, changes: [{from: 2027-Q3, units: 6}]}\n", month},
	} {
		t.Run(tc.name, func(t *testing.T) {
			f, err := Parse(strings.NewReader(head+tc.body), "plan.yaml")
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			if err := f.Resolve(tc.next); err != nil {
				t.Fatalf("Resolve: %v", err)
			}
			if f.History.Period != tc.next.Freq {
				t.Errorf("History.Period = %s; want %s", f.History.Period, tc.next.Freq)
			}
		})
	}
}

func TestResolveHandBuilt(t *testing.T) {
	// A File built in code has no positions: errors fall back to the
	// event's Pos and name the event by id.
	f := &File{Path: "mem", Events: []*Event{{ID: "x", Kind: Pulse, Start: when("2027-08"), Periods: 1, Probability: 1, Pos: Pos{Line: 3, Column: 5}}}}
	err := f.Resolve(period("2027-01", forecast.Monthly))
	want := `mem:3:5: event "x": effect: required: the event reaches the forecast (2027-01 on); give units, percent or from: past`
	if err == nil || err.Error() != want {
		t.Errorf("error = %v; want %s", err, want)
	}
}
