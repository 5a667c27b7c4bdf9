package solver

import (
	"fmt"
	"sync"
)

// attempts remembers, on a solution that warm starts are taken from, the
// outcome of each attempt solveOnce made from it, so that the same
// attempt is not made twice. The routes of solveStrategies overlap: the
// continuation from a neighbour starts with the iterations straight from
// it that cheapRoute has just made; the halving of one angle's step
// solves the angle half way between, and the next angle of a polar,
// whose neighbour failed, halves from the same neighbour again (on the
// two-element polar of BenchmarkCoupledPolar41TwoElement a third of the
// iterations were such repeats). An attempt is a pure function of its
// start, its angle, its System, its options, its strategy and its steps,
// so a remembered outcome is the one it would give again.
type attempts struct {
	mu   sync.Mutex
	done map[attemptKey]*CoupledSolution
}

type attemptKey struct {
	sys   *System
	alpha float64
	opt   string
	st    strategy
	steps warmSteps
	cold  bool
}

func newAttemptKey(s *System, alphaDeg float64, opt CoupledOptions, st strategy, steps warmSteps, cold bool) attemptKey {
	return attemptKey{sys: s, alpha: alphaDeg, opt: fmt.Sprint(opt), st: st, steps: steps, cold: cold}
}

// get returns a copy of the remembered outcome of k, with no iterations
// (none were run for it), and whether there was one.
func (a *attempts) get(k attemptKey) (*CoupledSolution, bool) {
	if a == nil {
		return nil, false
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	r, ok := a.done[k]
	if !ok {
		return nil, false
	}
	c := *r
	c.Iterations = 0
	return &c, true
}

// put remembers the outcome r of k. A failed outcome's Newton workspace
// (a few n² numbers) is released: the outcome is kept for its verdict
// and last state, not to iterate on.
func (a *attempts) put(k attemptKey, r *CoupledSolution) {
	if a == nil {
		return
	}
	if !r.Converged && r.state != nil {
		r.state.work.release()
	}
	a.mu.Lock()
	defer a.mu.Unlock()
	if a.done == nil {
		a.done = map[attemptKey]*CoupledSolution{}
	}
	a.done[k] = r
}

// marches remembers, on a flow, the outcome of each start from the march
// made on it (solveOnce), so that it is not made again. The march and
// the iterations from it do not depend on the warm start that failed
// before them (the state is laid out afresh, reset), so the same start
// came up again and again: on a polar, an angle's halving solves the
// angle half way between from the march, and the next angle, whose
// neighbour failed, halves through the same angle (on
// BenchmarkCoupledPolar41TwoElement −9.5° from the march twice, 192
// iterations); on a map, the rescue from a further neighbour ends with
// the same march as the nearest neighbour's attempts (on
// BenchmarkMapTwoElement20x20 every point that did not converge made
// both strategies' marches twice, with the same iterations). The outcome
// is kept with the iteration bound it had: one that failed within a
// bound fails within any lower one (the iterations are the same up to
// it), so a rescue's shorter bound (engine rescueIterations) takes it too.
type marches struct {
	mu   sync.Mutex
	done map[marchKey]marchOutcome
}

type marchKey struct {
	opt string // the options but the iteration bound
	st  strategy
}

type marchOutcome struct {
	sol   *CoupledSolution
	bound int // the iteration bound it was made with
}

func newMarchKey(opt CoupledOptions, st strategy) marchKey {
	opt.MaxIterations = 0
	return marchKey{opt: fmt.Sprint(opt), st: st}
}

// iterationBound returns opt's bound on the Newton iterations.
func iterationBound(opt CoupledOptions) int {
	if opt.MaxIterations > 0 {
		return opt.MaxIterations
	}
	return defaultMaxIter
}

// get returns a copy of the remembered outcome of the start from the
// march with opt and st, with no iterations, if there is one made with
// opt's bound, or one that failed with a bound at least as high.
func (m *marches) get(opt CoupledOptions, st strategy) (*CoupledSolution, bool) {
	m.mu.Lock()
	defer m.mu.Unlock()
	r, ok := m.done[newMarchKey(opt, st)]
	bound := iterationBound(opt)
	if !ok || !(r.bound == bound || !r.sol.Converged && r.bound > bound) {
		return nil, false
	}
	c := *r.sol
	c.Iterations = 0
	return &c, true
}

// put remembers the outcome r of the start from the march with opt and st.
func (m *marches) put(opt CoupledOptions, st strategy, r *CoupledSolution) {
	m.mu.Lock()
	defer m.mu.Unlock()
	if m.done == nil {
		m.done = map[marchKey]marchOutcome{}
	}
	m.done[newMarchKey(opt, st)] = marchOutcome{sol: r, bound: iterationBound(opt)}
}
