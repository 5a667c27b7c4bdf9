//go:build unix

package ui

import (
	"path/filepath"
	"syscall"
	"testing"
)

// makeFIFO makes a FIFO named name in dir, or returns "" where the system
// cannot.
func makeFIFO(t *testing.T, dir, name string) string {
	t.Helper()
	p := filepath.Join(dir, name)
	if err := syscall.Mkfifo(p, 0o600); err != nil {
		t.Logf("no FIFO: %v", err)
		return ""
	}
	return p
}
