package solver

import (
	"math"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// The surface speed of the panel method is −γ, the jump of the tangential
// velocity across the vortex sheet, on the premise that the fluid inside
// the contour is at rest (system.go). The tangency conditions hold that
// premise at the panel midpoints only. Where the section is thin next to
// its trailing edge, thinner than its panels are long, the two faces'
// conditions nearly repeat and a discrete flow along the inside of the
// wedge, which no midpoint condition sees, is left free. The panel
// method alone hardly stirs it (its speeds are checked against exact
// solutions), but the sources of the coupled solution do: on E387
// (closed edge, wedge about 4°) at 4°, with the smooth mass defects of a
// converged solution, the inside of the wedge flowed forwards at 0.23 U∞
// at x/c 0.9985 (0.02 U∞ at the same place with the edge opened by 0.1 %
// of chord), and −γ overstated the outer speed there by as much: the
// edge speeds read from −γ rose from 0.97 at x/c 0.99 to 1.65 at the
// last node, where the outer flow runs at 0.93. Fed back through the
// layers, which thinned in that spurious acceleration, the coupled lift
// depended on the panel count (the viscous decrement of E387 at 4°, Re
// 2e5: 0.025, 0.045, 0.066 at 160, 320, 640 panels) and the pressures
// of the two surfaces at the edge did not meet.
//
// The outer speed is the inner flow's tangential velocity plus the
// sheet's jump, u_outer·τ = u_inner·τ − γ along the node order τ, so a
// station reads
//
//	Ue = ±(γ − u_inner(P)·τ)
//
// with u_inner taken at P, half way across the section from the node
// (the inner flow across a thin wedge is nearly uniform). It is linear in
// the sources like γ itself, so it enters ue0 and D as −γ does. It is
// taken on the aft half of each element (interiorFromXC), where sections
// are thin; ahead of that the inside is at rest to 10⁻³ U∞ and the
// correction is left out. Where the wedge is thinner than
// minInteriorThickness of the node's panels even the inner flow across it
// is not uniform (P lies in the sheets' near field), and the node takes
// the corrected speed of the nearest node ahead of it where the probe is
// good (constant extrapolation, as speedNode does for the edge node).

// Where the interior correction is taken, and how thin the section may
// be against the node's panels for the inner flow at its middle to stand
// for the inner flow at the node (measured on E387, 160–640 panels: at a
// ratio of 0.06 the probe gave −0.15 against 0.93, from 0.1 on it agreed
// with the open edge's speeds within 0.02).
const (
	interiorFromXC       = 0.5
	minInteriorThickness = 0.1
)

// interiorProbe is the inner flow's velocity along the node order at the
// middle of the section across from one node: v0 + Σ_c row[c] σ_c.
type interiorProbe struct {
	v0     float64
	row    []float64
	px, py float64 // the point
	tx, ty float64 // the node order's tangent at the node
}

// interiorSpeeds holds, per nodal unknown, the probe of the inner flow
// (row nil where none is taken) and the node whose corrected speed it
// reads (itself, or the nearest good node ahead of it in a wedge too thin
// for the probe).
type interiorSpeeds struct {
	probe []interiorProbe
	stand []int // per unknown index: the unknown index whose speed stands in
}

// newInteriorSpeeds builds the probes of every element's aft nodes from
// the solution sol, the sources' response r (gam and cols) and the wakes.
func newInteriorSpeeds(sol *Solution, wakes []*wakeGeom, r *sourceResponse) *interiorSpeeds {
	geo := sol.sys.geo
	n := geo.n
	is := &interiorSpeeds{probe: make([]interiorProbe, n), stand: make([]int, n)}
	for i := range is.stand {
		is.stand[i] = i
	}
	type job struct {
		u      int // unknown index of the node
		px, py float64
		tx, ty float64
	}
	var jobs []job
	for k := range geo.elems {
		e := &geo.elems[k]
		if e.open() {
			continue
		}
		good := make([]bool, e.np+1)
		probed := make([]bool, e.np+1)
		for i := 1; i < e.np; i++ {
			if i == e.le || e.chordPos(e.nodes[i]) < interiorFromXC {
				continue
			}
			q := e.nodes[i]
			// The nearest point of the other surface.
			lo, hi := e.le, e.np
			if i > e.le {
				lo, hi = 0, e.le
			}
			best, bx, by := math.Inf(1), 0.0, 0.0
			for j := lo; j < hi; j++ {
				p := &geo.panels[e.p0+j]
				t := math.Max(0, math.Min(p.l, (q.X-p.x1)*p.tx+(q.Y-p.y1)*p.ty))
				x, y := p.x1+t*p.tx, p.y1+t*p.ty
				if d := math.Hypot(q.X-x, q.Y-y); d < best {
					best, bx, by = d, x, y
				}
			}
			l := 0.5 * (geo.panels[e.p0+i-1].l + geo.panels[e.p0+i].l)
			probed[i] = true
			if best < minInteriorThickness*l {
				continue
			}
			good[i] = true
			tx, ty := e.nodes[i+1].X-e.nodes[i-1].X, e.nodes[i+1].Y-e.nodes[i-1].Y
			tl := math.Hypot(tx, ty)
			jobs = append(jobs, job{u: e.u0 + i, px: 0.5 * (q.X + bx), py: 0.5 * (q.Y + by), tx: tx / tl, ty: ty / tl})
		}
		// Nodes of a wedge too thin for the probe read the nearest good
		// node ahead of them, from each end of the node order.
		for i := 1; i < e.le && probed[i] && !good[i]; i++ {
			j := i
			for j < e.le && probed[j] && !good[j] {
				j++
			}
			if good[j] {
				is.stand[e.u0+i] = e.u0 + j
			}
		}
		for i := e.np - 1; i > e.le && probed[i] && !good[i]; i-- {
			j := i
			for j > e.le && probed[j] && !good[j] {
				j--
			}
			if good[j] {
				is.stand[e.u0+i] = e.u0 + j
			}
		}
	}
	ncol := r.cols.n
	parallelRows(len(jobs), func(lo, hi int) {
		u, v := make([]float64, ncol), make([]float64, ncol)
		tg := make([]float64, n)
		for _, jb := range jobs[lo:hi] {
			vortexTangential(geo, jb.px, jb.py, jb.tx, jb.ty, tg)
			v0 := sol.cosA*jb.tx + sol.sinA*jb.ty
			for j, a := range tg {
				v0 += a * sol.g[j]
			}
			sourceVelocity(geo, wakes, r.cols, jb.px, jb.py, -1, -1, -1, u, v)
			row := make([]float64, ncol)
			for c := range row {
				row[c] = u[c]*jb.tx + v[c]*jb.ty
			}
			y := blas64.Vector{N: ncol, Inc: 1, Data: row}
			for j, a := range tg {
				if a == 0 {
					continue
				}
				blas64.Axpy(a, blas64.Vector{N: ncol, Inc: 1, Data: r.gam.Data[j*ncol : (j+1)*ncol]}, y)
			}
			is.probe[jb.u] = interiorProbe{v0: v0, row: row, px: jb.px, py: jb.py, tx: jb.tx, ty: jb.ty}
		}
	})
	return is
}

// speedRow writes into out the change, per unit source, of the corrected
// speed −γ + u_inner·τ along the node order's opposite (γ − u_inner·τ)
// at unknown index u, and returns its value in the inviscid solution g.
func (is *interiorSpeeds) speedRow(r *sourceResponse, g []float64, u int, out []float64) float64 {
	ncol := r.cols.n
	p := &is.probe[u]
	if out != nil {
		copy(out, r.gam.Data[u*ncol:(u+1)*ncol])
		if p.row != nil {
			for c, x := range p.row {
				out[c] -= x
			}
		}
	}
	if g == nil {
		return 0
	}
	v := g[u]
	if p.row != nil {
		v -= p.v0
	}
	return v
}

// kuttaOnSpeeds changes the sources' response r.gam so that the sources
// leave the corrected speeds of the two trailing-edge stations of every
// closed edge equal, and returns whether it changed anything.
//
// The panel method's Kutta condition, γ_1 + γ_(N+1) = 0, holds at the
// shared edge node, whose strengths the stations do not read (speedNode);
// the stations read the corrected speeds of the nodes beside it. With the
// sources those did not meet: on E387 at 4° (Re 2e5, 160 panels) 0.952
// above against 0.911 below, Cp 0.094 against 0.171 where the two layers
// leave the edge together. The flow with the sources is made to satisfy
// Kutta's condition at the stations instead: to G σ is added the
// circulation that closes the gap, a multiple of the circulation mode of
// each closed edge (the panel system's solution with 1 on that edge's
// Kutta row and 0 on every other), G ← G − C μ⁻¹ M, with M the gap per
// unit source and μ the gap each mode makes. The inviscid flow (σ = 0)
// keeps the panel method's own condition, whose answer is checked
// against exact solutions (the gap it leaves, 0.8 against 0.78 on E387,
// is its approach to the edge's stagnation point).
func kuttaOnSpeeds(sol *Solution, r *sourceResponse) bool {
	geo := sol.sys.geo
	n, ncol := geo.n, r.cols.n
	is := r.inner
	type edge struct{ row, a, b int }
	var edges []edge
	for k := range geo.elems {
		e := &geo.elems[k]
		if e.open() {
			continue
		}
		a := is.stand[e.u0+speedNode(e, 0)]
		b := is.stand[e.u0+speedNode(e, e.np)]
		if is.probe[a].row == nil || is.probe[b].row == nil {
			continue
		}
		edges = append(edges, edge{row: e.u0 + e.np, a: a, b: b})
	}
	ne := len(edges)
	if ne == 0 {
		return false
	}
	// The circulation modes, one column per edge.
	c := blas64.General{Rows: n, Cols: ne, Stride: ne, Data: make([]float64, n*ne)}
	for j, ed := range edges {
		c.Data[ed.row*ne+j] = 1
	}
	sol.sys.solveColumns(c)
	// Gap rows M (per unit source) and the modes' gaps μ.
	m := make([]float64, ne*ncol)
	mu := make([]float64, ne*ne)
	tg := make([]float64, n)
	ra := make([]float64, ncol)
	for i, ed := range edges {
		row := m[i*ncol : (i+1)*ncol]
		for _, u := range []int{ed.a, ed.b} {
			is.speedRow(r, sol.g, u, ra)
			for q, v := range ra {
				row[q] += v
			}
			p := &is.probe[u]
			vortexTangential(geo, p.px, p.py, p.tx, p.ty, tg)
			for j := range edges {
				v := c.Data[u*ne+j]
				for q, a := range tg {
					v -= a * c.Data[q*ne+j]
				}
				mu[i*ne+j] += v
			}
		}
	}
	// X = μ⁻¹ M (ne, the number of closed edges, is a handful); a gap
	// system the modes cannot close (singular or nearly so) leaves the
	// response as it is.
	var x mat.Dense
	if err := x.Solve(mat.NewDense(ne, ne, mu), mat.NewDense(ne, ncol, m)); err != nil {
		return false
	}
	xr := x.RawMatrix()
	// G ← G − C X.
	for i := 0; i < n; i++ {
		y := blas64.Vector{N: ncol, Inc: 1, Data: r.gam.Data[i*ncol : (i+1)*ncol]}
		for j := 0; j < ne; j++ {
			if v := c.Data[i*ne+j]; v != 0 {
				blas64.Axpy(-v, blas64.Vector{N: ncol, Inc: 1, Data: xr.Data[j*xr.Stride : j*xr.Stride+ncol]}, y)
			}
		}
	}
	return true
}

// nodeRow returns the change per unit source of the corrected speed at
// unknown index u (speedRow's out): r.gam's own row where no probe is
// taken, a new slice otherwise.
func (is *interiorSpeeds) nodeRow(r *sourceResponse, u int) []float64 {
	ncol := r.cols.n
	if is.probe[u].row == nil {
		return r.gam.Data[u*ncol : (u+1)*ncol]
	}
	out := make([]float64, ncol)
	is.speedRow(r, nil, u, out)
	return out
}
