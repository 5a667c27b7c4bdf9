package geometry

import (
	"errors"
	"math"
	"testing"

	"sectionbench/export/exporttest"
	"sectionbench/model"
)

// Spar holes are measured against the rib, the skin offset when there is
// one: the ligament is the distance from the hole's centre to the rib's
// edge less the radius. The 250 mm NACA 0012 main plane of
// exporttest.TwoElementLayout is 2·y_t = 2 × 15.00 mm thick at x/c = 0.3,
// y_t = 0.6 c (0.2969√x − 0.1260x − 0.3516x² + 0.2843x³ − 0.1036x⁴) with
// x = 0.3 (Abbott & von Doenhoff, Theory of Wing Sections, 1959, eq. 6.2,
// closed trailing edge), and flat there, so a hole on the chord line at
// 0.3c leaves 15.00 − skin − radius.
func TestHoleLigament(t *testing.T) {
	const half = 15.002 // mm, y_t above at x/c = 0.3, c = 250 mm
	l := exporttest.TwoElementLayout(120)
	for _, c := range []struct {
		name         string
		skin, dia    float64
		min          float64
		wantLigament float64 // NaN: accepted
		tol          float64 // mm; 60 cosine panels per surface cut the flat top by under 0.01 mm
	}{
		{"20 mm hole, 1.5 mm skin, 3 mm minimum: accepted", 1.5, 20, 3, math.NaN(), 0},
		{"20 mm hole, 1.5 mm skin, 4 mm minimum: refused", 1.5, 20, 4, half - 1.5 - 10, 0.02},
		{"30 mm hole, 1.5 mm skin: breaks out", 1.5, 30, 0, half - 1.5 - 15, 0.02},
		{"28 mm hole without skin, 2 mm minimum: refused", 0, 28, 2, half - 14, 0.02},
	} {
		_, err := NewOutline("demo", l, OutlineOptions{SkinMM: c.skin, MinLigamentMM: c.min,
			Marks: []Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: c.dia}}})
		if math.IsNaN(c.wantLigament) {
			if err != nil {
				t.Errorf("%s: %v", c.name, err)
			}
			continue
		}
		var he *HoleError
		if !errors.As(err, &he) {
			t.Errorf("%s: error %v, want a *HoleError", c.name, err)
			continue
		}
		if he.Element != "main" || he.Hole != "spar" || he.DiameterMM != c.dia {
			t.Errorf("%s: names element %q, hole %q, %g mm", c.name, he.Element, he.Hole, he.DiameterMM)
		}
		if math.Abs(he.LigamentMM-c.wantLigament) > c.tol {
			t.Errorf("%s: ligament %.3f mm, want %.3f", c.name, he.LigamentMM, c.wantLigament)
		}
		if want := c.min - c.wantLigament; math.Abs(he.ShortfallMM()-want) > c.tol {
			t.Errorf("%s: shortfall %.3f mm, want %.3f", c.name, he.ShortfallMM(), want)
		}
		t.Logf("%s: %v", c.name, err)
	}
}

// On a cambered section a spar on the chord line sits low; on the mean line
// it sits where the NACA mean line is: y_c = m/p² (2px − x²) = 0.0375 c at
// x = 0.3 for the 4412 (m = 0.04, p = 0.4; Abbott & von Doenhoff 1959,
// eq. 6.4), 4.5 mm on a 120 mm flap. The rib's chord runs from the
// geometric leading edge (the point farthest from the trailing edge, 0.37
// mm above the mean line's end), so the expected centre is the published
// mean-line point at 0.3 of that chord, measured normal to it. The
// thickness is laid normal to the mean line, whose slope there is 0.05, so
// the midpoint measured normal to the chord differs from it by less than
// 0.01 mm.
func TestHoleOnMeanLine(t *testing.T) {
	sec, err := model.NACA("4412", model.NACAOptions{ClosedTE: true})
	if err != nil {
		t.Fatal(err)
	}
	st := model.NewStudy()
	st.Elements[0].ChordMM = 120
	l, err := model.Place(st, []*model.Section{sec})
	if err != nil {
		t.Fatal(err)
	}
	// The published mean line in the layout's frame (mm), and the point
	// of it whose projection on the geometric chord is at 0.3.
	yc := func(x float64) float64 { x /= 120; return 120 * 0.04 / 0.16 * (0.8*x - x*x) }
	e := l.Elements[0]
	le, te := e.LeadingEdge.Scale(1000), e.TrailingEdge.Scale(1000)
	u := te.Sub(le).Scale(1 / te.Dist(le))
	x := 36.0
	for range 20 {
		p := model.Point{X: x, Y: yc(x)}
		x += 0.3*te.Dist(le) - p.Sub(le).Dot(u)
	}
	wantV := u.Cross(model.Point{X: x, Y: yc(x)}.Sub(le))
	for _, c := range []struct {
		name   string
		mean   bool
		wantY  float64
		tol    float64
		refuse bool
	}{
		{"chord line: 8 mm hole at 0.3c breaks out of a 1 mm skin", false, 0, 1e-9, true},
		{"mean line: same hole fits", true, wantV, 0.01, false},
	} {
		o, err := NewOutline("flap", l, OutlineOptions{SkinMM: 1, MinLigamentMM: 0.5,
			Marks: []Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8, OnMeanLine: c.mean}}})
		var he *HoleError
		if c.refuse {
			if !errors.As(err, &he) || he.LigamentMM >= 0 {
				t.Errorf("%s: error %v, want a hole breaking out", c.name, err)
			}
			continue
		}
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		m := o.Elements[0].Marks[0]
		if math.Abs(m.Centre.Y-c.wantY) > c.tol || math.Abs(m.Centre.X-0.3*te.Dist(le)) > 1e-9 {
			t.Errorf("%s: centre %v, want (%g, %g)", c.name, m.Centre, 0.3*te.Dist(le), c.wantY)
		}
	}
}

// The drawing puts each hole on the cut layer and its centre cross on the
// mark layer, the cross's arms inside the hole; every coordinate lies in
// the positive quadrant.
func TestDrawingHolesAndQuadrant(t *testing.T) {
	o, err := NewOutline("demo", exporttest.TwoElementLayout(120), OutlineOptions{SkinMM: 1, Placed: true,
		Marks: []Mark{{Element: 0, Label: "spar", XC: 0.3, DiameterMM: 8}, {Element: 1, Label: "pin", XC: 0.4, DiameterMM: 3}}})
	if err != nil {
		t.Fatal(err)
	}
	d := o.Drawing()
	cut, mark := d.Layer(LayerCut), d.Layer(LayerMark)
	if len(cut.Circles) != 2 {
		t.Fatalf("%d holes on the cut layer, want 2", len(cut.Circles))
	}
	for _, h := range cut.Circles {
		arms := 0
		for _, p := range mark.Paths {
			if len(p.Points) != 2 {
				continue
			}
			mid := p.Points[0].Add(p.Points[1]).Scale(0.5)
			if mid.Dist(h.Centre) > 1e-9 {
				continue
			}
			arms++
			for _, q := range p.Points {
				if q.Dist(h.Centre) > h.Radius {
					t.Errorf("hole at %v: cross reaches %v, past its edge", h.Centre, q)
				}
			}
		}
		if arms != 2 {
			t.Errorf("hole at %v: %d cross arms, want 2", h.Centre, arms)
		}
	}
	for _, l := range d.Layers {
		for _, p := range l.Paths {
			for _, q := range p.Points {
				if q.X < 0 || q.Y < 0 || q.X > d.Width || q.Y > d.Height {
					t.Errorf("%s: point %v outside 0..%g × 0..%g", l.Name, q, d.Width, d.Height)
				}
			}
		}
	}
}
