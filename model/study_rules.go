package model

import (
	"errors"
	"fmt"
)

// Rules that a study must meet to be solved and that the window and the
// command-line tool both enforce: each is stated once, here.

// ErrViscousNeedsFlow is the rule that the viscous solution needs a
// Reynolds number per element: from a speed (with the air) or entered
// directly.
var ErrViscousNeedsFlow = errors.New("the viscous solution needs a speed or a Reynolds number")

// CheckFlow reports flow settings that validate one by one but cannot be
// solved together: the viscous solution without a speed or a Reynolds
// number. The error is a *FieldError on flow.speed_mps wrapping
// ErrViscousNeedsFlow.
func (st *Study) CheckFlow() error {
	if st.Viscous.Enabled && !(st.Flow.SpeedMPS > 0) && !(st.Flow.Reynolds > 0) {
		return &FieldError{Field: "flow.speed_mps", Err: ErrViscousNeedsFlow}
	}
	return nil
}

// FollowFlow applies the rule that a study with a speed (or a Reynolds
// number) shows the viscous answer by default: when the flow gains one —
// it had neither before (prev) and has one now — the viscous solution is
// turned on, as the coupled solution unless the study chose the one-way
// estimate explicitly. A change of speed keeps whatever the user chose,
// so a viscous solution turned off stays off; removing the last speed
// while the viscous solution is on is refused (CheckFlow), with its
// reason, rather than turning it off unasked.
func (st *Study) FollowFlow(prev Flow) {
	had := prev.SpeedMPS > 0 || prev.Reynolds > 0
	has := st.Flow.SpeedMPS > 0 || st.Flow.Reynolds > 0
	if had || !has || st.Viscous.Enabled {
		return
	}
	st.Viscous.Enabled = true
	if st.Viscous.Mode == "" {
		st.Viscous.Mode = ViscousCoupled
	}
}

// MaxDensityRuns bounds the solves of one density study (panel counts ×
// nose values), so that a mistyped list cannot start hours of work: each
// solve factorises a dense system whose cost grows as the cube of the
// total panel count.
const MaxDensityRuns = 60

// CheckDensityRuns reports a density plan of more than MaxDensityRuns
// solves; defaultCounts is the number of panel counts run when the plan
// lists none.
func (p DensityPlan) CheckDensityRuns(defaultCounts int) error {
	n := len(p.Panels)
	if n == 0 {
		n = defaultCounts
	}
	if runs := n * max(len(p.Nose), 1); runs > MaxDensityRuns {
		return &FieldError{Field: "density", Err: fmt.Errorf("%d solves: at most %d (fewer counts or nose values)", runs, MaxDensityRuns)}
	}
	return nil
}

// Limits of the manufacturing outputs' dimensions, in millimetres: a skin
// thicker than MaxSkinMM or a hole wider than MaxHoleMM is a typing
// mistake on a wing section (chords of a few hundred millimetres), not a
// design.
const (
	MaxSkinMM = 50
	MaxHoleMM = 200
)

// ErrNoseNeedsBlend is the rule that nose clustering shapes only the blend
// spacing law: with any other law every nose value gives the same panels,
// so a density study comparing several is meaningless.
var ErrNoseNeedsBlend = errors.New("nose clustering changes the panels only with the blend spacing law")

// CheckDensityNose reports a density plan that compares several nose
// values under a spacing law they do not shape: a *FieldError on
// density.nose wrapping ErrNoseNeedsBlend.
func (st *Study) CheckDensityNose() error {
	if len(st.Density.Nose) > 1 && st.Panelling.Spacing != SpacingBlend {
		return &FieldError{Field: "density.nose", Err: fmt.Errorf("%w (the study uses %s spacing)", ErrNoseNeedsBlend, st.Panelling.Spacing)}
	}
	return nil
}
