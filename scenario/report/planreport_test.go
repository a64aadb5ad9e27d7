package report

import (
	"bytes"
	"encoding/json"
	"strings"
	"testing"
)

// TestPlanJSONWarnings checks that plan.json always has a warnings list:
// the plan's warnings (the over-large loss of the invented test scenario
// is clipped in 12 periods, one warning), or [] when there are none, and
// that the text summary leaves them to the caller.
func TestPlanJSONWarnings(t *testing.T) {
	p := loadPlan(t, "../../testdata/scenario/overlarge-loss.yaml")
	r := ForPlan(p, true, nil)
	js, err := r.JSON()
	if err != nil {
		t.Fatal(err)
	}
	var got struct {
		Warnings []string `json:"warnings"`
	}
	if err := json.Unmarshal(js, &got); err != nil {
		t.Fatal(err)
	}
	if len(got.Warnings) != 1 || !strings.Contains(got.Warnings[0], "event grocer-exit takes 900,000 litres a month") {
		t.Errorf("warnings %q", got.Warnings)
	}
	if len(r.Warnings) != 1 {
		t.Errorf("report warnings %q, want the plan's one", r.Warnings)
	}
	if strings.Contains(r.Text.String(), "grocer-exit takes") {
		t.Error("the text summary prints the warnings")
	}
	p.Warnings = nil
	if js, _ = ForPlan(p, false, nil).JSON(); !bytes.Contains(js, []byte(`"warnings": []`)) {
		t.Errorf("no empty warnings list in\n%s", js)
	}
}

// TestPlanEventText checks the account of one event of the demo plan.
// examples/dairy/plan.yaml: the grocer's exit is a step of -26,000 litres
// a month from 2027-05 with a linear ramp of 2 periods, range -32,000 to
// -20,000, probability 0.5. By hand: share s(1) = 1/2, s(2) = 1;
// contribution -13,000 then -26,000; standard deviation (the range as a
// 90% interval) 12,000 / (2 x 1.644854) = 3,647.7 at full size, 1,823.9
// at half.
func TestPlanEventText(t *testing.T) {
	p := loadPlan(t, "../../examples/dairy/plan.yaml")
	e, err := p.FutureEvent("grocer-exit")
	if err != nil {
		t.Fatal(err)
	}
	text := ForPlan(p, false, e).Text.String()
	for _, want := range []string{
		"Event grocer-exit, period by period (in scenarios: contract-and-loss)\n",
		"period   share  baseline  contribution (litres)  std dev\n",
		"-13,000    1,824\n",
		"-26,000    3,648\n",
		"Probability 0.50: the risk-weighted plan counts 0.50 of each contribution.\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q\n%s", want, text)
		}
	}
	for _, want := range []string{"2027-05  0.500", "2027-06  1.000"} {
		if !strings.Contains(text, want) {
			t.Errorf("text lacks %q\n%s", want, text)
		}
	}
}
