package session

import (
	"math"

	"sectionbench/export/figure"
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
func coupledSweepOf(res *engine.Result) *coupledSweep {
	if res == nil || len(res.SweepCoupled) == 0 {
		return nil
	}
	return &coupledSweep{rows: res.SweepCoupled, clMax: res.ClMax, alphaClMax: res.AlphaClMax, peak: res.ClMaxIsPeak}
}

// addTo puts the coupled sweep into a scene whose sweep it belongs to.
func (cs *coupledSweep) addTo(sc *figure.Scene) {
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

// AddSweepTo puts the sweep shown in the polar into res: its rows, the
// boundary-layer estimate's and the coupled solution's when they ran,
// and the coupled sweep's maximum lift, so that what is written from res
// (the team report) says what the window shows. A report written from the
// window said "margin to maximum lift not known" beside a polar marking
// it, as it took the sweep's rows but not its coupled solution.
func (c *Controller) AddSweepTo(res *engine.Result) {
	c.mu.Lock()
	defer c.mu.Unlock()
	res.Sweep, res.SweepViscous = c.sweep, c.sweepVis
	if len(res.SweepViscous) != len(res.Sweep) {
		res.SweepViscous = nil
	}
	res.SweepCoupled, res.ClMax, res.AlphaClMax, res.ClMaxIsPeak = nil, math.NaN(), math.NaN(), false
	if cs := c.sweepCpl; cs != nil && len(cs.rows) == len(c.sweep) {
		res.SweepCoupled, res.ClMax, res.AlphaClMax, res.ClMaxIsPeak = cs.rows, cs.clMax, cs.alphaClMax, cs.peak
	}
}
