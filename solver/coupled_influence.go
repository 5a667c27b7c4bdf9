package solver

import (
	"math"
	"runtime"
	"sync"

	"gonum.org/v1/gonum/blas/blas64"
)

// The displacement effect of the boundary layers and wakes is modelled by
// sources (the equivalent-source or transpiration model of Lighthill, On
// displacement thickness, J. Fluid Mech. 4(4), 1958): a source sheet of
// strength σ = d(Ue δ*)/dξ, the streamwise growth of the mass defect
// m = Ue δ*, displaces the outer flow as the layer does. Body panels
// carry constant-strength sources (one per panel, from the mass defects
// at its two nodes), wakes linear-strength ones (continuous, from the
// wake's nodal mass defects). The body's flow tangency is held on the
// inner face of its source sheet, so the fluid inside stays at rest and
// the outer normal velocity is σ; the surface speed is still −γ.
//
// With the sources, the panel system reads A γ + S σ = b(α); A's kept LU
// factors give G = −A⁻¹ S, the change of every vortex strength per unit
// source, once per geometry and wake. The edge velocity at every station
// is then linear in σ and so in m (coupled_newton.go):
//
//	Ue = Ue_inviscid + D m.

// linearSource returns the panel-frame velocity coefficients (ua, va) of
// σa and (ub, vb) of σb of a linear-strength source panel, σ(ξ) = σa +
// (σb − σa) ξ/L, at panel-frame point (x, y) of a panel of inverse length
// il, given Δθ and λ = ln(r1/r2) as for the vortex panel (influence.go).
// Integrating the point source σ dξ (x' − ξ, y')/(2π r²) along the panel
// (as Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001, sec. 10.3.1):
//
//	2π u' = σa λ + (σb − σa)/L (x' λ − L + y' Δθ)
//	2π v' = σa Δθ + (σb − σa)/L (x' Δθ − y' λ)
func linearSource(x, y, il, dth, lam float64) (ua, va, ub, vb float64) {
	const inv2pi = 1 / (2 * math.Pi)
	p := (x*lam+y*dth)*il - 1
	q := (x*dth - y*lam) * il
	return (lam - p) * inv2pi, (dth - q) * inv2pi, p * inv2pi, q * inv2pi
}

// sourceColumns indexes the sources of a configuration with wakes: the
// body panels in the geometry's order, then the wake nodes element after
// element.
type sourceColumns struct {
	body  int   // number of body panels
	wake0 []int // first column of each element's wake
	n     int
}

func newSourceColumns(geo *geometry, wakes []*wakeGeom) sourceColumns {
	c := sourceColumns{body: len(geo.panels), n: len(geo.panels)}
	for _, w := range wakes {
		c.wake0 = append(c.wake0, c.n)
		c.n += len(w.nodes)
	}
	return c
}

// sourceVelocity writes into u and v (one entry per source column) the
// velocity that each unit source induces at (px, py), images included in
// ground mode. selfPanel ≥ 0 is the body panel whose midpoint the point is
// (its inner-face limit is taken: the outward normal velocity −½);
// wake ≥ 0 with node ≥ 0 says the point is that wake node (the two wake
// panels meeting there have their coincident logarithms cancelled, the
// principal value along a smooth wake).
func sourceVelocity(geo *geometry, wakes []*wakeGeom, cols sourceColumns, px, py float64, selfPanel, wake, node int, u, v []float64) {
	clear(u[:cols.n])
	clear(v[:cols.n])
	addSources(geo, wakes, cols, px, py, selfPanel, wake, node, u, v, false)
	if geo.ground {
		addSources(geo, wakes, cols, px, 2*geo.groundY-py, -1, -1, -1, u, v, true)
	}
}

// addSources adds the unit-source velocities at (px, py); with image set
// the point is the mirror of the real one and the reflection (u, −v) of
// the velocity is added, the image of a source being a source of the same
// sign (system.go).
func addSources(geo *geometry, wakes []*wakeGeom, cols sourceColumns, px, py float64, selfPanel, wake, node int, u, v []float64, image bool) {
	addBodySources(geo, px, py, selfPanel, u, v, image)
	addWakeSources(wakes, cols, px, py, wake, node, u, v, image)
}

// addBodySources is addSources for the body panels' columns.
func addBodySources(geo *geometry, px, py float64, selfPanel int, u, v []float64, image bool) {
	sgn := 1.0
	if image {
		sgn = -1
	}
	for j := range geo.panels {
		p := &geo.panels[j]
		var dth, lam float64
		if j == selfPanel {
			dth, lam = math.Pi, 0
		} else {
			r1x, r1y := px-p.x1, py-p.y1
			r2x, r2y := px-p.x2, py-p.y2
			floor := minDistFrac * minDistFrac * p.l * p.l
			lam = 0.5 * math.Log(math.Max(r1x*r1x+r1y*r1y, floor)/math.Max(r2x*r2x+r2y*r2y, floor))
			dth = math.Atan2(r1x*r2y-r1y*r2x, r1x*r2x+r1y*r2y)
		}
		lu, lv := constantSource(dth, lam)
		u[j] += lu*p.tx - lv*p.ty
		v[j] += sgn * (lu*p.ty + lv*p.tx)
	}
}

// addWakeSources is addSources for the wakes' columns.
func addWakeSources(wakes []*wakeGeom, cols sourceColumns, px, py float64, wake, node int, u, v []float64, image bool) {
	sgn := 1.0
	if image {
		sgn = -1
	}
	for k, w := range wakes {
		c0 := cols.wake0[k]
		for j := range w.panels {
			p := &w.panels[j]
			r1x, r1y := px-p.x1, py-p.y1
			r2x, r2y := px-p.x2, py-p.y2
			s1, s2 := r1x*r1x+r1y*r1y, r2x*r2x+r2y*r2y
			dth := math.Atan2(r1x*r2y-r1y*r2x, r1x*r2x+r1y*r2y)
			switch {
			case k == wake && node == j && j == 0:
				// The wake's start on a base panel's midpoint (an
				// open trailing edge): the sheet's end, whose
				// logarithm is left out as if the sheet went on
				// upstream into the base (principal value).
				s1, dth = p.l*p.l, 0
			case k == wake && node == j:
				s1, dth = 1, 0
			case k == wake && node == j+1:
				s2, dth = 1, 0
			}
			floor := minDistFrac * minDistFrac * p.l * p.l
			lam := 0.5 * math.Log(math.Max(s1, floor)/math.Max(s2, floor))
			x := r1x*p.tx + r1y*p.ty
			y := -r1x*p.ty + r1y*p.tx
			ua, va, ub, vb := linearSource(x, y, p.il, dth, lam)
			u[c0+j] += ua*p.tx - va*p.ty
			v[c0+j] += sgn * (ua*p.ty + va*p.tx)
			u[c0+j+1] += ub*p.tx - vb*p.ty
			v[c0+j+1] += sgn * (ub*p.ty + vb*p.tx)
		}
	}
}

// sourceResponse is what the coupled solution needs of the panel system
// with wakes: for every source column, the change of each nodal vortex
// strength (gam, Unknowns() × columns) and of the velocity along each wake
// node's tangent (wakeUt, one row per wake node, element after element).
type sourceResponse struct {
	cols   sourceColumns
	gam    blas64.General
	wakeUt blas64.General
	wakeU0 []float64 // the inviscid speed along each wake node's tangent
	// inner corrects the surface speeds of the aft nodes for the flow
	// inside a thin section (coupled_interior.go).
	inner *interiorSpeeds
}

// newSourceResponse assembles S, solves G = −A⁻¹ S with the kept factors
// and the wake velocities per unit source: Ut = t · (V_vortex(G σ) + V_source(σ)).
func newSourceResponse(sol *Solution, wakes []*wakeGeom) *sourceResponse {
	s := sol.sys
	geo := s.geo
	cols := newSourceColumns(geo, wakes)
	n := geo.n
	r := &sourceResponse{cols: cols}
	// G = −A⁻¹ S, S's rows the tangency at every panel midpoint and base
	// midpoint (0 on Kutta rows). The body panels' columns do not depend
	// on the wakes (nor, in free air, on the angle): they come from the
	// System, built once (bodySourceResponse); the wakes' are built here.
	// Each column is solved on its own, so the two parts are what solving
	// them together gave, to the last bit.
	body := s.bodySourceResponse()
	nwc := cols.n - cols.body
	wg := blas64.General{Rows: n, Cols: nwc, Stride: nwc, Data: make([]float64, n*nwc)}
	rows := sourceRows(geo)
	parallelRows(len(rows), func(lo, hi int) {
		u, v := make([]float64, cols.n), make([]float64, cols.n)
		for _, rp := range rows[lo:hi] {
			node := -1
			if rp.wake >= 0 {
				node = 0
			}
			clear(u)
			clear(v)
			addWakeSources(wakes, cols, rp.px, rp.py, rp.wake, node, u, v, false)
			if geo.ground {
				addWakeSources(wakes, cols, rp.px, 2*geo.groundY-rp.py, -1, -1, u, v, true)
			}
			out := wg.Data[rp.row*nwc : (rp.row+1)*nwc]
			for c := range out {
				out[c] = -(u[cols.body+c]*rp.nx + v[cols.body+c]*rp.ny)
			}
		}
	})
	s.solveColumns(wg)
	r.gam = blas64.General{Rows: n, Cols: cols.n, Stride: cols.n, Data: make([]float64, n*cols.n)}
	for i := range n {
		row := r.gam.Data[i*cols.n : (i+1)*cols.n]
		copy(row, body.Data[i*cols.body:(i+1)*cols.body])
		copy(row[cols.body:], wg.Data[i*nwc:(i+1)*nwc])
	}
	r.inner = newInteriorSpeeds(sol, wakes, r)
	if kuttaOnSpeeds(sol, r) {
		r.inner = newInteriorSpeeds(sol, wakes, r)
	}
	// Wake rows: the vortex sheets' velocity per unit nodal γ times G, plus
	// the sources' own.
	nw := 0
	for _, w := range wakes {
		nw += len(w.nodes)
	}
	r.wakeUt = blas64.General{Rows: nw, Cols: cols.n, Stride: cols.n, Data: make([]float64, nw*cols.n)}
	r.wakeU0 = make([]float64, nw)
	type wakePt struct{ k, j, row int }
	var pts []wakePt
	for k, w := range wakes {
		for j := range w.nodes {
			pts = append(pts, wakePt{k, j, cols.wake0[k] - cols.body + j})
		}
	}
	f := sol.field()
	parallelRows(len(pts), func(lo, hi int) {
		u, v := make([]float64, cols.n), make([]float64, cols.n)
		tg := make([]float64, n) // tangential velocity per unit nodal γ
		for _, wp := range pts[lo:hi] {
			w := wakes[wp.k]
			q, t := w.nodes[wp.j], w.tan[wp.j]
			uu, vv, _ := f.at(q.X, q.Y)
			r.wakeU0[wp.row] = uu*t.X + vv*t.Y
			sourceVelocity(geo, wakes, cols, q.X, q.Y, -1, wp.k, wp.j, u, v)
			vortexTangential(geo, q.X, q.Y, t.X, t.Y, tg)
			out := r.wakeUt.Data[wp.row*cols.n : (wp.row+1)*cols.n]
			for c := range out {
				out[c] = u[c]*t.X + v[c]*t.Y
			}
			// out += tgᵀ G, row by row (blas64.Axpy: the same operations
			// as the plain loop, vectorised).
			y := blas64.Vector{N: cols.n, Inc: 1, Data: out}
			for i, a := range tg {
				if a == 0 {
					continue
				}
				blas64.Axpy(a, blas64.Vector{N: cols.n, Inc: 1, Data: r.gam.Data[i*cols.n : (i+1)*cols.n]}, y)
			}
		}
	})
	return r
}

// vortexTangential writes into tg, per nodal vortex unknown, the velocity
// component along (tx, ty) induced at (px, py) by the element's vortex
// panels (images included); base-source unknowns get their source's.
func vortexTangential(geo *geometry, px, py, tx, ty float64, tg []float64) {
	clear(tg)
	add := func(qx, qy float64, image bool) {
		for k := range geo.elems {
			e := &geo.elems[k]
			for i := 0; i < e.np; i++ {
				p := &geo.panels[e.p0+i]
				ua, va, ub, vb := panelInfluence(p, qx, qy)
				if image {
					// Image vortex of opposite sign: velocity (u(P'), −v(P')).
					va, vb = -va, -vb
				}
				tg[p.ia] += ua*tx + va*ty
				tg[p.ib] += ub*tx + vb*ty
			}
			if e.open() {
				us, vs := sourceInfluence(&e.base, qx, qy)
				if image {
					vs = -vs
				}
				tg[e.us] += us*tx + vs*ty
			}
		}
	}
	add(px, py, false)
	if geo.ground {
		add(px, 2*geo.groundY-py, true)
	}
}

// parallelRows runs body over [0, n) split into GOMAXPROCS blocks.
func parallelRows(n int, body func(lo, hi int)) {
	workers := min(runtime.GOMAXPROCS(0), max(1, n/minRowsPerWorker))
	var wg sync.WaitGroup
	for w := range workers {
		lo, hi := w*n/workers, (w+1)*n/workers
		wg.Go(func() { body(lo, hi) })
	}
	wg.Wait()
}

// sourceRow is a row of S: a point where the body's flow tangency is
// held, with its normal.
type sourceRow struct {
	row, self int
	wake      int // the element whose wake starts at this point (a base midpoint), −1 if none
	px, py    float64
	nx, ny    float64
}

// sourceRows returns S's rows: every panel midpoint and every open
// trailing edge's base midpoint.
func sourceRows(geo *geometry) []sourceRow {
	var rows []sourceRow
	for k := range geo.elems {
		e := &geo.elems[k]
		for i := 0; i < e.np; i++ {
			p := &geo.panels[e.p0+i]
			rows = append(rows, sourceRow{row: e.u0 + i, self: e.p0 + i, wake: -1, px: p.mx, py: p.my, nx: p.nx, ny: p.ny})
		}
		if e.open() {
			b := &e.base
			rows = append(rows, sourceRow{row: e.us, self: -1, wake: k, px: b.mx, py: b.my, nx: b.nx, ny: b.ny})
		}
	}
	return rows
}

// bodySources is the body panels' columns of G = −A⁻¹ S (Unknowns() ×
// body panels), which depend on the geometry only; a System builds them
// the first time a coupled solution needs them.
type bodySources struct {
	once sync.Once
	g    blas64.General
}

// bodySourceResponse returns the body panels' columns of G (bodySources).
func (s *System) bodySourceResponse() blas64.General {
	s.bodySrc.once.Do(func() {
		geo := s.geo
		nb := len(geo.panels)
		n := geo.n
		g := blas64.General{Rows: n, Cols: nb, Stride: nb, Data: make([]float64, n*nb)}
		rows := sourceRows(geo)
		parallelRows(len(rows), func(lo, hi int) {
			u, v := make([]float64, nb), make([]float64, nb)
			for _, rp := range rows[lo:hi] {
				clear(u)
				clear(v)
				addBodySources(geo, rp.px, rp.py, rp.self, u, v, false)
				if geo.ground {
					addBodySources(geo, rp.px, 2*geo.groundY-rp.py, -1, u, v, true)
				}
				out := g.Data[rp.row*nb : (rp.row+1)*nb]
				for c := range out {
					out[c] = -(u[c]*rp.nx + v[c]*rp.ny)
				}
			}
		})
		s.solveColumns(g)
		s.bodySrc.g = g
	})
	return s.bodySrc.g
}
