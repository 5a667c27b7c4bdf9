package model

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// TestStudyMessagesInWords: a study with a byte-order mark loads (it
// failed with "invalid character 'ï'"); wrong types are named by their
// field path with element indexes (elements[1].chord_mm, not
// elements.chord_mm) and in words, never as a Go type.
func TestStudyMessagesInWords(t *testing.T) {
	const head = `{"format": "sectionbench-study", "version": 2, "name": "w", `
	ok := head + `"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}]}`
	if _, err := DecodeStudy([]byte("\ufeff" + ok)); err != nil {
		t.Errorf("a study with a byte-order mark: %v", err)
	}
	for _, tc := range []struct {
		name, study, field, words string
	}{
		{"top-level list", `[{"format": "sectionbench-study"}]`, "(the whole file)", "a list where an object is wanted"},
		{"section a number", head + `"elements": [{"name": "main", "section": 42, "chord_mm": 250}]}`, "elements[0].section", "a number; a section is a section spec"},
		{"second element's chord", head + `"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}, {"name": "f", "section": "naca:4412", "chord_mm": true}]}`, "elements[1].chord_mm", "true or false where a number is wanted"},
		{"version as text", `{"format": "sectionbench-study", "version": "2"}`, "version", "text where a whole number is wanted"},
		{"unknown field in an element", head + `"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250, "wing": 1}]}`, "elements[0].wing", "unknown field"},
		{"embedded name a number", head + `"elements": [{"name": "main", "section": {"name": 3, "points": []}, "chord_mm": 250}]}`, "elements[0].section", "name: a number where text is wanted"},
		{"pin point as text", head + `"elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}], "pins": [{"label": "p", "cp": [{"element": "m", "side": "u", "points": [[1, "a"]]}], "polar": []}]}`, "pins[0].cp[0].points[0][1]", "text where a number is wanted"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := DecodeStudy([]byte(tc.study))
			var fe *FieldError
			if !errors.As(err, &fe) || fe.Field != tc.field || !strings.Contains(err.Error(), tc.words) {
				t.Fatalf("error %v, want field %s saying %q", err, tc.field, tc.words)
			}
			for _, goWord := range []string{"struct", "float64", "int64", " int", "model.", "string"} {
				if strings.Contains(err.Error(), goWord) {
					t.Errorf("message %q names a Go type (%s)", err, goWord)
				}
			}
		})
	}
}

// TestNonFiniteFieldSaysNoCoordinate: a field that is not finite (an
// angle, a Reynolds number, a trip, the air, a Kármán–Trefftz parameter)
// is "not a finite number", still ErrNonFinite for errors.Is, and is not
// called a coordinate (it was "flow.alpha_deg: coordinate is not a finite
// number", and so the command line's "--alpha: coordinate is …").
func TestNonFiniteFieldSaysNoCoordinate(t *testing.T) {
	nan := math.NaN()
	valid := func(edit func(*Study)) error {
		st := NewStudy()
		st.Elements = []StudyElement{{Name: "main", Section: SectionSource{Spec: "naca:0012"}, ChordMM: 250}}
		edit(st)
		return st.Validate()
	}
	for _, tc := range []struct {
		name, field string
		err         error
	}{
		{"angle of attack", "flow.alpha_deg", valid(func(st *Study) { st.Flow.AlphaDeg = nan })},
		{"Reynolds number", "flow.reynolds", valid(func(st *Study) { st.Flow.Reynolds = math.Inf(1) })},
		{"upper trip", "viscous.trip_upper", valid(func(st *Study) { st.Viscous.TripUpper = nan })},
		{"chord", "elements[0].chord_mm", valid(func(st *Study) { st.Elements[0].ChordMM = nan })},
		{"sweep step", "sweep.step_deg", valid(func(st *Study) { st.Sweep.StepDeg = nan })},
		{"temperature", "flow.temperature_c", func() error { _, err := AirFromCelsius(nan, 101325); return err }()},
		{"Kármán–Trefftz centre", "kt.cy", KarmanTrefftz{CenterX: -0.1, CenterY: nan, TEAngleDeg: 10}.validateMap()},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var fe *FieldError
			if !errors.As(tc.err, &fe) || fe.Field != tc.field {
				t.Fatalf("error %v, want field %s", tc.err, tc.field)
			}
			if !errors.Is(tc.err, ErrNonFinite) {
				t.Errorf("error %v does not match ErrNonFinite", tc.err)
			}
			if want := tc.field + ": not a finite number"; tc.err.Error() != want {
				t.Errorf("message %q, want %q", tc.err, want)
			}
		})
	}
	// A coordinate keeps its word.
	if _, err := NewSection("x", []Point{{1, 0}, {0.5, nan}, {0, 0}, {0.5, -0.1}, {1, 0}}); err == nil || !strings.Contains(err.Error(), "coordinate is not a finite number") {
		t.Errorf("a NaN coordinate: %v, want it called a coordinate", err)
	}
}
