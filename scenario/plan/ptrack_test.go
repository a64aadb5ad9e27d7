package plan

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
	"forelay/scenario/data"
)

// tinyPortfolio is a three-month portfolio, 2027-01 to 2027-03, after a
// history ending 2026-12, of four series at two levels: a/x, a/y, b/z
// and b/new, which an event creates (no fit, plan 0 so far). Scenario
// "plan" lifts a/y by 10 from 2027-02. The roll-ups' variances are made
// up for the test: total 64 (sigma 8), group a 49 (sigma 7), group b
// 1.44 (sigma 1.2).
func tinyPortfolio(t *testing.T) *PortfolioTrackPlan {
	t.Helper()
	end, err := forecast.ParsePeriod("2026-12", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	periods := []forecast.Period{end.Add(1), end.Add(2), end.Add(3)}
	series := func(name string, base, adj []float64, mad, mse float64, isNew bool) SeriesTrackPlan {
		return SeriesTrackPlan{New: isNew, TrackPlan: TrackPlan{Name: "tiny", Series: name, HistoryEnd: end, Periods: periods,
			Baseline: base, Scenarios: []PlanLine{{Name: "plan", Adjusted: adj}}, MAD: mad, MSE: mse}}
	}
	return &PortfolioTrackPlan{Name: "tiny", HistoryEnd: end, Periods: periods,
		Series: []SeriesTrackPlan{
			series("a/x", []float64{100, 100, 100}, []float64{100, 100, 100}, 4, 25, false),
			series("a/y", []float64{50, 50, 50}, []float64{50, 60, 60}, 2, 9, false),
			series("b/z", []float64{20, 20, 20}, []float64{20, 20, 20}, 1, 1, false),
			series("b/new", []float64{0, 0, 0}, []float64{0, 0, 0}, 0, 0, true),
		},
		Rollups: [][]RollupScale{{
			{Level: TotalGroup, Group: TotalGroup, Members: []string{"a/x", "a/y", "b/z", "b/new"}, Var: 64},
			{Level: "family", Depth: 1, Group: "a", Members: []string{"a/x", "a/y"}, Var: 49},
			{Level: "family", Depth: 1, Group: "b", Members: []string{"b/z", "b/new"}, Var: 1.44},
		}},
	}
}

// tinyActuals are two months of actuals in the long layout with a key,
// and one series the plan lacks (c/w).
const tinyActuals = `family,item,period,value
a,x,2027-01,104
a,y,2027-01,53
b,z,2027-01,21
c,w,2027-01,5
a,x,2027-02,98
a,y,2027-02,66
b,z,2027-02,19
`

func TestPortfolioTrackHandWorked(t *testing.T) {
	pt := tinyPortfolio(t)
	acts, err := pt.ReadActuals(strings.NewReader(tinyActuals), "actuals.csv", []string{"family", "item"})
	if err != nil {
		t.Fatal(err)
	}
	if len(acts.Warnings) != 1 || !strings.Contains(acts.Warnings[0], `actuals.csv: 1 series is not in the plan and not tracked: "c/w"`) {
		t.Errorf("warnings %q, want one naming c/w", acts.Warnings)
	}
	if acts.Values[3] != nil {
		t.Errorf("b/new has actuals %v; the file has none", acts.Values[3])
	}
	tr, err := pt.Track("", acts, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	// b/new has no actuals: counted, not tracked; the three others are.
	if tr.NoActuals != 1 || len(tr.Series) != 3 || len(tr.Untracked) != 0 {
		t.Fatalf("no actuals %d, tracked %d, untracked %v; want 1, 3, none", tr.NoActuals, len(tr.Series), tr.Untracked)
	}
	const tol = 1e-9
	// Each series' errors, actual - plan, by hand:
	//	a/x: 104-100 = 4,  98-100 = -2
	//	a/y:  53-50  = 3,  66-60  =  6
	//	b/z:  21-20  = 1,  19-20  = -1
	wantErr := map[string][]float64{"a/x": {4, -2}, "a/y": {3, 6}, "b/z": {1, -1}}
	for _, s := range tr.Series {
		for i, p := range s.Points {
			if !scalar.EqualWithinAbs(p.Error, wantErr[s.Plan.Series][i], tol) {
				t.Errorf("%s period %d: error %v, want %v", s.Plan.Series, i+1, p.Error, wantErr[s.Plan.Series][i])
			}
		}
	}
	// The roll-ups: every member of the total has actuals or a plan of
	// zero (b/new), so all three are tracked.
	if len(tr.Rollups) != 3 {
		t.Fatalf("%d roll-ups tracked (notes %q), want 3", len(tr.Rollups), tr.Notes)
	}
	// The total's error is the sum of the members' errors:
	//	period 1: 4 + 3 + 1 = 8      (actual 104+53+21 = 178, plan 100+50+20 = 170)
	//	period 2: -2 + 6 - 1 = 3     (actual 98+66+19 = 183, plan 100+60+20 = 180)
	// sigma = sqrt(64) = 8, so sigmas = 8/8 = 1 and 3/8 = 0.375.
	// MAD_0 = sqrt(2/pi) * 8 = 0.7978845608 * 8 = 6.3830764864
	// MAD_1 = 0.1*8 + 0.9*6.3830764864 = 6.5447688378
	// MAD_2 = 0.1*3 + 0.9*6.5447688378 = 6.1902919540
	// C = 8, 11; TS = 8/6.5447688378 = 1.2223503, 11/6.1902919540 = 1.7769760
	mad0 := math.Sqrt(2/math.Pi) * 8
	mad1 := 0.1*8 + 0.9*mad0
	mad2 := 0.1*3 + 0.9*mad1
	// The groups, by hand: a: 4+3 = 7, -2+6 = 4 with sigma 7;
	// b: 1+0 = 1, -1+0 = -1 with sigma 1.2.
	for _, c := range []struct {
		group                 string
		actual, plan, err, ts []float64
		sigmas                []float64
		sigma                 float64
	}{
		{TotalGroup, []float64{178, 183}, []float64{170, 180}, []float64{8, 3}, []float64{8 / mad1, 11 / mad2}, []float64{1, 0.375}, 8},
		{"a", []float64{157, 164}, []float64{150, 160}, []float64{7, 4}, nil, []float64{1, 4.0 / 7}, 7},
		{"b", []float64{21, 19}, []float64{20, 20}, []float64{1, -1}, nil, []float64{1 / 1.2, -1 / 1.2}, 1.2},
	} {
		var ru *RollupTracking
		for i := range tr.Rollups {
			if tr.Rollups[i].Group == c.group {
				ru = &tr.Rollups[i]
			}
		}
		if ru == nil {
			t.Fatalf("roll-up %s not tracked", c.group)
		}
		if !scalar.EqualWithinAbs(ru.Limits.Sigma, c.sigma, tol) {
			t.Errorf("%s: sigma %v, want %v", c.group, ru.Limits.Sigma, c.sigma)
		}
		for i, p := range ru.Points {
			for _, v := range []struct {
				what      string
				got, want float64
			}{{"actual", p.Actual, c.actual[i]}, {"plan", p.Plan, c.plan[i]}, {"error", p.Error, c.err[i]}, {"sigmas", p.Sigmas, c.sigmas[i]}} {
				if !scalar.EqualWithinAbs(v.got, v.want, tol) {
					t.Errorf("%s period %d: %s %v, want %v", c.group, i+1, v.what, v.got, v.want)
				}
			}
			if c.ts != nil && !scalar.EqualWithinAbs(p.TrackingSignal, c.ts[i], tol) {
				t.Errorf("%s period %d: tracking signal %v, want %v", c.group, i+1, p.TrackingSignal, c.ts[i])
			}
		}
	}
	// The hand values above, written out, agree with the formulas.
	if !scalar.EqualWithinAbs(8/mad1, 1.2223503, 1e-6) || !scalar.EqualWithinAbs(11/mad2, 1.7769760, 1e-6) {
		t.Errorf("tracking signals %v, %v; the hand calculation gives 1.2223503, 1.7769760", 8/mad1, 11/mad2)
	}
}

// A roll-up is tracked only when its members all have actuals (or a plan
// of zero): without b/z, neither the total nor group b is.
func TestPortfolioTrackMissingMember(t *testing.T) {
	pt := tinyPortfolio(t)
	src := "family,item,period,value\na,x,2027-01,104\na,y,2027-01,53\n"
	acts, err := pt.ReadActuals(strings.NewReader(src), "actuals.csv", []string{"family", "item"})
	if err != nil {
		t.Fatal(err)
	}
	tr, err := pt.Track("plan", acts, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	if len(tr.Rollups) != 1 || tr.Rollups[0].Group != "a" {
		t.Fatalf("roll-ups tracked %v, want group a alone", tr.Rollups)
	}
	want := []string{
		"2 of 4 planned series have no actuals and are not tracked",
		"total is not tracked: 1 of its 4 series has no actuals (and a plan other than zero); its variance is that of all of them",
		"family b is not tracked: none of its 2 series has actuals",
	}
	if strings.Join(tr.Notes, "\n") != strings.Join(want, "\n") {
		t.Errorf("notes\n%s\nwant\n%s", strings.Join(tr.Notes, "\n"), strings.Join(want, "\n"))
	}
	// --fail-on looks at every series and roll-up: a/x's error of 4 is
	// 4/5 = 0.8 sigma, nothing fires.
	if got := tr.Matching([]forecast.Verdict{forecast.Bias, forecast.Outlier}); len(got) != 0 {
		t.Errorf("Matching = %v, want none", got)
	}
	if got := tr.Matching([]forecast.Verdict{forecast.InControl}); strings.Join(got, ",") != "a/x,a/y,family a" {
		t.Errorf("Matching(in-control) = %v, want a/x, a/y, family a", got)
	}
}

func TestPortfolioReadActualsErrors(t *testing.T) {
	key := []string{"family", "item"}
	for _, c := range []struct {
		name string
		csv  string // § marks where the error points
		want error
		msg  string
	}{
		{"inside the history", "family,item,period,value\na,x,2027-01,1\na,y,§2026-12,2\n", ErrOffPlan,
			"2026-12 is inside the history (which ends 2026-12)"},
		{"gap in one series", "family,item,period,value\na,x,2027-01,1\na,y,2027-01,2\na,y,§2027-03,2\n", data.ErrGap,
			"no actual for 2027-02 (no row before 2027-03)"},
		{"no planned series", "§family,item,period,value\nc,w,2027-01,1\n", ErrNoPlannedSeries,
			`none of the file's 1 series is planned (the first is "c/w")`},
		{"missing key column", "§family,period,value\na,2027-01,1\n", data.ErrMissingColumn, "item"},
	} {
		t.Run(c.name, func(t *testing.T) {
			src, line, col := pos(c.csv)
			_, err := tinyPortfolio(t).ReadActuals(strings.NewReader(src), "actuals.csv", key)
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

// Without the key's columns the actuals are read as a wide file, a column
// per series named as the plan names it.
func TestPortfolioReadActualsWide(t *testing.T) {
	pt := tinyPortfolio(t)
	src := "period,a/y,b/z\n2027-01,53,21\n2027-02,66,19\n"
	acts, err := pt.ReadActuals(strings.NewReader(src), "actuals.csv", []string{"family", "item"})
	if err != nil {
		t.Fatal(err)
	}
	if acts.Values[0] != nil || len(acts.Values[1]) != 2 || acts.Values[1][1] != 66 || acts.Values[2][0] != 21 || len(acts.Warnings) != 0 {
		t.Errorf("values %v, warnings %q; want a/y 53, 66 and b/z 21, 19", acts.Values, acts.Warnings)
	}
}

func TestGroupMembers(t *testing.T) {
	names := []string{"a/x/1", "a/y/1", "b/x/1", "ab/x/2"}
	for _, c := range []struct {
		level, group string
		depth        int
		want         string
	}{
		{TotalGroup, TotalGroup, 0, "a/x/1 a/y/1 b/x/1 ab/x/2"},
		{"family", "a", 1, "a/x/1 a/y/1"},
		{"product", "a/x", 2, "a/x/1"},
	} {
		if d := GroupDepth(c.level, c.group); d != c.depth {
			t.Errorf("GroupDepth(%q, %q) = %d, want %d", c.level, c.group, d, c.depth)
		}
		if got := strings.Join(GroupMembers(names, c.depth, c.group), " "); got != c.want {
			t.Errorf("GroupMembers(%d, %q) = %q, want %q", c.depth, c.group, got, c.want)
		}
	}
}

// A built portfolio with a series that an event creates (milk/n: a step
// of 5 from 2026-02, after a history ending 2025-12): the series is
// marked New with no error scale, is not tracked on its own, and counts
// in the total, whose variance is that of Rollups.
func TestPortfolioTrackPlanNewSeries(t *testing.T) {
	body := "events:\n  - {id: e, kind: step, start: 2026-02, effect: {units: 5}, range: {low: 3, high: 7}, scope: [{series: milk/n, new: true}]}\n"
	f, in := writePortfolio(t, []string{"milk/a", "milk/b"}, [][]float64{scaled(1), scaled(2)}, body)
	pf, err := BuildPortfolio(f, in, 2)
	if err != nil {
		t.Fatal(err)
	}
	pt, err := pf.TrackPlan()
	if err != nil {
		t.Fatal(err)
	}
	rs, err := pf.Rollups("plan")
	if err != nil {
		t.Fatal(err)
	}
	n := pt.Series[2]
	if !n.New || n.MAD != 0 || n.MSE != 0 || pt.Series[0].New || pt.HistoryEnd.String() != "2025-12" {
		t.Fatalf("series %s new %v MAD %v MSE %v; end %s", n.Series, n.New, n.MAD, n.MSE, pt.HistoryEnd)
	}
	if len(pt.Rollups[0]) != 2 || pt.Rollups[0][0].Var != rs[0].Var[0] || pt.Rollups[0][1].Group != "milk" {
		t.Fatalf("roll-ups %+v", pt.Rollups[0])
	}
	plan := func(i, t int) float64 { return pt.Series[i].Scenarios[0].Adjusted[t] }
	// Two months: each series 1, 2 and 3 above its plan.
	acts := &PortfolioActuals{Values: [][]float64{
		{plan(0, 0) + 1, plan(0, 1) + 1}, {plan(1, 0) + 2, plan(1, 1) + 2}, {plan(2, 0) + 3, plan(2, 1) + 3}}}
	tr, err := pt.Track("", acts, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	if len(tr.Series) != 2 || strings.Join(tr.Untracked, ",") != "milk/n" || len(tr.Rollups) != 2 {
		t.Fatalf("tracked %d, untracked %v, %d roll-ups; notes %q", len(tr.Series), tr.Untracked, len(tr.Rollups), tr.Notes)
	}
	// The total's error is the sum of the three: 1 + 2 + 3 = 6 each month,
	// milk/n's included although it is not tracked on its own.
	for i, p := range tr.Rollups[0].Points {
		if !scalar.EqualWithinAbs(p.Error, 6, 1e-9) {
			t.Errorf("total's error in month %d: %v, want 6", i+1, p.Error)
		}
	}
	// Without milk/n's actuals the total is tracked over 2026-01, where
	// its plan is 0, but not over 2026-02, where it is 5.
	acts.Values[2] = nil
	acts.Values[0], acts.Values[1] = acts.Values[0][:1], acts.Values[1][:1]
	if tr, err = pt.Track("", acts, forecast.TrackConfig{}); err != nil || len(tr.Rollups) != 2 {
		t.Fatalf("one month without milk/n: %v, roll-ups %v", err, tr.Rollups)
	}
	acts.Values[0], acts.Values[1] = []float64{1, 1}, []float64{2, 2}
	if tr, err = pt.Track("", acts, forecast.TrackConfig{}); err != nil || len(tr.Rollups) != 0 {
		t.Fatalf("two months without milk/n: %v, roll-ups %v", err, tr.Rollups)
	}
}
