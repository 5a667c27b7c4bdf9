package ui

import (
	"strings"
	"testing"

	"sectionbench/solver/engine"
)

// TestCoupledStateSaysWhyRejected: a point whose iterations met their
// tolerance on a solution the solver rejected says why in the app's
// state, beside the iterations; a point that simply did not converge
// keeps its short words.
func TestCoupledStateSaysWhyRejected(t *testing.T) {
	const why = "the iterations met their tolerance with Cl -0.145, above the inviscid -0.121, which the boundary layers cannot give: a spurious solution"
	res := &engine.Result{Coupled: &engine.CoupledPoint{Iterations: 492, Residual: 4.9e-10, Rejected: why}}
	if s := coupledState(res); !strings.Contains(s, "not converged after 492 iterations") || !strings.Contains(s, why) {
		t.Errorf("rejected point: %q, want the iterations and the reason", s)
	}
	res.Coupled.Rejected = ""
	if s := coupledState(res); s != "viscous solution not converged after 492 iterations" {
		t.Errorf("plain non-converged point: %q", s)
	}
}
