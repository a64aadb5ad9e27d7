package report

import (
	"encoding/json"
	"strings"
	"testing"

	"forelay/forecast"
	"forelay/scenario/plan"
)

// tinyTrack tracks the actuals 104, 97, 118 against scenario "lift" of a
// six-month plan after a history ending 2026-12: baseline 100, "lift"
// adds 10 from 2027-03, in-sample MAD 5 and MSE 36, default settings.
func tinyTrack(t *testing.T) Track {
	t.Helper()
	end, err := forecast.ParsePeriod("2026-12", forecast.Monthly)
	if err != nil {
		t.Fatal(err)
	}
	tp := plan.TrackPlan{Name: "tiny", Units: "boxes", Series: "widgets", HistoryEnd: end,
		Baseline:  []float64{100, 100, 100, 100, 100, 100},
		Scenarios: []plan.PlanLine{{Name: "lift", Adjusted: []float64{100, 100, 110, 110, 110, 110}}},
		MAD:       5, MSE: 36}
	for i := 1; i <= 6; i++ {
		tp.Periods = append(tp.Periods, end.Add(i))
	}
	tr, err := tp.Track("lift", []float64{104, 97, 118}, forecast.TrackConfig{})
	if err != nil {
		t.Fatal(err)
	}
	return Track{Plan: tp, Tracking: tr, Source: "read from out/plan.json", DefaultLimit: true}
}

// TestForTrack checks the text, the CSV table and the JSON document of a
// tracking run. Hand calculation (scenario/plan's TestTrackHandWorked):
// errors 4, -3, 8; cumulative 4, 1, 9; MAD 0.1|e| + 0.9 MAD: 4.9, 4.71,
// 5.039; signal cum/MAD 0.8163, 0.2123, 1.7861; sigmas e/6 0.6667, -0.5,
// 1.3333. FVA: plan MAD (4+3+8)/3 = 5, baseline MAD (4+3+18)/3 = 8.33,
// improvement 3.33, 40.0% of the baseline's.
func TestForTrack(t *testing.T) {
	r := ForTrack(tinyTrack(t))
	if r.Name != "track" || !r.NoJSONFile || len(r.Charts) != 2 || r.Charts[0].Name != "control" || r.Charts[1].Name != "signal" {
		t.Errorf("report %q, no JSON file %v, %d charts", r.Name, r.NoJSONFile, len(r.Charts))
	}
	text := r.Text.String()
	for _, want := range []string{
		"Tracking widgets against scenario lift of plan tiny: 3 month period(s) 2027-01 to 2027-03 (boxes)\n",
		"plan: read from out/plan.json\n",
		"  control chart    sigma = sqrt(MSE) = 6.00 boxes; UCL +18.00, LCL -18.00 boxes (z = 3)\n",
		"2027-03  118.00  110.00  +8.00       +9.00  5.04            +1.79   +1.33  in-control  -\n",
		"The events helped: they cut the MAD by 3.33 boxes (40.0% of the baseline's).\n",
		"2027-03: in-control: tracking signal +1.79 within +-4, error +1.33 sigma; no action needed.\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q\n%s", want, text)
		}
	}
	csv, err := r.CSVBytes()
	if err != nil {
		t.Fatal(err)
	}
	if want := "2027-03,118.00,110.00,100.00,8.00,9.00,5.04,1.7861,1.3333,in-control,\n"; !strings.HasSuffix(string(csv), want) {
		t.Errorf("track.csv\n%s\nlacks %q", csv, want)
	}
	js, err := r.JSON()
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Periods []struct {
			Rules []string `json:"rules"`
		} `json:"periods"`
		Latest   struct{ Verdict, Message string } `json:"latest"`
		Warnings []string                          `json:"warnings"`
	}
	if err := json.Unmarshal(js, &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Periods) != 3 || doc.Periods[0].Rules == nil || doc.Warnings == nil || doc.Latest.Verdict != "in-control" ||
		!strings.HasPrefix(doc.Latest.Message, "2027-03: in-control") {
		t.Errorf("document %+v", doc)
	}
}
