package model

import "fmt"

// Panel count limits accepted by Repanel.
const (
	MinPanels = 16
	MaxPanels = 2000
)

// Spacing names a law for placing panel nodes along the contour.
type Spacing string

// The spacing laws.
const (
	// SpacingCosine places nodes at equal steps of β on each surface with
	// x = (1 − cos β)/2, clustering at both edges (Kuethe & Chow,
	// Foundations of Aerodynamics; Katz & Plotkin, Low-Speed Aerodynamics,
	// 2nd ed., sec. 11.1).
	SpacingCosine Spacing = "cosine"
	// SpacingUniform places nodes at equal steps of arc length.
	SpacingUniform Spacing = "uniform"
	// SpacingBlend blends uniform and end-clustered spacing; Nose and Tail
	// set how strongly nodes cluster at the leading and trailing edge.
	SpacingBlend Spacing = "blend"
	// SpacingCurvature places nodes so that panel length shrinks where the
	// contour curves most.
	SpacingCurvature Spacing = "curvature"
)

// Spacings lists the laws in the order the app offers them.
var Spacings = []Spacing{SpacingCosine, SpacingUniform, SpacingBlend, SpacingCurvature}

// Panelling is the user's control over how a section is cut into panels.
type Panelling struct {
	Panels  int     `json:"panels"`  // number of panels per element, MinPanels..MaxPanels
	Spacing Spacing `json:"spacing"` // spacing law
	Nose    float64 `json:"nose"`    // nose clustering in [0, 1]
	Tail    float64 `json:"tail"`    // tail clustering in [0, 1]
}

// DefaultPanelling is what a new study starts with.
var DefaultPanelling = Panelling{Panels: 160, Spacing: SpacingCosine, Nose: 0.5, Tail: 0.2}

// Validate reports the first field that is out of range.
func (p Panelling) Validate() error {
	if p.Panels < MinPanels || p.Panels > MaxPanels {
		return &FieldError{Field: "panelling.panels", Err: fmt.Errorf("%d is outside %d..%d", p.Panels, MinPanels, MaxPanels)}
	}
	ok := false
	for _, s := range Spacings {
		ok = ok || s == p.Spacing
	}
	if !ok {
		return &FieldError{Field: "panelling.spacing", Err: fmt.Errorf("unknown spacing law %q (want cosine, uniform, blend or curvature)", p.Spacing)}
	}
	if !(p.Nose >= 0 && p.Nose <= 1) {
		return &FieldError{Field: "panelling.nose", Err: fmt.Errorf("%g is outside [0, 1]", p.Nose)}
	}
	if !(p.Tail >= 0 && p.Tail <= 1) {
		return &FieldError{Field: "panelling.tail", Err: fmt.Errorf("%g is outside [0, 1]", p.Tail)}
	}
	return nil
}

// FieldError reports a bad value in a named field of a study, a panelling or
// a command-line flag. Field is a dotted path such as "elements[1].chord_mm".
type FieldError struct {
	Field string
	Err   error
}

func (e *FieldError) Error() string { return e.Field + ": " + e.Err.Error() }

func (e *FieldError) Unwrap() error { return e.Err }
