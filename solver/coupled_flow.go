package solver

import (
	"slices"
	"sync"
)

// coupledFlow is what a coupled solution at one angle needs of the
// inviscid flow and what costs most to build (a third of a warm-started
// solution's time at 160 panels): the inviscid solution, the wakes traced
// through it and the source responses on them. It is not changed once
// built, so the coupled states of one angle share it.
type coupledFlow struct {
	sol   *Solution
	wakes []*wakeGeom
	resp  *sourceResponse

	mu   sync.Mutex
	sens []*sensitivities // the layouts' most recent last (layoutSensitivities)

	marches marches // the starts from the march made on this flow (coupled_attempts.go)
}

// sensitivities are the inviscid edge velocities ue0 and their
// sensitivities d = ∂Ue/∂m of one layout of the stations on a flow, which
// its stagnation panels (stag, per element) determine
// (buildSensitivities). Never written once built.
type sensitivities struct {
	stag   []int
	ue0, d []float64
}

// sensCacheSize is how many layouts' sensitivities a flow keeps: the
// attempts at one angle lay the stations out at the inviscid stagnation
// points, at a warm start's and at the coupled ones, and go back to them
// (a start from the march after a failed warm start, a stagnation point
// moving back and forth between two panels); building d, n² numbers,
// came to a tenth of a two-element polar, most of it for layouts built
// before.
const sensCacheSize = 4

// layoutSensitivities returns the flow's sensitivities of the layout at
// stag, built by build if the flow does not hold them.
func (f *coupledFlow) layoutSensitivities(stag []int, build func() *sensitivities) *sensitivities {
	f.mu.Lock()
	for _, s := range f.sens {
		if slices.Equal(s.stag, stag) {
			f.mu.Unlock()
			return s
		}
	}
	f.mu.Unlock()
	s := build()
	s.stag = slices.Clone(stag)
	f.mu.Lock()
	if len(f.sens) == sensCacheSize {
		f.sens = append(f.sens[:0:0], f.sens[1:]...)
	}
	f.sens = append(f.sens, s)
	f.mu.Unlock()
	return s
}

// newCoupledFlow traces the wakes of the inviscid solution sol and builds
// the source responses.
func newCoupledFlow(sol *Solution) (*coupledFlow, error) {
	f := &coupledFlow{sol: sol}
	for k := range sol.sys.geo.elems {
		w, err := traceWake(sol, k)
		if err != nil {
			return nil, err
		}
		f.wakes = append(f.wakes, w)
	}
	f.resp = newSourceResponse(sol, f.wakes)
	return f, nil
}

// flowCacheSize is how many angles' flows a System keeps: one solution's
// attempts visit the angle asked for, the angles of its continuation in α
// between it and the warm start's, and for a stagnation point on a node
// the two angles beside it.
const flowCacheSize = 4

// flowCache keeps the coupled flows of a System's most recent angles, so
// that the strategies and fallbacks of SolveCoupled that start again at
// an angle already solved build its wakes and source responses once.
type flowCache struct {
	mu     sync.Mutex
	recent []*coupledFlow // most recent last
}

// coupledFlowAt returns the coupled flow at alphaDeg, from the cache if it
// holds that angle.
func (s *System) coupledFlowAt(alphaDeg float64) (*coupledFlow, error) {
	c := &s.flows
	c.mu.Lock()
	for i, f := range c.recent {
		if f.sol.AlphaDeg == alphaDeg {
			c.recent = append(append(c.recent[:i:i], c.recent[i+1:]...), f)
			c.mu.Unlock()
			return f, nil
		}
	}
	c.mu.Unlock()
	f, err := newCoupledFlow(s.Solve(alphaDeg))
	if err != nil {
		return nil, err
	}
	c.mu.Lock()
	if len(c.recent) == flowCacheSize {
		c.recent = append(c.recent[:0:0], c.recent[1:]...)
	}
	c.recent = append(c.recent, f)
	c.mu.Unlock()
	return f, nil
}

// clear empties the cache (for benchmarks that time the flow's build).
func (c *flowCache) clear() {
	c.mu.Lock()
	c.recent = nil
	c.mu.Unlock()
}
