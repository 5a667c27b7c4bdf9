package ui

import (
	"fmt"
	"math"
	"strings"

	"sectionbench/solver/engine"
)

// This file shows the coupled viscous solution (engine.CoupledPoint) in
// the status line and the results table. A point that did not converge
// shows no viscous number, only its state and the inviscid values beside.

// orDash formats x with prec decimals, or a dash when it is NaN (no
// answer).
func orDash(x float64, prec int) string {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return dash
	}
	return fixed(x, prec)
}

// coupledState says in words how the coupled solution ended.
func coupledState(res *engine.Result) string {
	c := res.Coupled
	switch {
	case c.Note != "":
		return "no viscous solution: " + firstLine(c.Note)
	case c.Rejected != "":
		// Met its tolerance, but on a solution the solver does not
		// accept: a residual of 1e-10 and "not converged" need the why.
		return fmt.Sprintf("viscous solution not converged after %d iteration%s (%s)", c.Iterations, plural(c.Iterations), c.Rejected)
	case !c.Converged:
		return fmt.Sprintf("viscous solution not converged after %d iteration%s", c.Iterations, plural(c.Iterations))
	}
	return fmt.Sprintf("viscous solution converged in %d iteration%s", c.Iterations, plural(c.Iterations))
}

// coupledStatusItems summarises a coupled result in order of importance:
// the viscous Cl (or −Cl) with the inviscid one beside it, Cd and the
// lift-to-drag ratio, the force, Cm, the convergence and the solve time.
// Without convergence the first item says so and the numbers that follow
// are the inviscid ones, labelled.
func coupledStatusItems(res *engine.Result) []string {
	c, s := res.Coupled, res.Solution
	inv := res.Layout != nil && res.Layout.Inverted
	coef, sense, sign := "Cl", "+ up", func(x float64) float64 { return x }
	if inv {
		coef, sense, sign = "−Cl", "+ down", engine.Downforce
	}
	f := res.Forces
	if !c.Converged {
		parts := []string{coupledState(res) + ": no viscous numbers",
			"inviscid " + coef + " " + orDash(sign(s.Cl), 3) + " (" + sense + ")"}
		if f != nil {
			parts = append(parts, "inviscid "+forceName(inv)+" "+orDash(sign(f.InviscidLiftPerSpan), 1)+" N/m")
		}
		return append(parts, "inviscid Cm "+fixed(s.Cm, 3), fmt.Sprintf("solve %d ms", res.Elapsed.Milliseconds()))
	}
	// The forces in newtons come second: on a line too narrow for every
	// item (a caution first takes a third of it) they are what a team
	// reads. Then the lift-to-drag ratio, which nothing else on screen
	// gives, before the Cd, which the results table gives (at the default
	// width, with a caution, the ratio was left off).
	parts := []string{"viscous " + coef + " " + fixed(sign(c.Cl), 3) + " (" + sense + "), inviscid " + fixed(sign(c.ClInviscid), 3)}
	if f != nil {
		parts = append(parts, coupledForceText(f, inv, sign))
	}
	parts = append(parts, coef+"/Cd "+orDash(sign(res.LiftToDrag()), 1), "Cd "+fixed(c.Cd, 4))
	return append(parts, "viscous Cm "+fixed(c.Cm, 3), coupledState(res), fmt.Sprintf("solve %d ms", res.Elapsed.Milliseconds()))
}

// coupledForceText gives the downforce (or lift) and the drag of a
// converged coupled point on the span when the study has one, else per
// metre of span: "downforce 284.5 N, drag 2.01 N on 1 m" (the results
// table gives both per metre).
func coupledForceText(f *engine.Forces, inv bool, sign func(float64) float64) string {
	per, drag := sign(f.LiftPerSpan), f.DragPerSpan
	unit, on := " N/m", ""
	if f.SpanM > 0 {
		per, drag = f.SpanTotal(per), f.SpanTotal(drag)
		unit, on = " N", " on "+num(f.SpanM)+" m"
	}
	t := forceName(inv) + " " + orDash(per, 1) + unit
	if !math.IsNaN(drag) {
		t += ", drag " + orDash(drag, 2) + unit
	}
	return t + on
}

func forceName(inverted bool) string {
	if inverted {
		return "downforce"
	}
	return "lift"
}

// coupledResultsText lays out the results table of a coupled result and
// its note: per element and for the configuration, the viscous
// coefficients, the inviscid Cl beside them, forces, transition and
// separation.
func coupledResultsText(res *engine.Result) (table, note string) {
	c, s, f := res.Coupled, res.Solution, res.Forces
	inv := res.Layout.Inverted
	coef := "Cl"
	sign := func(x float64) float64 { return x }
	if inv {
		coef, sign = "−Cl", engine.Downforce
	}
	cols := []string{"element", "chord mm", "Re", coef + " viscous", coef + " inviscid", "Cd", "Cm viscous"}
	if f != nil {
		cols = append(cols, forceName(inv)+" N/m")
		if f.SpanM > 0 {
			cols = append(cols, fmt.Sprintf("N on %s m span", num(f.SpanM)))
		}
	}
	if f != nil {
		cols = append(cols, "drag N/m")
	}
	cols = append(cols, transitionColumn, separationColumn)
	forceCells := func(perSpan float64) []string {
		if f == nil {
			return nil
		}
		r := []string{orDash(sign(perSpan), 1)}
		if f.SpanM > 0 {
			r = append(r, orDash(f.SpanTotal(sign(perSpan)), 1))
		}
		return r
	}
	var rows [][]string
	for i, e := range c.Elements {
		if i >= len(s.Elements) {
			break
		}
		r := []string{fmt.Sprintf("%d %s", i+1, e.Name), num(elementChordMM(res, i)), reText(res, i),
			orDash(sign(e.Cl), 3), orDash(sign(e.ClInviscid), 3), orDash(e.Cd, 4), orDash(e.Cm, 3)}
		if f != nil && i < len(f.ElementLift) {
			r = append(r, forceCells(f.ElementLift[i])...)
		}
		if f != nil {
			r = append(r, orDash(f.ElementDrag[i], 2))
		}
		r = append(r, xcText(e.TransitionUpper)+" / "+xcText(e.TransitionLower), xcText(e.SeparationUpper)+" / "+xcText(e.SeparationLower))
		rows = append(rows, r)
	}
	if len(c.Elements) > 1 || res.Layout.RefChordM != res.Layout.Elements[0].Chord {
		r := []string{"configuration", num(refChordMM(res)) + " ref", "", orDash(sign(c.Cl), 3), orDash(sign(c.ClInviscid), 3), orDash(c.Cd, 4), orDash(c.Cm, 3)}
		if f != nil {
			r = append(r, forceCells(f.LiftPerSpan)...)
			r = append(r, orDash(f.DragPerSpan, 2))
		}
		rows = append(rows, append(r, "", ""))
	}
	table = alignColumns(cols, rows)

	n := []string{signNote(inv)}
	state := coupledState(res)
	if c.Converged {
		n = append(n, fmt.Sprintf("Viscous: coupled boundary layers and wakes, %s (largest last change %s); a 2-D estimate, validate by test.", state, sci(c.Residual, 2)))
	} else if c.Note != "" {
		n = append(n, "Viscous: "+state+"; only the inviscid Cl is given.")
	} else if c.Rejected != "" {
		n = append(n, "Viscous: "+state+", so no viscous numbers (—); the inviscid Cl is beside.")
	} else {
		n = append(n, fmt.Sprintf("Viscous: not converged after %d iterations, so no viscous numbers (—); the inviscid Cl is beside.", c.Iterations))
	}
	n = append(n, "Elements on their own chord (Cm about their quarter chord), the configuration on the reference chord.",
		xcNote)
	if f != nil && f.SpanM > 0 {
		n = append(n, "Span totals are 2-D values times the span (no end effects).")
	}
	n = append(n, fmt.Sprintf("Solved in %d ms.", res.Elapsed.Milliseconds()))
	return table, strings.Join(append(cautions(res), n...), " ")
}

// cautions are the plausibility flags of a result, as sentences.
func cautions(res *engine.Result) []string {
	var w []string
	for _, f := range resultFlags(res) {
		w = append(w, "Caution, "+string(f.Kind)+": "+f.Message+".")
	}
	return w
}

// signNote says which way Cl is counted.
func signNote(inverted bool) string {
	if inverted {
		return "−Cl is the downforce coefficient: positive pushes the car down."
	}
	return "Cl positive up."
}
