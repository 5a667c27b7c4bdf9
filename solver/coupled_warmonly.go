package solver

import "context"

// SolveCoupledWarm makes one of SolveCoupled's attempts from warm alone,
// with the strategy warm was solved with and none of SolveCoupled's
// fallbacks (other strategies, the halving of an angle step, the start
// from the march, the trip ladder), for a caller with several
// neighbouring solutions to start from (a map's point) that tries each
// cheaply before it pays for the fallbacks of one. Without continuation
// it is the full coupling straight from warm's state, at most
// warmDirectIterations Newton iterations: SolveCoupled's first attempt,
// so that when it converges the answer is SolveCoupled's from warm to
// the last bit, and when it does not a later SolveCoupled from warm
// finds it in warm's record of attempts and does not make it again.
// With continuation it is the continuation from warm's boundary layers
// alone (within opt.MaxIterations), for a caller that made the direct
// attempt already.
//
// tried is false, and nothing was done, where SolveCoupled would not
// start that way: no warm state, a System of other element or panel
// counts, a free-air stagnation point on a node (SolveCoupled solves
// either side of it). A solution that met the tolerance with transition
// held upstream of its e^N position, which SolveCoupled's fallbacks may
// improve on, is returned as not converged. Errors are SolveCoupled's.
func (s *System) SolveCoupledWarm(ctx context.Context, alphaDeg float64, opt CoupledOptions, warm *CoupledSolution, continuation bool) (out *CoupledSolution, tried bool, err error) {
	if warm == nil || warm.state == nil || !s.sameElements(warm.state.sol.sys) {
		return nil, false, nil
	}
	if !s.geo.ground {
		flow, err := s.coupledFlowAt(alphaDeg)
		if err != nil {
			return nil, false, err
		}
		if stagnationOnNode(flow.sol) {
			return nil, false, nil
		}
	}
	steps := warmDirect
	if continuation {
		steps = warmContinuation
	}
	o, err := s.solveOnce(ctx, alphaDeg, opt, warm, steps, false, warm.state.strategy)
	if err != nil {
		return nil, true, err
	}
	if o.Converged && !o.held() {
		out, err := s.finish(ctx, o, o.Iterations)
		return out, true, err
	}
	r := *o
	r.Converged = false
	return &r, true, nil
}
