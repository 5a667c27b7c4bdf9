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
// the closed-form linear-vortex velocities (influence.go), plus the base
// sources of open trailing edges (constant-strength source panels, always
// in closed form), and, in ground mode, of their images: by symmetry the
// image sheet's velocity at z is the reflection (u, −v) of the real sheet's
// velocity at the mirrored point z' = (x, 2·GroundY − y). The reflection
// turns a clockwise vortex into an anticlockwise one but leaves a source a
// source, so vortex images carry −γ and source images +σ, both by the same
// formula.
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
//
// Groups of panels are lumped the same way, as in Barnes and Hut's tree
// code (J. Barnes and P. Hut, Nature 324, 1986) with the multipole
// expansions of Greengard and Rokhlin (J. Comput. Phys. 73, 1987): each
// element's panels are split in halves recursively down to clusterLeaf
// panels; a cluster with centre zc and radius R (all its panels within R of
// zc) carries
//
//	a_k = ∫ γ(ζ) (ζ − zc)^k ds,  k = 0 … clusterOrder,
//	w(z) ≈ (i/2π) Σ_k a_k / (z − zc)^{k+1},
//
// used when |z − zc| > clusterOpening·R, where the truncation error is at
// most (R/|z − zc|)^{P+1}/(1 − R/|z − zc|) ≈ 10⁻⁶ of the cluster's
// Σ|γ|L/(2π|z − zc|). A leaf's moments come from its panels' μ_m by the
// binomial shift (ζ − zc)^k = Σ_m C(k, m) (z0 − zc)^{k−m} (s e^{iφ})^m, a
// parent's from its children's by the same shift. Points near the surface
// descend to the panels; TestFieldTree checks the whole against the
// closed-form sum.

// farFieldPanelLengths is the distance from a panel's midpoint, in panel
// lengths, beyond which the panel's multipole expansion replaces its closed
// form (error bound above).
const farFieldPanelLengths = 4

// Cluster expansion settings (see above): order P = clusterOrder and the
// opening ratio 3 give (1/3)^13/(2/3) ≈ 10⁻⁶.
const (
	clusterOrder   = 12
	clusterOpening = 3.0
	clusterLeaf    = 8 // panels in a leaf cluster
)

// farPanel is one panel's multipole coefficients i e^{ikφ} μ_k /(2π).
type farPanel struct {
	c0, c1, c2, c3 complex128
	r2             float64 // squared distance beyond which the expansion is used
}

// cluster is a node of the per-element panel tree.
type cluster struct {
	zc          complex128
	r2open      float64 // (clusterOpening·R)²
	a           [clusterOrder + 1]complex128
	lo, hi      int   // panel range
	left, right int32 // children, −1 for a leaf
}

// field evaluates the velocity of one solution.
type field struct {
	geo    *geometry
	g      []float64
	far    []farPanel
	tree   []cluster
	roots  []int32
	bases  []basePanel
	ux, uy float64 // freestream
}

// basePanel is the source panel closing an open trailing edge. There is at
// most one per element, so it is always evaluated in closed form.
type basePanel struct {
	p     *panelGeom
	sigma float64
	elem  int
}

// lazyField builds a Solution's field once, on first use.
type lazyField struct {
	once sync.Once
	f    *field
}

func (s *Solution) field() *field {
	if s.sys == nil {
		panic("solver: velocity of a Solution not made by Solve")
	}
	s.lazy.once.Do(func() { s.lazy.f = newField(s) })
	return s.lazy.f
}

// binom holds the binomial coefficients C(k, m), k, m ≤ clusterOrder.
var binom = func() (c [clusterOrder + 1][clusterOrder + 1]float64) {
	for k := range c {
		c[k][0] = 1
		for m := 1; m <= k; m++ {
			c[k][m] = c[k-1][m-1] + c[k-1][m]
		}
	}
	return c
}()

func newField(s *Solution) *field { return newFieldOf(s.sys.geo, s.g, s.cosA, s.sinA) }

// newFieldOf returns the field of the strengths g (all unknowns, as the
// system orders them) in the freestream (ux, uy).
func newFieldOf(geo *geometry, g []float64, ux, uy float64) *field {
	f := &field{geo: geo, g: g, far: make([]farPanel, len(geo.panels)), ux: ux, uy: uy}
	k := complex(0, 1/(2*math.Pi))
	for j := range geo.panels {
		p := &geo.panels[j]
		ga, gb := g[p.ia], g[p.ib]
		gm, dg := 0.5*(ga+gb), gb-ga
		e := complex(p.tx, p.ty)
		l := p.l
		f.far[j] = farPanel{
			c0: k * complex(gm*l, 0),
			c1: k * e * complex(dg*l*l/12, 0),
			c2: k * e * e * complex(gm*l*l*l/12, 0),
			c3: k * e * e * e * complex(dg*l*l*l*l/80, 0),
			r2: farFieldPanelLengths * farFieldPanelLengths * l * l,
		}
	}
	for ei := range geo.elems {
		e := &geo.elems[ei]
		f.roots = append(f.roots, f.build(e.p0, e.p0+e.np))
		if e.open() {
			f.bases = append(f.bases, basePanel{p: &e.base, sigma: g[e.us], elem: ei})
		}
	}
	return f
}

// build makes the cluster of panels [lo, hi) and returns its index.
func (f *field) build(lo, hi int) int32 {
	idx := int32(len(f.tree))
	f.tree = append(f.tree, cluster{lo: lo, hi: hi, left: -1, right: -1})
	// Centre: mean of the nodes; radius: farthest node (the panels lie in
	// the nodes' convex hull).
	var zc complex128
	for j := lo; j < hi; j++ {
		p := &f.geo.panels[j]
		zc += complex(p.x1, p.y1)
	}
	last := &f.geo.panels[hi-1]
	zc = (zc + complex(last.x2, last.y2)) / complex(float64(hi-lo+1), 0)
	r2 := 0.0
	for j := lo; j < hi; j++ {
		p := &f.geo.panels[j]
		r2 = math.Max(r2, sqAbs(complex(p.x1, p.y1)-zc))
		r2 = math.Max(r2, sqAbs(complex(p.x2, p.y2)-zc))
	}
	var a [clusterOrder + 1]complex128
	if hi-lo <= clusterLeaf {
		for j := lo; j < hi; j++ {
			p := &f.geo.panels[j]
			// t_m = e^{imφ} μ_m, μ_m = γm I_m + (Δγ/L) I_{m+1},
			// I_m = ∫_{−L/2}^{L/2} s^m ds.
			ga, gb := f.g[p.ia], f.g[p.ib]
			gm, dgl := 0.5*(ga+gb), (gb-ga)/p.l
			var t [clusterOrder + 1]complex128
			e := complex(p.tx, p.ty)
			em := complex(1, 0)
			h := p.l / 2
			for m := range t {
				mu := gm*moment(h, m) + dgl*moment(h, m+1)
				t[m] = em * complex(mu, 0)
				em *= e
			}
			shiftAdd(&a, &t, complex(p.mx, p.my)-zc)
		}
	} else {
		mid := (lo + hi) / 2
		l := f.build(lo, mid)
		r := f.build(mid, hi)
		f.tree[idx].left, f.tree[idx].right = l, r
		for _, ch := range []int32{l, r} {
			shiftAdd(&a, &f.tree[ch].a, f.tree[ch].zc-zc)
		}
	}
	cl := &f.tree[idx]
	cl.zc = zc
	cl.r2open = clusterOpening * clusterOpening * r2
	cl.a = a
	return idx
}

// moment returns ∫_{−h}^{h} s^m ds.
func moment(h float64, m int) float64 {
	if m%2 == 1 {
		return 0
	}
	return 2 * math.Pow(h, float64(m+1)) / float64(m+1)
}

// shiftAdd adds to a the moments t (about z1) re-expressed about z0, where
// d = z1 − z0: a_k += Σ_m C(k, m) d^{k−m} t_m.
func shiftAdd(a, t *[clusterOrder + 1]complex128, d complex128) {
	var dp [clusterOrder + 1]complex128
	dp[0] = 1
	for k := 1; k <= clusterOrder; k++ {
		dp[k] = dp[k-1] * d
	}
	for k := range a {
		var sum complex128
		for m := 0; m <= k; m++ {
			sum += complex(binom[k][m], 0) * dp[k-m] * t[m]
		}
		a[k] += sum
	}
}

func sqAbs(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }

// maxTreeDepth bounds the evaluation stack: the tree halves its panels at
// every level, so 64 levels cover any panel count.
const maxTreeDepth = 64

// induced returns the velocity the panels and base sources (without
// images) induce at p.
func (f *field) induced(px, py float64) (u, v float64) { return f.inducedExcept(px, py, -1) }

// inducedExcept returns the velocity that the panels and base sources of
// every element but skip (none if skip < 0), without images, induce at p.
func (f *field) inducedExcept(px, py float64, skip int) (u, v float64) {
	var w complex128 // Σ a_k/(z − zc)^{k+1} over opened clusters; × i/2π below
	z := complex(px, py)
	var stack [maxTreeDepth + 1]int32
	for ei, root := range f.roots {
		if ei == skip {
			continue
		}
		stack[0] = root
		sp := 1
		for sp > 0 {
			sp--
			cl := &f.tree[stack[sp]]
			dz := z - cl.zc
			if d2 := sqAbs(dz); d2 > cl.r2open {
				inv := complex(real(dz)/d2, -imag(dz)/d2)
				acc := cl.a[clusterOrder]
				for k := clusterOrder - 1; k >= 0; k-- {
					acc = acc*inv + cl.a[k]
				}
				w += acc * inv
				continue
			}
			if cl.left >= 0 {
				stack[sp], stack[sp+1] = cl.right, cl.left
				sp += 2
				continue
			}
			for j := cl.lo; j < cl.hi; j++ {
				du, dv := f.panelVelocity(j, px, py)
				u += du
				v += dv
			}
		}
	}
	for _, b := range f.bases {
		if b.elem == skip {
			continue
		}
		su, sv := sourceInfluence(b.p, px, py)
		u += b.sigma * su
		v += b.sigma * sv
	}
	w *= complex(0, 1/(2*math.Pi))
	return u + real(w), v - imag(w)
}

// panelVelocity is panel j's velocity at p: its multipole expansion beyond
// farFieldPanelLengths, the closed form nearer.
func (f *field) panelVelocity(j int, px, py float64) (u, v float64) {
	p := &f.geo.panels[j]
	dx, dy := px-p.mx, py-p.my
	d2 := dx*dx + dy*dy
	if fp := &f.far[j]; d2 > fp.r2 {
		inv := complex(dx/d2, -dy/d2)
		w := inv * (fp.c0 + inv*(fp.c1+inv*(fp.c2+inv*fp.c3)))
		return real(w), -imag(w)
	}
	ua, va, ub, vb := panelInfluence(p, px, py)
	ga, gb := f.g[p.ia], f.g[p.ib]
	return ua*ga + ub*gb, va*ga + vb*gb
}

// inside reports whether p lies within an element's contour (closed across
// its trailing-edge gap) or below the ground plane.
func (g *geometry) inside(px, py float64) bool {
	if g.ground && py < g.groundY {
		return true
	}
	for ei := range g.elems {
		e := &g.elems[ei]
		if p := (model.Point{X: px, Y: py}); e.box.Contains(p) && model.InPolygon(p, e.nodes) {
			return true
		}
	}
	return false
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
