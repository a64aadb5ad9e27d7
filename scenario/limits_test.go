package scenario

import (
	"forelay/scenario/data"
	"strings"
	"testing"
)

func TestParseLimited(t *testing.T) {
	head := "plan: p\nhistory: {file: h.csv}\n"
	events := func(n int) string {
		var b strings.Builder
		b.WriteString("events:\n")
		for i := range n {
			b.WriteString("  - {id: e" + strings.Repeat("x", i) + ", kind: pulse, start: 2027-02, effect: {units: 1}}\n")
		}
		return b.String()
	}
	for _, c := range []struct {
		name    string
		src     string
		l       Limits
		wantErr string // "" for none
	}{
		{"horizon at the default limit", head + "horizon: 10000\n", Limits{}, ""},
		{"horizon above the default limit", head + "horizon: 10001\n", Limits{},
			"f.yaml:3:10: horizon: 10001 is above the limit of 10000 periods; if you mean it, raise the limit with --limit horizon=10001"},
		{"horizon limit raised", head + "horizon: 50000\n", Limits{Horizon: 50000}, ""},
		{"horizon above the technical bound", head + "horizon: 100001\n", Limits{Horizon: 200000}, "horizon: must be at most 100000"},
		{"events at the limit", head + "horizon: 12\n" + events(3), Limits{Events: 3}, ""},
		{"too many events", head + "horizon: 12\n" + events(4), Limits{Events: 3},
			"f.yaml:5:3: events: 4 is above the limit of 3 events"},
		{"long event id", head + "horizon: 12\n" + "events:\n  - {id: " + strings.Repeat("a", 30) + ", kind: pulse, start: 2027-02, effect: {units: 1}}\n",
			Limits{NameLength: 20}, `event "aaaaaaaaaaaaaaaaaaaaaaaaaaaaaa": id: a name of 30 is above the limit of 20 characters`},
		{"long plan name", "plan: " + strings.Repeat("p", 21) + "\nhistory: {file: h.csv}\nhorizon: 12\n", Limits{NameLength: 20},
			"f.yaml:1:7: plan: a name of 21 is above the limit of 20 characters"},
		{"long scenario name", head + "horizon: 12\nscenarios:\n  - {name: " + strings.Repeat("s", 21) + ", events: []}\n", Limits{NameLength: 20},
			`scenario "sssssssssssssssssssss": name: a name of 21 is above the limit of 20 characters`},
		{"file too large", head + "horizon: 12\n# " + strings.Repeat("x", 100) + "\n", Limits{Input: data.SizeLimits{Bytes: 64}},
			"f.yaml: larger than 64 bytes"},
	} {
		_, err := ParseLimited(strings.NewReader(c.src), "f.yaml", c.l)
		if c.wantErr == "" {
			if err != nil {
				t.Errorf("%s: %v", c.name, err)
			}
			continue
		}
		if err == nil || !strings.Contains(err.Error(), c.wantErr) {
			t.Errorf("%s: err = %v\nwant it to contain %q", c.name, err, c.wantErr)
		}
	}
}
