package plan

import (
	"errors"
	"forelay/scenario"
	"forelay/scenario/data"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
)

// monthPlan is a six-month plan, 2027-01 to 2027-06, after a history
// ending 2026-12, for the series "widgets". Scenario "lift" adds 10 from
// 2027-03; scenario "flat" is the baseline.
func monthPlan(t *testing.T) TrackPlan {
	t.Helper()
	end, err := forecast.ParsePeriod("2026-12", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	tp := TrackPlan{Name: "tiny", Series: "widgets", HistoryEnd: end,
		Baseline: []float64{100, 100, 100, 100, 100, 100},
		Scenarios: []PlanLine{
			{Name: "flat", Adjusted: []float64{100, 100, 100, 100, 100, 100}},
			{Name: "lift", Adjusted: []float64{100, 100, 110, 110, 110, 110}},
		},
		MAD: 5, MSE: 36,
	}
	for i := 1; i <= 6; i++ {
		tp.Periods = append(tp.Periods, end.Add(i))
	}
	return tp
}

// A hand-worked example: three months of actuals, aligned with the plan
// and tracked against scenario "lift" with the default settings (MAD
// smoothing a = 0.1, limit 4, z = 3).
func TestTrackHandWorked(t *testing.T) {
	tp := monthPlan(t)
	actual, err := tp.ReadActuals(strings.NewReader("period,widgets\n2027-01,104\n2027-02,97\n2027-03,118\n"), "actuals.csv")
	if err != nil {
		t.Fatal(err)
	}
	// The three rows are the first three plan periods.
	want := []float64{104, 97, 118}
	if len(actual) != len(want) {
		t.Fatalf("aligned %v, want %v", actual, want)
	}
	for i := range want {
		if actual[i] != want[i] {
			t.Fatalf("aligned %v, want %v", actual, want)
		}
	}
	tr, err := tp.Track("lift", actual, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-9
	// Hand calculation (plan 100, 100, 110; MAD_0 = 5; sigma = sqrt(36) = 6):
	//	e     = 104-100 = 4,  97-100 = -3,  118-110 = 8
	//	C     = 4, 4-3 = 1, 1+8 = 9
	//	MAD_1 = 0.1*4 + 0.9*5    = 4.9
	//	MAD_2 = 0.1*3 + 0.9*4.9  = 4.71
	//	MAD_3 = 0.1*8 + 0.9*4.71 = 5.039
	//	TS    = 4/4.9 = 0.81633, 1/4.71 = 0.21231, 9/5.039 = 1.78607
	//	z     = 4/6 = 0.667, -3/6 = -0.5, 8/6 = 1.333 (no rule fires)
	wantE := []float64{4, -3, 8}
	wantC := []float64{4, 1, 9}
	wantMAD := []float64{4.9, 4.71, 5.039}
	wantTS := []float64{4 / 4.9, 1 / 4.71, 9 / 5.039}
	wantZ := []float64{4.0 / 6, -3.0 / 6, 8.0 / 6}
	for i, p := range tr.Points {
		for _, c := range []struct {
			name      string
			got, want float64
		}{{"error", p.Error, wantE[i]}, {"cum", p.CumError, wantC[i]}, {"mad", p.MAD, wantMAD[i]},
			{"ts", p.TrackingSignal, wantTS[i]}, {"sigmas", p.Sigmas, wantZ[i]}} {
			if !scalar.EqualWithinAbsOrRel(c.got, c.want, tol, tol) {
				t.Errorf("period %d %s = %v, want %v", i+1, c.name, c.got, c.want)
			}
		}
		if p.Verdict != forecast.InControl || p.Rules != nil {
			t.Errorf("period %d: verdict %v rules %v, want in-control", i+1, p.Verdict, p.Rules)
		}
	}
	if got := tr.Periods[2].String(); got != "2027-03" {
		t.Errorf("last tracked period %s, want 2027-03", got)
	}
	// Limits: UCL = 3*6 = 18, LCL = -18.
	if tr.Limits.UCL != 18 || tr.Limits.LCL != -18 || tr.Config.TSLimit != 4 || tr.Config.MADSmoothing != 0.1 {
		t.Errorf("limits %+v config %+v", tr.Limits, tr.Config)
	}
	// FVA: plan errors 4, -3, 8; baseline errors 4, -3, 18.
	//	plan MAD     = (4+3+8)/3  = 5,      plan bias     = 9/3  = 3
	//	baseline MAD = (4+3+18)/3 = 8.3333, baseline bias = 19/3 = 6.3333
	//	improvement  = 8.3333 - 5 = 3.3333 (the lift helped)
	va := tr.ValueAdded
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"plan mad", va.PlanMAD, 5}, {"baseline mad", va.BaselineMAD, 25.0 / 3}, {"plan bias", va.PlanBias, 3},
		{"baseline bias", va.BaselineBias, 19.0 / 3}, {"improvement", va.Improvement, 10.0 / 3}} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, tol, tol) {
			t.Errorf("%s = %v, want %v", c.name, c.got, c.want)
		}
	}
}

// pos finds the marker § in s, removes it and returns the text and the
// 1-based line and byte column where it stood (the csv package's trick).
func pos(s string) (string, int, int) {
	i := strings.Index(s, "§")
	if i < 0 {
		return s, 0, 0
	}
	before := s[:i]
	line := strings.Count(before, "\n") + 1
	col := i - strings.LastIndex(before, "\n")
	return before + s[i+len("§"):], line, col
}

func TestReadActualsErrors(t *testing.T) {
	for _, c := range []struct {
		name string
		csv  string // § marks where the error points
		want error
		msg  string
	}{
		{"inside the history", "period,widgets\n§2026-11,90\n2026-12,95\n2027-01,99\n", ErrOffPlan,
			"2026-11 is inside the history (which ends 2026-12); track only periods after it"},
		{"starts late", "period,widgets\n§2027-02,90\n2027-03,95\n", data.ErrGap,
			"the actuals start at 2027-02 but the plan at 2027-01; actuals must start at the first plan period and run without gaps"},
		{"missing row", "period,widgets\n2027-01,90\n2027-02,95\n§2027-04,99\n", data.ErrGap,
			"no actual for 2027-03 (no row before 2027-04)"},
		{"empty cell", "period,widgets\n2027-01,90\n§2027-02,\n2027-03,99\n", data.ErrGap, "no actual for 2027-02 (its cell is empty)"},
		{"beyond the horizon", "period,widgets\n2027-01,1\n2027-02,2\n2027-03,3\n2027-04,4\n2027-05,5\n2027-06,6\n§2027-07,7\n",
			ErrOffPlan, "2027-07 is beyond the plan's horizon (the plan ends 2027-06)"},
		{"wrong series", "§period,gadgets,gizmos\n2027-01,1,2\n", data.ErrNoSeries,
			`the plan's series "widgets" is not in the file (it has "gadgets", "gizmos")`},
		{"other frequency", "period,widgets\n§2027-Q1,90\n", forecast.ErrBadPeriod, "the actuals are by quarter but the plan is by month"},
		{"long layout gap", "series,period,value\ngadgets,2027-01,5\nwidgets,2027-01,90\ngadgets,2027-02,6\ngadgets,2027-03,7\nwidgets,§2027-03,92\n",
			data.ErrGap, "no actual for 2027-02"},
		{"not a number", "period,widgets\n2027-01,§9O\n", forecast.ErrBadNumber, `"9O"`},
		// Actuals go through data.ParseDecimal like the history.
		{"digit separator", "period,widgets\n2027-01,§1_000\n", data.ErrNotDecimal,
			`actuals.csv:2:9: widgets: not a plain decimal number: "1_000"`},
		// Gaps are read with a zero fill, which must not hide a NaN.
		{"NaN is not a gap", "period,widgets\n2027-01,90\n2027-02,§NaN\n2027-03,99\n", data.ErrNotFinite,
			`actuals.csv:3:9: widgets: not a finite number: "NaN"; leave the cell empty`},
		{"infinity", "series,period,value\nwidgets,2027-01,§-inf\n", data.ErrNotFinite, `"-inf"`},
	} {
		t.Run(c.name, func(t *testing.T) {
			src, line, col := pos(c.csv)
			_, err := monthPlan(t).ReadActuals(strings.NewReader(src), "actuals.csv")
			if !errors.Is(err, c.want) {
				t.Fatalf("error %v, want one wrapping %v", err, c.want)
			}
			var pe *data.ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %T %v is not a *data.ParseError", err, err)
			}
			if pe.File != "actuals.csv" || pe.Line != line || pe.Column != col {
				t.Errorf("error at %s:%d:%d, want actuals.csv:%d:%d", pe.File, pe.Line, pe.Column, line, col)
			}
			if !strings.Contains(err.Error(), c.msg) {
				t.Errorf("error %q lacks %q", err, c.msg)
			}
		})
	}
}

func TestReadActualsAccepts(t *testing.T) {
	for _, c := range []struct {
		name string
		csv  string
		want []float64
	}{
		{"whole horizon", "period,widgets\n2027-01,1\n2027-02,2\n2027-03,3\n2027-04,4\n2027-05,5\n2027-06,6\n", []float64{1, 2, 3, 4, 5, 6}},
		// A gap in another series of the file does not matter.
		{"other series with a gap", "period,gadgets,widgets\n2027-01,5,90\n2027-02,,91\n2027-03,7,92\n", []float64{90, 91, 92}},
		{"long layout", "series,period,value\ngadgets,2027-01,5\nwidgets,2027-01,90\nwidgets,2027-02,91\n", []float64{90, 91}},
		// The series starts after another one: its first value is what counts.
		{"later start of another series", "period,gadgets,widgets\n2026-12,4,\n2027-01,5,90\n", []float64{90}},
		{"byte order mark and blank rows", "\ufeffperiod,widgets\n\n2027-01,90\n,\n2027-02,91\n", []float64{90, 91}},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, err := monthPlan(t).ReadActuals(strings.NewReader(c.csv), "actuals.csv")
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != len(c.want) {
				t.Fatalf("got %v, want %v", got, c.want)
			}
			for i := range got {
				if got[i] != c.want[i] {
					t.Fatalf("got %v, want %v", got, c.want)
				}
			}
		})
	}
}

// Weekly plans: ISO week labels and dates of the weeks' first days are the
// same weeks; a date on another weekday is not a plan week.
func TestReadActualsWeeks(t *testing.T) {
	// 2027-01-04 is a Monday, the first day of ISO week 2027-W01
	// (1 January 2027 is a Friday, so week 1 is the week holding 4 January).
	end, err := forecast.ParsePeriod("2026-12-28", forecast.Weekly)
	if err != nil {
		t.Fatal(err)
	}
	tp := TrackPlan{Series: "w", HistoryEnd: end, Baseline: []float64{1, 1, 1},
		Scenarios: []PlanLine{{Name: "plan", Adjusted: []float64{1, 1, 1}}}, MAD: 1, MSE: 1}
	for i := 1; i <= 3; i++ {
		tp.Periods = append(tp.Periods, end.Add(i))
	}
	for _, c := range []struct {
		name, csv string
		n         int
		want      error
	}{
		{"iso weeks", "period,w\n2027-W01,1\n2027-W02,2\n", 2, nil},
		{"dates", "period,w\n2027-01-04,1\n2027-01-11,2\n2027-01-18,3\n", 3, nil},
		// A single date is read as a week because the plan is weekly.
		{"one date", "period,w\n2027-01-04,1\n", 1, nil},
		{"tuesday", "period,w\n2027-01-05,1\n2027-01-12,2\n", 0, ErrOffPlan},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, err := tp.ReadActuals(strings.NewReader(c.csv), "a.csv")
			if !errors.Is(err, c.want) || (c.want == nil && err != nil) {
				t.Fatalf("error %v, want %v", err, c.want)
			}
			if len(got) != c.n {
				t.Errorf("got %v, want %d values", got, c.n)
			}
		})
	}
}

func TestChoose(t *testing.T) {
	two := monthPlan(t)
	one := monthPlan(t)
	one.Scenarios = one.Scenarios[1:]
	withPlan := monthPlan(t)
	withPlan.Scenarios = append(withPlan.Scenarios, PlanLine{Name: "plan", Adjusted: withPlan.Baseline})
	for _, c := range []struct {
		name string
		tp   TrackPlan
		ask  string
		want string // "" for an error
		msg  string
	}{
		{"named", two, "flat", "flat", ""},
		{"only one", one, "", "lift", ""},
		{"several, one called plan", withPlan, "", "plan", ""},
		{"several, none called plan", two, "", "", `the plan has 2 scenarios (flat, lift) and none is called "plan"; name one`},
		{"unknown", two, "lfit", "", `no such scenario "lfit"; the plan has flat, lift`},
	} {
		t.Run(c.name, func(t *testing.T) {
			got, err := c.tp.Choose(c.ask)
			if c.want == "" {
				if !errors.Is(err, ErrScenarioChoice) || !strings.Contains(err.Error(), c.msg) {
					t.Fatalf("error %v, want one wrapping ErrScenarioChoice with %q", err, c.msg)
				}
				return
			}
			if err != nil || got.Name != c.want {
				t.Fatalf("got %q, %v; want %q", got.Name, err, c.want)
			}
		})
	}
}

func TestTrackPlanCheck(t *testing.T) {
	for _, c := range []struct {
		name  string
		spoil func(*TrackPlan)
		msg   string
	}{
		{"no periods", func(tp *TrackPlan) { tp.Periods = nil }, "no periods"},
		{"no scenarios", func(tp *TrackPlan) { tp.Scenarios = nil }, "no scenarios"},
		{"not after the history", func(tp *TrackPlan) { tp.HistoryEnd = tp.HistoryEnd.Add(-1) }, "period 1 is 2027-01; want 2026-12"},
		{"short baseline", func(tp *TrackPlan) { tp.Baseline = tp.Baseline[:5] }, "the baseline has 5 values for 6 periods"},
		{"NaN in a scenario", func(tp *TrackPlan) { tp.Scenarios[1].Adjusted = []float64{1, 2, math.NaN(), 4, 5, 6} }, `scenario "lift" for 2027-03 is NaN`},
		{"zero MAD", func(tp *TrackPlan) { tp.MAD = 0 }, "in-sample MAD is 0"},
		{"NaN MSE", func(tp *TrackPlan) { tp.MSE = math.NaN() }, "in-sample MSE is NaN"},
	} {
		t.Run(c.name, func(t *testing.T) {
			tp := monthPlan(t)
			c.spoil(&tp)
			err := tp.Check()
			if !errors.Is(err, ErrTrackPlan) || !strings.Contains(err.Error(), c.msg) {
				t.Errorf("error %v, want one wrapping ErrTrackPlan with %q", err, c.msg)
			}
		})
	}
	if err := monthPlan(t).Check(); err != nil {
		t.Errorf("good plan: %v", err)
	}
}

func TestTrackErrors(t *testing.T) {
	tp := monthPlan(t)
	for _, c := range []struct {
		name   string
		actual []float64
		cfg    forecast.TrackConfig
		want   error
	}{
		{"no actuals", nil, forecast.TrackConfig{}, forecast.ErrTooShort},
		{"too many", []float64{1, 2, 3, 4, 5, 6, 7}, forecast.TrackConfig{}, ErrOffPlan},
		{"NaN actual", []float64{1, math.NaN()}, forecast.TrackConfig{}, forecast.ErrEmptyCell},
		{"bad smoothing", []float64{1}, forecast.TrackConfig{MADSmoothing: 1.5}, forecast.ErrBadSetting},
	} {
		t.Run(c.name, func(t *testing.T) {
			if _, err := tp.Track("flat", c.actual, c.cfg); !errors.Is(err, c.want) {
				t.Errorf("error %v, want one wrapping %v", err, c.want)
			}
		})
	}
}

// A drift the plan did not foresee: the errors 6, 7, 8, 9, 10 against
// scenario "flat" (MAD_0 = 5, a = 0.1, limit 4) push the cumulative signal
// past 4 at the fourth period:
//
//	C     = 6, 13, 21, 30
//	MAD_1 = 0.1*6 + 0.9*5     = 5.1
//	MAD_2 = 0.1*7 + 0.9*5.1   = 5.29
//	MAD_3 = 0.1*8 + 0.9*5.29  = 5.561
//	MAD_4 = 0.1*9 + 0.9*5.561 = 5.9049
//	TS    = 1.176, 2.457, 3.776, 30/5.9049 = 5.081 > 4  -> bias
func TestTrackDriftIsBias(t *testing.T) {
	tr, err := monthPlan(t).Track("flat", []float64{106, 107, 108, 109}, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	_, last := tr.Latest()
	if !scalar.EqualWithinAbsOrRel(last.TrackingSignal, 30/5.9049, 1e-9, 1e-9) || last.Verdict != forecast.Bias {
		t.Errorf("latest: signal %v verdict %v, want %v bias", last.TrackingSignal, last.Verdict, 30/5.9049)
	}
	if v := tr.Points[2].Verdict; v != forecast.InControl {
		t.Errorf("third period verdict %v, want in-control (signal %v)", v, tr.Points[2].TrackingSignal)
	}
}

// Plan.TrackPlan takes the periods, baseline, scenarios and in-sample
// error of a built plan.
func TestPlanTrackPlan(t *testing.T) {
	dir := t.TempDir()
	var hist strings.Builder
	hist.WriteString("period,widgets\n")
	p, _ := forecast.ParsePeriod("2024-01", forecast.Monthly)
	for i := 0; i < 24; i++ {
		// A line with a small alternating wiggle, so the fit is not exact.
		v := 100 + 2*float64(i) + 3*float64(i%2*2-1)
		hist.WriteString(p.Add(i).String() + "," + strconv.FormatFloat(v, 'f', -1, 64) + "\n")
	}
	write := func(name, s string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(s), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("history.csv", hist.String())
	write("plan.yaml", `plan: tiny
history: {file: history.csv}
horizon: 4
baseline: {method: linear-trend}
events:
  - {id: extra, kind: step, start: 2026-02, effect: {units: 10}}
scenarios:
  - {name: base, events: []}
  - {name: more, events: [extra]}
`)
	f, err := scenario.Load(filepath.Join(dir, "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	pl, err := Load(f)
	if err != nil {
		t.Fatal(err)
	}
	tp := pl.TrackPlan()
	if err := tp.Check(); err != nil {
		t.Fatal(err)
	}
	if tp.Series != "widgets" || tp.HistoryEnd.String() != "2025-12" || len(tp.Periods) != 4 || tp.Periods[0].String() != "2026-01" {
		t.Errorf("series %q, history end %s, periods %v", tp.Series, tp.HistoryEnd, tp.Periods)
	}
	if tp.MAD != pl.Fit.Accuracy.MAD || tp.MSE != pl.Fit.Accuracy.MSE || len(tp.Scenarios) != 2 || tp.Scenarios[1].Name != "more" {
		t.Errorf("MAD %v MSE %v scenarios %+v", tp.MAD, tp.MSE, tp.Scenarios)
	}
	// The step of 10 from 2026-02 is in "more" and not in the baseline.
	if d := tp.Scenarios[1].Adjusted[1] - tp.Baseline[1]; !scalar.EqualWithinAbs(d, 10, 1e-9) {
		t.Errorf("adjusted - baseline in 2026-02 = %v, want 10", d)
	}
}

// TestUnchanged: scenario "flat" of monthPlan is the baseline; "lift"
// differs from 2027-03 on, so it is unchanged over the first two months
// only.
func TestUnchanged(t *testing.T) {
	tp := monthPlan(t)
	for _, c := range []struct {
		scenario string
		actual   []float64
		want     bool
	}{
		{"flat", []float64{104, 97, 118}, true},
		{"lift", []float64{104, 97}, true},
		{"lift", []float64{104, 97, 118}, false},
	} {
		tr, err := tp.Track(c.scenario, c.actual, forecast.TrackConfig{})
		if err != nil {
			t.Fatal(err)
		}
		if got := tr.Unchanged(); got != c.want {
			t.Errorf("%s over %d periods: Unchanged %v, want %v", c.scenario, len(c.actual), got, c.want)
		}
	}
}
