package figure

import (
	"math"

	"sectionbench/export/exporttest"
	"sectionbench/model"
	"sectionbench/solver"
	bl "sectionbench/solver/boundarylayer"
	"sectionbench/solver/engine"
)

// Synthetic data for the figure and table tests: invented, not solved. The
// shapes follow closed forms so that the tests know what they drew.

func synthPins() []model.Pin {
	return []model.Pin{{
		Label: "160 panels",
		Cp: []model.PinCurve{
			{Element: "main", Side: "upper", Points: [][2]float64{{1, 0.2}, {0.5, -0.4}, {0.1, -0.9}, {0.01, -1.4}, {0, 1}}},
			{Element: "main", Side: "lower", Points: [][2]float64{{0, 1}, {0.1, -0.1}, {0.5, -0.1}, {1, 0.2}}},
		},
		Polar: [][3]float64{{-4, -0.5, -0.04}, {0, 0, -0.05}, {4, 0.5, -0.06}, {8, 1.0, -0.07}},
	}}
}

func synthScene() *Scene {
	l := exporttest.TwoElementLayout(120)
	sw := exporttest.Sweep()
	return &Scene{
		Layout: l, Solution: exporttest.Solution(l, 4), Sweep: sw, SweepViscous: exporttest.Drag(sw),
		Pins: synthPins(), AlphaDeg: 4, Element: -1,
		Ground: true, GroundY: -0.06,
		Streamlines: synthStreamlines(), Viscous: exporttest.Viscous(), Density: synthDensity(),
	}
}

// synthStreamlines are horizontal lines displaced over a bump about the
// main plane, with speed 1 + 0.3·bump (invented shapes).
func synthStreamlines() []solver.Streamline {
	var out []solver.Streamline
	for k := -6; k <= 6; k++ {
		y0 := 0.02 * float64(k)
		var s solver.Streamline
		for i := 0; i <= 200; i++ {
			x := -0.3 + 0.9*float64(i)/200
			bump := math.Exp(-math.Pow((x-0.12)/0.12, 2)) * 0.03 / (1 + math.Abs(y0)*20)
			sign := 1.0
			if y0 < 0 {
				sign = -1
			}
			s.Points = append(s.Points, model.Point{X: x, Y: y0 + sign*bump})
			s.Speed = append(s.Speed, 1+sign*10*bump)
		}
		s.Dividing = k == 0
		if s.Dividing { // ends on the nose
			s.Points = s.Points[:67]
			s.Speed = s.Speed[:67]
			for i := range s.Points {
				s.Points[i].Y = 0
			}
		}
		out = append(out, s)
	}
	return out
}

// synthDensity converges as Cl = 0.9 − 20/N², Cp min = −2 − 400/N² (second
// order, as docs/validation.md §7 describes for this panel method).
func synthDensity() *engine.DensityResult {
	d := &engine.DensityResult{RecommendedPanels: 160}
	for _, nose := range []float64{0.3, 0.6} {
		for _, n := range []int{40, 80, 160, 320} {
			f := float64(n * n)
			d.Rows = append(d.Rows, engine.DensityRow{Panels: n, Nose: nose, Cl: 0.9 - (20+10*nose)/f, CpMin: -2 - 400/f})
		}
	}
	d.Cl = engine.Extrapolation{Value: 0.9, OK: true}
	return d
}

// synthCoupledScene is the synthetic scene with a coupled viscous point
// at the scene's angle (synthCoupled) and the coupled sweep of
// coupledDragScene (invented rows, one not converged, the last past
// maximum lift and below it); the pins are dropped so that the viscous curves stand
// alone beside the inviscid ones.
func synthCoupledScene() *Scene {
	sc := coupledDragScene(false)
	sc.Viscous = nil // the coupled mode has no one-way estimate
	sc.Coupled = synthCoupled(sc.Solution)
	// The row past maximum lift lifts less than the one before it.
	last := len(sc.SweepCoupled) - 1
	sc.SweepCoupled[last].Cl = 0.9 * sc.SweepCoupled[last-1].Cl
	// Maximum lift as the engine gives it: the largest Cl of the converged
	// rows, a peak because the row after it is past it.
	sc.ClMax = math.Inf(-1)
	for _, r := range sc.SweepCoupled {
		if r.Converged && !r.PastClMax && r.Cl > sc.ClMax {
			sc.ClMax, sc.AlphaClMax = r.Cl, r.AlphaDeg
		}
	}
	sc.ClMaxIsPeak = true
	return sc
}

// synthCoupled is a converged coupled point whose stations lie on the
// panels of sol, running from the leading edge to the trailing edge on
// each surface, with an invented viscous Cp: the inviscid one times 0.85
// plus 0.1·x/c (less suction, and pressure recovery falling short at the
// trailing edge, as a boundary layer's displacement gives), and Cl 0.85
// times the inviscid.
func synthCoupled(sol *solver.Solution) *engine.CoupledPoint {
	d := &solver.CoupledSolution{AlphaDeg: sol.AlphaDeg, Cl: 0.85 * sol.Cl, Cd: 0.012, Cm: sol.Cm, ClInviscid: sol.Cl, Converged: true, Inviscid: sol}
	pt := &engine.CoupledPoint{AlphaDeg: sol.AlphaDeg, Cl: d.Cl, Cd: d.Cd, Cm: d.Cm, ClInviscid: sol.Cl, CmInviscid: sol.Cm, Converged: true, Iterations: 7, Detail: d}
	for _, e := range sol.Elements {
		ce := solver.CoupledElement{Name: e.Name, Chord: e.Chord, Cl: 0.85 * e.Cl, ClInviscid: e.Cl, Cd: 0.012, Cm: e.Cm}
		for _, p := range e.Panels {
			st := solver.CoupledStation{XC: p.XC, X: p.X, Y: p.Y, Cp: 0.85*p.Cp + 0.1*p.XC}
			if p.Side == solver.Upper {
				ce.Upper.Stations = append([]solver.CoupledStation{st}, ce.Upper.Stations...)
			} else {
				ce.Lower.Stations = append(ce.Lower.Stations, st)
			}
		}
		ce.Upper.Transition, ce.Lower.Transition = 0.3, 0.6
		ce.Upper.Separation, ce.Lower.Separation = math.NaN(), math.NaN()
		synthLayer(&ce.Upper, e.Chord)
		synthLayer(&ce.Lower, e.Chord)
		d.Elements = append(d.Elements, ce)
		pt.Elements = append(pt.Elements, engine.CoupledElementPoint{Name: e.Name, Cl: ce.Cl, Cd: ce.Cd, Cm: ce.Cm})
	}
	return pt
}

// synthLayer fills a surface's stations (leading edge first) with the
// boundary layer of exporttest.Viscous along the arc length ξ from the
// first station, on the chord: Blasius' laminar θ = 0.664 √(ξ/Re),
// H = 2.59, Cf = 0.664/√(Re ξ) and ñ rising linearly to 9 up to the
// surface's transition, then H = 1.4, Cf = 0.004 and θ growing by
// 3 (x/c − x_tr); Re = 5 × 10⁵ (invented shapes).
func synthLayer(s *solver.CoupledSurface, chord float64) {
	const re, nCrit = 5e5, 9
	xi := 0.0
	var thTr float64
	for i := range s.Stations {
		st := &s.Stations[i]
		if i > 0 {
			p := s.Stations[i-1]
			xi += math.Hypot(st.X-p.X, st.Y-p.Y) / chord
		}
		st.Xi = xi
		if st.XC <= s.Transition {
			st.Theta, st.H, st.Cf, st.N, st.Regime = 0.664*math.Sqrt(xi/re), 2.59, 0.664/math.Sqrt(re*math.Max(xi, 1e-4)), nCrit*st.XC/s.Transition, bl.Laminar
			thTr = st.Theta
		} else {
			st.Theta, st.H, st.Cf, st.N, st.Regime = thTr*(1+3*(st.XC-s.Transition)), 1.4, 0.004, nCrit, bl.Turbulent
		}
		st.DStar = st.H * st.Theta
		st.Ue = math.Sqrt(math.Max(1-st.Cp, 0))
	}
}
