package solver

import (
	"context"
	"math"

	bl "sectionbench/solver/boundarylayer"
)

// The trip ladder: a cold start for free transition that the march
// cannot give (SolveCoupled turns to it when no strategy converged).
// Where a laminar layer separates before it turns turbulent (a laminar
// separation bubble, usual on the suction side at Reynolds numbers of
// 1e5–1e6), the march's layer, solved on the inviscid edge velocities,
// goes through the bubble in inverse mode, and the coupled iterations
// from it often diverge (NACA 4412 at Re 2.77e5, free transition: 0–5°
// all failed from the march). With transition forced ahead of the
// laminar separation the layers stay attached and the iterations
// converge from the march; the trip is then moved downstream in steps of
// ladderStepXC, each step started from the one before (a continuation in
// the trip position, along which the bubble grows from nothing), until
// on every free side transition comes ahead of the trip by itself. The
// trips then act nowhere, and that step's solution is one of the free
// problem (TestCoupledColdStartBubble: 0–10° all converge, with the Cl of
// a polar reached from its neighbours).

// Steps of the ladder: the trip starts ladderBackoffXC ahead of the
// march's laminar separation (or transition) and no nearer the leading
// edge than ladderMinXC, and moves by ladderStepXC a step (the step at
// which each converged within a dozen iterations in the trials above).
const (
	ladderBackoffXC = 0.05
	ladderMinXC     = 0.02
	ladderStepXC    = 0.025
)

// freeSides reports which sides (upper, lower) have free transition.
func (cs *coupledState) freeSides() [2]bool {
	free := func(trip float64) bool { return !(trip > 0 && trip < 1) }
	return [2]bool{free(cs.opt.TripUpper), free(cs.opt.TripLower)}
}

// sibling returns a state of the same inviscid solution with the options
// opt, sharing cs's wakes and source sensitivities (the costly part), laid
// out afresh with zeroed variables.
func (cs *coupledState) sibling(opt CoupledOptions) *coupledState {
	n := stateOn(cs.flow, opt)
	n.strategy = cs.strategy
	return n
}

// solveFrom iterates from the neighbouring state w (a polar's previous
// angle, or the ladder's previous step): first the full coupling straight
// from w's state, which converges in a few iterations when w is close;
// failing that, a continuation from w's boundary layers, which solve
// their own equations on w's edge velocities. ok is false (and nothing
// was done) when w's layout cannot be carried over (warmFrom). steps
// says which of the two it tries.
func (cs *coupledState) solveFrom(ctx context.Context, w *coupledState, steps warmSteps) (conv bool, iters int, res float64, ok bool, err error) {
	if !cs.warmFrom(w) {
		return false, 0, math.Inf(1), false, nil
	}
	if steps&warmDirect != 0 {
		var snap snapshot
		if steps&warmContinuation != 0 {
			snap = cs.snapshot()
		}
		conv, iters, res, err = cs.iterate(ctx, warmDirectIterations, warmDirectGrace, tolerance(cs.opt))
		if err != nil || conv || steps&warmContinuation == 0 {
			return conv, iters, res, true, err
		}
		cs.restore(snap)
	}
	var n int
	conv, n, res, err = cs.solve(ctx, cs.warmUe)
	return conv, iters + n, res, true, err
}

// warmSteps selects the parts of solveFrom: the full coupling straight
// from the neighbour's state, the continuation from its layers, or both
// in turn.
type warmSteps int

const (
	warmDirect warmSteps = 1 << iota
	warmContinuation
	warmBoth = warmDirect | warmContinuation
)

// tripLadder solves cs's problem (free transition on at least one side)
// through the trip ladder (see above). It returns the state of the free
// solution and whether it converged, with the iterations of every step.
func (cs *coupledState) tripLadder(ctx context.Context) (out *coupledState, conv bool, iters int, res float64, err error) {
	free := cs.freeSides()
	return cs.ladder(ctx, free, cs.ladderStart(free), nil, 0)
}

// ladder runs the trip ladder on the sides of free (upper, lower) from
// the trip positions trip (x/c), its first step from prev if that is
// not nil. A budget above zero bounds its iterations: each step then
// starts only from the step before (no start from the march), and the
// ladder gives up once it has spent the budget (releaseHeld).
func (cs *coupledState) ladder(ctx context.Context, free [2]bool, trip [2]float64, prev *coupledState, budget int) (out *coupledState, conv bool, iters int, res float64, err error) {
	for {
		if budget > 0 && iters >= budget {
			return nil, false, iters, res, nil
		}
		opt := cs.opt
		done := true
		if free[0] {
			opt.TripUpper = trip[0]
			done = done && trip[0] >= 1
		}
		if free[1] {
			opt.TripLower = trip[1]
			done = done && trip[1] >= 1
		}
		t, c, n, r, err := cs.rung(ctx, opt, prev, budget > 0)
		iters += n
		res = r
		if err != nil {
			return nil, false, iters, res, err
		}
		if !c {
			break
		}
		if done {
			// The trips reached the trailing edges: this is the free
			// problem.
			return t, branchJump(t.result()) == "", iters, res, nil
		}
		if !t.anyTripped(free) {
			// Transition on every free side lies ahead of its trip:
			// the trips act nowhere, and this is a solution of the
			// free problem itself (a free start from it, tried at
			// first, could fail where it had converged).
			t.opt = cs.opt
			t.setTrips()
			return t, branchJump(t.result()) == "", iters, res, nil
		}
		prev = t
		trip[0] = math.Min(trip[0]+ladderStepXC, 1)
		trip[1] = math.Min(trip[1]+ladderStepXC, 1)
	}
	if prev == nil || budget > 0 && iters >= budget {
		return nil, false, iters, res, nil
	}
	f := cs.sibling(cs.opt)
	c, n, r, _, err := f.solveFrom(ctx, prev, warmBoth)
	iters += n
	if err != nil {
		return nil, false, iters, r, err
	}
	if c && implausible(f.result()) != "" {
		c = false
	}
	return f, c, iters, r, nil
}

// rung solves one step of the ladder with the trips of opt, with each of
// strategies in turn (prev's first): from the step before (prev, if any)
// and, failing that, from the march, which with the trip just behind a
// bubble's transition can converge where the step before cannot lead
// (NACA 4412 at Re 2.8e5 and 1°, the trip moved from 0.675 to 0.7);
// with onlyPrev, from the step before alone.
func (cs *coupledState) rung(ctx context.Context, opt CoupledOptions, prev *coupledState, onlyPrev bool) (t *coupledState, conv bool, iters int, res float64, err error) {
	first := cs.strategy
	if prev != nil {
		first = prev.strategy
	}
	order := []strategy{first}
	for _, st := range strategies {
		if st != first {
			order = append(order, st)
		}
	}
	for _, st := range order {
		for _, fromPrev := range []bool{true, false} {
			if fromPrev && prev == nil || !fromPrev && onlyPrev && prev != nil {
				continue
			}
			t = cs.sibling(opt)
			t.strategy = st
			var n int
			if fromPrev {
				conv, n, res, _, err = t.solveFrom(ctx, prev, warmBoth)
			} else {
				conv, n, res, err = t.solve(ctx, t.march())
			}
			iters += n
			if err != nil {
				return nil, false, iters, res, err
			}
			// A step whose layer jumps between the branches of H*
			// (branchJump) may still lead on to a free solution that
			// does not: only the ladder's answer is held to it (on
			// the two-element example, free transition, at 3° and
			// 100 mm, a step with the main element's slot-side layer
			// jumping at its trailing edge led to a solution with
			// transition where e^N puts it on both elements;
			// rejected, the ladder ended on one with the flap's held).
			if conv && spuriousLift(t.result()) == "" {
				return t, true, iters, res, nil
			}
		}
	}
	return t, false, iters, res, nil
}

// ladderStart returns the first trip positions (x/c, upper and lower) of
// the ladder from the march of cs's layout: ladderBackoffXC ahead of the
// first laminar separation (negative skin friction) or transition on that
// side of any element, no nearer the leading edge than ladderMinXC.
func (cs *coupledState) ladderStart(free [2]bool) [2]float64 {
	m := cs.sibling(cs.opt)
	ue := m.march()
	first := [2]float64{1, 1}
	for i := range m.st {
		s := &m.st[i]
		if s.side == sideWake || s.first || !free[s.side] {
			continue
		}
		turned := s.kind != bl.Laminar && m.st[s.prev[0]].kind == bl.Laminar
		separated := s.kind == bl.Laminar && bl.Eval(bl.Laminar, m.stationOf(i, math.Max(ue[i], 1e-6)), m.re).Cf < 0
		if turned || separated {
			first[s.side] = math.Min(first[s.side], s.xc)
		}
	}
	for k := range first {
		first[k] = math.Max(first[k]-ladderBackoffXC, ladderMinXC)
	}
	return first
}

// releaseBudget bounds the iterations releaseHeld spends: the releases
// that succeed take tens to a few hundred (NACA 0012 at Re 1e6, 6°–8°;
// NACA 4412 at Re 2.8e5, 1°), while on the two-element example with free
// transition, where nothing is released, the unbounded ladder spent
// 3000–3700 iterations a point (20–25 s) with every start from the march
// tried at every step.
const releaseBudget = 400

// heldMargin is how far below NCrit the envelope of a transition
// station, grown from the station before at the laminar rates
// (envelopeAt), may stay before its transition counts as held upstream
// of its e^N position (heldTransition): a consistent transition station
// reaches NCrit within its interval, and a margin keeps the discrete
// choice between two neighbouring stations (common to every station
// layout) from counting.
const heldMargin = 0.5

// heldTransition reports, per side (upper, lower), whether on a side of
// free of any element the layer turns turbulent at a station where it
// would still be laminar: its envelope grown from the station before
// stays more than heldMargin below NCrit. It happens where the rounds
// that move transition downstream after convergence (iterate) fail: the
// laminar layer beyond is about to separate (a bubble, or laminar
// separation at a trailing edge), where its local solution in direct
// mode does not converge or the iterations after the move diverge. at
// is the held transition's x/c, the most upstream one per side.
func (cs *coupledState) heldTransition(free [2]bool) (held [2]bool, at [2]float64) {
	at = [2]float64{1, 1}
	ue := cs.ueLayers()
	for i := range cs.st {
		if s := &cs.st[i]; s.side != sideWake && free[s.side] && cs.heldAt(i, ue) {
			held[s.side] = true
			at[s.side] = math.Min(at[s.side], cs.st[s.prev[0]].xc)
		}
	}
	return held, at
}

// heldAt reports whether body station i is a transition station (the
// first turbulent one after a laminar one) that no trip or trailing edge
// forces, where the layer would still be laminar (heldTransition), on
// the edge velocities ue.
func (cs *coupledState) heldAt(i int, ue []float64) bool {
	s := &cs.st[i]
	if s.side == sideWake || s.first || s.kind == bl.Laminar || s.last || s.xi >= s.tripXi || cs.st[s.prev[0]].kind != bl.Laminar {
		return false
	}
	return cs.envelopeAt(i, ue) < cs.ncrit-heldMargin
}

// envelopeAt returns the envelope exponent ñ that station i would reach
// as a laminar station: its predecessor's, grown over the interval at
// the mean of the laminar rates of the predecessor and of station i's
// present state (θ and m, with the predecessor's ñ), on the edge
// velocities ue.
func (cs *coupledState) envelopeAt(i int, ue []float64) float64 {
	p := cs.st[i].prev[0]
	a := cs.stationOf(p, math.Max(ue[p], 1e-6))
	b := cs.stationOf(i, math.Max(ue[i], 1e-6))
	b.C = a.C
	ra := bl.Eval(bl.Laminar, a, cs.re).AmpRate
	rb := bl.Eval(bl.Laminar, b, cs.re).AmpRate
	return a.C + (b.Xi-a.Xi)*0.5*(ra+rb)
}

// releaseHeld moves transition held upstream of its e^N position
// (heldTransition) to it through the trip ladder: a trip put one step
// behind the held transition, each step from the one before, until
// transition comes ahead of the trips by itself, each step started from
// the one before only, within releaseBudget iterations. It returns the
// state of the free solution reached that way, or nil (and the
// iterations spent) if there was nothing to release or it failed.
// (Releasing one side at a time where both were held, tried on NACA 0012
// at Re 1e6 and 6°, cost twice the iterations and released nothing
// more.)
func (cs *coupledState) releaseHeld(ctx context.Context) (*coupledState, int, float64, error) {
	held, at := cs.heldTransition(cs.freeSides())
	if held == [2]bool{} {
		return nil, 0, 0, nil
	}
	for k := range at {
		at[k] = math.Min(at[k]+ladderStepXC, 1)
	}
	t, conv, iters, res, err := cs.ladder(ctx, held, at, cs, releaseBudget)
	if err != nil || !conv {
		return nil, iters, res, err
	}
	if h, _ := t.heldTransition(t.freeSides()); h != [2]bool{} {
		return nil, iters, res, nil
	}
	return t, iters, res, nil
}

// anyTripped reports whether transition on a free side of any element
// sits at its trip rather than ahead of it.
func (cs *coupledState) anyTripped(free [2]bool) bool {
	for _, e := range cs.result().Elements {
		if free[0] && e.Upper.Tripped || free[1] && e.Lower.Tripped {
			return true
		}
	}
	return false
}
