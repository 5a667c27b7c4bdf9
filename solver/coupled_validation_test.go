package solver

import (
	"context"
	"math"
	"testing"
)

// The coupled solution on NACA 0012 at Re 6e6 with transition fixed at 5 %
// chord on both surfaces (Ladson's grit; the position is from memory),
// against Ladson's 80-grit polar (NASA TM-4074, 1988; testdata/validation),
// swept upwards from 0° with each angle warm-started from the one before.
//
// Drag: within 10 % for α ≤ 10° (the tolerance: the spread between
// Ladson's three grit sizes is ± 4 % and a lag-entrainment integral method
// is good to a few percent on attached tripped layers). Lift: the coupled
// Cl must lie below the inviscid one and closer to the measurement. The
// issue's 3 % on Cl is NOT met yet: the coupled Cl runs 4–6 % above
// Ladson's (a lift slope of 0.112/deg against 0.106); the test logs the
// figures and DEVELOPERS.md lists it among the open items.
func TestCoupledNACA0012Ladson(t *testing.T) {
	g80 := ladsonPolars(t)["grit_80"]
	e := nacaElement(t, "0012", 160)
	sys, err := NewSystem(Config{Elements: []Element{e}})
	if err != nil {
		t.Fatal(err)
	}
	opt := CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}
	var warm *CoupledSolution
	for i, a := range g80.AlphaDeg {
		if a < 0 || a > 10.5 {
			continue
		}
		cs, err := sys.SolveCoupled(context.Background(), a, opt, warm)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Errorf("α = %.2f°: not converged (%d iterations, residual %.2g)", a, cs.Iterations, cs.Residual)
			continue
		}
		warm = cs
		cl, cd := g80.Cl[i], g80.Cd[i]
		dcd := cs.Cd/cd - 1
		t.Logf("α %5.2f°: Cl %.4f (inviscid %.4f, Ladson %.4f, %+.1f %%), Cd %.5f (Ladson %.5f, %+.1f %%), %d iterations",
			a, cs.Cl, cs.ClInviscid, cl, 100*(cs.Cl/cl-1), cs.Cd, cd, 100*dcd, cs.Iterations)
		if math.Abs(dcd) > 0.10 {
			t.Errorf("α = %.2f°: Cd %.5f, Ladson %.5f: %.1f %% off, 10 %% allowed", a, cs.Cd, cd, 100*dcd)
		}
		if a > 1 && !(cs.Cl < cs.ClInviscid && math.Abs(cs.Cl-cl) < math.Abs(cs.ClInviscid-cl)) {
			t.Errorf("α = %.2f°: coupled Cl %.4f is not between the inviscid %.4f and Ladson's %.4f", a, cs.Cl, cs.ClInviscid, cl)
		}
		if tr := cs.Elements[0].Upper.Transition; !(tr > 0 && tr <= 0.05+1e-9) {
			t.Errorf("α = %.2f°: upper transition at x/c %.4f, want at or ahead of the trip at 0.05", a, tr)
		}
	}
}
