package solver

// StartCopy returns a copy of c that holds only what a solve started
// from it reads (SolveCoupled's warm), for a caller that keeps
// solutions to start later solves from: a map over ride height keeps
// each point's until every point beside it is solved, a row of twenty
// points or more. A solution holds its panel system, the source
// responses of its wakes and the sensitivities of its edge velocities
// to the mass defects (on the two-element example with 160 panels per
// element some 7 MB); the copy holds its boundary-layer variables, its
// stations and stagnation points, its geometry and its edge velocities
// (computed once), well under a megabyte. A solve started from the
// copy gives the answer started from c to the last bit (it reads the
// same numbers).
//
// The copy also keeps its own record of the attempts made from it: c
// keeps every attempt's outcome, with its last state, for as long as c
// lives, which a polar walking one System needs (the next angle
// repeats attempts of the one before), while a caller that starts each
// solve on a System of its own cannot repeat an attempt of an earlier
// solve; started from a StartCopy, what a solve tried is dropped with
// the copy (an attempt is a pure function of its start, angle, System,
// options and steps: the record only saves making one twice).
//
// The copy is no full solution: it has no inviscid solution
// (Inviscid is nil) and no elements' results (Elements is nil); its
// coefficients and verdicts are c's.
func (c *CoupledSolution) StartCopy() *CoupledSolution {
	if c == nil {
		return nil
	}
	d := *c
	d.attempts = &attempts{}
	d.Inviscid, d.Elements = nil, nil
	if c.state != nil {
		d.state = c.state.startCopy()
	}
	return &d
}

// startCopy returns a copy of cs without what a warm start from it
// (solveFrom, warmFrom, warmStagnation, sameElements) does not read:
// the sensitivities d (its edge velocities are computed once and kept
// in ueKept), the flow and source responses, the Newton workspace, and
// of its inviscid solution all but the nodal strengths and the
// geometry of its System.
func (cs *coupledState) startCopy() *coupledState {
	if cs.ueKept != nil {
		return cs // already a copy
	}
	n := *cs
	n.ueKept = cs.ue()
	n.d, n.flow, n.resp, n.warmUe, n.work = nil, nil, nil, nil, newtonWork{}
	sol := Solution{AlphaDeg: cs.sol.AlphaDeg, RefChord: cs.sol.RefChord, g: cs.sol.g, cosA: cs.sol.cosA, sinA: cs.sol.sinA}
	sol.sys = &System{geo: cs.sol.sys.geo}
	n.sol = &sol
	return &n
}
