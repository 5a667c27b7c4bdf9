package engine

import (
	"cmp"
	"context"
	"errors"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sync"

	"gonum.org/v1/gonum/optimize"

	"sectionbench/model"
)

// Objective is what a setting search optimises.
type Objective string

// The objectives.
const (
	// ObjectiveDownforce maximises the load the wing is mounted for:
	// downforce on an inverted wing, lift on an upright one (N/m of span
	// with a speed, else the coefficient).
	ObjectiveDownforce Objective = "downforce"
	// ObjectiveLiftToDrag maximises that load over the drag (Cl/Cd, with
	// −Cl on an inverted wing).
	ObjectiveLiftToDrag Objective = "lift-to-drag"
	// ObjectiveDrag minimises the drag (N/m, else Cd) while the load is at
	// least SearchOptions.DownforceTarget (by default the start's).
	ObjectiveDrag Objective = "drag"
)

// ErrObjective reports an objective the search does not know.
var ErrObjective = errors.New("not an objective (want downforce, lift-to-drag or drag)")

// ParseObjective reads an objective's name.
func ParseObjective(s string) (Objective, error) {
	switch o := Objective(s); o {
	case ObjectiveDownforce, ObjectiveLiftToDrag, ObjectiveDrag:
		return o, nil
	}
	return "", fmt.Errorf("%q: %w", s, ErrObjective)
}

// SearchOptions are the settings of a setting search.
type SearchOptions struct {
	PointOptions
	Objective Objective
	// DownforceTarget is the least load (downforce inverted, lift
	// upright) a point of the drag objective must give: N/m of span when
	// the study has a speed, else the load coefficient (−Cl inverted).
	// 0 means the start's own load (none when the start did not
	// converge: SearchResult.Target says which).
	DownforceTarget float64
	// AttachedToXC, when positive, asks every element's suction side to
	// stay attached at least to this x/c (Point.AttachedTo); it needs the
	// viscous solution. Every point must converge in any case.
	AttachedToXC float64
	// MinGapMM, when positive, is the least slot gap (model.Slot) behind
	// every element after the first: a manufacturing minimum.
	MinGapMM float64
	// MinClearanceMM, when positive, is the least ground clearance (the
	// ground to the configuration's lowest point at the point's angle);
	// the study's own minimum (model.MinGroundClearanceChords) holds
	// always.
	MinClearanceMM float64
	// MaxEvaluations bounds the solves; 0 means DefaultSearchEvaluations.
	MaxEvaluations int
	// Tolerance ends the search when the best value has improved by less
	// than this fraction of itself over searchStallIterations simplex
	// steps per variable; 0 means DefaultSearchTolerance.
	Tolerance float64
	// PreferReproducible: when a single solve (`solve`, what Apply
	// shows) of the best setting found lands on another root or has no
	// answer, the best of the path's other settings that meet every
	// constraint and that a single solve reproduces takes its place
	// (SearchResult.Unreproduced keeps the first). Settings solved from
	// their own start are reproduced already; of the others at most
	// ReproducibleTries are solved again to be compared, best first.
	PreferReproducible bool
}

// Defaults of a search: a budget of 60 solves and a relative improvement
// of 1e-4 (a tenth of a newton on a wing making 1 kN/m; far below the
// method's uncertainty) over 5 simplex steps per variable. Measured on
// BenchmarkSearchThreeVariables (three variables of the two-element
// example, each solve started from the nearest one solved): with 120
// solves and 10 steps per variable, the best setting was found at the
// 20th solve and the 100 after it improved nothing; 60 solves are 20 per
// variable there.
const (
	DefaultSearchEvaluations = 60
	DefaultSearchTolerance   = 1e-4
	searchStallIterations    = 5
	// simplexSize is the initial simplex's edge as a fraction of each
	// variable's bounds: large enough to see past the solver's noise of
	// convergence, small enough to stay near the start.
	simplexSize = 0.25
)

// OptionError reports search options that cannot be used together with
// the study, naming the option.
type OptionError struct {
	Option string
	Err    error
}

func (e *OptionError) Error() string { return e.Option + ": " + e.Err.Error() }

// SearchResult is a search's answer.
type SearchResult struct {
	Start Point // the study's own setting (moved inside the bounds)
	Best  Point // the best point that meets every constraint; Start if none does
	// Feasible is false when no point met every constraint: Best is then
	// the start and says nothing better was found.
	Feasible bool
	// Path holds every solve in the order made (Start first); Evaluations
	// is its length.
	Path        []Point
	Evaluations int
	// Status says in words why the search stopped.
	Status string
	// Target is the drag objective's least load as used (the option, or
	// the start's load); NaN for the other objectives or when the start
	// gave none.
	Target float64
	// Unreproduced is, with SearchOptions.PreferReproducible, the best
	// setting found when a single solve did not reproduce it and Best is
	// another that one does; nil otherwise.
	Unreproduced *Point
}

// evalFunc solves one setting (values parallel to the bounds); only
// cancellation is an error.
type evalFunc func(ctx context.Context, values []float64) (Point, error)

// Search looks for the setting of the bounded variables (model.SetupRange
// from model.ParseSetupBounds) that best meets opt.Objective under the
// constraints (every point converged, attached to opt.AttachedToXC on
// every suction side, slot gaps at least opt.MinGapMM, clearance at least
// opt.MinClearanceMM, and for the drag objective the load at least
// opt.DownforceTarget), starting from the study's own setting.
//
// The method is Nelder and Mead's simplex (gonum/optimize.NelderMead), a
// derivative-free method: it finds a local optimum near the start, not
// necessarily the best setting within the bounds; a map of the same
// bounds shows whether there is a better one elsewhere. The variables are
// scaled to [0, 1] across their bounds. Bounds and constraints are kept by
// penalty: a point outside the bounds is given a value worse than any
// inside without being solved; a point that is solved but breaks a
// constraint (or does not converge) is given a value worse than any point
// that meets them, growing with how far it misses (the separation's x/c,
// the gap's and clearance's millimetres, the load's shortfall), so the
// simplex moves back towards what is allowed. The start's simplex (the
// start and one step of a quarter of the bounds along each variable, into
// the bounds) is solved on two goroutines; the simplex steps after it are
// one solve at a time.
//
// Warm starts: the start is solved as `solve` solves it; every other
// solve starts from the converged solution of the nearest setting solved
// before it within searchSeedReach (in the bounds' scale; the start's
// simplex from the start, the steps after it from the whole path so
// far), and, when that does not converge, from the next nearest within
// rescueIterations, as a map's points do (Map); a solve with no solved
// setting that near is solved as `solve` solves it. Once the simplex has
// shrunk, a step costs a warm solve, not a start from the march. Which solution a solve starts from does not
// depend on how the goroutines ran. The best setting found is then
// solved as `solve` solves it and compared (Point.Single: a start from
// elsewhere can reach another root of the coupled equations), since
// that is what Apply shows; with opt.PreferReproducible a best setting
// it does not reproduce gives way to the best one it does
// (preferReproduced).
//
// When no point of the start's simplex converges the search stops there
// (points that do not converge all rank alike, so the simplex has no
// direction to go) and says so in Status.
//
// each, if not nil, is called with every solve as it is made, one call at
// a time. Cancellation returns ctx.Err().
func Search(ctx context.Context, st *model.Study, secs []*model.Section, bounds []model.SetupRange, opt SearchOptions, each func(Point)) (*SearchResult, error) {
	if len(bounds) == 0 {
		panic("engine: Search: no variables")
	}
	if err := st.CheckSetup(bounds); err != nil {
		return nil, err
	}
	vars := make([]model.SetupVariable, len(bounds))
	start := make([]float64, len(bounds))
	for i, b := range bounds {
		if !(b.From < b.To) {
			panic("engine: Search: bounds must have lo < hi")
		}
		vars[i] = b.Var
		start[i] = math.Min(math.Max(st.SetupValue(b.Var, secs), b.From), b.To)
	}
	if err := checkSearchOptions(st, vars, opt); err != nil {
		return nil, err
	}
	// One point solver per goroutine of the start's simplex; the first
	// carries on, so its engine keeps its warm start along the path.
	var mu sync.Mutex
	solvers := []*pointSolver{}
	seeds := searchSeeds(bounds, opt.PointOptions)
	newSolver := func() *pointSolver {
		mu.Lock()
		defer mu.Unlock()
		ps := newPointSolver(st, secs, vars, opt.PointOptions)
		solvers = append(solvers, ps)
		return ps
	}
	main := newSolver()
	main.neighbours = seeds.neighbours
	var pending []seed // the start's simplex's solutions, for the path after it
	eval := func(ctx context.Context, values []float64) (Point, error) {
		mu.Lock()
		slices.SortFunc(pending, func(a, b seed) int { return slices.Compare(a.at, b.at) })
		for _, sd := range pending { // in an order of their own, not the goroutines'
			seeds.add(sd.at, sd.sol)
		}
		pending = nil
		mu.Unlock()
		p, err := main.solve(ctx, values)
		if err == nil && seeds != nil {
			seeds.add(values, main.last)
		}
		return p, err
	}
	par := func(ctx context.Context, values []float64) (Point, error) {
		// The start's simplex, solved side by side: each vertex starts
		// from what the path had converged before it (the start), and
		// adds its own solution to the path's only after all are solved
		// (pending), so no vertex's answer depends on another's timing.
		ps := newSolver()
		ps.neighbours = seeds.clone().neighbours
		p, err := ps.solve(ctx, values)
		if err == nil && seeds != nil && ps.last != nil {
			mu.Lock()
			pending = append(pending, seed{at: slices.Clone(values), sol: ps.last})
			mu.Unlock()
		}
		return p, err
	}
	res, err := search(ctx, eval, par, bounds, start, opt, each)
	if err != nil {
		return nil, err
	}
	if b := &res.Best; res.Feasible && b.Viscous && b.Single == SingleNotCompared {
		// The best setting, reached from the path's nearest solve, against
		// a single solve of it: what Apply then shows.
		st, err := main.study(b.Values)
		if err != nil {
			return nil, err
		}
		one, err := NewEngine().Run(ctx, Request{Study: st, Sections: secs, CoupledMaxIterations: opt.CoupledMaxIterations})
		if err != nil {
			return nil, err
		}
		b.judge(one.Coupled)
		res.setPath(*b)
	}
	if opt.PreferReproducible && res.Feasible && res.Best.NotSolve() {
		single := func(values []float64) (*CoupledPoint, error) {
			st, err := main.study(values)
			if err != nil {
				return nil, err
			}
			one, err := NewEngine().Run(ctx, Request{Study: st, Sections: secs, CoupledMaxIterations: opt.CoupledMaxIterations})
			if err != nil {
				return nil, err
			}
			return one.Coupled, nil
		}
		if err := res.preferReproduced(opt, single); err != nil {
			return nil, err
		}
	}
	return res, nil
}

// setPath puts p in place of every solve of the path at its setting.
func (r *SearchResult) setPath(p Point) {
	for i := range r.Path {
		if slices.Equal(r.Path[i].Values, p.Values) {
			r.Path[i] = p
		}
	}
}

// ReproducibleTries is how many settings of a search's path that started
// from a neighbour PreferReproducible solves again to compare, best first:
// each costs a start from the march (1–2 s on the two-element example
// where it converges, the solver's whole fallback where it does not).
const ReproducibleTries = 3

// preferReproduced replaces r.Best, which a single solve does not
// reproduce, by the best setting of the path that meets every
// constraint and that a single solve (single) reproduces: one solved
// from its own start (SingleIdentical), or one that agrees with a single
// solve within SolveAgreementTolerance, comparing at most
// ReproducibleTries. When none does, r.Best stays and r.Status says so.
func (r *SearchResult) preferReproduced(opt SearchOptions, single func([]float64) (*CoupledPoint, error)) error {
	if !math.IsNaN(r.Target) {
		opt.DownforceTarget = r.Target
	}
	type cand struct {
		v float64
		i int
	}
	var cs []cand
	for i, p := range r.Path {
		if v, ok := searchValue(&p, opt); ok && !slices.Equal(p.Values, r.Best.Values) {
			cs = append(cs, cand{v, i})
		}
	}
	slices.SortStableFunc(cs, func(a, b cand) int { return cmp.Compare(a.v, b.v) })
	tries := 0
	var seen [][]float64
	for _, c := range cs {
		p := r.Path[c.i]
		if slices.ContainsFunc(seen, func(v []float64) bool { return slices.Equal(v, p.Values) }) {
			continue
		}
		seen = append(seen, p.Values)
		if p.Single == SingleNotCompared {
			if tries == ReproducibleTries {
				continue
			}
			tries++
			s, err := single(p.Values)
			if err != nil {
				return err
			}
			p.judge(s)
			r.setPath(p)
		}
		if p.Single == SingleIdentical || p.Single == SingleAgrees {
			first := r.Best
			r.Unreproduced, r.Best = &first, p
			r.Status += fmt.Sprintf("; a single solve of the best setting found gives %s, so the best shown is the best setting a single solve reproduces", singleWords(first.Single))
			return nil
		}
	}
	r.Status += fmt.Sprintf("; a single solve of the best setting found gives %s, and of the next best it reproduces none (%d compared)", singleWords(r.Best.Single), tries)
	return nil
}

// singleWords says what a single solve gives for a point that it does
// not reproduce.
func singleWords(s SingleSolve) string {
	if s == SingleNoAnswer {
		return "no answer"
	}
	return "another root"
}

// searchSeeds returns the bank of converged solves of a search's path
// that a solve starts from: the nearest evaluated settings in the
// bounds' scale within searchSeedReach, the newest searchSeedLimit kept;
// nil for an inviscid search.
func searchSeeds(bounds []model.SetupRange, opt PointOptions) *seedBank {
	if opt.Inviscid {
		return nil
	}
	scale := make([]float64, len(bounds))
	for i, b := range bounds {
		scale[i] = b.To - b.From
	}
	return newSeedBank(scale, searchSeedLimit, searchSeedReach)
}

// searchSeedReach is how far, in the bounds' scale (the root of the sum
// of each variable's change squared over its bounds' width squared), a
// solve's setting may lie from the setting whose solution it starts
// from; farther, it is solved as `solve` solves it. Measured on the
// three-variable benchmark (two-element example; deflection, gap and α):
// warm starts 0.01–0.05 away converged in 5–20 Newton iterations, 0.1–0.25
// away (the start's simplex steps a quarter of the bounds) in 90–640 or
// not at all, and a warm start that fails costs the solver's whole
// fallback, 14–28 s of a 200-s search, where a start from the march
// costs 1–2 s; and the one far start that converged highest (441 N/m,
// 0.13 away) lay on another root than `solve`'s, its neighbours 400–410.
const searchSeedReach = 0.1

// searchSeedLimit is how many converged solves a search keeps to start
// from: the simplex's last few vertices and their neighbourhood.
const searchSeedLimit = 12

// checkSearchOptions refuses options the study cannot meet.
func checkSearchOptions(st *model.Study, vars []model.SetupVariable, opt SearchOptions) error {
	if _, err := ParseObjective(string(opt.Objective)); err != nil {
		return &OptionError{Option: "objective", Err: err}
	}
	viscous := ViscousFor(st, opt.PointOptions, vars)
	switch {
	case opt.Objective != ObjectiveDownforce && !viscous:
		return &OptionError{Option: "objective", Err: errors.New("drag needs the viscous solution (a speed or a Reynolds number, and not inviscid)")}
	case opt.AttachedToXC > 0 && !viscous:
		return &OptionError{Option: "attached to x/c", Err: errors.New("separation needs the viscous solution (a speed or a Reynolds number, and not inviscid)")}
	case opt.AttachedToXC < 0 || opt.AttachedToXC > 1 || math.IsNaN(opt.AttachedToXC):
		return &OptionError{Option: "attached to x/c", Err: fmt.Errorf("%g is outside 0 to 1", opt.AttachedToXC)}
	case opt.DownforceTarget < 0 || math.IsNaN(opt.DownforceTarget):
		return &OptionError{Option: "downforce target", Err: errors.New("must not be negative")}
	case opt.MinGapMM < 0 || math.IsNaN(opt.MinGapMM):
		return &OptionError{Option: "minimum gap", Err: errors.New("must not be negative")}
	case opt.MinClearanceMM < 0 || math.IsNaN(opt.MinClearanceMM):
		return &OptionError{Option: "minimum clearance", Err: errors.New("must not be negative")}
	}
	return nil
}

// Penalty levels of the search's value (minimised): any point that meets
// the constraints has a value far below infeasibleValue (loads and drags
// in N/m or coefficients are below 1e5 on any wing the study accepts); a
// point that breaks one is above it by its shortfall; one without a
// converged solution above that; and one outside the bounds above all.
const (
	infeasibleValue   = 1e6
	notConvergedValue = 1e7
	outsideValue      = 1e8
)

// search runs the simplex over eval; par solves the start's simplex
// (possibly concurrently).
func search(ctx context.Context, eval, par evalFunc, bounds []model.SetupRange, start []float64, opt SearchOptions, each func(Point)) (*SearchResult, error) {
	n := len(bounds)
	maxEval := opt.MaxEvaluations
	if maxEval <= 0 {
		maxEval = DefaultSearchEvaluations
	}
	tol := opt.Tolerance
	if tol <= 0 {
		tol = DefaultSearchTolerance
	}
	toX := func(u []float64) []float64 {
		x := make([]float64, n)
		for i, b := range bounds {
			x[i] = b.From + u[i]*(b.To-b.From)
		}
		return x
	}
	res := &SearchResult{Target: math.NaN()}
	var mu sync.Mutex
	bestValue := math.Inf(1)
	record := func(p Point) float64 {
		mu.Lock()
		defer mu.Unlock()
		v, ok := searchValue(&p, opt)
		res.Path = append(res.Path, p)
		if ok && v < bestValue {
			bestValue, res.Best, res.Feasible = v, p, true
		}
		if each != nil {
			each(p)
		}
		return v
	}

	// The start's simplex: the start and a step along each variable,
	// into the bounds.
	u0 := make([]float64, n)
	for i, b := range bounds {
		u0[i] = (start[i] - b.From) / (b.To - b.From)
	}
	verts := make([][]float64, n+1)
	verts[0] = u0
	for i := range n {
		v := append([]float64(nil), u0...)
		if v[i]+simplexSize <= 1 {
			v[i] += simplexSize
		} else {
			v[i] -= simplexSize
		}
		verts[i+1] = v
	}
	pts := make([]Point, n+1)
	errs := make([]error, n+1)
	p0, err := eval(ctx, toX(verts[0]))
	if err != nil {
		return nil, err
	}
	pts[0] = p0
	res.Start = p0
	if opt.Objective == ObjectiveDrag {
		if opt.DownforceTarget == 0 && p0.Converged {
			opt.DownforceTarget = loadOf(&p0) // keep at least the start's load
		}
		if opt.DownforceTarget != 0 {
			res.Target = opt.DownforceTarget
		}
	}
	var wg sync.WaitGroup
	sem := make(chan struct{}, max(1, min(2, runtime.GOMAXPROCS(0))))
	for i := 1; i <= n; i++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			sem <- struct{}{}
			defer func() { <-sem }()
			pts[i], errs[i] = par(ctx, toX(verts[i]))
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	values := make([]float64, n+1)
	for i, p := range pts {
		values[i] = record(p)
	}
	if !res.Feasible {
		res.Best = res.Start
	}
	converged := false
	for _, p := range pts {
		converged = converged || (p.Converged && p.Err == "")
	}
	if !converged {
		// Points that did not converge all rank alike: the simplex has
		// no direction to go, and each further solve would cost the
		// solver's whole iteration budget.
		res.Evaluations = len(res.Path)
		res.Status = "stopped: no point of the start's simplex converged, so there is no direction to search in; no setting met every constraint"
		return res, nil
	}

	var evalErr error
	problem := optimize.Problem{
		Func: func(u []float64) float64 {
			if evalErr != nil {
				return outsideValue
			}
			out := 0.0
			for _, x := range u {
				out += math.Max(0, -x) + math.Max(0, x-1)
			}
			if out > 0 {
				return outsideValue * (1 + out)
			}
			if len(res.Path) >= maxEval {
				return outsideValue // the budget is spent; Status ends the run
			}
			p, err := eval(ctx, toX(u))
			if err != nil {
				evalErr = err
				return outsideValue
			}
			return record(p)
		},
		Status: func() (optimize.Status, error) {
			if evalErr != nil {
				return optimize.Failure, evalErr
			}
			if len(res.Path) >= maxEval {
				return optimize.FunctionEvaluationLimit, nil
			}
			return optimize.NotTerminated, nil
		},
	}
	method := &optimize.NelderMead{InitialVertices: verts, InitialValues: values}
	settings := &optimize.Settings{
		// The start is solved already: Minimize would solve it again.
		InitValues: &optimize.Location{F: values[0]},
		Converger:  &optimize.FunctionConverge{Relative: tol, Absolute: tol * 1e-3, Iterations: searchStallIterations * n},
	}
	r, err := optimize.Minimize(problem, u0, settings, method)
	if evalErr != nil {
		return nil, evalErr
	}
	if err != nil && r == nil {
		return nil, err
	}
	res.Evaluations = len(res.Path)
	if !res.Feasible {
		res.Best = res.Start
	}
	res.Status = searchStatus(r.Status, res)
	return res, nil
}

// searchStatus says why the search stopped, in words.
func searchStatus(s optimize.Status, res *SearchResult) string {
	why := "stopped (" + s.String() + ")"
	switch s {
	case optimize.FunctionConvergence:
		why = "converged: the best value stopped improving (a local optimum)"
	case optimize.FunctionEvaluationLimit:
		why = fmt.Sprintf("stopped at the limit of %d solves; the optimum may lie further", res.Evaluations)
	}
	if !res.Feasible {
		why += "; no setting met every constraint"
	}
	failed := 0
	for _, p := range res.Path {
		if !p.Converged || p.Err != "" {
			failed++
		}
	}
	if failed > 0 && res.Feasible {
		they := "where they lie"
		if failed == 1 {
			they = "where it lies"
		}
		why += fmt.Sprintf("; %d of %d solves did not converge: %s next to the best setting, it may mark the edge of what the solver can answer rather than the wing's optimum", failed, len(res.Path), they)
	}
	return why
}

// searchValue returns the value the search minimises at p and whether p
// meets every constraint.
func searchValue(p *Point, opt SearchOptions) (float64, bool) {
	if p.Err != "" || !p.Converged {
		return notConvergedValue, false
	}
	load := loadOf(p)
	drag := p.DragPerSpan
	if math.IsNaN(drag) {
		drag = p.Cd
	}
	shortfall := 0.0
	if opt.AttachedToXC > 0 {
		for _, e := range p.Elements {
			if e.SeparationSuction < opt.AttachedToXC {
				shortfall += opt.AttachedToXC - e.SeparationSuction
			}
		}
	}
	if opt.MinGapMM > 0 {
		for _, e := range p.Elements[1:] {
			if e.GapMM < opt.MinGapMM {
				shortfall += (opt.MinGapMM - e.GapMM) / opt.MinGapMM
			}
		}
	}
	if opt.MinClearanceMM > 0 && p.ClearanceMM < opt.MinClearanceMM {
		shortfall += (opt.MinClearanceMM - p.ClearanceMM) / opt.MinClearanceMM
	}
	var v float64
	switch opt.Objective {
	case ObjectiveDownforce:
		v = -load
	case ObjectiveLiftToDrag:
		v = -p.Load() / p.Cd
	case ObjectiveDrag:
		v = drag
		if opt.DownforceTarget != 0 && load < opt.DownforceTarget {
			shortfall += (opt.DownforceTarget - load) / opt.DownforceTarget
		}
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return notConvergedValue, false
	}
	if shortfall > 0 {
		return infeasibleValue * (1 + shortfall), false
	}
	return v, true
}

// loadOf is the load the objectives use: downforce on an inverted wing,
// lift on an upright one, in N/m with a speed, else the coefficient.
func loadOf(p *Point) float64 {
	lift := p.LiftPerSpan
	if p.Inverted {
		lift = p.DownforcePerSpan
	}
	if !math.IsNaN(lift) {
		return lift
	}
	return p.Load()
}
