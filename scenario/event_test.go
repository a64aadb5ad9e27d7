package scenario

import (
	"forelay/scenario/internal/plantest"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
)

// when parses a label for a test; it panics on a bad one.
func when(label string) When {
	w, err := ParseWhen(label)
	if err != nil {
		panic(err)
	}
	return w
}

// period parses a label in frequency f for a test.
func period(label string, f forecast.Frequency) forecast.Period {
	p, err := forecast.ParsePeriod(label, f)
	if err != nil {
		panic(err)
	}
	return p
}

// step builds a step from start (and end, unless "").
func step(start, end string, ramp Ramp) *Event {
	e := &Event{ID: "s", Kind: Step, Start: when(start), Ramp: ramp, Probability: 1}
	if end != "" {
		e.End, e.HasEnd = when(end), true
	}
	return e
}

// pulse builds a pulse of n periods from start, or from start to end.
func pulse(start, end string, n int, pb *Payback) *Event {
	e := &Event{ID: "p", Kind: Pulse, Start: when(start), Periods: n, Payback: pb, Probability: 1}
	if end != "" {
		e.End, e.HasEnd = when(end), true
	}
	return e
}

func equalSlices(t *testing.T, what string, got, want []float64, tol float64) {
	t.Helper()
	plantest.EqualSlices(t, what, got, want, tol)
}

// sc holds the s-curve shares for P = 4 and P = 3, s(k) = (tanh(4k/P − 2) +
// tanh 2) / (2 tanh 2), with tanh 1 = 0.7615941559557649 and
// tanh 2 = 0.9640275800758169 (Python 3.11 math.tanh):
//
//	P=4: s(1) = (−tanh 1 + tanh 2)/(2 tanh 2) = 0.2024334241/1.9280551602 = 0.1049935854
//	     s(2) = (0 + tanh 2)/(2 tanh 2) = 0.5
//	     s(3) = (tanh 1 + tanh 2)/(2 tanh 2) = 1.7256217360/1.9280551602 = 0.8950064146
//	P=3: s(1) = (tanh(−2/3) + tanh 2)/(2 tanh 2) = 0.1977353359, s(2) = 1 − s(1) = 0.8022646641
//
// The same values come from the logistic form (Python 3.11:
// (L(8*(k-P/2)/P) - L(-4)) / (L(4) - L(-4)) with L(x) = 1/(1+exp(-x))).
const (
	sc41 = 0.10499358540350655
	sc43 = 0.8950064145964934
	sc31 = 0.1977353359008273
	sc32 = 0.8022646640991726
)

func TestRampShare(t *testing.T) {
	for _, tc := range []struct {
		name string
		ramp Ramp
		want []float64 // s(0), s(1), ..., s(P+1)
	}{
		// Immediate: full size from the first period.
		{"immediate", Ramp{}, []float64{0, 1, 1}},
		{"immediate ignores periods", Ramp{Periods: 3, Shape: Immediate}, []float64{0, 1, 1}},
		// Linear, P = 3: k/3.
		{"linear 3", Ramp{Periods: 3, Shape: Linear}, []float64{0, 1.0 / 3, 2.0 / 3, 1, 1}},
		{"linear 1", Ramp{Periods: 1, Shape: Linear}, []float64{0, 1, 1}},
		{"s-curve 4", Ramp{Periods: 4, Shape: SCurve}, []float64{0, sc41, 0.5, sc43, 1, 1}},
		{"s-curve 3", Ramp{Periods: 3, Shape: SCurve}, []float64{0, sc31, sc32, 1, 1}},
		// P = 2: s(1) = (tanh 0 + tanh 2)/(2 tanh 2) = 1/2, as linear.
		{"s-curve 2", Ramp{Periods: 2, Shape: SCurve}, []float64{0, 0.5, 1, 1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := make([]float64, len(tc.want))
			for k := range got {
				got[k] = tc.ramp.Share(k)
			}
			equalSlices(t, "Share", got, tc.want, 1e-12)
		})
	}
	// Symmetry and total, for P = 1..12: s(k) + s(P−k) = 1, so the sum of
	// s(1..P) is (P+1)/2, that of the linear ramp (sum of k/P = (P+1)/2).
	for P := 1; P <= 12; P++ {
		r := Ramp{Periods: P, Shape: SCurve}
		sum := 0.0
		for k := 1; k <= P; k++ {
			sum += r.Share(k)
			if s := r.Share(k) + r.Share(P-k); !scalar.EqualWithinAbs(s, 1, 1e-12) {
				t.Errorf("P=%d k=%d: s(k)+s(P-k) = %g", P, k, s)
			}
		}
		if !scalar.EqualWithinAbs(sum, float64(P+1)/2, 1e-12) {
			t.Errorf("P=%d: sum = %g, want %g", P, sum, float64(P+1)/2)
		}
	}
}

func TestProfile(t *testing.T) {
	pb := func(share float64, n int) *Payback { return &Payback{Share: share, Periods: n} }
	for _, tc := range []struct {
		name  string
		ev    *Event
		first forecast.Period
		n     int
		want  []float64
		tol   float64
	}{
		// Immediate step from March, no end: 0 in Jan and Feb, 1 from March on.
		{"immediate step", step("2027-03", "", Ramp{}), period("2027-01", forecast.Monthly), 5,
			[]float64{0, 0, 1, 1, 1}, 1e-12},
		// Linear ramp of 3 from February: k/3 for k = 1, 2, 3, then 1.
		{"linear ramp", step("2027-02", "", Ramp{Periods: 3, Shape: Linear}), period("2027-01", forecast.Monthly), 6,
			[]float64{0, 1.0 / 3, 2.0 / 3, 1, 1, 1}, 1e-12},
		// S-curve of 4 from February: s(1..4) = sc41, 0.5, sc43, 1.
		{"s-curve ramp", step("2027-02", "", Ramp{Periods: 4, Shape: SCurve}), period("2027-01", forecast.Monthly), 7,
			[]float64{0, sc41, 0.5, sc43, 1, 1, 1}, 1e-12},
		// Step Feb to Apr inclusive: 1 in Feb, Mar, Apr; 0 from May.
		{"step with end", step("2027-02", "2027-04", Ramp{}), period("2027-01", forecast.Monthly), 6,
			[]float64{0, 1, 1, 1, 0, 0}, 1e-12},
		// A ramp cut short by the end: 1/3, 2/3, then over.
		{"ramp cut by end", step("2027-02", "2027-03", Ramp{Periods: 3, Shape: Linear}), period("2027-01", forecast.Monthly), 4,
			[]float64{0, 1.0 / 3, 2.0 / 3, 0}, 1e-12},
		// Looking from inside the ramp: first = April is ramp period 3.
		{"view starts mid-ramp", step("2027-02", "", Ramp{Periods: 3, Shape: Linear}), period("2027-04", forecast.Monthly), 2,
			[]float64{1, 1}, 1e-12},
		{"view starts mid-ramp 2", step("2027-02", "", Ramp{Periods: 4, Shape: Linear}), period("2027-03", forecast.Monthly), 3,
			[]float64{0.5, 0.75, 1}, 1e-12},
		// Days 14..23 August: 10 of August's 31 days.
		{"prorated dates", step("2027-08-14", "2027-08-23", Ramp{}), period("2027-07", forecast.Monthly), 3,
			[]float64{0, 10.0 / 31, 0}, 1e-12},
		// Leap February: 2028-02-10 to 2028-03-05 covers 20 of February's
		// 29 days (10..29) and 5 of March's 31.
		{"leap february", pulse("2028-02-10", "2028-03-05", 0, nil), period("2028-01", forecast.Monthly), 4,
			[]float64{0, 20.0 / 29, 5.0 / 31, 0}, 1e-12},
		// The same dates a year earlier: 2027-02-10..28 is 19 of 28 days.
		{"common february", pulse("2027-02-10", "2027-03-05", 0, nil), period("2027-01", forecast.Monthly), 4,
			[]float64{0, 19.0 / 28, 5.0 / 31, 0}, 1e-12},
		// A step from 15 May with a linear ramp of 2: May has 17 of 31 days
		// (15..31) at ramp share 1/2: 17/62; June at 2/2 = 1.
		{"prorated start with ramp", step("2027-05-15", "", Ramp{Periods: 2, Shape: Linear}), period("2027-04", forecast.Monthly), 4,
			[]float64{0, 17.0 / 62, 1, 1}, 1e-12},
		// A month on quarterly data: May and June are 31+30 = 61 of Q2's
		// 30+31+30 = 91 days.
		{"month on quarters", step("2027-05", "", Ramp{}), period("2027-Q1", forecast.Quarterly), 3,
			[]float64{0, 61.0 / 91, 1}, 1e-12},
		// A month on weeks that start on Sunday 2027-08-01: the weeks of
		// 1, 8, 15 and 22 August lie inside; that of 29 August has 3 days
		// (29..31) in August.
		{"month on sunday weeks", pulse("2027-08", "2027-08", 0, nil), period("2027-08-01", forecast.Weekly), 6,
			[]float64{1, 1, 1, 1, 3.0 / 7, 0}, 1e-12},
		// A month on daily data: one for each of its days.
		{"month on days", pulse("2027-02", "2027-02", 0, nil), period("2027-02-27", forecast.Daily), 4,
			[]float64{1, 1, 0, 0}, 1e-12},
		// Pulse of 2 periods with half paid back over 2 periods:
		// lift 1 + 1 = 2, payback −0.5*2/2 = −0.5 in each of the next two.
		{"pulse with payback", pulse("2027-08", "", 2, pb(0.5, 2)), period("2027-07", forecast.Monthly), 6,
			[]float64{0, 1, 1, -0.5, -0.5, 0}, 1e-12},
		// One-period pulse, share 0.5 over 2: −0.5*1/2 = −0.25 each.
		{"fair week", pulse("2027-08", "", 1, pb(0.5, 2)), period("2027-08", forecast.Monthly), 4,
			[]float64{1, -0.25, -0.25, 0}, 1e-12},
		// Prorated pulse 14..23 August, all paid back in September:
		// lift 10/31, payback −1*(10/31)/1.
		{"prorated pulse payback", pulse("2027-08-14", "2027-08-23", 0, pb(1, 1)), period("2027-08", forecast.Monthly), 3,
			[]float64{10.0 / 31, -10.0 / 31, 0}, 1e-12},
		// The payback counts the whole pulse even when the view starts
		// after it: first = October, pulse Aug..Sep (lift 2), share 0.3 over
		// 3 periods: −0.3*2/3 = −0.2 in Oct, Nov, Dec.
		{"payback seen alone", pulse("2027-08", "", 2, pb(0.3, 3)), period("2027-10", forecast.Monthly), 4,
			[]float64{-0.2, -0.2, -0.2, 0}, 1e-12},
		// A default pulse (Periods 0 means 1).
		{"pulse default length", pulse("2027-08", "", 0, nil), period("2027-07", forecast.Monthly), 3,
			[]float64{0, 1, 0}, 1e-12},
		{"empty view", step("2027-01", "", Ramp{}), period("2027-01", forecast.Monthly), 0,
			[]float64{}, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			equalSlices(t, "Profile", tc.ev.Profile(tc.first, tc.n), tc.want, tc.tol)
		})
	}
}

func TestContribution(t *testing.T) {
	nan := math.NaN()
	units := step("2027-02", "", Ramp{Periods: 2, Shape: Linear})
	units.Effect = Effect{Units: 35000}
	pct := step("2027-02", "", Ramp{Periods: 2, Shape: Linear})
	pct.Effect = Effect{Percent: 8, IsPercent: true}
	fair := pulse("2027-02", "", 1, &Payback{Share: 0.5, Periods: 2})
	fair.Effect = Effect{Percent: 20, IsPercent: true}
	fairUnits := pulse("2027-02", "", 1, &Payback{Share: 0.5, Periods: 2})
	fairUnits.Effect = Effect{Units: 4000}
	janFair := pulse("2027-01", "", 1, &Payback{Share: 0.5, Periods: 2})
	janFair.Effect = Effect{Percent: 20, IsPercent: true}
	twoFair := pulse("2027-01", "", 2, &Payback{Share: 1, Periods: 1})
	twoFair.Effect = Effect{Percent: 10, IsPercent: true}
	twoFairLate := pulse("2027-01", "", 2, &Payback{Share: 1, Periods: 1})
	twoFairLate.Effect = twoFair.Effect
	learnt := pulse("2027-02", "", 1, nil)
	learnt.Effect = Effect{FromPast: true}
	first := period("2027-01", forecast.Monthly)
	for _, tc := range []struct {
		name     string
		ev       *Event
		baseline []float64
		want     []float64
		tol      float64
	}{
		// Units: 35000 * (0, 1/2, 1, 1).
		{"units with ramp", units, []float64{100, 200, 300, 400}, []float64{0, 17500, 35000, 35000}, 1e-12},
		// Percent: 8/100 * baseline * profile = 0, 0.08*200/2 = 8, 0.08*300 = 24,
		// 0.08*400 = 32; the NaN in January is ignored (profile 0).
		{"percent with ramp", pct, []float64{nan, 200, 300, 400}, []float64{0, 8, 24, 32}, 1e-12},
		// Percent pulse with payback (hand calculation): 0.2*1000*1 = 200
		// in Feb; the payback takes back 0.5*200 = 100 units, 100/2 = 50 in
		// each of March and April, whatever their baseline.
		{"percent pulse payback", fair, []float64{500, 1000, 800, 900, 700}, []float64{0, 200, -50, -50, 0}, 1e-12},
		// Baseline 100, 120, 110 from January: +20% in January is 20
		// units; half of it back over two periods is −5 and −5 (not 10% of
		// 120 and of 110, −12 and −11).
		{"percent payback in units", janFair, []float64{100, 120, 110}, []float64{20, -5, -5}, 1e-12},
		// A pulse of two periods with one payback period (hand
		// calculation): 0.1*200 + 0.1*400 = 60 lift, all of it back: −60.
		{"two-period percent pulse", twoFair, []float64{200, 400, 50, 9}, []float64{20, 40, -60, 0}, 1e-12},
		// The same pulse seen from its second period: the January period
		// before the view counts at the first baseline given (400), so
		// the lift is 0.1*400 + 0.1*400 = 80 and the payback −80.
		{"pulse begun before the view", twoFairLate, []float64{400, 50, 9}, []float64{40, -80, 0}, 1e-12},
		// Units pulse with payback: 4000, then 4000*(−0.25) = −1000 twice.
		{"units pulse payback", fairUnits, []float64{1, 1, 1, 1, 1}, []float64{0, 4000, -1000, -1000, 0}, 1e-12},
		// An effect still to be learnt adds nothing.
		{"from past unset", learnt, []float64{1, 1, 1}, []float64{0, 0, 0}, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			at := first
			if tc.ev == twoFairLate {
				at = first.Add(1)
			}
			equalSlices(t, "Contribution", tc.ev.Contribution(at, tc.baseline), tc.want, tc.tol)
		})
	}
}

func TestSigma(t *testing.T) {
	// Φ⁻¹(0.95) = 1.6448536269514722 (standard normal table 1.6449;
	// scipy 1.10.1 norm.ppf(0.95)), so a 90% range spans 3.2897072539
	// standard deviations.
	units := step("2027-02", "", Ramp{Periods: 2, Shape: Linear})
	units.Effect = Effect{Units: 35000}
	units.Range = &Range{Low: 25000, High: 42000}
	pct := pulse("2027-02", "", 1, &Payback{Share: 0.5, Periods: 1})
	pct.Effect = Effect{Percent: 8, IsPercent: true}
	pct.Range = &Range{Low: 5, High: 11}
	none := step("2027-02", "", Ramp{})
	none.Effect = Effect{Units: 10}
	first := period("2027-01", forecast.Monthly)
	for _, tc := range []struct {
		name     string
		ev       *Event
		baseline []float64
		want     []float64
		tol      float64
	}{
		// sd = 17000/3.2897072539 = 5167.633071; times |profile| 0, 1/2, 1.
		{"units", units, []float64{9, 9, 9}, []float64{0, 2583.8165356, 5167.6330713}, 1e-9},
		// sd = 6/3.2897072539 = 1.8238705 percent points; times
		// baseline/100 = 10 in Feb: 18.238705. The payback per percent of
		// effect is 0.5 * (1000/100) / 1 = 5 units, whatever March's
		// baseline: 1.8238705 * 5 = 9.1193525.
		{"percent", pct, []float64{1000, 1000, 800}, []float64{0, 18.238704957, 9.1193524786}, 1e-9},
		{"no range", none, []float64{1, 1, 1}, []float64{0, 0, 0}, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			equalSlices(t, "Sigma", tc.ev.Sigma(first, tc.baseline), tc.want, tc.tol)
		})
	}
}

func TestWindowIsPastProrated(t *testing.T) {
	month := period("2027-01", forecast.Monthly)
	for _, tc := range []struct {
		name        string
		ev          *Event
		next        forecast.Period
		first, last string // "" last: open
		past        bool
		prorated    bool
	}{
		{"open step", step("2025-03", "", Ramp{}), month, "2025-03", "", false, false},
		{"step with end", step("2025-03", "2026-12", Ramp{}), month, "2025-03", "2026-12", true, false},
		{"step ending in forecast", step("2025-03", "2027-01", Ramp{}), month, "2025-03", "2027-01", false, false},
		// Payback makes the window longer: Dec 2026 pulse, payback Jan 2027.
		{"payback reaches forecast", pulse("2026-12", "", 1, &Payback{Share: 0.5, Periods: 1}), month, "2026-12", "2027-01", false, false},
		{"pulse wholly past", pulse("2025-07", "", 2, nil), month, "2025-07", "2025-08", true, false},
		{"dates inside months", pulse("2026-08-14", "2026-08-23", 0, nil), month, "2026-08", "2026-08", true, true},
		// A pulse given by periods covers whole periods: not prorated.
		{"date pulse by periods", pulse("2026-08-01", "", 1, nil), month, "2026-08", "2026-08", true, false},
		// An ISO week (Monday 2027-08-16) on Monday weeks is aligned; on
		// Sunday weeks it is not.
		{"iso week on iso weeks", step("2027-W33", "", Ramp{}), period("2027-W01", forecast.Weekly), "2027-W33", "", false, false},
		{"iso week on sunday weeks", step("2027-W33", "", Ramp{}), period("2027-08-01", forecast.Weekly), "2027-08-15", "", false, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			first, last, open := tc.ev.Window(tc.next)
			if first.String() != tc.first || open != (tc.last == "") || (!open && last.String() != tc.last) {
				t.Errorf("Window = %s, %s, open %v; want %s, %q", first, last, open, tc.first, tc.last)
			}
			if got := tc.ev.IsPast(tc.next); got != tc.past {
				t.Errorf("IsPast = %v; want %v", got, tc.past)
			}
			if got := tc.ev.Prorated(tc.next); got != tc.prorated {
				t.Errorf("Prorated = %v; want %v", got, tc.prorated)
			}
		})
	}
}

func TestOccurrences(t *testing.T) {
	for _, tc := range []struct {
		name      string
		ev        *Event
		past      []string
		wantStart []string
		wantEnd   []string // "" when the event has no end
	}{
		// Days: start 2027-08-14, end 2027-08-23 (9 days later); past
		// 2024-08-16 ends 9 days later, 2024-08-25.
		{"dates", pulse("2027-08-14", "2027-08-23", 0, nil), []string{"2024-08-16"}, []string{"2024-08-16"}, []string{"2024-08-25"}},
		// Months: start 2027-02, end 2028-01 (11 months on); past 2024-03
		// ends 11 months on, 2025-02.
		{"months", step("2027-02", "2028-01", Ramp{}), []string{"2024-03", "2025-06"}, []string{"2024-03", "2025-06"}, []string{"2025-02", "2026-05"}},
		// A date start and a month end: the end is 1 month after the
		// month holding the start.
		{"date and month", pulse("2027-08-14", "2027-09", 0, nil), []string{"2025-08-10"}, []string{"2025-08-10"}, []string{"2025-09"}},
		{"by periods", pulse("2027-08", "", 1, &Payback{Share: 0.5, Periods: 2}), []string{"2024-08", "2025-08"}, []string{"2024-08", "2025-08"}, []string{"", ""}},
		{"none", pulse("2027-08", "", 1, nil), nil, nil, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			for _, p := range tc.past {
				tc.ev.Past = append(tc.ev.Past, when(p))
			}
			occ := tc.ev.Occurrences()
			if len(occ) != len(tc.wantStart) {
				t.Fatalf("%d occurrences, want %d", len(occ), len(tc.wantStart))
			}
			for i, o := range occ {
				end := ""
				if o.HasEnd {
					end = o.End.Label
				}
				if o.Start.Label != tc.wantStart[i] || end != tc.wantEnd[i] || o.Past != nil || o.Kind != tc.ev.Kind || o.Periods != tc.ev.Periods {
					t.Errorf("occurrence %d: %s..%s (past %v); want %s..%s", i, o.Start, end, o.Past, tc.wantStart[i], tc.wantEnd[i])
				}
				if tc.ev.Payback != nil && (o.Payback == tc.ev.Payback || *o.Payback != *tc.ev.Payback) {
					t.Errorf("occurrence %d: payback not copied", i)
				}
			}
		})
	}
}
