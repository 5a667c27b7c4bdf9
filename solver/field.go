package solver

import (
	"fmt"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"sectionbench/model"
)

// The velocity field.
//
// At a point z the velocity is the freestream plus the sum over panels of
// the closed-form linear-vortex velocities (influence.go) and, in ground
// mode, of their images: by symmetry the image sheet's velocity at z is the
// reflection (u, −v) of the real sheet's velocity at the mirrored point
// z' = (x, 2·GroundY − y).
//
// Far from a panel the closed form (one atan2 and one logarithm) is
// replaced by its multipole expansion about the panel midpoint z0. With the
// complex velocity w = u − iv, a clockwise point vortex Γ at z0 gives
// w = iΓ/(2π(z − z0)); expanding 1/(z − ζ) for ζ = z0 + s e^{iφ} on the
// panel (|s| ≤ L/2, φ the panel's direction),
//
//	w(z) = (i/2π) Σ_k e^{ikφ} μ_k / (z − z0)^{k+1},  μ_k = ∫ s^k γ(s) ds,
//
// and for γ(s) = γm + (γb − γa) s/L, γm = (γa + γb)/2,
//
//	μ0 = γm L, μ1 = (γb − γa) L²/12, μ2 = γm L³/12, μ3 = (γb − γa) L⁴/80.
//
// Truncating after μ3 leaves a relative error of about μ4/(μ0 |z − z0|⁴) =
// L⁴/(80 |z − z0|⁴), below 5·10⁻⁵ of the panel's own contribution beyond
// farFieldPanelLengths = 4 panel lengths. TestFarField checks it against the
// closed form.

// farFieldPanelLengths is the distance from a panel's midpoint, in panel
// lengths, beyond which the panel's multipole expansion replaces its closed
// form (error bound above).
const farFieldPanelLengths = 4

// farPanel is one panel's multipole coefficients i e^{ikφ} μ_k /(2π).
type farPanel struct {
	c0, c1, c2, c3 complex128
	r2             float64 // squared distance beyond which the expansion is used
}

// field evaluates the velocity of one solution.
type field struct {
	geo    *geometry
	g      []float64
	far    []farPanel
	ux, uy float64 // freestream
}

func (s *Solution) field() *field {
	if s.sys == nil {
		panic("solver: velocity of a Solution not made by Solve")
	}
	geo := s.sys.geo
	c, sn := s.sys.weights(s.AlphaDeg)
	f := &field{geo: geo, g: s.g, far: make([]farPanel, len(geo.panels)), ux: c, uy: sn}
	for j := range geo.panels {
		p := &geo.panels[j]
		ga, gb := s.g[p.ia], s.g[p.ia+1]
		gm, dg := 0.5*(ga+gb), gb-ga
		e := complex(p.tx, p.ty)
		l := p.l
		k := complex(0, 1/(2*math.Pi))
		f.far[j] = farPanel{
			c0: k * complex(gm*l, 0),
			c1: k * e * complex(dg*l*l/12, 0),
			c2: k * e * e * complex(gm*l*l*l/12, 0),
			c3: k * e * e * e * complex(dg*l*l*l*l/80, 0),
			r2: farFieldPanelLengths * farFieldPanelLengths * l * l,
		}
	}
	return f
}

// induced returns the velocity the panels (without images) induce at p.
func (f *field) induced(px, py float64) (u, v float64) {
	for j := range f.geo.panels {
		p := &f.geo.panels[j]
		dx, dy := px-p.mx, py-p.my
		d2 := dx*dx + dy*dy
		if fp := &f.far[j]; d2 > fp.r2 {
			inv := complex(dx/d2, -dy/d2)
			w := inv * (fp.c0 + inv*(fp.c1+inv*(fp.c2+inv*fp.c3)))
			u += real(w)
			v -= imag(w)
			continue
		}
		ua, va, ub, vb := f.geo.panelInfluence(j, px, py)
		ga, gb := f.g[p.ia], f.g[p.ia+1]
		u += ua*ga + ub*gb
		v += va*ga + vb*gb
	}
	return u, v
}

// inside reports whether p lies within an element's contour (closed across
// its trailing-edge gap) or below the ground plane.
func (g *geometry) inside(px, py float64) bool {
	if g.ground && py < g.groundY {
		return true
	}
	for ei := range g.elems {
		e := &g.elems[ei]
		if px < e.min.X || px > e.max.X || py < e.min.Y || py > e.max.Y {
			continue
		}
		if pointInPolygon(e.nodes, px, py) {
			return true
		}
	}
	return false
}

// pointInPolygon is the even–odd crossing test on the closed polygon pts.
func pointInPolygon(pts []model.Point, px, py float64) bool {
	in := false
	n := len(pts)
	for i, j := 0, n-1; i < n; j, i = i, i+1 {
		a, b := pts[i], pts[j]
		if (a.Y > py) != (b.Y > py) && px < a.X+(py-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}

// at returns the velocity / U∞ at p, or inside = true and zero velocity.
func (f *field) at(px, py float64) (u, v float64, inside bool) {
	if f.geo.inside(px, py) {
		return 0, 0, true
	}
	u, v = f.induced(px, py)
	if f.geo.ground {
		ui, vi := f.induced(px, 2*f.geo.groundY-py)
		u += ui
		v -= vi
	}
	return u + f.ux, v + f.uy, false
}

// Velocity writes the velocity / U∞ at each of pts into u and v, including
// the freestream and, in ground mode, the images. Points inside an element
// (even–odd test on its nodes, the trailing-edge gap closed) or below the
// ground plane get inside[i] = true and u = v = 0; inside may be nil. The
// points are shared among GOMAXPROCS goroutines. Within a few panel lengths
// of the surface the discrete sheet's velocity departs from the smooth
// flow's (it is exact on the panels' collocation points only); it stays
// finite everywhere (see minDistFrac). Velocity panics if u or v (or a
// non-nil inside) is shorter than pts.
func (s *Solution) Velocity(pts []model.Point, u, v []float64, inside []bool) {
	if len(u) < len(pts) || len(v) < len(pts) || (inside != nil && len(inside) < len(pts)) {
		panic(fmt.Sprintf("solver: Velocity of %d points into slices of length %d, %d, %d", len(pts), len(u), len(v), len(inside)))
	}
	f := s.field()
	const chunk = 64 // points per work item: enough to hide the scheduling cost
	items := (len(pts) + chunk - 1) / chunk
	workers := min(runtime.GOMAXPROCS(0), items)
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for {
				it := int(next.Add(1)) - 1
				if it >= items {
					return
				}
				for i := it * chunk; i < min(len(pts), (it+1)*chunk); i++ {
					var in bool
					u[i], v[i], in = f.at(pts[i].X, pts[i].Y)
					if inside != nil {
						inside[i] = in
					}
				}
			}
		})
	}
	wg.Wait()
}

// VelocityAt returns the velocity / U∞ at p (zero inside a body); see
// Velocity.
func (s *Solution) VelocityAt(p model.Point) (u, v float64) {
	u, v, _ = s.field().at(p.X, p.Y)
	return u, v
}
