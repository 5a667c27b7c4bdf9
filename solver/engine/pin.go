package engine

import (
	"sectionbench/model"
	"sectionbench/solver"
)

// PinOf freezes a result for comparison: the panel method's Cp on every
// element's upper and lower surface (x/c, Cp) and the polar of sweep
// (α, Cl, Cm), under label. The workbench's Pin and the command line's
// search --pin-start both make their pins here.
func PinOf(label string, res *Result, sweep []solver.Coefficients) model.Pin {
	pin := model.Pin{Label: label}
	for _, e := range res.Solution.Elements {
		for _, side := range []solver.Side{solver.Upper, solver.Lower} {
			pc := model.PinCurve{Element: e.Name, Side: side.String()}
			for _, p := range e.Panels {
				if p.Side == side {
					pc.Points = append(pc.Points, [2]float64{p.XC, p.Cp})
				}
			}
			pin.Cp = append(pin.Cp, pc)
		}
	}
	for _, k := range sweep {
		pin.Polar = append(pin.Polar, [3]float64{k.AlphaDeg, k.Cl, k.Cm})
	}
	return pin
}
