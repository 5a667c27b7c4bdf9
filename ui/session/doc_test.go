package session

import (
	"os/exec"
	"strings"
	"testing"
)

// TestNoFyne: the package and everything it imports stay free of the
// toolkit, so that it is tested (and could be driven) without a window.
func TestNoFyne(t *testing.T) {
	out, err := exec.Command("go", "list", "-deps", ".").Output()
	if err != nil {
		t.Fatalf("go list: %v", err)
	}
	for _, p := range strings.Fields(string(out)) {
		if strings.HasPrefix(p, "fyne.io/") {
			t.Errorf("session depends on %s", p)
		}
	}
}
