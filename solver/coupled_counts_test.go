package solver

import (
	"context"
	"testing"
)

// The counts of the coupled solution's work (CoupledCounts) add up: a
// solve takes as many Newton steps as it reports iterations, every step
// solves its mass-defect system once, by a factorisation or by GMRES on
// kept factors, and the first step of a start from the march has no
// kept factors to use. NACA 0012 at 160 panels, Re 6e6 tripped at 5 %,
// 4° from the march and 5° from 4°. (The solver's tests run one at a
// time: nothing else adds to the counts meanwhile.)
func TestCoupledCountsAddUp(t *testing.T) {
	sys := mustSystem(t, Config{Elements: []Element{nacaElement(t, "0012", 160)}})
	opt := CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}
	var warm *CoupledSolution
	for _, c := range []struct {
		name  string
		alpha float64
	}{{"from the march", 4}, {"from 4°", 5}} {
		t.Run(c.name, func(t *testing.T) {
			c0 := ReadCoupledCounts()
			cs, err := sys.SolveCoupled(context.Background(), c.alpha, opt, warm)
			if err != nil || !cs.Converged {
				t.Fatalf("not converged: %v", err)
			}
			d := ReadCoupledCounts().Sub(c0)
			t.Logf("%d Newton steps, %d factorisations, %d GMRES solves", d.NewtonSteps, d.Factorisations, d.KrylovSolves)
			if d.NewtonSteps != int64(cs.Iterations) {
				t.Errorf("%d Newton steps counted, the solution reports %d iterations", d.NewtonSteps, cs.Iterations)
			}
			if d.Factorisations+d.KrylovSolves != d.NewtonSteps {
				t.Errorf("%d factorisations and %d GMRES solves for %d Newton steps", d.Factorisations, d.KrylovSolves, d.NewtonSteps)
			}
			if d.Factorisations < 1 {
				t.Error("no factorisation counted")
			}
			warm = cs
		})
	}
}
