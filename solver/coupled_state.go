package solver

import (
	"math"

	bl "sectionbench/solver/boundarylayer"
)

// Sides of a station.
const (
	sideUpper = iota
	sideLower
	sideWake
)

// station is one boundary-layer station of the coupled solution: a body
// node on one side of an element's stagnation point, or a wake node.
type station struct {
	elem, side, node int
	kind             bl.Kind
	prev             [2]int // preceding stations (two for the first wake station: the trailing edges)
	nprev            int
	first            bool    // first station of a surface: the stagnation-point similarity solution
	nearStagnation   bool    // among the first nearStagnationStations of a surface (ueLayers)
	ref              int     // for a nearStagnation station, the first station of its surface past them (ueLayers), or −1
	refFactor        float64 // and the factor of ref's coupled speed that is its own (ueLayers)
	wakeStart        bool
	last             bool    // last station of a surface (the trailing edge): transition is forced there
	xi               float64 // from the stagnation point (surfaces) or the trailing edge (wakes)
	xc               float64
	tripXi           float64 // ξ of the trip on this station's surface, +Inf if none
}

// strategy selects how the Newton iterations treat the two discrete
// choices of the layout, transition station and stagnation panel.
type strategy struct {
	// relaminariseAlways lets a transition station turn laminar within
	// the iterations, tested with the envelope grown at the mean of
	// the laminar rates of its predecessor and of its own (turbulent)
	// state; otherwise transition moves downstream only once the
	// iterations have converged (iterate).
	relaminariseAlways bool
	// followStagnation moves the stagnation points with the coupled
	// edge velocities (restagnate); otherwise the layout stays at the
	// inviscid ones.
	followStagnation bool
}

// sigmaTerm is one term of a source column's dependence on the mass
// defects: σ_c = Σ coef m_station.
type sigmaTerm struct {
	st   int
	coef float64
}

// coupledState is the state of a coupled solution: the layout of the
// stations, the sensitivities of the edge velocities to the mass defects,
// and the boundary-layer variables.
type coupledState struct {
	strategy strategy
	warmUe   []float64 // a warm start's edge velocities, carried onto this layout (warmFrom)
	flow     *coupledFlow
	sol      *Solution
	geo      *geometry
	opt      CoupledOptions
	re       float64 // per unit length
	ncrit    float64
	wakes    []*wakeGeom
	resp     *sourceResponse
	slot     []float64 // per element, the weight of the slot treatment of its trailing-edge stations (slotWeights)

	stag  []int     // per element, the node before the stagnation point in node order
	sStag []float64 // arc length of the stagnation point from the element's first node
	base  []int     // first station of each element
	st    []station
	ue0   []float64 // inviscid edge velocity at each station
	d     []float64 // ∂Ue/∂m, nst × nst, row-major
	// ueKept, on a start copy (StartCopy), is ue() computed before d
	// was dropped.
	ueKept []float64
	// The continuation of a cold start (coupled_newton.go): Ue =
	// (1 − lam) ueMarch + lam (ue0 + D m); ueMarch is nil outside it.
	lam     float64
	ueMarch []float64

	c  []float64 // ñ or √Cτ
	th []float64 // θ
	m  []float64 // mass defect Ue δ*

	work newtonWork // newtonStep's workspace
}

// newCoupledState traces the wakes of the inviscid solution sol, builds
// the source sensitivities and lays out the stations at its stagnation
// points.
func newCoupledState(sol *Solution, opt CoupledOptions) (*coupledState, error) {
	f, err := newCoupledFlow(sol)
	if err != nil {
		return nil, err
	}
	return stateOn(f, opt), nil
}

// stateOn lays out the stations of a coupled solution on flow f at its
// inviscid stagnation points.
func stateOn(f *coupledFlow, opt CoupledOptions) *coupledState {
	geo := f.sol.sys.geo
	cs := &coupledState{flow: f, sol: f.sol, geo: geo, opt: opt, lam: 1, wakes: f.wakes, resp: f.resp}
	cs.re = opt.Re[0] / geo.elems[0].chord
	cs.ncrit = opt.NCrit
	if cs.ncrit <= 0 {
		cs.ncrit = bl.DefaultNCrit
	}
	cs.slot = slotWeights(geo)
	cs.stag = make([]int, len(geo.elems))
	cs.sStag = make([]float64, len(geo.elems))
	cs.reset()
	return cs
}

// reset lays the stations out again at the inviscid stagnation points
// with zeroed variables, keeping the wakes and source sensitivities (the
// costly part), for a start from the march after a failed warm start.
func (cs *coupledState) reset() {
	for k := range cs.geo.elems {
		cs.stag[k], cs.sStag[k] = stagnationSplit(&cs.geo.elems[k], cs.sol.g, -1)
	}
	cs.ueMarch, cs.lam = nil, 1
	cs.layout()
	n := len(cs.st)
	cs.c, cs.th, cs.m = make([]float64, n), make([]float64, n), make([]float64, n)
}

// stagnationSplit returns the node k such that the stagnation point lies
// on panel k (between nodes k and k+1) and its arc length, from the nodal
// strengths gam of the whole system: the sign change of γ (the surface
// speed −γ along the node order) nearest the previous split near (or the
// leading edge when near < 0).
func stagnationSplit(e *elemGeom, gam []float64, near int) (int, float64) {
	ref := e.le
	if near >= 0 {
		ref = near
	}
	best, bestD := -1, math.MaxInt
	lo, hi := 0, e.np-1
	if near >= 0 {
		// Following a solution: the stagnation point moves a few panels
		// at most between iterations; a sign change farther away is a
		// failing iteration's noise, not the stagnation point.
		lo, hi = max(near-maxStagnationMove, 0), min(near+maxStagnationMove, e.np-1)
	}
	for k := lo; k <= hi; k++ {
		ga, gb := gam[e.u0+k], gam[e.u0+k+1]
		if ga >= 0 && gb < 0 || ga > 0 && gb <= 0 {
			if d := abs(k - ref); d < bestD {
				best, bestD = k, d
			}
		}
	}
	if best < 0 {
		if near >= 0 {
			return near, -1 // no move; the caller keeps its position
		}
		best = min(max(ref, 1), e.np-2)
		return best, 0.5 * (e.sNode[best] + e.sNode[best+1])
	}
	ga, gb := gam[e.u0+best], gam[e.u0+best+1]
	f := ga / (ga - gb)
	return best, e.sNode[best] + f*(e.sNode[best+1]-e.sNode[best])
}

// maxStagnationMove is how many panels a stagnation point may move in
// one Newton iteration.
const maxStagnationMove = 3

func abs(i int) int {
	if i < 0 {
		return -i
	}
	return i
}

// layout builds the stations from the splits: per element its upper
// surface from the stagnation point to the first node, its lower surface
// to the last node, then its wake.
func (cs *coupledState) layout() {
	geo := cs.geo
	cs.st = cs.st[:0]
	cs.base = cs.base[:0]
	for k := range geo.elems {
		e := &geo.elems[k]
		cs.base = append(cs.base, len(cs.st))
		kk := cs.stag[k]
		minXi := 1e-4 * e.chord
		add := func(side, node int, xi float64, prev int) {
			s := station{elem: k, side: side, node: node, prev: [2]int{prev, -1}, xi: math.Max(xi, minXi)}
			if prev >= 0 {
				s.nprev = 1
				// Keep stations ordered even where the stagnation point
				// sits next to a node.
				s.xi = math.Max(s.xi, cs.st[prev].xi+minXi)
			} else {
				s.first = true
			}
			s.xc = e.chordPos(e.nodes[node])
			n := 0
			for j := prev; j >= 0; j = cs.st[j].prev[0] {
				n++
			}
			s.nearStagnation = n < nearStagnationStations
			s.ref = -1
			if n == nearStagnationStations {
				for j := len(cs.st) - n; j < len(cs.st); j++ {
					cs.st[j].ref = len(cs.st)
				}
			}
			cs.st = append(cs.st, s)
		}
		prev := -1
		for i := kk; i >= 0; i-- {
			add(sideUpper, i, cs.sStag[k]-e.sNode[i], prev)
			prev = len(cs.st) - 1
		}
		upperTE := prev
		cs.st[upperTE].last = true
		prev = -1
		for i := kk + 1; i <= e.np; i++ {
			add(sideLower, i, e.sNode[i]-cs.sStag[k], prev)
			prev = len(cs.st) - 1
		}
		lowerTE := prev
		cs.st[lowerTE].last = true
		w := cs.wakes[k]
		for j := range w.nodes {
			s := station{elem: k, side: sideWake, node: j, kind: bl.Wake, xi: w.xi[j], xc: 1 + w.xi[j]/e.chord}
			if j == 0 {
				s.wakeStart, s.prev, s.nprev = true, [2]int{upperTE, lowerTE}, 2
			} else {
				s.prev, s.nprev = [2]int{len(cs.st) - 1, -1}, 1
			}
			cs.st = append(cs.st, s)
		}
	}
	cs.setTrips()
	cs.buildSensitivities()
}

// setTrips converts the trips' x/c into arc lengths on each surface.
func (cs *coupledState) setTrips() {
	for i := range cs.st {
		s := &cs.st[i]
		s.tripXi = math.Inf(1)
	}
	for i := range cs.st {
		s := &cs.st[i]
		if s.side == sideWake || s.first {
			continue
		}
		trip := cs.opt.TripUpper
		if s.side == sideLower {
			trip = cs.opt.TripLower
		}
		if !(trip > 0 && trip < 1) {
			continue
		}
		p := &cs.st[s.prev[0]]
		if p.xc < trip && s.xc >= trip {
			f := (trip - p.xc) / (s.xc - p.xc)
			xi := p.xi + f*(s.xi-p.xi)
			// Every station of this surface gets it.
			for j := range cs.st {
				q := &cs.st[j]
				if q.elem == s.elem && q.side == s.side {
					q.tripXi = xi
				}
			}
		}
	}
}

// buildSensitivities sets ue0 and d = ∂Ue/∂m for the current layout,
// from the flow's if it built them before.
func (cs *coupledState) buildSensitivities() {
	s := cs.flow.layoutSensitivities(cs.stag, cs.newSensitivities)
	cs.ue0, cs.d = s.ue0, s.d
	cs.setRefFactors()
}

// newSensitivities builds ue0 and d = ∂Ue/∂m for the current layout.
func (cs *coupledState) newSensitivities() *sensitivities {
	geo, r := cs.geo, cs.resp
	n := len(cs.st)
	ncol := r.cols.n
	// New slices, never written once built: snapshots and the flow's
	// other states share them.
	ue0 := make([]float64, n)
	dd := make([]float64, n*n)
	// σ columns in terms of station mass defects.
	terms := make([][]sigmaTerm, ncol)
	stOfNode := func(k, node int) int {
		if node <= cs.stag[k] {
			return cs.base[k] + cs.stag[k] - node
		}
		return cs.base[k] + node
	}
	wake0 := func(k int) int { return cs.base[k] + geo.elems[k].np + 1 }
	for k := range geo.elems {
		e := &geo.elems[k]
		kk := cs.stag[k]
		for i := 0; i < e.np; i++ {
			p := &geo.panels[e.p0+i]
			a, b := stOfNode(k, i), stOfNode(k, i+1)
			switch {
			case i+1 <= kk:
				terms[e.p0+i] = []sigmaTerm{{a, p.il}, {b, -p.il}}
			case i >= kk+1:
				terms[e.p0+i] = []sigmaTerm{{b, p.il}, {a, -p.il}}
			default:
				terms[e.p0+i] = []sigmaTerm{{a, p.il}, {b, p.il}}
			}
		}
		w := cs.wakes[k]
		nw := len(w.nodes)
		w0 := wake0(k)
		for j := range nw {
			lo, hi := max(j-1, 0), min(j+1, nw-1)
			h := 1 / (w.xi[hi] - w.xi[lo])
			terms[r.cols.wake0[k]+j] = []sigmaTerm{{w0 + hi, h}, {w0 + lo, -h}}
		}
	}
	// Each station's row on its own: split between the machine's cores.
	parallelRows(n, func(lo, hi int) {
		row, ru, rl := make([]float64, ncol), make([]float64, ncol), make([]float64, ncol)
		for i := lo; i < hi; i++ {
			s := &cs.st[i]
			switch {
			case s.side == sideWake && s.wakeStart:
				u, l := &cs.st[s.prev[0]], &cs.st[s.prev[1]]
				cs.sigmaRow(u, ru)
				cs.sigmaRow(l, rl)
				for c := range row {
					row[c] = 0.5 * (ru[c] + rl[c])
				}
				ue0[i] = 0.5 * (cs.ue0Of(u) + cs.ue0Of(l))
			default:
				cs.sigmaRow(s, row)
				ue0[i] = cs.ue0Of(s)
			}
			d := dd[i*n : (i+1)*n] // zero (made above)
			for c, v := range row {
				if v == 0 {
					continue
				}
				for _, t := range terms[c] {
					d[t.st] += v * t.coef
				}
			}
		}
	})
	return &sensitivities{ue0: ue0, d: dd}
}

// setRefFactors sets each near-stagnation station's refFactor
// (ueLayers): the ratio of its inviscid speed to its ref's where the
// inviscid speeds of the surface's near-stagnation stations are positive
// and rise towards ref, as they do next to a stagnation point; otherwise
// (a layout at a coupled stagnation point one or two panels from the
// inviscid one, where the inviscid flow at the first stations runs the
// other way) the ratio of their arc lengths, the plane stagnation-point
// flow's Ue ∝ ξ that the first station's similarity solution assumes
// (boundarylayer.Similarity).
func (cs *coupledState) setRefFactors() {
	for i := range cs.st {
		s := &cs.st[i]
		if !s.first || s.ref < 0 {
			continue
		}
		rising := true
		for j := i; j < s.ref; j++ {
			if !(cs.ue0[j] > 0 && cs.ue0[j] < cs.ue0[j+1]) {
				rising = false
			}
		}
		for j := i; j < s.ref; j++ {
			if rising {
				cs.st[j].refFactor = cs.ue0[j] / cs.ue0[s.ref]
			} else {
				cs.st[j].refFactor = cs.st[j].xi / cs.st[s.ref].xi
			}
		}
	}
}

// speedNode returns the node whose surface speed stands for node i of
// element e: the node itself, except in a trailing edge thinner than its
// panels (system.go), where the strengths at the nodes are unreliable,
// and at the shared node of a closed trailing edge, where the discrete
// speed falls towards the inviscid stagnation point that the
// displacement removes: there the nearest node outside stands in
// (constant extrapolation).
func speedNode(e *elemGeom, i int) int {
	up := max(e.thinUpper, 0)
	lo := max(e.thinLower, 0)
	if !e.open() {
		up, lo = max(up, 1), max(lo, 1)
	}
	if i < up {
		return up
	}
	if i > e.np-lo {
		return e.np - lo
	}
	return i
}

// sigmaRow writes ∂Ue/∂σ of a body or non-first wake station into out
// (one entry per source column).
func (cs *coupledState) sigmaRow(s *station, out []float64) {
	r := cs.resp
	ncol := r.cols.n
	out = out[:ncol]
	if s.side == sideWake {
		row := r.cols.wake0[s.elem] - r.cols.body + s.node
		copy(out, r.wakeUt.Data[row*ncol:(row+1)*ncol])
		return
	}
	e := &cs.geo.elems[s.elem]
	a, b, wb := cs.speedNodes(s)
	sg := 1.0
	if s.side == sideLower {
		sg = -1
	}
	ra := r.inner.nodeRow(r, e.u0+a)[:len(out)]
	rb := r.inner.nodeRow(r, e.u0+b)[:len(out)]
	for c := range out {
		out[c] = sg * ((1-wb)*ra[c] + wb*rb[c])
	}
}

// ue0Of returns the inviscid edge velocity of a body or non-first wake
// station.
func (cs *coupledState) ue0Of(s *station) float64 {
	if s.side == sideWake {
		return cs.resp.wakeU0[cs.resp.cols.wake0[s.elem]-cs.resp.cols.body+s.node]
	}
	e := &cs.geo.elems[s.elem]
	a, b, wb := cs.speedNodes(s)
	in := cs.resp.inner
	g := (1-wb)*in.speedRow(cs.resp, cs.sol.g, e.u0+a, nil) + wb*in.speedRow(cs.resp, cs.sol.g, e.u0+b, nil)
	if s.side == sideLower {
		return -g
	}
	return g
}

// ue returns the edge velocities of the current mass defects (during the
// continuation blended with the march's, homotopySteps).
func (cs *coupledState) ue() []float64 {
	if cs.ueKept != nil {
		return append([]float64(nil), cs.ueKept...)
	}
	n := len(cs.st)
	out := make([]float64, n)
	rowProducts(cs.d, n, cs.m, cs.ue0, out)
	if cs.ueMarch != nil {
		for i, v := range out {
			out[i] = (1-cs.lam)*cs.ueMarch[i] + cs.lam*v
		}
	}
	return out
}

// nearStagnationStations is how many stations at the start of each
// surface take their edge velocity, in the boundary-layer equations, not
// from their own coupled speeds but from the first station past them
// (ueLayers). Next to a stagnation point the panels are shortest, so the
// coupled speeds there respond most to the mass defects (entries of D of
// order 1/panel length), while the layer is thinnest and its
// displacement least: left coupled, these stations were where the Newton
// iterations oscillated on every section tried. The forces and the
// stagnation point still use the coupled speeds (ue).
const nearStagnationStations = 3

// ueLayers returns the edge velocities the boundary-layer equations use:
// those of ue, except at the stations next to each stagnation point
// (nearStagnation), which take a fixed fraction, refFactor, of the
// coupled speed of the first station past them (ref): Ue_i = f_i Ue_ref,
// f_i the ratio of their inviscid speeds (or of their arc lengths,
// setRefFactors), also during the continuation, where ref's speed is
// blended with the march's (or a warm start's): the speeds a warm start
// carries over from its neighbour are near zero next to the neighbour's
// stagnation point, and the continuation from them failed at its first
// step (NACA 0012 at 19.08° from 18.02°).
//
// They used to keep the inviscid speed Ue0 itself. Near maximum lift the
// layers take a quarter of the circulation away and the coupled
// stagnation point lies one or two leading-edge panels from the inviscid
// one, where the coupled speed of the first coupled station is a third
// below its inviscid one: the step from the inviscid speed of the last
// near-stagnation station to it decelerated the layer, which separated
// there (laminar H 9 at x/c 0.018 on NACA 4412 at 12.5°, Re 1.52e6), its
// ñ reached NCrit at 13° and the iterations failed. Scaled with ref's
// coupled speed the speeds rise to it as the inviscid ones do.
func (cs *coupledState) ueLayers() []float64 {
	out := cs.ueIterated()
	for i := range cs.st {
		if s := &cs.st[i]; s.nearStagnation && s.ref >= 0 {
			out[i] = s.refFactor * out[s.ref]
		}
	}
	return out
}

// layerCoupling returns the station whose row of D carries station j's
// edge velocity in the boundary-layer equations (ueLayers) and its
// factor: j itself with 1, or a near-stagnation station's ref with
// ξ_j/ξ_ref.
func (cs *coupledState) layerCoupling(j int) (int, float64) {
	if s := &cs.st[j]; s.nearStagnation && s.ref >= 0 {
		return s.ref, s.refFactor
	}
	return j, 1
}

// coupling returns the factor of D in the edge velocities: lam during
// the continuation, 1 otherwise.
func (cs *coupledState) coupling() float64 {
	if cs.ueMarch != nil {
		return cs.lam
	}
	return 1
}

// snapshot is a copy of everything a Newton iteration may change. ue0
// and d are shared, not copied: a new layout builds new ones
// (buildSensitivities).
type snapshot struct {
	stag     []int
	sStag    []float64
	base     []int
	st       []station
	ue0, d   []float64
	c, th, m []float64
}

func (cs *coupledState) snapshot() snapshot {
	cp := func(x []float64) []float64 { return append([]float64(nil), x...) }
	return snapshot{
		stag: append([]int(nil), cs.stag...), sStag: cp(cs.sStag), base: append([]int(nil), cs.base...),
		st: append([]station(nil), cs.st...), ue0: cs.ue0, d: cs.d,
		c: cp(cs.c), th: cp(cs.th), m: cp(cs.m),
	}
}

func (cs *coupledState) restore(s snapshot) {
	copy(cs.stag, s.stag)
	copy(cs.sStag, s.sStag)
	cs.base = append(cs.base[:0], s.base...)
	cs.st = append(cs.st[:0], s.st...)
	cs.ue0, cs.d = s.ue0, s.d
	copy(cs.c, s.c)
	copy(cs.th, s.th)
	copy(cs.m, s.m)
}
