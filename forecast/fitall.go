package forecast

import (
	"fmt"
	"runtime"
	"sync"
)

// Outcome is the result of fitting one series in FitAll: a Result or the
// error that stopped it.
type Outcome struct {
	Result *Result
	Err    error
}

// FitAll fits spec to every series, spreading the work over workers
// goroutines (zero or less means runtime.GOMAXPROCS(0)). Outcomes come back
// in the order of the input, whatever order the work finished in, so output
// built from them is reproducible.
func FitAll(series []Series, spec Spec, workers int) []Outcome {
	return FitAllProgress(series, spec, workers, nil)
}

// FitAllProgress is FitAll that tells progress of each series fitted (see
// Progress); the outcomes are those of FitAll.
func FitAllProgress(series []Series, spec Spec, workers int, progress Progress) []Outcome {
	tick := progress.Counter(len(series))
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	out := make([]Outcome, len(series))
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < min(workers, len(series)); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				out[i] = fitGuarded(series[i], spec)
				tick()
			}
		}()
	}
	for i := range series {
		next <- i
	}
	close(next)
	wg.Wait()
	return out
}

// fitGuarded fits one series and turns a panic (a bug, never bad data) into
// an error naming the series, so one bad fit cannot take down a run over
// thousands of series.
func fitGuarded(s Series, spec Spec) (oc Outcome) {
	defer func() {
		if p := recover(); p != nil {
			oc = Outcome{Err: fmt.Errorf("series %q: %w while fitting: %v", s.Name, ErrInternal, p)}
		}
	}()
	r, err := Fit(s, spec)
	return Outcome{Result: r, Err: err}
}
