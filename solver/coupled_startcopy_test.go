package solver

import (
	"context"
	"math"
	"testing"

	"sectionbench/model"
)

// A solve started from a StartCopy gives the answer started from the
// solution itself to the last bit (it reads the same numbers), on
// another System in ground effect (a map over ride height) and on the
// same System in free air (a polar's next angle); the copy holds no
// sensitivities, flow or panel system, and what a solve tries from it is
// not recorded on the original.
func TestCoupledStartCopy(t *testing.T) {
	skipUnderRace(t)
	opt := CoupledOptions{Re: []float64{1e6}, TripUpper: 0.05, TripLower: 0.05}
	ground := func(h float64) *System {
		e := transform(nacaElement(t, "4412", 160), 4, 1, model.Point{})
		sys, err := NewSystem(Config{Elements: []Element{e}, Ground: true, GroundY: -h})
		if err != nil {
			t.Fatal(err)
		}
		return sys
	}
	free, err := NewSystem(Config{Elements: []Element{nacaElement(t, "0012", 160)}})
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name          string
		from, to      *System
		alpha0, alpha float64
	}{
		{"ground, h/c 0.5 to 0.45", ground(0.5), ground(0.45), 0, 0},
		{"free air, 3° to 4°", free, free, 3, 4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ctx := context.Background()
			first, err := tc.from.SolveCoupled(ctx, tc.alpha0, opt, nil)
			if err != nil || !first.Converged {
				t.Fatalf("start: converged %v, err %v", first != nil && first.Converged, err)
			}
			cp := first.StartCopy()
			if cp.state.d != nil || cp.state.flow != nil || cp.state.resp != nil || cp.state.sol.sys.lu.Data != nil || cp.Inviscid != nil {
				t.Errorf("the copy holds more than a start reads")
			}
			fromCopy, err := tc.to.SolveCoupled(ctx, tc.alpha, opt, cp)
			if err != nil || !fromCopy.Converged {
				t.Fatalf("from the copy: converged %v, err %v", fromCopy != nil && fromCopy.Converged, err)
			}
			if n := len(first.attempts.done); n != 0 {
				t.Errorf("the original recorded %d attempts made from its copy", n)
			}
			fromFirst, err := tc.to.SolveCoupled(ctx, tc.alpha, opt, first)
			if err != nil || !fromFirst.Converged {
				t.Fatalf("from the solution: converged %v, err %v", fromFirst != nil && fromFirst.Converged, err)
			}
			same := func(what string, a, b float64) {
				if math.Float64bits(a) != math.Float64bits(b) {
					t.Errorf("%s: %v from the copy, %v from the solution", what, a, b)
				}
			}
			same("Cl", fromCopy.Cl, fromFirst.Cl)
			same("Cd", fromCopy.Cd, fromFirst.Cd)
			same("Cm", fromCopy.Cm, fromFirst.Cm)
			if fromCopy.Iterations != fromFirst.Iterations {
				t.Errorf("iterations: %d from the copy, %d from the solution", fromCopy.Iterations, fromFirst.Iterations)
			}
			for k, e := range fromFirst.Elements {
				for i, s := range e.Lower.Stations {
					same("lower θ", fromCopy.Elements[k].Lower.Stations[i].Theta, s.Theta)
				}
			}
			t.Logf("%d iterations, Cl %.6f", fromCopy.Iterations, fromCopy.Cl)
		})
	}
}
