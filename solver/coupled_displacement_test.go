package solver

import (
	"math"
	"testing"

	"sectionbench/model"
)

// Diagnostic: sources σ = d(Ue δ*)/dξ on the body must change the vortex
// strengths as displacing the surface by δ* does (Lighthill 1958).
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
		geo := sys.geo
		eg := &geo.elems[0]
		nn := len(eg.nodes)
		// δ* on the upper surface (nodes before LE, y>0 assumed; check), a bump vanishing at LE and TE.
		le := eg.le
		upperFirst := eg.nodes[le/2].Y > 0
		dstar := make([]float64, nn)
		for i := range nn {
			var f float64
			if upperFirst && i < le {
				f = float64(i) / float64(le)
			} else if !upperFirst && i > le {
				f = float64(nn-1-i) / float64(nn-1-le)
			} else {
				continue
			}
			dstar[i] = eps * math.Pow(math.Sin(math.Pi*f), 2)
		}
		ue := make([]float64, nn)
		for i := range nn {
			ue[i] = math.Abs(sol.g[eg.u0+i])
		}
		sigma := make([]float64, r.cols.n)
		for j := 0; j < eg.np; j++ {
			p := &geo.panels[eg.p0+j]
			a, b := j, j+1
			ma, mb := ue[a]*dstar[a], ue[b]*dstar[b]
			// flow direction: upper surface runs against node order if upperFirst.
			if upperFirst == (j < le) {
				sigma[eg.p0+j] = (ma - mb) / p.l
			} else {
				sigma[eg.p0+j] = (mb - ma) / p.l
			}
		}
		dgSrc := make([]float64, nn)
		for i := range nn {
			row := r.gam.Data[(eg.u0+i)*r.cols.n : (eg.u0+i+1)*r.cols.n]
			for c, s := range sigma {
				dgSrc[i] += row[c] * s
			}
		}
		// Displaced geometry.
		disp := Element{Name: e.Name, LE: e.LE, Nodes: make([]model.Point, nn)}
		for i := range nn {
			ip, in := max(i-1, 0), min(i+1, nn-1)
			tx, ty := e.Nodes[in].X-e.Nodes[ip].X, e.Nodes[in].Y-e.Nodes[ip].Y
			l := math.Hypot(tx, ty)
			nx, ny := ty/l, -tx/l // outward for clockwise? check sign below
			disp.Nodes[i] = model.Point{X: e.Nodes[i].X + nx*dstar[i], Y: e.Nodes[i].Y + ny*dstar[i]}
		}
		sys2, err := NewSystem(Config{Elements: []Element{disp}})
		if err != nil {
			t.Fatal(err)
		}
		sol2 := sys2.Solve(alpha)
		var gs, gg float64
		for j := 0; j < eg.np; j++ {
			p := &geo.panels[eg.p0+j]
			gs += 0.5 * (dgSrc[j] + dgSrc[j+1]) * p.l
			gg += 0.5 * ((sol2.g[j] - sol.g[j]) + (sol2.g[j+1] - sol.g[j+1])) * p.l
		}
		t.Logf("eps %.3f upperFirst %v: ΔΓ sources %.5f, displaced %.5f, ratio %.3f; ΔCl geo %.4f (Cl %.4f)", eps, upperFirst, gs, gg, gs/gg, sol2.Cl-sol.Cl, sol.Cl)
		for _, i := range []int{le / 4, le / 2, 3 * le / 4} {
			t.Logf("  node %d: Δγ src %.4f geo %.4f", i, dgSrc[i], sol2.g[i]-sol.g[i])
		}
	}
}
