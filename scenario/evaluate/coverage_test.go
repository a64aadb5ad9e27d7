package evaluate

import (
	"fmt"
	"reflect"
	"sync"
	"testing"

	"forelay/forecast"
)

// openDir holds the open series written by testdata/open/gen_open.py.
const openDir = "../../testdata/open"

// fullReps is the number of synthetic series per family and frequency in
// the full run, the default of `go run ./examples/evaluate`.
const fullReps = 20

var full struct {
	once  sync.Once
	cases []Case
	res   *Results
	err   error
}

// fullRun evaluates the open data and the synthetic series once per test
// binary (a few seconds on one core).
func fullRun(t *testing.T) ([]Case, *Results) {
	t.Helper()
	full.once.Do(func() {
		open, err := ReadOpen(openDir)
		if err != nil {
			full.err = err
			return
		}
		reps := fullReps
		if testing.Short() {
			reps = 4
		}
		full.cases = append(open, Synthetic(1, reps, nil)...)
		full.res, full.err = Run(full.cases, Config{})
	})
	if full.err != nil {
		t.Fatal(full.err)
	}
	return full.cases, full.res
}

// TestOpenData checks what ReadOpen gives against testdata/open/open.json:
// 3 monthly series (co2 526 months, elec_equip 257, elnino 732) and 14
// quarterly ones (12 macrodata columns of 203 quarters, 2
// interest_inflation columns of 107), and the origins the rule gives them:
// 5 each (even the shortest, 107 quarters, has 107-5*8 = 67 >= 12 values
// before its fifth origin), 85 origins holding 3*5*12 + 14*5*8 = 740
// held-out values.
func TestOpenData(t *testing.T) {
	open, err := ReadOpen(openDir)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]int{"co2": 526, "elec_equip": 257, "elnino": 732,
		"interest_inflation.Dp": 107, "interest_inflation.R": 107}
	for _, c := range []string{"realgdp", "realcons", "realinv", "realgovt", "realdpi", "cpi", "m1",
		"tbilrate", "unemp", "pop", "infl", "realint"} {
		want["macrodata."+c] = 203
	}
	if len(open) != len(want) {
		t.Fatalf("%d open series, want %d", len(open), len(want))
	}
	for _, c := range open {
		if c.Series.Len() != want[c.Series.Name] || c.Source != SourceOpen || c.Group != c.Series.Name {
			t.Errorf("%s: %d values (want %d), source %s, group %s", c.Series.Name, c.Series.Len(), want[c.Series.Name], c.Source, c.Group)
		}
	}
	// The first periods the datasets document (statsmodels' notes).
	firsts := map[string]string{"co2": "1958-03", "elec_equip": "1995-01", "elnino": "1950-01",
		"macrodata.realgdp": "1959-Q1", "interest_inflation.R": "1972-Q2"}
	for _, c := range open {
		if f, ok := firsts[c.Series.Name]; ok && c.Series.Start.String() != f {
			t.Errorf("%s starts %s, want %s", c.Series.Name, c.Series.Start, f)
		}
	}
	_, res := fullRun(t)
	s := sliceOf(t, res, "auto", SourceOpen, FreqAll)
	if s.Series != 17 || s.Origins+s.Failed != 85 || s.Bands[0].N+s.Bands[0].NoBand != 740 {
		t.Errorf("open data: %d series, %d origins, %d values; want 17, 85, 740",
			s.Series, s.Origins+s.Failed, s.Bands[0].N+s.Bands[0].NoBand)
	}
}

// TestResultsSane checks that every aggregate adds up: shares lie in
// [0, 1] and equal their counts' ratio, the band outcomes split the
// held-out values, the lead times add up to the total, every method saw
// every origin of its slice, and auto never failed.
func TestResultsSane(t *testing.T) {
	cases, res := fullRun(t)
	origins, values := map[[2]string]int{}, map[[2]string]int{}
	for _, c := range res.Cases {
		for _, k := range [][2]string{{c.Source, c.Freq}, {c.Source, FreqAll}, {SourceAll, c.Freq}, {SourceAll, FreqAll}} {
			origins[k] += len(c.Origins)
			values[k] += len(c.Origins) * c.Horizon
		}
	}
	if len(res.Cases) != len(cases) {
		t.Fatalf("%d cases listed, want %d", len(res.Cases), len(cases))
	}
	for _, s := range res.Slices {
		k := [2]string{s.Source, s.Freq}
		checkSlice(t, s, origins[k], values[k])
		if s.Method == "auto" && s.Failed != 0 {
			t.Errorf("auto failed at %d origins of %s %s", s.Failed, s.Source, s.Freq)
		}
	}
	for _, g := range res.Groups {
		checkSlice(t, g, -1, -1)
	}
	if len(res.Accuracy) == 0 {
		t.Error("no accuracy summary")
	}
	for _, a := range res.Accuracy {
		if a.Candidates < 1 || a.Best == "" || !(a.BestMASE > 0) || !(a.Auto > 0) || !(a.SeasonalNaive > 0) {
			t.Errorf("accuracy summary %+v: want a best method and positive means", a)
		}
	}
}

// checkSlice checks one aggregate; origins and values are the totals it
// must account for (negative: unknown).
func checkSlice(t *testing.T, s Slice, origins, values int) {
	t.Helper()
	name := s.Method + " " + s.Source + " " + s.Freq + " " + s.Group
	if origins >= 0 && s.Origins+s.Failed != origins {
		t.Errorf("%s: %d fitted + %d failed origins, want %d", name, s.Origins, s.Failed, origins)
	}
	if s.MASEOrigins > s.Origins || (s.Origins > 0 && !(s.MASE > 0)) {
		t.Errorf("%s: MASE %v over %d of %d origins", name, s.MASE, s.MASEOrigins, s.Origins)
	}
	for _, b := range s.Bands {
		if b.Inside+b.Below+b.Above != b.N || !inUnit(b.Share) || b.Share != ratio(float64(b.Inside), b.N) {
			t.Errorf("%s %g: inside %d below %d above %d of %d, share %v", name, b.Nominal, b.Inside, b.Below, b.Above, b.N, b.Share)
		}
		if values >= 0 && s.Failed == 0 && b.N+b.NoBand != values {
			t.Errorf("%s %g: %d values with a band + %d without, want %d", name, b.Nominal, b.N, b.NoBand, values)
		}
		n := 0
		for _, l := range b.ByLead {
			n += l.N
			if l.Inside > l.N || !inUnit(l.Share) {
				t.Errorf("%s %g lead %d: %+v", name, b.Nominal, l.Lead, l)
			}
		}
		if s.Group == "" && n != b.N {
			t.Errorf("%s %g: lead times add up to %d, total %d", name, b.Nominal, n, b.N)
		}
	}
	for i, sv := range s.Service {
		if sv.Covered > sv.N || sv.N+sv.NoStock != s.Origins || !inUnit(sv.Share) {
			t.Errorf("%s service %d: %+v over %d origins", name, i, sv, s.Origins)
		}
	}
}

func inUnit(x float64) bool { return x >= 0 && x <= 1 }

// TestDeterministic: the results do not depend on the number of workers.
func TestDeterministic(t *testing.T) {
	open, err := ReadOpen(openDir)
	if err != nil {
		t.Fatal(err)
	}
	cases := append(open[:4], Synthetic(5, 1, nil)...)
	a, err := Run(cases, Config{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Run(cases, Config{Workers: 3})
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a, b) {
		t.Error("1 and 3 workers gave different results")
	}
}

// TestCoverageTarget asks every method, and auto, to hold within 3 points
// of the nominal 80 % and 95 % over all the origins, open and synthetic
// pooled over frequencies, and auto's 95 % safety stock to cover demand
// over lead times of 1 and 3 periods at 95 % within 3 points: the goal of
// the calibrated bands. The open data alone are logged, not held to it:
// 85 origins of mostly macroeconomic series, the last ones across the 2008
// recession. The release before calibration missed the goal
// (scenario/evaluate/testdata/before.txt).
func TestCoverageTarget(t *testing.T) {
	if testing.Short() {
		t.Skip("the full evaluation: run without -short")
	}
	const tol = 0.03 // 3 percentage points, the target of the issue
	_, res := fullRun(t)
	for _, s := range res.Slices {
		if s.Freq != FreqAll {
			continue
		}
		for _, b := range s.Bands {
			d := b.Share - b.Nominal
			msg := fmt.Sprintf("%-28s %-9s %g %%: %.1f %% of %d held-out values inside (below %d, above %d)",
				s.Method, s.Source, 100*b.Nominal, 100*b.Share, b.N, b.Below, b.Above)
			switch {
			case s.Source != SourceAll:
				t.Log(msg) // the open data alone are 85 origins, the last across the 2008 recession
			case d < -tol || d > tol:
				t.Error(msg)
			}
		}
		if s.Method != "auto" || s.Source != SourceAll {
			continue
		}
		for _, sv := range s.Service {
			if d := sv.Share - sv.Target; d < -tol || d > tol {
				t.Errorf("auto: safety stock for lead time %d covered %.1f %% of %d origins, want %.0f %% within 3 points",
					sv.Lead, 100*sv.Share, sv.N, 100*sv.Target)
			}
		}
	}
}

// TestMethodsDefault: the default list is every method, auto last.
func TestMethodsDefault(t *testing.T) {
	cfg := Config{}.resolve()
	names := forecast.Methods()
	if len(cfg.Methods) != len(names) || cfg.Methods[len(names)-1] != forecast.Auto {
		t.Errorf("default methods %v, want %v", cfg.Methods, names)
	}
}
