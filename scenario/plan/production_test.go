package plan

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"forelay/scenario"
	"forelay/scenario/data"
	"forelay/scenario/internal/plantest"
)

// TestReadProduction: only a frozen production plan is read, its only
// series or the one named like the history's, under the file's limits;
// what it holds is checked against the plan periods later, by the stress
// run.
func TestReadProduction(t *testing.T) {
	var long strings.Builder // 2000-01 .. 2026-12: over 3,000 bytes
	long.WriteString("period,units\n")
	for m := 0; m < 27*12; m++ {
		fmt.Fprintf(&long, "%d-%02d,%d\n", 2000+m/12, m%12+1, m)
	}
	files := map[string]string{
		"one.csv":  "period,units\n2026-01,10\n2026-02,20\n",
		"two.csv":  "period,other,demand\n2026-01,1,11\n2026-02,2,12\n",
		"long.csv": long.String(),
	}
	base := "plan: p\nhorizon: 3\nbaseline: {method: naive}\n"
	for _, c := range []struct {
		name, production string
		limits           scenario.Limits
		want             []float64 // nil: no production read
		wantErr          string
	}{
		{"none", "", scenario.Limits{}, nil, ""},
		{"follow with a plan is not read", "production: {plan: missing.csv}\n", scenario.Limits{}, nil, ""},
		{"frozen without a plan", "production: {mode: frozen}\n", scenario.Limits{}, nil, ""},
		{"one series", "production: {mode: frozen, plan: one.csv}\n", scenario.Limits{}, []float64{10, 20}, ""},
		{"named like the history", "production: {mode: frozen, plan: two.csv}\n", scenario.Limits{}, []float64{11, 12}, ""},
		{"missing file", "production: {mode: frozen, plan: missing.csv}\n", scenario.Limits{}, nil, "plan.yaml:5:34: production.plan: "},
		// The history is about 900 bytes, so only the production plan
		// passes 2,000.
		{"over the size limit", "production: {mode: frozen, plan: long.csv}\n",
			scenario.Limits{Input: data.SizeLimits{Bytes: 2000}}, nil, "long.csv: larger than 2000 bytes"},
	} {
		t.Run(c.name, func(t *testing.T) {
			path := plantest.Write(t, base+c.production, testHistory(48), files)
			src, err := os.ReadFile(path)
			if err != nil {
				t.Fatal(err)
			}
			f, err := scenario.ParseLimited(strings.NewReader(string(src)), path, c.limits)
			if err != nil {
				t.Fatal(err)
			}
			p, err := Load(f)
			if err != nil {
				t.Fatal(err)
			}
			got, err := ReadProduction(p)
			if c.wantErr != "" {
				var pe *data.ParseError
				if got != nil || !errors.As(err, &pe) || !strings.Contains(err.Error(), c.wantErr) {
					t.Fatalf("production %v, error %v; want a ParseError containing %q", got, err, c.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if c.want == nil {
				if got != nil {
					t.Fatalf("read %+v, want nothing", got)
				}
				return
			}
			if got == nil || !strings.HasSuffix(c.production, " "+filepath.Base(got.Path)+"}\n") {
				t.Fatalf("production %+v", got)
			}
			plantest.EqualSlices(t, "values", got.Series.Values, c.want, 0)
		})
	}
}
