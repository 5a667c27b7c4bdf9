package main

import (
	"path/filepath"
	"strings"
	"testing"
)

// A spar hole that leaves less than the minimum ligament is refused with
// exit 1 and a message naming the element, the hole and the shortfall in
// mm; the same hole on the mean line, or a smaller minimum, is written.
// The rear wing's flap is a 120 mm NACA 4412, 14.4 mm thick near 0.3c
// (t = 0.12, Abbott & von Doenhoff, Theory of Wing Sections, 1959, eq.
// 6.2): with a 3 mm skin an 8 mm hole leaves about 0.2 mm on the mean line.
func TestExportRefusesHoleBreakingOut(t *testing.T) {
	study := filepath.Join("..", "..", "testdata", "studies", "rear-wing.json")
	out := filepath.Join(t.TempDir(), "o.dxf")
	for _, c := range []struct {
		name string
		args []string
		code int
		want []string
	}{
		{"chord line, 1 mm skin: breaks out", []string{"--skin-mm", "1", "--spar", "0.3,8", "--spar-on", "chord-line", "--min-ligament-mm", "0"}, exitInput,
			[]string{`element "flap"`, "spar 8 mm", "breaks out", "mm"}},
		{"mean line, 3 mm skin: ligament below 2 mm", []string{"--skin-mm", "3", "--spar", "0.3,8"}, exitInput,
			[]string{`element "flap"`, "spar 8 mm", "short of the 2.0 mm minimum ligament"}},
		{"mean line, 3 mm skin, no minimum", []string{"--skin-mm", "3", "--spar", "0.3,8", "--min-ligament-mm", "0"}, exitOK, nil},
		{"mean line, 1 mm skin", []string{"--skin-mm", "1", "--spar", "0.3,8"}, exitOK, nil},
	} {
		args := append([]string{"export", "--study", study, "--what", "outline-dxf", "-o", out}, c.args...)
		code, _, stderr := runCLI(t, args...)
		if code != c.code {
			t.Errorf("%s: exit %d, want %d (%s)", c.name, code, c.code, stderr)
		}
		for _, w := range c.want {
			if !strings.Contains(stderr, w) {
				t.Errorf("%s: message %q lacks %q", c.name, stderr, w)
			}
		}
	}
}
