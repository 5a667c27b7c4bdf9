package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
)

// Study file identification.
const (
	StudyFormat  = "sectionbench-study"
	StudyVersion = 2
)

// Study versions and what changed:
//
//   - 1: element positions of an inverted study in the upright design frame
//     (mirrored about y = 0 when placed).
//   - 2: element positions as mounted (FrameText) for every study; a
//     version-1 inverted study is read with each y_mm negated, which places
//     the same wing.

// MaxElements is the largest number of elements a study may hold.
const MaxElements = 5

// Study is a saved workbench state: everything needed to reproduce the
// screen. Its JSON form is the user's file format, documented field by field
// in the README.
type Study struct {
	Format           string         `json:"format"`
	Version          int            `json:"version"`
	Name             string         `json:"name"`
	Team             string         `json:"team,omitempty"`
	Elements         []StudyElement `json:"elements"`
	Panelling        Panelling      `json:"panelling"`
	Flow             Flow           `json:"flow"`
	Sweep            SweepRange     `json:"sweep"`
	Ground           Ground         `json:"ground"`
	Inverted         bool           `json:"inverted"`
	ReferenceChordMM float64        `json:"reference_chord_mm,omitempty"`
	Viscous          Viscous        `json:"viscous"`
	Density          DensityPlan    `json:"density"`
	Pins             []Pin          `json:"pins"`
}

// StudyElement is one wing element: a section source placed as mounted
// (FrameText) by its leading edge (millimetres) and setting angle (degrees
// about its own leading edge, positive in the sense of AngleSense: nose-up
// on an upright wing, leading edge down on an inverted one).
type StudyElement struct {
	Name     string        `json:"name"`
	Section  SectionSource `json:"section"`
	ChordMM  float64       `json:"chord_mm"`
	XMM      float64       `json:"x_mm"`
	YMM      float64       `json:"y_mm"`
	AngleDeg float64       `json:"angle_deg"`
}

// SectionSource is where an element's section comes from: either a spec
// string (naca:DIGITS, kt:…, or a coordinate-file path relative to the study
// file) or embedded cleaned coordinates. In JSON it is a string or an object
// {"name": …, "points": [[x, y], …]}.
type SectionSource struct {
	Spec     string           `json:"-"`
	Embedded *EmbeddedSection `json:"-"`
}

// EmbeddedSection is a section stored inside the study file.
type EmbeddedSection struct {
	Name   string       `json:"name"`
	Points [][2]float64 `json:"points"`
}

// String returns the spec, or "embedded:NAME" for embedded coordinates.
func (s SectionSource) String() string {
	if s.Embedded != nil {
		return "embedded:" + s.Embedded.Name
	}
	return s.Spec
}

// MarshalJSON writes the spec string or the embedded object.
func (s SectionSource) MarshalJSON() ([]byte, error) {
	if s.Embedded != nil {
		return json.Marshal(s.Embedded)
	}
	return json.Marshal(s.Spec)
}

// UnmarshalJSON accepts a string or an object.
func (s *SectionSource) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '"' {
		*s = SectionSource{}
		return json.Unmarshal(b, &s.Spec)
	}
	var e EmbeddedSection
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&e); err != nil {
		return &sectionSourceError{err}
	}
	*s = SectionSource{Embedded: &e}
	return nil
}

// EmbedSection returns a source holding sec's points.
func EmbedSection(sec *Section) SectionSource {
	pts := make([][2]float64, sec.Len())
	for i := range pts {
		p := sec.At(i)
		pts[i] = [2]float64{p.X, p.Y}
	}
	return SectionSource{Embedded: &EmbeddedSection{Name: sec.Name(), Points: pts}}
}

// Flow is the freestream: angle of attack and, optionally, real air and speed.
// A zero speed means "no speed known": results stay non-dimensional.
type Flow struct {
	AlphaDeg     float64 `json:"alpha_deg"`
	SpeedMPS     float64 `json:"speed_mps,omitempty"`
	TemperatureC float64 `json:"temperature_c"`
	PressurePa   float64 `json:"pressure_pa"`
	SpanM        float64 `json:"span_m,omitempty"`   // span for total forces; 0 means per metre only
	Reynolds     float64 `json:"reynolds,omitempty"` // entered directly; overrides speed-derived Re when > 0
	// EndPlateHeightMM is the height of the end plates at both tips, for
	// the finite-span estimate's effective aspect ratio; 0 means none.
	EndPlateHeightMM float64 `json:"end_plate_height_mm,omitempty"`
}

// SweepRange is a set of angles of attack from FromDeg to ToDeg in StepDeg.
type SweepRange struct {
	FromDeg float64 `json:"from_deg"`
	ToDeg   float64 `json:"to_deg"`
	StepDeg float64 `json:"step_deg"`
}

// MaxSweepAngles bounds the number of angles in one sweep.
const MaxSweepAngles = 2001

// Angles returns the sweep's angles, end inclusive (to within a small
// fraction of a step, so 0:1:0.1 includes 1).
func (r SweepRange) Angles() ([]float64, error) {
	if err := r.Validate(); err != nil {
		return nil, err
	}
	n := int((r.ToDeg-r.FromDeg)/r.StepDeg+1e-9) + 1
	a := make([]float64, n)
	for i := range a {
		a[i] = r.FromDeg + float64(i)*r.StepDeg
	}
	return a, nil
}

// Validate checks that the range is finite, increasing in its step and not
// too long.
func (r SweepRange) Validate() error {
	for _, v := range []struct {
		f string
		x float64
	}{{"sweep.from_deg", r.FromDeg}, {"sweep.to_deg", r.ToDeg}, {"sweep.step_deg", r.StepDeg}} {
		if !finite(v.x) {
			return &FieldError{Field: v.f, Err: errNotFinite}
		}
		if v.x < -MaxAlphaDeg || v.x > MaxAlphaDeg {
			return &FieldError{Field: v.f, Err: fmt.Errorf("%g is outside ±%g°", v.x, float64(MaxAlphaDeg))}
		}
	}
	if r.StepDeg <= 0 {
		return &FieldError{Field: "sweep.step_deg", Err: errors.New("step must be positive")}
	}
	if r.ToDeg < r.FromDeg {
		return &FieldError{Field: "sweep.to_deg", Err: fmt.Errorf("%g is below from_deg %g", r.ToDeg, r.FromDeg)}
	}
	if (r.ToDeg-r.FromDeg)/r.StepDeg+1 > MaxSweepAngles {
		return &FieldError{Field: "sweep.step_deg", Err: fmt.Errorf("more than %d angles", MaxSweepAngles)}
	}
	return nil
}

// MaxAlphaDeg bounds the angle of attack the study accepts: beyond it a
// potential-flow answer means nothing for a wing section.
const MaxAlphaDeg = 45

// Ground is a flat ground plane parallel to the freestream, ClearanceMM below
// the lowest point of the configuration at its current angle.
type Ground struct {
	Enabled     bool    `json:"enabled"`
	ClearanceMM float64 `json:"clearance_mm"`
}

// Viscous holds the settings of the viscous solution.
type Viscous struct {
	Enabled bool `json:"enabled"`
	// Mode is ViscousCoupled (boundary layers and wakes that act back on
	// the flow, iterated to convergence) or ViscousEstimate (the one-way
	// boundary-layer estimate on the inviscid pressures, lift inviscid).
	// Empty means ViscousEstimate: studies saved before the coupled
	// solution existed keep the meaning they were saved with. NewStudy,
	// the demo study and the command line's --section studies set
	// ViscousCoupled; a study that gains a speed turns it on (FollowFlow).
	Mode ViscousMode `json:"mode,omitempty"`
	// TransitionN is the critical amplification exponent N of the e^N
	// transition criterion (coupled mode), MinTransitionN to
	// MaxTransitionN; 0 or absent means DefaultTransitionN. Mack's
	// correlation relates it to the free-stream turbulence level Tu in
	// percent: N = −8.43 − 2.4 ln(Tu/100) (Mack, Transition and laminar
	// instability, JPL Publication 77-15, 1977), so N = 9 is Tu ≈ 0.07 %
	// (a quiet wind tunnel) and N = 4 is Tu ≈ 0.5 %.
	TransitionN float64 `json:"transition_n,omitempty"`
	// Forced transition (trip) positions in x/c per surface; 0 or absent
	// means free transition. Surfaces are as mounted, like every upper and
	// lower in the results: on an inverted wing the suction side is the
	// lower surface.
	TripUpper float64 `json:"trip_upper,omitempty"`
	TripLower float64 `json:"trip_lower,omitempty"`
	// SeparationH is the shape factor at which the turbulent boundary
	// layer is taken to separate; 0 or absent means the solver's default
	// (2.4), else it lies in [MinSeparationH, MaxSeparationH].
	SeparationH float64 `json:"separation_h,omitempty"`
}

// ViscousMode selects the viscous solution.
type ViscousMode string

// The viscous modes.
const (
	ViscousCoupled  ViscousMode = "coupled"
	ViscousEstimate ViscousMode = "estimate"
)

// IsCoupled reports whether the coupled solution is selected (an empty
// mode is the estimate).
func (v Viscous) IsCoupled() bool { return v.Mode == ViscousCoupled }

// CriticalN returns TransitionN, or DefaultTransitionN when it is 0.
func (v Viscous) CriticalN() float64 {
	if v.TransitionN == 0 {
		return DefaultTransitionN
	}
	return v.TransitionN
}

// The critical amplification exponents a study accepts and the default:
// N = 9 is the common choice for a quiet wind tunnel (common practice);
// by Mack's correlation N = 1 is Tu ≈ 2.5 % and N = 15 is Tu ≈ 0.006 %,
// the ends of the range where the correlation is used.
const (
	MinTransitionN     = 1
	MaxTransitionN     = 15
	DefaultTransitionN = 9
)

// The range of turbulent separation thresholds a study may set: texts put
// turbulent separation in Head's method anywhere in H ≈ 2.2–3.0 (2.2–2.4 in
// common teaching use), with margin at the low end.
const (
	MinSeparationH = 2.0
	MaxSeparationH = 3.0
)

// DensityPlan lists the panel counts and nose clusterings of a density
// study and its tolerances.
type DensityPlan struct {
	Panels      []int     `json:"panels,omitempty"`
	Nose        []float64 `json:"nose,omitempty"`
	TolClPct    float64   `json:"tol_cl_pct,omitempty"`
	TolCpMinPct float64   `json:"tol_cp_min_pct,omitempty"`
}

// Pin is a frozen result shown for comparison: the curves as they were and
// a label saying what differed.
type Pin struct {
	Label string       `json:"label"`
	Cp    []PinCurve   `json:"cp"`    // one per element and surface
	Polar [][3]float64 `json:"polar"` // rows of alpha_deg, cl, cm
}

// PinCurve is one frozen Cp curve: x/c and Cp.
type PinCurve struct {
	Element string       `json:"element"`
	Side    string       `json:"side"`
	Points  [][2]float64 `json:"points"`
}

func finite(x float64) bool { return Point{x, 0}.IsFinite() }
