package solver

import (
	"context"
	"math"
	"os"
	"testing"

	"sectionbench/model"
)

// A closed trailing edge with a thin wedge (E387's file, about 4° over its
// last panels) solved coupled at 4°, Re 2e5, tripped at 10 % (no bubble,
// whose position moves with the panelling by itself): the viscous
// decrement of Cl must not depend on the panel count (consistency of the
// method), and must agree with the same section opened by 0.1 % of chord
// and solved with its base panel, an independent treatment of the edge
// (the opening's own effect on the decrement is of the order of the gap
// over the displacement thickness at the edge, 0.001/0.015). Tolerance
// 0.005 in Cl between 160 and 320 panels and against the opened edge.
// Before the stations read the outer speed (coupled_interior.go) the
// decrement was 0.040 at 160 panels and 0.061 at 320, against 0.065 for
// the opened edge; measured now 0.067, 0.069 and 0.065.
func TestCoupledClosedEdgePanelCount(t *testing.T) {
	skipUnderRace(t)
	f, err := os.Open("../testdata/validation/e387.dat")
	if err != nil {
		t.Fatal(err)
	}
	parsed, err := model.ParseCoordinates(f, "e387.dat")
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	decrement := func(panels int, gap float64) float64 {
		t.Helper()
		sec, _, err := model.Clean(parsed.Name, parsed.Points, model.CleanOptions{})
		if err != nil {
			t.Fatal(err)
		}
		if sec, err = model.Repanel(sec, model.Panelling{Panels: panels, Spacing: model.SpacingCosine, Nose: 0.5, Tail: 0.2}); err != nil {
			t.Fatal(err)
		}
		e := Element{Name: sec.Name(), Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}
		for i := range e.Nodes {
			d := 0.5 * gap * e.Nodes[i].X
			if i > e.LE {
				d = -d
			}
			e.Nodes[i].Y += d
		}
		sys, err := NewSystem(Config{Elements: []Element{e}})
		if err != nil {
			t.Fatal(err)
		}
		if open := sys.geo.elems[0].open(); open != (gap > 0) {
			t.Fatalf("%d panels, gap %g: open trailing edge %v", panels, gap, open)
		}
		cs, err := sys.SolveCoupled(context.Background(), 4, CoupledOptions{Re: []float64{2e5}, TripUpper: 0.1, TripLower: 0.1}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if !cs.Converged {
			t.Fatalf("%d panels, gap %g: not converged", panels, gap)
		}
		u, l := cs.Elements[0].Upper.Stations, cs.Elements[0].Lower.Stations
		t.Logf("%d panels, gap %g: Cl %.4f (inviscid %.4f, decrement %.4f), Cd %.5f, edge speeds %.4f and %.4f",
			panels, gap, cs.Cl, cs.ClInviscid, cs.ClInviscid-cs.Cl, cs.Cd, u[len(u)-1].Ue, l[len(l)-1].Ue)
		return cs.ClInviscid - cs.Cl
	}
	d160, d320 := decrement(160, 0), decrement(320, 0)
	open := decrement(160, 0.001)
	if math.Abs(d320-d160) > 0.005 {
		t.Errorf("viscous decrement %.4f at 160 panels, %.4f at 320: want within 0.005", d160, d320)
	}
	if math.Abs(d160-open) > 0.005 {
		t.Errorf("viscous decrement %.4f with the closed edge, %.4f with it opened by 0.1 %%: want within 0.005", d160, open)
	}
}
