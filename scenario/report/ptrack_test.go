package report

import (
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"forelay/forecast"
	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/plan"
)

// twoSeries is a two-month portfolio after a history ending 2026-12: a/x
// (plan 100, MAD 4, MSE 25) and a/y (plan 50, MAD 2, MSE 9), with a
// total of variance 36 (sigma 6) made up for the test.
func twoSeries(t *testing.T) *plan.PortfolioTrackPlan {
	t.Helper()
	end, err := forecast.ParsePeriod("2026-12", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	periods := []forecast.Period{end.Add(1), end.Add(2)}
	one := func(name string, v, mad, mse float64) plan.SeriesTrackPlan {
		return plan.SeriesTrackPlan{TrackPlan: plan.TrackPlan{Name: "tiny", Units: "packs", Series: name, HistoryEnd: end,
			Periods: periods, Baseline: []float64{v, v}, Scenarios: []plan.PlanLine{{Name: "plan", Adjusted: []float64{v, v}}},
			MAD: mad, MSE: mse}}
	}
	return &plan.PortfolioTrackPlan{Name: "tiny", Units: "packs", HistoryEnd: end, Periods: periods,
		Series:  []plan.SeriesTrackPlan{one("a/x", 100, 4, 25), one("a/y", 50, 2, 9)},
		Rollups: [][]plan.RollupScale{{{Level: plan.TotalGroup, Group: plan.TotalGroup, Members: []string{"a/x", "a/y"}, Var: 36}}}}
}

func TestForPortfolioTrack(t *testing.T) {
	pt := twoSeries(t)
	// a/x: errors 104-100 = 4 then 100-100 = 0 (0.8 sigma at most);
	// a/y: 50-50 = 0 then 65-50 = 15, 15/3 = 5 sigma: an outlier.
	// The total's errors are the sums: 4 + 0 = 4, 0 + 15 = 15, and 15/6 =
	// 2.5 sigma.
	acts := &plan.PortfolioActuals{Values: [][]float64{{104, 100}, {50, 65}}}
	tr, err := pt.Track("plan", acts, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	r := ForPortfolioTrack(PortfolioTrack{Plan: pt, Tracking: tr, Source: "recomputed from p.yaml", DefaultLimit: true})
	text := textOf(t, r)
	for _, want := range []string{
		"Tracking plan tiny against scenario plan: 2 of 2 series, month periods 2027-01 to 2027-02 (packs)",
		"Latest period of each series: 1 in-control, 0 bias, 1 outlier (of 2 series tracked)",
		"a/y     2027-02  outlier",
		"total       2  2027-02",
		"Total: 2027-02: in-control",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q:\n%s", want, text)
		}
	}
	doc := docOf(t, r)
	if doc["kind"] != "portfolio-track" || doc["tracked"] != 2.0 {
		t.Errorf("kind %v, tracked %v", doc["kind"], doc["tracked"])
	}
	ru := doc["rollups"].([]any)[0].(map[string]any)
	last := ru["periods"].([]any)[1].(map[string]any)
	// The total's second error, 0 + 15 = 15, and 15 / sqrt(36) = 2.5 sigmas.
	if !scalar.EqualWithinAbs(last["error"].(float64), 15, 1e-9) || !scalar.EqualWithinAbs(last["sigmas"].(float64), 2.5, 1e-9) {
		t.Errorf("total's last period %v, want error 15 and 2.5 sigmas", last)
	}
	if got := strings.Join(r.CSV.Head, ","); got != "series,period,actual,plan,baseline,error,cum_error,mad,tracking_signal,sigmas,verdict,rules" {
		t.Errorf("track.csv head %s", got)
	}
	if len(r.CSV.Rows) != 4 || len(r.MoreCSV) != 2 || r.MoreCSV[1].Table.Rows[0][1] != "a/y" {
		t.Errorf("track.csv %d rows, more %d, summary's first %v", len(r.CSV.Rows), len(r.MoreCSV), r.MoreCSV[1].Table.Rows[0])
	}
	if got := chartNames(r); !slices.Equal(got, []string{"control", "signal"}) {
		t.Errorf("charts %v, want control and signal", got)
	}
	msg := PortfolioAlert(tr, []forecast.Verdict{forecast.Bias, forecast.Outlier}, "any")
	if msg != "--fail-on any: the latest verdict is bias or outlier in 1 series or roll-up: a/y" {
		t.Errorf("alert %q", msg)
	}
}

// textOf returns the text report of r.
func textOf(t *testing.T, r *Report) string {
	t.Helper()
	var b strings.Builder
	if err := r.WriteText(&b); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// The portfolio example's plan.json reads back as the plan it was written
// from: the same series, baselines, plans, MAD and MSE (to the 10
// significant digits plan.json keeps), and the roll-ups' variances.
func TestReadPortfolioPlanRoundTrip(t *testing.T) {
	if testing.Short() {
		t.Skip("plans the 301 series of the portfolio example")
	}
	f, err := scenario.Load(filepath.Join("..", "..", "examples", "portfolio", "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	in, err := plan.ReadSelection(f)
	if err != nil {
		t.Fatal(err)
	}
	pf, err := plan.BuildPortfolio(f, in, 0)
	if err != nil {
		t.Fatal(err)
	}
	want, err := pf.TrackPlan()
	if err != nil {
		t.Fatal(err)
	}
	r, err := ForPortfolio(pf, PortfolioOptions{})
	if err != nil {
		t.Fatal(err)
	}
	js, err := r.JSON()
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(t.TempDir(), "plan.json")
	if err := os.WriteFile(path, js, 0o644); err != nil {
		t.Fatal(err)
	}
	got, inputs, err := ReadPortfolioPlan(path)
	if err != nil {
		t.Fatal(err)
	}
	if inputs["history"] == "" || got.HistoryEnd.String() != "2026-10" || len(got.Periods) != 18 || len(got.Series) != 301 {
		t.Fatalf("inputs %v, end %s, %d periods, %d series", inputs, got.HistoryEnd, len(got.Periods), len(got.Series))
	}
	const rel = 1e-9 // 10 significant digits
	same := func(what string, a, b float64) {
		if !scalar.EqualWithinAbsOrRel(a, b, 1e-9, rel) {
			t.Errorf("%s: read %v, built %v", what, a, b)
		}
	}
	for i, s := range got.Series {
		w := want.Series[i]
		if s.Series != w.Series || s.New != w.New || len(s.Scenarios) != len(w.Scenarios) {
			t.Fatalf("series %d: %s new %v, want %s new %v", i, s.Series, s.New, w.Series, w.New)
		}
		same(s.Series+" MAD", s.MAD, w.MAD)
		same(s.Series+" MSE", s.MSE, w.MSE)
		for k, sc := range s.Scenarios {
			for j := range got.Periods {
				same(s.Series+" baseline", s.Baseline[j], w.Baseline[j])
				same(s.Series+" "+sc.Name, sc.Adjusted[j], w.Scenarios[k].Adjusted[j])
			}
		}
	}
	for k := range got.Rollups {
		if len(got.Rollups[k]) != len(want.Rollups[k]) {
			t.Fatalf("scenario %d: %d roll-ups, want %d", k, len(got.Rollups[k]), len(want.Rollups[k]))
		}
		for j, ru := range got.Rollups[k] {
			w := want.Rollups[k][j]
			if ru.Label() != w.Label() || ru.Depth != w.Depth || !slices.Equal(ru.Members, w.Members) {
				t.Errorf("roll-up %s (depth %d, %d members), want %s (depth %d, %d members)", ru.Label(), ru.Depth, len(ru.Members), w.Label(), w.Depth, len(w.Members))
			}
			same(ru.Label()+" var", ru.Var, w.Var)
		}
	}
}

func TestReadPortfolioPlanErrors(t *testing.T) {
	for _, c := range []struct {
		name, doc string
		want      string
	}{
		{"newer", `{"version": 9, "kind": "portfolio"}`, "plan.json: version: not a usable plan.json: form 9, newer than the form 1"},
		{"one series", `{"version": 1, "plan": "p"}`, `plan.json: kind: not a usable plan.json: "", not a plan of several series`},
		{"older", `{"version": 1, "kind": "portfolio", "periods": ["2026-11"]}`, "plan.json: series_baselines: not a usable plan.json: missing"},
		{"type", "{\"version\": 1,\n \"kind\": 3}", "plan.json:2:11: kind: not a usable plan.json: number where string was expected"},
		{"short baseline", `{"version": 1, "kind": "portfolio", "history": {"period": "month", "end": "2026-10"},
		  "periods": ["2026-11", "2026-12"], "series_baselines": [{"series": "a", "mad": 1, "mse": 1, "baseline": [1]}],
		  "scenarios": [{"name": "plan"}]}`, "plan.json: series_baselines[0].baseline: not a usable plan.json: 1 values for 2 periods"},
	} {
		t.Run(c.name, func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "plan.json")
			if err := os.WriteFile(path, []byte(c.doc), 0o644); err != nil {
				t.Fatal(err)
			}
			_, _, err := ReadPortfolioPlan(path)
			var pe *data.ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v, want a *data.ParseError", err)
			}
			if got := strings.TrimPrefix(err.Error(), filepath.Dir(path)+"/"); !strings.HasPrefix(got, c.want) {
				t.Errorf("error %q, want it to start with %q", got, c.want)
			}
		})
	}
}
