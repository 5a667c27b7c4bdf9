package session

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
		{"speed", base(), func(s *model.Study) { s.Flow.SpeedMPS = 25 }, "90 km/h"},
		{"viscous", base(), func(s *model.Study) { s.Viscous.Enabled = true }, "boundary layer on"},
		{"main angle", base(), func(s *model.Study) { s.Elements[0].AngleDeg = 3 }, "main 3°"},
	}
	for _, c := range cases {
		cur := base()
		c.edit(cur)
		if got := PinLabel(c.prev, cur); got != c.want {
			t.Errorf("%s: PinLabel = %q, want %q", c.name, got, c.want)
		}
	}
}

// TestPinLabelFlap: two flap settings pinned one after the other are named
// by the flap's deflection and its gap (model.Slot, with the sections).
func TestPinLabelFlap(t *testing.T) {
	sec, err := model.NACA("4412", model.NACAOptions{})
	if err != nil {
		t.Fatal(err)
	}
	secs := []*model.Section{sec, sec}
	prev := model.NewStudy()
	prev.Elements = append(prev.Elements, model.StudyElement{Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 120})
	if err := prev.PlaceSlot(1, sec, model.Slot{GapMM: 8, OverlapMM: 5, DeflectionDeg: 15}); err != nil {
		t.Fatal(err)
	}
	cur := prev.Clone()
	if err := cur.PlaceSlot(1, sec, model.Slot{GapMM: 10, OverlapMM: 5, DeflectionDeg: 25}); err != nil {
		t.Fatal(err)
	}
	if got, want := pinLabel(prev, cur, secs, secs), "flap deflection 25°, flap gap 10 mm"; got != want {
		t.Errorf("pinLabel = %q, want %q", got, want)
	}
}

// TestChangeLabel: what a step of the history sets, named with the values
// it sets, at most two settings before "…"; a change the pin label does
// not name (the sweep, the name) is named too.
func TestChangeLabel(t *testing.T) {
	base := model.NewStudy()
	for _, c := range []struct {
		name string
		edit func(*model.Study)
		want string
	}{
		{"nothing", func(*model.Study) {}, ""},
		{"angle", func(s *model.Study) { s.Flow.AlphaDeg = 6 }, "α=6°"},
		{"sweep", func(s *model.Study) { s.Sweep.FromDeg, s.Sweep.ToDeg = -2, 12 }, "sweep −2° to 12°"},
		{"name", func(s *model.Study) { s.Name = "rear" }, "name “rear”"},
		{"three at once", func(s *model.Study) { s.Flow.AlphaDeg = 6; s.Panelling.Panels = 200; s.Name = "rear" }, "N=200, α=6°, …"},
	} {
		t.Run(c.name, func(t *testing.T) {
			to := base.Clone()
			c.edit(to)
			if got := changeLabel(base, to, nil, nil); got != c.want {
				t.Errorf("got %q, want %q", got, c.want)
			}
		})
	}
}

// TestChangeLabelSlotNoise: a flap's slot quantity is named only where it
// differs as the label writes it. Applying a searched deflection kept the
// gap to within 2e-5 mm, and the Edit menu read "Undo (back to flap
// deflection 15°, flap gap 2.231 mm)", naming a gap that had not changed.
func TestChangeLabelSlotNoise(t *testing.T) {
	base := model.NewStudy()
	base.AppendFlap("flap")
	fp := base.FlapPlacementOf(1)
	for _, c := range []struct {
		name string
		edit func(*model.FlapPlacement)
		want string
	}{
		{"gap noise", func(f *model.FlapPlacement) { f.GapMM += 2e-5 }, "elements"}, // the fallback: something changed
		{"deflection, gap noise", func(f *model.FlapPlacement) { f.DeflectionDeg += 3; f.GapMM += 2e-5 }, "flap deflection " + Number(fp.DeflectionDeg+3) + "°"},
		{"gap", func(f *model.FlapPlacement) { f.GapMM += 1 }, "flap gap"},
	} {
		t.Run(c.name, func(t *testing.T) {
			to := base.Clone()
			f := fp
			c.edit(&f)
			to.PlaceFlapAt(1, f)
			if got := changeLabel(base, to, nil, nil); got != c.want {
				t.Errorf("got %q, want %q", got, c.want)
			}
		})
	}
}
