package session

import (
	"testing"

	"sectionbench/model"
)

func TestSameDensityCase(t *testing.T) {
	cases := []struct {
		name string
		edit func(*model.Study)
		want bool
	}{
		{"same", func(*model.Study) {}, true},
		{"panel count", func(s *model.Study) { s.Panelling.Panels = 240 }, true},
		{"nose clustering", func(s *model.Study) { s.Panelling.Nose = 0.8 }, true},
		{"plan", func(s *model.Study) { s.Density = model.DensityPlan{Panels: []int{40, 80}} }, true},
		{"pins", func(s *model.Study) { s.Pins = []model.Pin{{Label: "x"}} }, true},
		{"name and team", func(s *model.Study) { s.Name, s.Team = "other", "other" }, true},
		{"sweep range", func(s *model.Study) { s.Sweep.ToDeg = 20 }, true},
		{"angle", func(s *model.Study) { s.Flow.AlphaDeg = 7 }, false},
		{"tail clustering", func(s *model.Study) { s.Panelling.Tail = 0.7 }, false},
		{"spacing", func(s *model.Study) { s.Panelling.Spacing = model.Spacings[len(model.Spacings)-1] }, false},
		{"section", func(s *model.Study) { s.Elements[0].Section.Spec = "naca:0012" }, false},
		{"ground", func(s *model.Study) { s.Ground.Enabled = true }, false},
	}
	for _, c := range cases {
		a := model.NewStudy()
		b := a.Clone()
		c.edit(b)
		if got := SameDensityCase(a, b); got != c.want {
			t.Errorf("%s: SameDensityCase = %v, want %v", c.name, got, c.want)
		}
	}
}
