package model

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestGroundRule: a clearance below MinGroundClearanceChords of the main
// element's chord is refused naming the field and the limit; one in the
// band below GroundHOverCMin is accepted and flagged (Plausibility); above it,
// and with the ground off, nothing is said. (1 mm on a 250 mm chord gave
// Cl −887 and 1e-9 mm 3.6 GN/m; 10–20 mm, front-wing heights, gave Cl
// −36 and −15, all without a word.) NearGround, which marks the set-up
// maps' points, agrees with the flag.
func TestGroundRule(t *testing.T) {
	for _, tc := range []struct {
		name    string
		on      bool
		h       float64 // mm, on a 250 mm main chord
		refused bool
		warned  bool
	}{
		{"a billionth of a millimetre", true, 1e-9, true, false},
		{"1 mm", true, 1, true, false},
		{"just below 2 %", true, 4.99, true, false},
		{"2 %", true, 5, false, true},
		{"10 mm", true, 10, false, true},
		{"20 mm", true, 20, false, true},
		{"just below 10 %", true, 24.9, false, true},
		{"10 %", true, 25, false, false},
		{"60 mm", true, 60, false, false},
		{"ground off", false, 1, false, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := NewStudy()
			st.Elements[0].ChordMM = 250
			st.Ground = Ground{Enabled: tc.on, ClearanceMM: tc.h}
			err := st.Validate()
			var fe *FieldError
			if tc.refused != (err != nil) {
				t.Fatalf("Validate: %v, want refused %v", err, tc.refused)
			}
			if err != nil && (!errors.As(err, &fe) || fe.Field != "ground.clearance_mm" || !strings.Contains(err.Error(), "2 %") || !strings.Contains(err.Error(), "5 mm")) {
				t.Errorf("message %q does not name the field and the 2 %% (5 mm) limit", err)
			}
			if tc.refused {
				return
			}
			flags := Plausibility(PointFacts{HOverC: st.Ground.ClearanceMM / st.GroundChordMM()})
			if !tc.on {
				flags = Plausibility(PointFacts{HOverC: math.NaN()})
			}
			if tc.warned != (len(flags) == 1 && flags[0].Kind == FlagGround) {
				t.Errorf("flags %v, want the ground flagged: %v", flags, tc.warned)
			}
			// The set-up maps mark their points by the same rule.
			if got := st.NearGround(tc.h); got != tc.warned {
				t.Errorf("NearGround(%g) = %v, want %v as the flag", tc.h, got, tc.warned)
			}
		})
	}
}
