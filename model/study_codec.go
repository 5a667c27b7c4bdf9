package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"
)

// Limits the study loader enforces.
const (
	// MaxStudyBytes bounds a study file. An embedded section of MaxPoints
	// points at full precision takes well under 1 MiB; 8 MiB leaves room for
	// five elements and pins while rejecting nonsense fast.
	MaxStudyBytes = 8 << 20
	// MaxPins bounds the pins kept in a study.
	MaxPins = 20
	// MaxTotalPanels bounds the panels of all elements together. The
	// influence matrix has about that many rows and columns: 3000 makes a
	// 72 MB matrix whose LU takes a few seconds on a laptop; five elements
	// at the 2000-panel maximum would take 800 MB and minutes.
	MaxTotalPanels = 3000
	// MaxDensityCounts and MaxDensityNose bound a density study's lists
	// (each pair is one full solve).
	MaxDensityCounts = 12
	MaxDensityNose   = 6
)

// Physical ranges a study accepts. They are generous bounds on what a wing
// section workbench can mean, not design limits.
const (
	MinChordMM     = 1.0    // 1 mm
	MaxChordMM     = 10000  // 10 m
	MaxPositionMM  = 100000 // 100 m from the origin
	MaxSettingDeg  = 90
	MaxSpeedMPS    = 150 // beyond this compressibility matters (Mach ≈ 0.44)
	MaxClearanceMM = 100000
)

// ErrStudyFormat reports a file that is not a Sectionbench study.
var ErrStudyFormat = errors.New("not a sectionbench study")

// NewStudy returns a one-element study with the default settings.
func NewStudy() *Study {
	return &Study{
		Format:  StudyFormat,
		Version: StudyVersion,
		Name:    "Untitled study",
		Elements: []StudyElement{{
			Name: "main", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 250,
		}},
		Panelling: DefaultPanelling,
		Flow:      Flow{AlphaDeg: 4, TemperatureC: 15, PressurePa: 101325},
		Sweep:     SweepRange{FromDeg: -4, ToDeg: 12, StepDeg: 1},
		Ground:    Ground{ClearanceMM: 50},
		Pins:      []Pin{},
	}
}

// Clone returns a deep copy of st.
func (st *Study) Clone() *Study {
	b, err := json.Marshal(st)
	if err != nil {
		panic("model: study cannot be copied: " + err.Error())
	}
	var c Study
	if err := json.Unmarshal(b, &c); err != nil {
		panic("model: study cannot be copied: " + err.Error())
	}
	return &c
}

// Encode returns the study as indented JSON.
func (st *Study) Encode() ([]byte, error) {
	if err := st.Validate(); err != nil {
		return nil, err
	}
	b, err := json.MarshalIndent(st, "", "  ")
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}

// DecodeStudy reads a study from JSON and validates it. It never returns a
// half-loaded study: on error the result is nil. Unknown fields, wrong types
// and out-of-range values are reported with their field path.
func DecodeStudy(b []byte) (*Study, error) {
	if len(b) > MaxStudyBytes {
		return nil, fmt.Errorf("study is %d bytes, more than the %d a study may have: %w", len(b), MaxStudyBytes, ErrStudyFormat)
	}
	var head struct {
		Format  string `json:"format"`
		Version int    `json:"version"`
	}
	if err := json.Unmarshal(b, &head); err != nil {
		return nil, jsonFieldError(b, err)
	}
	if head.Format != StudyFormat {
		return nil, &FieldError{Field: "format", Err: fmt.Errorf("%q is not %q: %w", head.Format, StudyFormat, ErrStudyFormat)}
	}
	if head.Version < 1 || head.Version > StudyVersion {
		return nil, &FieldError{Field: "version", Err: fmt.Errorf("version %d is not supported (this build reads 1 to %d)", head.Version, StudyVersion)}
	}
	st := NewStudy()
	st.Elements = nil
	st.Pins = nil
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(st); err != nil {
		return nil, jsonFieldError(b, err)
	}
	if dec.More() {
		return nil, errors.New("study: unexpected data after the JSON object")
	}
	if st.Pins == nil {
		st.Pins = []Pin{}
	}
	migrate(st)
	if err := st.Validate(); err != nil {
		return nil, err
	}
	return st, nil
}

// migrate brings a study read from an older version to StudyVersion, same
// wing, same meaning (see StudyVersion).
func migrate(st *Study) {
	if st.Version < 2 && st.Inverted {
		for i := range st.Elements {
			st.Elements[i].YMM = -st.Elements[i].YMM
		}
	}
	st.Version = StudyVersion
}

// jsonFieldError turns an encoding/json error into a FieldError where the
// field is known, otherwise into an error naming the line.
func jsonFieldError(b []byte, err error) error {
	var te *json.UnmarshalTypeError
	if errors.As(err, &te) {
		f := te.Field
		if f == "" {
			f = "(top level)"
		}
		return &FieldError{Field: f, Err: fmt.Errorf("%s is not a valid %s", te.Value, te.Type)}
	}
	var se *json.SyntaxError
	if errors.As(err, &se) {
		line := 1 + bytes.Count(b[:min(int(se.Offset), len(b))], []byte("\n"))
		return fmt.Errorf("study: line %d: %v", line, se)
	}
	if msg := err.Error(); strings.HasPrefix(msg, "json: unknown field ") {
		return &FieldError{Field: strings.Trim(strings.TrimPrefix(msg, "json: unknown field "), `"`), Err: errors.New("unknown field")}
	}
	return fmt.Errorf("study: %w", err)
}

// Validate reports the first out-of-range or missing value, naming its
// field.
func (st *Study) Validate() error {
	if st.Format != StudyFormat {
		return &FieldError{Field: "format", Err: ErrStudyFormat}
	}
	if err := st.checkLimits(); err != nil {
		return err
	}
	if n := len(st.Elements); n < 1 || n > MaxElements {
		return &FieldError{Field: "elements", Err: fmt.Errorf("%d elements; a study holds 1 to %d", n, MaxElements)}
	}
	for i, e := range st.Elements {
		f := func(name string) string { return fmt.Sprintf("elements[%d].%s", i, name) }
		if e.Section.Spec == "" && e.Section.Embedded == nil {
			return &FieldError{Field: f("section"), Err: errors.New("missing")}
		}
		if em := e.Section.Embedded; em != nil {
			if len(em.Points) < MinSectionPoints {
				return &FieldError{Field: f("section.points"), Err: fmt.Errorf("%d points: %w", len(em.Points), ErrTooFewPoints)}
			}
			for j, p := range em.Points {
				if !finite(p[0]) || !finite(p[1]) {
					return &FieldError{Field: fmt.Sprintf("elements[%d].section.points[%d]", i, j), Err: ErrNonFinite}
				}
			}
		}
		for _, c := range []struct {
			name     string
			v, lo, h float64
		}{
			{"chord_mm", e.ChordMM, MinChordMM, MaxChordMM},
			{"x_mm", e.XMM, -MaxPositionMM, MaxPositionMM},
			{"y_mm", e.YMM, -MaxPositionMM, MaxPositionMM},
			{"angle_deg", e.AngleDeg, -MaxSettingDeg, MaxSettingDeg},
		} {
			if err := inRange(c.v, c.lo, c.h); err != nil {
				return &FieldError{Field: f(c.name), Err: err}
			}
		}
	}
	if err := st.Panelling.Validate(); err != nil {
		return err
	}
	if err := st.Panelling.checkBlendRange(); err != nil {
		return err
	}
	fl := st.Flow
	for _, c := range []struct {
		name     string
		v, lo, h float64
	}{
		{"flow.alpha_deg", fl.AlphaDeg, -MaxAlphaDeg, MaxAlphaDeg},
		{"flow.speed_mps", fl.SpeedMPS, 0, MaxSpeedMPS},
		{"flow.span_m", fl.SpanM, 0, 100},
		{"flow.reynolds", fl.Reynolds, 0, 1e9},
		{"reference_chord_mm", st.ReferenceChordMM, 0, MaxChordMM * MaxElements},
		{"ground.clearance_mm", st.Ground.ClearanceMM, 0, MaxClearanceMM},
		{"viscous.trip_upper", st.Viscous.TripUpper, 0, 1},
		{"viscous.trip_lower", st.Viscous.TripLower, 0, 1},
	} {
		if err := inRange(c.v, c.lo, c.h); err != nil {
			return &FieldError{Field: c.name, Err: err}
		}
	}
	if h := st.Viscous.SeparationH; h != 0 && !(h >= MinSeparationH && h <= MaxSeparationH) {
		return &FieldError{Field: "viscous.separation_h", Err: fmt.Errorf("%g is outside %g..%g", h, float64(MinSeparationH), float64(MaxSeparationH))}
	}
	switch st.Viscous.Mode {
	case "", ViscousCoupled, ViscousEstimate:
	default:
		return &FieldError{Field: "viscous.mode", Err: fmt.Errorf("%q is not %q or %q", st.Viscous.Mode, ViscousCoupled, ViscousEstimate)}
	}
	if n := st.Viscous.TransitionN; n != 0 && !(n >= MinTransitionN && n <= MaxTransitionN) {
		return &FieldError{Field: "viscous.transition_n", Err: fmt.Errorf("%g is outside %g..%g", n, float64(MinTransitionN), float64(MaxTransitionN))}
	}
	if st.Ground.Enabled && !(st.Ground.ClearanceMM > 0) {
		return &FieldError{Field: "ground.clearance_mm", Err: errors.New("must be positive when the ground is on")}
	}
	if err := st.checkGround(); err != nil {
		return err
	}
	if fl.SpeedMPS > 0 {
		if _, err := AirFromCelsius(fl.TemperatureC, fl.PressurePa); err != nil {
			return err
		}
	}
	if err := st.Sweep.Validate(); err != nil {
		return err
	}
	if len(st.Pins) > MaxPins {
		return &FieldError{Field: "pins", Err: fmt.Errorf("%d pins; at most %d", len(st.Pins), MaxPins)}
	}
	if n := st.Panelling.Panels * len(st.Elements); n > MaxTotalPanels {
		return &FieldError{Field: "panelling.panels", Err: fmt.Errorf("%d panels on each of %d elements is %d in all, more than %d", st.Panelling.Panels, len(st.Elements), n, MaxTotalPanels)}
	}
	if n := len(st.Density.Panels); n > MaxDensityCounts {
		return &FieldError{Field: "density.panels", Err: fmt.Errorf("%d counts; at most %d", n, MaxDensityCounts)}
	}
	if n := len(st.Density.Nose); n > MaxDensityNose {
		return &FieldError{Field: "density.nose", Err: fmt.Errorf("%d values; at most %d", n, MaxDensityNose)}
	}
	for i, n := range st.Density.Panels {
		if n*len(st.Elements) > MaxTotalPanels {
			return &FieldError{Field: fmt.Sprintf("density.panels[%d]", i), Err: fmt.Errorf("%d panels on each of %d elements is more than %d in all", n, len(st.Elements), MaxTotalPanels)}
		}
		if n < MinPanels || n > MaxPanels {
			return &FieldError{Field: fmt.Sprintf("density.panels[%d]", i), Err: fmt.Errorf("%d is outside %d..%d", n, MinPanels, MaxPanels)}
		}
	}
	for i, v := range st.Density.Nose {
		if err := inRange(v, 0, 1); err != nil {
			return &FieldError{Field: fmt.Sprintf("density.nose[%d]", i), Err: err}
		}
	}
	return nil
}

func inRange(v, lo, hi float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ErrNonFinite
	}
	if v < lo || v > hi {
		return fmt.Errorf("%g is outside %g..%g", v, lo, hi)
	}
	return nil
}
