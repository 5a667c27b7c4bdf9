package figure

import (
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"

	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// This file draws the coupled viscous solution (engine.CoupledPoint) in
// the pressure view: the viscous Cp from the coupled stations beside the
// inviscid Cp, in colours and dashes of their own and named in the key.
// Only a converged point is drawn; one that did not converge has no
// stations (Detail is nil) and its state is said in the title.

// coupledDetail returns the converged coupled solution of the scene, nil
// when there is none.
func coupledDetail(sc *Scene) *solver.CoupledSolution {
	if c := sc.Coupled; c != nil && c.Converged && c.Detail != nil {
		return c.Detail
	}
	return nil
}

// stationXYs returns a surface's stations as (abscissa, Cp).
func stationXYs(s solver.CoupledSurface, ab cpAbscissa) plotter.XYs {
	var xys plotter.XYs
	for _, st := range s.Stations {
		x := st.XC
		if !ab.perElement {
			x = (st.X - ab.x0) / ab.cref
		}
		xys = append(xys, plotter.XY{X: x, Y: st.Cp})
	}
	return xys
}

// addViscousCp draws the viscous Cp of the shown elements; it reports
// whether it drew anything (keyViscousCp names it).
func addViscousCp(p *plot.Plot, k *key, sc *Scene, shown []int, ab cpAbscissa, th *theme) bool {
	d := coupledDetail(sc)
	if d == nil {
		return false
	}
	upSty := lineStyle(th.second, widthNormal, nil)
	loSty := lineStyle(th.second, widthNormal, dashLower)
	drawn := false
	for _, i := range shown {
		if i >= len(d.Elements) {
			continue
		}
		e := d.Elements[i]
		up, lo := stationXYs(e.Upper, ab), stationXYs(e.Lower, ab)
		k.keep(up, lo)
		if len(up) > 1 {
			p.Add(newLine(up, upSty))
			drawn = true
		}
		if len(lo) > 1 {
			p.Add(newLine(lo, loSty))
			drawn = true
		}
	}
	return drawn
}

// keyViscousCp names the viscous Cp curves in the key.
func keyViscousCp(k *key, th *theme) {
	k.add("viscous upper (coupled)", legendLine{lineStyle(th.second, widthNormal, nil)})
	k.add("viscous lower (coupled)", legendLine{lineStyle(th.second, widthNormal, dashLower)})
}

// coupledTitle is what the pressure view's title says of the coupled
// solution: its Cl when converged, that it did not converge otherwise.
func coupledTitle(c *engine.CoupledPoint, element int) string {
	if c == nil {
		return ""
	}
	if !c.Converged {
		return "; viscous solution not converged"
	}
	cl := c.Cl
	if element >= 0 && element < len(c.Elements) {
		cl = c.Elements[element].Cl
	}
	return ", viscous " + formatTick(cl, 4)
}
