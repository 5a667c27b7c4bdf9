package ui

import (
	"math"

	"sectionbench/solver/engine"
)

// coupledSweep is the coupled viscous solution of a sweep, kept with the
// polar it belongs to: its rows (parallel to the sweep's angles), its
// maximum lift among the converged rows and whether lift falls after it.
type coupledSweep struct {
	rows              []engine.CoupledPoint
	clMax, alphaClMax float64
	peak              bool
}

// coupledSweepOf returns a result's coupled sweep, nil when it has none.
func coupledSweepOf(res *engineResult) *coupledSweep {
	if res == nil || len(res.SweepCoupled) == 0 {
		return nil
	}
	return &coupledSweep{rows: res.SweepCoupled, clMax: res.ClMax, alphaClMax: res.AlphaClMax, peak: res.ClMaxIsPeak}
}

// addTo puts the coupled sweep into a scene whose sweep it belongs to.
func (cs *coupledSweep) addTo(sc *scene) {
	if cs == nil || sc == nil || len(cs.rows) != len(sc.Sweep) {
		return
	}
	sc.SweepCoupled, sc.ClMax, sc.AlphaClMax, sc.ClMaxIsPeak = cs.rows, cs.clMax, cs.alphaClMax, cs.peak
}

// SweepCoupled returns the coupled viscous solution at each angle of
// Sweep with the maximum lift among its converged rows (NaN, NaN when
// none converged), or nil when the sweep ran without it.
func (c *Controller) SweepCoupled() (rows []engine.CoupledPoint, clMax, alphaClMax float64) {
	c.mu.Lock()
	defer c.mu.Unlock()
	if c.sweepCpl == nil {
		return nil, math.NaN(), math.NaN()
	}
	return c.sweepCpl.rows, c.sweepCpl.clMax, c.sweepCpl.alphaClMax
}

// coupledViewNote explains an empty boundary-layer view when the coupled
// solution ran, and an empty drag view when the sweep's coupled rows give
// no drag; ok is false when another note applies.
func coupledViewNote(sc *scene, f figKind, err error) (note string, ok bool) {
	if sc == nil || !isNoData(err) {
		return "", false
	}
	switch {
	case (f == figDragPolar || f == figLiftToDrag) && len(sc.SweepCoupled) > 0:
		return "No drag at any angle of the sweep: the viscous solution converged at none of them (see the results table).", true
	case f == figBoundaryLayer && sc.Coupled != nil:
		return "No boundary layer: the viscous solution did not converge at this angle (see the status line).", true
	}
	return "", false
}
