package model

import (
	"errors"
	"strings"
	"testing"
)

func TestStudyRoundTrip(t *testing.T) {
	st := twoElementStudy()
	st.Name = "Demo — fictional team"
	st.Flow.SpeedMPS = 25
	st.Ground = Ground{Enabled: true, ClearanceMM: 60}
	st.Inverted = true
	st.Elements[1].Section = EmbedSection(mustNACA(t, "0012"))
	st.Pins = []Pin{{Label: "N=80, cosine", Cp: []PinCurve{{Element: "main", Side: "upper", Points: [][2]float64{{0, 1}, {1, 0}}}}}}
	b, err := st.Encode()
	if err != nil {
		t.Fatal(err)
	}
	got, err := DecodeStudy(b)
	if err != nil {
		t.Fatal(err)
	}
	b2, _ := got.Encode()
	if string(b) != string(b2) {
		t.Errorf("study changed in a round trip:\n%s\n---\n%s", b, b2)
	}
	if got.Elements[1].Section.Embedded == nil || len(got.Elements[1].Section.Embedded.Points) != mustNACA(t, "0012").Len() {
		t.Error("embedded section lost")
	}
	c := got.Clone()
	c.Elements[0].ChordMM = 1
	if got.Elements[0].ChordMM == 1 {
		t.Error("Clone shares elements")
	}
}

// The documented example in the README loads.
func TestStudyReadmeExample(t *testing.T) {
	const doc = `{"format": "sectionbench-study", "version": 1, "name": "…",
   "elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250, "x_mm": 0, "y_mm": 0, "angle_deg": 0}],
   "panelling": {"panels": 160, "spacing": "cosine", "nose": 0.5, "tail": 0.2},
   "flow": {"alpha_deg": 4},
   "sweep": {"from_deg": -4, "to_deg": 12, "step_deg": 1},
   "pins": []}`
	st, err := DecodeStudy([]byte(doc))
	if err != nil {
		t.Fatal(err)
	}
	if st.Flow.TemperatureC != 15 || st.Flow.PressurePa != 101325 {
		t.Errorf("air defaults %g °C %g Pa, want ISA sea level", st.Flow.TemperatureC, st.Flow.PressurePa)
	}
}

func TestDecodeStudyErrors(t *testing.T) {
	good := `{"format": "sectionbench-study", "version": 1, "name": "x",
 "elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}],
 "panelling": {"panels": 160, "spacing": "cosine", "nose": 0.5, "tail": 0.2},
 "flow": {"alpha_deg": 4}, "sweep": {"from_deg": -4, "to_deg": 12, "step_deg": 1}}`
	for _, tc := range []struct {
		name, from, to string
		field          string // FieldError path, or "" for a non-field error
		contains       string
	}{
		{"wrong format", `"sectionbench-study"`, `"other"`, "format", "not"},
		{"future version", `"version": 1`, `"version": 7`, "version", "not supported"},
		{"wrong type", `"chord_mm": 250`, `"chord_mm": "big"`, "elements[0].chord_mm", "text where a number is wanted"},
		{"negative chord", `"chord_mm": 250`, `"chord_mm": -3`, "elements[0].chord_mm", "outside"},
		{"unknown field", `"name": "x",`, `"name": "x", "wingspan": 3,`, "wingspan", "unknown"},
		{"bad spacing", `"cosine"`, `"wavy"`, "panelling.spacing", "wavy"},
		{"too many panels", `"panels": 160`, `"panels": 5000`, "panelling.panels", "5000"},
		{"no elements", `[{"name": "main", "section": "naca:4412", "chord_mm": 250}]`, `[]`, "elements", "0 elements"},
		{"missing section", `"section": "naca:4412", `, ``, "elements[0].section", "missing"},
		{"NaN-like alpha", `"alpha_deg": 4`, `"alpha_deg": 1e999`, "", ""},
		{"syntax error names the line", `"flow": {"alpha_deg": 4}`, `"flow": {"alpha_deg": 4,}`, "", "line 4"},
		{"ground without clearance", `"flow"`, `"ground": {"enabled": true, "clearance_mm": 0}, "flow"`, "ground.clearance_mm", "positive"},
		{"embedded with too few points", `"section": "naca:4412"`, `"section": {"name": "a", "points": [[0,0],[1,0]]}`, "elements[0].section.points", "too few"},
		{"sweep backwards", `"to_deg": 12`, `"to_deg": -10`, "sweep.to_deg", "below"},
		{"unknown viscous mode", `"flow"`, `"viscous": {"enabled": true, "mode": "exact"}, "flow"`, "viscous.mode", "exact"},
		{"transition exponent too large", `"flow"`, `"viscous": {"enabled": true, "transition_n": 20}, "flow"`, "viscous.transition_n", "outside"},
		{"density list too long", `"flow"`, `"density": {"panels": [16,17,18,19,20,21,22,23,24,25,26,27,28]}, "flow"`, "density.panels", "at most"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			doc := strings.Replace(good, tc.from, tc.to, 1)
			if doc == good {
				t.Fatalf("test case does not change the document")
			}
			st, err := DecodeStudy([]byte(doc))
			if err == nil {
				t.Fatalf("accepted: %+v", st)
			}
			if st != nil {
				t.Error("half-loaded study returned with the error")
			}
			var fe *FieldError
			if tc.field != "" {
				if !errors.As(err, &fe) || fe.Field != tc.field {
					t.Errorf("error %q, want a FieldError on %q", err, tc.field)
				}
			}
			if !strings.Contains(err.Error(), tc.contains) {
				t.Errorf("error %q does not mention %q", err, tc.contains)
			}
		})
	}
	if _, err := DecodeStudy([]byte(good)); err != nil {
		t.Fatalf("the good document fails: %v", err)
	}
}

// Five elements at the per-element maximum would make an 800 MB system:
// the total is bounded too.
func TestStudyTotalPanels(t *testing.T) {
	st := twoElementStudy()
	st.Panelling.Panels = MaxPanels
	var fe *FieldError
	if err := st.Validate(); !errors.As(err, &fe) || fe.Field != "panelling.panels" {
		t.Errorf("2 × %d panels: %v, want a FieldError on panelling.panels", MaxPanels, err)
	}
	st.Panelling.Panels = MaxTotalPanels / 2
	if err := st.Validate(); err != nil {
		t.Errorf("2 × %d panels: %v", MaxTotalPanels/2, err)
	}
}

// A study saved before the coupled solution keeps its one-way estimate;
// one that says so gets the coupled solution, with the critical
// amplification exponent defaulting to 9.
func TestStudyViscousMode(t *testing.T) {
	const doc = `{"format": "sectionbench-study", "version": 2, "name": "x",
 "elements": [{"name": "main", "section": "naca:4412", "chord_mm": 250}],
 "panelling": {"panels": 160, "spacing": "cosine", "nose": 0.5, "tail": 0.2},
 "flow": {"alpha_deg": 4, "reynolds": 3e5}, "sweep": {"from_deg": -4, "to_deg": 12, "step_deg": 1},
 "viscous": {"enabled": true%s}}`
	for _, tc := range []struct {
		name, extra string
		coupled     bool
		n           float64
	}{
		{"absent: the estimate it was saved with", "", false, 9},
		{"estimate", `, "mode": "estimate"`, false, 9},
		{"coupled", `, "mode": "coupled", "transition_n": 4`, true, 4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st, err := DecodeStudy([]byte(strings.Replace(doc, "%s", tc.extra, 1)))
			if err != nil {
				t.Fatal(err)
			}
			if st.Viscous.IsCoupled() != tc.coupled || st.Viscous.CriticalN() != tc.n {
				t.Errorf("coupled %v, N %g; want %v, %g", st.Viscous.IsCoupled(), st.Viscous.CriticalN(), tc.coupled, tc.n)
			}
			b, err := st.Encode()
			if err != nil {
				t.Fatal(err)
			}
			again, err := DecodeStudy(b)
			if err != nil {
				t.Fatal(err)
			}
			if again.Viscous != st.Viscous {
				t.Errorf("round trip changed the viscous settings: %+v, then %+v", st.Viscous, again.Viscous)
			}
		})
	}
}
