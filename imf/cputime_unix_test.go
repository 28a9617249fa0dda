//go:build unix

package imf_test

import "syscall"

// processCPUSeconds returns the user+system CPU time of this process, so
// benchmarks can report throughput per CPU-second (per core) even when the
// machine is shared and wall-clock time overstates the cost.
func processCPUSeconds() float64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	tv := func(t syscall.Timeval) float64 { return float64(t.Sec) + float64(t.Usec)*1e-6 }
	return tv(ru.Utime) + tv(ru.Stime)
}
