package geometry

import (
	"errors"
	"math"
	"sectionbench/export/exporttest"
	"testing"

	"sectionbench/model"
)

// TestOutlineTemplates: unplaced elements lie on their chord lines, leading
// edge at x = 0, trailing edge at x = chord, stacked without overlap, and
// a mark sits at its chord fraction.
func TestOutlineTemplates(t *testing.T) {
	l := exporttest.TwoElementLayout(80)
	o, err := NewOutline("demo", l, OutlineOptions{GapMM: 15, Marks: []Mark{{Element: 1, XC: 0.25, YC: 0.01, DiameterMM: 4}}})
	if err != nil {
		t.Fatal(err)
	}
	prevMin := math.Inf(1)
	for i, e := range o.Elements {
		c := l.Elements[i].Chord * 1000
		if math.Abs(e.LE.X) > 1e-9 || math.Abs(e.TE.X-c) > 1e-6 || math.Abs(e.TE.Y-e.LE.Y) > 1e-6 {
			t.Errorf("element %d: chord line %v–%v, want (0, y)–(%g, y)", i, e.LE, e.TE, c)
		}
		if model.PolygonArea(e.Contour) <= 0 {
			t.Errorf("element %d is not counter-clockwise", i)
		}
		ymin, ymax := math.Inf(1), math.Inf(-1)
		for _, p := range e.Contour {
			ymin, ymax = math.Min(ymin, p.Y), math.Max(ymax, p.Y)
		}
		if i > 0 && math.Abs(prevMin-ymax-15) > 1e-6 {
			t.Errorf("element %d: gap %g mm, want 15", i, prevMin-ymax)
		}
		prevMin = ymin
	}
	m := o.Elements[1].Marks[0]
	want := o.Elements[1].LE.Add(model.Point{X: 25, Y: 1})
	if m.Centre.Dist(want) > 1e-6 {
		t.Errorf("mark at %v, want %v", m.Centre, want)
	}
}

func TestOutlineErrors(t *testing.T) {
	l := exporttest.TwoElementLayout(80)
	for _, c := range []struct {
		name  string
		opt   OutlineOptions
		field string
	}{
		{"negative skin", OutlineOptions{SkinMM: -1}, "outline.skin_mm"},
		{"mark on a missing element", OutlineOptions{Marks: []Mark{{Element: 2, DiameterMM: 3}}}, "outline.marks[0].element"},
		{"mark without size", OutlineOptions{Marks: []Mark{{Element: 0}}}, "outline.marks[0].diameter_mm"},
	} {
		_, err := NewOutline("demo", l, c.opt)
		var fe *model.FieldError
		if !errors.As(err, &fe) || fe.Field != c.field {
			t.Errorf("%s: error %v, want field %s", c.name, err, c.field)
		}
	}
	if _, err := NewOutline("empty", &model.Layout{}, OutlineOptions{}); !errors.Is(err, ErrNoElements) {
		t.Errorf("empty layout: error %v does not wrap ErrNoElements", err)
	}
	// A 3 mm skin is thinner than the main plane's nose radius, 1.1019 t² c
	// = 3.97 mm for t = 0.12, c = 250 mm, and thicker than the flap's,
	// 1.10 mm for t = 0.10, c = 100 mm (Abbott & von Doenhoff, Theory of
	// Wing Sections, 1959, eq. 6.3): the flap's offset is trimmed at the
	// nose (within its coarse first panels, x/c < 0.1), not refused, the
	// main plane's needs no trim, and both keep the skin everywhere.
	o, err := NewOutline("demo", l, OutlineOptions{SkinMM: 3})
	if err != nil {
		t.Fatalf("3 mm skin: %v", err)
	}
	for _, e := range o.Elements {
		wantCut := e.Name == "flap"
		if cut := !math.IsNaN(e.Inner.LoopCutXC); cut != wantCut || e.Inner.LoopCutXC > 0.1 {
			t.Errorf("3 mm skin, %s: loop cut at x/c %g, want a cut %v at the nose", e.Name, e.Inner.LoopCutXC, wantCut)
		}
		checkInside(t, e.Name, e.Inner, e.Contour, 3, 1e-6)
	}
	var oe *OffsetError
	// The flap alone, 10 mm thick, with a 5.5 mm skin: an *OffsetError
	// naming the flap.
	_, err = NewOutline("demo", &model.Layout{Elements: l.Elements[1:]}, OutlineOptions{SkinMM: 5.5})
	if !errors.As(err, &oe) || oe.Element != "flap" {
		t.Errorf("5.5 mm skin: error %v, want an *OffsetError for the flap", err)
	}
}
