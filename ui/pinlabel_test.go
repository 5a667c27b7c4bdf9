package ui

import (
	"testing"

	"sectionbench/model"
)

func TestPinLabel(t *testing.T) {
	base := func() *model.Study {
		return &model.Study{
			Elements:  []model.StudyElement{{Name: "main", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 250}},
			Panelling: model.Panelling{Panels: 160, Spacing: model.SpacingCosine, Nose: 0.5, Tail: 0.2},
			Flow:      model.Flow{AlphaDeg: 4},
		}
	}
	cases := []struct {
		name string
		prev *model.Study
		edit func(*model.Study)
		want string
	}{
		{"first pin", nil, func(*model.Study) {}, "NACA 4412, N=160, cosine"},
		{"panel count", base(), func(s *model.Study) { s.Panelling.Panels = 80 }, "N=80"},
		{"count and law", base(), func(s *model.Study) {
			s.Panelling.Panels = 80
			s.Panelling.Spacing = model.SpacingUniform
		}, "N=80, uniform"},
		{"nose", base(), func(s *model.Study) { s.Panelling.Nose = 0.9 }, "nose 0.9"},
		{"alpha", base(), func(s *model.Study) { s.Flow.AlphaDeg = -2.5 }, "α=−2.5°"},
		{"section", base(), func(s *model.Study) { s.Elements[0].Section.Spec = "naca:0012" }, "NACA 0012"},
		{"file section", base(), func(s *model.Study) { s.Elements[0].Section.Spec = "sections/flap.dat" }, "flap.dat"},
		{"ground", base(), func(s *model.Study) { s.Ground = model.Ground{Enabled: true, ClearanceMM: 60} }, "ground 60 mm"},
		{"nothing", base(), func(*model.Study) {}, "N=160, cosine (unchanged)"},
	}
	for _, c := range cases {
		cur := base()
		c.edit(cur)
		if got := PinLabel(c.prev, cur); got != c.want {
			t.Errorf("%s: PinLabel = %q, want %q", c.name, got, c.want)
		}
	}
}
