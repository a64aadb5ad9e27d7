package bounds

import (
	"errors"
	"strings"
	"testing"

	"forelay/scenario/data"
)

// TestValue: --limit takes NAME=N pairs, repeated or comma-separated, and
// refuses unknown names, numbers below 1 and a horizon past the technical
// bound; String lists what differs from the defaults.
func TestValue(t *testing.T) {
	v := &Value{L: Defaults()}
	if err := v.Set("paths=5000000, events=20"); err != nil {
		t.Fatal(err)
	}
	if v.L.Get("paths") != 5_000_000 || v.L.Get("events") != 20 || v.L.Get("horizon") != 10_000 {
		t.Errorf("limits %v", v.L)
	}
	if got := v.String(); got != "paths=5000000,events=20" {
		t.Errorf("String() = %q", got)
	}
	for _, bad := range []string{"path=5", "paths", "paths=0", "paths=x", "horizon=100001"} {
		if err := (&Value{L: Defaults()}).Set(bad); err == nil {
			t.Errorf("Set(%q) gave no error", bad)
		}
	}
}

// TestExceededAndHint: the error names the value, the limit and the flag
// that raises it; a size error of an input file gets the same hint.
func TestExceededAndHint(t *testing.T) {
	err := Defaults().Exceeded("--paths", "paths", 1_000_000_000)
	want := "--paths 1,000,000,000: above the limit of 1,000,000 Monte Carlo sample paths; if you mean it, raise the limit with --limit paths=1000000000"
	if err == nil || err.Error() != want {
		t.Errorf("Exceeded: %v\nwant %s", err, want)
	}
	size := &data.ParseError{File: "h.csv", Err: &data.SizeError{Limit: "bytes", Max: 10}}
	if h := Hint(size); !strings.Contains(h, "--limit history-bytes=N") {
		t.Errorf("Hint = %q", h)
	}
	if h := Hint(errors.New("other")); h != "" {
		t.Errorf("Hint of another error = %q", h)
	}
	if s := Defaults().Scenario(); s.Horizon != 10_000 || s.Events != 10_000 || s.NameLength != 200 || s.Input.LineBytes != 1<<20 {
		t.Errorf("Scenario() = %+v", s)
	}
}
