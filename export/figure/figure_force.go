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
}

// ForcePlot draws the load against α: Sign × PerCl × Cl for each sweep
// row, the angle solved marked and flagged rows drawn as open rings.
func ForcePlot(fc ForceCurve) (*plot.Plot, error) {
	if len(fc.Sweep) == 0 || !(fc.PerCl > 0) || math.IsInf(fc.PerCl, 0) {
		return nil, fmt.Errorf("force curve: %w", ErrNoData)
	}
	th := themeFor(false)
	p := newPlot(th, fmt.Sprintf("%s against α at the study's speed (2-D)", fc.Name), "α, degrees", fmt.Sprintf("%s, %s", fc.Name, fc.Unit))
	all, marked := forceXYs(fc)
	p.Add(newLine(all, lineStyle(th.upper, widthNormal, nil)), newScatter(all, th.upper, glyphSmall, draw.CircleGlyph{}))
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

// forceXYs are the curve's points, Sign × PerCl × Cl against α, and the
// marked ones.
func forceXYs(fc ForceCurve) (all, marked plotter.XYs) {
	for i, c := range fc.Sweep {
		xy := plotter.XY{X: c.AlphaDeg, Y: fc.Sign * fc.PerCl * c.Cl}
		all = append(all, xy)
		if i < len(fc.Marked) && fc.Marked[i] {
			marked = append(marked, xy)
		}
	}
	return all, marked
}
