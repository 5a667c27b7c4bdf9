package geometry

import (
	"fmt"
	"math"
	"sectionbench/export/exporttest"
	"testing"

	"sectionbench/model"
)

// TestOffsetSharpWedge: a symmetric wedge of included angle τ, apex at
// (c, 0) on the bisector y = 0, offset inwards by d. The two offset lines
// are the surfaces moved d inwards; they meet on the bisector at the centre
// of the circle of radius d touching both surfaces, d/sin(τ/2) from the
// apex (plane geometry: the circle's centre, the apex and a point of
// contact form a right triangle with angle τ/2 at the apex). The wedge
// there is 2(d/sin(τ/2))·tan(τ/2) = 2d/cos(τ/2) thick; it is 2d thick
// d/tan(τ/2) from the apex. Closed (sharp) and open (a base e thinner than
// 2d cut off the apex) trailing edges end at the same point, and so do
// flanks of segments longer than d/sin(τ/2), where no edge is cut away and
// the end is the mitre point of the apex.
func TestOffsetSharpWedge(t *testing.T) {
	const c = 250.0
	for _, tc := range []struct {
		tauDeg, d float64
		openMM    float64 // trailing-edge base; 0 for a sharp apex
		segs      int     // segments per flank
		coarse    bool    // the apex segments outlast the cut: even spacing
	}{
		{5, 0.5, 0, 100, false}, {5, 3, 0, 100, false}, {10, 1.5, 0, 100, false},
		{15, 3, 0, 100, false}, {30, 1.5, 0, 100, false},
		{10, 1.5, 0.5, 100, false}, {15, 3, 1, 100, false},
		{30, 1.5, 0, 4, true}, {10, 1.5, 0, 1, true},
	} {
		name := fmt.Sprintf("τ %g°, skin %g mm, base %g mm, %d segments", tc.tauDeg, tc.d, tc.openMM, tc.segs)
		half := tc.tauDeg * math.Pi / 360
		spacing := 2.0
		if tc.coarse {
			spacing = 1
		}
		pts := wedge(c, half, tc.openMM, tc.segs, spacing)
		o, err := InwardOffset(name, pts, tc.d, model.Point{}, model.Point{X: c})
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		dist := tc.d / math.Sin(half) // apex to the end of the offset
		want := model.Point{X: c - dist}
		if got := o.Points[0]; got.Dist(want) > 1e-9*c {
			t.Errorf("%s: offset ends at %v, want %v", name, got, want)
		}
		if e := math.Abs(o.TrimmedXC - (1 - dist/c)); e > 1e-12 {
			t.Errorf("%s: TrimmedXC %.9f, want 1 − d/(c sin(τ/2)) = %.9f", name, o.TrimmedXC, 1-dist/c)
		}
		// The trim lies just ahead of where the wedge is 2d thick.
		if x2d := c - tc.d/math.Tan(half); !(o.TrimmedXC*c < x2d) {
			t.Errorf("%s: trim at x %.4f mm is not ahead of the 2d-thick station %.4f mm", name, o.TrimmedXC*c, x2d)
		}
		checkInside(t, name, o, pts, tc.d, 1e-9*c)
	}
}

// wedge returns the counter-clockwise outline of a symmetric wedge of
// chord c and half-angle half: apex at (c, 0) (or, when open > 0, a base of
// that height where the wedge is that thick), straight flanks of m
// segments each and a flat base at x = 0. The flank points lie at
// x = xt(1 − (i/m)^p), the apex at xt: p = 2 clusters them at the apex and
// keeps the segments at the base corners long, longer than the mitre there
// moves along them (d/tan(θ/2), θ = 90° − τ/2 the corner angle), so that
// only the trailing edge is cut.
func wedge(c, half, open float64, m int, p float64) []model.Point {
	xt := c
	if open > 0 {
		xt = c - open/2/math.Tan(half)
	}
	y := func(x float64) float64 { return (c - x) * math.Tan(half) }
	var pts []model.Point
	for i := 0; i <= m; i++ { // upper flank, trailing edge to x = 0
		x := xt * (1 - math.Pow(float64(i)/float64(m), p))
		pts = append(pts, model.Point{X: x, Y: y(x)})
	}
	for i := 0; i <= m; i++ { // lower flank back
		x := xt * (1 - math.Pow(float64(m-i)/float64(m), p))
		if open == 0 && i == m {
			break // the apex is pts[0]
		}
		pts = append(pts, model.Point{X: x, Y: -y(x)})
	}
	return pts
}

// TestOffsetKarmanTrefftzTrailingEdge: Kármán–Trefftz sections (Katz &
// Plotkin, Low-Speed Aerodynamics, 2nd ed., sec. 6.7) have a sharp
// trailing edge of included angle τ. At 250 mm chord their offsets by the
// skin end where the section is twice the skin thick, measured normal to
// the chord: a little ahead of it, since the end is the centre of a circle
// of radius d touching both surfaces and the section there is at least 2d
// thick along any line through that centre. The centres give sections
// about 12 % thick, with nose radii (about 1.1 t² c = 4 mm, Abbott & von
// Doenhoff, Theory of Wing Sections, 1959, eq. 6.3) above the thickest
// skin.
func TestOffsetKarmanTrefftzTrailingEdge(t *testing.T) {
	const (
		c = 250.0
		// tipTol: how far ahead of the 2d-thick station the offset may
		// end, as a fraction of chord. For a wedge it is d tan(τ/4)/c
		// (see TestOffsetSharpWedge), below 0.001 here; surface curvature
		// and chord-normal thickness of a cambered tip add a little.
		tipTol = 0.02
	)
	for _, k := range []model.KarmanTrefftz{
		{CenterX: -0.1, CenterY: 0, TEAngleDeg: 5},
		{CenterX: -0.1, CenterY: 0.05, TEAngleDeg: 5},
		{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 10},
		{CenterX: -0.1, CenterY: 0, TEAngleDeg: 15},
		{CenterX: -0.1, CenterY: 0.08, TEAngleDeg: 15},
	} {
		sec, err := k.Section(241)
		if err != nil {
			t.Fatal(err)
		}
		unit := sec.Points()
		pts := make([]model.Point, len(unit)-1) // closed: drop the repeat
		for i := range pts {
			pts[i] = unit[i].Scale(c)
		}
		leIdx := sec.LeadingEdgeIndex()
		for _, d := range []float64{0.5, 1.5, 3} {
			name := fmt.Sprintf("%v, skin %g mm", k, d)
			o, err := InwardOffset(name, pts, d, model.Point{}, model.Point{X: c})
			if err != nil {
				t.Errorf("%s: %v", name, err)
				continue
			}
			x2d := thicknessStation(unit, leIdx, 2*d/c)
			if !(o.TrimmedXC > x2d-tipTol && o.TrimmedXC <= x2d+1e-3) {
				t.Errorf("%s: offset ends at x/c %.4f, want just ahead of %.4f where the section is %g mm thick", name, o.TrimmedXC, x2d, 2*d)
			}
			checkInside(t, name, o, pts, d, 1e-6)
			t.Logf("%s: ends at x/c %.4f, 2d thick at %.4f", name, o.TrimmedXC, x2d)
		}
	}
}

// thicknessStation returns the x/c nearest the trailing edge at which the
// unit-chord section (closed, upper surface unit[0..leIdx], lower
// unit[leIdx..]) is t thick normal to the chord, by bisection on the
// linear interpolation of both surfaces between mid-chord and the trailing
// edge (where the thickness falls to 0).
func thicknessStation(unit []model.Point, leIdx int, t float64) float64 {
	upper := append([]model.Point(nil), unit[:leIdx+1]...)
	for i, j := 0, len(upper)-1; i < j; i, j = i+1, j-1 {
		upper[i], upper[j] = upper[j], upper[i]
	}
	lower := unit[leIdx:]
	thick := func(x float64) float64 { return interpY(upper, x) - interpY(lower, x) }
	lo, hi := 0.5, 1.0
	for range 60 {
		m := (lo + hi) / 2
		if thick(m) > t {
			lo = m
		} else {
			hi = m
		}
	}
	return lo
}

// interpY interpolates y at x on a polyline whose x increases.
func interpY(p []model.Point, x float64) float64 {
	for i := 1; i < len(p); i++ {
		if p[i].X >= x {
			a, b := p[i-1], p[i]
			return a.Y + (b.Y-a.Y)*(x-a.X)/(b.X-a.X)
		}
	}
	return p[len(p)-1].Y
}

// checkInside: every offset point lies inside the outline pts and at least
// d − tol from it, and the offset runs counter-clockwise without crossing
// itself.
func checkInside(t *testing.T, name string, o *Offset, pts []model.Point, d, tol float64) {
	t.Helper()
	for i, p := range o.Points {
		if !insidePolygon(p, pts) {
			t.Errorf("%s: offset point %d %v lies outside the outline", name, i, p)
			return
		}
		if dist := distToEdges(p, pts); dist < d-tol {
			t.Errorf("%s: offset point %d is %.6f mm from the outline, less than the %g mm skin", name, i, dist, d)
			return
		}
	}
	if model.PolygonArea(o.Points) <= 0 {
		t.Errorf("%s: offset is not counter-clockwise", name)
	}
	if i, j, x, ok := firstCrossing(o.Points); ok {
		t.Errorf("%s: offset edges %d and %d cross at %v", name, i, j, x)
	}
}

// TestOffsetOpenTrailingEdge: a NACA 0012 at 250 mm (Abbott & von
// Doenhoff, Theory of Wing Sections, 1959, eq. 6.2) thickened by a linear
// ramp to an open trailing edge with a base perpendicular to the chord,
// panelled finely towards the trailing edge (cosine spacing: the last
// panels are far shorter than the skin). A base at least twice the skin
// keeps its moved copy x = c − d between the two surfaces, with nothing
// trimmed; a thinner base is cut off where the section is twice the skin
// thick (just ahead of it, as for the sharp edges above).
func TestOffsetOpenTrailingEdge(t *testing.T) {
	const c = 250.0
	for _, tc := range []struct{ baseMM, d float64 }{
		{0.5, 0.5}, {0.5, 3}, {2, 0.5}, {2, 1.5}, {4, 1.5}, {8, 3},
	} {
		name := fmt.Sprintf("base %g mm, skin %g mm", tc.baseMM, tc.d)
		half := func(x float64) float64 { // unit chord
			return 5*0.12*(0.2969*math.Sqrt(x)-0.1260*x-0.3516*x*x+0.2843*x*x*x-0.1036*x*x*x*x) + tc.baseMM/c/2*x
		}
		unit := exporttest.NACA00XX(0.12, 200)
		m := len(unit) / 2
		var pts []model.Point
		for i, p := range unit[:len(unit)-1] {
			y := half(p.X)
			if i > m {
				y = -y
			}
			pts = append(pts, model.Point{X: p.X * c, Y: y * c})
		}
		pts = append(pts, model.Point{X: c, Y: -half(1) * c}) // lower trailing edge
		o, err := InwardOffset(name, pts, tc.d, model.Point{}, model.Point{X: c})
		if err != nil {
			t.Errorf("%s: %v", name, err)
			continue
		}
		checkInside(t, name, o, pts, tc.d, 1e-6)
		if tc.baseMM >= 2*tc.d {
			onBase := 0
			for _, p := range o.Points {
				if math.Abs(p.X-(c-tc.d)) < 1e-9 {
					onBase++
				}
			}
			if !math.IsNaN(o.TrimmedXC) || onBase != 2 {
				t.Errorf("%s: TrimmedXC %g and %d points on the moved base, want NaN and 2", name, o.TrimmedXC, onBase)
			}
			continue
		}
		lo, hi := 0.5, 1.0
		for range 60 {
			x := (lo + hi) / 2
			if 2*half(x)*c > 2*tc.d {
				lo = x
			} else {
				hi = x
			}
		}
		if !(o.TrimmedXC > lo-0.02 && o.TrimmedXC <= lo+1e-3) {
			t.Errorf("%s: offset ends at x/c %.4f, want just ahead of %.4f where the section is %g mm thick", name, o.TrimmedXC, lo, 2*tc.d)
		}
	}
}

// A rib template under a 1.5 mm skin for a 250 mm wedge with a 10°
// trailing edge stops where the two offset surfaces meet,
// d/sin(τ/2) = 17.21 mm ahead of the trailing edge: x/c = 0.9312.
func ExampleInwardOffset() {
	const c, tau, skin = 250.0, 10.0, 1.5
	h := c * math.Tan(tau*math.Pi/360) // half-thickness at the leading edge
	pts := []model.Point{{X: c}, {X: 0, Y: h}, {X: 0, Y: -h}}
	o, err := InwardOffset("flap", pts, skin, model.Point{}, model.Point{X: c})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d points, the rib ends at x/c %.4f\n", len(o.Points), o.TrimmedXC)
	// Output:
	// 3 points, the rib ends at x/c 0.9312
}
