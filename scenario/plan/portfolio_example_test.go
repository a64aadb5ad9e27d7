package plan

import (
	"path/filepath"
	"reflect"
	"runtime"
	"strings"
	"testing"

	"forelay/scenario"
)

// examplePortfolio loads the portfolio example's scenario file and its
// inputs.
func examplePortfolio(tb testing.TB) (*scenario.File, *Inputs) {
	tb.Helper()
	f, err := scenario.Load(filepath.Join("..", "..", "examples", "portfolio", "plan.yaml"))
	if err != nil {
		tb.Fatal(err)
	}
	in, err := ReadSelection(f)
	if err != nil {
		tb.Fatal(err)
	}
	return f, in
}

// TestPortfolioExamplePlans: the 300 series of the portfolio example and
// the one its signed account creates are planned, the same on one worker
// and on three; the customer leaving moves only its own series.
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
	if len(one.Plans) != 301 || one.Names[300] != "milk/whole-1l/grocer-hill" || !reflect.DeepEqual(one.Warnings, three.Warnings) {
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

// BenchmarkBuildPortfolioExample plans the portfolio example: 300 series
// fitted with method auto and one new series, 18 months, three scoped
// events, on GOMAXPROCS workers.
func BenchmarkBuildPortfolioExample(b *testing.B) {
	f, in := examplePortfolio(b)
	for b.Loop() {
		if _, err := BuildPortfolio(f, in, 0); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPortfolioKept plans the portfolio example as
// BenchmarkBuildPortfolioExample does and reports the heap the portfolio
// keeps, per plan, measured after a collection before and after the
// build: what bounds the memory of a large portfolio (each plan keeps its
// fit, with the backtest and the selection's errors its bands rest on).
func BenchmarkPortfolioKept(b *testing.B) {
	f, in := examplePortfolio(b)
	kept := 0.0
	for b.Loop() {
		var before, after runtime.MemStats
		runtime.GC()
		runtime.ReadMemStats(&before)
		pf, err := BuildPortfolio(f, in, 0)
		if err != nil {
			b.Fatal(err)
		}
		runtime.GC()
		runtime.ReadMemStats(&after)
		kept = (float64(after.HeapAlloc) - float64(before.HeapAlloc)) / float64(len(pf.Plans))
		runtime.KeepAlive(pf)
	}
	b.ReportMetric(kept, "kept-B/plan")
}
