//go:build unix

package supply

import (
	"syscall"
	"time"
)

// cpuTime returns the processor time the process has used (user and
// system, all threads), which other processes on the machine do not
// inflate as they do wall-clock time.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
