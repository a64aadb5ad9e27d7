package plan

import (
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"forelay/scenario"
)

// examplePortfolio loads the portfolio example's scenario file without
// its new series (a plan without history is not built yet), reading the
// example's history, and returns it with its inputs.
func examplePortfolio(tb testing.TB) (*scenario.File, *Inputs) {
	tb.Helper()
	dir := filepath.Join("..", "..", "examples", "portfolio")
	src, err := os.ReadFile(filepath.Join(dir, "plan.yaml"))
	if err != nil {
		tb.Fatal(err)
	}
	hist, err := filepath.Abs(filepath.Join(dir, "history.csv"))
	if err != nil {
		tb.Fatal(err)
	}
	var kept []string
	for _, line := range strings.Split(string(src), "\n") {
		if !strings.Contains(line, "new: true") {
			kept = append(kept, strings.Replace(line, "file: history.csv", "file: "+hist, 1))
		}
	}
	path := filepath.Join(tb.TempDir(), "plan.yaml")
	if err := os.WriteFile(path, []byte(strings.Join(kept, "\n")), 0o644); err != nil {
		tb.Fatal(err)
	}
	f, err := scenario.Load(path)
	if err != nil {
		tb.Fatal(err)
	}
	in, err := ReadSelection(f)
	if err != nil {
		tb.Fatal(err)
	}
	return f, in
}

// TestPortfolioExamplePlans: the 300 series of the portfolio example are
// planned, the same on one worker and on three; the customer leaving moves
// only its own series.
func TestPortfolioExamplePlans(t *testing.T) {
	if testing.Short() {
		t.Skip("plans 300 series twice")
	}
	f, in := examplePortfolio(t)
	one, err := BuildPortfolio(f, in, 1)
	if err != nil {
		t.Fatal(err)
	}
	three, err := BuildPortfolio(f, in, 3)
	if err != nil {
		t.Fatal(err)
	}
	if len(one.Plans) != 300 || !reflect.DeepEqual(one.Warnings, three.Warnings) {
		t.Fatalf("%d plans; warnings %q and %q", len(one.Plans), one.Warnings, three.Warnings)
	}
	for i, p := range one.Plans {
		q := three.Plans[i]
		if !reflect.DeepEqual(p.Scenarios, q.Scenarios) || !reflect.DeepEqual(p.Effects, q.Effects) {
			t.Fatalf("%s: plans differ between 1 and 3 workers", p.History.Name)
		}
		_, leaves := p.Effects["grocer-east-leaves"]
		if want := strings.HasSuffix(p.History.Name, "/grocer-east"); leaves != want {
			t.Errorf("%s: moved by grocer-east-leaves: %v", p.History.Name, leaves)
		}
	}
}

// BenchmarkBuildPortfolio300 plans the 300 series of the portfolio example
// (method auto, 18 months, three scoped events) on GOMAXPROCS workers.
func BenchmarkBuildPortfolio300(b *testing.B) {
	f, in := examplePortfolio(b)
	for b.Loop() {
		if _, err := BuildPortfolio(f, in, 0); err != nil {
			b.Fatal(err)
		}
	}
}
