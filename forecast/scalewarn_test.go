package forecast

import (
	"strings"
	"testing"
)

// TestScaleWarnings: values whose squares leave float64's range (about
// 1.8e308 at the top, 2.2e-308 at the bottom; IEEE 754 binary64) are
// warned of; ordinary values are not.
func TestScaleWarnings(t *testing.T) {
	start, _ := ParsePeriod("2020-01", Monthly)
	for _, c := range []struct {
		scale float64
		want  string
	}{
		{1, ""},
		{1e140, ""},
		{1e160, "squared errors overflow"},
		{1e-160, "squared errors vanish"},
	} {
		y := make([]float64, 24)
		for i := range y {
			y[i] = (100 + float64(i%5)) * c.scale
		}
		r, err := Fit(Series{Name: "s", Start: start, Values: y}, Spec{Method: SES})
		if err != nil {
			t.Fatalf("scale %g: %v", c.scale, err)
		}
		got := strings.Join(r.Warnings(), " ")
		if c.want == "" && got != "" || c.want != "" && !strings.Contains(got, c.want) {
			t.Errorf("scale %g: warnings %q, want %q", c.scale, got, c.want)
		}
	}
}
