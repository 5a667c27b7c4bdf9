package solver

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"sectionbench/model"
)

// circleExactVelocity is the flow past a circle of radius a centred at c
// with the Kutta circulation Γ = 4πUa sin α (docs/validation.md §2; Milne-Thomson,
// Theoretical Hydrodynamics): u − iv = e^{−iα} − a² e^{iα}/Z² + iΓ/(2πZ).
func circleExactVelocity(a float64, c model.Point, alpha float64, p model.Point) (u, v float64) {
	z := complex(p.X-c.X, p.Y-c.Y)
	gam := 4 * math.Pi * a * math.Sin(alpha)
	w := cmplx.Exp(complex(0, -alpha)) - complex(a*a, 0)*cmplx.Exp(complex(0, alpha))/(z*z) + complex(0, gam/(2*math.Pi))/z
	return real(w), -imag(w)
}

func TestVelocityCircleExact(t *testing.T) {
	s := mustSystem(t, circleConfig(240))
	alpha := 6.0
	sol := s.Solve(alpha)
	rng := rand.New(rand.NewPCG(3, 4))
	var pts []model.Point
	for range 400 {
		r := 0.5 * (1.15 + 3*rng.Float64())
		th := 2 * math.Pi * rng.Float64()
		pts = append(pts, model.Point{X: 0.5 + r*math.Cos(th), Y: r * math.Sin(th)})
	}
	u, v := make([]float64, len(pts)), make([]float64, len(pts))
	in := make([]bool, len(pts))
	sol.Velocity(pts, u, v, in)
	worst := 0.0
	for i, p := range pts {
		if in[i] {
			t.Fatalf("point %v outside the circle flagged inside", p)
		}
		eu, ev := circleExactVelocity(0.5, model.Point{X: 0.5}, alpha*math.Pi/180, p)
		worst = math.Max(worst, math.Hypot(u[i]-eu, v[i]-ev))
		if gu, gv := sol.VelocityAt(p); gu != u[i] || gv != v[i] {
			t.Fatalf("VelocityAt %v = (%g, %g), Velocity (%g, %g)", p, gu, gv, u[i], v[i])
		}
	}
	// 240 panels: the discretisation error in Cl is about 1e-4 (see
	// TestEllipseExact); the field error beyond 0.15 radius off the
	// surface is of the same order.
	if worst > 2e-3 {
		t.Errorf("max |V − exact| = %.3g", worst)
	}
}

// The multipole expansion that replaces distant panels (field.go) against
// the closed form, beyond farFieldPanelLengths.
func TestFarField(t *testing.T) {
	s := mustSystem(t, Config{Elements: []Element{nacaElement(t, "4412", 60)}})
	sol := s.Solve(8)
	f := sol.field()
	rng := rand.New(rand.NewPCG(5, 6))
	for j := range s.geo.panels {
		p := &s.geo.panels[j]
		ga, gb := sol.g[p.ia], sol.g[p.ib]
		scale := (math.Abs(ga) + math.Abs(gb)) / 2 * p.l // |circulation| of the panel
		for range 30 {
			d := p.l * (farFieldPanelLengths * (1 + 1e-9) * (1 + 4*rng.Float64()))
			th := 2 * math.Pi * rng.Float64()
			px, py := p.mx+d*math.Cos(th), p.my+d*math.Sin(th)
			ua, va, ub, vb := panelInfluence(&s.geo.panels[j], px, py)
			eu, ev := ua*ga+ub*gb, va*ga+vb*gb
			fp := f.far[j]
			dx, dy := px-p.mx, py-p.my
			d2 := dx*dx + dy*dy
			inv := complex(dx/d2, -dy/d2)
			w := inv * (fp.c0 + inv*(fp.c1+inv*(fp.c2+inv*fp.c3)))
			// Bound: μ4/|Z|⁵ term, (γ L⁵/80)/(2π d⁵) relative to
			// γL/(2πd): L⁴/(80 d⁴), times a safety factor of 2.
			bound := 2 * scale / (2 * math.Pi * d) * math.Pow(p.l/d, 4) / 80
			if e := math.Hypot(real(w)-eu, -imag(w)-ev); e > bound+1e-15 {
				t.Fatalf("panel %d at %.3g lengths: far-field error %.3g > bound %.3g", j, d/p.l, e, bound)
			}
		}
	}
}

func TestVelocityInsideAndGround(t *testing.T) {
	cfg := circleConfig(100)
	cfg.Ground, cfg.GroundY = true, -0.8
	sol := mustSystem(t, cfg).Solve(0)
	pts := []model.Point{{X: 0.5, Y: 0}, {X: 0.9, Y: 0.1}, {X: 2, Y: 0}, {X: 0.5, Y: -0.9}, {X: -3, Y: -0.8}, {X: 0.5, Y: -0.8}}
	want := []bool{true, true, false, true, false, false}
	u, v := make([]float64, len(pts)), make([]float64, len(pts))
	in := make([]bool, len(pts))
	sol.Velocity(pts, u, v, in)
	for i := range pts {
		if in[i] != want[i] {
			t.Errorf("%v: inside %v, want %v", pts[i], in[i], want[i])
		}
		if in[i] && (u[i] != 0 || v[i] != 0) {
			t.Errorf("%v inside: velocity (%g, %g), want 0", pts[i], u[i], v[i])
		}
	}
	// The ground plane is a streamline: no normal velocity on it (exact by
	// the symmetry of the images).
	for x := -2.0; x <= 3; x += 0.25 {
		if _, vg := sol.VelocityAt(model.Point{X: x, Y: -0.8}); math.Abs(vg) > 1e-12 {
			t.Errorf("v on the ground at x=%g: %g", x, vg)
		}
	}
	// Velocity accepts a nil inside slice.
	sol.Velocity(pts[:2], u, v, nil)
}

// Next to the surface, on nodes and on panels, the field stays finite (a few
// times U∞ even on the open ends of the sheet at a blunt trailing edge, where
// the clamp of minDistFrac acts), and
// just outside a panel midpoint the flow is tangent (the boundary condition,
// to the far-field expansion's accuracy, field.go). Its tangential speed there is the discrete sheet's,
// which differs from the surface value Vt = −γ by a first-order
// discretisation error (Vt = −γ converges at second order against the exact
// ellipse flow; checked while writing this test): a few percent near the
// leading edge at 160 panels.
func TestVelocityNearSurface(t *testing.T) {
	el := nacaElement(t, "2412", 160)
	sol := mustSystem(t, Config{Elements: []Element{el}}).Solve(4)
	e := sol.Elements[0]
	for i, p := range el.Nodes {
		for _, d := range []float64{0, 1e-15, 1e-9, 1e-4} {
			q := model.Point{X: p.X + d, Y: p.Y + d}
			u, v := sol.VelocityAt(q)
			if math.IsNaN(u) || math.IsNaN(v) || math.IsInf(u, 0) || math.IsInf(v, 0) || math.Hypot(u, v) > 20 {
				t.Fatalf("node %d offset %g: velocity (%g, %g)", i, d, u, v)
			}
		}
	}
	for i := 5; i < len(e.Panels)-5; i += 7 {
		a, b := el.Nodes[i], el.Nodes[i+1]
		l := a.Dist(b)
		tx, ty := (b.X-a.X)/l, (b.Y-a.Y)/l
		q := model.Point{X: e.Panels[i].X + 1e-7*l*ty, Y: e.Panels[i].Y - 1e-7*l*tx}
		u, v := sol.VelocityAt(q)
		vt, vn := u*tx+v*ty, u*ty-v*tx
		if math.Abs(vt-e.Panels[i].Vt) > 0.03*math.Max(1, math.Abs(vt)) || math.Abs(vn) > 1e-4 {
			t.Errorf("panel %d: just outside Vt %g (surface %g), Vn %g", i, vt, e.Panels[i].Vt, vn)
		}
	}
}

// The cluster tree of field.go against the plain sum of every panel's
// closed form and the base sources, near and far, in free air and with the
// ground.
func TestFieldTree(t *testing.T) {
	main := nacaElement(t, "4412", 240)
	flap := transform(nacaElement(t, "2412", 120), 25, 0.35, model.Point{X: 1.0, Y: -0.06})
	for _, ground := range []bool{false, true} {
		cfg := Config{Elements: []Element{main, flap}, Ground: ground, GroundY: -0.5}
		sol := mustSystem(t, cfg).Solve(0)
		f := sol.field()
		rng := rand.New(rand.NewPCG(7, 8))
		worst := 0.0
		for i := range 3000 {
			var px, py float64
			if i%2 == 0 {
				// Anywhere in a wide box.
				px, py = -3+7*rng.Float64(), -0.5+3*rng.Float64()
			} else {
				// Close to a random node.
				q := main.Nodes[rng.IntN(len(main.Nodes))]
				px, py = q.X+0.02*(rng.Float64()-0.5), q.Y+0.02*(rng.Float64()-0.5)
			}
			if f.geo.inside(px, py) {
				continue
			}
			u, v, _ := f.at(px, py)
			eu, ev := f.ux, f.uy
			add := func(x, y, sign float64) {
				all := f.geo.panels
				for j := range all {
					p := &all[j]
					ua, va, ub, vb := panelInfluence(p, x, y)
					eu += ua*sol.g[p.ia] + ub*sol.g[p.ib]
					ev += sign * (va*sol.g[p.ia] + vb*sol.g[p.ib])
				}
				for k := range f.geo.elems {
					if e := &f.geo.elems[k]; e.open() {
						su, sv := sourceInfluence(&e.base, x, y)
						eu += su * sol.g[e.us]
						ev += sign * sv * sol.g[e.us]
					}
				}
			}
			add(px, py, 1)
			if ground {
				add(px, 2*cfg.GroundY-py, -1)
			}
			worst = math.Max(worst, math.Hypot(u-eu, v-ev))
		}
		// The per-panel expansion (≤ 5e-5 of a panel's contribution at 4
		// panel lengths) dominates; the clusters add about 1e-6.
		t.Logf("ground %v: max |tree − closed form| = %.2g", ground, worst)
		if worst > 5e-5 {
			t.Errorf("ground %v: tree field differs from the closed-form sum by %.3g", ground, worst)
		}
	}
}

// Relabelling AlphaDeg (as a caller may, with its own angle convention)
// does not change the field, which keeps the freestream of the solve.
func TestFieldIgnoresRelabelledAlpha(t *testing.T) {
	sol := mustSystem(t, Config{Elements: []Element{nacaElement(t, "2412", 80)}}).Solve(6)
	p := model.Point{X: -0.5, Y: 0.3}
	u0, v0 := sol.VelocityAt(p)
	cm0 := sol.CmAbout(model.Point{})
	relabelled := *sol
	relabelled.AlphaDeg = -12
	relabelled.lazy = &lazyField{}
	u1, v1 := relabelled.VelocityAt(p)
	if u1 != u0 || v1 != v0 || relabelled.CmAbout(model.Point{}) != cm0 {
		t.Errorf("after relabelling: (%g, %g) Cm %g, was (%g, %g) Cm %g", u1, v1, relabelled.CmAbout(model.Point{}), u0, v0, cm0)
	}
}

// Property: in random two-element configurations, with and without the
// ground, the velocity computed by the field (field.go) has no normal
// component just outside every collocation point — the condition the
// matrix (system.go) imposes through a separate code path.
func TestFieldSatisfiesTangency(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for trial := range 6 {
		a := 0.5 * (0.6 + 0.4*rng.Float64())
		b := a * (0.05 + 0.25*rng.Float64())
		main := transform(Element{Nodes: ellipseNodes(60+2*rng.IntN(40), a, b, a), LE: 0}, 10*rng.Float64()-5, 1, model.Point{})
		main.LE = (len(main.Nodes) - 1) / 2
		flap := transform(nacaElement(t, "2412", 60), 30*rng.Float64(), 0.3, model.Point{X: 2*a + 0.05, Y: -0.1 - 0.1*rng.Float64()})
		cfg := Config{Elements: []Element{main, flap}, Ground: trial%2 == 1, GroundY: -0.6}
		alpha := 0.0
		if !cfg.Ground {
			alpha = 8*rng.Float64() - 2
		}
		sol := mustSystem(t, cfg).Solve(alpha)
		geo := sol.sys.geo
		worst := 0.0
		for _, p := range geo.panels {
			q := model.Point{X: p.mx + 1e-9*p.l*p.nx, Y: p.my + 1e-9*p.l*p.ny}
			u, v := sol.VelocityAt(q)
			worst = math.Max(worst, math.Abs(u*p.nx+v*p.ny))
		}
		if worst > 1e-4 {
			t.Errorf("trial %d (ground %v): max normal velocity %.3g at the collocation points", trial, cfg.Ground, worst)
		}
		// On an open trailing edge's base panel the fluid inside is at
		// rest, so just outside its midpoint the normal velocity is the
		// source's own σ (system.go; the flap's NACA section is open).
		for k := range geo.elems {
			e := &geo.elems[k]
			if !e.open() {
				continue
			}
			b := &e.base
			sig := sol.Elements[k].BaseSource
			q := model.Point{X: b.mx + 1e-9*b.l*b.nx, Y: b.my + 1e-9*b.l*b.ny}
			u, v := sol.VelocityAt(q)
			if vn := u*b.nx + v*b.ny; math.Abs(vn-sig) > 1e-4 {
				t.Errorf("trial %d element %d: normal velocity %.6g outside the base, want σ = %.6g", trial, k, vn, sig)
			}
		}
		for k, e := range sol.Elements {
			if d := math.Abs(e.Gamma[0] + e.Gamma[len(e.Gamma)-1]); d > 1e-10 {
				t.Errorf("trial %d element %d: Kutta residual %g", trial, k, d)
			}
		}
	}
}
