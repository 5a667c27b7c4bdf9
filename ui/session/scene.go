package session

import (
	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// sceneOf gathers what the views draw from a result and the study solved
// (figure.NewScene, as the report and the command line do), with the
// sweep the controller holds for that study instead of the result's: a
// live update carries no sweep when the last one was run by RunSweep.
// The boundary-layer estimate of the sweep (vis) and its coupled solution
// (cpl) are drawn only when they belong to it.
func sceneOf(res *engine.Result, st *model.Study, sweep []solver.Coefficients, vis []engine.ViscousPoint, cpl *coupledSweep) *figure.Scene {
	sc := figure.NewScene(res, st)
	sc.Sweep, sc.SweepViscous = sweep, nil
	if len(vis) == len(sweep) {
		sc.SweepViscous = vis
	}
	sc.SweepCoupled, sc.ClMax, sc.AlphaClMax, sc.ClMaxIsPeak = nil, 0, 0, false
	cpl.addTo(sc)
	return sc
}
