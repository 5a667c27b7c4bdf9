package solver

import (
	"math"
	"testing"
)

// A source on a surface panel pushes the flow away from it along the
// surface (half its outflow each way): the edge speed just downstream
// rises and just upstream falls, by about σ/2 each (a source sheet's
// tangential jump; Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001,
// sec. 10.2.1). On the upper surface the flow runs against the node order,
// so downstream is the panel's first node.
func TestSourceResponseSign(t *testing.T) {
	e := nacaElement(t, "0012", 160)
	sys, err := NewSystem(Config{Elements: []Element{e}})
	if err != nil {
		t.Fatal(err)
	}
	sol := sys.Solve(0)
	w, err := traceWake(sol, 0)
	if err != nil {
		t.Fatal(err)
	}
	r := newSourceResponse(sol, []*wakeGeom{w})
	const p = 40 // nodes 40 and 41, upper surface, mid-chord
	ncol := r.cols.n
	down, up := r.gam.Data[40*ncol+p], r.gam.Data[41*ncol+p] // upper Ue = +γ
	if !(down > 0.3 && down < 1 && up < -0.3 && up > -1) {
		t.Errorf("unit source on panel %d: ΔUe downstream %.3f, upstream %.3f; want about +½ and −½", p, down, up)
	}
	// In the wake the same holds along the wake's tangent.
	c := r.cols.wake0[0] + 10
	if a, b := r.wakeUt.Data[12*ncol+c], r.wakeUt.Data[8*ncol+c]; !(a > 0 && b < 0) {
		t.Errorf("unit wake source at node 10: ΔUt downstream %.3f (want > 0), upstream %.3f (want < 0)", a, b)
	}
}

// With the edge velocities held (no coupling), the Newton step's
// elimination is exact: from a perturbed march state the residuals fall
// quadratically to rounding (Newton's method on a smooth system).
func TestCoupledNewtonUncoupled(t *testing.T) {
	e := nacaElement(t, "0012", 160)
	sys, err := NewSystem(Config{Elements: []Element{e}})
	if err != nil {
		t.Fatal(err)
	}
	cs, err := newCoupledState(sys.Solve(4), CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05})
	if err != nil {
		t.Fatal(err)
	}
	copy(cs.ue0, cs.march())
	clear(cs.d)
	for i := range cs.th {
		cs.th[i] *= 1 + 0.02*math.Sin(float64(i))
	}
	norm := func() float64 {
		ue := cs.ue()
		s := 0.0
		for i := range cs.st {
			l := cs.localOf(i, ue)
			for _, v := range cs.residual(i, &l) {
				s += v * v
			}
		}
		return math.Sqrt(s)
	}
	var hist []float64
	for range 4 {
		hist = append(hist, norm())
		dc, dth, dm, ok := cs.newtonStep()
		if !ok {
			t.Fatal("Newton step failed")
		}
		for i := range cs.st {
			cs.c[i] += dc[i]
			cs.th[i] += dth[i]
			cs.m[i] += dm[i]
		}
	}
	hist = append(hist, norm())
	if !(hist[0] > 0.1 && hist[2] < 1e-3 && hist[4] < 1e-9) {
		t.Errorf("residual norms %.3g: want quadratic convergence to below 1e-9 in four steps", hist)
	}
}

// A solution with more lift than the potential flow is rejected as
// spurious (the boundary layers take lift away); one with less is not.
func TestCoupledImplausible(t *testing.T) {
	for _, tc := range []struct {
		name       string
		cl, clInv  float64
		wantReject bool
	}{
		{"less lift", 0.39, 0.42, false},
		{"within the margin", 0.425, 0.42, false},
		{"more lift", 0.50, 0.42, true},
		{"inverted, less downforce", -0.39, -0.42, false},
		{"inverted, more downforce", -0.50, -0.42, true},
	} {
		got := implausible(&CoupledSolution{Cl: tc.cl, ClInviscid: tc.clInv}) != ""
		if got != tc.wantReject {
			t.Errorf("%s: Cl %.2f against inviscid %.2f: rejected %v, want %v", tc.name, tc.cl, tc.clInv, got, tc.wantReject)
		}
	}
}
