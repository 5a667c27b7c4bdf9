package figure

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/solver"
)

// ForceCurve is a load against the angle of attack at one speed.
type ForceCurve struct {
	Sweep []solver.Coefficients
	// PerCl is the force of a unit lift coefficient: q × reference chord
	// × span (N), or × 1 m when no span is given (N/m).
	PerCl float64
	// Sign turns the standard-sense lift into the load shown: −1 for the
	// downforce of an inverted wing, +1 for lift.
	Sign     float64
	Name     string  // "Downforce" or "Lift"
	Unit     string  // "N" or "N/m"
	AlphaDeg float64 // the angle solved, marked
	// Marked[i] flags sweep row i as not to be taken at face value (past
	// maximum lift, separated, implausible); nil for none.
	Marked []bool
	// ClViscous[i] is the coupled viscous Cl of sweep row i, NaN where it
	// did not converge; nil without the viscous solution. When given, the
	// viscous load is the curve (rows that did not converge left out) and
	// the inviscid one is drawn thin beside it for comparison.
	ClViscous []float64
}

// ForcePlot draws the load against α: Sign × PerCl × Cl for each sweep
// row (the viscous Cl when fc.ClViscous is given, the inviscid one beside
// it), the angle solved marked and flagged rows drawn as open rings.
func ForcePlot(fc ForceCurve) (*plot.Plot, error) {
	if len(fc.Sweep) == 0 || !(fc.PerCl > 0) || math.IsInf(fc.PerCl, 0) {
		return nil, fmt.Errorf("force curve: %w", ErrNoData)
	}
	if fc.ClViscous != nil && len(fc.ClViscous) != len(fc.Sweep) {
		panic(fmt.Sprintf("figure: %d viscous lift coefficients for %d sweep rows", len(fc.ClViscous), len(fc.Sweep)))
	}
	th := themeFor(false)
	title := fmt.Sprintf("%s against α at the study's speed (2-D)", fc.Name)
	if fc.ClViscous != nil {
		title = fmt.Sprintf("%s against α at the study's speed (2-D, viscous)", fc.Name)
	}
	p := newPlot(th, title, "α, degrees", fmt.Sprintf("%s, %s", fc.Name, fc.Unit))
	all, marked := forceXYs(fc)
	if inv := inviscidForceXYs(fc); inv != nil {
		k := newKey(th, keyTopLeft)
		k.above = true
		vSty, iSty := lineStyle(th.lower, widthNormal, nil), lineStyle(th.upper, widthThin, dashLower)
		p.Add(newLine(inv, iSty))
		k.add("inviscid, for comparison", legendLine{iSty})
		if len(all) > 0 {
			p.Add(newLine(all, vSty), newScatter(all, th.lower, glyphSmall, draw.CircleGlyph{}))
			k.add("viscous (coupled boundary layers)", legendLine{vSty})
		}
		if n := len(fc.Sweep) - len(all); n > 0 {
			p.X.Label.Text += fmt.Sprintf("; %d of %d angles did not converge (left out)", n, len(fc.Sweep))
		}
		p.Add(k)
	} else {
		p.Add(newLine(all, lineStyle(th.upper, widthNormal, nil)), newScatter(all, th.upper, glyphSmall, draw.CircleGlyph{}))
	}
	if len(marked) > 0 {
		p.Add(newScatter(marked, th.accent, glyphMarker, draw.RingGlyph{}))
		p.X.Label.Text += "; rings: marked rows of the sweep table, not to be taken at face value"
	}
	p.Add(alphaMark(th, fc.AlphaDeg))
	p.Add(&refLine{value: 0, style: lineStyle(th.faint, widthThin, nil)})
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.03)
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.06)
	return p, nil
}

// forceXYs are the curve's points, Sign × PerCl × Cl against α (the
// viscous Cl when there is one, rows without it left out), and the marked
// ones.
func forceXYs(fc ForceCurve) (all, marked plotter.XYs) {
	for i, c := range fc.Sweep {
		cl := c.Cl
		if fc.ClViscous != nil {
			cl = fc.ClViscous[i]
		}
		if math.IsNaN(cl) {
			continue
		}
		xy := plotter.XY{X: c.AlphaDeg, Y: fc.Sign * fc.PerCl * cl}
		all = append(all, xy)
		if i < len(fc.Marked) && fc.Marked[i] {
			marked = append(marked, xy)
		}
	}
	return all, marked
}

// inviscidForceXYs is the inviscid load against α drawn beside a viscous
// curve; nil without one.
func inviscidForceXYs(fc ForceCurve) plotter.XYs {
	if fc.ClViscous == nil {
		return nil
	}
	xys := make(plotter.XYs, len(fc.Sweep))
	for i, c := range fc.Sweep {
		xys[i] = plotter.XY{X: c.AlphaDeg, Y: fc.Sign * fc.PerCl * c.Cl}
	}
	return xys
}
