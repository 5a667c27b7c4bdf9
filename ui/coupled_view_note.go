package ui

import (
	figures "sectionbench/export/figure"
)

// coupledViewNote explains an empty boundary-layer view when the coupled
// solution ran, and an empty drag view when the sweep's coupled rows give
// no drag; ok is false when another note applies.
func coupledViewNote(sc *figures.Scene, f figKind, err error) (note string, ok bool) {
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
