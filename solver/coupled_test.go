package solver

import (
	"context"
	"math"
	"testing"

	"sectionbench/model"
	bl "sectionbench/solver/boundarylayer"
)

// A source on a surface panel pushes the flow away from it along the
// surface (half its outflow each way): the edge speed just downstream
// rises and just upstream falls, by about σ/2 each (a source sheet's
// tangential jump; Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001,
// sec. 10.2.1). On the upper surface the flow runs against the node order,
// so downstream is the panel's first node.
func TestSourceResponseSign(t *testing.T) {
	_, _, r := sourceSystem(t, "0012", 160, 0)
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
// spurious where every suction side's layer is the thicker at the
// trailing edge (the boundary layers then take lift away); one with less
// is not, nor one whose pressure-side layer is the thicker (a one-sided
// trip: the displacement cambers the section and may add lift).
func TestCoupledImplausible(t *testing.T) {
	edge := func(dStar float64) CoupledSurface {
		return CoupledSurface{Stations: []CoupledStation{{DStar: dStar / 2}, {DStar: dStar}}, Separation: math.NaN()}
	}
	for _, tc := range []struct {
		name           string
		cl, clInv      float64
		dUpper, dLower float64 // displacement thickness at the trailing edge
		wantReject     bool
	}{
		{"less lift", 0.39, 0.42, 0.006, 0.003, false},
		{"within the margin", 0.425, 0.42, 0.006, 0.003, false},
		{"more lift", 0.50, 0.42, 0.006, 0.003, true},
		{"inverted, less downforce", -0.39, -0.42, 0.003, 0.006, false},
		{"inverted, more downforce", -0.50, -0.42, 0.003, 0.006, true},
		{"more lift, the pressure side the thicker", 0.031, 0.019, 0.004, 0.005, false},
		{"near zero lift, the upper surface tripped", -0.145, -0.121, 0.006, 0.003, false},
		{"inverted, more downforce, the pressure side the thicker", -0.50, -0.42, 0.006, 0.003, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := &CoupledSolution{Cl: tc.cl, ClInviscid: tc.clInv, Elements: []CoupledElement{{ClInviscid: tc.clInv, Upper: edge(tc.dUpper), Lower: edge(tc.dLower)}}}
			if got := implausible(s) != ""; got != tc.wantReject {
				t.Errorf("Cl %.3f against inviscid %.3f, δ* upper %.3f lower %.3f: rejected %v, want %v", tc.cl, tc.clInv, tc.dUpper, tc.dLower, got, tc.wantReject)
			}
		})
	}
}

// A pressure side thicker only by separating over its last stations is the
// spurious root the check was written for (E387 at Re 3e5 and 0°); one
// separating from x/c 0.9 (NACA 0012 at Re 3e5 and 3–5°) may add lift.
func TestCoupledImplausiblePressureSideSeparation(t *testing.T) {
	edge := func(dStar, sepXC float64) CoupledSurface {
		return CoupledSurface{Stations: []CoupledStation{{DStar: dStar / 2}, {DStar: dStar}}, Separation: sepXC}
	}
	for _, tc := range []struct {
		name       string
		sepXC      float64
		wantReject bool
	}{
		{"separated at its last station", 0.995, true},
		{"separated from 0.9", 0.9, false},
		{"attached", math.NaN(), false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s := &CoupledSolution{Cl: 0.50, ClInviscid: 0.42, Elements: []CoupledElement{{ClInviscid: 0.42, Upper: edge(0.004, math.NaN()), Lower: edge(0.009, tc.sepXC)}}}
			if got := implausible(s) != ""; got != tc.wantReject {
				t.Errorf("lower surface separated from x/c %g: rejected %v, want %v", tc.sepXC, got, tc.wantReject)
			}
		})
	}
}

// Elements far apart reproduce the single element (the issue's
// consistency check): two NACA 0012 ten chords apart, one above the
// other, at 4° and Re 6e6 tripped. Each keeps the single element's ratio
// of viscous to inviscid lift within 0.5 % and its drag within 2 % (the
// potential flows differ by the biplane interference, 0.7 % of lift at
// ten chords, which the ratio takes out).
func TestCoupledFarApart(t *testing.T) {
	skipUnderRace(t)
	a := nacaElement(t, "0012", 160)
	b := transform(nacaElement(t, "0012", 160), 0, 1, model.Point{X: 0, Y: 10})
	b.Name = "upper"
	solve := func(els ...Element) *CoupledSolution {
		sys, err := NewSystem(Config{Elements: els})
		if err != nil {
			t.Fatal(err)
		}
		re := make([]float64, len(els))
		for i := range re {
			re[i] = 6e6
		}
		cs, err := sys.SolveCoupled(context.Background(), 4, CoupledOptions{Re: re, TripUpper: 0.05, TripLower: 0.05}, nil)
		if err != nil || !cs.Converged {
			t.Fatalf("%d elements: not converged (%v)", len(els), err)
		}
		return cs
	}
	one := solve(a).Elements[0]
	for _, e := range solve(a, b).Elements {
		r1, r2 := one.Cl/one.ClInviscid, e.Cl/e.ClInviscid
		if d := math.Abs(r2/r1 - 1); d > 0.005 {
			t.Errorf("%s: viscous/inviscid lift %.4f, alone %.4f (%.2f %% apart, 0.5 %% allowed)", e.Name, r2, r1, 100*d)
		}
		if d := math.Abs(e.Cd/one.Cd - 1); d > 0.02 {
			t.Errorf("%s: Cd %.5f, alone %.5f (%.1f %% apart, 2 %% allowed)", e.Name, e.Cd, one.Cd, 100*d)
		}
	}
}

// mainAndFlap is TestCoupledMainAndFlap's configuration (also its
// polar's benchmark): NACA 4412 at 160 panels and a 0.35-chord NACA 4412
// flap at 120 panels, 10° down, its leading edge at (1.1, −0.15).
func mainAndFlap(t testing.TB) Config {
	main := nacaElement(t, "4412", 160)
	flap := transform(nacaElement(t, "4412", 120), 10, 0.35, model.Point{X: 1.1, Y: -0.15})
	flap.Name = "flap"
	return Config{Elements: []Element{main, flap}}
}

// A main element and a flap behind it converge with every element's
// lift below its inviscid lift and a positive drag (NACA 4412 main,
// 0.35-chord NACA 4412 flap at 10°, Re 1e6 on the main chord, tripped at
// 5 %): a guard for the wake of one element running past another. Close
// slots (a gap of a few percent of chord) do not converge yet
// (DEVELOPERS.md).
func TestCoupledMainAndFlap(t *testing.T) {
	skipUnderRace(t)
	sys, err := NewSystem(mainAndFlap(t))
	if err != nil {
		t.Fatal(err)
	}
	cs, err := sys.SolveCoupled(context.Background(), 2, CoupledOptions{Re: []float64{1e6, 0.35e6}, TripUpper: 0.05, TripLower: 0.05}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !cs.Converged {
		t.Fatalf("not converged (%d iterations, residual %.2g)", cs.Iterations, cs.Residual)
	}
	for _, e := range cs.Elements {
		if !(e.Cl < e.ClInviscid && e.Cd > 0) {
			t.Errorf("%s: Cl %.4f (inviscid %.4f), Cd %.5f: want less lift than inviscid and positive drag", e.Name, e.Cl, e.ClInviscid, e.Cd)
		}
	}
	t.Logf("Cl %.4f (inviscid %.4f), Cd %.5f, %d iterations", cs.Cl, cs.ClInviscid, cs.Cd, cs.Iterations)
}

// The main element and flap of TestCoupledMainAndFlap walked down from 0°
// in the polar's half-degree steps reach −9°; from it, every straight
// start at −9.5° (both strategies, and at the half step −9.25°) meets the
// tolerance with more lift than the inviscid, a root implausible
// rejects. The row ends there, not converged and saying why, without the
// continuations and starts from the march that found that root again or
// none (rejectedStraight).
func TestCoupledRejectedStraightStartEnds(t *testing.T) {
	skipUnderRace(t)
	sys, err := NewSystem(mainAndFlap(t))
	if err != nil {
		t.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{1e6, 0.35e6}, TripUpper: 0.05, TripLower: 0.05}
	var warm *CoupledSolution
	for a := 0.0; a >= -9; a -= 0.5 {
		cs, err := sys.SolveCoupled(context.Background(), a, opt, warm)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Fatalf("%.1f°: not converged on the way down (%d iterations)", a, cs.Iterations)
		}
		warm = cs
	}
	cs, err := sys.SolveCoupled(context.Background(), -9.5, opt, warm)
	if err != nil {
		t.Fatal(err)
	}
	// The four straight starts take 29; with the costly routes the
	// chain took 436.
	const maxIterations = 100
	if cs.Converged || cs.Rejected == "" || cs.Iterations > maxIterations {
		t.Errorf("−9.5°: converged %v, rejected %q, %d iterations: want not converged, why, at most %d iterations", cs.Converged, cs.Rejected, cs.Iterations, maxIterations)
	}
	t.Logf("−9.5°: %s, %d iterations", cs.Rejected, cs.Iterations)
}

// A symmetric section at exactly 0° puts the stagnation point on its
// leading-edge node; SolveCoupled then returns the mean of ±0.01°, which
// must give Cl = 0 by symmetry and Ladson's drag at −0.05° (0.00809, NASA
// TM-4074, 80 grit) within the 10 % of the other tripped checks.
func TestCoupledSymmetricAtZero(t *testing.T) {
	skipUnderRace(t)
	sys, err := NewSystem(Config{Elements: []Element{nacaElement(t, "0012", 160)}})
	if err != nil {
		t.Fatal(err)
	}
	cs, err := sys.SolveCoupled(context.Background(), 0, CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !cs.Converged || cs.Note == "" {
		t.Fatalf("converged %v, note %q: want a converged mean of ±0.01° with its note", cs.Converged, cs.Note)
	}
	if math.Abs(cs.Cl) > 1e-6 || math.Abs(cs.Cd/0.00809-1) > 0.10 {
		t.Errorf("Cl %.2g (want 0), Cd %.5f (Ladson 0.00809 ± 10 %%)", cs.Cl, cs.Cd)
	}
}

// A solution of one configuration warm-starts another of the same
// elements and panel counts (a map over ride height steps from one
// clearance to the next): NACA 4412 at 4°, 0.5 and 0.45 chords above the
// ground (lower surface towards it), Re 1e6 tripped at 5 %. The warm
// start must converge to the cold start's answer (same equations, same
// tolerance: within 10⁻³ in Cl and 1 % in Cd) in fewer iterations.
func TestCoupledWarmAcrossSystems(t *testing.T) {
	skipUnderRace(t)
	opt := CoupledOptions{Re: []float64{1e6}, TripUpper: 0.05, TripLower: 0.05}
	at := func(h float64) *System {
		e := transform(nacaElement(t, "4412", 160), 4, 1, model.Point{})
		sys, err := NewSystem(Config{Elements: []Element{e}, Ground: true, GroundY: -h})
		if err != nil {
			t.Fatal(err)
		}
		return sys
	}
	first, err := at(0.5).SolveCoupled(context.Background(), 0, opt, nil)
	if err != nil || !first.Converged {
		t.Fatalf("h/c 0.5: converged %v, err %v", first != nil && first.Converged, err)
	}
	next := at(0.45)
	cold, err := next.SolveCoupled(context.Background(), 0, opt, nil)
	if err != nil || !cold.Converged {
		t.Fatalf("h/c 0.45 cold: converged %v, err %v", cold != nil && cold.Converged, err)
	}
	warm, err := next.SolveCoupled(context.Background(), 0, opt, first)
	if err != nil || !warm.Converged {
		t.Fatalf("h/c 0.45 warm: converged %v, err %v", warm != nil && warm.Converged, err)
	}
	t.Logf("h/c 0.45: cold Cl %.4f Cd %.5f in %d iterations, warm from h/c 0.5 Cl %.4f Cd %.5f in %d", cold.Cl, cold.Cd, cold.Iterations, warm.Cl, warm.Cd, warm.Iterations)
	if math.Abs(warm.Cl-cold.Cl) > 1e-3 || math.Abs(warm.Cd/cold.Cd-1) > 0.01 {
		t.Errorf("warm Cl %.4f Cd %.5f, cold Cl %.4f Cd %.5f: want the same answer", warm.Cl, warm.Cd, cold.Cl, cold.Cd)
	}
	if warm.Iterations >= cold.Iterations {
		t.Errorf("warm start took %d iterations, cold %d", warm.Iterations, cold.Iterations)
	}
}

// A cold start with free transition where the march's layer separates
// in a laminar bubble (NACA 4412 at Re 2.77e5: the demo study's wing at
// 16.7 m/s): every angle converges from cold (through the trip ladder
// where the march cannot start it), and the answer is the polar's — the
// same angle reached from its converged neighbour, as a sweep does —
// within 0.5 % in Cl and 0.02c in transition (the one-station spacing
// of the surface near mid-chord). A consistency check of the method, no
// outside source.
func TestCoupledColdStartBubble(t *testing.T) {
	skipUnderRace(t)
	e := nacaElement(t, "4412", 160)
	sys, err := NewSystem(Config{Elements: []Element{e}})
	if err != nil {
		t.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{2.77e5}}
	ctx := context.Background()
	polar := map[float64]*CoupledSolution{}
	var warm *CoupledSolution
	for a := 0.0; a <= 8; a++ {
		cs, err := sys.SolveCoupled(ctx, a, opt, warm)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Fatalf("polar: α = %g° did not converge", a)
		}
		polar[a], warm = cs, cs
	}
	for _, a := range []float64{1, 2, 4, 5, 8} {
		cs, err := sys.SolveCoupled(ctx, a, opt, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Errorf("α = %g°: no convergence from cold (%d iterations)", a, cs.Iterations)
			continue
		}
		p := polar[a]
		tr, ptr := cs.Elements[0].Upper.Transition, p.Elements[0].Upper.Transition
		t.Logf("α %g°: cold Cl %.4f, transition %.3f, %d iterations; polar Cl %.4f, transition %.3f", a, cs.Cl, tr, cs.Iterations, p.Cl, ptr)
		if math.Abs(cs.Cl/p.Cl-1) > 0.005 || math.Abs(tr-ptr) > 0.02 {
			t.Errorf("α = %g°: cold Cl %.4f, transition %.3f; the polar's %.4f, %.3f", a, cs.Cl, tr, p.Cl, ptr)
		}
	}
}

// Transition held upstream of its e^N position must be released or
// said. NACA 0012 at Re 1e6, free transition, a polar from 4° to 8° in
// half degrees as the engine sweeps one: at 6° and 6.5° the rounds that
// move transition downstream after convergence failed (the laminar layer
// beyond is about to separate: a bubble near the leading edge on the
// upper surface, laminar separation at the trailing edge on the lower),
// and the solutions were returned with transition held at x/c 0.046 and
// 0.969, where the envelope was at ñ 4–5, and a lift curve that fell
// from 0.13 to 0.08 per degree and jumped by 0.10 between 6.5° and 7°.
// Now a warm start that converges with transition held takes the half
// step in α, as one that does not converge does (solveCoupled), and the
// trip ladder (releaseHeld) moves what is still held downstream from the
// held solution, one step at a time.
// In the attached range the lift curve of a section is smooth (common
// practice), so every step of the polar must stay within a quarter of
// the mean step wherever neither neighbour is flagged, and a point whose
// transition stays held must say so (TransitionHeld).
func TestCoupledHeldTransitionReleased(t *testing.T) {
	skipUnderRace(t)
	e := nacaElement(t, "0012", 160)
	sys, err := NewSystem(Config{Elements: []Element{e}})
	if err != nil {
		t.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{1e6}}
	type point struct {
		alpha, cl float64
		held      bool
	}
	var pts []point
	var warm *CoupledSolution
	for a := 4.0; a <= 7.5; a += 0.5 {
		cs, err := sys.SolveCoupled(context.Background(), a, opt, warm)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Fatalf("α = %g°: did not converge", a)
		}
		warm = cs
		el := cs.Elements[0]
		held := el.Upper.TransitionHeld || el.Lower.TransitionHeld
		// Consistency of the flag with the state it describes.
		if h, _ := cs.state.heldTransition(cs.state.freeSides()); (h != [2]bool{}) != held {
			t.Errorf("α = %g°: TransitionHeld %v, but the state says %v", a, held, h)
		}
		t.Logf("α %.1f°: Cl %.4f, transition upper %.3f lower %.3f, held %v, %d iterations", a, cs.Cl, el.Upper.Transition, el.Lower.Transition, held, cs.Iterations)
		pts = append(pts, point{a, cs.Cl, held})
	}
	for _, p := range pts {
		if p.held {
			t.Errorf("α = %g°: transition still held", p.alpha)
		}
	}
	mean := (pts[len(pts)-1].cl - pts[0].cl) / float64(len(pts)-1)
	for i := 1; i < len(pts); i++ {
		if pts[i].held || pts[i-1].held {
			continue
		}
		if d := pts[i].cl - pts[i-1].cl; math.Abs(d/mean-1) > 0.25 {
			t.Errorf("α %g° → %g°: Cl step %.4f, the polar's mean step %.4f", pts[i-1].alpha, pts[i].alpha, d, mean)
		}
	}
}

// Next to a stagnation point the flow accelerates from rest (common
// practice: Ue ∝ ξ in the plane stagnation-point flow, White, Viscous
// Fluid Flow, 3rd ed., 2006, sec. 3-8), so the speeds the boundary-layer
// equations take there must rise along each surface up to the first
// coupled station, and the laminar layer there must stay attached (the
// Falkner–Skan separation shape is H = 4.03, White Table 4-1). Near
// maximum lift the coupled stagnation point lies one or two panels from
// the inviscid one; the near-stagnation stations once kept their inviscid
// speeds, above the first coupled station's, and the layer separated
// there (H 9 at x/c 0.018 on NACA 4412 at 12.5°), which stopped the
// iterations converging at 13°. NACA 4412 at 12.5°, Re 1.52e6, tripped
// as Coles & Wadcock's (TestCoupledNACA4412ColesWadcock).
func TestCoupledNearStagnationSpeedsRise(t *testing.T) {
	skipUnderRace(t)
	sys, err := NewSystem(Config{Elements: []Element{nacaElement(t, "4412", 160)}})
	if err != nil {
		t.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{1.52e6}, TripUpper: 0.025, TripLower: 0.103}
	var cs *CoupledSolution
	for _, a := range []float64{10, 12, 12.5} {
		if cs, err = sys.SolveCoupled(context.Background(), a, opt, cs); err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Fatalf("α = %g°: not converged (%d iterations, residual %.2g)", a, cs.Iterations, cs.Residual)
		}
	}
	st := cs.state
	ue := st.ueLayers()
	for i := range st.st {
		s := &st.st[i]
		if !s.first || s.ref < 0 {
			continue
		}
		for j := i; j < s.ref; j++ {
			if !(ue[j] > 0 && ue[j] < ue[j+1]) {
				t.Errorf("%s surface: speed %.4f at station %d, %.4f at the next: want positive and rising up to the first coupled station", sideNames[s.side], ue[j], j-i, ue[j+1])
			}
		}
		for j := i; j <= s.ref+2; j++ {
			if h := st.m[j] / (ue[j] * st.th[j]); st.st[j].kind == bl.Laminar && h > 4.03 {
				t.Errorf("%s surface, station %d (x/c %.4f): laminar H %.2f, separated next to the stagnation point", sideNames[s.side], j-i, st.st[j].xc, h)
			}
		}
	}
}

var sideNames = [...]string{sideUpper: "upper", sideLower: "lower", sideWake: "wake"}

// At high lift the boundary layers take circulation away and the coupled
// stagnation point moves a panel or two from the layout's; the stations
// between carry the layer of the stagnation region (their equations take
// the speed of a station further on, ueLayers) while the coupled edge
// speed there is near zero or reversed. Their reported layer must be that
// region's, thin and of the stagnation-point shape (Hiemenz, H = 2.216:
// White, Viscous Fluid Flow, 3rd ed., 2006, Table 4-1), not δ* = m/Ue on
// a speed near zero (it read 3 to 27 chords on the two-element example at
// 3°, and drew the boundary-layer view's δ* and H off scale).
func TestCoupledStationsNearMovedStagnation(t *testing.T) {
	skipUnderRace(t)
	sys, err := NewSystem(Config{Elements: []Element{nacaElement(t, "0012", 160)}})
	if err != nil {
		t.Fatal(err)
	}
	cs, err := sys.SolveCoupled(context.Background(), 16, CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}, nil)
	if err != nil || !cs.Converged {
		t.Fatalf("NACA 0012 at 16°, Re 6e6: converged %v, %v", cs != nil && cs.Converged, err)
	}
	reversed := 0
	for _, sf := range []CoupledSurface{cs.Elements[0].Upper, cs.Elements[0].Lower} {
		for _, st := range sf.Stations {
			if st.Ue > 0 {
				continue
			}
			reversed++
			// Tolerances: δ* of a stagnation-point layer at Re 6e6 is
			// of order 1e-4 chord; H within 10 % of Hiemenz's.
			if st.DStar > 1e-3 || math.Abs(st.H/2.216-1) > 0.1 {
				t.Errorf("station at x/c %.4f (Ue %.4f): δ*/c %.3g, H %.3g; want a stagnation-point layer", st.XC, st.Ue, st.DStar, st.H)
			}
		}
	}
	if reversed == 0 {
		t.Error("no station with reversed coupled speed at 16°: the case no longer tests the moved stagnation point; choose an angle where the stagnation point moves")
	}
}
