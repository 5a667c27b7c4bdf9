package engine

import (
	"math"
	"testing"

	"sectionbench/solver"
)

func TestSpanTotal(t *testing.T) {
	for _, c := range []struct {
		name    string
		span    float64
		perSpan float64
		want    float64 // NaN: no span
	}{
		{"metre", 1, 123.4, 123.4},
		{"rear wing", 1.1, -250, -275},
		{"no span", 0, 100, math.NaN()},
	} {
		f := &Forces{SpanM: c.span}
		got := f.SpanTotal(c.perSpan)
		if math.IsNaN(c.want) {
			if !math.IsNaN(got) {
				t.Errorf("%s: %g, want NaN", c.name, got)
			}
			continue
		}
		if math.Abs(got-c.want) > 1e-12*math.Abs(c.want) {
			t.Errorf("%s: %g, want %g", c.name, got, c.want)
		}
	}
}

func TestDownforceSign(t *testing.T) {
	// The engine's forces use the same sign as Downforce, and the span
	// total of its lift is the per-metre lift times the span.
	st, secs := engineStudy(t, "4412")
	st.Flow.SpeedMPS, st.Flow.SpanM, st.Inverted = 25, 1.1, true
	f := run(t, NewEngine(), st, secs, false).Forces
	if f.DownforcePerSpan != Downforce(f.LiftPerSpan) {
		t.Errorf("DownforcePerSpan %g, Downforce(LiftPerSpan) %g", f.DownforcePerSpan, Downforce(f.LiftPerSpan))
	}
	if got, want := f.SpanTotal(f.DownforcePerSpan), 1.1*f.DownforcePerSpan; math.Abs(got-want) > 1e-12*math.Abs(want) || !(got > 0) {
		t.Errorf("downforce over 1.1 m: %g N, want %g N (positive for an inverted cambered section)", got, want)
	}
}

func TestLiftToDrag(t *testing.T) {
	for _, c := range []struct {
		name string
		res  Result
		want float64 // NaN: none
	}{
		{"estimate", Result{Solution: &solver.Solution{Cl: 1.2}, Viscous: &solver.ViscousResult{Cd: 0.015}}, 80},
		{"separated", Result{Solution: &solver.Solution{Cl: 1.2}, Viscous: &solver.ViscousResult{Cd: math.NaN()}}, math.NaN()},
		{"inviscid", Result{Solution: &solver.Solution{Cl: 1.2}}, math.NaN()},
		{"empty", Result{}, math.NaN()},
	} {
		got := c.res.LiftToDrag()
		if math.IsNaN(c.want) != math.IsNaN(got) || (!math.IsNaN(c.want) && math.Abs(got-c.want) > 1e-12*c.want) {
			t.Errorf("%s: %g, want %g", c.name, got, c.want)
		}
	}
}
