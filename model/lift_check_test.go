package model

import "testing"

// TestLiftDisagreement: lifts that agree to the discretisation error pass;
// an under-resolved solution is flagged.
func TestLiftDisagreement(t *testing.T) {
	for _, tc := range []struct {
		name           string
		cl, clPressure float64
		flagged        bool
	}{
		{"160 panels, NACA 0012 at 4°", 0.4833, 0.4830, false},
		{"40 panels, uniform", 0.4777, 0.4463, false},
		{"near zero lift", 0.001, -0.012, false},
		{"under-resolved, seen", 35.97, -5863, true},
		{"spike at a sharp trailing edge", 1.1341, 0.7350, true},
		{"opposite signs", 0.3, -0.3, true},
	} {
		if got := LiftDisagreement(tc.cl, tc.clPressure) != ""; got != tc.flagged {
			t.Errorf("%s: flagged %v, want %v", tc.name, got, tc.flagged)
		}
	}
}
