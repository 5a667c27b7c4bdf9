package solver

import (
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"sectionbench/model"
	"sectionbench/solver/ode"
)

// Streamlines.
//
// A streamline solves dx/dσ = V(x)/|V(x)|, parametrised by arc length σ so
// that points are spread evenly whatever the local speed. It is integrated
// with the Dormand–Prince 5(4) pair (package solver/ode: seven stages, the
// last reused as the first of the next step, a fifth-order solution and an
// embedded fourth-order one whose difference estimates the local error). A
// step is accepted when the length of that error vector is below Tol, and
// the next step is h·min(5, max(0.2, 0.9 (err/Tol)^{−1/5})) (ode.StepScale).
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
	// The line's equation for the shared step: y = (x, y), y′ the unit
	// direction; the arc length σ does not appear on the right.
	f := func(_ float64, y, dy []float64) bool {
		var ok bool
		dy[0], dy[1], _, ok = in.dir(y[0], y[1], backward)
		return ok
	}
	dp := ode.NewDormandPrince(2)
	y, k1 := []float64{p.X, p.Y}, []float64{k1x, k1y}
	y1, k7, e := make([]float64, 2), make([]float64, 2), make([]float64, 2)
	h := math.Min(in.hmax, 100*in.hmin)
	// Rejected steps do not count against MaxSteps, but every rejection
	// shrinks h by at least half (or by the error control's factor, at
	// most 0.9), so a line cannot stall; maxAttemptsPerStep is a backstop.
	for steps, attempts := 0, 0; steps < in.maxSteps && attempts < maxAttemptsPerStep*in.maxSteps; attempts++ {
		if !dp.Advance(f, 0, y, k1, h, y1) {
			// A stage entered a body (or a stagnation point): halve
			// the step, closing in on the surface.
			if h *= 0.5; h < in.hmin {
				return sl
			}
			continue
		}
		if !in.b.contains(y1[0], y1[1]) {
			// Leaving the domain: the step is accepted as it is, its
			// last point clipped to the edge.
			ex, ey := clipToRect(in.b, y[0], y[1], y1[0], y1[1])
			_, _, spe, _ := in.dir(ex, ey, backward)
			sl.Points = append(sl.Points, model.Point{X: ex, Y: ey})
			sl.Speed = append(sl.Speed, spe)
			return sl
		}
		var sp7 float64
		k7[0], k7[1], sp7, ok = in.dir(y1[0], y1[1], backward)
		if !ok {
			if h *= 0.5; h < in.hmin {
				return sl
			}
			continue
		}
		dp.Error(h, k1, k7, e)
		ratio := math.Hypot(e[0], e[1]) / in.tol
		if !(ratio <= 1) {
			// Too inaccurate (or a non-finite error): shrink.
			if h *= ode.StepScale(ratio); h < in.hmin {
				return sl
			}
			continue
		}
		steps++
		copy(y, y1)
		copy(k1, k7)
		sl.Points = append(sl.Points, model.Point{X: y[0], Y: y[1]})
		sl.Speed = append(sl.Speed, sp7)
		h = math.Min(in.hmax, h*ode.StepScale(ratio))
	}
	return sl
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
