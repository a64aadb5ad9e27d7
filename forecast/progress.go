package forecast

import "sync"

// A Progress is told how far a long run has got: done units of work out
// of total (series fitted or planned, blocks of paths drawn). The long
// loops of forelay (FitAllProgress, plan.BuildPortfolioProgress,
// sim.Simulate and sim.SimulatePortfolio) call it once per unit, never
// per path or per period, and one call at a time, with done rising by one
// from 1 to total. It must not block for long, and it cannot change the
// results: they are the same, bit for bit, with or without it. A nil
// Progress is never called.
type Progress func(done, total int)

// Counter returns a function that counts one more unit of a run of total
// units and tells p, under a lock, so that the calls come one at a time
// and in order even when workers count at once. With a nil p it does
// nothing.
func (p Progress) Counter(total int) func() {
	if p == nil {
		return func() {}
	}
	var mu sync.Mutex
	done := 0
	return func() {
		mu.Lock()
		defer mu.Unlock()
		done++
		p(done, total)
	}
}
