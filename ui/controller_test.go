package ui

import (
	"testing"

	"sectionbench/model"
)

func TestEqualGeometry(t *testing.T) {
	cases := []struct {
		name string
		edit func(*model.Study)
		want bool
	}{
		{"same", func(*model.Study) {}, true},
		{"angle", func(s *model.Study) { s.Flow.AlphaDeg = 9 }, true},
		{"sweep range", func(s *model.Study) { s.Sweep.ToDeg = 20 }, true},
		{"name", func(s *model.Study) { s.Name = "other" }, true},
		{"pins", func(s *model.Study) { s.Pins = []model.Pin{{Label: "x"}} }, true},
		{"panels", func(s *model.Study) { s.Panelling.Panels = 90 }, false},
		{"section", func(s *model.Study) { s.Elements[0].Section.Spec = "naca:0012" }, false},
		{"ground", func(s *model.Study) { s.Ground.Enabled = true }, false},
		{"inverted", func(s *model.Study) { s.Inverted = !s.Inverted }, false},
	}
	for _, c := range cases {
		a := model.NewStudy()
		b := a.Clone()
		c.edit(b)
		if got := equalGeometry(a, b); got != c.want {
			t.Errorf("%s: equalGeometry = %v, want %v", c.name, got, c.want)
		}
	}
}
