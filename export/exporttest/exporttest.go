// Package exporttest holds the synthetic data the export packages' tests
// share: a two-element wing of closed-form NACA 00xx sections and
// solution, sweep, drag and boundary-layer values of known shape. The data
// are invented, not solved; the shapes follow closed forms so that the
// tests know what they drew or wrote.
package exporttest

import (
	"math"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// NACA00XX returns the closed NACA four-digit symmetric section of
// thickness t (fraction of chord) with n panels (n even), cosine spaced,
// trailing edge → upper → leading edge → lower → trailing edge. Thickness
// distribution from Abbott & von Doenhoff, Theory of Wing Sections (1959),
// eq. 6.2, with the closed-trailing-edge last coefficient −0.1036 (common
// practice).
func NACA00XX(t float64, n int) []model.Point {
	half := func(x float64) float64 {
		return 5 * t * (0.2969*math.Sqrt(x) - 0.1260*x - 0.3516*x*x + 0.2843*x*x*x - 0.1036*x*x*x*x)
	}
	m := n / 2
	pts := make([]model.Point, 0, n+1)
	for i := 0; i <= m; i++ { // upper, TE to LE
		x := 0.5 * (1 + math.Cos(math.Pi*float64(i)/float64(m)))
		pts = append(pts, model.Point{X: x, Y: half(x)})
	}
	for i := 1; i <= m; i++ { // lower, LE to TE
		x := 0.5 * (1 - math.Cos(math.Pi*float64(i)/float64(m)))
		pts = append(pts, model.Point{X: x, Y: -half(x)})
	}
	return pts
}

// Place scales unit-chord points to chord c (metres), rotates them nose-up
// by angleDeg about the leading edge and moves the leading edge to le.
func Place(unit []model.Point, c, angleDeg float64, le model.Point) []model.Point {
	out := make([]model.Point, len(unit))
	for i, p := range unit {
		q := p.Scale(c).Rotate(model.Point{}, -angleDeg*math.Pi/180)
		out[i] = q.Add(le)
	}
	return out
}

// TwoElementLayout is a two-element wing: a 250 mm main plane and a 100 mm flap
// set 20° nose-up (trailing edge down, as a flap deflects) behind it
// (invented demo geometry).
func TwoElementLayout(panels int) *model.Layout {
	type spec struct {
		name       string
		c, a       float64
		le         model.Point
		thick      float64
		panelCount int
	}
	specs := []spec{
		{"main", 0.25, 0, model.Point{}, 0.12, panels},
		{"flap", 0.10, 20, model.Point{X: 0.24, Y: -0.02}, 0.10, panels / 2},
	}
	l := &model.Layout{RefChordM: 0.35, MomentRef: model.Point{X: 0.0625}}
	for _, s := range specs {
		nodes := Place(NACA00XX(s.thick, s.panelCount), s.c, s.a, s.le)
		te := nodes[0].Add(nodes[len(nodes)-1]).Scale(0.5)
		l.Elements = append(l.Elements, model.PlacedElement{
			Name: s.name, Nodes: nodes, LE: s.panelCount / 2, Chord: s.c,
			LeadingEdge: nodes[s.panelCount/2], TrailingEdge: te,
		})
	}
	return l
}

// Solution fills panels with a thin-aerofoil-like surface speed,
// V = 1 + τ/2 ± 2α√((1−x)/x), faded to zero at the nose (the stagnation
// point), so Cp = 1 − V² has a suction peak near the leading edge of the
// upper surface. Not a solve: only a plausible shape with known extremes.
func Solution(l *model.Layout, alphaDeg float64) *solver.Solution {
	a := alphaDeg * math.Pi / 180
	sol := &solver.Solution{AlphaDeg: alphaDeg, RefChord: l.RefChordM}
	for _, e := range l.Elements {
		es := solver.ElementSolution{Name: e.Name, Chord: e.Chord, CpMin: math.Inf(1), Stagnation: solver.Stagnation{XC: 0}}
		d := e.TrailingEdge.Sub(e.LeadingEdge)
		s := 0.0
		for i := 0; i+1 < len(e.Nodes); i++ {
			p, q := e.Nodes[i], e.Nodes[i+1]
			m := p.Add(q).Scale(0.5)
			s += p.Dist(m)
			xc := m.Sub(e.LeadingEdge).Dot(d) / d.Dot(d)
			xc = math.Min(math.Max(xc, 1e-6), 1)
			side := solver.Upper
			sign := 1.0
			if i >= e.LE {
				side, sign = solver.Lower, -1
			}
			v := (1 + 0.06 + sign*2*a*math.Sqrt((1-xc)/xc)) * math.Sqrt(xc/(xc+0.002))
			vt := -v
			if side == solver.Lower {
				vt = v
			}
			cp := 1 - v*v
			es.Panels = append(es.Panels, solver.Panel{X: m.X, Y: m.Y, S: s, XC: xc, Vt: vt, Cp: cp, Side: side})
			if cp < es.CpMin {
				es.CpMin, es.XCpMin = cp, xc
			}
			s += m.Dist(q)
		}
		es.Stagnation = solver.Stagnation{X: e.LeadingEdge.X, Y: e.LeadingEdge.Y, XC: 0}
		es.Cl = 2 * math.Pi * a
		es.ClPressure = es.Cl
		es.Cm = -0.01
		sol.Elements = append(sol.Elements, es)
	}
	sol.Cl = 2 * math.Pi * a * 1.3
	sol.ClPressure = sol.Cl
	sol.Cm = -0.05
	return sol
}

// Sweep is Cl = 2π·1.3·α, Cm = −0.05 − 0.002α over −4..12° in 2°.
func Sweep() []solver.Coefficients {
	var sw []solver.Coefficients
	for a := -4.0; a <= 12; a += 2 {
		r := a * math.Pi / 180
		sw = append(sw, solver.Coefficients{AlphaDeg: a, Cl: 2 * math.Pi * 1.3 * r, ClPressure: 2 * math.Pi * 1.3 * r * 0.99,
			Cm: -0.05 - 0.002*a, CpMin: -1 - 0.3*a, XCpMin: 0.01})
	}
	return sw
}

// Drag is Cd = 0.008 + 0.01 Cl² for each row of sw.
func Drag(sw []solver.Coefficients) []engine.ViscousPoint {
	d := make([]engine.ViscousPoint, len(sw))
	for i, c := range sw {
		d[i] = engine.ViscousPoint{AlphaDeg: c.AlphaDeg, Cd: 0.008 + 0.01*c.Cl*c.Cl, TransitionUpper: 0.3 - 0.02*c.AlphaDeg,
			TransitionLower: 0.6, SeparationUpper: math.NaN(), SeparationLower: math.NaN(), Valid: true}
	}
	return d
}

// Viscous uses the flat-plate laminar closed forms θ = 0.664 √(x/Re),
// H = 2.59, Cf = 0.664/√(Re x) (Blasius, in Schlichting, Boundary-Layer
// Theory) up to a transition at x/c = 0.3 on the upper surface, then
// turbulent-looking H = 1.4; Re = 5×10⁵.
func Viscous() *solver.ViscousResult {
	const re = 5e5
	surf := func(xtr float64) solver.SurfaceBL {
		var s solver.SurfaceBL
		for i := 1; i <= 60; i++ {
			x := float64(i) / 60
			h, th, cf := 2.59, 0.664*math.Sqrt(x/re), 0.664/math.Sqrt(re*x)
			if x > xtr {
				h, th, cf = 1.4, th*(1+3*(x-xtr)), 0.004
			}
			s.XC = append(s.XC, x)
			s.S = append(s.S, x)
			s.Ue = append(s.Ue, 1)
			s.Theta = append(s.Theta, th)
			s.H = append(s.H, h)
			s.DeltaStar = append(s.DeltaStar, h*th)
			s.Cf = append(s.Cf, cf)
			s.Turbulent = append(s.Turbulent, x > xtr)
		}
		s.TransitionXC, s.LaminarSeparationXC, s.TurbulentSeparationXC = xtr, math.NaN(), math.NaN()
		s.TransitionCause = solver.TransitionMichel
		s.Cd = 0.004
		return s
	}
	eb := solver.ElementBL{Name: "main", Upper: surf(0.3), Lower: surf(0.6), Cd: 0.008, Valid: true}
	return &solver.ViscousResult{Elements: []solver.ElementBL{eb}, Cd: 0.008}
}
