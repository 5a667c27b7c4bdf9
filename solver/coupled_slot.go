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
// The approximation: in a slot each trailing-edge station takes the speed
// of the node before it on its own side (constant extrapolation over the
// last panel, as a closed or thin trailing edge already does, speedNode);
// the wake's first station takes their mean as before. A boundary layer
// cannot respond to a change of its edge speed over less than its own
// thickness, and the pressures of the two sides meet over about that
// length behind the edge, not at the node. Alone in the flow an element
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
)

// slotWeights returns, per element, the weight of the slot treatment of
// its trailing-edge stations (above): 1 in a slot, 0 alone in the flow.
// Only an open trailing edge whose edge nodes are its own (no thin
// panels) is concerned; the others already take a neighbour (speedNode).
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
// a body station, and the weight of the second: speedNode's node, and at
// a trailing edge in a slot the node before it on its side with the
// element's slot weight (slotWeights).
func (cs *coupledState) speedNodes(s *station) (a, b int, wb float64) {
	e := &cs.geo.elems[s.elem]
	a = speedNode(e, s.node)
	w := cs.slot[s.elem]
	switch {
	case w == 0 || a != s.node:
	case s.node == 0:
		return a, 1, w
	case s.node == e.np:
		return a, e.np - 1, w
	}
	return a, a, 0
}
