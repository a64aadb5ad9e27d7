package sim

import (
	"fmt"
	"runtime"
	"sync"
	"sync/atomic"
)

// workerCount returns the number of goroutines for jobs jobs when asked
// for asked: asked, or one per core (GOMAXPROCS) when asked is 0 or
// less, and never more than the jobs.
func workerCount(asked, jobs int) int {
	w := asked
	if w <= 0 {
		w = runtime.GOMAXPROCS(0)
	}
	return max(1, min(w, jobs))
}

// inParallel runs the jobs 0..jobs−1 on workerCount(workers, jobs)
// goroutines, which take them in increasing order; with one worker they
// run on the calling goroutine. Each goroutine first calls start for its
// own job function, so scratch space made in start is never shared. The
// jobs must write to disjoint places: then the results do not depend on
// the number of workers or on which goroutine ran which job.
//
// A panic in a job (a programmer error) stops the remaining jobs and is
// raised again on the calling goroutine, once every goroutine has
// stopped, so that the command's guard sees it.
func inParallel(workers, jobs int, start func() func(j int)) {
	w := workerCount(workers, jobs)
	if w == 1 {
		run := start()
		for j := range jobs {
			run(j)
		}
		return
	}
	var (
		next    atomic.Int64
		failed  atomic.Bool
		wg      sync.WaitGroup
		mu      sync.Mutex
		problem any
	)
	for range w {
		wg.Go(func() {
			defer func() {
				if r := recover(); r != nil {
					failed.Store(true)
					mu.Lock()
					if problem == nil {
						problem = r
					}
					mu.Unlock()
				}
			}()
			run := start()
			for !failed.Load() {
				j := int(next.Add(1) - 1)
				if j >= jobs {
					return
				}
				run(j)
			}
		})
	}
	wg.Wait()
	if problem != nil {
		panic(fmt.Sprintf("scenario: worker: %v", problem))
	}
}
