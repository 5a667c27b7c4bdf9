package solver

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"sectionbench/assets"
	"sectionbench/model"
)

// The slot weight is 1 for a trailing edge in a slot, 0 alone in the flow
// and linear between slotNear and slotFar chords (coupled_slot.go).
func TestSlotWeights(t *testing.T) {
	for _, tc := range []struct {
		name     string
		flapY    float64 // flap leading edge below the main's trailing edge, main chords
		wantMain float64
		tol      float64
	}{
		{"slot of a few percent of chord", 0.03, 1, 0},
		{"half way between near and far", 0.2, 0.5, 0.1},
		{"beyond the far limit", 0.5, 0, 0},
		{"ten chords apart", 10, 0, 0},
	} {
		main := nacaElement(t, "4412", 160)
		flap := transform(nacaElement(t, "4412", 120), 15, 0.45, model.Point{X: 0.98, Y: -tc.flapY})
		sys := mustSystem(t, Config{Elements: []Element{main, flap}})
		w := slotWeights(sys.geo)
		if math.Abs(w[0]-tc.wantMain) > tc.tol {
			t.Errorf("%s: main element's weight %.3f, want %.2f ± %.2f", tc.name, w[0], tc.wantMain, tc.tol)
		}
	}
}

// A close slot (the usual rear wing: a gap of a few percent of chord)
// converges at these settings of a scan: NACA 4412 main, 0.45-chord NACA
// 4412 flap at 15°, its leading edge 0.02 chord ahead of the main's
// trailing edge and 0.03–0.15 chord below it, α 0° and 4°, Re 1e6 on the
// main chord, tripped at 5 %: 9 of the 10 (0.15 at 4° does not converge;
// before the slot treatment 2 of the 10 did not, with the treatment over
// the last panel only 3). Plausibility (common
// practice): the layers take lift away from every element and each
// wake's drag is positive; the configuration's Cd on the sum of the
// chords lies within 0.008–0.04, the attached range of two-element
// sections at this Reynolds number (from memory; measured here
// 0.012–0.019).
func TestCoupledCloseSlot(t *testing.T) {
	skipUnderRace(t)
	for _, tc := range []struct {
		depth  float64
		alphas []float64
	}{
		{0.03, []float64{0, 4}},
		{0.06, []float64{0, 4}},
		{0.09, []float64{0, 4}},
		{0.12, []float64{0, 4}},
		{0.15, []float64{0}},
	} {
		depth := tc.depth
		main := nacaElement(t, "4412", 160)
		flap := transform(nacaElement(t, "4412", 120), 15, 0.45, model.Point{X: 0.98, Y: -depth})
		flap.Name = "flap"
		sys := mustSystem(t, Config{Elements: []Element{main, flap}})
		for _, alpha := range tc.alphas {
			name := fmt.Sprintf("flap %.2f below, α %g°", depth, alpha)
			cs, err := sys.SolveCoupled(context.Background(), alpha, CoupledOptions{Re: []float64{1e6, 0.45e6}, TripUpper: 0.05, TripLower: 0.05}, nil)
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			if !cs.Converged {
				t.Errorf("%s: not converged (%d iterations, residual %.2g)", name, cs.Iterations, cs.Residual)
				continue
			}
			checkPlausible(t, name, cs, 0.008, 0.04)
		}
	}
}

// checkPlausible checks what any converged multi-element solution must
// give: every element's lift below its inviscid lift in magnitude, a
// positive drag from every wake, and a total Cd within [cdLo, cdHi].
func checkPlausible(t *testing.T, name string, cs *CoupledSolution, cdLo, cdHi float64) {
	t.Helper()
	for _, e := range cs.Elements {
		if !(math.Abs(e.Cl) < math.Abs(e.ClInviscid) && e.Cd > 0) {
			t.Errorf("%s, %s: Cl %.4f (inviscid %.4f), Cd %.5f: want less lift than inviscid and a positive wake drag", name, e.Name, e.Cl, e.ClInviscid, e.Cd)
		}
	}
	if !(cs.Cd >= cdLo && cs.Cd <= cdHi) {
		t.Errorf("%s: Cd %.5f outside %.3f–%.3f", name, cs.Cd, cdLo, cdHi)
	}
	t.Logf("%s: Cl %.4f (inviscid %.4f), Cd %.5f, %d iterations", name, cs.Cl, cs.ClInviscid, cs.Cd, cs.Iterations)
}

// twoElementExample returns the system of the two-element inverted
// example (assets) at angle alphaDeg and ground clearance clearanceMM,
// with each element's Reynolds number at the study's speed.
func twoElementExample(t *testing.T, alphaDeg, clearanceMM float64) (*System, []float64) {
	t.Helper()
	var st *model.Study
	for _, ex := range assets.Examples {
		if strings.HasPrefix(ex.Title, "Two-element") {
			s, err := model.DecodeStudy(ex.Study)
			if err != nil {
				t.Fatal(err)
			}
			st = s
		}
	}
	if st == nil {
		t.Fatal("no two-element example")
	}
	st.Ground.ClearanceMM = clearanceMM
	var secs []*model.Section
	for _, e := range st.Elements {
		s, _, err := model.SectionFromSpec(e.Section.String(), nil)
		if err != nil {
			t.Fatal(err)
		}
		secs = append(secs, s)
	}
	l, err := model.Place(st, secs)
	if err != nil {
		t.Fatal(err)
	}
	cfg, _ := LayoutConfig(l, alphaDeg)
	air, err := model.AirFromCelsius(st.Flow.TemperatureC, st.Flow.PressurePa)
	if err != nil {
		t.Fatal(err)
	}
	var re []float64
	for _, e := range l.Elements {
		re = append(re, model.Reynolds(st.Flow.SpeedMPS, e.Chord, air))
	}
	return mustSystem(t, cfg), re
}

// The inverted two-element example in ground effect (main NACA 4412 of
// 250 mm, flap NACA 4412 of 120 mm at 15°, gap 2 mm, 22.2 m/s: Re 3.7e5
// on the main) converges over a range of angles and ride heights, with
// free transition and tripped at 5 %; before the slot treatment it
// converged at none of these. (Measured with maps, DEVELOPERS.md: tripped,
// every angle from −4° to 8° at 100 mm and every clearance from 40 to 260
// mm at 3° but 240; with free transition about two points in three.)
// Plausibility as
// for the close slot, Cd on the sum of the chords within 0.01–0.08
// (common practice for a loaded two-element rear wing at these Reynolds
// numbers, from memory), and, tripped, downforce rising as the ride
// height falls (common practice; Zerihan & Zhang, J. Aircraft 37(6),
// 2000, for the single element, down to h/c 0.1): over 260 → 80 mm, h/c
// 1.04 → 0.32 on the main chord.
func TestCoupledTwoElementGround(t *testing.T) {
	skipUnderRace(t)
	type point struct{ alpha, clearance float64 }
	for _, tc := range []struct {
		name   string
		trip   float64
		points []point
	}{
		{"tripped, angle scan at 100 mm", 0.05, []point{{-4, 100}, {0, 100}, {4, 100}, {8, 100}}},
		{"tripped, ride heights at 3°", 0.05, []point{{3, 260}, {3, 200}, {3, 160}, {3, 120}, {3, 80}}},
		{"free transition, ride heights at 3° (the example's angle)", 0, []point{{3, 220}, {3, 160}}},
		{"free transition, angle scan at 100 mm", 0, []point{{0, 100}}},
	} {
		prev := math.NaN()
		for _, p := range tc.points {
			name := fmt.Sprintf("%s: α %g°, clearance %g mm", tc.name, p.alpha, p.clearance)
			sys, re := twoElementExample(t, p.alpha, p.clearance)
			cs, err := sys.SolveCoupled(context.Background(), 0, CoupledOptions{Re: re, TripUpper: tc.trip, TripLower: tc.trip}, nil)
			if err != nil {
				t.Fatalf("%s: %v", name, err)
			}
			if !cs.Converged {
				t.Errorf("%s: not converged (%d iterations, residual %.2g)", name, cs.Iterations, cs.Residual)
				prev = math.NaN()
				continue
			}
			checkPlausible(t, name, cs, 0.01, 0.08)
			if strings.HasPrefix(tc.name, "tripped, ride heights") && !(-cs.Cl > prev) && !math.IsNaN(prev) {
				t.Errorf("%s: downforce coefficient %.4f, not above %.4f at the higher clearance", name, -cs.Cl, prev)
			}
			prev = -cs.Cl
		}
	}
	// With free transition at 100 mm, 2° and 3° the only roots the solver
	// finds have the main element's pressure-side layer jump from the
	// attached to the separated branch of H* at one edge speed near its
	// trailing edge (H 3.14 → 3.67 at x/c 0.9983 at 3°), which the
	// boundary-layer equations forbid (branchJump): they are reported as
	// not converged rather than as numbers (they read Cl −3.6832 and
	// −3.3657 before the check saw that crossing). When a root without the
	// jump is found there, these points go back to the converging cases.
	for _, p := range []point{{2, 100}, {3, 100}} {
		sys, re := twoElementExample(t, p.alpha, p.clearance)
		cs, err := sys.SolveCoupled(context.Background(), 0, CoupledOptions{Re: re}, nil)
		if err != nil {
			t.Fatalf("free transition, α %g°, clearance %g mm: %v", p.alpha, p.clearance, err)
		}
		if cs.Converged {
			t.Errorf("free transition, α %g°, clearance %g mm: converged at Cl %.4f; the roots known there jump branches (branchJump %q)", p.alpha, p.clearance, cs.Cl, branchJump(cs))
		}
	}
}
