package solver

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"sectionbench/model"
)

// Streamlines.
//
// A streamline solves dx/dσ = V(x)/|V(x)|, parametrised by arc length σ so
// that points are spread evenly whatever the local speed. It is integrated
// with the explicit Runge–Kutta pair of Dormand and Prince (J. R. Dormand
// and P. J. Prince, "A family of embedded Runge–Kutta formulae", J. Comput.
// Appl. Math. 6(1), 1980; coefficients as tabulated by Hairer, Nørsett and
// Wanner, Solving Ordinary Differential Equations I, 2nd ed., 1993, sec.
// II.5, Table 5.2): seven stages, the last reused as the first of the next
// step (FSAL), a fifth-order solution and an embedded fourth-order one whose
// difference estimates the local error. A step is accepted when that error
// is below Tol and the next step is h·min(5, max(0.2, 0.9 (Tol/err)^{1/5}))
// (Hairer et al. eq. II.4.13 with their safety factor 0.9).
//
// A streamline stops when a stage would enter a body (the step is halved
// until it is below the smallest step, then the line ends at the surface),
// when it leaves the bounds (its last point is moved onto the edge), when
// the speed falls below stagnationSpeed, or after MaxSteps steps.

// Rect is an axis-aligned rectangle.
type Rect struct{ Min, Max model.Point }

// StreamOptions control Streamlines. Zero fields take the defaults below.
type StreamOptions struct {
	Bounds   Rect    // domain; zero means DefaultBounds of the configuration
	Seeds    int     // streamlines seeded on the upstream edge; default DefaultSeeds
	MaxSteps int     // accepted steps per streamline; default DefaultMaxSteps
	Tol      float64 // local error per step, length units; default DefaultTolFraction × the bounds' diagonal
}

// Streamline defaults.
const (
	DefaultSeeds       = 25
	DefaultMaxSteps    = 4000
	DefaultTolFraction = 1e-6
	// maxStepFraction caps a step at this fraction of the bounds'
	// diagonal, so that plotted lines stay smooth between points.
	maxStepFraction = 0.01
	// minStepFraction is the smallest step, as a fraction of the diagonal:
	// below it a step that keeps entering a body ends the line there.
	minStepFraction = 1e-7
	// stagnationSpeed / U∞ ends a line at a stagnation point, where the
	// direction of flow is undefined.
	stagnationSpeed = 1e-9
	// maxAttemptsPerStep bounds the attempted steps of a line at this
	// multiple of MaxSteps.
	maxAttemptsPerStep = 20
	// dividingOffset is how far off the stagnation point, as a fraction of
	// the element's chord along the surface's outward normal, the dividing
	// streamline starts its upstream integration.
	dividingOffset = 1e-3
)

// Streamline is one integrated line: points in flow order and the speed /
// U∞ at each. Dividing marks the line that ends at an element's stagnation
// point.
type Streamline struct {
	Points   []model.Point
	Speed    []float64
	Dividing bool
}

// Dormand–Prince 5(4) coefficients (Hairer, Nørsett & Wanner, Table 5.2).
const (
	dpA21 = 1.0 / 5
	dpA31 = 3.0 / 40
	dpA32 = 9.0 / 40
	dpA41 = 44.0 / 45
	dpA42 = -56.0 / 15
	dpA43 = 32.0 / 9
	dpA51 = 19372.0 / 6561
	dpA52 = -25360.0 / 2187
	dpA53 = 64448.0 / 6561
	dpA54 = -212.0 / 729
	dpA61 = 9017.0 / 3168
	dpA62 = -355.0 / 33
	dpA63 = 46732.0 / 5247
	dpA64 = 49.0 / 176
	dpA65 = -5103.0 / 18656
	dpB1  = 35.0 / 384
	dpB3  = 500.0 / 1113
	dpB4  = 125.0 / 192
	dpB5  = -2187.0 / 6784
	dpB6  = 11.0 / 84
	// Error weights: fifth- minus fourth-order weights.
	dpE1 = 71.0 / 57600
	dpE3 = -71.0 / 16695
	dpE4 = 71.0 / 1920
	dpE5 = -17253.0 / 339200
	dpE6 = 22.0 / 525
	dpE7 = -1.0 / 40
)

// DefaultBounds returns a rectangle framing the elements of cfg with margins
// of boundsUpstream, boundsDownstream and boundsSide times the largest
// extent of the configuration; in ground mode the bottom edge is the ground
// when it lies within the margin. It panics if cfg has no nodes.
func DefaultBounds(cfg Config) Rect {
	first := true
	var r Rect
	for _, e := range cfg.Elements {
		for _, p := range e.Nodes {
			if first {
				r = Rect{p, p}
				first = false
			}
			r.Min = model.Point{X: math.Min(r.Min.X, p.X), Y: math.Min(r.Min.Y, p.Y)}
			r.Max = model.Point{X: math.Max(r.Max.X, p.X), Y: math.Max(r.Max.Y, p.Y)}
		}
	}
	if first {
		panic("solver: DefaultBounds of a configuration without nodes")
	}
	w := math.Max(r.Max.X-r.Min.X, r.Max.Y-r.Min.Y)
	r.Min.X -= boundsUpstream * w
	r.Max.X += boundsDownstream * w
	r.Min.Y -= boundsSide * w
	r.Max.Y += boundsSide * w
	if cfg.Ground && cfg.GroundY > r.Min.Y {
		r.Min.Y = cfg.GroundY
	}
	return r
}

// Margins of DefaultBounds, in units of the configuration's largest extent:
// chosen to show the upstream turning of the flow and the start of the
// downwash, as a plot frame, not a physical limit.
const (
	boundsUpstream   = 0.5
	boundsDownstream = 0.75
	boundsSide       = 0.5
)

func (r Rect) contains(x, y float64) bool {
	return x >= r.Min.X && x <= r.Max.X && y >= r.Min.Y && y <= r.Max.Y
}

// Streamlines integrates opt.Seeds streamlines from points evenly spread on
// the upstream (left) edge of the bounds, skipping seeds inside a body or
// below the ground, followed by one dividing streamline per element: from a
// point just off its stagnation point (dividingOffset of the chord along the
// outward normal) integrated upstream to the edge of the bounds, returned in
// flow order and ending at the stagnation point. Lines are computed in
// parallel over GOMAXPROCS goroutines.
func (s *Solution) Streamlines(opt StreamOptions) []Streamline {
	f := s.field()
	geo := f.geo
	if opt.Bounds == (Rect{}) {
		cfg := Config{Ground: geo.ground, GroundY: geo.groundY}
		for _, e := range geo.elems {
			cfg.Elements = append(cfg.Elements, Element{Nodes: e.nodes})
		}
		opt.Bounds = DefaultBounds(cfg)
	}
	b := opt.Bounds
	diag := math.Hypot(b.Max.X-b.Min.X, b.Max.Y-b.Min.Y)
	if !(diag > 0) {
		panic("solver: streamline bounds are empty")
	}
	if opt.Seeds <= 0 {
		opt.Seeds = DefaultSeeds
	}
	if opt.MaxSteps <= 0 {
		opt.MaxSteps = DefaultMaxSteps
	}
	if !(opt.Tol > 0) {
		opt.Tol = DefaultTolFraction * diag
	}
	type job struct {
		start    model.Point
		backward bool
		end      *model.Point // appended after reversing (stagnation point)
	}
	var jobs []job
	for i := range opt.Seeds {
		y := b.Min.Y + (float64(i)+0.5)*(b.Max.Y-b.Min.Y)/float64(opt.Seeds)
		if geo.inside(b.Min.X, y) {
			continue
		}
		jobs = append(jobs, job{start: model.Point{X: b.Min.X, Y: y}})
	}
	for k := range s.Elements {
		st := s.Elements[k].Stagnation
		sp := model.Point{X: st.X, Y: st.Y}
		n := geo.elems[k].normalAt(st.S)
		off := sp.Add(n.Scale(dividingOffset * geo.elems[k].chord))
		jobs = append(jobs, job{start: off, backward: true, end: &sp})
	}
	out := make([]Streamline, len(jobs))
	in := &integrator{f: f, b: b, tol: opt.Tol, hmax: maxStepFraction * diag, hmin: minStepFraction * diag, maxSteps: opt.MaxSteps}
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), len(jobs)) {
		wg.Go(func() {
			for {
				i := int(next.Add(1)) - 1
				if i >= len(jobs) {
					return
				}
				j := jobs[i]
				sl := in.run(j.start, j.backward)
				if j.backward {
					reverse(sl.Points)
					reverse(sl.Speed)
					sl.Points = append(sl.Points, *j.end)
					sl.Speed = append(sl.Speed, 0)
					sl.Dividing = true
				}
				out[i] = sl
			}
		})
	}
	wg.Wait()
	return out
}

func reverse[T any](s []T) {
	for i, j := 0, len(s)-1; i < j; i, j = i+1, j-1 {
		s[i], s[j] = s[j], s[i]
	}
}

// normalAt returns the outward unit normal of the panel at arc length s.
func (e *elemGeom) normalAt(s float64) model.Point {
	k := 0
	for k+2 < len(e.sNode) && e.sNode[k+1] < s {
		k++
	}
	a, b := e.nodes[k], e.nodes[k+1]
	t := b.Sub(a).Scale(1 / a.Dist(b))
	return model.Point{X: t.Y, Y: -t.X}
}

// integrator holds the settings of one Streamlines call.
type integrator struct {
	f          *field
	b          Rect
	tol        float64
	hmax, hmin float64
	maxSteps   int
}

// dir returns the unit flow direction (reversed if backward), the speed, and
// ok = false inside a body or at a stagnation point.
func (in *integrator) dir(x, y float64, backward bool) (dx, dy, speed float64, ok bool) {
	u, v, inside := in.f.at(x, y)
	if inside {
		return 0, 0, 0, false
	}
	speed = math.Hypot(u, v)
	if speed < stagnationSpeed {
		return 0, 0, speed, false
	}
	if backward {
		u, v = -u, -v
	}
	return u / speed, v / speed, speed, true
}

// run integrates one streamline from p.
func (in *integrator) run(p model.Point, backward bool) Streamline {
	var sl Streamline
	k1x, k1y, sp, ok := in.dir(p.X, p.Y, backward)
	sl.Points = append(sl.Points, p)
	sl.Speed = append(sl.Speed, sp)
	if !ok {
		return sl
	}
	x, y := p.X, p.Y
	h := math.Min(in.hmax, 100*in.hmin)
	// Rejected steps do not count against MaxSteps, but every rejection
	// shrinks h by at least half (or by the error control's factor, at
	// most 0.9), so a line cannot stall; maxAttemptsPerStep is a backstop.
	for steps, attempts := 0, 0; steps < in.maxSteps && attempts < maxAttemptsPerStep*in.maxSteps; attempts++ {
		nx, ny, k7x, k7y, sp7, err, ok := in.step(x, y, h, k1x, k1y, backward)
		if !ok || !(err <= in.tol) {
			// Entered a body (or a stagnation point), or too inaccurate
			// (or a non-finite error): shrink.
			f := 0.5
			if ok && !math.IsInf(err, 1) && !math.IsNaN(err) {
				f = math.Max(0.2, 0.9*math.Pow(in.tol/err, 0.2))
			}
			h *= f
			if h < in.hmin {
				return sl
			}
			continue
		}
		steps++
		if !in.b.contains(nx, ny) {
			ex, ey := clipToRect(in.b, x, y, nx, ny)
			_, _, spe, _ := in.dir(ex, ey, backward)
			sl.Points = append(sl.Points, model.Point{X: ex, Y: ey})
			sl.Speed = append(sl.Speed, spe)
			return sl
		}
		x, y, k1x, k1y = nx, ny, k7x, k7y
		sl.Points = append(sl.Points, model.Point{X: x, Y: y})
		sl.Speed = append(sl.Speed, sp7)
		grow := 5.0
		if err > 0 {
			grow = math.Min(5, 0.9*math.Pow(in.tol/err, 0.2))
		}
		h = math.Min(in.hmax, h*math.Max(grow, 0.2))
	}
	return sl
}

// step takes one Dormand–Prince step of size h from (x, y) with first stage
// (k1x, k1y). It returns the new point, its direction (the FSAL stage), its
// speed, the error estimate, and ok = false if a stage entered a body.
func (in *integrator) step(x, y, h, k1x, k1y float64, bw bool) (nx, ny, k7x, k7y, sp7, errEst float64, ok bool) {
	k2x, k2y, _, ok := in.dir(x+h*dpA21*k1x, y+h*dpA21*k1y, bw)
	if !ok {
		return
	}
	k3x, k3y, _, ok := in.dir(x+h*(dpA31*k1x+dpA32*k2x), y+h*(dpA31*k1y+dpA32*k2y), bw)
	if !ok {
		return
	}
	k4x, k4y, _, ok := in.dir(x+h*(dpA41*k1x+dpA42*k2x+dpA43*k3x), y+h*(dpA41*k1y+dpA42*k2y+dpA43*k3y), bw)
	if !ok {
		return
	}
	k5x, k5y, _, ok := in.dir(x+h*(dpA51*k1x+dpA52*k2x+dpA53*k3x+dpA54*k4x), y+h*(dpA51*k1y+dpA52*k2y+dpA53*k3y+dpA54*k4y), bw)
	if !ok {
		return
	}
	k6x, k6y, _, ok := in.dir(x+h*(dpA61*k1x+dpA62*k2x+dpA63*k3x+dpA64*k4x+dpA65*k5x), y+h*(dpA61*k1y+dpA62*k2y+dpA63*k3y+dpA64*k4y+dpA65*k5y), bw)
	if !ok {
		return
	}
	nx = x + h*(dpB1*k1x+dpB3*k3x+dpB4*k4x+dpB5*k5x+dpB6*k6x)
	ny = y + h*(dpB1*k1y+dpB3*k3y+dpB4*k4y+dpB5*k5y+dpB6*k6y)
	if !in.b.contains(nx, ny) {
		// Leaving the domain: the step is accepted as it is (its last
		// point is clipped to the edge by the caller).
		return nx, ny, 0, 0, 0, 0, true
	}
	k7x, k7y, sp7, ok = in.dir(nx, ny, bw)
	if !ok {
		return
	}
	ex := h * (dpE1*k1x + dpE3*k3x + dpE4*k4x + dpE5*k5x + dpE6*k6x + dpE7*k7x)
	ey := h * (dpE1*k1y + dpE3*k3y + dpE4*k4y + dpE5*k5y + dpE6*k6y + dpE7*k7y)
	return nx, ny, k7x, k7y, sp7, math.Hypot(ex, ey), true
}

// clipToRect returns where the segment from the inside point (x0, y0) to the
// outside point (x1, y1) crosses the boundary of r.
func clipToRect(r Rect, x0, y0, x1, y1 float64) (float64, float64) {
	t := 1.0
	dx, dy := x1-x0, y1-y0
	if x1 < r.Min.X {
		t = math.Min(t, (r.Min.X-x0)/dx)
	}
	if x1 > r.Max.X {
		t = math.Min(t, (r.Max.X-x0)/dx)
	}
	if y1 < r.Min.Y {
		t = math.Min(t, (r.Min.Y-y0)/dy)
	}
	if y1 > r.Max.Y {
		t = math.Min(t, (r.Max.Y-y0)/dy)
	}
	return x0 + t*dx, y0 + t*dy
}
