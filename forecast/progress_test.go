package forecast

import (
	"reflect"
	"slices"
	"sync"
	"testing"
)

// calls records what a Progress is told.
type calls struct {
	done, total []int
}

func (c *calls) progress(done, total int) {
	c.done = append(c.done, done)
	c.total = append(c.total, total)
}

// upTo returns 1, 2, ..., n.
func upTo(n int) []int {
	out := make([]int, n)
	for i := range out {
		out[i] = i + 1
	}
	return out
}

// TestProgressCounter checks that counts from many goroutines reach the
// Progress one at a time, done rising by one from 1 to the total (8
// goroutines counting 250 each: 2,000 calls), and that a nil Progress
// counts nothing.
func TestProgressCounter(t *testing.T) {
	var c calls
	tick := Progress(c.progress).Counter(2000)
	var wg sync.WaitGroup
	for range 8 {
		wg.Go(func() {
			for range 250 {
				tick()
			}
		})
	}
	wg.Wait()
	if !slices.Equal(c.done, upTo(2000)) {
		t.Errorf("done %v..., want 1, 2, ..., 2000", c.done[:min(10, len(c.done))])
	}
	if slices.ContainsFunc(c.total, func(n int) bool { return n != 2000 }) {
		t.Error("a total other than 2000")
	}
	Progress(nil).Counter(5)() // must not panic
}

// TestFitAllProgress checks that FitAllProgress tells of each series
// once, in order, and fits what FitAll fits, whatever the workers.
func TestFitAllProgress(t *testing.T) {
	series := benchPortfolio(7, 60)
	spec := Spec{Method: SES}
	want := FitAll(series, spec, 1)
	for _, workers := range []int{1, 3} {
		var c calls
		got := FitAllProgress(series, spec, workers, c.progress)
		if !slices.Equal(c.done, upTo(7)) || !slices.Equal(c.total, []int{7, 7, 7, 7, 7, 7, 7}) {
			t.Errorf("%d workers: told done %v of %v, want 1..7 of 7", workers, c.done, c.total)
		}
		for i := range want {
			if got[i].Err != nil || want[i].Err != nil {
				t.Fatalf("series %d: %v / %v", i, got[i].Err, want[i].Err)
			}
			g, w := got[i].Result, want[i].Result
			if g.SSE != w.SSE || !reflect.DeepEqual(g.Model.Forecast(12), w.Model.Forecast(12)) {
				t.Errorf("%d workers, series %d: the fit differs from FitAll's", workers, i)
			}
		}
	}
}
