package model

import (
	"errors"
	"fmt"
	"math"
)

// GeometryError reports a configuration that cannot be solved as placed:
// overlapping or touching elements, a gap too small for its panels, or an
// element below the ground. Elements names the one or two elements
// concerned (indices into the study's elements; the second is -1 when only
// one is involved).
type GeometryError struct {
	Elements [2]int
	Names    [2]string
	Err      error
}

func (e *GeometryError) Error() string {
	if e.Elements[1] < 0 {
		return fmt.Sprintf("element %q: %v", e.Names[0], e.Err)
	}
	return fmt.Sprintf("elements %q and %q: %v", e.Names[0], e.Names[1], e.Err)
}

func (e *GeometryError) Unwrap() error { return e.Err }

// Sentinel geometry errors, matched with errors.Is through GeometryError.
var (
	ErrOverlap  = errors.New("elements overlap or touch")
	ErrSmallGap = errors.New("gap too small for the panels")
)

// minGapPanels is the smallest gap between two elements, in lengths of the
// adjacent panels, that the panel method resolves: two vortex sheets closer
// than about one panel length interact through the log singularity of each
// panel's ends and the tangency condition can no longer be met at a single
// control point per panel (common practice: keep gaps above a panel length).
const minGapPanels = 1.0

// Place repanels each element's section with the study's panelling, scales
// it to its chord, sets it at its angle about its leading edge and moves the
// leading edge to its position, all in metres, as mounted. sections[i] is
// the cleaned unit-chord section of st.Elements[i]. If the study is
// inverted each section is mounted upside down: it is placed in the design
// frame (the element's position mirrored, see DesignElement), then the whole
// configuration is mirrored about y = 0 and each contour's order reversed
// so that it still runs trailing edge → upper → leading edge → lower. A
// positive setting angle thus lowers an inverted element's leading edge.
//
// Place checks the configuration: elements must not overlap or touch and
// their gaps must exceed the local panel length (GeometryError). The ground cannot be crossed: its clearance is measured to the lowest point at each angle.
func Place(st *Study, sections []*Section) (*Layout, error) {
	if len(sections) != len(st.Elements) {
		panic(fmt.Sprintf("model: %d sections for %d elements", len(sections), len(st.Elements)))
	}
	if err := st.Validate(); err != nil {
		return nil, err
	}
	l := &Layout{Inverted: st.Inverted, Ground: st.Ground.Enabled, ClearanceM: st.Ground.ClearanceMM / 1000}
	sum := 0.0
	for i, e := range st.Elements {
		nodes, err := Repanel(sections[i], st.Panelling)
		if err != nil {
			return nil, &FieldError{Field: fmt.Sprintf("elements[%d].section", i), Err: err}
		}
		pe := placeElement(DesignElement(e, st.Inverted), nodes, st.Inverted)
		l.Elements = append(l.Elements, pe)
		sum += pe.Chord
	}
	l.RefChordM = sum
	if st.ReferenceChordMM > 0 {
		l.RefChordM = st.ReferenceChordMM / 1000
	}
	m := l.Elements[0]
	l.PitchRef = m.LeadingEdge.Add(m.TrailingEdge.Sub(m.LeadingEdge).Scale(0.25))
	l.MomentRef = l.PitchRef
	if err := l.check(st); err != nil {
		return nil, err
	}
	return l, nil
}

// DesignElement returns e in the design frame, where its section is
// upright and a positive setting angle is nose-up: e itself for an upright
// study, e mirrored about y = 0 for an inverted one. It is its own inverse.
func DesignElement(e StudyElement, inverted bool) StudyElement {
	if inverted {
		e.YMM = -e.YMM
	}
	return e
}

// placeElement places e, given in the design frame, and mirrors it when
// inverted.
func placeElement(e StudyElement, nodes *Section, inverted bool) PlacedElement {
	c := e.ChordMM / 1000
	origin := Point{e.XMM / 1000, e.YMM / 1000}
	// Nose-up is clockwise in the study frame (x downstream, y up).
	rad := -e.AngleDeg * math.Pi / 180
	n := nodes.Len()
	pts := make([]Point, n)
	for i := range n {
		pts[i] = nodes.At(i).Scale(c).Rotate(Point{}, rad).Add(origin)
	}
	le := nodes.LeadingEdgeIndex()
	if inverted {
		for i := range pts {
			pts[i].Y = -pts[i].Y
		}
		for i, j := 0, n-1; i < j; i, j = i+1, j-1 {
			pts[i], pts[j] = pts[j], pts[i]
		}
		le = n - 1 - le
	}
	return PlacedElement{
		Name: e.Name, Nodes: pts, LE: le, Chord: c,
		LeadingEdge:  pts[le],
		TrailingEdge: pts[0].Add(pts[n-1]).Scale(0.5),
	}
}

// At returns the configuration at angle of attack alphaDeg as the solver
// needs it. In free air the geometry stays and the freestream turns: the
// freestream angle is α (−α when inverted, the mirror image of the upright
// case). Above the ground the freestream stays parallel to the ground and
// the configuration pitches nose-up by α about PitchRef (nose-down in the
// mirrored frame when inverted, which raises downforce); the ground is then
// ClearanceM below the lowest node.
func (l *Layout) At(alphaDeg float64) (elems []PlacedElement, groundY, freestreamDeg float64) {
	if !l.Ground {
		if l.Inverted {
			return l.Elements, 0, -alphaDeg
		}
		return l.Elements, 0, alphaDeg
	}
	rad := -alphaDeg * math.Pi / 180
	if l.Inverted {
		rad = -rad
	}
	low := math.Inf(1)
	elems = make([]PlacedElement, len(l.Elements))
	for k, e := range l.Elements {
		r := e
		r.Nodes = make([]Point, len(e.Nodes))
		for i, p := range e.Nodes {
			q := p.Rotate(l.PitchRef, rad)
			r.Nodes[i] = q
			low = math.Min(low, q.Y)
		}
		r.LeadingEdge = e.LeadingEdge.Rotate(l.PitchRef, rad)
		r.TrailingEdge = e.TrailingEdge.Rotate(l.PitchRef, rad)
		elems[k] = r
	}
	return elems, low - l.ClearanceM, 0
}

// LowestPoint returns the lowest node of the configuration at alphaDeg.
func (l *Layout) LowestPoint(alphaDeg float64) Point {
	elems, _, _ := l.At(alphaDeg)
	best := Point{Y: math.Inf(1)}
	for _, e := range elems {
		for _, p := range e.Nodes {
			if p.Y < best.Y {
				best = p
			}
		}
	}
	return best
}

// check reports overlapping elements and gaps smaller than the panels.
// Only nodes and panels near the other element are examined: those inside
// its bounding box grown by the longest panel either element has, since
// nothing farther away can touch it or come within a panel length.
func (l *Layout) check(st *Study) error {
	for a := 0; a < len(l.Elements); a++ {
		for b := a + 1; b < len(l.Elements); b++ {
			ea, eb := l.Elements[a], l.Elements[b]
			ge := func(err error) error {
				return &GeometryError{Elements: [2]int{a, b}, Names: [2]string{ea.Name, eb.Name}, Err: err}
			}
			reach := minGapPanels * math.Max(longestPanel(ea.Nodes), longestPanel(eb.Nodes))
			boxA, boxB := BoxOf(ea.Nodes...).Grow(reach), BoxOf(eb.Nodes...).Grow(reach)
			if !boxA.Overlaps(boxB) {
				continue
			}
			if polylinesCross(ea.Nodes, eb.Nodes, boxB, boxA) || InPolygon(ea.Nodes[ea.LE], eb.Nodes) || InPolygon(eb.Nodes[eb.LE], ea.Nodes) {
				return ge(ErrOverlap)
			}
			gap, pa, pb := closestApproach(ea.Nodes, eb.Nodes, boxB, boxA)
			need := minGapPanels * math.Max(pa, pb)
			if gap < need {
				return ge(fmt.Errorf("%w: %.2f mm apart where the panels are %.2f mm long; open the gap or raise the panel count", ErrSmallGap, gap*1000, need*1000))
			}
		}
	}
	return nil
}

func longestPanel(pts []Point) float64 {
	m := 0.0
	for i := 0; i+1 < len(pts); i++ {
		m = math.Max(m, pts[i].Dist(pts[i+1]))
	}
	return m
}

// closestApproach returns the smallest node-to-panel distance between two
// polylines and the lengths of the panels of each at that place; nearA and
// nearB bound the parts of a and b near the other (see check).
func closestApproach(a, b []Point, nearB, nearA Box) (d, panelA, panelB float64) {
	d1, la1, lb1 := nodeToPolyline(a, b, nearB, nearA)
	d2, lb2, la2 := nodeToPolyline(b, a, nearA, nearB)
	if d1 <= d2 {
		return d1, la1, lb1
	}
	return d2, la2, lb2
}

// nodeToPolyline returns the smallest distance from a node of p inside
// nearQ to a panel of q inside nearP, the length of a panel of p at that
// node and that of the panel of q.
func nodeToPolyline(p, q []Point, nearQ, nearP Box) (d, lp, lq float64) {
	d = math.Inf(1)
	for i, pt := range p {
		if !nearQ.Contains(pt) {
			continue
		}
		for j := 0; j+1 < len(q); j++ {
			if !nearP.Contains(q[j]) && !nearP.Contains(q[j+1]) {
				continue
			}
			if dd := segmentDistance(pt, q[j], q[j+1]); dd < d {
				d, lq = dd, q[j].Dist(q[j+1])
				if i+1 < len(p) {
					lp = pt.Dist(p[i+1])
				} else {
					lp = pt.Dist(p[i-1])
				}
			}
		}
	}
	return d, lp, lq
}

func segmentDistance(p, a, b Point) float64 {
	ab := b.Sub(a)
	t := 0.0
	if l2 := ab.Dot(ab); l2 > 0 {
		t = math.Max(0, math.Min(1, p.Sub(a).Dot(ab)/l2))
	}
	return p.Dist(a.Add(ab.Scale(t)))
}

// polylinesCross reports whether a panel of a crosses a panel of b; only
// panels with an end inside the other's near box (see check) can.
func polylinesCross(a, b []Point, nearB, nearA Box) bool {
	for i := 0; i+1 < len(a); i++ {
		if !nearB.Contains(a[i]) && !nearB.Contains(a[i+1]) {
			continue
		}
		for j := 0; j+1 < len(b); j++ {
			if !nearA.Contains(b[j]) && !nearA.Contains(b[j+1]) {
				continue
			}
			if segmentsCross(a[i], a[i+1], b[j], b[j+1]) {
				return true
			}
		}
	}
	return false
}

func segmentsCross(p1, p2, q1, q2 Point) bool {
	d1 := p2.Sub(p1).Cross(q1.Sub(p1))
	d2 := p2.Sub(p1).Cross(q2.Sub(p1))
	d3 := q2.Sub(q1).Cross(p1.Sub(q1))
	d4 := q2.Sub(q1).Cross(p2.Sub(q1))
	return d1*d2 <= 0 && d3*d4 <= 0 && !(d1 == 0 && d2 == 0)
}
