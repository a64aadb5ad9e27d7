package sim

import (
	"reflect"
	"slices"
	"testing"

	"forelay/scenario/internal/testplan"
)

// told records what a forecast.Progress is told.
type told struct{ done, total []int }

func (c *told) progress(done, total int) {
	c.done = append(c.done, done)
	c.total = append(c.total, total)
}

// wantBlocks checks that c was told of blocks blocks, in order.
func (c *told) wantBlocks(t *testing.T, blocks int) {
	t.Helper()
	want := make([]int, blocks)
	for i := range want {
		want[i] = i + 1
	}
	if !slices.Equal(c.done, want) {
		t.Errorf("told done %v, want %v", c.done, want)
	}
	for _, n := range c.total {
		if n != blocks {
			t.Errorf("told a total of %d, want %d", n, blocks)
			break
		}
	}
}

// TestSimulateProgress checks that Simulate tells of each block of paths
// once (5,000 paths are ceil(5000/1024) = 5 blocks) and that the paths are
// those of a run without Progress, bit for bit, on one worker or two.
func TestSimulateProgress(t *testing.T) {
	p := buildTestPlan(t, eventBody, testHistory(48))
	want, err := Simulate(p, SimOptions{Paths: 5000, Seed: 4, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, workers := range []int{1, 2} {
		var c told
		got, err := Simulate(p, SimOptions{Paths: 5000, Seed: 4, Workers: workers, Progress: c.progress})
		if err != nil {
			t.Fatal(err)
		}
		c.wantBlocks(t, 5)
		if !reflect.DeepEqual(got.Error, want.Error) || !reflect.DeepEqual(got.Scenarios, want.Scenarios) {
			t.Errorf("%d workers: the paths differ with Progress", workers)
		}
	}
}

// TestSimulatePortfolioProgress is TestSimulateProgress for a portfolio:
// 3,000 paths are ceil(3000/1024) = 3 blocks.
func TestSimulatePortfolioProgress(t *testing.T) {
	pf := testplan.Portfolio(t, []string{"milk/a", "milk/b"}, [][]float64{walshA, walshB}, "")
	sums := []Sum{one("a", 0), TotalOf(pf)}
	want := simulatePortfolio(t, pf, sums, SimOptions{Paths: 3000, Seed: 8, Workers: 1})
	for _, workers := range []int{1, 2} {
		var c told
		got := simulatePortfolio(t, pf, sums, SimOptions{Paths: 3000, Seed: 8, Workers: workers, Progress: c.progress})
		c.wantBlocks(t, 3)
		if !reflect.DeepEqual(got.Scenarios, want.Scenarios) {
			t.Errorf("%d workers: the paths differ with Progress", workers)
		}
	}
}
