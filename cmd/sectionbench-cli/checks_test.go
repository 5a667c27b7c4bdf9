package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestLiftDisagreementReachesTheOutput: an under-resolved solution (16
// uniform panels on NACA 0012, circulation Cl 0.468 against pressure Cl
// 0.386) carries the warning in the JSON; a resolved one does not.
func TestLiftDisagreementReachesTheOutput(t *testing.T) {
	for _, tc := range []struct {
		panels, spacing string
		warned          bool
	}{{"16", "uniform", true}, {"160", "cosine", false}} {
		code, out, stderr := runCLI(t, "solve", "--section", "naca:0012", "--alpha", "4", "--panels", tc.panels, "--spacing", tc.spacing, "--format", "json")
		if code != exitOK {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		var r struct{ Warnings []string }
		if err := json.Unmarshal([]byte(out), &r); err != nil {
			t.Fatal(err)
		}
		if got := strings.Contains(strings.Join(r.Warnings, "\n"), "disagree"); got != tc.warned {
			t.Errorf("%s %s panels: warned %v, want %v (%q)", tc.panels, tc.spacing, got, tc.warned, r.Warnings)
		}
	}
}

// TestGroundBelowTheMethodIsRefused: a study 1 mm above the ground on a
// 250 mm chord (which gave Cl −887) is refused naming the field.
func TestGroundBelowTheMethodIsRefused(t *testing.T) {
	study := filepath.Join(t.TempDir(), "low.json")
	os.WriteFile(study, []byte(`{"format": "sectionbench-study", "version": 2, "name": "low",
		"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}],
		"ground": {"enabled": true, "clearance_mm": 1}, "inverted": true}`), 0o644)
	code, _, stderr := runCLI(t, "solve", "--study", study)
	if code != exitInput || !strings.Contains(stderr, "ground.clearance_mm") || !strings.Contains(stderr, "5 mm") {
		t.Errorf("exit %d, %q; want exit %d naming ground.clearance_mm and the 5 mm limit", code, stderr, exitInput)
	}
}
