package solver

import (
	"context"
	"math"
	"sync"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"

	bl "sectionbench/solver/boundarylayer"
)

// The coupled system. Every station i carries three unknowns, its third
// variable c_i (ñ or √Cτ), θ_i and the mass defect m_i = Ue_i δ*_i, and
// three residuals R_i (boundarylayer: an interval from the preceding
// station, the stagnation similarity, or the wake's start at a trailing
// edge), which depend on the unknowns and edge velocities of station i
// and its predecessors. The edge velocities are Ue = Ue0 + D m
// (coupled_influence.go), so the boundary layers and the panel solution
// are one nonlinear system, solved by Newton's method as Drela & Giles
// (AIAA J. 25(10), 1987) do.
//
// The Jacobian is block lower-bidiagonal in (c, θ) and dense in m. Its
// blocks come from finite differences of each station's residuals. The
// linear system is reduced station by station in marching order: with the
// predecessors' local unknowns already written as L_p = P_p − Q_p Δm,
// station i's three equations become A_i L_i + W_i Δm = r_i, A_i being 3×2;
// the combination z = a1 × a2 orthogonal to A's columns gives one equation
// in Δm alone, and L_i = A⁺ (r_i − W_i Δm). The Δm equations form a dense
// system of one row per station, solved by GMRES through an earlier
// step's LU factors (coupled_linear.go) with products that never form it,
// or by factorising it; back-substitution gives the rest. The cost per
// iteration is O(n²) (products with D), plus the O(n³/3) of the LU when
// one is made.

// Limits of one Newton update (as fractions of the current values): a
// larger step is scaled down as a whole so no θ, m or √Cτ changes by more
// than this, and ñ by no more than maxAmpStep (common practice in
// Newton solutions of boundary layers).
const (
	maxRelDecrease = 0.5
	maxRelIncrease = 1.5
	maxAmpStep     = 2.0
	// Largest shape factors of the initial march in direct mode; beyond
	// them it holds H there and lets Ue follow (inverse mode), as at
	// separation (Drela & Giles 1987 switch at similar values; from
	// memory).
	maxMarchHLaminar   = 3.8
	maxMarchHTurbulent = 2.5
	maxMarchHWake      = 3.0
	minH               = 1.02
	defaultMaxIter     = 60
	defaultTolerance   = 1e-5
)

// stationOf returns station i's state with edge velocity ue.
func (cs *coupledState) stationOf(i int, ue float64) bl.Station {
	return bl.Station{Xi: cs.st[i].xi, Ue: ue, Theta: cs.th[i], DStar: cs.m[i] / ue, C: cs.c[i]}
}

// local holds the variables of a station and its predecessors for one
// residual evaluation: per participant (c, θ, m, Ue).
type local struct {
	idx [3]int
	n   int
	v   [3][4]float64
}

func (cs *coupledState) localOf(i int, ue []float64) local {
	s := &cs.st[i]
	var l local
	l.idx[0] = i
	l.n = 1 + s.nprev
	for q := 0; q < s.nprev; q++ {
		l.idx[1+q] = s.prev[q]
	}
	for q := 0; q < l.n; q++ {
		j := l.idx[q]
		l.v[q] = [4]float64{cs.c[j], cs.th[j], cs.m[j], ue[j]}
	}
	return l
}

func (cs *coupledState) stationFrom(l *local, q int) bl.Station {
	j := l.idx[q]
	v := l.v[q]
	ue := max(v[3], 1e-6)
	return bl.Station{Xi: cs.st[j].xi, Ue: ue, Theta: max(v[1], 1e-12), DStar: max(v[2], 1e-14) / ue, C: v[0]}
}

// residual returns station i's residuals from the local variables.
func (cs *coupledState) residual(i int, l *local) bl.Residuals {
	s := &cs.st[i]
	me := cs.stationFrom(l, 0)
	switch {
	case s.first:
		// The stagnation station's speed is that of the plane
		// stagnation-point flow through the first coupled station
		// (ueLayers), so its θ, ∝ √(ξ/Ue), does not move with every
		// mass defect nearby.
		return bl.Similarity(me, cs.re)
	case s.wakeStart:
		return bl.WakeStart(cs.stationFrom(l, 1), cs.stationFrom(l, 2), me, 0)
	}
	p := cs.stationFrom(l, 1)
	pk := cs.st[s.prev[0]].kind
	if pk == bl.Laminar && s.kind == bl.Turbulent {
		trip := s.tripXi
		if s.last {
			trip = math.Min(trip, s.xi)
		}
		r, _ := bl.TransitionInterval(p, me, cs.re, cs.ncrit, trip)
		return r
	}
	return bl.Interval(s.kind, p, me, cs.re)
}

// plainInterval reports whether station i's residuals are a plain
// interval from its predecessor of one regime (residual), and the regime.
func (cs *coupledState) plainInterval(i int) (bool, bl.Kind) {
	s := &cs.st[i]
	if s.first || s.wakeStart {
		return false, 0
	}
	if cs.st[s.prev[0]].kind == bl.Laminar && s.kind == bl.Turbulent {
		return false, 0
	}
	return true, s.kind
}

// fdStep returns the finite-difference step of local variable v of kind k
// (0 c, 1 θ, 2 m, 3 Ue).
func fdStep(k int, v float64, laminar bool) float64 {
	if k == 0 && laminar {
		return 1e-6
	}
	return 1e-7*math.Abs(v) + 1e-12
}

// solve runs the coupled iterations. With ueMarch (a cold start from the
// march) it first follows the continuation; otherwise it iterates the
// full coupling from the current state (a warm start).
func (cs *coupledState) solve(ctx context.Context, ueMarch []float64) (converged bool, iters int, res float64, err error) {
	maxIt := cs.opt.MaxIterations
	if maxIt <= 0 {
		maxIt = defaultMaxIter
	}
	tol := cs.opt.Tolerance
	if tol <= 0 {
		tol = defaultTolerance
	}
	if ueMarch != nil {
		n, err := cs.continuation(ctx, ueMarch)
		iters += n
		if err != nil {
			return false, iters, math.Inf(1), err
		}
	}
	converged, n, res, err := cs.iterate(ctx, maxIt, 0, tol)
	return converged, iters + n, res, err
}

// iterate runs at most maxIt Newton iterations from the current state,
// the first round up to grace more while its steps keep falling
// (newtonIterations).
//
// Within the Newton iterations transition may only move upstream (retype
// without relaminarising): a transition station turning laminar and
// turbulent again between steps was the commonest cause of failure (on
// NACA 0012 at Re 6e6 the iterations failed from 6° up until this was
// done). Once they have converged, retype with relaminarising checks each
// transition station against its own laminar solution; if one turns
// laminar the iterations go on (at most maxRelaminarisations times), and
// if they then fail, the converged state before is restored and returned:
// its transition lies at most a few stations upstream of the consistent
// one. In the same way, with the strategy that holds the layout, a
// converged solution whose stagnation points left their panels is laid
// out again at them (relayout, the variables carried over by arc length)
// and the iterations go on: at high lift the boundary layers take a
// quarter of the circulation away and the stagnation points move by
// several leading-edge panels (NACA 4412 at 12.5° converges only so).
func (cs *coupledState) iterate(ctx context.Context, maxIt, grace int, tol float64) (converged bool, iters int, res float64, err error) {
	var fallback *snapshot
	var fallbackRes float64
	for relaminarised := 0; ; relaminarised++ {
		// Each round has maxIt iterations: a warm start's short budget
		// (warmDirectIterations) is for reaching convergence, not for
		// the rounds that move transition after it, which a shared
		// budget cut short with transition still upstream of its e^N
		// position (NACA 4412 at Re 2.8e5 and 5°: x/c 0.42 instead of
		// 0.49, Cl 2 % low).
		conv, n, r, err := cs.newtonIterations(ctx, maxIt, grace, tol)
		grace = 0 // for reaching convergence, not for moving transition after it
		iters += n
		if err != nil {
			return false, iters, r, err
		}
		if !conv {
			if fallback != nil {
				cs.restore(*fallback)
				return true, iters, fallbackRes, nil
			}
			return false, iters, r, nil
		}
		if relaminarised == maxRelaminarisations {
			return true, iters, r, nil
		}
		snap := cs.snapshot()
		changed := cs.retype(true)
		if !cs.strategy.followStagnation && cs.ueMarch == nil {
			// The layout follows the converged coupled stagnation
			// points (between solutions, not between Newton steps).
			if stag, _ := cs.coupledSplits(); cs.stagnationShift(stag) >= minRelayoutShift {
				cs.relayout(stag)
				changed = true
			}
		}
		if !changed {
			return true, iters, r, nil
		}
		fallback, fallbackRes = &snap, r
	}
}

// newtonIterations runs at most maxIt Newton iterations from the current
// state, transition moving upstream only (iterate). Past maxIt it goes on,
// up to grace iterations more, while the step has fallen in each of the
// last graceFalling iterations: the iterations are then converging, and
// stopping them throws their progress away for the costlier routes
// (solveFrom).
func (cs *coupledState) newtonIterations(ctx context.Context, maxIt, grace int, tol float64) (converged bool, iters int, res float64, err error) {
	n := len(cs.st)
	prevRes, grown, falling := math.Inf(1), 0, 0
	bound := maxIt
	for it := 1; it <= bound; it++ {
		if err := ctx.Err(); err != nil {
			return false, it - 1, res, err
		}
		dc, dth, dm, ok := cs.newtonStep()
		if !ok {
			return false, it, math.Inf(1), nil
		}
		// Relaxation.
		rlx := 1.0
		limit := func(rel float64) {
			if rel*rlx < -maxRelDecrease {
				rlx = -maxRelDecrease / rel
			}
			if rel*rlx > maxRelIncrease {
				rlx = maxRelIncrease / rel
			}
		}
		for i := range n {
			limit(dth[i] / cs.th[i])
			limit(dm[i] / cs.m[i])
			if cs.st[i].kind == bl.Laminar {
				if a := math.Abs(dc[i]); a*rlx > maxAmpStep {
					rlx = maxAmpStep / a
				}
			} else {
				limit(dc[i] / cs.c[i])
			}
		}
		ue, du := cs.speedStep(dm)
		for i, u := range ue {
			if u := math.Abs(u); u > minLimitedSpeed {
				limit(du[i] / u)
			}
		}
		rlx = cs.limitShape(dth, dm, ue, du, rlx)
		res = 0
		for i := range n {
			r := math.Max(math.Abs(dth[i]/cs.th[i]), math.Abs(dm[i]/cs.m[i]))
			if cs.st[i].kind == bl.Laminar {
				r = math.Max(r, 0.01*math.Abs(dc[i]))
			} else {
				r = math.Max(r, math.Abs(dc[i]/cs.c[i]))
			}
			res = math.Max(res, r)
		}
		if math.IsNaN(res) {
			return false, it, res, nil
		}
		if diverging(res, &grown, prevRes) {
			return false, it, res, nil
		}
		if res < prevRes {
			falling++
		} else {
			falling = 0
		}
		prevRes = res
		// Backtracking: the step is halved (up to lineSearchHalvings
		// times) while the residuals' norm grows past lineSearchGrowth
		// times its value (Dennis & Schnabel, Numerical Methods for
		// Unconstrained Optimization and Nonlinear Equations, 1983, sec.
		// 6.3, with a relaxed acceptance).
		c0, t0, m0 := cs.work.c0, cs.work.t0, cs.work.m0
		copy(c0, cs.c)
		copy(t0, cs.th)
		copy(m0, cs.m)
		f0 := cs.work.residual
		for h := 0; ; h++ {
			for i := range n {
				cs.c[i] = c0[i] + rlx*dc[i]
				cs.th[i] = t0[i] + rlx*dth[i]
				cs.m[i] = m0[i] + rlx*dm[i]
			}
			cs.clampState()
			if f := cs.residualNorm(); f < lineSearchGrowth*f0 || h == lineSearchHalvings || !(f0 > lineSearchFloor) {
				break
			}
			rlx /= 2
		}
		changed := cs.retype(false)
		if cs.strategy.followStagnation && cs.restagnate() {
			changed = true
		}
		if res < tol && rlx == 1 && !changed {
			return true, it, res, nil
		}
		if it == bound && bound < maxIt+grace && falling >= graceFalling {
			bound++
		}
	}
	return false, bound, res, nil
}

// Divergence: newtonIterations gives up before its bound when the
// Newton step asks to change some variable by more than maxStepRatio
// times its value, or when the step has grown in each of
// divergingSteps iterations in a row and is above minDivergingStep times
// the values. Measured on the validation polars and a NACA 0012 polar
// (1100 runs of the Newton iterations), no run that converged ever had a
// step above 170 times the values or grew four times in a row above 10,
// while 60 % of the iterations spent in runs that failed came after one
// of these; so a strategy or continuation that fails costs a fraction of
// its iteration bound.
const (
	maxStepRatio     = 1e4
	divergingSteps   = 4
	minDivergingStep = 10
)

// DivergedStep is the Newton step, as a multiple of the variables'
// values, above which iterations that keep growing are given up as
// diverging (minDivergingStep; see diverging): a solution that did not
// converge with a last step above it diverged, one below it stopped at
// the iteration bound.
const DivergedStep = minDivergingStep

// diverging reports whether the iterations clearly diverge (see
// maxStepRatio), given this iteration's step res, the previous one's
// prev, and grown, the count of growing steps before, which it updates.
func diverging(res float64, grown *int, prev float64) bool {
	if res > prev {
		*grown++
	} else {
		*grown = 0
	}
	return res > maxStepRatio || *grown >= divergingSteps && res > minDivergingStep
}

// speedStep returns the edge velocities ue and their change du in the
// Newton step dm of the mass defects (ΔUe = λ D Δm). The step is
// under-relaxed so that no speed changes by more than the fractions θ, m
// and √Cτ may, as the Newton update of Drela & Giles (AIAA J. 25(10),
// 1987) is: next to a trailing edge the entries of D are of order one
// over the panel length, and a step that changed the mass defects there
// by a few per cent swung the edge velocity of the last stations by half
// and more, and the iterations diverged (NACA 4412 at 14.5° from 14°,
// where the upper layer leaves the trailing edge separated with H 11).
func (cs *coupledState) speedStep(dm []float64) (ue, du []float64) {
	n := len(cs.st)
	ue = cs.ueIterated()
	coup := cs.coupling()
	du = make([]float64, n)
	rowProducts(cs.d, n, dm, nil, du)
	for i := range du {
		du[i] *= coup
	}
	return ue, du
}

// limitShape halves the relaxation rlx (maxShapeHalvings times at most)
// while the step would take a station's shape factor δ*/θ = m/(θ Ue),
// with the speeds ue changing by du, below minH, where clampState would
// raise that station's m outside the Newton step and through D move
// every speed near it (keeping H in the closures' range, as Drela &
// Giles 1987 do). Stations already at minH, those whose speed is below
// minLimitedSpeed, those whose speed is not their own (near a stagnation
// point, the start of a wake) and those of an element whose trailing edge
// lies in a slot (slotWeights; with them the inverted two-element example
// in ground effect lost two of its ride heights) are left out. On a
// single element the lower trailing-edge station's H fell below 1 under
// a trailing edge left separated, the clamp raised its m and its speed
// swung (NACA 4412 at 14.5° from 14°, NACA 0012 at 20° from 19°).
func (cs *coupledState) limitShape(dth, dm, ue, du []float64, rlx float64) float64 {
	for range maxShapeHalvings {
		ok := true
		for i := range cs.st {
			s := &cs.st[i]
			if s.first || s.nearStagnation || s.wakeStart || !(ue[i] > minLimitedSpeed) || cs.slot[s.elem] > 0 {
				continue
			}
			u, m, th := ue[i]+rlx*du[i], cs.m[i]+rlx*dm[i], cs.th[i]+rlx*dth[i]
			if u > 0 && th > 0 && m < minH*th*u && cs.m[i] > minH*cs.th[i]*ue[i] {
				ok = false
				break
			}
		}
		if ok {
			break
		}
		rlx /= 2
	}
	return rlx
}

// maxShapeHalvings bounds limitShape's halvings of a step.
const maxShapeHalvings = 6

// minLimitedSpeed is the edge velocity below which speedStep's limit leaves
// a station's change alone: next to a stagnation point the relative
// change of a speed near zero says nothing of the step.
const minLimitedSpeed = 0.1

// minRelayoutShift is how many panels a converged solution's coupled
// stagnation point must lie from the layout's before iterate lays the
// stations out again: a shift of one panel is taken up by the stations
// near the stagnation point, whose edge speed is the inviscid one
// (ueLayers), while relaying out for it made a polar three times slower
// (the point moves back and forth between two panels).
const minRelayoutShift = 2

// stagnationShift returns the largest number of panels by which any
// element's stagnation panel in stag differs from the layout's.
func (cs *coupledState) stagnationShift(stag []int) int {
	d := 0
	for k, v := range stag {
		d = max(d, v-cs.stag[k], cs.stag[k]-v)
	}
	return d
}

// maxRelaminarisations bounds how often one call of iterate moves
// transition downstream after converging.
const maxRelaminarisations = 16

// Line search bounds: at most lineSearchHalvings halvings of a Newton
// step, and none once the residuals' norm is below lineSearchFloor,
// where rounding decides whether it falls.
const (
	lineSearchHalvings = 4
	lineSearchFloor    = 1e-9
	// lineSearchGrowth lets the norm grow somewhat before a step is
	// halved: Newton steps near transition and separation often raise
	// it briefly on their way (a non-monotone acceptance; Grippo, Lampariello
	// & Lucidi, SIAM J. Numer. Anal. 23(4), 1986).
	lineSearchGrowth = 2.0
)

// residualNorm returns the 2-norm of all stations' residuals. Each
// station's closure is evaluated once (a plain interval takes its two
// stations' closures, as newtonStep's Jacobian does).
func (cs *coupledState) residualNorm() float64 {
	ue := cs.ueLayers()
	n := len(cs.st)
	cs.work.size(n)
	ev := cs.work.ev
	for j := range n {
		e := &ev[j]
		e.kind, e.re = cs.st[j].kind, cs.re
		e.st[0] = cs.stationVars(j, [4]float64{cs.c[j], cs.th[j], cs.m[j], ue[j]})
		e.cl[0] = bl.Eval(e.kind, e.st[0], cs.re)
	}
	s := 0.0
	for i := range n {
		var r bl.Residuals
		if plain, kind := cs.plainInterval(i); plain && ev[cs.st[i].prev[0]].kind == kind {
			p := &ev[cs.st[i].prev[0]]
			r = bl.IntervalOf(kind, p.st[0], ev[i].st[0], p.cl[0], ev[i].cl[0])
		} else {
			l := cs.localOf(i, ue)
			r = cs.residual(i, &l)
		}
		for _, v := range r {
			s += v * v
		}
	}
	if math.IsNaN(s) {
		return math.Inf(1)
	}
	return math.Sqrt(s)
}

// clampState keeps the variables where the closures are defined.
func (cs *coupledState) clampState() {
	ue := cs.ueLayers()
	for i := range cs.st {
		u := max(ue[i], 1e-6)
		if cs.m[i] < minH*cs.th[i]*u {
			cs.m[i] = minH * cs.th[i] * u
		}
		if cs.st[i].kind != bl.Laminar {
			cs.c[i] = min(max(cs.c[i], 1e-6), 0.3)
		} else {
			cs.c[i] = max(cs.c[i], 0)
		}
	}
}

// newtonWork is the workspace of newtonStep and newtonIterations, kept
// between iterations so that a Newton step allocates nothing once the
// station count is known.
type newtonWork struct {
	n        int
	p        [][2]float64
	q        []float64 // Q_i rows: q[(2i+r)*n : ...]
	mm       []float64
	bm       []float64
	w        []float64 // W, three rows of n
	lin      []stationLin
	u, y     []float64    // D x and M x in mulReduced
	qx       [][2]float64 // Q_i x in mulReduced
	dm       dmSolver
	dc, dth  []float64
	c0, t0   []float64
	m0       []float64
	ev       []stationEval
	speeds   speedCache
	residual float64 // 2-norm of the residuals at the state of the last newtonStep
}

// stationEval is one station's state and closures for the
// finite-difference Jacobian: index 0 at the current variables, index
// 1 + v with local variable v (0 c, 1 θ, 2 m, 3 Ue) moved by h[v]. A
// station enters its own interval and its successor's; with these kept,
// each closure is evaluated once per Newton step instead of once per
// interval and perturbation (the closures' exp, log and pow are most of
// the Jacobian's cost). residualNorm leaves index 0 at the state it
// measured, which the next Newton step usually linearises about.
type stationEval struct {
	kind bl.Kind
	re   float64 // the Reynolds number per unit length cl was evaluated at
	st   [5]bl.Station
	cl   [5]bl.Closure
	h    [4]float64
}

func (w *newtonWork) size(n int) {
	if w.n == n {
		return
	}
	if p, ok := workPool.Get().(*newtonWork); ok && p.n == n {
		// A finished solution's workspace: every slice is written before
		// it is read; its factors belong to another matrix.
		p.dm.fresh = true
		p.speeds = w.speeds
		p.dm.factorisations, p.dm.krylovSolves, p.dm.krylovIterations = w.dm.factorisations, w.dm.krylovSolves, w.dm.krylovIterations
		*w = *p
		return
	}
	*w = newtonWork{
		n: n, p: make([][2]float64, n), q: make([]float64, 2*n*n), mm: make([]float64, n*n),
		bm: make([]float64, n), w: make([]float64, 3*n), dm: w.dm,
		lin: make([]stationLin, n), u: make([]float64, n), y: make([]float64, n), qx: make([][2]float64, n), dc: make([]float64, n), dth: make([]float64, n),
		c0: make([]float64, n), t0: make([]float64, n), m0: make([]float64, n), ev: make([]stationEval, n), speeds: w.speeds,
	}
}

// workPool holds the Newton workspaces of solutions that have stopped
// iterating (release), a few n² numbers each: a polar lays out a new
// state at every attempt, and allocating and clearing these (the
// operating system's fresh pages) cost a tenth of a two-element polar.
var workPool sync.Pool

// release hands the workspace to workPool and leaves w empty (a state
// iterated again takes one there or makes its own).
func (w *newtonWork) release() {
	if w.n == 0 {
		return
	}
	p := new(newtonWork)
	*p = *w
	p.speeds = speedCache{}
	workPool.Put(p)
	*w = newtonWork{}
}

// evalStation fills ev with station j's state and closures (kind k) at
// local variables v and with each of them perturbed.
func (cs *coupledState) evalStation(ev *stationEval, j int, k bl.Kind, v [4]float64) {
	lam := cs.st[j].kind == bl.Laminar
	st := cs.stationVars(j, v)
	if ev.kind != k || ev.re != cs.re || ev.st[0] != st {
		// Else cl[0] holds Eval(k, st, re) already (residualNorm's).
		ev.kind, ev.re = k, cs.re
		ev.cl[0] = bl.Eval(k, st, cs.re)
	}
	ev.st[0] = st
	for x := range 4 {
		h := fdStep(x, v[x], lam)
		vp := v
		vp[x] += h
		ev.h[x] = h
		ev.st[1+x] = cs.stationVars(j, vp)
		if x == 0 {
			// Only the third variable moved.
			ev.cl[1] = bl.WithC(k, ev.cl[0], ev.st[1].C)
			continue
		}
		ev.cl[1+x] = bl.Eval(k, ev.st[1+x], cs.re)
	}
}

// stationVars is stationFrom for station j's variables v (c, θ, m, Ue).
func (cs *coupledState) stationVars(j int, v [4]float64) bl.Station {
	ue := max(v[3], 1e-6)
	return bl.Station{Xi: cs.st[j].xi, Ue: ue, Theta: max(v[1], 1e-12), DStar: max(v[2], 1e-14) / ue, C: v[0]}
}

// newtonStep assembles and solves one Newton step; ok is false if the
// reduced system is singular or not finite. The returned slices are the
// workspace's, valid until the next step; the residuals' norm at the
// state it linearised about is left in cs.work.residual.
//
// The reduced Δm system M Δm = b is kept in the station-by-station form
// its elimination produces (stationLin): station i's equations in Δm are
// W_i Δm = r_i − B_i L_p with
//
//	W_i Δm = Σ_q (∂R_i/∂m_q Δm_q + λ f_q ∂R_i/∂Ue_q (D Δm)_{r_q}) − Σ_{q pred} B_{i,q} Q_q Δm,
//
// Q_i Δm = A⁺_i W_i Δm and row i of M Δm = z_i · W_i Δm. A product M x
// then costs one product with D and O(n) (mulReduced), where forming M
// costs about forty n² operations; M is formed (formReduced) only when
// dmSolver factorises it, and the back-substitution L_i = P_i − Q_i Δm
// takes the same recursion.
func (cs *coupledState) newtonStep() (dc, dth, dm []float64, ok bool) {
	counts.newtonSteps.Add(1)
	n := len(cs.st)
	ue := cs.ueLayers()
	wk := &cs.work
	wk.size(n)
	p, bm := wk.p, wk.bm
	coup := cs.coupling()
	// Each station's closures, at its own regime, once. (Split between
	// this machine's two cores, this loop and the residuals' derivatives
	// below took half as much CPU again and longer on the clock: the
	// cold point 35-39 ms against 30-35 under a load average of 5-6.
	// Starting and joining workers several times a step costs more than
	// it saves.)
	for j := range n {
		cs.evalStation(&wk.ev[j], j, cs.st[j].kind, [4]float64{cs.c[j], cs.th[j], cs.m[j], ue[j]})
	}
	norm := 0.0
	for i := range n {
		l := cs.localOf(i, ue)
		var r0 bl.Residuals
		var jac [3][4][3]float64 // participant, variable, residual
		if plain, kind := cs.plainInterval(i); plain {
			// A plain interval's residuals depend on each station
			// through its own closure only.
			me := &wk.ev[i]
			pv := &wk.ev[l.idx[1]]
			if pv.kind != kind {
				var fresh stationEval
				cs.evalStation(&fresh, l.idx[1], kind, l.v[1])
				pv = &fresh
			}
			var memo bl.IntervalMemo
			r0 = memo.IntervalOf(kind, pv.st[0], me.st[0], pv.cl[0], me.cl[0])
			for x := range 4 {
				r1 := memo.IntervalOf(kind, pv.st[0], me.st[1+x], pv.cl[0], me.cl[1+x])
				r2 := memo.IntervalOf(kind, pv.st[1+x], me.st[0], pv.cl[1+x], me.cl[0])
				for e := range 3 {
					jac[0][x][e] = (r1[e] - r0[e]) / me.h[x]
					jac[1][x][e] = (r2[e] - r0[e]) / pv.h[x]
				}
			}
		} else {
			r0 = cs.residual(i, &l)
			for qq := 0; qq < l.n; qq++ {
				plam := cs.st[l.idx[qq]].kind == bl.Laminar
				for v := range 4 {
					h := fdStep(v, l.v[qq][v], plam)
					save := l.v[qq][v]
					l.v[qq][v] = save + h
					r1 := cs.residual(i, &l)
					l.v[qq][v] = save
					for e := range 3 {
						jac[qq][v][e] = (r1[e] - r0[e]) / h
					}
				}
			}
		}
		for _, v := range r0 {
			norm += v * v
		}
		sl := &wk.lin[i]
		*sl = stationLin{idx: l.idx, n: l.n}
		var rhs [3]float64
		for e := range 3 {
			rhs[e] = -r0[e]
		}
		for qq := 0; qq < l.n; qq++ {
			r, f := cs.layerCoupling(l.idx[qq])
			sl.row[qq] = r
			for e := range 3 {
				sl.dm[qq][e] = jac[qq][2][e]
				sl.du[qq][e] = coup * f * jac[qq][3][e]
			}
		}
		// The predecessors' local unknowns, L_p = P_p − Q_p Δm.
		for qq := 1; qq < l.n; qq++ {
			j := l.idx[qq]
			for e := range 3 {
				b0, b1 := jac[qq][0][e], jac[qq][1][e]
				sl.b[qq][0][e], sl.b[qq][1][e] = b0, b1
				rhs[e] -= b0*p[j][0] + b1*p[j][1]
			}
		}
		// A = [∂R/∂c_i, ∂R/∂θ_i] (3×2).
		a0 := [3]float64{jac[0][0][0], jac[0][0][1], jac[0][0][2]}
		a1 := [3]float64{jac[0][1][0], jac[0][1][1], jac[0][1][2]}
		z := [3]float64{a0[1]*a1[2] - a0[2]*a1[1], a0[2]*a1[0] - a0[0]*a1[2], a0[0]*a1[1] - a0[1]*a1[0]}
		zn := math.Sqrt(z[0]*z[0] + z[1]*z[1] + z[2]*z[2])
		if !(zn > 0) {
			return nil, nil, nil, false
		}
		for e := range 3 {
			sl.z[e] = z[e] / zn
		}
		bm[i] = sl.z[0]*rhs[0] + sl.z[1]*rhs[1] + sl.z[2]*rhs[2]
		// A⁺ = (AᵀA)⁻¹ Aᵀ.
		g00 := a0[0]*a0[0] + a0[1]*a0[1] + a0[2]*a0[2]
		g01 := a0[0]*a1[0] + a0[1]*a1[1] + a0[2]*a1[2]
		g11 := a1[0]*a1[0] + a1[1]*a1[1] + a1[2]*a1[2]
		det := g00*g11 - g01*g01
		for e := range 3 {
			sl.pin[0][e] = (g11*a0[e] - g01*a1[e]) / det
			sl.pin[1][e] = (-g01*a0[e] + g00*a1[e]) / det
		}
		for r := range 2 {
			p[i][r] = sl.pin[r][0]*rhs[0] + sl.pin[r][1]*rhs[1] + sl.pin[r][2]*rhs[2]
		}
	}
	wk.residual = math.Sqrt(norm)
	if math.IsNaN(wk.residual) {
		wk.residual = math.Inf(1)
	}
	// Solve the Δm system.
	if !wk.dm.solveSystem(reducedSystem{cs}, n, bm) {
		return nil, nil, nil, false
	}
	dm = bm
	dc, dth = wk.dc, wk.dth
	qx := wk.qx
	cs.mulReduced(dm, wk.y)
	for i := range n {
		s0, s1 := p[i][0]-qx[i][0], p[i][1]-qx[i][1]
		dc[i], dth[i] = s0, s1
		if math.IsNaN(s0) || math.IsNaN(s1) || math.IsNaN(dm[i]) {
			return nil, nil, nil, false
		}
	}
	return dc, dth, dm, true
}

// stationLin is station i's part of the reduced Δm system of a Newton
// step (newtonStep): its participants (itself, then its predecessors),
// per participant q the derivatives of its three residuals with respect
// to m_q (dm) and, through row r_q of D, to the edge velocity (du, times
// the coupling λ and layerCoupling's factor), the predecessors' ∂R/∂(c,
// θ) (b[q][v]), the combination z orthogonal to A_i's columns and A_i's
// pseudo-inverse.
type stationLin struct {
	idx [3]int
	n   int
	row [3]int
	dm  [3][3]float64
	du  [3][3]float64
	b   [3][2][3]float64
	z   [3]float64
	pin [2][3]float64
}

// reducedSystem is the Δm system of the state's last newtonStep, for
// dmSolver.
type reducedSystem struct{ cs *coupledState }

func (r reducedSystem) mul(x, y []float64) { r.cs.mulReduced(x, y) }
func (r reducedSystem) dense() []float64   { return r.cs.formReduced() }

// mulReduced sets y = M x for the reduced system of the last newtonStep
// (see there), leaving Q_i x in the workspace's qx.
func (cs *coupledState) mulReduced(x, y []float64) {
	n := len(cs.st)
	wk := &cs.work
	u, qx := wk.u, wk.qx
	blas64.Gemv(blas.NoTrans, 1, blas64.General{Rows: n, Cols: n, Stride: n, Data: cs.d[:n*n]},
		blas64.Vector{N: n, Inc: 1, Data: x}, 0, blas64.Vector{N: n, Inc: 1, Data: u})
	// The loops over the three residuals are written out (the compiler
	// does not unroll them); the operations are those of the loops.
	for i := range n {
		sl := &wk.lin[i]
		var we0, we1, we2 float64
		for q := range sl.n {
			xj, uj := x[sl.idx[q]], u[sl.row[q]]
			dm, du := &sl.dm[q], &sl.du[q]
			we0 += dm[0]*xj + du[0]*uj
			we1 += dm[1]*xj + du[1]*uj
			we2 += dm[2]*xj + du[2]*uj
		}
		for q := 1; q < sl.n; q++ {
			qj := &qx[sl.idx[q]]
			b0, b1 := &sl.b[q][0], &sl.b[q][1]
			we0 -= b0[0]*qj[0] + b1[0]*qj[1]
			we1 -= b0[1]*qj[0] + b1[1]*qj[1]
			we2 -= b0[2]*qj[0] + b1[2]*qj[1]
		}
		y[i] = sl.z[0]*we0 + sl.z[1]*we1 + sl.z[2]*we2
		p0, p1 := &sl.pin[0], &sl.pin[1]
		qx[i] = [2]float64{p0[0]*we0 + p0[1]*we1 + p0[2]*we2, p1[0]*we0 + p1[1]*we1 + p1[2]*we2}
	}
}

// formReduced returns M of the last newtonStep (n × n, row-major, the
// workspace's), formed row by row: W_i as above with the rows of D and
// the predecessors' Q rows, M's row z_i · W_i and Q_i = A⁺_i W_i.
func (cs *coupledState) formReduced() []float64 {
	cs.formReducedColumns(0, len(cs.st))
	return cs.work.mm
}

// formReducedColumns forms columns [lo, hi) of M and Q (formReduced).
func (cs *coupledState) formReducedColumns(lo, hi int) {
	n := len(cs.st)
	wk := &cs.work
	q, mm, w := wk.q, wk.mm, wk.w
	for i := range n {
		sl := &wk.lin[i]
		for e := range 3 {
			clear(w[e*n+lo : e*n+hi])
		}
		for qq := 0; qq < sl.n; qq++ {
			j := sl.idx[qq]
			drow := cs.d[sl.row[qq]*n+lo : sl.row[qq]*n+hi]
			for e := range 3 {
				we := w[e*n+lo : e*n+hi]
				if j >= lo && j < hi {
					we[j-lo] += sl.dm[qq][e]
				}
				if a := sl.du[qq][e]; a != 0 {
					axpy(a, drow, we)
				}
			}
		}
		for qq := 1; qq < sl.n; qq++ {
			j := sl.idx[qq]
			q0 := q[(2*j)*n+lo : (2*j)*n+hi]
			q1 := q[(2*j+1)*n+lo : (2*j+1)*n+hi]
			for e := range 3 {
				b0, b1 := sl.b[qq][0][e], sl.b[qq][1][e]
				we := w[e*n+lo : e*n+hi]
				q0, q1 = q0[:len(we)], q1[:len(we)]
				for c := range we {
					we[c] -= b0*q0[c] + b1*q1[c]
				}
			}
		}
		row := mm[i*n+lo : i*n+hi]
		w0, w1, w2 := w[lo:hi], w[n+lo:n+hi], w[2*n+lo:2*n+hi]
		w0, w1, w2 = w0[:len(row)], w1[:len(row)], w2[:len(row)]
		z := sl.z
		for c := range row {
			row[c] = z[0]*w0[c] + z[1]*w1[c] + z[2]*w2[c]
		}
		for r := range 2 {
			pin := sl.pin[r]
			qr := q[(2*i+r)*n+lo : (2*i+r)*n+hi]
			qr = qr[:len(w0)]
			for c := range qr {
				qr[c] = pin[0]*w0[c] + pin[1]*w1[c] + pin[2]*w2[c]
			}
		}
	}
}

// luSolve solves A x = b in place for one right-hand side b, from the LU
// factors lu (n×n, row-major) and pivots ipiv of lapack64.Getrf: the row
// interchanges, then forward substitution with the unit lower factor and
// back substitution with the upper one, each in the order and with the
// operations of lapack64.Getrs (so the results are the same to the last
// bit), without its per-element calls, which for a single right-hand
// side in row-major storage cost more than the substitutions themselves.
func luSolve(lu []float64, n int, ipiv []int, b []float64) {
	for i := range n {
		if p := ipiv[i]; p != i {
			b[i], b[p] = b[p], b[i]
		}
	}
	for i := range n {
		row := lu[i*n : i*n+i]
		v := b[i]
		for k, a := range row {
			if a != 0 {
				v += -a * b[k]
			}
		}
		b[i] = v
	}
	for i := n - 1; i >= 0; i-- {
		row := lu[i*n+i+1 : i*n+n]
		v := b[i]
		for k, a := range row {
			if a != 0 {
				v += -a * b[i+1+k]
			}
		}
		b[i] = v * (1 / lu[i*n+i])
	}
}
