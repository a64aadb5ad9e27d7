//go:build !unix

package supply

import "time"

var startClock = time.Now()

// cpuTime falls back on wall-clock time where the processor time is not
// at hand.
func cpuTime() time.Duration { return time.Since(startClock) }
