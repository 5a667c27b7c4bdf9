package solver

import (
	"math"
	"testing"

	"sectionbench/model"
)

// Streamlines of the non-lifting flow past a circle keep the stream
// function ψ = y (1 − a²/r²) constant (Milne-Thomson, Theoretical
// Hydrodynamics; centre at the origin of r, y).
func TestStreamlinesCircle(t *testing.T) {
	sol := mustSystem(t, circleConfig(200)).Solve(0)
	b := Rect{Min: model.Point{X: -1.5, Y: -1.2}, Max: model.Point{X: 2.5, Y: 1.2}}
	lines := sol.Streamlines(StreamOptions{Bounds: b, Seeds: 12})
	if len(lines) != 13 {
		t.Fatalf("%d lines, want 12 seeded + 1 dividing", len(lines))
	}
	psi := func(p model.Point) float64 {
		x, y := p.X-0.5, p.Y
		return y * (1 - 0.25/(x*x+y*y))
	}
	for i, l := range lines[:12] {
		if l.Dividing || len(l.Points) != len(l.Speed) || len(l.Points) < 10 {
			t.Fatalf("line %d: dividing %v, %d points, %d speeds", i, l.Dividing, len(l.Points), len(l.Speed))
		}
		if l.Points[0].X != b.Min.X {
			t.Errorf("line %d starts at %v, not on the upstream edge", i, l.Points[0])
		}
		// Seeds near the top and bottom leave through those edges, the
		// flow being displaced by the body; the others run to the end.
		last := l.Points[len(l.Points)-1]
		onEdge := math.Abs(last.X-b.Max.X) < 1e-12 || math.Abs(math.Abs(last.Y)-b.Max.Y) < 1e-12
		if !onEdge || (i > 0 && i < 11 && math.Abs(last.X-b.Max.X) > 1e-12) {
			t.Errorf("line %d ends at %v, not on the edge", i, last)
		}
		psi0 := psi(l.Points[0])
		for k, p := range l.Points {
			if d := math.Abs(psi(p) - psi0); d > 2e-3 {
				t.Fatalf("line %d point %d %v: ψ drifts by %.3g", i, k, p, d)
			}
			if k > 0 && p.Dist(l.Points[k-1]) > maxStepFraction*math.Hypot(4, 2.4)*(1+1e-9) {
				t.Fatalf("line %d: step %g longer than the cap", i, p.Dist(l.Points[k-1]))
			}
			u, v := sol.VelocityAt(p)
			if math.Abs(l.Speed[k]-math.Hypot(u, v)) > 1e-12 {
				t.Fatalf("line %d point %d: speed %g, field %g", i, k, l.Speed[k], math.Hypot(u, v))
			}
		}
	}
	// The dividing streamline of the symmetric flow is the axis y = 0,
	// ending at the front stagnation point (0, 0).
	d := lines[12]
	if !d.Dividing {
		t.Fatal("last line is not marked dividing")
	}
	if first, last := d.Points[0], d.Points[len(d.Points)-1]; math.Abs(first.X-b.Min.X) > 1e-9 || last.Dist(model.Point{}) > 1e-3 {
		t.Errorf("dividing line from %v to %v, want from the upstream edge to (0, 0)", first, last)
	}
	for _, p := range d.Points {
		if math.Abs(p.Y) > 1e-3 {
			t.Fatalf("dividing line leaves the axis at %v", p)
		}
	}
}

// The dividing streamline of a lifting section approaches from below the
// leading edge (the stagnation point is on the lower surface at α > 0) and
// streamlines stop at bodies and at the ground.
func TestStreamlinesLiftingGround(t *testing.T) {
	el := transform(nacaElement(t, "4412", 120), 6, 1, model.Point{})
	cfg := Config{Elements: []Element{el}, Ground: true, GroundY: -0.4}
	sol := mustSystem(t, cfg).Solve(0)
	b := DefaultBounds(cfg)
	if b.Min.Y != -0.4 {
		t.Errorf("DefaultBounds bottom %g, want the ground -0.4", b.Min.Y)
	}
	lines := sol.Streamlines(StreamOptions{Seeds: 20, MaxSteps: 500})
	if len(lines) != 21 {
		t.Fatalf("%d lines, want 21", len(lines))
	}
	for i, l := range lines {
		if len(l.Points) > 500+2 {
			t.Errorf("line %d: %d points exceed MaxSteps", i, len(l.Points))
		}
		for k, p := range l.Points {
			if l.Dividing && k == len(l.Points)-1 {
				break // the stagnation point itself, on the contour
			}
			if p.Y < -0.4-1e-9 || p.X < b.Min.X-1e-9 || p.X > b.Max.X+1e-9 || p.Y > b.Max.Y+1e-9 {
				t.Fatalf("line %d leaves the bounds at %v", i, p)
			}
			if cfgInside(sol, p) {
				t.Fatalf("line %d enters the body at %v", i, p)
			}
		}
	}
	d := lines[20]
	st := sol.Elements[0].Stagnation
	if last := d.Points[len(d.Points)-1]; last != (model.Point{X: st.X, Y: st.Y}) {
		t.Errorf("dividing line ends at %v, stagnation at (%g, %g)", last, st.X, st.Y)
	}
	if d.Points[0].X != b.Min.X {
		t.Errorf("dividing line starts at %v, not upstream", d.Points[0])
	}
	// Ahead of a lifting section the upwash lifts the dividing streamline
	// towards the stagnation point (common practice).
	if !(d.Points[0].Y < st.Y) {
		t.Errorf("dividing line starts at y = %g, above the stagnation point %g", d.Points[0].Y, st.Y)
	}
}

func cfgInside(sol *Solution, p model.Point) bool { return sol.sys.geo.inside(p.X, p.Y) }

func TestDefaultBounds(t *testing.T) {
	el := nacaElement(t, "0012", 40)
	b := DefaultBounds(Config{Elements: []Element{el}})
	for _, p := range el.Nodes {
		if !b.contains(p.X, p.Y) {
			t.Errorf("node %v outside %v", p, b)
		}
	}
	if b.Min.X != -boundsUpstream || b.Max.X != 1+boundsDownstream {
		t.Errorf("bounds %v, want x from %g to %g", b, -boundsUpstream, 1+boundsDownstream)
	}
}

func TestClipToRect(t *testing.T) {
	r := Rect{Max: model.Point{X: 1, Y: 1}}
	for _, tc := range []struct {
		x0, y0, x1, y1, wx, wy float64
	}{
		{0.5, 0.5, 1.5, 0.5, 1, 0.5},
		{0.5, 0.5, 0.5, -1, 0.5, 0},
		{0.5, 0.5, 1.5, 1.0, 1, 0.75},
		{0.9, 0.9, 1.3, 1.1, 1, 0.95},
	} {
		if x, y := clipToRect(r, tc.x0, tc.y0, tc.x1, tc.y1); math.Abs(x-tc.wx) > 1e-15 || math.Abs(y-tc.wy) > 1e-15 {
			t.Errorf("clip (%g,%g)→(%g,%g) = (%g, %g), want (%g, %g)", tc.x0, tc.y0, tc.x1, tc.y1, x, y, tc.wx, tc.wy)
		}
	}
}

// Behind an open trailing edge the base source fills the dead-air region
// (system.go): just behind the base the flow leaves it downstream, and a
// streamline started there runs to the downstream edge of the bounds
// without entering the body, also when the last panels are much shorter
// than the gap (NACA 0012, 640 panels, gap 0.25% of chord, at 4°).
func TestStreamlinesOpenTrailingEdge(t *testing.T) {
	el := nacaElement(t, "0012", 640)
	cfg := Config{Elements: []Element{el}}
	sol := mustSystem(t, cfg).Solve(4)
	up, lo := el.Nodes[0], el.Nodes[len(el.Nodes)-1]
	gap := up.Dist(lo)
	b := DefaultBounds(cfg)
	diag := math.Hypot(b.Max.X-b.Min.X, b.Max.Y-b.Min.Y)
	in := &integrator{f: sol.field(), b: b, tol: DefaultTolFraction * diag, hmax: maxStepFraction * diag, hmin: minStepFraction * diag, maxSteps: DefaultMaxSteps}
	for _, f := range []float64{0.25, 0.5, 0.75} {
		p := model.Point{X: lo.X + f*(up.X-lo.X) + 0.2*gap, Y: lo.Y + f*(up.Y-lo.Y)}
		if u, _ := sol.VelocityAt(p); !(u > 0.5) {
			t.Errorf("behind the base at %v: u = %g, want the outflow of the base", p, u)
		}
		sl := in.run(p, false)
		last := sl.Points[len(sl.Points)-1]
		if math.Abs(last.X-b.Max.X) > 1e-9 {
			t.Errorf("line from %v ends at %v, not at the downstream edge %g", p, last, b.Max.X)
		}
		for _, q := range sl.Points {
			if cfgInside(sol, q) {
				t.Fatalf("line from %v enters the body at %v", p, q)
			}
		}
	}
}
