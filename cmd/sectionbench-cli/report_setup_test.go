package main

import (
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// report --map and --finite-span add the set-up page: the load against
// the clearance and the finite-span totals, with the cautions; a bad
// --map is bad usage naming the flag, and the finite span without a span
// is bad input naming the study field.
func TestReportSetupPage(t *testing.T) {
	dir := t.TempDir()
	pdf := filepath.Join(dir, "setup.pdf")
	// The panel method's polar: the example's viscous sweep does not
	// converge below −12°, where the finite span's tips need it.
	study := inviscidExample(t, "two-element-ground.json")
	code, _, stderr := runCLI(t, "report", "--study", study, "-o", pdf, "--no-density", "--map", "clearance_mm=40:120:40", "--map-inviscid", "--finite-span")
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	out, err := exec.Command("pdftotext", pdf, "-").CombinedOutput()
	if err != nil {
		t.Fatalf("pdftotext: %v\n%s", err, out)
	}
	text := strings.Join(strings.Fields(string(out)), " ")
	for _, want := range []string{"Set-up", "Downforce (N/m) against ground clearance (mm)", "report --map clearance_mm=40:120:40",
		"Finite span (an estimate the wind tunnel or the track must confirm)", "Induced drag", "validate by test"} {
		if !strings.Contains(text, want) {
			t.Errorf("report lacks %q", want)
		}
	}
	code, _, stderr = runCLI(t, "report", "--study", study, "-o", pdf, "--no-density", "--search", "elements[1].deflection_deg=10:20", "--search-inviscid", "--search-max-evaluations", "8")
	if code != exitOK {
		t.Fatalf("--search: exit %d: %s", code, stderr)
	}
	out, err = exec.Command("pdftotext", pdf, "-").CombinedOutput()
	if err != nil {
		t.Fatalf("pdftotext: %v\n%s", err, out)
	}
	text = strings.Join(strings.Fields(string(out)), " ")
	for _, want := range []string{"Best setting found", "Start Best found", "a local optimum", "with the panel method only"} {
		if !strings.Contains(text, want) {
			t.Errorf("report with --search lacks %q", want)
		}
	}
	code, _, stderr = runCLI(t, "report", "--study", study, "-o", pdf, "--no-density", "--search", "elements[1].deflection_deg=20:10")
	if code != exitUsage || !strings.Contains(stderr, "--search") {
		t.Errorf("bad --search: exit %d, %s", code, stderr)
	}
	code, _, stderr = runCLI(t, "report", "--study", study, "-o", pdf, "--no-density", "--map", "height=1:2:1")
	if code != exitUsage || !strings.Contains(stderr, "--map") {
		t.Errorf("bad --map: exit %d, %s", code, stderr)
	}
	code, _, stderr = runCLI(t, "report", "--section", "naca:2412", "-o", pdf, "--no-density", "--finite-span")
	if code != exitInput || !strings.Contains(stderr, "span") {
		t.Errorf("--finite-span without a span: exit %d, %s", code, stderr)
	}
}
