//go:build !unix

package ui

import "testing"

func makeFIFO(t *testing.T, dir, name string) string {
	t.Log("no FIFOs on this system")
	return ""
}
