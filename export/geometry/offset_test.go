package geometry

import (
	"errors"
	"math"
	"sectionbench/export/exporttest"
	"testing"

	"sectionbench/model"
)

func circle(r float64, n int) []model.Point {
	pts := make([]model.Point, n)
	for i := range pts {
		s, c := math.Sincos(2 * math.Pi * float64(i) / float64(n))
		pts[i] = model.Point{X: r * c, Y: r * s}
	}
	return pts
}

// TestOffsetCircle: the inward offset of a circle of radius R by t is the
// circle of radius R − t (exact). The mitre offset of the inscribed
// n-gon moves each edge by exactly t, so its vertices lie at
// R − t/cos(π/n) from the centre: the tolerance is that polygon error.
func TestOffsetCircle(t *testing.T) {
	for _, c := range []struct {
		name string
		r, d float64
		n    int
	}{
		{"spar tube", 20, 1.5, 720},
		{"thick skin", 50, 12, 400},
	} {
		o, err := InwardOffset(c.name, circle(c.r, c.n), c.d, model.Point{X: -c.r}, model.Point{X: c.r})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		if len(o.Points) != c.n || !math.IsNaN(o.TrimmedXC) {
			t.Errorf("%s: %d points, trimmed %g", c.name, len(o.Points), o.TrimmedXC)
		}
		tol := c.d*(1/math.Cos(math.Pi/float64(c.n))-1) + c.r*(1-math.Cos(math.Pi/float64(c.n))) + 1e-9
		for i, p := range o.Points {
			if e := math.Abs(p.Norm() - (c.r - c.d)); e > tol {
				t.Fatalf("%s: point %d at radius %.6f, want %.6f ± %.2g", c.name, i, p.Norm(), c.r-c.d, tol)
			}
		}
		if tol > 0.01 {
			t.Errorf("%s: polygon tolerance %.3g mm is coarser than the 0.01 mm outline tolerance", c.name, tol)
		}
	}
}

// TestOffsetRectangle: a w × h rectangle offset inwards by t is the
// (w − 2t) × (h − 2t) rectangle with the same centre (exact).
func TestOffsetRectangle(t *testing.T) {
	w, h, d := 120.0, 30.0, 2.5
	rect := []model.Point{{X: w, Y: 0}, {X: w, Y: h}, {X: 0, Y: h}, {X: 0, Y: 0}}
	o, err := InwardOffset("plate", rect, d, model.Point{X: 0, Y: h / 2}, model.Point{X: w, Y: h / 2})
	if err != nil {
		t.Fatal(err)
	}
	want := []model.Point{{X: w - d, Y: d}, {X: w - d, Y: h - d}, {X: d, Y: h - d}, {X: d, Y: d}}
	if len(o.Points) != 4 {
		t.Fatalf("%d points", len(o.Points))
	}
	for i := range want {
		if o.Points[i].Dist(want[i]) > 1e-12 {
			t.Errorf("corner %d = %v, want %v", i, o.Points[i], want[i])
		}
	}
}

// TestOffsetSectionTrailingEdge: a NACA 0012 at 250 mm with a 1.5 mm skin
// ends short of its sharp trailing edge where the thickness is 2 × 1.5 mm;
// every offset point lies at least the skin inside the contour.
func TestOffsetSectionTrailingEdge(t *testing.T) {
	const c, d = 250.0, 1.5
	unit := exporttest.NACA00XX(0.12, 200)
	pts := make([]model.Point, len(unit)-1) // closed: drop the repeat
	for i := range pts {
		pts[i] = unit[i].Scale(c)
	}
	o, err := InwardOffset("main", pts, d, model.Point{}, model.Point{X: c})
	if err != nil {
		t.Fatal(err)
	}
	// Where is the full thickness 3 mm? Thickness 2·y_t(x) from the same
	// closed form (Abbott & von Doenhoff eq. 6.2); the offset ends a little
	// ahead of it because the surfaces slope.
	half := func(x float64) float64 {
		return 5 * 0.12 * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x - 0.1036*x*x*x*x)
	}
	lo, hi := 0.5, 1.0
	for range 60 {
		m := (lo + hi) / 2
		if 2*half(m)*c > 2*d {
			lo = m
		} else {
			hi = m
		}
	}
	if !(o.TrimmedXC > lo-0.02 && o.TrimmedXC <= lo+1e-3) {
		t.Errorf("offset ends at x/c %.4f, want just ahead of %.4f where the section is %g mm thick", o.TrimmedXC, lo, 2*d)
	}
	for i, p := range o.Points {
		if dist := distToEdges(p, pts); dist < d-1e-6 {
			t.Fatalf("offset point %d is %.4f mm from the contour, less than the skin", i, dist)
		}
	}
	if model.PolygonArea(o.Points) <= 0 {
		t.Error("offset is not counter-clockwise")
	}
}

func TestOffsetErrors(t *testing.T) {
	for _, c := range []struct {
		name    string
		pts     []model.Point
		d       float64
		wantErr error
		wantXC  float64 // where, ± 0.05
	}{
		{"thin plate collapses", []model.Point{{X: 100, Y: 0}, {X: 100, Y: 2}, {X: 0, Y: 2}, {X: 0, Y: 0}}, 1.5, ErrOffsetCollapses, -1},
	} {
		_, err := InwardOffset(c.name, c.pts, c.d, model.Point{}, model.Point{X: 100})
		var oe *OffsetError
		if !errors.As(err, &oe) {
			t.Errorf("%s: error %v is not an *OffsetError", c.name, err)
			continue
		}
		if !errors.Is(err, c.wantErr) {
			t.Errorf("%s: %v does not wrap %v", c.name, err, c.wantErr)
		}
		if oe.Element != c.name {
			t.Errorf("%s: element %q", c.name, oe.Element)
		}
		if c.wantXC >= 0 && math.Abs(oe.XC-c.wantXC) > 0.05 {
			t.Errorf("%s: reported at x/c %.3f, want about %.2f (%v)", c.name, oe.XC, c.wantXC, err)
		}
		t.Logf("%s: %v", c.name, err)
	}
}

// A skin thicker than the nose radius is trimmed, not refused: the moved
// edges round the nose run backwards and close a loop that is cut out, and
// the offset ends in a point where the offsets of the two flanks meet. For
// noseSection's straight flanks y = ±(x + 1)/2, which meet at (−1, 0) with
// half-angle atan(1/2), that point lies d/sin(atan(1/2)) = d√5 from the
// apex along the axis (the wedge closed form of TestOffsetSharpWedge), as
// long as it stays nearer the flanks than the 1 mm nose arc.
func TestOffsetNoseRadiusBelowSkin(t *testing.T) {
	for _, c := range []struct {
		name string
		d    float64
		tol  float64 // mm; the flank panels are 1 mm long, the offset exact on them
	}{
		{"1.5 mm skin on a 1 mm nose", 1.5, 1e-6},
		{"3 mm skin on a 1 mm nose", 3, 1e-6},
	} {
		pts := noseSection()
		o, err := InwardOffset(c.name, pts, c.d, model.Point{}, model.Point{X: 100})
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		front := math.Inf(1)
		for _, p := range o.Points {
			front = math.Min(front, p.X)
		}
		if want := -1 + c.d*math.Sqrt(5); math.Abs(front-want) > c.tol {
			t.Errorf("%s: offset starts at x = %.6f mm, want %.6f (d√5 behind the flanks' apex)", c.name, front, want)
		}
		if !(o.LoopCutXC >= 0 && o.LoopCutXC < 0.1) {
			t.Errorf("%s: loop cut at x/c %g, want at the nose", c.name, o.LoopCutXC)
		}
		checkInside(t, c.name, o, pts, c.d, 1e-6)
	}
}

// noseSection is a 100 mm bullet-like section 20 mm thick with a 1 mm
// nose radius: a circular nose of radius 1 joined to flanks of slope 1/2
// that reach y = ±10 at x = 19, then run straight to a blunt tail.
// Thicker than twice the 1.5 mm skin from x = 2 mm on, so only the nose
// radius can make the offset fold.
func noseSection() []model.Point {
	flank := func(x float64) float64 { return math.Min(1+0.5*(x-1), 10) }
	var pts []model.Point
	pts = append(pts, model.Point{X: 100, Y: -10}, model.Point{X: 100, Y: 10})
	for i := 1; i <= 100; i++ { // upper flank to the nose
		x := 100 - float64(i)*99/100
		pts = append(pts, model.Point{X: x, Y: flank(x)})
	}
	for i := 1; i < 40; i++ { // nose arc, centre (1, 0), radius 1
		a := math.Pi/2 + math.Pi*float64(i)/40
		pts = append(pts, model.Point{X: 1 + math.Cos(a), Y: math.Sin(a)})
	}
	for i := 0; i < 100; i++ { // lower flank
		x := 1 + float64(i)*99/100
		pts = append(pts, model.Point{X: x, Y: -flank(x)})
	}
	return pts
}
