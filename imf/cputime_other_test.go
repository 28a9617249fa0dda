//go:build !unix

package imf_test

// processCPUSeconds is unavailable here; benchmarks then report only wall time.
func processCPUSeconds() float64 { return 0 }
