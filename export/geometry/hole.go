package geometry

import (
	"fmt"
	"math"

	"sectionbench/model"
)

// HoleError refuses a hole that leaves less material to the rib's edge
// than the minimum ligament asked for, or breaks out of the rib: the
// element, the hole, where it is and by how much it falls short, in mm.
type HoleError struct {
	Element       string
	Hole          string  // the hole's label, e.g. "spar"
	XC            float64 // position along the chord
	DiameterMM    float64
	LigamentMM    float64 // material left to the rib edge; negative when the hole breaks out
	MinLigamentMM float64
	Edge          string // what the ligament is measured to: "the skin offset" or "the contour"
}

// ShortfallMM is how much more material the hole would need to leave.
func (e *HoleError) ShortfallMM() float64 { return e.MinLigamentMM - e.LigamentMM }

func (e *HoleError) Error() string {
	hole := e.Hole
	if hole == "" {
		hole = "hole"
	}
	what := fmt.Sprintf("leaves %.1f mm to %s", e.LigamentMM, e.Edge)
	if e.LigamentMM < 0 {
		what = fmt.Sprintf("breaks out through %s by %.1f mm", e.Edge, -e.LigamentMM)
	}
	if e.MinLigamentMM == 0 {
		return fmt.Sprintf("element %q: %s %g mm at x/c %.3g %s (move it or make it smaller)", e.Element, hole, e.DiameterMM, e.XC, what)
	}
	return fmt.Sprintf("element %q: %s %g mm at x/c %.3g %s, %.1f mm short of the %.1f mm minimum ligament (move it, make it smaller or lower the minimum)",
		e.Element, hole, e.DiameterMM, e.XC, what, e.ShortfallMM(), e.MinLigamentMM)
}

// checkHole measures the ligament of hole h on element oe: the distance
// from its centre to the nearest edge of the rib (the inward offset when
// there is one, else the contour), less its radius, negative when the
// centre lies outside the rib.
func checkHole(element string, m Mark, h MarkShape, oe OutlineElement, opt OutlineOptions) error {
	rib, edge := oe.Contour, "the contour"
	if oe.Inner != nil {
		rib, edge = oe.Inner.Points, "the skin offset"
	}
	lig := distToEdges(h.Centre, rib) - h.DiameterMM/2
	if !insidePolygon(h.Centre, rib) {
		lig = -distToEdges(h.Centre, rib) - h.DiameterMM/2
	}
	if lig < opt.MinLigamentMM {
		return &HoleError{Element: element, Hole: m.Label, XC: m.XC, DiameterMM: h.DiameterMM,
			LigamentMM: lig, MinLigamentMM: opt.MinLigamentMM, Edge: edge}
	}
	return nil
}

// meanLinePoint returns the midpoint between the two farthest crossings of
// the line c + s·n with the closed contour pts: the mean-line point at c's
// chord station when n is normal to the chord.
func meanLinePoint(pts []model.Point, c, n model.Point) (model.Point, bool) {
	lo, hi := math.Inf(1), math.Inf(-1)
	nn := n.Dot(n)
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		// Side of a and b with respect to the line through c along n.
		da, db := n.Cross(a.Sub(c)), n.Cross(b.Sub(c))
		if (da > 0) == (db > 0) || da == db {
			continue
		}
		p := a.Add(b.Sub(a).Scale(da / (da - db)))
		s := p.Sub(c).Dot(n) / nn
		lo, hi = math.Min(lo, s), math.Max(hi, s)
	}
	if !(hi > lo) {
		return model.Point{}, false
	}
	return c.Add(n.Scale((lo + hi) / 2)), true
}

// distToEdges is the distance from p to the nearest edge of the closed
// polygon pts.
func distToEdges(p model.Point, pts []model.Point) float64 {
	best := math.Inf(1)
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		ab := b.Sub(a)
		t := 0.0
		if l := ab.Dot(ab); l > 0 {
			t = math.Max(0, math.Min(1, p.Sub(a).Dot(ab)/l))
		}
		best = math.Min(best, p.Dist(a.Add(ab.Scale(t))))
	}
	return best
}

// insidePolygon is the even–odd rule: a ray from p towards +x crosses the
// edges an odd number of times from inside.
func insidePolygon(p model.Point, pts []model.Point) bool {
	in := false
	for i := range pts {
		a, b := pts[i], pts[(i+1)%len(pts)]
		if (a.Y > p.Y) != (b.Y > p.Y) && p.X < a.X+(p.Y-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}
