//go:build !unix

package engine

import "time"

// processCPU: no portable process CPU time here; the benchmarks then
// leave the figure out.
func processCPU() (time.Duration, bool) { return 0, false }
