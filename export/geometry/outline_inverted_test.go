package geometry

import (
	"math"
	"testing"

	"sectionbench/model"
)

// An inverted wing's skin offset is the mirror image of the upright one,
// for rib templates and for the placed assembly, open and closed trailing
// edges alike (the offset is computed the right way up and mirrored).
func TestOutlineInvertedMirrorsUpright(t *testing.T) {
	for _, closedTE := range []bool{false, true} {
		sec, err := model.NACA("4412", model.NACAOptions{ClosedTE: closedTE})
		if err != nil {
			t.Fatal(err)
		}
		st := model.NewStudy()
		place := func(inverted bool) *model.Layout {
			st.Inverted = inverted
			l, err := model.Place(st, []*model.Section{sec})
			if err != nil {
				t.Fatal(err)
			}
			return l
		}
		up, inv := place(false), place(true)
		for _, placed := range []bool{false, true} {
			opt := OutlineOptions{Placed: placed, SkinMM: 1.5}
			a, err := NewOutline("up", up, opt)
			if err != nil {
				t.Fatalf("closed %v, placed %v, upright: %v", closedTE, placed, err)
			}
			b, err := NewOutline("inv", inv, opt)
			if err != nil {
				t.Fatalf("closed %v, placed %v, inverted: %v", closedTE, placed, err)
			}
			ia, ib := a.Elements[0].Inner, b.Elements[0].Inner
			if len(ia.Points) != len(ib.Points) {
				t.Fatalf("closed %v, placed %v: %d offset points upright, %d inverted", closedTE, placed, len(ia.Points), len(ib.Points))
			}
			// Same set of points, mirrored when placed.
			sign := 1.0
			if placed {
				sign = -1
			}
			for _, p := range ia.Points {
				best := math.Inf(1)
				for _, q := range ib.Points {
					best = math.Min(best, p.Dist(model.Point{X: q.X, Y: sign * q.Y}))
				}
				if best > 1e-6 {
					t.Fatalf("closed %v, placed %v: offset point %v has no mirror (nearest %g mm)", closedTE, placed, p, best)
				}
			}
		}
	}
}
