package engine

import (
	"context"
	"math"
	"slices"
	"testing"

	"sectionbench/model"
)

// A map point says which neighbour's solution it started from
// (Point.StartedFrom), following the map's rule, and what is known of a
// single solve of its setting (Point.Single) is true. The case is hard on
// purpose: inverted NACA 0012 at 6° over the ground, Re 5e5 with free
// transition, and the Newton iterations of each attempt bounded to 3
// (PointOptions), under which the clearances of 120 mm and below do not
// converge from their own start (measured) while 140 mm and above do.
// The one-variable map walks out from its middle (140 mm, solved as
// `solve` solves it), and each point starts from the one before it
// towards the middle, or the one before that. With CompareWithSolve
// each point is compared with the single solve under the same bound.
// That single solve, at 6°, walks from 0° in 1° steps (coupledAt), and
// under the same bound the walk reaches 6° at 100 and 120 mm too
// (measured: 100 mm agrees, 120 mm is on another root, none is "no
// answer"); before single solves in ground effect walked, those two had
// no single answer. The test checks whatever each point says.
func TestMapStartedFromNeighbour(t *testing.T) {
	if testing.Short() {
		t.Skip("coupled viscous solves")
	}
	st, secs := coupledStudy(t)
	st.Viscous.Enabled = false // the map turns it on
	st.Viscous.TripUpper, st.Viscous.TripLower = 0, 0
	st.Flow.Reynolds = 5e5
	st.Inverted = true
	st.Flow.AlphaDeg = 6
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 300}
	const budget = 3
	pts, err := Map(context.Background(), st, secs, []model.SetupRange{mustRange(t, "clearance_mm=100:180:20")}, MapOptions{PointOptions: PointOptions{CoupledMaxIterations: budget}, CompareWithSolve: true}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	from := map[float64][]float64{100: {120, 140}, 120: {140, 160}, 160: {140}, 180: {160, 140}}
	single := func(h float64, maxIt int) *Result {
		one := st.Clone()
		one.Ground.ClearanceMM = h
		one.Viscous = model.Viscous{Enabled: true, Mode: model.ViscousCoupled}
		res, err := NewEngine().Run(context.Background(), Request{Study: one, Sections: secs, CoupledMaxIterations: maxIt})
		if err != nil {
			t.Fatal(err)
		}
		return res
	}
	for _, p := range pts {
		h := p.Values[0]
		c := single(h, budget).Coupled
		t.Logf("%g mm: converged %v from %v, single solve %v (converged %v)", h, p.Converged, p.StartedFrom, p.Single, c.Converged)
		if h == 140 {
			if p.FromNeighbour() || p.Single != SingleIdentical || p.Converged != c.Converged || p.Converged && p.Cl != c.Cl {
				t.Errorf("the middle: from %v, %v, Cl %.9f; solve converged %v Cl %.9f", p.StartedFrom, p.Single, p.Cl, c.Converged, c.Cl)
			}
			continue
		}
		if p.Converged && p.Single != SingleIdentical && (len(p.StartedFrom) != 1 || !slices.Contains(from[h], p.StartedFrom[0])) {
			t.Errorf("%g mm: started from %v, want one of %v", h, p.StartedFrom, from[h])
		}
		switch p.Single {
		case SingleIdentical:
			if p.FromNeighbour() || p.Converged != c.Converged || p.Converged && (p.Cl != c.Cl || p.Cd != c.Cd) {
				t.Errorf("%g mm: identical, from %v, Cl %.9f; solve converged %v Cl %.9f", h, p.StartedFrom, p.Cl, c.Converged, c.Cl)
			}
		case SingleNoAnswer:
			if c.Converged || !p.Converged {
				t.Errorf("%g mm: no single solve, but it converges (Cl %.6f)", h, c.Cl)
			}
			if d := single(h, 0).Coupled; d.Converged {
				t.Logf("%g mm from %v mm: Cl %.6f Cd %.6f; a single solve with the default bound: Cl %.6f Cd %.6f (ΔCl %.2g)", h, p.StartedFrom[0], p.Cl, p.Cd, d.Cl, d.Cd, math.Abs(p.Cl-d.Cl))
			}
		case SingleAgrees, SingleAnotherRoot:
			if !c.Converged || p.SingleCl != c.Cl || p.sameRoot(c.Cl, c.Cd, c.Cm) != (p.Single == SingleAgrees) {
				t.Errorf("%g mm: %v, single Cl %.9f; solve converged %v Cl %.9f", h, p.Single, p.SingleCl, c.Converged, c.Cl)
			}
		default:
			t.Errorf("%g mm: not compared", h)
		}
	}
}
