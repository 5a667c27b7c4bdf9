package report

import (
	"math"
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// TestCoupledRejectedSaysWhy: a point whose iterations met their
// tolerance on a solution the solver rejected carries the reason into the
// report's input, and the words the summary and the results page give
// the convergence with; a point that simply did not converge adds none.
func TestCoupledRejectedSaysWhy(t *testing.T) {
	const why = "the iterations met their tolerance with Cl -0.145, above the inviscid -0.121, which the boundary layers cannot give: a spurious solution"
	nan := math.NaN()
	res := &engine.Result{ClMax: nan, AlphaClMax: nan, Coupled: &engine.CoupledPoint{AlphaDeg: -1, Cl: nan, Cd: nan, Cm: nan, Iterations: 492, Residual: 4.9e-10, Rejected: why,
		Elements: []engine.CoupledElementPoint{{Name: "main", Cl: nan, Cd: nan, Cm: nan, TransitionUpper: nan, TransitionLower: nan, SeparationUpper: nan, SeparationLower: nan, CpMin: nan}}}}
	c := CoupledFrom(model.NewStudy(), res)
	if c.Rejected != why || rejectedWhy(c) != ": "+why {
		t.Errorf("Rejected %q, words %q; want the reason", c.Rejected, rejectedWhy(c))
	}
	res.Coupled.Rejected = ""
	if w := rejectedWhy(CoupledFrom(model.NewStudy(), res)); w != "" || strings.Contains(w, "spurious") {
		t.Errorf("a plain non-converged point: %q, want nothing added", w)
	}
}
