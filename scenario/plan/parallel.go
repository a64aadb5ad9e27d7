package plan

import (
	"fmt"
	"runtime"
	"sync"

	"forelay/forecast"
)

// eachSeries runs job(i) for i in [0, n) on workers goroutines (zero or
// less means runtime.GOMAXPROCS(0)) and returns the error of the lowest i
// that failed, so that the error reported does not depend on the number of
// workers or on timing. A panic in a job (a bug, never bad data) is
// returned as an error wrapping forecast.ErrInternal and naming the job's
// series, name(i).
func eachSeries(n, workers int, name func(i int) string, job func(i int) error) error {
	if workers <= 0 {
		workers = runtime.GOMAXPROCS(0)
	}
	errs := make([]error, n)
	next := make(chan int)
	var wg sync.WaitGroup
	for range min(workers, n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				errs[i] = guarded(name(i), func() error { return job(i) })
			}
		}()
	}
	for i := range n {
		next <- i
	}
	close(next)
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}

// guarded runs job, turning a panic into an error naming the series.
func guarded(series string, job func() error) (err error) {
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("series %q: %w while planning: %v", series, forecast.ErrInternal, p)
		}
	}()
	return job()
}
