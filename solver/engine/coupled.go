package engine

import (
	"cmp"
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"sectionbench/model"
	"sectionbench/solver"
)

// CoupledPoint is the coupled viscous solution (solver.SolveCoupled) at
// one angle of attack, as the application shows it. A point that did not
// converge carries no numbers that could be read as an answer: its Cl,
// Cd and Cm, and every element's, are NaN, and Detail is nil; its
// iterations and residual say how far it got. The inviscid Cl beside it
// is always there.
type CoupledPoint struct {
	AlphaDeg   float64 // the study's angle of attack
	Cl, Cd, Cm float64 // configuration, on the reference chord (Cm about the moment reference); NaN unless Converged
	ClInviscid float64
	CmInviscid float64
	Converged  bool
	Iterations int     // Newton iterations of the final attempt
	Residual   float64 // largest relative change of the last iteration
	// PastClMax marks a sweep row beyond the angle of maximum lift, when
	// the sweep found a peak (Result.ClMaxIsPeak); the study's own point
	// is marked likewise when the sweep ran.
	PastClMax bool
	Elements  []CoupledElementPoint
	// Note says why there is no solution at all when the solver gave up
	// with an error (a wake that cannot be traced, for example); empty
	// otherwise.
	Note string
	// Rejected says why iterations that met their tolerance were not
	// accepted (a spurious solution with more lift than the inviscid
	// one); empty otherwise.
	Rejected string
	// Detail is the solver's full solution (stations, wakes, bubbles);
	// nil unless Converged.
	Detail *solver.CoupledSolution

	last *solver.CoupledSolution // the last state, converged or not, for warm starts
}

// CoupledElementPoint is one element's share of a CoupledPoint, on its own
// chord. Transition and separation are x/c on the surfaces as mounted
// (the solver's upper and lower after model.Place mirrored an inverted
// wing), NaN for none or when the point did not converge.
type CoupledElementPoint struct {
	Name                             string
	Cl, Cd, Cm                       float64 // NaN unless converged; Cm about the element's quarter chord
	ClInviscid                       float64
	TransitionUpper, TransitionLower float64
	SeparationUpper, SeparationLower float64 // where the layer separates and stays separated to the trailing edge
	// HeldUpper and HeldLower: transition held upstream of its e^N
	// position (solver.CoupledSurface.TransitionHeld).
	HeldUpper, HeldLower     bool
	BubbleUpper, BubbleLower [2]float64 // laminar separation bubble from–to x/c; NaN, NaN for none
	// CpMin is the lowest Cp of the coupled solution on the element's
	// surfaces (1 − Ue² at its stations); NaN unless converged.
	CpMin float64
}

// Facts returns the point's verdict for model.Plausibility: past maximum
// lift, not converged, transition held, and, when it converged, separated
// on some element (suctionSeparated).
func (p *CoupledPoint) Facts() *model.ViscousFacts {
	f := &model.ViscousFacts{PastClMax: p.PastClMax, NotConverged: !p.Converged, TransitionHeld: p.Converged && p.Held(), Coupled: true}
	if p.Converged {
		for _, e := range p.Elements {
			f.Separated = f.Separated || e.suctionSeparated()
		}
	}
	return f
}

// PressureSideSeparatedFromXC: a pressure side counts as separated
// (suctionSeparated) when it separates ahead of this x/c, over half its
// chord: the negative stall of a cambered section at a low angle. At the
// team's Reynolds numbers a pressure side's laminar layer often leaves
// the last fifth of the chord without turning turbulent (NACA 0012 at
// Re 3e5 and 3–5°: separated from x/c 0.84–0.93 in the coupled solution,
// with a little more lift than the inviscid solution, not less), which
// is no stall.
const PressureSideSeparatedFromXC = 0.5

// suctionSeparated reports whether the element's suction side — the
// upper surface as mounted where it lifts upwards (Cl > 0), the lower
// where it pushes down — separates ahead of SeparatedFromXC, or its
// pressure side ahead of PressureSideSeparatedFromXC.
func (e *CoupledElementPoint) suctionSeparated() bool {
	suction, pressure := e.SeparationUpper, e.SeparationLower
	if e.Cl < 0 {
		suction, pressure = pressure, suction
	}
	return suction < SeparatedFromXC || pressure < PressureSideSeparatedFromXC
}

// Held reports whether the point converged with transition held upstream
// of its e^N position on some surface (solver.CoupledSurface.TransitionHeld).
func (p *CoupledPoint) Held() bool {
	for _, e := range p.Elements {
		if e.HeldUpper || e.HeldLower {
			return true
		}
	}
	return false
}

// coupledPoint summarises a solver solution at the study angle alphaDeg.
func coupledPoint(alphaDeg float64, cs *solver.CoupledSolution) CoupledPoint {
	nan := math.NaN()
	p := CoupledPoint{
		AlphaDeg: alphaDeg, Cl: nan, Cd: nan, Cm: nan,
		ClInviscid: cs.ClInviscid, CmInviscid: cs.CmInviscid,
		Converged: cs.Converged, Iterations: cs.Iterations, Residual: cs.Residual,
		Rejected: cs.Rejected, last: cs,
	}
	if cs.Converged {
		p.Cl, p.Cd, p.Cm, p.Detail = cs.Cl, cs.Cd, cs.Cm, cs
	}
	for _, e := range cs.Elements {
		ep := CoupledElementPoint{
			Name: e.Name, Cl: nan, Cd: nan, Cm: nan, ClInviscid: e.ClInviscid,
			TransitionUpper: nan, TransitionLower: nan, SeparationUpper: nan, SeparationLower: nan,
			BubbleUpper: [2]float64{nan, nan}, BubbleLower: [2]float64{nan, nan}, CpMin: nan,
		}
		if cs.Converged {
			ep.Cl, ep.Cd, ep.Cm = e.Cl, e.Cd, e.Cm
			ep.CpMin = surfaceCpMin(e.Upper, e.Lower)
			ep.TransitionUpper, ep.TransitionLower = e.Upper.Transition, e.Lower.Transition
			ep.SeparationUpper, ep.SeparationLower = e.Upper.Separation, e.Lower.Separation
			ep.HeldUpper, ep.HeldLower = e.Upper.TransitionHeld, e.Lower.TransitionHeld
			if e.Upper.HasBubble {
				ep.BubbleUpper = e.Upper.Bubble
			}
			if e.Lower.HasBubble {
				ep.BubbleLower = e.Lower.Bubble
			}
		}
		p.Elements = append(p.Elements, ep)
	}
	return p
}

// failedPoint is a point where the solver returned an error other than
// cancellation: no numbers, the reason in Note.
func failedPoint(alphaDeg float64, names []string, err error) CoupledPoint {
	nan := math.NaN()
	p := CoupledPoint{AlphaDeg: alphaDeg, Cl: nan, Cd: nan, Cm: nan, ClInviscid: nan, CmInviscid: nan, Residual: nan, Note: err.Error()}
	for _, n := range names {
		p.Elements = append(p.Elements, CoupledElementPoint{
			Name: n, Cl: nan, Cd: nan, Cm: nan, ClInviscid: nan,
			TransitionUpper: nan, TransitionLower: nan, SeparationUpper: nan, SeparationLower: nan,
			BubbleUpper: [2]float64{nan, nan}, BubbleLower: [2]float64{nan, nan}, CpMin: nan,
		})
	}
	return p
}

// surfaceCpMin returns the lowest Cp over the stations of the surfaces.
func surfaceCpMin(surfaces ...solver.CoupledSurface) float64 {
	cp := math.Inf(1)
	for _, s := range surfaces {
		for _, st := range s.Stations {
			cp = math.Min(cp, st.Cp)
		}
	}
	return cp
}

// CpMin returns the lowest Cp of the coupled solution over every element
// and true when the point converged; NaN and false otherwise.
func (p *CoupledPoint) CpMin() (float64, bool) {
	if p == nil || !p.Converged || len(p.Elements) == 0 {
		return math.NaN(), false
	}
	cp := math.Inf(1)
	for _, e := range p.Elements {
		cp = math.Min(cp, e.CpMin)
	}
	return cp, true
}

// coupledOptions are the solver's options for a study.
func coupledOptions(st *model.Study, re []float64, maxIter int) solver.CoupledOptions {
	return solver.CoupledOptions{
		Re: re, NCrit: st.Viscous.CriticalN(),
		TripUpper: st.Viscous.TripUpper, TripLower: st.Viscous.TripLower,
		MaxIterations: maxIter,
	}
}

// Warm starts: the engine keeps the last converged solution of its cached
// system and starts the next one from it when the angle moved at most
// maxWarmStepDeg (a neighbouring angle), of the size at which the
// solver's own continuation in α (two halvings) usually holds on a polar
// (the lead's trials on NACA 0012 and E387). A walk towards an angle that
// did not converge from a cold start goes through the angles of a sweep
// from 0° in steps of walkStepDeg, the sweep's usual step, so that near
// the maximum it follows the sweep's roots: in 2° steps the walk of an
// inverted kt:-0.1,0.1,10 at h/c 1 failed at 8°, where the 1° sweep goes
// on to 18°, and over the team's sections (roots11's note) single solves
// near the maximum gave the sweep's rows less often.
const (
	maxWarmStepDeg    = 3
	walkStepDeg       = 1
	walkFirstAboveDeg = 4
	// walkSameAngle: a step of the walk closer to alphaDeg than this
	// fraction of walkStepDeg is alphaDeg itself (rounding in the angle).
	walkSameAngle = 1e-9
)

// solveCoupled solves sys at the freestream angle fs for the study angle
// alphaDeg, starting from warm if not nil. Cancellation returns ctx's
// error; any other solver error becomes a point without numbers.
func solveCoupled(ctx context.Context, sys *solver.System, alphaDeg, fs float64, opt solver.CoupledOptions, warm *solver.CoupledSolution, names []string) (CoupledPoint, error) {
	cs, err := sys.SolveCoupled(ctx, fs, opt, warm)
	if err != nil {
		if ctx.Err() != nil || errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
			return CoupledPoint{}, err
		}
		return failedPoint(alphaDeg, names, err), nil
	}
	return coupledPoint(alphaDeg, cs), nil
}

// coupledAt solves the coupled flow at the study's angle. It starts from
// the engine's last converged solution when that is near. Otherwise, up
// to walkFirstAboveDeg it starts from scratch, and beyond it, or when
// that start does not converge, it walks from 0° as a sweep does
// (walk), and starts from scratch only when the walk does not reach
// alphaDeg. In ground effect the configuration pitches, so every angle
// of the walk is a new system, built as a sweep builds it (sweepSystem),
// and the solver carries each step's layers over to the next pitched
// system as a sweep's neighbour does: without the walk, an inverted
// kt:-0.1,0.1,10 at h/c 1 (TestEngineCoupledGroundStall) converged
// alone at none of 12°–16°, where the sweep converges. A map
// point that starts from its neighbours' solutions (runFromSeeds) does
// not walk; one that does not is solved here as `solve` solves it (a
// map's points, each on a fresh engine, runColdFirst, walk as `solve`
// walks). Without the walk in ground effect the two-element example with
// free transition had no answer at 3° from `solve` (2326 iterations, not
// converged) while its sweep's row, walked from 0°, converged (look9's
// E2, TestExampleFreeTransitionSolveWalks).
func (e *Engine) coupledAt(ctx context.Context, sys *solver.System, alphaDeg, fs float64, opt solver.CoupledOptions, optKey string) (CoupledPoint, error) {
	names := e.elementNames()
	if seed := e.seed; seed != nil {
		// Neighbouring settings' solutions (runFromSeeds): starts from
		// them, no walk.
		e.seed = nil
		p, from, err := fromSeeds(ctx, sys, alphaDeg, fs, opt, seed, e.seedMore, e.rescueMax, names)
		e.seedFrom = from
		e.keepWarm(p, optKey)
		return p, err
	}
	var warm *solver.CoupledSolution
	if e.warmKey == optKey && e.warm != nil && math.Abs(e.warmAlpha-alphaDeg) <= maxWarmStepDeg {
		warm = e.warm
	}
	own := warm != nil || math.Abs(alphaDeg) <= walkFirstAboveDeg
	var p CoupledPoint
	if own {
		var err error
		if p, err = solveCoupled(ctx, sys, alphaDeg, fs, opt, warm, names); err != nil || p.Converged {
			e.keepWarm(p, optKey)
			return p, err
		}
	}
	q, walked, err := e.walk(ctx, sys, alphaDeg, fs, opt, names)
	if err != nil {
		return CoupledPoint{}, err
	}
	// The iterations of every attempt made for the answer, as the
	// solver counts its fallbacks': the own start's, the walk's.
	total := p.Iterations + walked
	if q != nil {
		total += q.Iterations
	}
	switch {
	case q != nil && q.Converged:
		p = *q
	case !own:
		if p, err = solveCoupled(ctx, sys, alphaDeg, fs, opt, nil, names); err != nil {
			return CoupledPoint{}, err
		}
		total += p.Iterations
	}
	p.Iterations = total
	e.keepWarm(p, optKey)
	return p, nil
}

// walk solves sys at alphaDeg the way a sweep from 0° in steps of
// walkStepDeg reaches it (coupledSweep's first pass): from scratch at 0°,
// then through the whole multiples of walkStepDeg short of alphaDeg,
// each from the last angle that converged, a step that does not converge
// passed over, and last alphaDeg; when that does not converge, alphaDeg
// from the next angle beyond it, as the sweep's second pass reaches a row
// from the row above. It gives up, returning nil, when 0°
// does not converge or the next angle is further than maxWarmStepDeg
// from the last that converged. walked is the Newton iterations of the
// steps before alphaDeg (q's own are in q).
func (e *Engine) walk(ctx context.Context, sys *solver.System, alphaDeg, fs float64, opt solver.CoupledOptions, names []string) (q *CoupledPoint, walked int, err error) {
	steps := int(math.Ceil(math.Abs(alphaDeg)/walkStepDeg - walkSameAngle))
	var warm *solver.CoupledSolution
	from := 0.0 // the angle warm was solved at
	for i := 0; i < steps; i++ {
		a := math.Copysign(float64(i)*walkStepDeg, alphaDeg)
		if math.Abs(a-from) > maxWarmStepDeg {
			return nil, walked, nil
		}
		s, f, err := e.sweepSystem(ctx, a)
		if err != nil {
			if ctx.Err() != nil {
				return nil, walked, ctx.Err()
			}
			return nil, walked, nil // no system there: no walk
		}
		r, err := solveCoupled(ctx, s, a, f, opt, warm, names)
		walked += r.Iterations
		switch {
		case err != nil:
			return nil, walked, err
		case r.Converged:
			warm, from = r.last, a
		case i == 0:
			return nil, walked, nil
		}
	}
	if warm == nil || math.Abs(alphaDeg-from) > maxWarmStepDeg {
		return nil, walked, nil
	}
	p, err := solveCoupled(ctx, sys, alphaDeg, fs, opt, warm, names)
	if err != nil || p.Converged {
		return &p, walked, err
	}
	// As the sweep's second pass (coupledSweep) for a row that did not
	// converge: the next angle beyond alphaDeg from the last that
	// converged, and alphaDeg from it when that converged. Over the
	// team's sections (roots11's note) 2 of 175 single solves near
	// maximum lift converged so, on the sweep's rows, that did not
	// converge before, and no other changed. Not for a last step that
	// converged with transition held, which the sweep's second pass also
	// replaces: that lost as many single solves as it won (E387 at Re
	// 8e5, h/c 1, 10°: 0.194 from the sweep's row).
	b := math.Copysign((math.Floor(math.Abs(alphaDeg)/walkStepDeg+walkSameAngle)+1)*walkStepDeg, alphaDeg)
	if math.Abs(b-from) > maxWarmStepDeg {
		return &p, walked, nil
	}
	s, f, err := e.sweepSystem(ctx, b)
	if err != nil {
		if ctx.Err() != nil {
			return nil, walked, ctx.Err()
		}
		return &p, walked, nil
	}
	r, err := solveCoupled(ctx, s, b, f, opt, warm, names)
	if err != nil || !r.Converged {
		return &p, walked + r.Iterations, err
	}
	t, err := solveCoupled(ctx, sys, alphaDeg, fs, opt, r.last, names)
	if err != nil {
		return nil, walked, err
	}
	return &t, walked + p.Iterations + r.Iterations, nil
}

// fromSeeds solves sys from converged solutions of neighbouring
// settings: first, the nearest, with all of SolveCoupled's fallbacks (the
// continuation from its layers, the other strategy, the start from the
// march), then, when that does not converge, from those more returns
// (nearer first; it may wait for them to be solved), each within
// rescueMax Newton iterations an attempt. It returns the point with the
// index of the solution it converged from (0 first, i for more's i−1;
// −1: none). Each start is from a StartCopy of its solution, so that what
// it tries is dropped with it.
func fromSeeds(ctx context.Context, sys *solver.System, alphaDeg, fs float64, opt solver.CoupledOptions, first *solver.CoupledSolution, more func() []*solver.CoupledSolution, rescueMax int, names []string) (CoupledPoint, int, error) {
	fail := func(err error) (CoupledPoint, int, error) {
		if ctx.Err() != nil || errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
			return CoupledPoint{}, -1, err
		}
		return failedPoint(alphaDeg, names, err), -1, nil
	}
	cs, err := sys.SolveCoupled(ctx, fs, opt, first.StartCopy())
	if err != nil {
		return fail(err)
	}
	p := coupledPoint(alphaDeg, cs)
	switch {
	case cs.Converged:
		return p, 0, nil
	case more == nil:
		return p, -1, nil
	}
	starts := more()
	if err := ctx.Err(); err != nil {
		return fail(err)
	}
	ropt := opt
	ropt.MaxIterations = rescueMax
	for i, start := range starts {
		cs, err := sys.SolveCoupled(ctx, fs, ropt, start.StartCopy())
		if err != nil {
			return fail(err)
		}
		if cs.Converged {
			return coupledPoint(alphaDeg, cs), i + 1, nil
		}
	}
	return p, -1, nil
}

// keepWarm remembers a converged point of the cached free-air system.
func (e *Engine) keepWarm(p CoupledPoint, optKey string) {
	if p.Converged {
		e.warm, e.warmAlpha, e.warmKey = p.last, p.AlphaDeg, optKey
	}
}

func (e *Engine) elementNames() []string {
	var n []string
	for _, el := range e.layout.Elements {
		n = append(n, el.Name)
	}
	return n
}

// sweepOrder returns the indices of alphas in the order a polar is walked:
// the angle nearest zero first, then upwards from it, then downwards from
// it, so each angle can start from its converged neighbour.
func sweepOrder(alphas []float64) []int {
	if len(alphas) == 0 {
		return nil
	}
	i0 := 0
	for i, a := range alphas {
		if math.Abs(a) < math.Abs(alphas[i0]) {
			i0 = i
		}
	}
	order := []int{i0}
	for i := i0 + 1; i < len(alphas); i++ {
		order = append(order, i)
	}
	for i := i0 - 1; i >= 0; i-- {
		order = append(order, i)
	}
	return order
}

// coupledSweep solves the coupled flow at every angle of a sweep in
// sweepOrder, each warm-started from the last converged angle on the
// same side of the start. In ground effect each angle is a new system
// (the configuration pitches above the ground), and the solver carries
// the neighbour's layers over to it by arc length as it does between
// free-air angles: started from scratch instead, each angle of the
// two-element example took 100–300 Newton iterations and the coupled
// equations' several roots (transition a station apart, a slot-side
// layer separated at the trailing edge or not) made the polar jump
// between them; started from its neighbour, an angle stays on its
// neighbour's root (the solver still falls back to a start from scratch
// when the warm start fails). progress is called after each angle.
func (e *Engine) coupledSweep(ctx context.Context, alphas []float64, opt solver.CoupledOptions, progress func(done, total int)) ([]CoupledPoint, error) {
	names := e.elementNames()
	rows := make([]CoupledPoint, len(alphas))
	order := sweepOrder(alphas)
	var start, warm *solver.CoupledSolution
	from, startIdx := -1, -1   // the row warm came from
	tried := map[[2]int]bool{} // row, neighbour it was started from
	for n, i := range order {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		if n > 0 && i == order[0]-1 {
			warm, from = start, startIdx // turning round: downwards from the start
		}
		tried[[2]int{i, from}] = true
		a := alphas[i]
		sys, fs, err := e.sweepSystem(ctx, a)
		if err != nil {
			return nil, err
		}
		p, err := solveCoupled(ctx, sys, a, fs, opt, warm, names)
		if err != nil {
			return nil, err
		}
		if p.Converged {
			warm, from = p.last, i
			if n == 0 {
				start, startIdx = p.last, i
			}
		}
		rows[i] = p
		if progress != nil {
			progress(n+1, len(alphas))
		}
	}
	// More chances for a row that did not converge, or converged with its
	// transition held upstream of its e^N position (Held): from each
	// converged neighbour it was not started from (a row beyond a stall,
	// say, that its lower neighbour could not reach but its upper one
	// can), again while that makes new rows converge. Each row is tried at
	// most once from each neighbour; a held row is replaced only by a
	// solution that is not held.
	for changed := true; changed; {
		changed = false
		for i := range rows {
			if rows[i].Converged && !rows[i].Held() || rows[i].Note != "" {
				continue
			}
			for _, j := range []int{i + 1, i - 1} {
				if j < 0 || j >= len(rows) || !rows[j].Converged || rows[j].Held() || tried[[2]int{i, j}] {
					continue
				}
				tried[[2]int{i, j}] = true
				sys, fs, err := e.sweepSystem(ctx, alphas[i])
				if err != nil {
					return nil, err
				}
				p, err := solveCoupled(ctx, sys, alphas[i], fs, opt, rows[j].last, names)
				if err != nil {
					return nil, err
				}
				if p.Converged && !p.Held() {
					rows[i], changed = p, true
					break
				}
			}
		}
	}
	return rows, nil
}

// sweepSystem returns the system a sweep solves at alphaDeg and its
// freestream angle: the engine's free-air system, or in ground effect the
// configuration pitched to alphaDeg (groundSystem).
func (e *Engine) sweepSystem(ctx context.Context, alphaDeg float64) (*solver.System, float64, error) {
	if e.layout.Ground {
		return e.groundSystem(ctx, alphaDeg)
	}
	_, _, fs := e.layout.At(alphaDeg)
	return e.sys, fs, nil
}

// ClMax finds the maximum lift of a sweep among its converged rows: the
// largest Cl on an upright wing, the most negative (the most downforce) on
// an inverted one, where a positive angle loads the wing the other way
// (model.AngleSense). It returns NaN, NaN when no row converged. peak is
// true when a converged row at a larger angle gives less lift, so the
// maximum is a stall inside the sweep and not its end.
//
// The maximum is the first one on the way up: from the row of least lift
// below the sweep's largest (the far side of a negative stall, or the
// sweep's start) the rows are taken in order of angle, and the first whose
// next converged row gives less lift is the stall. Past a stall the
// coupled solution can follow another branch whose lift rises again above
// the first maximum (E387 at Re 2e5: 1.246 at 9°, 1.233 at 10°, 1.270 at
// 14° with its separation aft of 13°'s; DEVELOPERS.md "What does not
// yet"): the stall a team sets its wing by is where the lift first stops
// rising, so such a row is marked past the maximum
// (Result.HigherPastClMaxWords) instead of being taken as it. The way up
// ends, too, at a row whose suction side separates further aft than the
// maximum so far's, or not at all where that one separates
// (separationAft): a row of another branch, even where its lift rises.
func ClMax(rows []CoupledPoint, inverted bool) (cl, alphaDeg float64, peak bool) {
	sense := loadSense(inverted)
	var order []int
	for i, r := range rows {
		if r.Converged {
			order = append(order, i)
		}
	}
	if len(order) == 0 {
		return math.NaN(), math.NaN(), false
	}
	slices.SortStableFunc(order, func(a, b int) int { return cmp.Compare(rows[a].AlphaDeg, rows[b].AlphaDeg) })
	load := func(k int) float64 { return sense * rows[order[k]].Cl }
	top := 0
	for k := range order {
		if load(k) > load(top) {
			top = k
		}
	}
	low := 0
	for k := 0; k <= top; k++ {
		if load(k) < load(low) {
			low = k
		}
	}
	best := low
	for k := low + 1; k < len(order); k++ {
		if load(k) < load(best) || separationAft(&rows[order[best]], &rows[order[k]], sense) {
			peak = true
			break
		}
		if load(k) > load(best) {
			best = k
		}
	}
	r := rows[order[best]]
	return r.Cl, r.AlphaDeg, peak
}

// separationJitterXC is how far aft of a lower angle's a suction side's
// separation may lie and still be taken as the same stall: one station's
// spacing at mid-chord at the default 160 panels (cosine spacing, 80
// panels a surface: π/80 · ½ ≈ 0.02 of chord), the resolution the
// separation is found to.
const separationJitterXC = 0.02

// separationAft reports whether some element of q, a converged row at a
// larger angle than p, separates on its suction side (the upper surface
// as mounted on a wing loaded upwards, sense 1, the lower on one loaded
// downwards; elements of p or q loaded the other way are not compared)
// more than separationJitterXC aft of where p's does, or not
// at all where p's separates. Through a trailing-edge stall the
// separation moves forward as the angle rises (common practice;
// TestEngineCoupledCamberedStall, TestEngineCoupledGroundStall), so such
// a row is not on the stall's branch but on another root of the coupled
// equations whose layer stays attached further (E387 at Re 2e5, 14°:
// separated from x/c 0.585 after 0.503 at 13°; NACA 0012 at Re 3e5 in
// free air, 13°: from 0.974 after 0.861 at 12°, Cl 1.196 after 1.073; NACA
// 0012 at Re 1.5e5 tripped at 5 %, inverted at h/c 0.5: 0.832 at 14° after
// 0.669 at 13°, then no separation and downforce Cl −1.910 at 15° after
// −1.198), and the first maximum on the way up ends before it (ClMax).
func separationAft(p, q *CoupledPoint, sense float64) bool {
	for i := range min(len(p.Elements), len(q.Elements)) {
		pe, qe := &p.Elements[i], &q.Elements[i]
		if !(sense*pe.Cl > 0 && sense*qe.Cl > 0) {
			// Loaded the other way (the far side of a negative stall):
			// its suction side is the other surface.
			continue
		}
		a, b := pe.SeparationUpper, qe.SeparationUpper
		if sense < 0 {
			a, b = pe.SeparationLower, qe.SeparationLower
		}
		if math.IsNaN(a) {
			continue
		}
		if math.IsNaN(b) || b > a+separationJitterXC {
			return true
		}
	}
	return false
}

// loadSense is the sign that turns a Cl into the load a wing is set for:
// 1 on an upright wing (lift), −1 on an inverted one (downforce).
func loadSense(inverted bool) float64 {
	if inverted {
		return -1
	}
	return 1
}

// HigherPastClMaxWords says in a sentence which converged rows of the
// result's coupled sweep lie past its peak of maximum lift (ClMax) with
// more lift than it — rows of another branch of the coupled solution past
// the stall, which the sweep marks past the maximum — or is empty.
func (r *Result) HigherPastClMaxWords() string {
	if !r.ClMaxIsPeak {
		return ""
	}
	sense := loadSense(r.Layout != nil && r.Layout.Inverted)
	var at []string
	for _, p := range r.SweepCoupled {
		if p.Converged && p.AlphaDeg > r.AlphaClMax && sense*p.Cl > sense*r.ClMax {
			at = append(at, model.Minus(strconv.FormatFloat(p.AlphaDeg, 'f', -1, 64))+"°")
		}
	}
	if len(at) == 0 {
		return ""
	}
	return fmt.Sprintf("past the maximum lift at %s° (Cl %s) the lift falls, and at %s it rises above that maximum again: another branch of the coupled solution past the stall, not a higher maximum (marked past maximum lift); trust no row past the stall without a test",
		model.Minus(strconv.FormatFloat(r.AlphaClMax, 'f', -1, 64)), model.Minus(strconv.FormatFloat(r.ClMax, 'f', 3, 64)), strings.Join(at, ", "))
}

// markPastClMax marks the rows beyond the angle of a peak.
func markPastClMax(rows []CoupledPoint, alphaClMax float64, peak bool) {
	for i := range rows {
		rows[i].PastClMax = peak && rows[i].AlphaDeg > alphaClMax
	}
}
