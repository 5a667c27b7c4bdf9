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
