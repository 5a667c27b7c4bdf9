package solver

import (
	"math"

	"sectionbench/model"
)

// A trailing edge in a slot. When the next element sits just behind an
// element's trailing edge (a slotted flap, the usual rear wing), the flow
// through the slot accelerates the pressure side of the element before it
// right up to the edge while its suction side leaves fast, dumped by the
// flap's circulation (Smith, High-lift aerodynamics, J. Aircraft 12(6),
// 1975). The panel solution's Kutta condition makes the speeds at the two
// trailing-edge nodes equal, so the slot-side trailing-edge station jumps
// to the suction side's speed within its last panel: on the inverted
// two-element example (gap 0.008 chord) by half its speed over less than
// one momentum thickness, which the integral layer cannot follow (its
// shape factor fell below 1 and the Newton iterations oscillated there at
// every angle).
//
// The approximation: in a slot the stations within slotRun of the
// trailing edge take, on each side, the speed of the first node at least
// slotRun from the edge (constant extrapolation over the last stretch, as
// a closed or thin trailing edge already does over its last panel,
// speedNode); the wake's first station takes the mean of the two edges as
// before. A boundary layer cannot respond to a change of its edge speed
// over less than its own thickness, and the pressures of the two sides
// meet over about that length behind the edge, not at the node; slotRun
// is about the slot-side layer's displacement thickness at the edge in
// the cases tried (0.002–0.003 chord). The result depends on it: over the
// last panel only (0.0004 chord at 160 panels) the close slot's Cd was up
// to 10 % higher and fewer settings converged (8 of the 10 of
// TestCoupledCloseSlot, 29 of the 44 map points of the two-element
// example against 9 and 36), over 0.005 chord Cd was 3 % lower again and
// fewer converged. Alone in the flow an element
// keeps the speeds at its trailing-edge nodes (the single-element
// validation stands on them; taking the neighbours there raised NACA
// 0012's Cl by 2–4 % more above Ladson's). Between the two the weight of
// the neighbour falls linearly with the distance from the trailing edge
// to the nearest other element, from 1 within slotNear chords to 0 beyond
// slotFar chords (of the element's own chord), so that a map over the gap
// stays continuous.
const (
	slotNear = 0.1
	slotFar  = 0.3
	slotRun  = 0.002
)

// slotWeights returns, per element, the weight of the slot treatment of
// its trailing-edge stations (above): 1 in a slot, 0 alone in the flow.
// Only an open trailing edge whose edge nodes are its own (no thin
// panels) is concerned; the others already take a neighbour (speedNode).
// slotRun is in the element's chords, slotNear and slotFar likewise.
func slotWeights(geo *geometry) []float64 {
	w := make([]float64, len(geo.elems))
	for k := range geo.elems {
		e := &geo.elems[k]
		if !e.open() || e.thinUpper > 0 || e.thinLower > 0 {
			continue
		}
		d := math.Inf(1)
		for ko := range geo.elems {
			if ko != k {
				d = math.Min(d, distanceToContour(e.teMid, geo.elems[ko].nodes))
			}
		}
		f := (slotFar - d/e.chord) / (slotFar - slotNear)
		w[k] = math.Min(math.Max(f, 0), 1)
	}
	return w
}

// distanceToContour returns the shortest distance from p to the closed
// polygon through nodes.
func distanceToContour(p model.Point, nodes []model.Point) float64 {
	d := math.Inf(1)
	n := len(nodes)
	for i := range n {
		a, b := nodes[i], nodes[(i+1)%n]
		ab := b.Sub(a)
		t := 0.0
		if l2 := ab.X*ab.X + ab.Y*ab.Y; l2 > 0 {
			t = math.Min(math.Max(((p.X-a.X)*ab.X+(p.Y-a.Y)*ab.Y)/l2, 0), 1)
		}
		d = math.Min(d, p.Dist(a.Add(ab.Scale(t))))
	}
	return d
}

// speedNodes returns the nodes whose surface speeds stand for station s,
// a body station, and the weight of the second: speedNode's node, and
// within slotRun chords of a trailing edge in a slot the first node on its
// side at least slotRun from the edge, with the element's slot weight
// (slotWeights).
func (cs *coupledState) speedNodes(s *station) (a, b int, wb float64) {
	e := &cs.geo.elems[s.elem]
	a = cs.resp.inner.stand[e.u0+speedNode(e, s.node)] - e.u0
	w := cs.slot[s.elem]
	if w == 0 || a != s.node {
		return a, a, 0
	}
	run := slotRun * e.chord
	switch {
	case s.node < e.le && e.sNode[s.node]-e.sNode[0] < run:
		b = s.node
		for b < e.le && e.sNode[b]-e.sNode[0] < run {
			b++
		}
		return a, b, w
	case s.node > e.le && e.sNode[e.np]-e.sNode[s.node] < run:
		b = s.node
		for b > e.le && e.sNode[e.np]-e.sNode[b] < run {
			b--
		}
		return a, b, w
	}
	return a, a, 0
}
