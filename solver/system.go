package solver

import (
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"
	"time"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
	"gonum.org/v1/gonum/mat"

	"sectionbench/model"
)

// The linear-strength vortex panel method (Katz & Plotkin, Low-Speed
// Aerodynamics, 2nd ed., 2001, sec. 11.4; Kuethe & Chow, Foundations of
// Aerodynamics, 5th ed., sec. 5.10).
//
// Element k has n_k nodes and N_k = n_k − 1 panels, node i to node i+1. The
// strength γ is unknown at every node, linear along each panel and
// continuous at nodes, so element k has N_k + 1 unknowns. The equations are
//
//	flow tangency at every panel midpoint m_i with outward normal n_i:
//	  Σ_j (A_ij^a γ_j + A_ij^b γ_j+1) = −V∞·n_i,
//	the Kutta condition at the trailing edge:
//	  γ_1 + γ_(N+1) = 0,
//
// N_k + 1 equations per element (one more of each for an open trailing
// edge, below), a square system for any number of elements. A_ij^a, A_ij^b
// are the normal components at m_i of the velocities induced by panel j
// per unit γ at its two nodes (influence.go). For a closed trailing edge the first and last nodes
// coincide and the Kutta condition makes the velocities leaving along the
// upper and lower surfaces equal in size, the flow leaving the trailing edge
// smoothly.
//
// For an open (blunt) trailing edge the gap between the last and first
// nodes is closed by a straight base panel carrying a constant-strength
// source σ, an extra unknown of the element, with one extra equation: flow
// tangency at the base panel's midpoint m_g, on its inner face,
//
//	Σ_j (A_gj^a γ_j + A_gj^b γ_j+1) + Σ_k S_gk σ_k = −V∞·n_g,
//
// and the source columns S_ik (normal velocity at m_i per unit σ_k) enter
// every tangency row. So an element with an open trailing edge has N_k + 2
// unknowns (N_k + 1 nodal γ and σ) and N_k + 2 equations (N_k panel
// tangencies, the base tangency and the Kutta condition γ_1 + γ_(N+1) = 0,
// kept at the two trailing-edge nodes). The constant-strength source panel
// (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001, sec. 10.2.1) is
// given in influence.go. Physically σ is the outflow that fills the
// dead-air region behind the blunt edge, the start of the wake (its total
// Q = σ times the gap): the fluid inside the body stays at rest, and the
// outer flow meets the base's outflow instead of turning round the two
// corners into the gap.
//
// Which face. A vortex sheet's normal velocity is continuous, so the
// tangency rows of the vortex panels hold on both faces; a source sheet's
// jumps by σ, and the two choices differ. The inner face is the condition
// the whole formulation rests on, fluid at rest inside the contour (so that
// the surface velocity is −γ, forces.go): the base then emits σ ≈ 0.8 U∞
// on NACA 0012 at 4° and the outer normal velocity on the base is σ. The
// outer face was tried: it turns σ into a sink (≈ −0.22 U∞) that swallows
// the flow turning round the corners, and the last panels' Cp grew faster
// than without the base panel (−118 at 640 panels).
//
// Why. Left without a panel, the open gap lets the discrete flow pass
// between the body's inside and outside; once the trailing-edge panels are
// shorter than the gap the flow round the two sheet ends is resolved like
// flow round the edge of a plate, and the Cp of the last panel or two grows
// without bound as panels shrink (NACA 0012 at 4°, gap 0.25% of chord,
// cosine spacing: −0.80, −4.2, −17.9, −72 at 80, 160, 320, 640 panels).
// Closing the gap with a vortex panel instead keeps that Cp bounded but
// makes the sheet turn a corner at both nodes, and Cl then drifts
// logarithmically (−4.2e-5 per doubling), which spoils a density study's
// extrapolation. The source adds no circulation, so the Kutta condition
// and Cl converge as before (second order; at 200 panels on NACA 2412 at
// 4° Cl moves by +1.4e-4 relative as generated and by −1.3e-3 as
// repanelled with cosine spacing, and the two panellings, 1.3e-3 apart
// without the base panel, then agree to 1.4e-4), and the Cp of the last
// panel stays bounded: it rises towards stagnation at the two corners,
// where the outer flow meets the base's outflow (NACA 0012 at 4°: 0.53,
// 0.60, 0.71, 0.89 at 80, 160, 320, 640 panels;
// TestOpenTrailingEdgeBounded).
//
// Validity: a thin base model, good for the gaps of ordinary sections (a
// percent or two of chord); beyond MaxTEGapFraction a Solution warns,
// because the real base flow of a thick blunt edge separates and is not a
// potential flow. Gaps below openTEFraction of chord are treated as closed
// (no base panel, the Kutta condition alone): there the gap is far shorter
// than any panel and nothing can pass.

// The matrix depends on the geometry only. It is factorised once (LU with
// partial pivoting) and solved for two unit freestreams, V∞ = (1, 0) and
// (0, 1), giving γ0 and γ90 (with the base sources σ0, σ90); by linearity
// the solution at angle α is γ = cos α γ0 + sin α γ90, and likewise σ.
//
// Ground effect uses the method of images (Katz & Plotkin's treatment of
// ground effect; docs/validation.md §5): every panel has a mirror image about
// y = GroundY carrying −γ, and every base source one carrying +σ (a
// reflected source is a source), so the plane is a streamline of the
// combined flow.
// The images enter the influence matrix and the velocity field. The plane is
// a streamline only if the freestream is parallel to it: in ground mode the
// only angle Solve and Sweep accept is 0 and the configuration itself must
// be placed at its angle of attack.

// Tolerances of the system.
const (
	// CondWarn is the condition-number estimate (1-norm) above which a
	// Solution carries a warning: float64 holds about 16 significant
	// digits and an LU solve loses about log10(cond) of them, so beyond
	// 1e12 fewer than four digits of γ can be trusted.
	CondWarn = 1e12
	// MaxTEGapFraction is the open trailing-edge gap, as a fraction of the
	// element's chord, above which the thin base-source model of a blunt
	// edge is reported as doubtful (see the method notes above; common
	// practice).
	MaxTEGapFraction = 0.02
	// openTEFraction is the trailing-edge gap, as a fraction of the
	// element's chord, above which the gap is closed by a base source
	// panel. It is ten times the logarithm's floor minDistFrac of the
	// assembly, so that the base midpoint, half a gap from the two sheet
	// ends, is never clamped; a smaller gap is far shorter than any panel
	// and is treated as closed.
	openTEFraction = 10 * minDistFrac
	// minPanelFraction is the shortest panel accepted, as a fraction of the
	// element's chord: shorter ones are repeated or nearly repeated nodes
	// and make the influence matrix singular.
	minPanelFraction = 1e-9
	// minPanels is the fewest panels an element may have.
	minPanels = 3
	// thinTEFraction is the distance, as a fraction of a panel's length,
	// below which the panel's midpoint (its collocation point) counts as
	// lying on top of a facing panel of its own element (thinTrailingEdge).
	// Two vortex sheets that close make the midpoint tangency conditions
	// nearly repeat and leave the strengths of the last panels free to
	// spike. At a wedge trailing edge of angle τ the last panel's midpoint
	// lies (L/2) sin τ from the facing last panel, a fraction sin(τ)/2 of
	// its length whatever the panel count, so the threshold is a wedge
	// angle: 0.04 is τ ≈ 4.6°. Measured on Kármán–Trefftz sections
	// μ = (−0.1, 0.1) at 4°, 80–640 cosine panels (exact solution 0.2–0.4
	// there): the last panel's Cp is −4 to −6 at τ = 4° (fraction
	// 0.036–0.042), −16 to −22 at 3°, −68 to −119 at 2°, −450 to −1700 at
	// 1°, and grows without bound at a cusp (−1.1e4 … −2.8e7); at τ = 5°
	// (fraction ≥ 0.044) it stays above −1.3 there, the suction peak
	// comes from the leading edge and the validation against the exact
	// solution holds (validation_test.go).
	thinTEFraction = 0.04
)

// Sentinel errors of the geometry checks; match with errors.Is.
var (
	ErrNoElements      = errors.New("no elements")
	ErrTooFewPanels    = errors.New("too few panels")
	ErrDegeneratePanel = errors.New("degenerate panel (zero or tiny length)")
	ErrClockwise       = errors.New("nodes run clockwise (signed area ≤ 0); expected trailing edge → upper → leading edge → lower")
	ErrBelowGround     = errors.New("node below the ground plane")
	ErrNonFinite       = model.ErrNonFinite
	ErrLeadingEdge     = errors.New("leading-edge index out of range")
	ErrBadRefChord     = errors.New("reference chord is negative or not finite")
	ErrSingular        = errors.New("influence matrix is singular")
)

// GeometryError reports a problem with one element of a Config. Panel is the
// zero-based index of the offending panel or node, or −1 when the problem
// concerns the whole element (Element is −1 for the whole configuration).
type GeometryError struct {
	Element int
	Name    string
	Panel   int
	Err     error
}

func (e *GeometryError) Error() string {
	switch {
	case e.Element < 0:
		return "solver: configuration: " + e.Err.Error()
	case e.Panel < 0:
		return fmt.Sprintf("solver: element %d (%q): %v", e.Element+1, e.Name, e.Err)
	}
	return fmt.Sprintf("solver: element %d (%q), panel/node %d: %v", e.Element+1, e.Name, e.Panel+1, e.Err)
}

func (e *GeometryError) Unwrap() error { return e.Err }

// SingularError reports an influence matrix that cannot be solved, with the
// condition-number estimate (+Inf when exactly singular). It wraps
// ErrSingular. Coincident or overlapping elements are the usual cause.
type SingularError struct {
	Cond float64
}

func (e *SingularError) Error() string {
	return fmt.Sprintf("solver: influence matrix is singular (condition number estimate %g)", e.Cond)
}

func (e *SingularError) Unwrap() error { return ErrSingular }

// panelGeom is one panel, precomputed.
type panelGeom struct {
	x1, y1, x2, y2 float64 // nodes
	tx, ty         float64 // unit tangent, node 1 → node 2
	nx, ny         float64 // unit outward normal (tx rotated −90°)
	l, il          float64 // length and its inverse
	mx, my         float64 // midpoint (collocation point)
	s              float64 // arc length of the midpoint from the element's first node
	xc             float64 // midpoint's chord-line position
	ia, ib         int     // unknown indices of node 1 and node 2
	elem           int
	side           Side
	thin           bool // in a trailing edge thinner than its panels (thinTrailingEdge): left out of CpMin
}

// elemGeom is one element, precomputed.
type elemGeom struct {
	name        string
	nodes       []model.Point // copy
	sNode       []float64     // arc length of each node from the first
	le          int
	p0, np      int // first panel index, number of panels
	u0          int // first unknown index (np+1 unknowns)
	chord       float64
	lePt, teMid model.Point
	qc          model.Point // quarter-chord point on the chord line
	teGap       float64
	box         model.Box // bounding box of the nodes
	// An open trailing edge (gap above openTEFraction of chord) has a base
	// panel from the last node to the first carrying the source unknown
	// us; us is −1 for a closed edge.
	base panelGeom
	us   int
	// thinUpper and thinLower count the panels at each end of the node
	// order (the upper and lower surface next to the trailing edge) that
	// lie within thinTEFraction of their length of a facing panel;
	// thinXC is the chord position where that region begins (1 if none).
	thinUpper, thinLower int
	thinXC               float64
}

// open reports whether the element's trailing edge is closed by a base
// source panel.
func (e *elemGeom) open() bool { return e.us >= 0 }

// unknowns returns the element's number of unknowns: np + 1 nodal
// strengths and, for an open trailing edge, the base source.
func (e *elemGeom) unknowns() int {
	if e.open() {
		return e.np + 2
	}
	return e.np + 1
}

// geometry is a validated configuration.
type geometry struct {
	elems    []elemGeom
	panels   []panelGeom
	n        int // unknowns
	ground   bool
	groundY  float64
	refChord float64
	mref     model.Point
}

// System is a configuration's assembled and factorised influence system
// together with its two unit solutions. It is immutable after NewSystem and
// safe for concurrent use.
type System struct {
	geo      *geometry
	lu       blas64.General // LU factors, row-major, in the assembled matrix's storage; released by NewSystem
	ipiv     []int
	cond     float64
	warnings []string
	g0, g90  []float64 // nodal γ for V∞ = (1, 0) and (0, 1) (g90 nil in ground mode)
	vt0      []float64 // panel Vt for the unit solutions
	vt90     []float64
	forces   []elemQuad
	hull     []hullVertex // of ±(vt0_j, vt90_j), for CpMin in sweeps
	timings  Timings
	flows    flowCache   // the coupled solution's recent flows (coupled_flow.go)
	bodySrc  bodySources // the body sources' columns of the coupled solution's G (coupled_influence.go)
}

// NewSystem validates cfg, assembles and factorises the influence matrix of
// the linear-strength vortex panel method and solves it for the two unit
// freestreams. It copies the nodes it keeps.
//
// Geometry problems return a *GeometryError wrapping one of ErrNoElements,
// ErrTooFewPanels (fewer than 3), ErrDegeneratePanel, ErrClockwise,
// ErrBelowGround, ErrNonFinite, ErrLeadingEdge or ErrBadRefChord; a singular
// matrix returns a *SingularError.
func NewSystem(cfg Config) (*System, error) {
	return newSystem(context.Background(), cfg, buildOptions{})
}

// NewSystemContext is NewSystem that gives up when ctx is done, between
// the assembly's row blocks and before the factorisation (which, once
// started, runs to its end), returning ctx.Err(): a solve superseded by a
// newer request stops early.
func NewSystemContext(ctx context.Context, cfg Config) (*System, error) {
	return newSystem(ctx, cfg, buildOptions{})
}

// buildOptions select variants of the method for comparisons in tests.
type buildOptions struct {
	// unpanelledGap leaves open trailing edges without a base panel (the
	// earlier treatment: the Kutta condition alone).
	unpanelledGap bool
}

func newSystem(ctx context.Context, cfg Config, opt buildOptions) (*System, error) {
	g, err := newGeometryOpts(cfg, opt)
	if err != nil {
		return nil, err
	}
	t0 := time.Now()
	a, b, anorm := g.assemble(ctx)
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	s := &System{geo: g}
	t1 := time.Now()
	if err := s.factorLU(a); err != nil {
		return nil, err
	}
	t2 := time.Now()
	// The condition estimate only reads the factors, as the unit solves
	// do: it runs beside them and the sweep forms, and its verdict is
	// awaited before anything is returned.
	done := make(chan struct{})
	go func() {
		s.estimateCond(anorm)
		close(done)
	}()
	err = s.solveUnit(b)
	if err == nil {
		s.prepare()
	}
	<-done
	// The factors are kept: the coupled viscous solution solves the same
	// matrix for the right-hand sides of its surface and wake sources
	// (SolveColumns).
	if cerr := s.checkCond(); cerr != nil {
		return nil, cerr
	}
	if err != nil {
		return nil, err
	}
	s.timings = Timings{Assembly: t1.Sub(t0), Factorization: t2.Sub(t1), UnitSolves: time.Since(t2)}
	return s, nil
}

// Timings are the wall-clock durations of NewSystem's stages, for display
// and reports (the benchmarks in bench_test.go measure them properly).
type Timings struct {
	Assembly      time.Duration // influence matrix, in parallel over rows
	Factorization time.Duration // LU factorisation
	UnitSolves    time.Duration // the two unit solutions and the sweep forms, the condition estimate running beside them
}

// Timings returns how long NewSystem's stages took.
func (s *System) Timings() Timings { return s.timings }

// newGeometry validates cfg and precomputes its panels.
func newGeometry(cfg Config) (*geometry, error) { return newGeometryOpts(cfg, buildOptions{}) }

func newGeometryOpts(cfg Config, opt buildOptions) (*geometry, error) {
	if len(cfg.Elements) == 0 {
		return nil, &GeometryError{Element: -1, Panel: -1, Err: ErrNoElements}
	}
	if !(cfg.RefChord >= 0) || math.IsInf(cfg.RefChord, 0) {
		return nil, &GeometryError{Element: -1, Panel: -1, Err: ErrBadRefChord}
	}
	if cfg.Ground && (math.IsNaN(cfg.GroundY) || math.IsInf(cfg.GroundY, 0)) {
		return nil, &GeometryError{Element: -1, Panel: -1, Err: fmt.Errorf("ground height: %w", ErrNonFinite)}
	}
	if !cfg.MomentRef.IsFinite() {
		return nil, &GeometryError{Element: -1, Panel: -1, Err: fmt.Errorf("moment reference: %w", ErrNonFinite)}
	}
	g := &geometry{ground: cfg.Ground, groundY: cfg.GroundY, mref: cfg.MomentRef}
	np := 0
	for _, e := range cfg.Elements {
		np += max(len(e.Nodes)-1, 0)
	}
	g.panels = make([]panelGeom, 0, np)
	sumChord := 0.0
	for k, e := range cfg.Elements {
		ge, err := g.addElement(k, e, opt)
		if err != nil {
			return nil, err
		}
		sumChord += ge.chord
	}
	g.refChord = cfg.RefChord
	if g.refChord == 0 {
		g.refChord = sumChord
	}
	return g, nil
}

// addElement validates element k and appends its panels.
func (g *geometry) addElement(k int, e Element, opt buildOptions) (*elemGeom, error) {
	gerr := func(i int, err error) error {
		return &GeometryError{Element: k, Name: e.Name, Panel: i, Err: err}
	}
	n := len(e.Nodes)
	if n-1 < minPanels {
		return nil, gerr(-1, fmt.Errorf("%w: %d, need at least %d", ErrTooFewPanels, max(n-1, 0), minPanels))
	}
	for i, p := range e.Nodes {
		if !p.IsFinite() {
			return nil, gerr(i, ErrNonFinite)
		}
	}
	if e.LE <= 0 || e.LE >= n-1 {
		return nil, gerr(-1, fmt.Errorf("%w: %d not inside 1..%d", ErrLeadingEdge, e.LE, n-2))
	}
	nodes := make([]model.Point, n)
	copy(nodes, e.Nodes)
	ge := elemGeom{name: e.Name, nodes: nodes, le: e.LE, p0: len(g.panels), np: n - 1, u0: g.n}
	ge.lePt = nodes[e.LE]
	ge.teMid = nodes[0].Add(nodes[n-1]).Scale(0.5)
	ge.chord = ge.teMid.Dist(ge.lePt)
	ge.teGap = nodes[0].Dist(nodes[n-1])
	if !(ge.chord > 0) {
		return nil, gerr(-1, fmt.Errorf("%w: leading edge coincides with the trailing edge", ErrDegeneratePanel))
	}
	ge.qc = ge.lePt.Add(ge.teMid.Sub(ge.lePt).Scale(0.25))
	area := model.PolygonArea(nodes)
	ge.box = model.BoxOf(nodes...)
	for i, p := range nodes {
		if g.ground && p.Y < g.groundY {
			return nil, gerr(i, fmt.Errorf("%w: y = %g < %g", ErrBelowGround, p.Y, g.groundY))
		}
	}
	if !(area > 0) {
		return nil, gerr(-1, fmt.Errorf("%w (area %g)", ErrClockwise, area))
	}
	cx, cy := ge.teMid.X-ge.lePt.X, ge.teMid.Y-ge.lePt.Y
	c2 := cx*cx + cy*cy
	ge.sNode = make([]float64, n)
	for i := 0; i+1 < n; i++ {
		a, b := nodes[i], nodes[i+1]
		l := a.Dist(b)
		if !(l > minPanelFraction*ge.chord) {
			return nil, gerr(i, fmt.Errorf("%w: length %g", ErrDegeneratePanel, l))
		}
		ge.sNode[i+1] = ge.sNode[i] + l
		p := newPanelGeom(a, b, ge.u0+i, ge.u0+i+1, k)
		p.s = ge.sNode[i] + 0.5*l
		p.xc = ((p.mx-ge.lePt.X)*cx + (p.my-ge.lePt.Y)*cy) / c2
		if i < e.LE {
			p.side = Upper
		} else {
			p.side = Lower
		}
		g.panels = append(g.panels, p)
	}
	ge.thinTrailingEdge(g.panels[ge.p0:])
	ge.us = -1
	if ge.teGap > openTEFraction*ge.chord && !opt.unpanelledGap {
		ge.us = ge.u0 + n
		ge.base = newPanelGeom(nodes[n-1], nodes[0], -1, -1, k)
		ge.base.xc = 1
	}
	g.n += ge.unknowns()
	g.elems = append(g.elems, ge)
	return &g.elems[len(g.elems)-1], nil
}

// thinTrailingEdge marks the panels of a trailing edge thinner than its
// panels, ps being the element's panels. A panel is thin when its midpoint
// lies closer than thinTEFraction of its length to a facing panel of the
// same element (one running the opposite way, t_i·t_j < 0, the adjacent
// panel across a closed trailing edge included: at a cusp that is the
// nearest). The thin region is the run of thin panels from the trailing
// edge along each surface, stopping short of the leading edge; thin panels
// elsewhere (a sharp or very thin nose) are not a trailing-edge matter and
// are left alone. The search costs O(run × panels) with a cheap distance
// bound per pair.
func (e *elemGeom) thinTrailingEdge(ps []panelGeom) {
	thin := func(i int) bool {
		p := &ps[i]
		lim := thinTEFraction * p.l
		for j := range ps {
			q := &ps[j]
			if j == i || p.tx*q.tx+p.ty*q.ty >= 0 {
				continue
			}
			// |m_i − m_j| − L_j/2 bounds the distance to panel j below.
			if d := math.Hypot(p.mx-q.mx, p.my-q.my) - 0.5*q.l; d >= lim {
				continue
			}
			if segmentDist(p.mx, p.my, q) < lim {
				return true
			}
		}
		return false
	}
	for e.thinUpper < e.le-1 && thin(e.thinUpper) {
		ps[e.thinUpper].thin = true
		e.thinUpper++
	}
	for e.thinLower < e.np-e.le-1 && thin(e.np-1-e.thinLower) {
		ps[e.np-1-e.thinLower].thin = true
		e.thinLower++
	}
	e.thinXC = 1
	if e.thinUpper > 0 {
		e.thinXC = math.Min(e.thinXC, e.chordPos(e.nodes[e.thinUpper]))
	}
	if e.thinLower > 0 {
		e.thinXC = math.Min(e.thinXC, e.chordPos(e.nodes[e.np-e.thinLower]))
	}
}

// segmentDist returns the distance from (px, py) to panel q.
func segmentDist(px, py float64, q *panelGeom) float64 {
	t := math.Max(0, math.Min(q.l, (px-q.x1)*q.tx+(py-q.y1)*q.ty))
	return math.Hypot(px-q.x1-t*q.tx, py-q.y1-t*q.ty)
}

// newPanelGeom returns the panel from a to b whose nodal strengths are
// unknowns ia and ib.
func newPanelGeom(a, b model.Point, ia, ib, elem int) panelGeom {
	l := a.Dist(b)
	p := panelGeom{x1: a.X, y1: a.Y, x2: b.X, y2: b.Y, l: l, il: 1 / l, ia: ia, ib: ib, elem: elem}
	p.tx, p.ty = (b.X-a.X)/l, (b.Y-a.Y)/l
	p.nx, p.ny = p.ty, -p.tx
	p.mx, p.my = 0.5*(a.X+b.X), 0.5*(a.Y+b.Y)
	return p
}

// nrhs returns the number of unit right-hand sides: two in free air, one
// (V∞ = (1, 0)) in ground mode.
func (g *geometry) nrhs() int {
	if g.ground {
		return 1
	}
	return 2
}

// assemble returns the influence matrix, the unit right-hand sides and the
// matrix's 1-norm (largest absolute column sum, for the condition
// estimate). Rows are filled in parallel, GOMAXPROCS goroutines over
// blocks of rows, each summing its rows' absolute values by column; the row
// loop allocates nothing.
//
// When ctx is done the workers stop between rows and the matrix is left
// incomplete: the caller checks ctx.Err().
func (g *geometry) assemble(ctx context.Context) (a, b *mat.Dense, anorm float64) {
	n := g.n
	a = mat.NewDense(n, n, nil)
	b = mat.NewDense(n, g.nrhs(), nil)
	raw, rawb := a.RawMatrix(), b.RawMatrix()
	maxNodes := 0
	for _, e := range g.elems {
		maxNodes = max(maxNodes, len(e.nodes))
	}
	// Rows of element e are u0 .. u0+np−1 (tangency at panel p0+r),
	// u0+np (Kutta) and, for an open trailing edge, u0+np+1 (tangency at
	// the base panel), matching the unknown layout.
	workers := min(runtime.GOMAXPROCS(0), max(1, n/minRowsPerWorker))
	colSums := make([]float64, workers*n)
	var wg sync.WaitGroup
	for w := range workers {
		lo, hi := w*n/workers, (w+1)*n/workers
		cs := colSums[w*n : (w+1)*n]
		wg.Go(func() {
			sc := newRowScratch(maxNodes)
			for r := lo; r < hi; r++ {
				if r%minRowsPerWorker == 0 && ctx.Err() != nil {
					return
				}
				row := raw.Data[r*raw.Stride : r*raw.Stride+n]
				rhs := rawb.Data[r*rawb.Stride : r*rawb.Stride+rawb.Cols]
				g.fillRow(r, row, rhs, sc)
				for c, v := range row {
					cs[c] += math.Abs(v)
				}
			}
		})
	}
	wg.Wait()
	for c := range n {
		sum := 0.0
		for w := range workers {
			sum += colSums[w*n+c]
		}
		anorm = math.Max(anorm, sum)
	}
	return a, b, anorm
}

// minRowsPerWorker keeps tiny systems on one goroutine, where starting
// more would cost more than it saves.
const minRowsPerWorker = 32

// rowScratch holds per-node values shared by the two panels meeting at a
// node: the vector from the node to the collocation point and its squared
// length.
type rowScratch struct{ dx, dy, r2 []float64 }

func newRowScratch(n int) *rowScratch {
	return &rowScratch{dx: make([]float64, n), dy: make([]float64, n), r2: make([]float64, n)}
}

// fillRow writes equation r: tangency at a panel midpoint, or an element's
// Kutta condition.
func (g *geometry) fillRow(r int, row, rhs []float64, sc *rowScratch) {
	clear(row)
	// Find the element and the local row.
	k := 0
	for k+1 < len(g.elems) && g.elems[k+1].u0 <= r {
		k++
	}
	e := &g.elems[k]
	i := r - e.u0
	if i == e.np {
		// Kutta condition γ_first + γ_last = 0.
		row[e.u0] = 1
		row[e.u0+e.np] = 1
		clear(rhs)
		return
	}
	pi, selfBase := e.p0+i, -1
	var p *panelGeom
	if i == e.np+1 {
		// Tangency at the base panel's midpoint.
		pi, selfBase, p = -1, k, &e.base
	} else {
		p = &g.panels[pi]
	}
	g.addNormalInfluence(p.mx, p.my, p.nx, p.ny, pi, selfBase, row, sc)
	if g.ground {
		// The image of panel j at m_i equals the reflection (u, −v) of
		// panel j's velocity at the reflected point; its normal
		// component is u n_x − v n_y. The same holds for a source with
		// an image of the same sign (field.go).
		g.addNormalInfluence(p.mx, 2*g.groundY-p.my, p.nx, -p.ny, -1, -1, row, sc)
	}
	rhs[0] = -p.nx
	if len(rhs) > 1 {
		rhs[1] = -p.ny
	}
}

// addNormalInfluence adds to row, column by unknown, the component along
// (nx, ny) of the velocity induced at (px, py) by every panel per unit nodal
// γ and by every base source panel per unit σ. Panel self (if ≥ 0) is the
// panel whose midpoint (px, py) is: its limit on the outer face is taken
// exactly, λ = 0 and Δθ = −π. selfBase (if ≥ 0) is the element whose base
// panel's midpoint it is: there the limit on the inner face is taken,
// λ = 0 and Δθ = +π (see the method notes).
func (g *geometry) addNormalInfluence(px, py, nx, ny float64, self, selfBase int, row []float64, sc *rowScratch) {
	const inv2pi = 1 / (2 * math.Pi)
	for ei := range g.elems {
		e := &g.elems[ei]
		floor := minDistFrac * minDistFrac * e.chord * e.chord
		nn := len(e.nodes)
		dxs, dys, r2s := sc.dx[:nn], sc.dy[:nn], sc.r2[:nn]
		for k, q := range e.nodes {
			dx, dy := px-q.X, py-q.Y
			dxs[k], dys[k], r2s[k] = dx, dy, dx*dx+dy*dy
		}
		panels := g.panels[e.p0 : e.p0+e.np]
		// The columns of the element's nodal strengths: panel k adds to
		// columns k and k+1, so the share of column k+1 is carried to the
		// next panel instead of being stored and loaded again.
		col := row[e.u0 : e.u0+e.np+1]
		carry := 0.0
		for k := range panels {
			pn := &panels[k]
			r1x, r1y := dxs[k], dys[k]
			x := r1x*pn.tx + r1y*pn.ty
			y := -r1x*pn.ty + r1y*pn.tx
			var dth, lam float64
			if e.p0+k == self {
				dth, lam = -math.Pi, 0
			} else {
				dth, lam = subtended(r1x, r1y, dxs[k+1], dys[k+1], r2s[k], r2s[k+1], x, pn.l, floor)
			}
			// linearVortex (influence.go) projected on n: with
			// tn = x'·n, ln = y'·n and w = p tn + q ln, the γa
			// coefficient is (Δθ tn − λ ln − w)/2π and the γb one w/2π.
			tn := pn.tx*nx + pn.ty*ny  // panel x' axis · n
			ln := -pn.ty*nx + pn.tx*ny // panel y' axis · n
			pp := (x*dth - y*lam) * pn.il
			qq := 1 - (x*lam+y*dth)*pn.il
			w := pp*tn + qq*ln
			col[k] += (dth*tn-lam*ln-w)*inv2pi + carry
			carry = w * inv2pi
		}
		col[e.np] += carry
		if e.open() {
			// The base panel runs from the last node to the first: its
			// r1 and r2 are those of the two end nodes.
			b := &e.base
			var dth, lam float64
			if ei == selfBase {
				// The inner face of the base panel (see the method
				// notes): Δθ → +π.
				dth, lam = math.Pi, 0
			} else {
				r1x, r1y := dxs[nn-1], dys[nn-1]
				dth, lam = subtended(r1x, r1y, dxs[0], dys[0], r2s[nn-1], r2s[0], r1x*b.tx+r1y*b.ty, b.l, floor)
			}
			us, vs := constantSource(dth, lam)
			row[e.us] += us*(b.tx*nx+b.ty*ny) + vs*(-b.ty*nx+b.tx*ny)
		}
	}
}

// factorize LU-factorises a in place and estimates its condition number
// (factorLU, estimateCond, checkCond in turn).
func (s *System) factorize(a *mat.Dense, anorm float64) error {
	if err := s.factorLU(a); err != nil {
		return err
	}
	s.estimateCond(anorm)
	return s.checkCond()
}

// factorLU LU-factorises a in place with partial pivoting, P A = L U, on
// the assembled storage (lapack64.Getrf, gonum's blocked LAPACK routine).
// An exactly zero pivot returns a *SingularError.
func (s *System) factorLU(a *mat.Dense) error {
	raw := a.RawMatrix()
	s.lu = blas64.General{Rows: raw.Rows, Cols: raw.Cols, Stride: raw.Stride, Data: raw.Data}
	s.ipiv = make([]int, raw.Rows)
	if !lapack64.Getrf(s.lu, s.ipiv) {
		s.cond = math.Inf(1)
		return &SingularError{Cond: s.cond}
	}
	return nil
}

// solveColumns overwrites each column of b (Unknowns() rows, row-major)
// with the solution x of A x = b, A being the influence matrix, with the
// kept LU factors (lapack64.Getrs). It is safe for concurrent use on
// different b.
func (s *System) solveColumns(b blas64.General) {
	if b.Rows != s.geo.n {
		panic(fmt.Sprintf("solver: solveColumns: %d rows for %d unknowns", b.Rows, s.geo.n))
	}
	lapack64.Getrs(blas.NoTrans, s.lu, b, s.ipiv)
}

// estimateCond sets s.cond, the condition number in the 1-norm estimated
// from the factors and anorm, the 1-norm of the matrix (lapack64.Gecon,
// Higham's estimator as in LAPACK's DGECON). It only reads the factors.
func (s *System) estimateCond(anorm float64) {
	n := s.lu.Rows
	rcond := lapack64.Gecon(lapack.MaxColumnSum, s.lu, anorm, make([]float64, 4*n), make([]int, n))
	s.cond = 1 / rcond
}

// checkCond refuses a numerically singular matrix and adds the warnings of
// an ill-conditioned one and of wide open trailing edges.
func (s *System) checkCond() error {
	if math.IsInf(s.cond, 0) || math.IsNaN(s.cond) || s.cond > mat.ConditionTolerance {
		return &SingularError{Cond: s.cond}
	}
	if s.cond > CondWarn {
		s.warnings = append(s.warnings, fmt.Sprintf("ill-conditioned influence matrix (condition number estimate %.3g > %.0g): results may be inaccurate; check for overlapping or nearly touching elements", s.cond, CondWarn))
	}
	for _, e := range s.geo.elems {
		if e.teGap > MaxTEGapFraction*e.chord {
			s.warnings = append(s.warnings, fmt.Sprintf("element %q: open trailing edge gap %.2g%% of chord; the base-source model of a blunt edge is doubtful beyond about %.0f%% (the real flow behind a thick base separates)", e.name, 100*e.teGap/e.chord, 100*MaxTEGapFraction))
		}
		if n := e.thinUpper + e.thinLower; n > 0 {
			s.warnings = append(s.warnings, fmt.Sprintf("element %q: trailing edge thinner than its panels over the last %.2g%% of chord (%d panels lie within %.0f%% of their length of the opposite surface): Cp there is unreliable and is left out of Cp min, and the pressure lift (ClPressure) integrates it; use fewer panels there or a thicker trailing edge", e.name, 100*(1-e.thinXC), n, 100*thinTEFraction))
		}
	}
	return nil
}

// solveUnit solves for the unit right-hand sides (the columns of b) with
// the factors: x = U⁻¹ L⁻¹ P b, row interchanges then two triangular
// solves per column (blas64.Trsv; for two columns cheaper than
// lapack64.Getrs on row-major storage). It only reads the factors.
func (s *System) solveUnit(b *mat.Dense) error {
	n := s.geo.n
	lower := blas64.Triangular{Uplo: blas.Lower, Diag: blas.Unit, N: n, Stride: s.lu.Stride, Data: s.lu.Data}
	upper := blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: n, Stride: s.lu.Stride, Data: s.lu.Data}
	solve := func(col int) []float64 {
		x := make([]float64, n)
		mat.Col(x, col, b)
		for i, p := range s.ipiv {
			if p != i {
				x[i], x[p] = x[p], x[i]
			}
		}
		v := blas64.Vector{N: n, Inc: 1, Data: x}
		blas64.Trsv(blas.NoTrans, lower, v)
		blas64.Trsv(blas.NoTrans, upper, v)
		return x
	}
	s.g0 = solve(0)
	if !s.geo.ground {
		s.g90 = solve(1)
	}
	for _, g := range [][]float64{s.g0, s.g90} {
		for _, v := range g {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return &SingularError{Cond: math.Inf(1)}
			}
		}
	}
	return nil
}

// Cond returns the condition-number estimate (1-norm) of the influence
// matrix.
func (s *System) Cond() float64 { return s.cond }

// Unknowns returns the size of the linear system, Σ (N_k + 1) plus one base
// source per open trailing edge.
func (s *System) Unknowns() int { return s.geo.n }

// Panels returns the total number of panels.
func (s *System) Panels() int { return len(s.geo.panels) }

// Ground reports whether the system includes a ground plane.
func (s *System) Ground() bool { return s.geo.ground }

// RefChord returns the reference chord of the configuration's coefficients.
func (s *System) RefChord() float64 { return s.geo.refChord }

// Warnings returns the warnings every solution of s carries.
func (s *System) Warnings() []string { return append([]string(nil), s.warnings...) }

// checkAlpha panics if alphaDeg is not allowed.
func (s *System) checkAlpha(alphaDeg float64) {
	if math.IsNaN(alphaDeg) || math.IsInf(alphaDeg, 0) {
		panic(fmt.Sprintf("solver: angle of attack %g is not finite", alphaDeg))
	}
	if s.geo.ground && alphaDeg != 0 {
		panic(fmt.Sprintf("solver: ground mode needs the freestream at 0° (got %g°); rotate the configuration instead", alphaDeg))
	}
}

// weights returns the superposition factors of the unit solutions.
func (s *System) weights(alphaDeg float64) (c, sn float64) {
	if s.geo.ground {
		return 1, 0
	}
	sn, c = math.Sincos(alphaDeg * math.Pi / 180)
	return c, sn
}

// Solve returns the flow at freestream angle alphaDeg (degrees, to +x) by
// superposing the two unit solutions: γ = cos α γ0 + sin α γ90. In ground
// mode it panics unless alphaDeg is 0 (see the method notes); it panics on a
// non-finite angle.
func (s *System) Solve(alphaDeg float64) *Solution {
	s.checkAlpha(alphaDeg)
	c, sn := s.weights(alphaDeg)
	g := make([]float64, s.geo.n)
	for i := range g {
		g[i] = c * s.g0[i]
		if s.g90 != nil {
			g[i] += sn * s.g90[i]
		}
	}
	return s.solution(alphaDeg, c, sn, g)
}

// Sweep returns the integrated coefficients at each angle (degrees). On top
// of the factorised system it costs O(1) per angle for lift and moment
// (precomputed quadratic forms in cos α and sin α) and a scan of a convex
// hull of a few dozen points for CpMin (forces.go), so a sweep of tens of
// angles costs about one Solve. In ground mode every angle must be 0.
func (s *System) Sweep(alphaDeg []float64) []Coefficients {
	out := make([]Coefficients, len(alphaDeg))
	for i, a := range alphaDeg {
		s.checkAlpha(a)
		out[i] = s.coefficients(a)
	}
	return out
}
