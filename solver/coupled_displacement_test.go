package solver

import (
	"math"
	"testing"

	"sectionbench/model"
)

// Sources σ = d(Ue δ*)/dξ on a body change its lift as displacing the
// surface outwards by δ* does (the equivalent-source model: Lighthill,
// On displacement thickness, J. Fluid Mech. 4(4), 1958; first order in
// δ*/c). NACA 4412 at 4°, 200 panels, a bump δ* = ε sin²(π f) on the
// upper surface (f from the trailing edge to the leading edge, so δ*
// vanishes at both and no wake source is needed). The lift change through
// the sources, ΔCl = 2 ΔΓ/c with ΔΓ = ∮ Δγ ds from G σ, must equal the
// change of the panel solution about the displaced geometry within 3 %
// (the neglected terms are of order δ*/c and the surface curvature times
// δ*, a few tenths of a percent here; the rest is the two discretisations'
// difference). Measured: within 1 %.
func TestSourceEquivalentToDisplacement(t *testing.T) {
	const alpha = 4.0
	for _, eps := range []float64{0.002, 0.004} {
		e := nacaElement(t, "4412", 200)
		sys, err := NewSystem(Config{Elements: []Element{e}})
		if err != nil {
			t.Fatal(err)
		}
		sol := sys.Solve(alpha)
		w, err := traceWake(sol, 0)
		if err != nil {
			t.Fatal(err)
		}
		r := newSourceResponse(sol, []*wakeGeom{w})
		eg := &sys.geo.elems[0]
		nn, le := len(eg.nodes), eg.le
		// Nodes run from the trailing edge over the upper surface to
		// the leading edge (Upper, solution.go).
		dstar := make([]float64, nn)
		for i := 1; i < le; i++ {
			dstar[i] = eps * math.Pow(math.Sin(math.Pi*float64(i)/float64(le)), 2)
		}
		// σ per panel: the growth of m = Ue δ* along the flow, which on
		// the upper surface runs against the node order.
		sigma := make([]float64, r.cols.n)
		for j := 0; j < le; j++ {
			p := &sys.geo.panels[eg.p0+j]
			ma := math.Abs(sol.g[eg.u0+j]) * dstar[j]
			mb := math.Abs(sol.g[eg.u0+j+1]) * dstar[j+1]
			sigma[eg.p0+j] = (ma - mb) / p.l
		}
		var dGamma float64 // ∮ Δγ ds, linear γ on each panel
		dg := func(i int) float64 {
			row := r.gam.Data[(eg.u0+i)*r.cols.n : (eg.u0+i+1)*r.cols.n]
			s := 0.0
			for c, v := range sigma {
				s += row[c] * v
			}
			return s
		}
		for j := 0; j < eg.np; j++ {
			dGamma += 0.5 * (dg(j) + dg(j+1)) * sys.geo.panels[eg.p0+j].l
		}
		viaSources := 2 * dGamma / eg.chord

		disp := Element{Name: e.Name, LE: e.LE, Nodes: make([]model.Point, nn)}
		for i := range nn {
			a, b := e.Nodes[max(i-1, 0)], e.Nodes[min(i+1, nn-1)]
			tx, ty := b.X-a.X, b.Y-a.Y
			l := math.Hypot(tx, ty)
			// Outward normal of a contour running clockwise (upper
			// surface first, from the trailing edge).
			disp.Nodes[i] = model.Point{X: e.Nodes[i].X + dstar[i]*ty/l, Y: e.Nodes[i].Y - dstar[i]*tx/l}
		}
		sys2, err := NewSystem(Config{Elements: []Element{disp}})
		if err != nil {
			t.Fatal(err)
		}
		viaGeometry := sys2.Solve(alpha).Cl - sol.Cl
		t.Logf("ε = %g c: ΔCl %.5f through the sources, %.5f through the displaced surface", eps, viaSources, viaGeometry)
		if !(viaGeometry > 0) || math.Abs(viaSources/viaGeometry-1) > 0.03 {
			t.Errorf("ε = %g c: ΔCl %.5f through the sources, %.5f through the displaced surface: want the same within 3 %%", eps, viaSources, viaGeometry)
		}
	}
}
