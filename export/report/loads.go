package report

import (
	"fmt"
	"math"

	"sectionbench/solver"
)

// CentreOfPressureXC is where an element's lift acts along its chord, as a
// fraction of it from the leading edge: x_cp = 1/4 − Cm/Cl, from the lift
// and the moment about the quarter chord on the element's own chord, the
// lift taken normal to the chord (the usual small-angle form; Anderson,
// Fundamentals of Aerodynamics, 5th ed., 2011, §1.6). NaN when the lift is
// too small for the ratio to mean anything.
func CentreOfPressureXC(e solver.ElementSolution) float64 {
	if math.Abs(e.ClPressure) < 1e-3 {
		return math.NaN()
	}
	return 0.25 - e.Cm/e.ClPressure
}

// loadsTable gives each element's load for the people who design the
// mountings: per metre and over the span, with its centre of pressure.
func (r *writer) loadsTable() {
	st, res := r.in.Study, r.in.Result
	f := res.Forces
	if f == nil || len(f.ElementLift) != len(res.Solution.Elements) {
		return
	}
	s := loadSign(st)
	name := "Lift"
	if st.Inverted {
		name = "Downforce"
	}
	var rows [][]string
	for i, e := range res.Solution.Elements {
		span := "—"
		if f.SpanM > 0 {
			span = newtons(s * f.ElementLift[i] * f.SpanM)
		}
		xcp, at := CentreOfPressureXC(e), "—"
		if i < len(res.Layout.Elements) && !math.IsNaN(xcp) {
			pe := res.Layout.Elements[i]
			c := pe.LeadingEdge.Add(pe.TrailingEdge.Sub(pe.LeadingEdge).Scale(xcp))
			at = mm(c.X*1000) + ", " + mm(c.Y*1000)
		}
		rows = append(rows, []string{e.Name, num(s*f.ElementLift[i], 1), span, XC(xcp), at})
	}
	r.need(tableHeight(len(rows)) + 20)
	r.subheading("Loads per element (2-D estimates, for the mountings)")
	r.table([]string{"Element", name + ", N/m", name + fmt.Sprintf(" over %s m, N", num(f.SpanM, 2)), "Centre of pressure, x/c", "Centre of pressure x, y, mm (as set)"},
		[]float64{1.4, 1, 1.2, 1.1, 1.5}, []string{"L", "R", "R", "R", "R"}, rows)
	r.small("Two-dimensional estimates taken as constant along the span, with no end effects: a finite wing carries less, and its load is not uniform. The centre of pressure lies on the element's chord line at x/c = 1/4 − Cm/Cl (own chord, Cm about its quarter chord). Mountings follow the competition's rules and qualified engineering review.")
}
