package model

import "fmt"

// MinGroundClearanceChords is the smallest ground clearance the method
// supports, as a fraction h/c of the main element's chord (h from the
// ground to the configuration's lowest point). Below 2 % of the chord the
// gap is no thicker than the boundary layers that fill it — the wing's own
// at its trailing edge is about 5c/√Re = 0.013c laminar at Re 1.5 × 10⁵
// (Blasius) and 0.37c/Re^0.2 = 0.024c turbulent at 8 × 10⁵ (the 1/7-power
// law; both Schlichting, Boundary-Layer Theory, ch. 7 and 21) — so the
// inviscid flow through the gap that the image method computes does not
// exist there; the computed lift also grows without bound as h → 0 (Cl
// −887 at h/c = 0.004 for a 250 mm chord). Below it a study is refused.
// Between it and GroundHOverCMin results are flagged (Plausibility).
const MinGroundClearanceChords = 0.02

// GroundChordMM returns the chord h/c is measured against: the main
// element's, 0 for a study without elements.
func (st *Study) GroundChordMM() float64 {
	if len(st.Elements) == 0 {
		return 0
	}
	return st.Elements[0].ChordMM
}

// checkGround refuses a clearance below MinGroundClearanceChords.
func (st *Study) checkGround() error {
	c := st.GroundChordMM()
	if !st.Ground.Enabled || !(c > 0) {
		return nil
	}
	if h := st.Ground.ClearanceMM; h < MinGroundClearanceChords*c {
		return &FieldError{Field: "ground.clearance_mm", Err: fmt.Errorf(
			"%g mm is %.4g %% of the main element's chord (%g mm); the method supports no less than %g %% (%g mm): closer to the ground the gap is filled by boundary layers, which potential flow does not model",
			h, 100*h/c, c, 100*MinGroundClearanceChords, MinGroundClearanceChords*c)}
	}
	return nil
}

// NearGround reports whether a ground clearance of clearanceMM puts st's
// wing below GroundHOverCMin of its main element's chord, where
// Plausibility raises FlagGround (GroundCaution says what that means).
// False in free air, for a NaN clearance or a study without elements.
// The set-up maps mark their points with it, as the workbench flags the
// study.
func (st *Study) NearGround(clearanceMM float64) bool {
	c := st.GroundChordMM()
	return st.Ground.Enabled && c > 0 && clearanceMM/c < GroundHOverCMin
}

// NearGroundMM is the clearance, in mm, below which NearGround holds:
// GroundHOverCMin of the main element's chord (0 without elements).
func (st *Study) NearGroundMM() float64 {
	return GroundHOverCMin * st.GroundChordMM()
}
