package engine

import (
	"context"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"sectionbench/model"
	"sectionbench/solver"
)

// Request is everything one update of the workbench asks for.
type Request struct {
	Study       *model.Study
	Sections    []*model.Section     // cleaned unit-chord sections, one per study element
	Sweep       bool                 // also run the study's sweep
	Streamlines bool                 // also trace streamlines
	Stream      solver.StreamOptions // zero value: solver.DefaultBounds and default counts
	// Progress, if not nil, is called after each angle of a sweep that
	// needs one solve per angle (in ground effect, or with the boundary
	// layer on).
	Progress func(done, total int)
	// CoupledMaxIterations bounds the coupled solution's Newton
	// iterations per attempt; 0 is the solver's default. For tests that
	// need a point that does not converge; not a user setting.
	CoupledMaxIterations int
}

// Result is one update's answer.
type Result struct {
	Layout       *model.Layout
	Config       solver.Config    // what was solved at the study's angle of attack
	Solution     *solver.Solution // at the study's angle of attack
	Sweep        []solver.Coefficients
	SweepViscous []ViscousPoint // parallel to Sweep when the boundary layer is on
	Streamlines  []solver.Streamline
	Viscous      *solver.ViscousResult // nil unless the study enables the boundary-layer estimate
	// Coupled is the coupled viscous solution at the study's angle; nil
	// unless the study enables the viscous solution in coupled mode.
	// Solution stays the inviscid one, beside it.
	Coupled *CoupledPoint
	// SweepCoupled is the coupled solution at each angle of Sweep (in
	// coupled mode), with ClMax and AlphaClMax its maximum lift and angle
	// among the converged rows (NaN when none converged; see ClMax) and
	// ClMaxIsPeak whether lift falls after it inside the sweep.
	SweepCoupled      []CoupledPoint
	ClMax, AlphaClMax float64
	ClMaxIsPeak       bool
	Reynolds          []float64     // per element on its own chord; nil when neither speed nor Re is known
	Forces            *Forces       // nil unless the study has a speed
	Elapsed           time.Duration // solve time (not drawing)
}

// ViscousPoint is the boundary-layer estimate at one angle of a sweep.
type ViscousPoint struct {
	AlphaDeg        float64
	Cd              float64 // NaN when a surface separated (outside the method's range)
	TransitionUpper float64 // x/c on the main element, NaN if none
	TransitionLower float64
	SeparationUpper float64
	SeparationLower float64
	Valid           bool
	// Separated is true when some element's layer separates ahead of
	// SeparatedFromXC (all elements, not only the main one).
	Separated bool
	Note      string // why the estimate failed at this angle, when it did
}

// Engine turns study states into results. It keeps the last placed layout
// and factorised system, so an update that only changes the angle of attack
// (in free air) costs one superposition, not a new factorisation. An Engine
// is used by one goroutine at a time.
type Engine struct {
	geomKey string
	secs    []*model.Section // the sections the cached layout was placed from, held so no other section can take their addresses
	layout  *model.Layout
	sys     *solver.System // free air only
	sysCfg  solver.Config

	// The last converged coupled solution of sys, its study angle and
	// the options it was solved with, for warm starts (coupledAt).
	warm      *solver.CoupledSolution
	warmAlpha float64
	warmKey   string

	// seed, when set, is a converged coupled solution of a neighbouring
	// setting (another system with as many elements and panels) that the
	// next coupled solve starts from instead of its own start, and
	// seedMore, if not nil, gives the next nearest when that does not
	// converge (runFromSeeds, fromSeeds); rescueMax bounds the
	// iterations of the starts from those. seedFrom is the one the solve
	// converged from (0 seed, i seedMore's i−1; −1: none).
	seed      *solver.CoupledSolution
	seedMore  func() []*solver.CoupledSolution
	rescueMax int
	seedFrom  int
}

// NewEngine returns an engine with nothing cached.
func NewEngine() *Engine { return &Engine{} }

// geometryKey identifies the study fields the placed geometry depends on.
// Each element's section enters by its source's name only: the section
// itself is compared by identity (slices.Equal on the pointers), which is cheaper than
// encoding embedded points on every update.
func geometryKey(st *model.Study) string {
	type elem struct {
		Name, Source                string
		ChordMM, XMM, YMM, AngleDeg float64
	}
	es := make([]elem, len(st.Elements))
	for i, e := range st.Elements {
		es[i] = elem{e.Name, e.Section.String(), e.ChordMM, e.XMM, e.YMM, e.AngleDeg}
	}
	b, err := json.Marshal(struct {
		E []elem
		P model.Panelling
		I bool
		G model.Ground
		R float64
	}{es, st.Panelling, st.Inverted, st.Ground, st.ReferenceChordMM})
	if err != nil {
		panic("solver: study cannot be encoded: " + err.Error())
	}
	return string(b)
}

// Run solves the study at its angle of attack and, as asked, its sweep and
// streamlines, the boundary-layer estimate and the forces. The context is
// checked between the stages (after placement, after the factorisation,
// at each angle of a sweep, inside the assembly of each system
// (solver.NewSystemContext) and by the coupled solution): a cancelled run
// returns ctx.Err() within one stage; a factorisation once started runs
// to its end. A run cancelled part-way leaves the engine's cache
// consistent.
func (e *Engine) Run(ctx context.Context, req Request) (*Result, error) {
	start := time.Now()
	st := req.Study
	if err := st.Validate(); err != nil {
		return nil, err
	}
	if err := st.CheckFlow(); err != nil {
		return nil, err
	}
	key := geometryKey(st)
	if key != e.geomKey || !slices.Equal(req.Sections, e.secs) {
		l, err := model.Place(st, req.Sections)
		if err != nil {
			return nil, err
		}
		e.geomKey, e.layout, e.sys, e.warm = key, l, nil, nil
		e.secs = append([]*model.Section(nil), req.Sections...)
	}
	l := e.layout
	res := &Result{Layout: l}
	// A superseded run stops between stages and inside the assembly
	// (solver.NewSystemContext).
	if err := ctx.Err(); err != nil {
		return nil, err
	}

	sol, cfg, sys, err := e.solveAt(ctx, st.Flow.AlphaDeg)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	if err := checkFinite(sol); err != nil {
		return nil, err
	}
	if w := model.LiftDisagreement(sol.Cl, sol.ClPressure); w != "" {
		sol.Warnings = append(sol.Warnings, w)
	}
	res.Solution, res.Config = sol, cfg

	res.Reynolds = reynolds(st, l)
	var vopt solver.ViscousOptions
	var copt solver.CoupledOptions
	coupled := st.Viscous.Enabled && st.Viscous.IsCoupled()
	if st.Viscous.Enabled {
		if res.Reynolds == nil {
			return nil, &model.FieldError{Field: "flow.speed_mps", Err: fmt.Errorf("the viscous solution needs a speed or a Reynolds number")}
		}
	}
	switch {
	case coupled:
		copt = coupledOptions(st, res.Reynolds, req.CoupledMaxIterations)
		_, _, fs := e.layout.At(st.Flow.AlphaDeg)
		p, err := e.coupledAt(ctx, sys, st.Flow.AlphaDeg, fs, copt, fmt.Sprint(copt))
		if err != nil {
			return nil, err
		}
		res.Coupled = &p
	case st.Viscous.Enabled:
		vopt = solver.ViscousOptions{Re: res.Reynolds, TripUpper: st.Viscous.TripUpper, TripLower: st.Viscous.TripLower, TurbulentSeparationH: st.Viscous.SeparationH}
		v, err := sol.Viscous(vopt)
		if err != nil {
			return nil, err
		}
		res.Viscous = v
	}
	res.ClMax, res.AlphaClMax = math.NaN(), math.NaN()
	if req.Sweep {
		if err := e.sweep(ctx, st, req, res, vopt); err != nil {
			return nil, err
		}
		if coupled {
			if res.SweepCoupled, err = e.coupledSweep(ctx, res.sweepAngles(), copt, req.Progress); err != nil {
				return nil, err
			}
			res.ClMax, res.AlphaClMax, res.ClMaxIsPeak = ClMax(res.SweepCoupled, st.Inverted)
			markPastClMax(res.SweepCoupled, res.AlphaClMax, res.ClMaxIsPeak)
			res.Coupled.PastClMax = res.ClMaxIsPeak && st.Flow.AlphaDeg > res.AlphaClMax
		}
	}
	if req.Streamlines {
		opt := req.Stream
		if opt.Bounds == (solver.Rect{}) {
			opt.Bounds = solver.DefaultBounds(cfg)
		}
		res.Streamlines = sol.Streamlines(opt)
	}
	if st.Flow.SpeedMPS > 0 {
		res.Forces = forces(st, l, sol, res.Viscous, res.Coupled)
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	res.Elapsed = time.Since(start)
	return res, nil
}

// solveAt solves the current layout at one angle of attack, reusing the
// free-air factorisation, and returns the system it solved.
func (e *Engine) solveAt(ctx context.Context, alphaDeg float64) (*solver.Solution, solver.Config, *solver.System, error) {
	l := e.layout
	if !l.Ground {
		if e.sys == nil {
			cfg, _ := solver.LayoutConfig(l, 0)
			sys, err := solver.NewSystemContext(ctx, cfg)
			if err != nil {
				return nil, solver.Config{}, nil, err
			}
			e.sys, e.sysCfg = sys, cfg
		}
		_, _, fs := l.At(alphaDeg)
		sol := e.sys.Solve(fs)
		sol.AlphaDeg = alphaDeg
		return sol, e.sysCfg, e.sys, nil
	}
	cfg, fs := solver.LayoutConfig(l, alphaDeg)
	sys, err := solver.NewSystemContext(ctx, cfg)
	if err != nil {
		return nil, solver.Config{}, nil, err
	}
	sol := sys.Solve(fs)
	sol.AlphaDeg = alphaDeg
	return sol, cfg, sys, nil
}

// groundSystem builds the system of the configuration pitched to
// alphaDeg above the ground and returns it with its freestream angle.
func (e *Engine) groundSystem(ctx context.Context, alphaDeg float64) (*solver.System, float64, error) {
	cfg, fs := solver.LayoutConfig(e.layout, alphaDeg)
	sys, err := solver.NewSystemContext(ctx, cfg)
	return sys, fs, err
}

// sweepAngles returns the angles of the sweep rows.
func (r *Result) sweepAngles() []float64 {
	a := make([]float64, len(r.Sweep))
	for i, c := range r.Sweep {
		a[i] = c.AlphaDeg
	}
	return a
}

func (e *Engine) sweep(ctx context.Context, st *model.Study, req Request, res *Result, vopt solver.ViscousOptions) error {
	alphas, err := st.Sweep.Angles()
	if err != nil {
		return err
	}
	if !e.layout.Ground && (!st.Viscous.Enabled || st.Viscous.IsCoupled()) {
		fs := make([]float64, len(alphas))
		for i, a := range alphas {
			_, _, fs[i] = e.layout.At(a)
		}
		rows := e.sys.Sweep(fs)
		for i := range rows {
			rows[i].AlphaDeg = alphas[i]
		}
		res.Sweep = rows
		return nil
	}
	for i, a := range alphas {
		if err := ctx.Err(); err != nil {
			return err
		}
		sol, _, _, err := e.solveAt(ctx, a)
		if err != nil {
			return fmt.Errorf("sweep at %g°: %w", a, err)
		}
		res.Sweep = append(res.Sweep, coefficientsOf(sol))
		if st.Viscous.Enabled && !st.Viscous.IsCoupled() {
			res.SweepViscous = append(res.SweepViscous, viscousPoint(a, sol, vopt))
		}
		if req.Progress != nil && !st.Viscous.IsCoupled() { // a coupled sweep reports its own
			req.Progress(i+1, len(alphas))
		}
	}
	return nil
}

func viscousPoint(alpha float64, sol *solver.Solution, opt solver.ViscousOptions) ViscousPoint {
	p := ViscousPoint{AlphaDeg: alpha, Cd: math.NaN(), TransitionUpper: math.NaN(), TransitionLower: math.NaN(), SeparationUpper: math.NaN(), SeparationLower: math.NaN()}
	v, err := sol.Viscous(opt)
	if err != nil {
		p.Note = err.Error()
		return p
	}
	m := v.Elements[0]
	p.TransitionUpper, p.TransitionLower = m.Upper.TransitionXC, m.Lower.TransitionXC
	p.SeparationUpper, p.SeparationLower = m.Upper.TurbulentSeparationXC, m.Lower.TurbulentSeparationXC
	p.Valid = true
	p.Separated = estimateSeparated(v)
	for _, el := range v.Elements {
		p.Valid = p.Valid && el.Valid
	}
	if p.Valid {
		p.Cd = v.Cd
	}
	return p
}

// coefficientsOf sums up a full solution as one sweep row.
func coefficientsOf(sol *solver.Solution) solver.Coefficients {
	c := solver.Coefficients{AlphaDeg: sol.AlphaDeg, Cl: sol.Cl, ClPressure: sol.ClPressure, Cm: sol.Cm, CpMin: math.Inf(1)}
	for _, e := range sol.Elements {
		if e.CpMin < c.CpMin {
			c.CpMin, c.XCpMin = e.CpMin, e.XCpMin
		}
	}
	return c
}

// Density runs the study's density study (st.Density: panel counts, nose
// clustering values and tolerances; defaults where empty) at the study's
// angle of attack, re-placing and re-solving the whole configuration at
// each count. progress is called after each solve.
func (e *Engine) Density(ctx context.Context, st *model.Study, secs []*model.Section, progress func(done, total int)) (*DensityResult, error) {
	return e.DensityEach(ctx, st, secs, progress, nil)
}

// DensityEach is Density that also hands each count's solution to each (if
// not nil), in the order solved, for callers that draw them.
func (e *Engine) DensityEach(ctx context.Context, st *model.Study, secs []*model.Section, progress func(done, total int), each func(panels int, nose float64, sol *solver.Solution)) (*DensityResult, error) {
	if err := st.Validate(); err != nil {
		return nil, err
	}
	if err := st.Density.CheckDensityRuns(len(DefaultDensityPanels)); err != nil {
		return nil, err
	}
	opt := DensityOptions{Panels: st.Density.Panels, Nose: st.Density.Nose, TolClPct: st.Density.TolClPct, TolCpMinPct: st.Density.TolCpMinPct}
	if len(opt.Nose) == 0 {
		opt.Nose = []float64{st.Panelling.Nose}
	}
	// The recommendation judges the panel method; with the coupled
	// viscous solution on, each count solves it too, for its Cl and Cd's
	// own convergence (DensitySeries.ViscousCl, ViscousCd).
	coupled := st.Viscous.Enabled && st.Viscous.IsCoupled()
	solve := func(panels int, nose float64) (*solver.Solution, *CoupledPoint, error) {
		s := st.Clone()
		s.Panelling.Panels, s.Panelling.Nose = panels, nose
		s.Viscous.Enabled = coupled
		r, err := NewEngine().Run(ctx, Request{Study: s, Sections: secs})
		if err != nil {
			return nil, nil, err
		}
		if each != nil {
			each(panels, nose, r.Solution)
		}
		return r.Solution, r.Coupled, nil
	}
	return DensityStudy(ctx, opt, solve, progress)
}

// ErrNonFiniteResult reports a solution with NaN or infinite values: a
// guard against returning a silent wrong answer from a degenerate system.
var ErrNonFiniteResult = errors.New("the solution has values that are not finite numbers")

// checkFinite returns an error naming the first element and quantity of sol
// that is NaN or infinite.
func checkFinite(sol *solver.Solution) error {
	bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }
	if bad(sol.Cl) || bad(sol.ClPressure) || bad(sol.Cm) {
		return fmt.Errorf("configuration coefficients: %w", ErrNonFiniteResult)
	}
	for _, e := range sol.Elements {
		for i, p := range e.Panels {
			if bad(p.Cp) || bad(p.Vt) {
				return fmt.Errorf("element %q, panel %d: %w", e.Name, i+1, ErrNonFiniteResult)
			}
		}
	}
	return nil
}
