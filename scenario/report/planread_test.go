package report

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestReadPlanErrors checks that a plan.json ReadPlan cannot use gives an
// error naming the file, the position of a JSON error and the field.
func TestReadPlanErrors(t *testing.T) {
	for _, c := range []struct {
		name, json, msg string
	}{
		{"syntax", "{\n \"plan\": \"x\",\n oops}", "plan.json:3:3: invalid character"},
		// encoding/json gives the offset just after the value.
		{"type", "{\"plan\": 3}", "plan.json:1:11: plan: not a usable plan.json: number where string was expected"},
		{"no period length", `{"history": {"series": "w", "period": "fortnight", "end": "2026-12"}}`, "history.period: not a usable plan.json"},
		{"no accuracy", `{"history": {"series": "w", "period": "month", "end": "2026-12"}, "scenarios": []}`, "baseline.accuracy: not a usable plan.json: no in-sample MAD and MSE"},
		{"missing value", `{"history": {"series": "w", "period": "month", "end": "2026-12"}, "baseline": {"accuracy": {"mad": 1, "mse": 1}},
			"scenarios": [{"name": "a", "periods": [{"period": "2027-01", "baseline": 1}]}]}`, "scenarios[0].periods[0]: not a usable plan.json: no adjusted or baseline value"},
		{"periods apart", `{"history": {"series": "w", "period": "month", "end": "2026-12"}, "baseline": {"accuracy": {"mad": 1, "mse": 1}},
			"scenarios": [{"name": "a", "periods": [{"period": "2027-02", "baseline": 1, "adjusted": 1}]}]}`, "period 1 is 2027-02; want 2027-01"},
	} {
		t.Run(c.name, func(t *testing.T) {
			path := filepath.Join(t.TempDir(), "plan.json")
			if err := os.WriteFile(path, []byte(c.json), 0o644); err != nil {
				t.Fatal(err)
			}
			_, _, err := ReadPlan(path)
			if err == nil || !strings.Contains(err.Error(), c.msg) {
				t.Errorf("error %v, want %q", err, c.msg)
			}
		})
	}
}
