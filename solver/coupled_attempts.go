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
// made on a state of its own (solveOnce: a cold start, not the march after
// a warm start failed on the same state, which starts from the factors
// that left), so that it is not made again: such a start depends only on
// the flow, the options and the strategy. On a polar the same one came up
// again: an angle's halving solves the angle half way between from the
// march, and the next angle, whose neighbour failed, halves through the
// same angle (on BenchmarkCoupledPolar41TwoElement −10° made −9.5°'s
// marches again, 192 iterations). The outcome is taken again only with
// the same iteration bound: a march that failed within 60 iterations can
// converge within fewer, for iterate keeps the converged state before a
// round that fails (on BenchmarkMapTwoElement20x20 the point at 45 mm,
// 6.5° converges so in its rescue's 30).
type marches struct {
	mu   sync.Mutex
	done map[marchKey]*CoupledSolution
}

type marchKey struct {
	opt string
	st  strategy
}

// get returns a copy of the remembered outcome of the start from the
// march with opt and st, with no iterations, and whether there was one.
func (m *marches) get(opt CoupledOptions, st strategy) (*CoupledSolution, bool) {
	m.mu.Lock()
	defer m.mu.Unlock()
	r, ok := m.done[marchKey{opt: fmt.Sprint(opt), st: st}]
	if !ok {
		return nil, false
	}
	c := *r
	c.Iterations = 0
	return &c, true
}

// put remembers the outcome r of the start from the march with opt and st.
func (m *marches) put(opt CoupledOptions, st strategy, r *CoupledSolution) {
	m.mu.Lock()
	defer m.mu.Unlock()
	if m.done == nil {
		m.done = map[marchKey]*CoupledSolution{}
	}
	m.done[marchKey{opt: fmt.Sprint(opt), st: st}] = r
}
