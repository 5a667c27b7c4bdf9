package main

import (
	"os"
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

// A study element's coordinates come at its own chord in mm by default and
// name the element; --chord-mm 0 asks for unit chord. The rear wing's flap
// has a 120 mm chord.
func TestExportStudyCoordinates(t *testing.T) {
	study := filepath.Join("..", "..", "testdata", "studies", "rear-wing.json")
	dir := t.TempDir()
	for _, c := range []struct {
		name, what string
		args       []string
		want       []string
	}{
		{"text", "coords", nil, []string{"element flap, chord 120 mm, coordinates in mm", "\n120.0"}},
		{"csv", "csv", nil, []string{"# study: Rear wing", "# element: flap", "# units: millimetres at a chord of 120 mm", "\nx_mm,y_mm\n120.0"}},
		{"unit chord", "coords", []string{"--chord-mm", "0"}, []string{"NACA 4412 (element flap)\n 1.0"}},
	} {
		out := filepath.Join(dir, c.name)
		args := append([]string{"export", "--study", study, "--what", c.what, "--element", "2", "-o", out}, c.args...)
		if code, _, stderr := runCLI(t, args...); code != exitOK {
			t.Fatalf("%s: exit %d: %s", c.name, code, stderr)
		}
		b, err := os.ReadFile(out)
		if err != nil {
			t.Fatal(err)
		}
		for _, w := range c.want {
			if !strings.Contains(string(b), w) {
				t.Errorf("%s: file lacks %q:\n%.300s", c.name, w, b)
			}
		}
	}
}

// Cleaning the tool's own export of a cambered section gives no warning
// (the nose of a section kept on its published chord curls ahead of the
// leading edge; see model's noseCurlXC) and rewrites the name line's units
// for the unit chord it writes.
func TestCleanOwnExport(t *testing.T) {
	dir := t.TempDir()
	for _, spec := range []string{"naca:4412", "naca:23012", "naca:6409"} {
		mm, clean := filepath.Join(dir, "mm.dat"), filepath.Join(dir, "clean.dat")
		if code, _, stderr := runCLI(t, "export", "--section", spec, "--what", "coords", "--chord-mm", "200", "-o", mm); code != exitOK {
			t.Fatalf("%s: export: %s", spec, stderr)
		}
		code, out, stderr := runCLI(t, "clean", mm, "-o", clean)
		if code != exitOK {
			t.Fatalf("%s: clean: %s", spec, stderr)
		}
		if !strings.Contains(out+stderr, "Warnings: none") {
			t.Errorf("%s: cleaning its own export warns:\n%s%s", spec, out, stderr)
		}
		b, _ := os.ReadFile(clean)
		if first, _, _ := strings.Cut(string(b), "\n"); strings.Contains(first, "mm") {
			t.Errorf("%s: cleaned unit-chord file keeps the name line %q", spec, first)
		}
	}
}
