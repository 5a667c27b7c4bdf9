package model

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"reflect"
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
	// MaxEndPlateHeightMM bounds an end plate's height (10 m): generous,
	// like the others.
	MaxEndPlateHeightMM = 10000
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
		Viscous:   Viscous{Mode: ViscousCoupled},
		Pins:      []Pin{},
	}
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
	// A UTF-8 byte-order mark, as some editors write, is not part of the
	// JSON (the coordinate loader accepts it too).
	b = bytes.TrimPrefix(b, []byte("\ufeff"))
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
	// An absent viscous mode is the one-way estimate a study saved before
	// the coupled solution meant, not NewStudy's coupled default.
	st.Viscous = Viscous{}
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(st); err != nil {
		var se *sectionSourceError
		if errors.As(err, &se) {
			return nil, sectionFieldError(b, se)
		}
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
// field is known (its path with element indexes, found from the error's
// offset), otherwise into an error naming the line. Messages name JSON
// kinds in words, never Go types.
func jsonFieldError(b []byte, err error) error {
	var te *json.UnmarshalTypeError
	if errors.As(err, &te) {
		f := jsonPathAt(b, te.Offset)
		if f == "" {
			f = te.Field
		}
		if f == "" {
			f = "(the whole file)"
		}
		return &FieldError{Field: f, Err: fmt.Errorf("%s where %s is wanted", jsonKind(te.Value), goKind(te.Type))}
	}
	var se *json.SyntaxError
	if errors.As(err, &se) {
		line := 1 + bytes.Count(b[:min(int(se.Offset), len(b))], []byte("\n"))
		return fmt.Errorf("study: line %d: %v", line, se)
	}
	if msg := err.Error(); strings.HasPrefix(msg, "json: unknown field ") {
		name := strings.Trim(strings.TrimPrefix(msg, "json: unknown field "), `"`)
		f := jsonPathOfKey(b, name)
		if f == "" {
			f = name
		}
		return &FieldError{Field: f, Err: errors.New("unknown field")}
	}
	return fmt.Errorf("study: %w", err)
}

// sectionSourceError is a section that is neither a spec string nor an
// embedded {"name", "points"} object.
type sectionSourceError struct{ err error }

func (e *sectionSourceError) Error() string {
	return "must be a section spec (text such as \"naca:4412\") or {\"name\", \"points\"}"
}

func (e *sectionSourceError) Unwrap() error { return e.err }

// sectionFieldError names the element whose section could not be read
// (encoding/json reports a custom decoder's error without its place).
func sectionFieldError(b []byte, se *sectionSourceError) error {
	var doc struct {
		Elements []struct {
			Section json.RawMessage `json:"section"`
		} `json:"elements"`
	}
	field := "elements[].section"
	if json.Unmarshal(b, &doc) == nil {
		for i, e := range doc.Elements {
			var src SectionSource
			if src.UnmarshalJSON(e.Section) != nil {
				field = fmt.Sprintf("elements[%d].section", i)
				break
			}
		}
	}
	what := se.Error()
	var te *json.UnmarshalTypeError
	if errors.As(se.err, &te) && te.Field == "" {
		what = fmt.Sprintf("%s; a section is %s", jsonKind(te.Value), strings.TrimPrefix(what, "must be "))
	} else if errors.As(se.err, &te) {
		what = fmt.Sprintf("%s: %s where %s is wanted", te.Field, jsonKind(te.Value), goKind(te.Type))
	} else if msg := se.err.Error(); strings.HasPrefix(msg, "json: unknown field ") {
		what = strings.TrimPrefix(msg, "json: ") + "; " + what
	}
	return &FieldError{Field: field, Err: errors.New(what)}
}

// jsonKind names a JSON value kind as encoding/json reports it.
func jsonKind(v string) string {
	switch {
	case v == "string":
		return "text"
	case v == "number" || strings.HasPrefix(v, "number "):
		return "a number"
	case v == "bool":
		return "true or false"
	case v == "array":
		return "a list"
	case v == "object":
		return "an object"
	}
	return v
}

// goKind names what a Go type holds in JSON words.
func goKind(t reflect.Type) string {
	if t == nil {
		return "another kind of value"
	}
	switch t.Kind() {
	case reflect.String:
		return "text"
	case reflect.Bool:
		return "true or false"
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64, reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64:
		return "a whole number"
	case reflect.Float32, reflect.Float64:
		return "a number"
	case reflect.Slice, reflect.Array:
		return "a list"
	case reflect.Struct, reflect.Map, reflect.Pointer:
		return "an object"
	}
	return "another kind of value"
}

// jsonPathAt returns the path (elements[1].chord_mm) of the value of b
// that ends at or after offset, "" if none: encoding/json gives a wrong
// type's offset but drops the indexes from its field path.
func jsonPathAt(b []byte, offset int64) string {
	return jsonWalk(b, func(key string, end int64) bool { return key == "" && end >= offset })
}

// jsonPathOfKey returns the path of the first member named key, "" if
// none: encoding/json names an unknown field without its place.
func jsonPathOfKey(b []byte, key string) string {
	return jsonWalk(b, func(k string, _ int64) bool { return k == key })
}

// jsonWalk walks b's tokens keeping the path, and returns the path at
// the first point where stop says so: called with each member name (and
// the offset after it), and with "" at the end of each value.
func jsonWalk(b []byte, stop func(key string, end int64) bool) string {
	type frame struct {
		array    bool
		index    int
		key      string
		wantsKey bool
	}
	var stack []frame
	path := func() string {
		var sb strings.Builder
		for _, f := range stack {
			if f.array {
				fmt.Fprintf(&sb, "[%d]", f.index)
			} else if f.key != "" {
				if sb.Len() > 0 {
					sb.WriteByte('.')
				}
				sb.WriteString(f.key)
			}
		}
		return sb.String()
	}
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.UseNumber()
	for {
		tok, err := dec.Token()
		if err != nil {
			return ""
		}
		top := len(stack) - 1
		if d, ok := tok.(json.Delim); ok && (d == '}' || d == ']') {
			stack = stack[:top]
			if len(stack) > 0 && stop("", dec.InputOffset()) {
				return path()
			}
			if top > 0 && !stack[top-1].array {
				stack[top-1].wantsKey = true
			}
			continue
		}
		if top >= 0 && !stack[top].array && stack[top].wantsKey {
			stack[top].key, _ = tok.(string)
			stack[top].wantsKey = false
			if stop(stack[top].key, dec.InputOffset()) {
				return path()
			}
			continue
		}
		if top >= 0 && stack[top].array {
			stack[top].index++
		}
		if d, ok := tok.(json.Delim); ok {
			if stop("", dec.InputOffset()) {
				return path()
			}
			stack = append(stack, frame{array: d == '[', index: -1, wantsKey: d == '{'})
			continue
		}
		if stop("", dec.InputOffset()) {
			return path()
		}
		if top >= 0 && !stack[top].array {
			stack[top].wantsKey = true
		}
	}
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
		{"flow.end_plate_height_mm", fl.EndPlateHeightMM, 0, MaxEndPlateHeightMM},
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
		return errNotFinite
	}
	if v < lo || v > hi {
		return fmt.Errorf("%g is outside %g..%g", v, lo, hi)
	}
	return nil
}
