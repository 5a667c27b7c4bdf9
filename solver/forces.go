package solver

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"sectionbench/model"
)

// Surface velocity, pressure and integrated forces.
//
// Surface velocity. Across a vortex sheet of strength γ (clockwise
// positive) the tangential velocity jumps by γ: in a panel's frame, whose y'
// axis points into the body, the sheet's own contribution is −γ/2 on the
// outer face and +γ/2 on the inner one (influence.go). The tangency
// conditions make the body a streamline of the flow, so the fluid inside
// the closed contour is at rest and the velocity just outside, along the
// node ordering, is
//
//	Vt = V_inside − γ = −γ
//
// (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., sec. 11.4; Kuethe &
// Chow, Foundations of Aerodynamics, sec. 5.10). γ is linear along a panel,
// so Vt at a panel's midpoint is −(γa + γb)/2. Cp = 1 − Vt². The interior is
// at rest only in the limit: the discrete sheet leaves an O(h) interior
// velocity, and summing the influences just outside a midpoint is first
// order accurate against the exact ellipse flow where −γ is second order
// (b/a = 0.12, α = 4°: RMS errors 8.1e-3, 1.9e-3, 4.7e-4 at 100, 200, 400
// panels for −γ; 1.6e-2, 7.5e-3, 3.6e-3 summed; measured while writing
// this), so −γ is the surface value used.
//
// Circulation and lift. The clockwise circulation of element k is
//
//	Γ_k = ∮ γ ds = Σ_j L_j (γa + γb)/2 = −Σ_j L_j Vt_j,
//
// and Kutta–Joukowski gives Cl = 2Γ/(U∞ c) for a lone element in free air.
// In a multi-element configuration or above the ground the other bodies
// (and the images) induce velocity at the element, and the force on it is
// the vortex force of Lagally's theorem (Milne-Thomson, Theoretical
// Hydrodynamics, Lagally's theorem on the force on a body containing
// singularities; the Kutta–Joukowski force on each vortex element in its
// local velocity, Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., ch. 2):
//
//	F = ρ ∫ (V∞ + V_ind,others) × γ ds − ρ Q (V∞ + V_ind,others)_base,
//
// over the element's own sheet and its base source Q = σ g (an open
// trailing edge), where V_ind,others is induced by every other element and
// by all images. The element's own singularities exert no net force on
// themselves (their mutual forces cancel in pairs), so they are left out.
// Per unit dynamic pressure, with a clockwise γ, the sheet's force is
// 2∫ γ (−V_y, V_x) ds, evaluated with two Gauss points per panel (γ
// linear; exact for cubics) and V_ind from the field of field.go; Cl is
// its component across the stream on the element's chord. It agrees with
// the pressure integral ClPressure within 0.5% from 100 panels on
// (TestVortexForceMatchesPressure) and reduces to 2Γ/(U∞ c) for a lone
// element in free air (used exactly there). In free air the elements'
// mutual forces cancel, so the configuration's total is Kutta–Joukowski's
// 2ΣΓ/(U∞ c_ref); above the ground it is not. The circulation Γ itself is
// reported as ElementSolution.Circulation.
//
// Pressure forces. Each panel carries the midpoint Cp over its length; the
// force per unit span and dynamic pressure on panel j is −Cp_j n_j L_j, n_j
// the outward normal. Lift is the component along (−sin α, cos α), drag
// along (cos α, sin α) (ideally zero in potential flow: a check of the
// discretisation, d'Alembert), and the moment about a point r is
// Σ (m_j − r) × F_j, nose-up positive = clockwise, so Cm = −M_ccw/c².
//
// Superposition for sweeps. With Vt_j = cos α a_j + sin α b_j (a, b the unit
// solutions), every pressure integral Σ w_j (1 − Vt_j²) is a quadratic form
// in (cos α, sin α): Σ w_j − c² Σ w a² − 2cs Σ w ab − s² Σ w b². So is the
// vortex force: γ and V = cos α V_0 + sin α V_90 (V_u the unit freestream
// plus the velocity the unit solution induces) are both linear in
// (cos α, sin α). The sums are computed once per element, so a sweep costs
// O(1) per angle for forces, and CpMin comes from a convex hull of the
// unit velocities (coefficients).

// qform is k + aa c² + ab c s + bb s², a quadratic form in (cos α, sin α).
type qform struct{ k, aa, ab, bb float64 }

func (q qform) at(c, s float64) float64 { return q.k + q.aa*c*c + q.ab*c*s + q.bb*s*s }

// addCp adds the pressure integral Σ w (1 − Vt²) of one panel.
func (q *qform) addCp(w, a, b float64) {
	q.k += w
	q.aa -= w * a * a
	q.ab -= 2 * w * a * b
	q.bb -= w * b * b
}

// elemQuad holds one element's integrals as forms in (cos α, sin α).
type elemQuad struct {
	fx, fy   qform // pressure force components, per unit dynamic pressure
	m        qform // moment about the element's quarter chord, counter-clockwise
	gam0     float64
	gam90    float64 // clockwise circulation, Γ = c gam0 + s gam90
	vx, vy   qform   // vortex (Lagally) force components, per unit dynamic pressure
	isolated bool    // alone in free air: the vortex force is 2Γ across the stream
}

// elemForce is one element's integrated force at one angle.
type elemForce struct {
	fx, fy, m, gam float64
	vx, vy         float64 // vortex force; unused when isolated
	isolated       bool
	qc             model.Point
}

// vortexLift returns the element's vortex-force lift per unit dynamic
// pressure at (cos α, sin α) = (c, sn): 2Γ for an element alone in free
// air (Kutta–Joukowski), else the Lagally force across the stream.
func (f *elemForce) vortexLift(c, sn float64) float64 {
	if f.isolated {
		return 2 * f.gam
	}
	return -f.vx*sn + f.vy*c
}

// prepare computes the unit solutions' panel velocities and the
// superposition forms.
func (s *System) prepare() {
	g := s.geo
	s.vt0 = make([]float64, len(g.panels))
	s.vt90 = make([]float64, len(g.panels))
	for j, p := range g.panels {
		s.vt0[j] = -0.5 * (s.g0[p.ia] + s.g0[p.ib])
		if s.g90 != nil {
			s.vt90[j] = -0.5 * (s.g90[p.ia] + s.g90[p.ib])
		}
	}
	// CpMin candidates: every surface panel but those of a trailing edge
	// thinner than its panels (the base panel of an open trailing edge is
	// not one either; system.go).
	s.hull = velocityHull(s.vt0, s.vt90, func(j int) bool { return g.panels[j].thin })
	s.forces = make([]elemQuad, len(g.elems))
	for k := range g.elems {
		e := &g.elems[k]
		f := &s.forces[k]
		for j := e.p0; j < e.p0+e.np; j++ {
			p := &g.panels[j]
			a, b := s.vt0[j], s.vt90[j]
			// F = −Cp n L; M = (m − qc) × F.
			f.fx.addCp(-p.nx*p.l, a, b)
			f.fy.addCp(-p.ny*p.l, a, b)
			rx, ry := p.mx-e.qc.X, p.my-e.qc.Y
			f.m.addCp(-(rx*p.ny-ry*p.nx)*p.l, a, b)
			f.gam0 -= p.l * a
			f.gam90 -= p.l * b
		}
		f.isolated = len(g.elems) == 1 && !g.ground
	}
	if len(g.elems) > 1 || g.ground {
		s.prepareVortexForces()
	}
}

// gauss2 are the nodes of two-point Gauss–Legendre quadrature on [0, 1],
// each of weight 1/2; exact for cubics, so for γ linear times a velocity
// varying smoothly along the panel its error is O(L⁴) per panel.
var gauss2 = [2]float64{0.5 - 0.5/math.Sqrt(3), 0.5 + 0.5/math.Sqrt(3)}

// prepareVortexForces computes each element's vortex force as forms in
// (cos α, sin α), by Lagally's theorem (forces.go notes). For the unit
// solutions u = 0, 90 the velocity W_u induced on element k by every other
// element and by all images is evaluated at two Gauss points per panel
// (the field of field.go, with its expansions for distant panels); with
// V_u = V∞,u + W_u (V∞,0 = (1, 0), V∞,90 = (0, 1)) and γ = c γ0 + s γ90,
//
//	F/(½ρU∞²) = 2 ∫ γ (−V_y, V_x) ds − 2 Σ_base σ g V,  V = c V_0 + s V_90,
//
// where the second term is the force on the base source (strength σ over
// the gap g); both are quadratic forms in (c, s).
func (s *System) prepareVortexForces() {
	g := s.geo
	type unit struct {
		f  *field
		ex model.Point // its freestream
		g  []float64
	}
	units := []unit{{newFieldOf(g, s.g0, 0, 0), model.Point{X: 1}, s.g0}}
	if s.g90 != nil {
		units = append(units, unit{newFieldOf(g, s.g90, 0, 0), model.Point{Y: 1}, s.g90})
	}
	// vel returns V_u at p on element k.
	vel := func(u *unit, k int, px, py float64) (vx, vy float64) {
		vx, vy = u.f.inducedExcept(px, py, k)
		if g.ground {
			ix, iy := u.f.induced(px, 2*g.groundY-py)
			vx += ix
			vy -= iy
		}
		return vx + u.ex.X, vy + u.ex.Y
	}
	// term adds the force (fx, fy) of unit strength i in unit velocity j
	// to the forms: c² for i = j = 0, s² for i = j = 90, cs otherwise.
	term := func(f *elemQuad, i, j int, fx, fy float64) {
		switch {
		case i == 0 && j == 0:
			f.vx.aa += fx
			f.vy.aa += fy
		case i == 1 && j == 1:
			f.vx.bb += fx
			f.vy.bb += fy
		default:
			f.vx.ab += fx
			f.vy.ab += fy
		}
	}
	var v [2][2]float64
	for k := range g.elems {
		e := &g.elems[k]
		f := &s.forces[k]
		for j := e.p0; j < e.p0+e.np; j++ {
			p := &g.panels[j]
			for _, t := range gauss2 {
				px, py := p.x1+t*(p.x2-p.x1), p.y1+t*(p.y2-p.y1)
				for u := range units {
					v[u][0], v[u][1] = vel(&units[u], k, px, py)
				}
				// 2 w γ (−V_y, V_x), w = L/2.
				for i := range units {
					q := p.l * ((1-t)*units[i].g[p.ia] + t*units[i].g[p.ib])
					for u := range units {
						term(f, i, u, -q*v[u][1], q*v[u][0])
					}
				}
			}
		}
		if e.open() {
			// −2 Q V on the base source, Q = σ g, half at each point.
			b := &e.base
			for _, t := range gauss2 {
				px, py := b.x1+t*(b.x2-b.x1), b.y1+t*(b.y2-b.y1)
				for u := range units {
					v[u][0], v[u][1] = vel(&units[u], k, px, py)
				}
				for i := range units {
					q := b.l * units[i].g[e.us]
					for u := range units {
						term(f, i, u, -q*v[u][0], -q*v[u][1])
					}
				}
			}
		}
	}
}

// elementForces evaluates the forms at (cos α, sin α).
func (s *System) elementForces(c, sn float64) []elemForce {
	out := make([]elemForce, len(s.forces))
	for k := range s.forces {
		out[k] = s.forces[k].at(c, sn, s.geo.elems[k].qc)
	}
	return out
}

// at evaluates one element's forms at (cos α, sin α) = (c, sn).
func (f *elemQuad) at(c, sn float64, qc model.Point) elemForce {
	return elemForce{
		fx: f.fx.at(c, sn), fy: f.fy.at(c, sn), m: f.m.at(c, sn),
		gam: c*f.gam0 + sn*f.gam90, qc: qc,
		vx: f.vx.at(c, sn), vy: f.vy.at(c, sn), isolated: f.isolated,
	}
}

// totals returns the configuration's Cl (circulation), ClPressure and Cm
// about ref, on RefChord.
func (s *System) totals(ef []elemForce, c, sn float64, ref model.Point) (cl, clp, cm float64) {
	rc := s.geo.refChord
	var lift, fx, fy, m float64
	for i := range ef {
		f := &ef[i]
		lift += f.vortexLift(c, sn)
		fx += f.fx
		fy += f.fy
		m += f.m + (f.qc.X-ref.X)*f.fy - (f.qc.Y-ref.Y)*f.fx
	}
	return lift / rc, (-fx*sn + fy*c) / rc, -m / (rc * rc)
}

// coefficients returns the sweep entry at one angle. It allocates nothing.
func (s *System) coefficients(alphaDeg float64) Coefficients {
	c, sn := s.weights(alphaDeg)
	co := Coefficients{AlphaDeg: alphaDeg}
	ref := s.geo.mref
	rc := s.geo.refChord
	var lift, fx, fy, m float64
	for k := range s.forces {
		f := s.forces[k].at(c, sn, s.geo.elems[k].qc)
		lift += f.vortexLift(c, sn)
		fx += f.fx
		fy += f.fy
		m += f.m + (f.qc.X-ref.X)*f.fy - (f.qc.Y-ref.Y)*f.fx
	}
	co.Cl, co.ClPressure, co.Cm = lift/rc, (-fx*sn+fy*c)/rc, -m/(rc*rc)
	// CpMin = 1 − max_j Vt_j², Vt_j = (cos α, sin α)·(a_j, b_j): the
	// largest |Vt| is the support function of the point set {±(a_j, b_j)}
	// in the direction (cos α, sin α), attained at a vertex of its convex
	// hull (precomputed in prepare), so a sweep scans a few dozen
	// vertices per angle instead of every panel.
	vmax, jmax := math.Inf(-1), 0
	for _, h := range s.hull {
		if v := c*h.a + sn*h.b; v > vmax {
			vmax, jmax = v, h.j
		}
	}
	co.CpMin = 1 - vmax*vmax
	co.XCpMin = s.geo.panels[jmax].xc
	return co
}

// hullVertex is a vertex of the convex hull of {±(Vt0_j, Vt90_j)}.
type hullVertex struct {
	a, b float64
	j    int // panel
}

// velocityHull returns the convex hull of the points ±(a_j, b_j) but those
// j for which skip (if not nil) is true, counter-clockwise, by Andrew's
// monotone chain (A. M. Andrew, Inf. Process. Lett. 9(5), 1979). Collinear
// points are dropped.
func velocityHull(a, b []float64, skip func(j int) bool) []hullVertex {
	pts := make([]hullVertex, 0, 2*len(a))
	for j := range a {
		if skip == nil || !skip(j) {
			pts = append(pts, hullVertex{a[j], b[j], j}, hullVertex{-a[j], -b[j], j})
		}
	}
	slices.SortFunc(pts, func(p, q hullVertex) int {
		if c := cmp.Compare(p.a, q.a); c != 0 {
			return c
		}
		return cmp.Compare(p.b, q.b)
	})
	cross := func(o, p, q hullVertex) float64 { return (p.a-o.a)*(q.b-o.b) - (p.b-o.b)*(q.a-o.a) }
	h := make([]hullVertex, 0, len(pts)+1)
	for _, p := range pts { // lower hull
		for len(h) >= 2 && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	lower := len(h) + 1
	for i := len(pts) - 2; i >= 0; i-- { // upper hull
		p := pts[i]
		for len(h) >= lower && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	return h[:len(h)-1]
}

// solution builds the full result for nodal strengths g at (cos α, sin α).
func (s *System) solution(alphaDeg, c, sn float64, g []float64) *Solution {
	geo := s.geo
	ef := s.elementForces(c, sn)
	sol := &Solution{
		AlphaDeg: alphaDeg,
		Elements: make([]ElementSolution, len(geo.elems)),
		RefChord: geo.refChord,
		Warnings: s.Warnings(),
		sys:      s,
		g:        g,
		forces:   ef,
		lazy:     &lazyField{},
		cosA:     c,
		sinA:     sn,
	}
	sol.Cl, sol.ClPressure, sol.Cm = s.totals(ef, c, sn, geo.mref)
	for k := range geo.elems {
		e := &geo.elems[k]
		f := ef[k]
		es := &sol.Elements[k]
		es.Name = e.name
		es.Chord = e.chord
		es.Gamma = append([]float64(nil), g[e.u0:e.u0+e.np+1]...)
		if e.open() {
			es.BaseSource = g[e.us]
		}
		es.Circulation = f.gam
		es.Cl = f.vortexLift(c, sn) / e.chord
		es.ClPressure = (-f.fx*sn + f.fy*c) / e.chord
		es.CdPressure = (f.fx*c + f.fy*sn) / e.chord
		es.Cm = -f.m / (e.chord * e.chord)
		es.Panels = make([]Panel, e.np)
		es.CpMin = math.Inf(1)
		for i := range es.Panels {
			p := &geo.panels[e.p0+i]
			vt := -0.5 * (g[p.ia] + g[p.ib])
			cp := 1 - vt*vt
			es.Panels[i] = Panel{X: p.mx, Y: p.my, S: p.s, XC: p.xc, Vt: vt, Cp: cp, Side: p.side}
			if cp < es.CpMin && !p.thin {
				es.CpMin, es.XCpMin = cp, p.xc
			}
		}
		var ok bool
		es.Stagnation, ok = stagnation(e, es.Gamma)
		if !ok {
			sol.Warnings = append(sol.Warnings, fmt.Sprintf("element %q: no stagnation point found (surface velocity does not change sign); reported at the leading edge", e.name))
		}
	}
	return sol
}

// stagnation finds where the surface velocity Vt = −γ changes sign from
// negative (upper surface, flowing against the node order) to positive,
// nearest the leading-edge node in arc length. γ is linear in arc length
// along each panel, so the zero is interpolated linearly between the two
// nodes. If there is none, it returns the leading-edge node and false.
func stagnation(e *elemGeom, gam []float64) (Stagnation, bool) {
	best, bestD := Stagnation{}, math.Inf(1)
	sLE := e.sNode[e.le]
	for k := 0; k+1 < len(gam); k++ {
		va, vb := -gam[k], -gam[k+1]
		if !(va < 0 && vb >= 0) {
			continue
		}
		f := va / (va - vb)
		a, b := e.nodes[k], e.nodes[k+1]
		p := a.Add(b.Sub(a).Scale(f))
		st := Stagnation{X: p.X, Y: p.Y, S: e.sNode[k] + f*(e.sNode[k+1]-e.sNode[k]), XC: e.chordPos(p)}
		if d := math.Abs(st.S - sLE); d < bestD {
			best, bestD = st, d
		}
	}
	if math.IsInf(bestD, 1) {
		return Stagnation{X: e.lePt.X, Y: e.lePt.Y, S: sLE, XC: 0}, false
	}
	return best, true
}

// chordPos returns the projection of p on the element's chord line, 0 at
// the leading edge and 1 at the trailing-edge midpoint.
func (e *elemGeom) chordPos(p model.Point) float64 {
	d := e.teMid.Sub(e.lePt)
	return p.Sub(e.lePt).Dot(d) / d.Dot(d)
}

// CmAbout returns the whole configuration's pitching-moment coefficient
// about p (nose-up positive, on RefChord²): M_p = Σ_k [M_k + (qc_k − p) × F_k]
// with M_k, F_k each element's pressure moment about its quarter chord and
// pressure force.
func (s *Solution) CmAbout(p model.Point) float64 {
	if s.sys == nil {
		panic("solver: CmAbout on a Solution not made by Solve")
	}
	c, sn := s.cosA, s.sinA
	_, _, cm := s.sys.totals(s.forces, c, sn, p)
	return cm
}
