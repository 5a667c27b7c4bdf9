package engine

import (
	"context"
	"math"
	"testing"

	"sectionbench/solver"
)

// The two-element example (assets/examples/two-element-ground.json: an
// inverted main plane and flap 100 mm above the ground, Re 3.7e5 on the
// main, tripped at 5 %) opens with the coupled viscous solution on, and
// the app sweeps it (−4° to 10°). In ground effect every angle is its own
// system; the sweep starts each from its converged neighbour
// (coupledSweep), so it stays on one root of the coupled equations.
// Asserted: every angle converges (measured: 15 of 15; started each from
// scratch 13, with 8° on another root), and the downforce rises with the
// angle at every step, as a wing's lift does below its stall (common
// practice) — this one does not stall within the sweep: no element
// separates ahead of x/c 0.85 (measured: the flap's suction side from
// 0.90–0.98, the main attached). Each step's rise lies within 15 % of the
// mean of its neighbours' (the lift slope of an unstalled wing changes
// gradually with the angle, common practice; measured within 3 %, while
// a jump between roots made a step twice its neighbours').
func TestExampleTwoElementSweep(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous sweep of two elements: run without -short")
	}
	st, secs := exampleStudy(t, "two-element-ground.json")
	if !st.Viscous.Enabled || !st.Viscous.IsCoupled() {
		t.Fatal("the example does not open with the coupled viscous solution on")
	}
	res := run(t, NewEngine(), st, secs, true)
	rows := res.SweepCoupled
	if len(rows) != 15 {
		t.Fatalf("%d rows, want 15 (−4° to 10°)", len(rows))
	}
	for _, r := range rows {
		t.Logf("α %5.1f°: Cl %.4f (inviscid %.4f), Cd %.5f, %d iterations", r.AlphaDeg, r.Cl, r.ClInviscid, r.Cd, r.Iterations)
		if !r.Converged {
			t.Errorf("α %g°: not converged", r.AlphaDeg)
			continue
		}
		for _, e := range r.Elements {
			for _, s := range []float64{e.SeparationUpper, e.SeparationLower} {
				if s < 0.85 {
					t.Errorf("α %g°: %s separates from x/c %.3f, within the sweep's unstalled range", r.AlphaDeg, e.Name, s)
				}
			}
		}
	}
	rise := make([]float64, len(rows)-1)
	for i := 1; i < len(rows); i++ {
		rise[i-1] = rows[i-1].Cl - rows[i].Cl // downforce: −Cl
		if !(rise[i-1] > 0) {
			t.Errorf("downforce does not rise from %g° (Cl %.4f) to %g° (Cl %.4f)", rows[i-1].AlphaDeg, rows[i-1].Cl, rows[i].AlphaDeg, rows[i].Cl)
		}
	}
	for i := 1; i+1 < len(rise); i++ {
		mean := 0.5 * (rise[i-1] + rise[i+1])
		if math.Abs(rise[i]-mean) > 0.15*mean {
			t.Errorf("the downforce's rise from %g° to %g° is %.4f, against %.4f and %.4f either side: not smooth", rows[i].AlphaDeg, rows[i+1].AlphaDeg, rise[i], rise[i-1], rise[i+1])
		}
	}

	// The study's own point moved as the app's angle control moves it,
	// one engine, steps of at most maxWarmStepDeg: each angle starts from
	// the last converged one (as in free air), and every one converges;
	// started from scratch, 7°, 9° and 10° did not (measured). Not
	// asserted: which root it lands on, for the slot's equations have
	// more than one (DEVELOPERS.md), and which one a start reaches moves
	// with the linear algebra's rounding: the point at 3° from scratch
	// (the example as it opens) sat 3 % from the polar's row until
	// a58ccb8 (Cl −3.294 against −3.202, reached from 0°) and now lands on
	// the polar's root; measured now, every moved point is within 0.0006
	// of its polar row (7°: −4.2087 against −4.2081).
	e := NewEngine()
	for _, a := range []float64{3, 5, 7, 8, 9, 10} {
		one := st.Clone()
		one.Flow.AlphaDeg = a
		p := run(t, e, one, secs, false).Coupled
		row := rows[int(a)+4]
		t.Logf("point at %g° moved from the one before: converged %v, Cl %.4f (the polar's %.4f), %d iterations", a, p.Converged, p.Cl, row.Cl, p.Iterations)
		if !p.Converged {
			t.Errorf("point at %g° moved from the one before: not converged", a)
		}
	}
}

// The sweep the app runs when it opens the two-element example (its point
// at 3° and the coupled sweep from −4° to 10°, each angle in ground effect
// a system of its own). Measured at 06:27 UTC under light load: 8.6 s,
// 15 of 15 rows converged.
func BenchmarkExampleTwoElementSweep(b *testing.B) {
	st, secs := exampleStudy(b, "two-element-ground.json")
	defer reportCounts(b, solver.ReadCoupledCounts())()
	for b.Loop() {
		res, err := NewEngine().Run(context.Background(), Request{Study: st, Sections: secs, Sweep: true})
		if err != nil {
			b.Fatal(err)
		}
		n := 0
		for _, r := range res.SweepCoupled {
			if r.Converged {
				n++
			}
		}
		b.ReportMetric(float64(n), "converged-rows")
	}
}

// TestExampleFreeTransitionSolveWalks: the two-element example with free
// transition (its trips removed) at 3°, the angle it opens at. Started
// from scratch the coupled solution does not converge there (measured:
// 2326 iterations, residual 3e5), while the sweep's row, reached from 0°
// in 1° steps, converged (with transition held upstream). A single solve
// in ground effect then walks from 0° as a sweep does, each angle its own
// pitched system: it had no answer where the polar beside it had one
// (look9's E2). Asserted: the single solve converges, on the sweep row's
// root as a map's point and `solve` must agree (Point.sameRoot: Cl and Cm
// within SolveAgreementTolerance of |Cl|, Cd within
// SolveAgreementToleranceCd of Cd, relative; measured: identical, Cl
// −3.41316 and Cd 0.02498, walked in the sweep's 1° steps; 7e-5 apart in
// Cl when the walk went in 1.5° steps).
func TestExampleFreeTransitionSolveWalks(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves of two elements: run without -short")
	}
	st, secs := exampleStudy(t, "two-element-ground.json")
	st.Viscous.TripUpper, st.Viscous.TripLower = 0, 0
	st.Flow.AlphaDeg = 3
	st.Sweep.FromDeg, st.Sweep.ToDeg, st.Sweep.StepDeg = 0, 3, 1
	res := run(t, NewEngine(), st, secs, true)
	c, row := res.Coupled, res.SweepCoupled[3]
	if row.AlphaDeg != 3 || !row.Converged {
		t.Fatalf("the sweep's row at %g°: converged %v", row.AlphaDeg, row.Converged)
	}
	if !c.Converged {
		t.Fatalf("the single solve at 3° did not converge (%d iterations); the sweep's row did (Cl %.5f)", c.Iterations, row.Cl)
	}
	if p := (Point{Cl: row.Cl, Cd: row.Cd, Cm: row.Cm}); !p.sameRoot(c.Cl, c.Cd, c.Cm) {
		t.Errorf("single solve Cl %.5f Cd %.5f Cm %.5f, the sweep's row Cl %.5f Cd %.5f Cm %.5f: another root", c.Cl, c.Cd, c.Cm, row.Cl, row.Cd, row.Cm)
	}
	t.Logf("single solve Cl %.5f Cd %.5f (held %v), sweep row Cl %.5f Cd %.5f (held %v)", c.Cl, c.Cd, c.Held(), row.Cl, row.Cd, row.Held())
}
