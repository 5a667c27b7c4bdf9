package figure

import (
	"math"

	"gonum.org/v1/plot/plotter"

	"sectionbench/solver"
)

// displacementPaths returns, per element of a converged coupled solution,
// its displacement surface and wake in millimetres: the surface stations
// moved outwards along the surface normal by δ* (the displacement body
// the outer flow sees), joined at the trailing edge to the wake's edges,
// its centre line ± half its δ*. Each path runs from the far end of the
// wake along its upper edge to the trailing edge, round the upper surface
// to the stagnation point, back along the lower surface and out along the
// wake's lower edge.
//
// Normals: the contour runs counter-clockwise (upper surface from the
// trailing edge to the leading edge first), so along the stations' order,
// away from the stagnation point, the outward normal is to the left on
// the upper surface and to the right on the lower; on the wake, whose
// stations run downstream, the upper edge is to the left.
func displacementPaths(d *solver.CoupledSolution) []plotter.XYs {
	var out []plotter.XYs
	for _, e := range d.Elements {
		up := offsetStations(e.Upper.Stations, e.Chord, 1)
		lo := offsetStations(e.Lower.Stations, e.Chord, -1)
		wu := offsetStations(e.Wake.Stations, 0.5*e.Chord, 1)
		wl := offsetStations(e.Wake.Stations, 0.5*e.Chord, -1)
		if len(up) < 2 || len(lo) < 2 {
			continue
		}
		var path plotter.XYs
		for i := len(wu) - 1; i >= 0; i-- {
			path = append(path, wu[i])
		}
		for i := len(up) - 1; i >= 0; i-- {
			path = append(path, up[i])
		}
		path = append(path, lo...)
		path = append(path, wl...)
		out = append(out, path)
	}
	return out
}

// offsetStations returns the stations' positions (m) moved by δ* (δ*/c
// times scale, in metres) along the normal to the left of the stations'
// order (side 1) or to its right (side −1), in millimetres. The normal at
// a station is that of the chord between its neighbours.
func offsetStations(st []solver.CoupledStation, scale, side float64) plotter.XYs {
	n := len(st)
	xys := make(plotter.XYs, 0, n)
	for i := range st {
		a, b := st[max(i-1, 0)], st[min(i+1, n-1)]
		tx, ty := b.X-a.X, b.Y-a.Y
		l := math.Hypot(tx, ty)
		if l == 0 || math.IsNaN(st[i].DStar) {
			continue
		}
		d := side * st[i].DStar * scale / l
		xys = append(xys, plotter.XY{X: (st[i].X - d*ty) * mmPerM, Y: (st[i].Y + d*tx) * mmPerM})
	}
	return xys
}
