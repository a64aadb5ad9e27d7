package scenario

import (
	"strings"
	"testing"
)

// TestPickResources checks --resource's choice among a file's resources:
// the ids asked for, in file order whatever the order asked; all of them
// when none is asked; an unknown id refused with the ids there are.
func TestPickResources(t *testing.T) {
	src := "plan: p\nhistory: {file: h.csv, series: \"**\"}\nhorizon: 6\nbaseline: {method: naive}\n" +
		"resources:\n  - {id: churn-room, series: \"butter/*\", per-unit: 1}\n  - {id: vat-1, series: \"cheese/*\", per-unit: 1}\n  - {id: vat-2, series: \"cheese/*\", per-unit: 2}\n"
	f, err := Parse(strings.NewReader(src), "p.yaml")
	if err != nil {
		t.Fatal(err)
	}
	ids := func(rs []Resource) string {
		var out []string
		for _, r := range rs {
			out = append(out, r.ID)
		}
		return strings.Join(out, ",")
	}
	for _, tc := range []struct {
		ask  []string
		want string
	}{{nil, "churn-room,vat-1,vat-2"}, {[]string{"vat-2", "churn-room"}, "churn-room,vat-2"}, {[]string{"vat-1"}, "vat-1"}} {
		rs, err := f.PickResources(tc.ask)
		if err != nil || ids(rs) != tc.want {
			t.Errorf("%q: %s, %v; want %s", tc.ask, ids(rs), err, tc.want)
		}
	}
	if _, err := f.PickResources([]string{"vat-3"}); err == nil || !strings.Contains(err.Error(), `"vat-3": p.yaml has no such resource (it has churn-room, vat-1, vat-2)`) {
		t.Errorf("an unknown id: %v", err)
	}
}
