package engine

import (
	"context"
	"errors"
	"math"
	"slices"

	"sectionbench/model"
	"sectionbench/solver"
)

// The set-up explorer: maps (Map) and the setting search (Search) solve a
// study at many settings of its set-up variables (model.SetupVariable:
// alpha_deg, clearance_mm, speed_mps, elements[K].deflection_deg,
// elements[K].gap_mm, elements[K].overlap_mm, in the as-mounted frame) and
// describe each solve as a Point.
//
// Each point is one Engine.Run of a copy of the study with the variables
// applied (model.Study.ApplySetupAll), so a point is what `solve` gives
// for the same study and options, except for a warm start (see Map). By
// default the study is solved with the coupled viscous solution whatever
// its own viscous setting (saved studies leave it off); see PointOptions.

// Point is the study solved at one setting of the set-up variables. A
// point that did not converge, or could not be solved at all (Err), carries
// no numbers that could be read as an answer: its coefficients, forces and
// separation points are NaN.
type Point struct {
	// Values are the variables' values, parallel to the map's ranges or
	// the search's bounds; Index is the point's position in a map's grid
	// (nil for a search).
	Values []float64
	Index  []int
	// Viscous is true when the coupled viscous solution ran, false on an
	// inviscid point (the panel method only: Cd is NaN).
	Viscous bool
	// Converged is true when the viscous solution converged, or an
	// inviscid point solved; false when it did not or Err is set.
	Converged bool
	// StartedFrom is the setting (the variables' values, parallel to
	// Values) whose converged viscous solution this point's solve started
	// from: a map's neighbour (Map), the nearest setting a search had
	// solved (Search), or a free-air walk's point before it. Nil when the
	// point was solved from its own start, as `solve` solves it, did not
	// converge, or is inviscid. Single says how such a point compares
	// with `solve`.
	StartedFrom []float64
	// Single says what is known of a single solve (`solve`, from the
	// march) of the point's setting; SingleCl, SingleCd and SingleCm are
	// its coefficients when it was compared and converged (NaN otherwise).
	Single                       SingleSolve
	SingleCl, SingleCd, SingleCm float64
	Iterations                   int     // Newton iterations of the viscous solution
	Residual                     float64 // its last relative change; NaN inviscid
	// Cl, Cd and Cm are the configuration's coefficients on the reference
	// chord (the solver's signs: Cl positive up, so negative on an
	// inverted wing making downforce; Cm about the moment reference).
	Cl, Cd, Cm float64
	ClInviscid float64 // the panel method's Cl beside them, NaN when Err
	// LiftPerSpan, DownforcePerSpan (= −LiftPerSpan) and DragPerSpan are
	// in N/m of span; NaN without a speed.
	LiftPerSpan, DownforcePerSpan, DragPerSpan float64
	Inverted                                   bool
	// ClearanceMM is the ground clearance (the ground to the lowest point
	// at the point's angle), NaN in free air.
	ClearanceMM float64
	Elements    []PointElement
	// Err says in words why the point could not be solved (a setting that
	// places the elements into each other, a gap the flap cannot reach, a
	// study value out of range, a solver failure); empty otherwise.
	Err string
	// Flags are the plausibility flags of the point's result as `solve`
	// and a sweep's rows raise them (Result.Flags: a suction peak beyond
	// real flows, transition held upstream, the ground, …); nil when the
	// point could not be solved.
	Flags []model.Flag
}

// PointElement is one element's share of a Point.
type PointElement struct {
	Name   string
	Cl, Cd float64 // on the element's chord; NaN unless converged (Cd also inviscid)
	// SeparationUpper and SeparationLower are where the boundary layer
	// separates and stays separated to the trailing edge, x/c on the
	// surfaces as mounted; SeparationSuction is the suction side's (the
	// upper surface upright, the lower inverted). NaN when the layer stays
	// attached, and on a point without a converged viscous solution
	// (Converged tells the two apart).
	SeparationUpper, SeparationLower, SeparationSuction float64
	// GapMM is the slot's gap behind the element before (model.Slot); NaN
	// for the main element and when Err is set.
	GapMM float64
}

// FromNeighbour reports whether the point's solve started from a
// neighbouring setting's converged solution (StartedFrom).
func (p *Point) FromNeighbour() bool { return p.StartedFrom != nil }

// NotSolve reports whether the point is known not to be `solve`'s answer
// at its setting: it converged, and a single solve reached another root
// (SingleAnotherRoot) or none (SingleNoAnswer).
func (p *Point) NotSolve() bool {
	return p.Converged && (p.Single == SingleAnotherRoot || p.Single == SingleNoAnswer)
}

// NearGround reports whether the point has an answer (converged, no
// error) at a clearance below model.GroundHOverCMin of st's main chord
// (model.Study.NearGround), where the workbench flags the study "very
// close to the ground". A point without an answer is not marked: it has
// no numbers to doubt. The map's tables, figures and readout mark their
// points by it.
func (p *Point) NearGround(st *model.Study) bool {
	return p.Converged && p.Err == "" && st.NearGround(p.ClearanceMM)
}

// SingleSolve is what is known of a single solve (`solve`: a fresh
// engine, the viscous solution from the march) of a point's setting.
type SingleSolve int

// The states of SingleSolve.
const (
	// SingleNotCompared: the point started from a neighbour's solution
	// and was not compared with a single solve (a map without
	// MapOptions.CompareWithSolve, a search's path but its best).
	SingleNotCompared SingleSolve = iota
	// SingleIdentical: the point was solved from its own start as
	// `solve` solves it, or took `solve`'s answer: the same numbers to
	// the last bit (converged or not). Every inviscid point.
	SingleIdentical
	// SingleAgrees: compared, and `solve`'s coefficients lie within
	// SolveAgreementTolerance (Cd: SolveAgreementToleranceCd) of the
	// point's: the same root.
	SingleAgrees
	// SingleAnotherRoot: compared, and `solve` converged to coefficients
	// beyond the tolerance (SingleCl, SingleCd, SingleCm): the coupled
	// equations have two roots here, and the point is on the one its
	// neighbour led to.
	SingleAnotherRoot
	// SingleNoAnswer: `solve` does not converge at the setting; the
	// point converged only from a neighbour's solution.
	SingleNoAnswer
)

// String names the state in words, as the command line prints it.
func (s SingleSolve) String() string {
	switch s {
	case SingleIdentical:
		return "identical"
	case SingleAgrees:
		return "agrees"
	case SingleAnotherRoot:
		return "another root"
	case SingleNoAnswer:
		return "no answer"
	}
	return "not compared"
}

// SolveAgreementTolerance and SolveAgreementToleranceCd are how far,
// relative, a map point and `solve` of its setting may lie apart and
// still agree (SingleAgrees): Cl and Cm within SolveAgreementTolerance of
// |Cl|, Cd within SolveAgreementToleranceCd of Cd. They come from the
// solver's convergence criterion (solver.CoupledOptions.Tolerance): an
// iterate is accepted when its last Newton step changed no θ, m or √Cτ by
// more than 1e-5 of itself, so `solve`'s own answer is known to about
// that in each variable, and the coefficients, sums over the stations,
// amplify it: Cl and Cm through the edge velocities the mass defects
// move, ten times the criterion; Cd, Squire and Young's θ Ue^((H+5)/2) at
// each wake's end (the exponent about 3.2) summed over the wakes, a
// hundred times. Answers closer than that count as one. Measured on the
// two-element example, a map of clearance 20–200 mm by α −1° to 7° (90
// points, `map --compare-with-solve`): the 70 pairs of a point started
// from its neighbour and `solve` of it that agree lie within 2.8e-5 of
// Cl and 7.7e-4 of Cd (half of them within 2e-6 and 2e-5), the 10 that
// do not from 5.5e-4 of Cl or 5.5e-3 of Cd up to 9 % and 40 %: the
// tolerances fall in the gap. Differences of 1e-5 of Cl stay when both
// are converged to 1e-9 instead of 1e-5 (TestMapAgreesWithSolve's case):
// neighbouring solutions of the discrete equations (the stations laid
// out about the stagnation point as the start left them), far below the
// method's uncertainty. Other roots lie further apart: transition a
// station apart moves Cl by 0.005–0.012 (DEVELOPERS.md), a flap
// separating from another station Cl by 1e-3 and Cd by 5 %, a slot
// blocked by its own layer Cl by several percent.
const (
	SolveAgreementTolerance   = 1e-4
	SolveAgreementToleranceCd = 1e-3
)

// sameRoot reports whether the coefficients (cl, cd, cm) and the
// point's agree within SolveAgreementTolerance (Cd:
// SolveAgreementToleranceCd).
func (p *Point) sameRoot(cl, cd, cm float64) bool {
	scale := math.Max(math.Abs(p.Cl), math.Abs(cl))
	return math.Abs(p.Cl-cl) <= SolveAgreementTolerance*scale &&
		math.Abs(p.Cm-cm) <= SolveAgreementTolerance*scale &&
		math.Abs(p.Cd-cd) <= SolveAgreementToleranceCd*math.Max(math.Abs(p.Cd), math.Abs(cd))
}

// Load returns the point's load coefficient in the sense the wing is
// mounted for: Cl upright, the downforce coefficient −Cl inverted.
func (p *Point) Load() float64 {
	if p.Inverted {
		return -p.Cl
	}
	return p.Cl
}

// AttachedTo reports whether every element's suction side stays attached
// at least to x/c = xc: the point converged and no element separates
// ahead of xc. A point without a converged viscous solution is not known
// to be attached and returns false; an inviscid point returns true (it
// knows nothing of separation; the search refuses the limit without the
// viscous solution).
func (p *Point) AttachedTo(xc float64) bool {
	if !p.Converged {
		return false
	}
	for _, e := range p.Elements {
		if e.SeparationSuction < xc { // false for NaN: attached
			return false
		}
	}
	return true
}

// PointOptions are the settings every point of a map or search shares.
type PointOptions struct {
	// Inviscid solves with the panel method only. Without it the coupled
	// viscous solution runs, whatever the study's own viscous setting,
	// unless the study has neither a speed nor a Reynolds number (it then
	// cannot have one: ViscousFor).
	Inviscid bool
	// CoupledMaxIterations bounds the coupled solution's Newton
	// iterations per attempt; 0 is the solver's default. For tests.
	CoupledMaxIterations int
}

// ViscousFor reports whether points of st are solved with the coupled
// viscous solution under opt, given the variables varied (a varied speed
// supplies the speed a study may lack).
func ViscousFor(st *model.Study, opt PointOptions, vars []model.SetupVariable) bool {
	if opt.Inviscid {
		return false
	}
	if st.Flow.SpeedMPS > 0 || st.Flow.Reynolds > 0 {
		return true
	}
	for _, v := range vars {
		if v.Kind == model.SetupSpeed {
			return true
		}
	}
	return false
}

// pointSolver solves points of one study: the base study, its sections,
// the variables, and an Engine whose cache (placement, factorisation, last
// converged viscous solution) carries from one point to the next.
type pointSolver struct {
	base    *model.Study // with the viscous setting of the points
	secs    []*model.Section
	vars    []model.SetupVariable
	opt     PointOptions
	viscous bool
	eng     *Engine
	// neighbours, if not nil, returns at most n converged solutions of
	// neighbouring settings, nearest first, that a point at values starts
	// from: the first with the full iteration budget, the others, when
	// that does not converge, within rescueIterations (fromSeeds).
	neighbours func(ctx context.Context, values []float64, n int) []seed
	// compare: solve every point that started from a neighbour again as
	// `solve` does, and compare (MapOptions.CompareWithSolve).
	compare bool
	// last is the converged coupled solution of the last solve, nil when
	// it did not converge or was inviscid; lastAt is the setting of the
	// last solve that converged (the engine's warm start's, in free air).
	last   *solver.CoupledSolution
	lastAt []float64
}

func newPointSolver(st *model.Study, secs []*model.Section, vars []model.SetupVariable, opt PointOptions) *pointSolver {
	base := st.Clone()
	viscous := ViscousFor(st, opt, vars)
	base.Viscous.Enabled = viscous
	if viscous {
		base.Viscous.Mode = model.ViscousCoupled
	}
	return &pointSolver{base: base, secs: secs, vars: vars, opt: opt, viscous: viscous, eng: NewEngine()}
}

// study returns a copy of the base study with values applied.
func (ps *pointSolver) study(values []float64) (*model.Study, error) {
	st := ps.base.Clone()
	if err := st.ApplySetupAll(ps.vars, values, ps.secs); err != nil {
		return nil, err
	}
	return st, nil
}

// solve solves the point at values: from the nearest converged
// neighbour's solution when there is one (ps.neighbours), then from the
// next ones (fromSeeds), else as `solve` solves it. Only
// cancellation is an error; any other failure is a point with Err set.
func (ps *pointSolver) solve(ctx context.Context, values []float64) (Point, error) {
	ps.last = nil
	p := Point{Values: append([]float64(nil), values...), Viscous: ps.viscous, Inverted: ps.base.Inverted, Single: SingleIdentical}
	fail := func(err error) (Point, error) {
		if ctx.Err() != nil || errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
			return Point{}, err
		}
		p.Err = err.Error()
		p.fill(nil, ps.base, ps.secs)
		return p, nil
	}
	st, err := ps.study(values)
	if err != nil {
		return fail(err)
	}
	req := Request{Study: st, Sections: ps.secs, CoupledMaxIterations: ps.opt.CoupledMaxIterations}
	var seeds []seed
	if ps.viscous && ps.neighbours != nil {
		seeds = ps.neighbours(ctx, values, 1)
		if err := ctx.Err(); err != nil {
			return fail(err)
		}
	}
	var res *Result
	var from []float64 // the setting res started from; nil: its own start
	if len(seeds) == 0 {
		// As `solve` solves it; when that does not converge, again from
		// the engine's last converged point when it is near (Run's warm
		// start): then `solve` has no answer here.
		var warmed bool
		if res, warmed, err = ps.eng.runColdFirst(ctx, req); err != nil {
			return fail(err)
		}
		if warmed {
			from, p.Single = ps.lastAt, SingleNoAnswer
		}
	} else {
		var more []seed
		next := func() []*solver.CoupledSolution {
			// The next nearest, waiting for them to be solved.
			if all := ps.neighbours(ctx, values, rescueSeeds+1); len(all) > 1 {
				more = all[1:]
			}
			sols := make([]*solver.CoupledSolution, len(more))
			for i, s := range more {
				sols[i] = s.sol
			}
			return sols
		}
		var i int
		if res, i, err = ps.eng.runFromSeeds(ctx, req, seeds[0].sol, next, rescueIterations(ps.opt.CoupledMaxIterations)); err != nil {
			return fail(err)
		}
		p.Single = SingleNotCompared
		switch {
		case i == 0:
			from = seeds[0].at
		case i > 0:
			from = more[i-1].at
		}
	}
	c := res.Coupled
	if c != nil && c.Converged {
		ps.last, ps.lastAt = c.last, p.Values
	}
	p.fill(res, st, ps.secs)
	switch {
	case !p.Viscous:
		p.Single = SingleIdentical
	case p.Converged && from != nil:
		p.StartedFrom = slices.Clone(from)
	}
	if ps.compare && p.Single == SingleNotCompared {
		one, err := NewEngine().Run(ctx, req)
		if err != nil {
			return fail(err)
		}
		if c := one.Coupled; !p.Converged && c != nil && c.Converged {
			// Not converged from its neighbours, converged as `solve`
			// solves it: the point takes solve's answer.
			ps.last, ps.lastAt = c.last, p.Values
			p.fill(one, st, ps.secs)
			p.Single = SingleIdentical
		} else {
			p.judge(c)
		}
	}
	return p, nil
}

// judge sets p.Single and its single-solve coefficients from s, the
// coupled solution of a single solve of p's setting (`solve`), for a
// point that started from a neighbour.
func (p *Point) judge(s *CoupledPoint) {
	switch {
	case s == nil || !s.Converged:
		p.Single = SingleNoAnswer
		if !p.Converged {
			p.Single = SingleIdentical // no answer either way
		}
	case !p.Converged:
		p.Single = SingleNotCompared // solve has an answer the point has not taken
	default:
		p.SingleCl, p.SingleCd, p.SingleCm = s.Cl, s.Cd, s.Cm
		p.Single = SingleAnotherRoot
		if p.sameRoot(s.Cl, s.Cd, s.Cm) {
			p.Single = SingleAgrees
		}
	}
}

// rescueSeeds is how many more converged neighbours a point that did not
// converge from its nearest tries, nearest first (fromSeeds). On the
// 20 × 20 map of BenchmarkMapTwoElement20x20 every point a rescue
// converged (5 of 13 tried) converged from the first it tried; a second
// only cost the solver's whole fallback once more at each point that
// does not converge.
const rescueSeeds = 1

// rescueIterations is the Newton iteration bound of each attempt of a
// rescue from a further neighbour (fromSeeds; the solver's default is
// 60): a start from a converged neighbour one grid step away converges in
// a few tens of iterations when it converges at all, and a rescue that
// cannot must not cost as much as the attempts that already failed.
func rescueIterations(own int) int {
	const bound = 30
	if own > 0 && own < bound {
		return own
	}
	return bound
}

// runFromSeeds is Run with the coupled solution started from first, a
// converged solution of the nearest neighbouring setting, and, as it
// needs them, from those more returns (any systems with as many
// elements and panels: the solver carries the layers over by arc
// length), as fromSeeds tries them, without the engine's own warm start
// or walk; rescueMax bounds the iterations of the starts from more's.
// It returns the index of the solution converged from (0 first, i
// more's i−1; −1: none).
func (e *Engine) runFromSeeds(ctx context.Context, req Request, first *solver.CoupledSolution, more func() []*solver.CoupledSolution, rescueMax int) (*Result, int, error) {
	e.seed, e.seedMore, e.rescueMax, e.seedFrom = first, more, rescueMax, -1
	defer func() { e.seed, e.seedMore = nil, nil }()
	res, err := e.Run(ctx, req)
	if err != nil {
		return nil, -1, err
	}
	return res, e.seedFrom, nil
}

// fill sets the point's numbers from res (nil: none).
func (p *Point) fill(res *Result, st *model.Study, secs []*model.Section) {
	nan := math.NaN()
	p.Cl, p.Cd, p.Cm, p.ClInviscid, p.Residual = nan, nan, nan, nan, nan
	if p.Single != SingleAgrees && p.Single != SingleAnotherRoot {
		p.SingleCl, p.SingleCd, p.SingleCm = nan, nan, nan
	}
	p.LiftPerSpan, p.DownforcePerSpan, p.DragPerSpan, p.ClearanceMM = nan, nan, nan, nan
	p.Flags = nil
	p.Elements = make([]PointElement, len(st.Elements))
	for i, e := range st.Elements {
		p.Elements[i] = PointElement{Name: e.Name, Cl: nan, Cd: nan, SeparationUpper: nan, SeparationLower: nan, SeparationSuction: nan, GapMM: nan}
	}
	if res == nil {
		return
	}
	if st.Ground.Enabled {
		p.ClearanceMM = st.Ground.ClearanceMM
	}
	for i := 1; i < len(st.Elements); i++ {
		p.Elements[i].GapMM = st.SlotOf(i, secs[i]).GapMM
	}
	p.ClInviscid = res.Solution.Cl
	p.Flags = res.Flags()
	if c := res.Coupled; c != nil {
		p.Converged, p.Iterations, p.Residual = c.Converged, c.Iterations, c.Residual
		p.ClInviscid = c.ClInviscid
		p.Cl, p.Cd, p.Cm = c.Cl, c.Cd, c.Cm
		if c.Note != "" {
			p.Err = c.Note
		}
		for i, e := range c.Elements {
			pe := &p.Elements[i]
			pe.Cl, pe.Cd = e.Cl, e.Cd
			pe.SeparationUpper, pe.SeparationLower = e.SeparationUpper, e.SeparationLower
			pe.SeparationSuction = e.SeparationUpper
			if st.Inverted {
				pe.SeparationSuction = e.SeparationLower
			}
		}
	} else {
		p.Converged = true
		p.Cl, p.Cm = res.Solution.Cl, res.Solution.Cm
		for i, e := range res.Solution.Elements {
			p.Elements[i].Cl = e.Cl
		}
	}
	if f := res.Forces; f != nil {
		p.LiftPerSpan, p.DownforcePerSpan, p.DragPerSpan = f.LiftPerSpan, f.DownforcePerSpan, f.DragPerSpan
	}
}

// runColdFirst is Run started as a fresh engine's is (the viscous
// solution from the march, so that a point that converges there is
// `solve`'s answer exactly), and, when the viscous solution did not
// converge, run again from the engine's last converged neighbour (Run's
// warm start, when the neighbour is near and shares the system). warmed
// reports that the result is the second run's, converged from that
// neighbour.
func (e *Engine) runColdFirst(ctx context.Context, req Request) (res *Result, warmed bool, err error) {
	warm := e.warm
	e.warm = nil
	res, err = e.Run(ctx, req)
	if err != nil || res.Coupled == nil || res.Coupled.Converged || warm == nil {
		return res, false, err
	}
	if e.warm == nil { // Run did not move to another system or converge
		e.warm = warm
	}
	again, err := e.Run(ctx, req)
	if err != nil {
		return nil, false, err
	}
	if again.Coupled.Converged {
		return again, true, nil
	}
	return res, false, nil
}
