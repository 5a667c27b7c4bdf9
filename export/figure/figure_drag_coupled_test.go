package figure

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"sectionbench/solver/engine"
)

// coupledDragScene is the synthetic scene with a coupled sweep built by
// hand (invented rows): Cl = 0.8 × the inviscid Cl, Cd = 0.01 + 0.002·α²/16,
// the second row not converged (NaN values) and the last past maximum lift.
func coupledDragScene(inverted bool) *Scene {
	sc := synthScene()
	sc.Pins = nil
	sc.Inverted = inverted
	sc.SweepViscous = nil
	nan := math.NaN()
	for i, c := range sc.Sweep {
		r := engine.CoupledPoint{AlphaDeg: c.AlphaDeg, Cl: 0.8 * c.Cl, Cd: 0.01 + 0.002*c.AlphaDeg*c.AlphaDeg/16, Cm: c.Cm, Converged: true}
		switch {
		case i == 1:
			r = engine.CoupledPoint{AlphaDeg: c.AlphaDeg, Cl: nan, Cd: nan, Cm: nan, Iterations: 60}
		case i == len(sc.Sweep)-1:
			r.PastClMax = true
		}
		sc.SweepCoupled = append(sc.SweepCoupled, r)
	}
	return sc
}

// TestCoupledDragRows: the drag views take exactly the converged rows of
// the coupled sweep, in order, with the row past maximum lift flagged,
// and count the row that did not converge.
func TestCoupledDragRows(t *testing.T) {
	sc := coupledDragScene(false)
	rows, failed, ok := coupledDragRows(sc)
	if !ok {
		t.Fatal("coupled sweep not taken")
	}
	if len(failed) != 1 || failed[0] != sc.Sweep[1].AlphaDeg {
		t.Errorf("not converged: %v, want [%g]", failed, sc.Sweep[1].AlphaDeg)
	}
	if len(rows) != len(sc.Sweep)-1 {
		t.Fatalf("%d rows drawn, want %d", len(rows), len(sc.Sweep)-1)
	}
	j := 0
	for i, r := range sc.SweepCoupled {
		if !r.Converged {
			continue
		}
		got := rows[j]
		j++
		if got.alpha != r.AlphaDeg || got.cl != r.Cl || got.cd != r.Cd || got.past != (i == len(sc.Sweep)-1) {
			t.Errorf("row %d: got %+v, want α %g Cl %g Cd %g past %v", i, got, r.AlphaDeg, r.Cl, r.Cd, i == len(sc.Sweep)-1)
		}
	}
	sc.SweepCoupled = sc.SweepCoupled[:2] // does not match the sweep
	if _, _, ok := coupledDragRows(sc); ok {
		t.Error("a coupled sweep of other angles is drawn")
	}
}

// TestDragViewsCoupledSweep: with a coupled sweep the drag polar and the
// lift-to-drag view draw it, name the rows past maximum lift, count the
// rows that did not converge and never draw them as numbers; an inverted
// wing's views give −Cl; without a coupled sweep the estimate's views
// are unchanged.
func TestDragViewsCoupledSweep(t *testing.T) {
	notConv := func(sc *Scene) string {
		return fmt.Sprintf("viscous not converged (1 of %d angles), not drawn", len(sc.SweepCoupled))
	}
	for _, tc := range []struct {
		name     string
		inverted bool
		view     View
		want     []string
	}{
		{"drag polar", false, ViewDragPolar, []string{"Drag polar, viscous (coupled)", "Cd (viscous, coupled)", "Cl against Cd, viscous (coupled)", "viscous, past maximum lift"}},
		{"lift to drag", false, ViewLiftToDrag, []string{"Lift-to-drag ratio against α, viscous (coupled)", "Cl/Cd, viscous (coupled)", "viscous, past maximum lift"}},
		{"drag polar inverted", true, ViewDragPolar, []string{"−Cl against Cd, viscous (coupled)"}},
		{"lift to drag inverted", true, ViewLiftToDrag, []string{"−Cl/Cd, viscous (coupled)"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sc := coupledDragScene(tc.inverted)
			s := svgText(t, tc.view, sc)
			for _, w := range append(tc.want, notConv(sc)) {
				if !strings.Contains(s, w) {
					t.Errorf("view lacks %q", w)
				}
			}
			if strings.Contains(s, "NaN") || strings.Contains(s, "estimate") {
				t.Error("a row that did not converge is drawn as a number, or the estimate is named")
			}
		})
	}
	// The best |Cl/Cd| of the invented rows, found by hand over the
	// converged rows.
	sc := coupledDragScene(false)
	best, bestA := 0.0, 0.0
	for _, r := range sc.SweepCoupled {
		if r.Converged && math.Abs(r.Cl/r.Cd) > best {
			best, bestA = math.Abs(r.Cl/r.Cd), r.AlphaDeg
		}
	}
	if s, w := svgText(t, ViewDragPolar, sc), fmt.Sprintf("best |Cl/Cd| %.1f at α = %s°", best, formatTick(bestA, 2)); !strings.Contains(s, w) {
		t.Errorf("drag polar lacks %q", w)
	}
	// No converged row: no figure, and the reason says so.
	for i := range sc.SweepCoupled {
		sc.SweepCoupled[i].Converged = false
	}
	if err := WriteFigure(new(strings.Builder), ViewDragPolar, sc, "svg", 8, 5, 96); err == nil || !strings.Contains(err.Error(), "converge") {
		t.Errorf("no converged row: error %v", err)
	}
	// Estimate mode: unchanged.
	sc = synthScene()
	if s := svgText(t, ViewDragPolar, sc); !strings.Contains(s, "Cd (boundary-layer estimate)") || strings.Contains(s, "coupled") {
		t.Error("the estimate's drag polar changed")
	}
}
