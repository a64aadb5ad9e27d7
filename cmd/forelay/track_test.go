package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"forelay/scenario/data"
	"forelay/scenario/report"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestNewCmdTrack(t *testing.T) {
	base := TrackOptions{File: "plan.yaml", Actuals: "new.csv", Signal: "cumulative", Z: 3, MADSmoothing: 0.1}
	for _, c := range []struct {
		name    string
		argv    []string
		want    func(o *TrackOptions)
		wantErr string
	}{
		{"defaults", []string{"plan.yaml", "--actuals", "new.csv"}, func(o *TrackOptions) {}, ""},
		{"every flag", []string{"plan.yaml", "--actuals", "new.csv", "--scenario", "with-contract", "--plan", "out",
			"--out", "trk", "--json", "--ts-limit", "0.6", "--signal", "smoothed", "--z", "2", "--mad-smoothing", "0.2", "--fail-on", "any",
			"--workers", "2"},
			func(o *TrackOptions) {
				o.Scenario, o.PlanDir, o.Out, o.JSON = "with-contract", "out", "trk", true
				o.TSLimit, o.Signal, o.Z, o.MADSmoothing, o.FailOn, o.Workers = 0.6, "smoothed", 2, 0.2, "any", 2
			}, ""},
		{"no workers", []string{"plan.yaml", "--actuals", "new.csv", "--workers", "0"}, nil, "--workers 0: must be at least 1"},
		{"no actuals", []string{"plan.yaml"}, nil, "--actuals is required"},
		{"no file", []string{"--actuals", "new.csv"}, nil, "accepts 1 arg(s)"},
		{"bad number", []string{"plan.yaml", "--actuals", "new.csv", "--z", "three"}, nil, `invalid argument "three"`},
	} {
		t.Run(c.name, func(t *testing.T) {
			var got *TrackOptions
			io := &IOStreams{Out: &bytes.Buffer{}, ErrOut: &bytes.Buffer{}}
			cmd := newCmdTrack(&Factory{IO: io, Now: fixedNow}, func(o *TrackOptions) error { got = o; return nil })
			cmd.SetArgs(c.argv)
			cmd.SetOut(io.Out)
			cmd.SetErr(io.ErrOut)
			err := cmd.Execute()
			if c.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), c.wantErr) {
					t.Fatalf("error %v, want %q", err, c.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			want := base
			want.IO = io
			c.want(&want)
			if !reflect.DeepEqual(*got, want) {
				t.Errorf("options\n got %+v\nwant %+v", *got, want)
			}
		})
	}
}

// trackFiles writes a scenario, its history, a hand-made plan.json and new
// actuals into a temporary directory and returns its path.
//
// The plan: six months 2027-01 to 2027-06 after a history ending 2026-12;
// baseline 100 in every month; scenario "flat" is the baseline, scenario
// "lift" adds 10 from 2027-03; the baseline's in-sample MAD is 5 and its
// MSE 36 (sigma 6).
func trackFiles(t *testing.T, actuals string) string {
	t.Helper()
	dir := t.TempDir()
	write := func(name, s string) {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(s), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	write("history.csv", "period,widgets\n2026-10,98\n2026-11,103\n2026-12,99\n")
	write("plan.yaml", "plan: tiny\nhistory: {file: history.csv}\nhorizon: 6\nbaseline: {method: naive}\n")
	write("actuals.csv", actuals)
	sd, err := data.Digest(filepath.Join(dir, "plan.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	hd, err := data.Digest(filepath.Join(dir, "history.csv"))
	if err != nil {
		t.Fatal(err)
	}
	periods := func(adj ...float64) string {
		var s []string
		for i, a := range adj {
			s = append(s, `{"period": "2027-0`+string(rune('1'+i))+`", "baseline": 100, "adjusted": `+jsonNum(a)+`}`)
		}
		return "[" + strings.Join(s, ", ") + "]"
	}
	write("plan.json", `{"plan": "tiny", "units": "boxes",
 "history": {"file": "history.csv", "series": "widgets", "period": "month", "start": "2026-10", "end": "2026-12", "n": 3},
 "inputs": {"history": "`+hd+`", "scenario": "`+sd+`"},
 "baseline": {"method": "naive", "accuracy": {"n": 2, "mad": 5, "mse": 36}},
 "scenarios": [
  {"name": "flat", "periods": `+periods(100, 100, 100, 100, 100, 100)+`},
  {"name": "lift", "periods": `+periods(100, 100, 110, 110, 110, 110)+`}]}
`)
	return dir
}

func jsonNum(v float64) string { b, _ := json.Marshal(v); return string(b) }

func TestTrackRun(t *testing.T) {
	dir := trackFiles(t, "period,widgets\n2027-01,104\n2027-02,97\n2027-03,118\n")
	opts := func(mod func(o *TrackOptions)) (*TrackOptions, *bytes.Buffer, *bytes.Buffer) {
		out, errOut := &bytes.Buffer{}, &bytes.Buffer{}
		o := &TrackOptions{IO: &IOStreams{Out: out, ErrOut: errOut}, File: filepath.Join(dir, "plan.yaml"),
			Actuals: filepath.Join(dir, "actuals.csv"), PlanDir: dir, Scenario: "lift", Signal: "cumulative", Z: 3, MADSmoothing: 0.1}
		mod(o)
		return o, out, errOut
	}

	t.Run("table", func(t *testing.T) {
		o, out, errOut := opts(func(*TrackOptions) {})
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
		if errOut.Len() != 0 {
			t.Errorf("stderr: %s", errOut)
		}
		// The hand calculation of scenario/track_test.go's
		// TestTrackHandWorked: errors 4, -3, 8; cumulative 4, 1, 9;
		// MAD 4.9, 4.71, 5.039; signal 0.82, 0.21, 1.79; sigmas 4/6, -3/6, 8/6.
		// FVA: plan MAD (4+3+8)/3 = 5, bias 3; baseline MAD (4+3+18)/3 = 8.33,
		// bias 19/3 = 6.33.
		for _, want := range []string{
			"Tracking widgets against scenario lift of plan tiny: 3 month period(s) 2027-01 to 2027-03 (boxes)\n",
			"plan: read from " + filepath.Join(dir, "plan.json") + "\n",
			"  tracking signal  cumulative error / MAD; alarm beyond +-4\n",
			"  MAD              starts at 5.00 boxes (the baseline's in-sample MAD), then MAD_t = 0.1 |error_t| + 0.9 MAD_t-1\n",
			"  control chart    sigma = sqrt(MSE) = 6.00 boxes; UCL +18.00, LCL -18.00 boxes (z = 3)\n",
			"period   actual    plan  error  cum. error   MAD  tracking signal  sigmas  verdict     rules\n",
			"2027-01  104.00  100.00  +4.00       +4.00  4.90            +0.82   +0.67  in-control  -\n",
			"2027-02   97.00  100.00  -3.00       +1.00  4.71            +0.21   -0.50  in-control  -\n",
			"2027-03  118.00  110.00  +8.00       +9.00  5.04            +1.79   +1.33  in-control  -\n",
			"  adjusted plan  5.00  +3.00\n",
			"  baseline       8.33  +6.33\n",
			"The events helped: they cut the MAD by 3.33 boxes (40.0% of the baseline's).\n",
			"2027-03: in-control: tracking signal +1.79 within +-4, error +1.33 sigma; no action needed.\n",
		} {
			if !strings.Contains(out.String(), want) {
				t.Errorf("output lacks %q\n%s", want, out)
			}
		}
	})

	t.Run("json", func(t *testing.T) {
		o, out, _ := opts(func(o *TrackOptions) { o.JSON = true })
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
		var got struct {
			Scenario string   `json:"scenario"`
			MAD      *float64 `json:"mad"`
			MSE      *float64 `json:"mse"`
			UCL      *float64 `json:"ucl"`
			LCL      *float64 `json:"lcl"`
			Periods  []struct {
				Period         string   `json:"period"`
				Actual         *float64 `json:"actual"`
				Plan           *float64 `json:"plan"`
				Error          *float64 `json:"error"`
				CumError       *float64 `json:"cum_error"`
				MAD            *float64 `json:"mad"`
				TrackingSignal *float64 `json:"tracking_signal"`
				Verdict        string   `json:"verdict"`
				Rules          []string `json:"rules"`
			} `json:"periods"`
			FVA struct {
				PlanMAD     *float64 `json:"plan_mad"`
				BaselineMAD *float64 `json:"baseline_mad"`
			} `json:"fva"`
		}
		if err := json.Unmarshal(out.Bytes(), &got); err != nil {
			t.Fatal(err)
		}
		if got.Scenario != "lift" || len(got.Periods) != 3 || got.Periods[2].Period != "2027-03" || got.Periods[2].Rules == nil {
			t.Fatalf("got %+v", got)
		}
		p := got.Periods[2]
		// Hand calculation: see the table case.
		for _, c := range []struct {
			name string
			got  *float64
			want float64
		}{{"mad", got.MAD, 5}, {"mse", got.MSE, 36}, {"ucl", got.UCL, 18}, {"lcl", got.LCL, -18},
			{"actual", p.Actual, 118}, {"plan", p.Plan, 110}, {"error", p.Error, 8}, {"cum_error", p.CumError, 9},
			{"period mad", p.MAD, 5.039}, {"tracking_signal", p.TrackingSignal, 9 / 5.039},
			{"plan_mad", got.FVA.PlanMAD, 5}, {"baseline_mad", got.FVA.BaselineMAD, 25.0 / 3}} {
			if c.got == nil || !scalar.EqualWithinAbsOrRel(*c.got, c.want, 1e-9, 1e-9) {
				t.Errorf("%s = %v, want %v", c.name, c.got, c.want)
			}
		}
		if p.Verdict != "in-control" {
			t.Errorf("verdict %q", p.Verdict)
		}
	})

	t.Run("out", func(t *testing.T) {
		outDir := filepath.Join(t.TempDir(), "trk")
		o, _, errOut := opts(func(o *TrackOptions) { o.Out = outDir })
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
		for _, name := range []string{"track.csv", "control.png", "control.svg", "signal.png", "signal.svg"} {
			if _, err := os.Stat(filepath.Join(outDir, name)); err != nil {
				t.Error(err)
			}
			if !strings.Contains(errOut.String(), "wrote "+filepath.Join(outDir, name)+"\n") {
				t.Errorf("stderr lacks the line for %s: %s", name, errOut)
			}
		}
		csv, _ := os.ReadFile(filepath.Join(outDir, "track.csv"))
		want := "period,actual,plan,baseline,error,cum_error,mad,tracking_signal,sigmas,verdict,rules\n" +
			"2027-01,104.00,100.00,100.00,4.00,4.00,4.90,0.8163,0.6667,in-control,\n" +
			"2027-02,97.00,100.00,100.00,-3.00,1.00,4.71,0.2123,-0.5000,in-control,\n" +
			"2027-03,118.00,110.00,100.00,8.00,9.00,5.04,1.7861,1.3333,in-control,\n"
		if string(csv) != want {
			t.Errorf("track.csv\n%s\nwant\n%s", csv, want)
		}
	})

	// The drift of scenario/track_test.go's TestTrackDriftIsBias, errors
	// 6, 7, 8, 9 against "flat": signal 30/5.9049 = 5.08 > 4 at 2027-04.
	drift := trackFiles(t, "period,widgets\n2027-01,106\n2027-02,107\n2027-03,108\n2027-04,109\n")
	t.Run("fail on bias", func(t *testing.T) {
		o, out, _ := opts(func(o *TrackOptions) {
			o.File, o.Actuals, o.PlanDir = filepath.Join(drift, "plan.yaml"), filepath.Join(drift, "actuals.csv"), drift
			o.Scenario, o.FailOn = "flat", "bias"
		})
		err := trackRun(o)
		var ae *alertError
		if !errors.As(err, &ae) || exitCode(err) != exitAlert {
			t.Fatalf("error %v, want an alert (exit 3)", err)
		}
		if want := "--fail-on bias: the latest period, 2027-04, is bias"; err.Error() != want {
			t.Errorf("error %q, want %q", err, want)
		}
		// The report is printed before the alert.
		if want := "2027-04: bias: tracking signal +5.08 beyond +-4 (actuals above the plan); re-forecast.\n"; !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q\n%s", want, out)
		}
		if want := "Scenario flat changes nothing on these periods: the adjusted plan is the baseline.\n"; !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q\n%s", want, out)
		}
	})
	t.Run("fail on outlier passes a bias", func(t *testing.T) {
		o, _, _ := opts(func(o *TrackOptions) {
			o.File, o.Actuals, o.PlanDir = filepath.Join(drift, "plan.yaml"), filepath.Join(drift, "actuals.csv"), drift
			o.Scenario, o.FailOn = "flat", "outlier"
		})
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
	})

	// One spike against "flat" (MAD_0 5, sigma 6, a 0.1), errors 1, 40, 0:
	//   2027-01: MAD = 0.1 + 4.5 = 4.6     C = 1   TS = 0.22
	//   2027-02: MAD = 4 + 4.14 = 8.14     C = 41  TS = 5.04 > 4, z = 6.67 > 3
	//   2027-03: MAD = 0 + 7.326 = 7.326   C = 41  TS = 5.60 > 4
	// Without 2027-02: C' = 1 and MAD' = 0.9 * 4.6 = 4.14 at 2027-03,
	// TS' = 0.24: the spike alone carries the signal, so outlier.
	spike := trackFiles(t, "period,widgets\n2027-01,101\n2027-02,140\n2027-03,100\n")
	t.Run("spike is an outlier", func(t *testing.T) {
		o, out, _ := opts(func(o *TrackOptions) {
			o.File, o.Actuals, o.PlanDir = filepath.Join(spike, "plan.yaml"), filepath.Join(spike, "actuals.csv"), spike
			o.Scenario, o.FailOn = "flat", "bias"
		})
		if err := trackRun(o); err != nil {
			t.Fatalf("%v, want no bias alert\n%s", err, out)
		}
		want := "2027-03: outlier: tracking signal +5.60 beyond +-4, but +0.24 without the error beyond the limits in 2027-02 " +
			"(actuals above the plan) with no sign of drift; check for an unplanned event.\n"
		if !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q\n%s", want, out)
		}
	})

	t.Run("changed history warns", func(t *testing.T) {
		changed := trackFiles(t, "period,widgets\n2027-01,104\n")
		if err := os.WriteFile(filepath.Join(changed, "history.csv"), []byte("period,widgets\n2026-11,103\n2026-12,99\n"), 0o644); err != nil {
			t.Fatal(err)
		}
		o, _, errOut := opts(func(o *TrackOptions) {
			o.File, o.Actuals, o.PlanDir = filepath.Join(changed, "plan.yaml"), filepath.Join(changed, "actuals.csv"), changed
		})
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
		want := "warning: " + filepath.Join(changed, "history.csv") + " has changed since " + filepath.Join(changed, "plan.json") + " was written"
		if !strings.Contains(errOut.String(), want) {
			t.Errorf("stderr lacks %q: %s", want, errOut)
		}
	})

	t.Run("recomputed", func(t *testing.T) {
		// Without --plan the naive baseline is built again: its forecast
		// is the last value, 99, and the file has one scenario, "plan".
		// In-sample errors 103-98 = 5 and 99-103 = -4: MAD (5+4)/2 = 4.5,
		// MSE (25+16)/(2-1) = 41 (divisor n-1), sigma sqrt(41) = 6.40.
		o, out, _ := opts(func(o *TrackOptions) { o.PlanDir, o.Scenario = "", "" })
		if err := trackRun(o); err != nil {
			t.Fatal(err)
		}
		for _, want := range []string{"plan: recomputed from " + o.File + "\n", "scenario plan of plan tiny",
			"starts at 4.50 (the baseline's in-sample MAD)", "sigma = sqrt(MSE) = 6.40;", "2027-01  104.00  99.00   +5.00"} {
			if !strings.Contains(out.String(), want) {
				t.Errorf("output lacks %q\n%s", want, out)
			}
		}
	})

	for _, c := range []struct {
		name string
		mod  func(o *TrackOptions)
		code int
		msg  string
	}{
		{"unknown scenario", func(o *TrackOptions) { o.Scenario = "lfit" }, exitInput, `--scenario: no such scenario "lfit"; the plan has flat, lift`},
		{"no scenario chosen", func(o *TrackOptions) { o.Scenario = "" }, exitInput, `the plan has 2 scenarios (flat, lift) and none is called "plan"; name one (with --scenario)`},
		{"bad signal", func(o *TrackOptions) { o.Signal = "loud" }, exitInput, `--signal: unknown signal "loud"`},
		{"negative limit", func(o *TrackOptions) { o.TSLimit = -1 }, exitInput, "--ts-limit must be positive"},
		{"smoothed limit of 1", func(o *TrackOptions) { o.Signal, o.TSLimit = "smoothed", 1 }, exitInput, "--ts-limit must be below 1"},
		{"zero z", func(o *TrackOptions) { o.Z = 0 }, exitInput, "--z must be positive"},
		{"smoothing above 1", func(o *TrackOptions) { o.MADSmoothing = 1.5 }, exitInput, "--mad-smoothing must lie in (0, 1]"},
		{"smoothing outside Trigg's table", func(o *TrackOptions) { o.Signal, o.MADSmoothing = "smoothed", 0.7 }, exitInput, "the table covers 0.01 to 0.5"},
		{"bad fail-on", func(o *TrackOptions) { o.FailOn = "never" }, exitInput, `--fail-on: unknown verdict "never"`},
		{"no actuals file", func(o *TrackOptions) { o.Actuals = filepath.Join(dir, "none.csv") }, exitInput, "none.csv"},
		{"no plan.json", func(o *TrackOptions) { o.PlanDir = filepath.Join(dir, "none") }, exitInput, "plan.json"},
	} {
		t.Run(c.name, func(t *testing.T) {
			o, out, _ := opts(c.mod)
			err := trackRun(o)
			if err == nil || exitCode(err) != c.code || !strings.Contains(err.Error(), c.msg) {
				t.Fatalf("error %v (exit %d), want exit %d with %q", err, exitCode(err), c.code, c.msg)
			}
			if out.Len() != 0 {
				t.Errorf("printed output on failure: %s", out)
			}
		})
	}

	t.Run("failed run writes nothing", func(t *testing.T) {
		bad := trackFiles(t, "period,widgets\n2026-12,99\n2027-01,104\n")
		outDir := filepath.Join(t.TempDir(), "trk")
		o, _, _ := opts(func(o *TrackOptions) {
			o.File, o.Actuals, o.PlanDir, o.Out = filepath.Join(bad, "plan.yaml"), filepath.Join(bad, "actuals.csv"), bad, outDir
		})
		err := trackRun(o)
		if err == nil || exitCode(err) != exitInput || !strings.Contains(err.Error(), "actuals.csv:2:1: period: not a plan period: 2026-12 is inside the history") {
			t.Fatalf("error %v", err)
		}
		if _, err := os.Stat(outDir); !os.IsNotExist(err) {
			t.Errorf("%s exists after a failed run", outDir)
		}
	})
}

// readSavedPlan reads what "forelay plan --out" writes: a plan built and
// saved gives the same tracking plan as the one built in memory, to the
// 10 significant digits plan.json keeps.
func TestReadSavedPlanRoundTrip(t *testing.T) {
	dir := trackFiles(t, "period,widgets\n2027-01,104\n")
	out := filepath.Join(dir, "out")
	if err := planRun(&PlanOptions{IO: &IOStreams{Out: &bytes.Buffer{}, ErrOut: &bytes.Buffer{}}, File: filepath.Join(dir, "plan.yaml"),
		Out: out, NoChart: true}); err != nil {
		t.Fatal(err)
	}
	saved, inputs, err := report.ReadPlan(filepath.Join(out, "plan.json"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := buildPlan(filepath.Join(dir, "plan.yaml"), nil)
	if err != nil {
		t.Fatal(err)
	}
	built := p.TrackPlan()
	if saved.Series != built.Series || saved.HistoryEnd != built.HistoryEnd || len(saved.Periods) != len(built.Periods) ||
		len(saved.Scenarios) != len(built.Scenarios) || inputs["scenario"] == "" || inputs["history"] == "" {
		t.Fatalf("saved %+v\nbuilt %+v\ninputs %v", saved, built, inputs)
	}
	close := func(a, b float64) bool { return scalar.EqualWithinAbsOrRel(a, b, 1e-12, 1e-9) }
	if !close(saved.MAD, built.MAD) || !close(saved.MSE, built.MSE) {
		t.Errorf("MAD %v MSE %v, want %v %v", saved.MAD, saved.MSE, built.MAD, built.MSE)
	}
	for i := range built.Periods {
		if saved.Periods[i] != built.Periods[i] || !close(saved.Baseline[i], built.Baseline[i]) ||
			!close(saved.Scenarios[0].Adjusted[i], built.Scenarios[0].Adjusted[i]) {
			t.Errorf("period %d differs", i)
		}
	}
}
