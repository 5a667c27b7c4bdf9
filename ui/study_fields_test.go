package ui

import (
	"context"
	"reflect"
	"slices"
	"sort"
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// studyField declares what one study field means to the three places that
// must know every field: the engine's geometry cache (which fields re-place
// the configuration), equalGeometry (which fields leave a sweep valid) and
// fieldLabel (how an error on the field is named).
type studyField struct {
	path       string             // JSON path, elements as elements[0]
	edit       func(*model.Study) // a valid change of the field
	placed     bool               // the engine places the configuration anew
	sweepHolds bool               // a sweep of the old study still holds
	label      string             // fieldLabel's name; "" if errors on it keep the path
}

// studyFields is the one declaration of the study's fields. A field added
// to model.Study fails TestStudyFieldRegistries until it is declared here,
// and a declaration that the engine, equalGeometry or fieldLabel disagrees
// with fails it too, so that a new field cannot silently reuse a stale
// layout or a stale sweep.
var studyFields = []studyField{
	{"format", nil, false, true, ""},
	{"version", nil, false, true, ""},
	{"name", func(s *model.Study) { s.Name = "renamed" }, false, true, ""},
	{"team", func(s *model.Study) { s.Team = "another team" }, false, true, ""},
	{"elements[0].name", func(s *model.Study) { s.Elements[0].Name = "main plane" }, true, false, ""},
	{"elements[0].section", func(s *model.Study) { s.Elements[0].Section = model.SectionSource{Spec: "naca:2412"} }, true, false, "Element 1 section"},
	{"elements[0].chord_mm", func(s *model.Study) { s.Elements[0].ChordMM = 300 }, true, false, "Element 1 chord"},
	{"elements[0].x_mm", func(s *model.Study) { s.Elements[0].XMM = 10 }, true, false, "Element 1 leading edge x"},
	{"elements[0].y_mm", func(s *model.Study) { s.Elements[0].YMM = 10 }, true, false, "Element 1 leading edge y"},
	{"elements[0].angle_deg", func(s *model.Study) { s.Elements[0].AngleDeg = 2 }, true, false, "Element 1 setting angle"},
	{"panelling.panels", func(s *model.Study) { s.Panelling.Panels = 120 }, true, false, "Panel count"},
	{"panelling.spacing", func(s *model.Study) { s.Panelling.Spacing = model.SpacingUniform }, true, false, ""},
	{"panelling.nose", func(s *model.Study) { s.Panelling.Nose = 0.9 }, true, false, "Nose clustering"},
	{"panelling.tail", func(s *model.Study) { s.Panelling.Tail = 0.9 }, true, false, "Tail clustering"},
	{"flow.alpha_deg", func(s *model.Study) { s.Flow.AlphaDeg = 2 }, false, true, "Angle of attack"},
	{"flow.speed_mps", func(s *model.Study) { s.Flow.SpeedMPS = 30 }, false, true, "Speed (m/s)"},
	{"flow.temperature_c", func(s *model.Study) { s.Flow.TemperatureC = 25 }, false, true, "Air temperature"},
	{"flow.pressure_pa", func(s *model.Study) { s.Flow.PressurePa = 95000 }, false, true, "Air pressure"},
	{"flow.span_m", func(s *model.Study) { s.Flow.SpanM = 1.2 }, false, true, "Span (m)"},
	{"flow.reynolds", func(s *model.Study) { s.Flow.Reynolds = 4e5 }, false, true, "Reynolds number"},
	{"flow.end_plate_height_mm", func(s *model.Study) { s.Flow.EndPlateHeightMM = 250 }, false, true, "End-plate height (mm)"},
	{"sweep.from_deg", func(s *model.Study) { s.Sweep.FromDeg = -2 }, false, true, "Sweep from"},
	{"sweep.to_deg", func(s *model.Study) { s.Sweep.ToDeg = 10 }, false, true, "Sweep to"},
	{"sweep.step_deg", func(s *model.Study) { s.Sweep.StepDeg = 2 }, false, true, "Sweep step"},
	{"ground.enabled", func(s *model.Study) { s.Ground.Enabled = true }, true, false, ""},
	{"ground.clearance_mm", func(s *model.Study) { s.Ground.ClearanceMM = 80 }, true, false, "Ground clearance"},
	{"inverted", func(s *model.Study) { s.Inverted = true }, true, false, ""},
	{"reference_chord_mm", func(s *model.Study) { s.ReferenceChordMM = 200 }, true, false, "Reference chord"},
	{"viscous.enabled", func(s *model.Study) { s.Viscous.Enabled = true }, false, false, "Viscous solution"},
	{"viscous.mode", func(s *model.Study) { s.Viscous.Mode = model.ViscousEstimate }, false, true, "Viscous solution"},
	{"viscous.transition_n", func(s *model.Study) { s.Viscous.TransitionN = 7 }, false, true, "Critical amplification N"},
	{"viscous.trip_upper", func(s *model.Study) { s.Viscous.TripUpper = 0.1 }, false, true, "Upper trip"},
	{"viscous.trip_lower", func(s *model.Study) { s.Viscous.TripLower = 0.1 }, false, true, "Lower trip"},
	{"viscous.separation_h", func(s *model.Study) { s.Viscous.SeparationH = 2.6 }, false, true, ""},
	{"density.panels", func(s *model.Study) { s.Density.Panels = []int{40, 80, 160} }, false, true, ""},
	{"density.nose", func(s *model.Study) { s.Density.Nose = []float64{0.5} }, false, true, ""},
	{"density.tol_cl_pct", func(s *model.Study) { s.Density.TolClPct = 1 }, false, true, ""},
	{"density.tol_cp_min_pct", func(s *model.Study) { s.Density.TolCpMinPct = 1 }, false, true, ""},
	{"pins", func(s *model.Study) { s.Pins = append(s.Pins, model.Pin{Label: "a pin"}) }, false, true, ""},
}

// studyPaths lists the JSON paths of t's fields: nested structs are
// followed, slices of structs by their first element (elements[0]), other
// slices and types that encode themselves are leaves.
func studyPaths(t reflect.Type, prefix string) []string {
	var out []string
	for f := range t.Fields() {
		name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if name == "" || name == "-" {
			continue
		}
		path := prefix + name
		ft := f.Type
		_, custom := reflect.New(ft).Interface().(interface{ UnmarshalJSON([]byte) error })
		switch {
		case custom:
			out = append(out, path)
		case ft.Kind() == reflect.Struct:
			out = append(out, studyPaths(ft, path+".")...)
		case ft.Kind() == reflect.Slice && ft.Elem().Kind() == reflect.Struct && name == "elements":
			out = append(out, studyPaths(ft.Elem(), path+"[0].")...)
		default:
			out = append(out, path)
		}
	}
	return out
}

func TestStudyFieldRegistries(t *testing.T) {
	var declared []string
	for _, f := range studyFields {
		declared = append(declared, f.path)
	}
	actual := studyPaths(reflect.TypeFor[model.Study](), "")
	sort.Strings(declared)
	sort.Strings(actual)
	if !slices.Equal(declared, actual) {
		for _, p := range actual {
			if !slices.Contains(declared, p) {
				t.Errorf("study field %s is not declared in studyFields: say whether it re-places the configuration, keeps a sweep and how its errors are named", p)
			}
		}
		for _, p := range declared {
			if !slices.Contains(actual, p) {
				t.Errorf("studyFields declares %s, which model.Study does not have", p)
			}
		}
	}

	base := model.NewStudy()
	base.Flow.Reynolds = 3e5 // so that the boundary layer can be turned on
	sections := func(st *model.Study) []*model.Section {
		var out []*model.Section
		for _, e := range st.Elements {
			sec, _, err := model.SectionFromSource(e.Section, nil)
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, sec)
		}
		return out
	}
	baseSecs := sections(base)
	for _, f := range studyFields {
		t.Run(f.path, func(t *testing.T) {
			want := f.label
			if want == "" {
				want = f.path
			}
			if got := fieldLabel(f.path); got != want {
				t.Errorf("fieldLabel = %q, declared %q", got, want)
			}
			if f.placed && f.sweepHolds {
				t.Errorf("declared to re-place the configuration yet keep its sweep")
			}
			if f.edit == nil {
				return // not a field the user edits
			}
			next := base.Clone()
			f.edit(next)
			if reflect.DeepEqual(next, base) {
				t.Fatal("the edit changes nothing")
			}
			if got := session.EqualGeometry(base, next); got != f.sweepHolds {
				t.Errorf("equalGeometry = %v, declared sweep holds %v", got, f.sweepHolds)
			}
			e := engine.NewEngine()
			r1, err := e.Run(context.Background(), engine.Request{Study: base, Sections: baseSecs})
			if err != nil {
				t.Fatal(err)
			}
			secs := baseSecs
			if next.Elements[0].Section != base.Elements[0].Section {
				secs = sections(next)
			}
			r2, err := e.Run(context.Background(), engine.Request{Study: next, Sections: secs})
			if err != nil {
				t.Fatal(err)
			}
			if placed := r1.Layout != r2.Layout; placed != f.placed {
				t.Errorf("the engine placed anew: %v, declared %v", placed, f.placed)
			}
		})
	}
}
