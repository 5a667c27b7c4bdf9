package solver

import (
	"fmt"
	"math"

	"sectionbench/model"
)

// wakeGeom is the wake of one element: a polyline of nodes from the
// trailing-edge midpoint downstream along a streamline of the inviscid
// flow, carrying linear-strength sources (coupled_influence.go).
//
// Where one element's wake runs over the next element's boundary layer
// (a slotted flap: the main's wake passes 0.005–0.014 main chords off the
// flap's suction side, about its own displacement thickness) the two are
// not merged into one confluent layer: the approximation is that each
// keeps its own momentum and shape equations and its own edge velocity
// (the wake's along its streamline, the layer's at the flap's surface),
// and they act on each other only through their displacement sources in
// the panel solution. The flap's layer is then too thin and the wake's
// decay too fast where real confluent flow mixes them (the published
// confluent-layer treatments); no two-element data here measure by how
// much (docs/validation.md §9).
type wakeGeom struct {
	elem   int
	nodes  []model.Point
	xi     []float64     // arc length of each node from the trailing edge
	tan    []model.Point // unit tangent at each node (mean of the adjacent panels)
	panels []panelGeom   // node j → j+1
}

// Wake discretisation. The first wake panel is as long as the mean of the
// element's two trailing-edge panels, so the layer's stations are evenly
// spaced across the edge, but no shorter than minFirstWakePanel chords;
// the panels then grow geometrically. The wake reaches one element chord
// past the configuration's most downstream point (along the freestream),
// far enough that the wake's Ue has recovered to within a few percent of
// U∞ where Squire–Young is applied (common practice: one chord).
//
// The floor keeps the coupled lift converging with the panel count.
// Cosine spacing shortens the edge panels as 1/N², so without it the
// first wake panels shrank from 3.9e-4 chord at 160 panels to 2.5e-5 at
// 640, a thousandth of the layer's displacement thickness at the edge
// (0.003–0.02 chord), and the viscous Cl drifted away from its limit as
// the count rose (NACA 0012, Re 6e6, 4°, tripped at 5 %: 0.44873,
// 0.44960, 0.44956, 0.44867 at 80–640 panels; the demo's wing tripped at
// 30 % of its suction side: the viscous decrement of lift grew by 0.0012,
// 0.0009, 0.0016 per doubling), while a wake whose first panel did not
// shrink with the count converged (engine TestDensityStudyViscousConverges; with
// the floor 0.44873, 0.44960, 0.44974, 0.44975, observed order 4). The
// value lies just below the edge panels of the default 160 cosine panels
// (3.9e-4 chord), so that count and coarser ones lay their wakes as
// before, to the bit; a first panel of 2e-3 chord converged alike.
const (
	minFirstWakePanel = 3.5e-4
	wakeLengthChords  = 1.0
	minWakePanels     = 16
	maxWakeGrowth     = 1.25
)

// traceWake follows the streamline of the inviscid solution sol from the
// trailing edge of element k, returning its geometry. The streamline is
// stepped with the midpoint rule at the wake's own panel lengths.
func traceWake(sol *Solution, k int) (*wakeGeom, error) {
	geo := sol.sys.geo
	e := &geo.elems[k]
	f := sol.field()
	n := len(e.nodes)
	dU := e.nodes[0].Dist(e.nodes[1])
	dL := e.nodes[n-1].Dist(e.nodes[n-2])
	first := math.Max(0.5*(dU+dL), minFirstWakePanel*e.chord)
	// Downstream extent along the freestream.
	fx, fy := sol.cosA, sol.sinA
	far := math.Inf(-1)
	for _, ee := range geo.elems {
		for _, p := range ee.nodes {
			far = math.Max(far, p.X*fx+p.Y*fy)
		}
	}
	te := e.teMid
	length := wakeLengthChords*e.chord + math.Max(0, far-(te.X*fx+te.Y*fy))
	// Panel count and growth: enough panels that the growth ratio stays
	// below maxWakeGrowth.
	np := minWakePanels
	var ratio float64
	for {
		ratio = growthFor(first, length, np)
		if ratio <= maxWakeGrowth || np > 400 {
			break
		}
		np += 4
	}
	w := &wakeGeom{elem: k}
	w.nodes = append(w.nodes, te)
	w.xi = append(w.xi, 0)
	// The first step leaves along the bisector of the trailing-edge panels
	// (the flow leaves a sharp edge smoothly, the Kutta condition).
	tu := e.nodes[0].Sub(e.nodes[1])
	tl := e.nodes[n-1].Sub(e.nodes[n-2])
	dir := tu.Scale(1 / tu.Norm()).Add(tl.Scale(1 / tl.Norm()))
	if dir.Norm() < 1e-9 {
		dir = model.Point{X: fx, Y: fy}
	}
	dir = dir.Scale(1 / dir.Norm())
	p := te
	h := first
	for j := 0; j < np; j++ {
		var q model.Point
		if j == 0 {
			q = p.Add(dir.Scale(h))
		} else {
			u, v, _ := f.at(p.X, p.Y)
			d := model.Point{X: u, Y: v}
			if d.Norm() < 1e-9 {
				d = model.Point{X: fx, Y: fy}
			}
			mid := p.Add(d.Scale(0.5 * h / d.Norm()))
			u, v, _ = f.at(mid.X, mid.Y)
			d = model.Point{X: u, Y: v}
			if d.Norm() < 1e-9 {
				d = model.Point{X: fx, Y: fy}
			}
			q = p.Add(d.Scale(h / d.Norm()))
		}
		if geo.ground && q.Y < geo.groundY+1e-3*e.chord {
			q.Y = geo.groundY + 1e-3*e.chord
		}
		for ko := range geo.elems {
			if ko != k && geo.elems[ko].containsPoint(q) {
				return nil, fmt.Errorf("the wake of element %d (%q) runs into element %d (%q); the elements overlap or touch in the flow", k+1, e.name, ko+1, geo.elems[ko].name)
			}
		}
		w.nodes = append(w.nodes, q)
		w.xi = append(w.xi, w.xi[j]+q.Dist(p))
		p = q
		h *= ratio
	}
	w.panels = make([]panelGeom, np)
	for j := range np {
		w.panels[j] = newPanelGeom(w.nodes[j], w.nodes[j+1], -1, -1, k)
	}
	w.tan = make([]model.Point, np+1)
	for j := range w.tan {
		var t model.Point
		if j > 0 {
			t = t.Add(model.Point{X: w.panels[j-1].tx, Y: w.panels[j-1].ty})
		}
		if j < np {
			t = t.Add(model.Point{X: w.panels[j].tx, Y: w.panels[j].ty})
		}
		w.tan[j] = t.Scale(1 / t.Norm())
	}
	return w, nil
}

// growthFor returns the ratio r > 1 of a geometric series of n panels,
// the first of length a, that adds up to length: a (rⁿ − 1)/(r − 1) =
// length (bisection; 1 if n panels of length a already reach it).
func growthFor(a, length float64, n int) float64 {
	if a*float64(n) >= length {
		return 1
	}
	sum := func(r float64) float64 { return a * (math.Pow(r, float64(n)) - 1) / (r - 1) }
	lo, hi := 1.0+1e-9, 2.0
	for sum(hi) < length {
		hi *= 2
	}
	for range 100 {
		mid := 0.5 * (lo + hi)
		if sum(mid) < length {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// containsPoint reports whether p lies inside the element's contour
// (bounding box first).
func (e *elemGeom) containsPoint(p model.Point) bool {
	return e.box.Contains(p) && model.InPolygon(p, e.nodes)
}
