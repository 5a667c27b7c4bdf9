package solver

import (
	"context"
	"fmt"
	"math"

	bl "sectionbench/solver/boundarylayer"
)

// CoupledOptions are the settings of the coupled viscous solution.
type CoupledOptions struct {
	// Re is each element's Reynolds number U∞ c/ν on its own chord, in
	// element order; the solution uses Re per unit length from the first
	// (all elements share one flow).
	Re []float64
	// NCrit is the critical amplification exponent of the e^N method;
	// 0 means 9 (boundarylayer.DefaultNCrit, a quiet wind tunnel). Mack's
	// correlation relates it to the free-stream turbulence level Tu (in
	// percent): N = −8.43 − 2.4 ln(Tu/100) (Mack, Transition and laminar
	// instability, JPL Publication 77-15, 1977), so N = 9 is Tu ≈ 0.07 %
	// and N = 4 is Tu ≈ 0.5 %.
	NCrit float64
	// TripUpper and TripLower force transition at these x/c on every
	// element's upper and lower surface (the node order's: upper runs
	// from the leading edge to the first node); 0 or ≥ 1 leaves the
	// transition free.
	TripUpper, TripLower float64
	// MaxIterations bounds the Newton iterations; 0 means 60.
	MaxIterations int
	// Tolerance is the largest relative change of θ, m and √Cτ (and
	// 0.01 of ñ) accepted as converged; 0 means 1e-5.
	Tolerance float64
}

// CoupledStation is the boundary layer at one station of a surface or wake.
type CoupledStation struct {
	Xi      float64 // arc length from the stagnation point (surfaces) or the trailing edge (wakes), on the element's chord
	XC      float64 // chord position x/c (1 + ξ/c on a wake)
	X, Y    float64 // position, configuration frame
	Ue      float64 // edge velocity / U∞
	Cp      float64 // 1 − Ue²
	Theta   float64 // momentum thickness, on the element's chord
	DStar   float64 // displacement thickness, on the element's chord
	H       float64 // δ*/θ
	Cf      float64 // skin friction on the local Ue
	N       float64 // amplification exponent ñ (laminar stations; at transition and beyond, NCrit)
	CTau    float64 // shear-stress coefficient Cτ (turbulent and wake stations)
	Regime  bl.Kind
	Reverse bool // Cf < 0: reversed flow at the wall
}

// CoupledSurface is one surface (or the wake) of an element.
type CoupledSurface struct {
	Stations   []CoupledStation
	Transition float64 // x/c of transition, NaN if the layer stays laminar to the trailing edge (forced there)
	Tripped    bool    // transition forced by a trip
	// TransitionHeld: the layer turns turbulent upstream of where the
	// e^N criterion puts it (its envelope stays more than heldMargin
	// below NCrit there), because the solution with transition further
	// on did not converge; the answer is that of a trip at Transition.
	TransitionHeld bool
	Separation     float64 // x/c where the layer separates and stays separated to the trailing edge, NaN if attached
	Bubble         [2]float64
	HasBubble      bool // laminar separation bubble between Bubble[0] and Bubble[1] (x/c)
}

// CoupledElement is one element's coupled result.
type CoupledElement struct {
	Name         string
	Chord        float64
	Cl, Cd, Cm   float64 // on the element's chord; Cm about its quarter chord, nose-up positive
	ClInviscid   float64
	Upper, Lower CoupledSurface
	Wake         CoupledSurface
}

// CoupledSolution is the converged (or last) state of the coupled
// viscous–inviscid solution at one angle.
type CoupledSolution struct {
	AlphaDeg   float64
	Cl, Cd, Cm float64 // configuration, on RefChord; Cm about Config.MomentRef
	ClInviscid float64
	CmInviscid float64
	Elements   []CoupledElement
	Converged  bool
	Iterations int
	Residual   float64 // largest relative change of the last iteration
	// Rejected says, in words, why iterations that met the tolerance were
	// not accepted as converged (empty otherwise).
	Rejected string
	// Note says, in words, how a solution was reached when not directly
	// (SolveCoupled's fallback for a stagnation point on a node).
	Note     string
	Inviscid *Solution

	state    *coupledState // for warm starts
	attempts *attempts     // the attempts made from it (solveOnce)
	// warmRejected: the iterations from the warm start met the
	// tolerance on an implausible solution (solveOnce).
	warmRejected bool
}

// SolveCoupled solves the coupled viscous–inviscid flow at angle alphaDeg
// (degrees; 0 in ground mode, as Solve): integral boundary layers on every
// surface and wake (package boundarylayer) whose displacement acts back on
// the panel solution through sources, all solved together by Newton's
// method (coupled_newton.go). warm, if not nil, is a neighbouring
// solution of the same System to start from (a polar's previous angle).
//
// A solution that did not converge within the iteration bound is returned
// with Converged false and its last state; errors are reserved for
// geometry the wakes cannot be traced through and cancellation.
//
// From a warm start that does not converge it tries again through the
// angle half way between (twice at most: a continuation in α), then
// cold.
//
// When the stagnation point sits on a panel node (a symmetric section at
// 0°), the layout of the stations puts it on one of the two panels
// beside the node, and the solution, if it converges at all, is not the
// symmetric one (Cl −1.4e−6 on NACA 0012 at 0°); it solves at α ±
// nodeStepDeg instead and returns their mean (central differences: an
// error of order nodeStepDeg² in the coefficients, far below the
// method's), saying so in Note: α − nodeStepDeg from warm (cold if nil;
// halving the step as for α)
// and α + nodeStepDeg cold (its stagnation point lies on the node's
// other side, where a start from α − nodeStepDeg's layout failed after
// a hundred iterations). Only if either fails does it solve at α itself,
// try the failed side again from that solution if it converged, and
// return the solution at α if a side still fails.
func (s *System) SolveCoupled(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution) (*CoupledSolution, error) {
	solving.Add(1)
	defer solving.Add(-1)
	if s.geo.ground {
		return s.solveStrategies(ctx, alphaDeg, opt, warm, maxAlphaHalvings)
	}
	flow, err := s.coupledFlowAt(alphaDeg)
	if err != nil {
		return nil, err
	}
	if !stagnationOnNode(flow.sol) {
		return s.solveStrategies(ctx, alphaDeg, opt, warm, maxAlphaHalvings)
	}
	lo, err := s.solveStrategies(ctx, alphaDeg-nodeStepDeg, opt, warm, maxAlphaHalvings)
	if err != nil {
		return nil, err
	}
	hi, err := s.acrossNode(ctx, alphaDeg+nodeStepDeg, opt, lo)
	if err != nil {
		return nil, err
	}
	iters := lo.Iterations + hi.Iterations
	if !lo.Converged || !hi.Converged {
		out, err := s.solveStrategies(ctx, alphaDeg, opt, warm, maxAlphaHalvings)
		if err != nil || !out.Converged {
			return out, err
		}
		if !lo.Converged {
			if lo, err = s.solveStrategies(ctx, alphaDeg-nodeStepDeg, opt, out, 0); err != nil {
				return nil, err
			}
		}
		if !hi.Converged {
			if hi, err = s.solveStrategies(ctx, alphaDeg+nodeStepDeg, opt, lo, 0); err != nil {
				return nil, err
			}
		}
		if !lo.Converged || !hi.Converged {
			return out, nil
		}
		iters += out.Iterations
	}
	inv := flow.sol
	mean := *hi
	mean.AlphaDeg, mean.Inviscid = alphaDeg, inv
	mean.ClInviscid, mean.CmInviscid = inv.ClPressure, inv.Cm
	mean.Cl, mean.Cd, mean.Cm = 0.5*(lo.Cl+hi.Cl), 0.5*(lo.Cd+hi.Cd), 0.5*(lo.Cm+hi.Cm)
	mean.Elements = append([]CoupledElement(nil), hi.Elements...)
	for k := range mean.Elements {
		e, l := &mean.Elements[k], &lo.Elements[k]
		e.Cl, e.Cd, e.Cm = 0.5*(e.Cl+l.Cl), 0.5*(e.Cd+l.Cd), 0.5*(e.Cm+l.Cm)
		e.ClInviscid = inv.Elements[k].ClPressure
	}
	mean.Iterations = iters
	mean.Note = fmt.Sprintf("the stagnation point sat on a panel node: solved at %.2f° and %.2f° and their coefficients averaged; the boundary layers shown are those at %.2f°", alphaDeg-nodeStepDeg, alphaDeg+nodeStepDeg, alphaDeg+nodeStepDeg)
	return &mean, nil
}

// acrossNode solves at alphaDeg, the node's other side from lo: first
// straight from lo (the full coupling only, no continuation), then from
// the march. From lo's layout the continuation failed after a hundred
// iterations, while the iterations straight from it converge in a few
// (NACA 0012 at 6.01° from 5.99°: 8 iterations, from the march 86).
func (s *System) acrossNode(ctx context.Context, alphaDeg float64, opt CoupledOptions, lo *CoupledSolution) (*CoupledSolution, error) {
	iters := 0
	if lo.Converged && lo.state != nil {
		for _, st := range strategyOrder(lo) {
			o, err := s.cheapRoute(ctx, alphaDeg, opt, lo, 0, st, &iters)
			if err != nil {
				return nil, err
			}
			if o != nil {
				return s.finish(ctx, o, iters)
			}
		}
	}
	out, err := s.solveStrategies(ctx, alphaDeg, opt, nil, 0)
	if out != nil {
		out.Iterations += iters
	}
	return out, err
}

// nodeStepDeg is the angle step of SolveCoupled's fallback when the
// stagnation point sits on a node, and nodeFraction how close to a node
// (as a fraction of its panel) counts as on it.
const (
	nodeStepDeg  = 0.01
	nodeFraction = 0.02
)

// stagnationOnNode reports whether any element's inviscid stagnation point
// lies within nodeFraction of a panel of one of its nodes.
func stagnationOnNode(sol *Solution) bool {
	if sol == nil || sol.sys == nil {
		return false
	}
	geo := sol.sys.geo
	for k := range geo.elems {
		e := &geo.elems[k]
		kk, ss := stagnationSplit(e, sol.g, -1)
		l := e.sNode[kk+1] - e.sNode[kk]
		if f := (ss - e.sNode[kk]) / l; f < nodeFraction || f > 1-nodeFraction {
			return true
		}
	}
	return false
}

// sameElements reports whether o has as many elements as s with as many
// panels each: a solution of o can then warm-start one of s (its
// variables are carried over by arc length along each surface,
// carryFrom), as a map over ride height or flap gap does from its
// neighbouring setting.
func (s *System) sameElements(o *System) bool {
	if o == nil || len(o.geo.elems) != len(s.geo.elems) {
		return false
	}
	for k := range s.geo.elems {
		if s.geo.elems[k].np != o.geo.elems[k].np {
			return false
		}
	}
	return true
}

// warmDirectIterations is how many Newton iterations a warm start tries
// with the full coupling before it turns to the continuation, and
// warmDirectGrace how many more it may take while its steps keep falling
// in each of graceFalling iterations in a row (newtonIterations). On the
// main element and flap of BenchmarkCoupledPolar41TwoElement the start at
// 7° from 6.5° stood at a step of 1.03e-5 (the tolerance 1e-5) after its
// 12 iterations and falling; cut there, the halvings and the continuation
// from 6.5° took 111 iterations to reach the same solution (Cl 1.6299,
// Cd 0.01872), with the grace it converged in 13. A start that is not
// converging (the steps grow or wander) still stops at 12.
const (
	warmDirectIterations = 12
	warmDirectGrace      = 20
	graceFalling         = 3
)

// tolerance returns the convergence tolerance of opt.
func tolerance(opt CoupledOptions) float64 {
	if opt.Tolerance > 0 {
		return opt.Tolerance
	}
	return defaultTolerance
}

// maxAlphaHalvings bounds the continuation in α of SolveCoupled, and
// minAlphaStep the smallest step (degrees) it splits.
const (
	maxAlphaHalvings = 2
	minAlphaStep     = 0.25
)

// strategies are the ways solveStrategies tries in turn (strategy). The
// first follows the stagnation points and lets transition move both ways
// within the iterations; where it converges, a laminar separation bubble's
// transition comes out where the layers put it from both sides (on E387
// at Re 2e5 about 0.03–0.04c further aft, and the drag 5–10 % higher and
// nearer the measured, than by the second). The second holds the layout
// at the inviscid stagnation points and moves transition downstream only
// after converging (iterate); it converges where the first does not (on
// NACA 0012 at Re 6e6 from 6° to past maximum lift).
var strategies = []strategy{
	{relaminariseAlways: true, followStagnation: true},
	{},
}

// solveStrategies solves with each of strategies in turn until one
// converges, starting with the one that solved warm (a polar's
// neighbouring angle) if any; the iterations of all attempts are counted.
// strategyOrder returns strategies, the one that solved warm (if any)
// first.
func strategyOrder(warm *CoupledSolution) []strategy {
	if warm == nil || warm.state == nil {
		return strategies
	}
	order := []strategy{warm.state.strategy}
	for _, st := range strategies {
		if st != warm.state.strategy {
			order = append(order, st)
		}
	}
	return order
}

func (s *System) solveStrategies(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, halvings int) (*CoupledSolution, error) {
	order := strategyOrder(warm)
	var out *CoupledSolution
	iters := 0
	cheap := warm != nil && warm.state != nil && s.sameElements(warm.state.sol.sys)
	for _, st := range order {
		if cheap {
			o, err := s.cheapRoute(ctx, alphaDeg, opt, warm, halvings, st, &iters)
			if err != nil {
				return nil, err
			}
			if o != nil {
				out = o
				break
			}
			if r := s.rejectedStraight(alphaDeg, opt, warm, st); r != nil {
				if out == nil {
					out = r
				}
				continue
			}
		}
		o, err := s.solveCoupled(ctx, alphaDeg, opt, warm, halvings, st)
		if err != nil {
			return nil, err
		}
		iters += o.Iterations
		if out == nil || o.Converged {
			out = o
		}
		if o.Converged {
			break
		}
	}
	return s.finish(ctx, out, iters)
}

// rejectedStraight returns, when the iterations straight from warm at
// alphaDeg with strategy st (cheapRoute) met the tolerance on a solution
// implausible rejects, that solution, not converged and saying why;
// otherwise nil. solveStrategies then ends the strategy there instead of
// taking its costly routes (the continuation and the start from the
// march, at the angle and at its half step): the root the neighbour's
// solution leads to at this angle is one the method rejects, and those
// routes, started elsewhere, met the same root or none. On
// BenchmarkCoupledPolar41TwoElement that is −9.5° and −10° (every
// straight start's lift above the inviscid): of the six costly attempts
// there five failed and one, hold's march at −10°, converged on the
// straight start's own root (Cl −0.15023, the same to 14 digits), in
// 436 and 162 Newton iterations, now 29 and 18. No solve of the
// solver's TestCoupled tests and the engine's coupled, map and
// example-sweep tests (231 solves: slot, ground, validation, sweeps) has
// such a straight start, so none that converges is lost. Only in free
// air: on the two-element example's 20 × 20 map (ground effect; its
// points are solved two at a time, so the trace does not say which
// point each attempt belongs to) such straight starts occur, and
// whether the same strategy's costly routes then converge was not
// checked.
func (s *System) rejectedStraight(alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, st strategy) *CoupledSolution {
	if s.geo.ground {
		return nil
	}
	r, ok := warm.attempts.get(newAttemptKey(s, alphaDeg, opt, st, warmDirect, false))
	if !ok || !r.warmRejected {
		return nil
	}
	r.Rejected = implausible(r)
	return r
}

// finish completes solveStrategies' answer out, with iters iterations
// spent on it: when it did not converge, the trip ladder; when it did,
// the release of transition held upstream.
func (s *System) finish(ctx context.Context, out *CoupledSolution, iters int) (*CoupledSolution, error) {
	if !out.Converged && out.state != nil && out.state.freeSides() != [2]bool{} {
		// No strategy converged from the march (a laminar separation
		// bubble, most often): the trip ladder reaches the free
		// solution through tripped layers.
		t, c, n, r, err := out.state.tripLadder(ctx)
		iters += n
		if err != nil {
			return nil, err
		}
		if c {
			out = t.result()
			out.Converged, out.Residual = true, r
		}
	}
	if out.Converged && out.state != nil {
		t, n, r, err := out.state.releaseHeld(ctx)
		iters += n
		if err != nil {
			return nil, err
		}
		if t != nil {
			out = t.result()
			out.Converged, out.Residual = true, r
		}
	}
	out.Iterations = iters
	return out, nil
}

// cheapRoute tries, with strategy st, the cheap routes from warm before
// solveStrategies turns to solveCoupled's costly ones (the continuation
// from warm's layers, the start from the march): the full coupling
// straight from warm (at most warmDirectIterations iterations), and,
// failing that, with halvings left, the angle half way between reached
// the same way and the angle from it. It returns the solution if one
// converged with no transition held (CoupledSolution.held), or nil; the
// iterations of every attempt are added to iters.
// On a NACA 0012 polar (Re 6e6, tripped, 0.5° steps) the continuation
// from the neighbour's layers took about 200 iterations to fail at ±10°
// before the halving converged in 17.
func (s *System) cheapRoute(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, halvings int, st strategy, iters *int) (*CoupledSolution, error) {
	out, err := s.solveOnce(ctx, alphaDeg, opt, warm, warmDirect, false, st)
	if err != nil {
		return nil, err
	}
	*iters += out.Iterations
	if out.Converged && !out.held() {
		return out, nil
	}
	// Not converged, or with transition held upstream of its e^N
	// position, which solveCoupled's halving may do better on: the
	// cheap halving, then (nil) the costly routes.
	if halvings == 0 || math.Abs(alphaDeg-warm.AlphaDeg) <= minAlphaStep {
		return nil, nil
	}
	mid, err := s.cheapRoute(ctx, 0.5*(alphaDeg+warm.AlphaDeg), opt, warm, halvings-1, st, iters)
	if err != nil || mid == nil {
		return nil, err
	}
	return s.cheapRoute(ctx, alphaDeg, opt, mid, halvings-1, st, iters)
}

// solveCoupled solves at alphaDeg with strategy st: from warm, through
// the angle half way between while halvings are left, and from the
// march. The answer's Iterations count every attempt made for it: the
// half steps' and the first try's at alphaDeg as well as its own.
func (s *System) solveCoupled(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, halvings int, st strategy) (*CoupledSolution, error) {
	spent := 0 // iterations of the attempts before the answer's own
	if warm != nil && halvings > 0 && math.Abs(alphaDeg-warm.AlphaDeg) > minAlphaStep {
		out, err := s.solveOnce(ctx, alphaDeg, opt, warm, warmBoth, false, st)
		if err != nil || out.Converged && !out.held() {
			return out, err
		}
		spent += out.Iterations
		// Not converged, or converged with transition held upstream of
		// its e^N position (kept, should the half steps do no better).
		var held *CoupledSolution
		if out.Converged {
			held = out
		}
		mid, err := s.solveCoupled(ctx, 0.5*(alphaDeg+warm.AlphaDeg), opt, warm, halvings-1, st)
		if err != nil {
			return nil, err
		}
		spent += mid.Iterations
		if mid.Converged && !mid.held() {
			// Its last resort is the start from the march below, which
			// would only repeat it.
			out, err := s.solveCoupled(ctx, alphaDeg, opt, mid, halvings-1, st)
			if err != nil {
				return nil, err
			}
			spent += out.Iterations
			if held != nil && (!out.Converged || out.held()) {
				out = held
			}
			return withIterations(out, spent), nil
		}
		if held != nil {
			return withIterations(held, spent), nil
		}
		warm = nil
	}
	out, err := s.solveOnce(ctx, alphaDeg, opt, warm, warmBoth, true, st)
	if err != nil {
		return nil, err
	}
	return withIterations(out, spent+out.Iterations), nil
}

// withIterations returns a copy of c with n iterations: c may be an
// attempt's outcome that other attempts keep (attempts, marches), whose
// own count must not change.
func withIterations(c *CoupledSolution, n int) *CoupledSolution {
	o := *c
	o.Iterations = n
	return &o
}

// held reports whether transition is held upstream of its e^N position
// on some surface (CoupledSurface.TransitionHeld).
func (c *CoupledSolution) held() bool {
	for _, e := range c.Elements {
		if e.Upper.TransitionHeld || e.Lower.TransitionHeld {
			return true
		}
	}
	return false
}

// solveOnce solves at one angle from warm (if any; the steps of solveFrom
// given) and, when that fails and cold is set, from the march.
func (s *System) solveOnce(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, steps warmSteps, cold bool, st strategy) (*CoupledSolution, error) {
	s.checkAlpha(alphaDeg)
	if len(opt.Re) != len(s.geo.elems) {
		panic("solver: SolveCoupled: one Reynolds number per element needed")
	}
	for _, r := range opt.Re {
		if !(r > 0) || math.IsInf(r, 0) {
			panic("solver: SolveCoupled: Reynolds numbers must be positive and finite")
		}
	}
	var memo *attempts
	if warm != nil {
		memo = warm.attempts
	}
	key := newAttemptKey(s, alphaDeg, opt, st, steps, cold)
	if r, ok := memo.get(key); ok {
		return r, nil
	}
	if steps == warmBoth {
		// The iterations straight from warm, made before on their own
		// (cheapRoute): converged, this attempt ends as they did; met
		// on an implausible solution, which ends the warm part too, it
		// ends as they did when it is not to go on from the march (on
		// BenchmarkCoupledPolar41TwoElement 7–11 iterations each, four
		// times at −9.5° and −10°; cold, they are made again, for the
		// march after them starts from the factors they leave);
		// failed, it goes on with the continuation.
		if r, ok := memo.get(newAttemptKey(s, alphaDeg, opt, st, warmDirect, false)); ok {
			switch {
			case r.Converged:
				return r, nil
			case r.warmRejected && !cold:
				return r, nil
			case !r.warmRejected && r.Rejected == "":
				steps = warmContinuation
			}
		}
	}
	flow, err := s.coupledFlowAt(alphaDeg)
	if err != nil {
		return nil, err
	}
	cs := stateOn(flow, opt)
	cs.strategy = st
	var conv, warmRejected bool
	var iters int
	var res float64
	if warm != nil && warm.state != nil && s.sameElements(warm.state.sol.sys) {
		var ok bool
		conv, iters, res, ok, err = cs.solveFrom(ctx, warm.state, steps)
		if err != nil {
			return nil, err
		}
		if ok && conv && implausible(cs.result()) != "" {
			conv = false // try from the march
			warmRejected = true
		}
	}
	var out *CoupledSolution
	if !conv && (cold || iters == 0) {
		// A cold start, or a warm start that failed: from the march. A
		// start from the march on a state of its own (no warm start
		// iterated on it before) is made once per flow (marches).
		fresh := iters == 0
		var m *CoupledSolution
		ok := false
		if fresh {
			m, ok = flow.marches.get(opt, st)
		}
		if !ok {
			n := iters
			if n > 0 {
				cs.reset()
			}
			conv, iters, res, err = cs.solve(ctx, cs.march())
			if err != nil {
				return nil, err
			}
			m = cs.outcome(conv, iters+n, res)
			if fresh {
				kept := *m
				flow.marches.put(opt, st, &kept)
			}
		}
		out = m
	} else {
		out = cs.outcome(conv, iters, res)
	}
	out.attempts, out.warmRejected = &attempts{}, warmRejected
	memo.put(key, out)
	// Nothing iterates on cs again (the trip ladder and the release of
	// held transition start states of their own): its workspace goes
	// to the next attempt.
	cs.work.release()
	return out, nil
}

// outcome returns cs's result after iterations that converged (conv) or
// not, iters of them, the last with the step res; one that converged on an
// implausible solution is not taken as converged.
func (cs *coupledState) outcome(conv bool, iters int, res float64) *CoupledSolution {
	out := cs.result()
	out.Converged, out.Iterations, out.Residual = conv, iters, res
	if conv {
		if why := implausible(out); why != "" {
			out.Converged, out.Rejected = false, why
		}
	}
	return out
}

// implausible returns why a solution that met the tolerance cannot be the
// flow's, or "". The boundary layers and wakes displace the flow so that
// the lift falls below the potential-flow lift where the suction side's
// layer is the thicker at the trailing edge, as on a lifting section
// (common practice: the displacement thickens the rear of the section on
// that side, decambering it, and the Kutta condition then takes less
// circulation). Where a pressure side's layer is the thicker — a
// one-sided trip, a pressure side separating near its trailing edge at a
// low Reynolds number, a cambered section near zero lift whose lower
// surface turns turbulent first — the displacement cambers the section
// instead and the viscous lift may exceed the inviscid (NACA 0012 at
// −1°, Re 2e5, upper surface tripped at 5 %: Cl −0.145 against the
// inviscid −0.121; NACA 2412 at −2°, Re 5e5: 0.031 against 0.019). So
// a solution with more lift than the inviscid one by more than
// liftExcess is rejected as a spurious root of the discrete equations
// only when every element's suction-side layer is at least as thick at
// its trailing edge as its pressure side's (pressureSideThicker).
//
// A solution whose layer jumps from separated to attached where its edge
// speed does not fall is rejected too (branchJump).
func implausible(s *CoupledSolution) string {
	if why := branchJump(s); why != "" {
		return why
	}
	return spuriousLift(s)
}

// spuriousLift is implausible's lift check alone (see there).
func spuriousLift(s *CoupledSolution) string {
	inv := s.ClInviscid
	if math.Copysign(1, inv)*(s.Cl-inv) > liftExcessAbs+liftExcessRel*math.Abs(inv) && !pressureSideThicker(s) {
		return fmt.Sprintf("the iterations met their tolerance with Cl %.3f, above the inviscid %.3f, with no pressure-side layer the thicker at its trailing edge (but by separating over its last stations only), which cannot give more lift: a spurious solution", s.Cl, inv)
	}
	return ""
}

// pressureSideThicker reports whether some element's pressure-side layer
// (the lower surface where the element's inviscid lift is positive, the
// upper where it is negative) has the larger displacement thickness at
// the trailing edge, and not only by separating over its last stations
// (edgeOnlySeparationXC).
func pressureSideThicker(s *CoupledSolution) bool {
	for _, e := range s.Elements {
		nu, nl := len(e.Upper.Stations), len(e.Lower.Stations)
		if nu == 0 || nl == 0 {
			continue
		}
		up, low := e.Upper.Stations[nu-1].DStar, e.Lower.Stations[nl-1].DStar
		pressure := e.Lower
		if e.ClInviscid < 0 {
			up, low = low, up
			pressure = e.Upper
		}
		if low > up && !(pressure.Separation >= edgeOnlySeparationXC) {
			return true
		}
	}
	return false
}

// edgeOnlySeparationXC: a pressure side separating only aft of this x/c
// (its last station or two at 160 panels) does not count as the thicker
// layer that may add lift. That is the signature of the spurious root
// the check was written for (E387 at Re 3e5 and 0°, the lower surface
// "separating" at its last station); a pressure side's real laminar
// separation at these Reynolds numbers starts further forward (NACA 0012
// at Re 3e5 and 3–5°: x/c 0.84–0.93, engine.PressureSideSeparatedFromXC).
const edgeOnlySeparationXC = 0.98

// The lift a coupled solution may have above the inviscid lift before it
// is rejected (implausible): room for the discretisation and for the
// pressure integration of the two solutions differing slightly.
const (
	liftExcessAbs = 0.01
	liftExcessRel = 0.02
)
