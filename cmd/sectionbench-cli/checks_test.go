package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"sectionbench/model"
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
	if err := os.WriteFile(study, []byte(`{"format": "sectionbench-study", "version": 2, "name": "low",
		"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}],
		"ground": {"enabled": true, "clearance_mm": 1}, "inverted": true}`), 0o644); err != nil {
		t.Fatal(err)
	}
	code, _, stderr := runCLI(t, "solve", "--study", study)
	if code != exitInput || !strings.Contains(stderr, "ground.clearance_mm") || !strings.Contains(stderr, "5 mm") {
		t.Errorf("exit %d, %q; want exit %d naming ground.clearance_mm and the 5 mm limit", code, stderr, exitInput)
	}
}

// TestFlagMessages: bad flags exit 2 naming the flag, in words. "1_0"
// was read as 10; --tol-cl 0 printed "within 0 %" while using 0.5 %; a
// bad density count exited 1 naming a study field; a figure of a
// ten-thousandth of an inch gave a raw image error.
func TestFlagMessages(t *testing.T) {
	for _, tc := range []struct {
		name     string
		args     []string
		contains string
	}{
		{"underscore in a number", []string{"solve", "--section", "naca:0012", "--alpha", "1_0"}, "-alpha"},
		{"hexadecimal number", []string{"solve", "--section", "naca:0012", "--alpha", "0x1p3"}, "-alpha"},
		{"tolerance zero", []string{"density", "--section", "naca:0012", "--alpha", "4", "--tol-cl", "0"}, "--tol-cl"},
		{"tolerance negative", []string{"density", "--section", "naca:0012", "--alpha", "4", "--tol-cp", "-1"}, "--tol-cp"},
		{"density count out of range", []string{"density", "--section", "naca:0012", "--alpha", "4", "--panels", "20,5000"}, "--panels"},
		{"figure too small", []string{"export", "--section", "naca:0012", "--what", "figure", "--height-in", "0.0001", "-o", "x.png"}, "pixels"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code, _, stderr := runCLI(t, tc.args...)
			if code != exitUsage || !strings.Contains(stderr, tc.contains) {
				t.Errorf("exit %d, %q; want exit %d naming %s", code, stderr, exitUsage, tc.contains)
			}
			for _, goWord := range []string{"float64", "strconv", "png:"} {
				if strings.Contains(stderr, goWord) {
					t.Errorf("message %q shows %q", stderr, goWord)
				}
			}
		})
	}
}

// TestGroundBandFlagged: 10 mm over a 250 mm chord (h/c 0.04, a front
// wing's height; it gave Cl −36 without a word) is solved with the
// caution that real wings lose downforce there; 60 mm is not flagged.
func TestGroundBandFlagged(t *testing.T) {
	for _, tc := range []struct {
		h      string
		warned bool
	}{{"10", true}, {"60", false}} {
		study := filepath.Join(t.TempDir(), "front.json")
		if err := os.WriteFile(study, []byte(`{"format": "sectionbench-study", "version": 2, "name": "front",
			"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}],
			"ground": {"enabled": true, "clearance_mm": `+tc.h+`}, "inverted": true}`), 0o644); err != nil {
			t.Fatal(err)
		}
		code, out, stderr := runCLI(t, "solve", "--study", study, "--format", "json")
		if code != exitOK {
			t.Fatalf("exit %d: %s", code, stderr)
		}
		var r struct{ Warnings []string }
		if err := json.Unmarshal([]byte(out), &r); err != nil {
			t.Fatal(err)
		}
		if got := strings.Contains(strings.Join(r.Warnings, "\n"), model.GroundCaution()); got != tc.warned {
			t.Errorf("%s mm: flagged %v, want %v (%q)", tc.h, got, tc.warned, r.Warnings)
		}
	}
}
