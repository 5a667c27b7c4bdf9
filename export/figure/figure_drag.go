package figure

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// dragRows returns the sweep rows that have a finite Cd, as (α, Cl, Cd).
func dragRows(sc *Scene) [][3]float64 {
	var rows [][3]float64
	for i, c := range sc.Sweep {
		if i >= len(sc.SweepViscous) {
			break
		}
		if cd := sc.SweepViscous[i].Cd; !math.IsNaN(cd) && !math.IsInf(cd, 0) && cd > 0 {
			rows = append(rows, [3]float64{c.AlphaDeg, c.Cl, cd})
		}
	}
	return rows
}

// dragPolarPlot draws Cl against Cd with the angle of best |Cl/Cd| marked.
// The lift-to-drag ratio has α as abscissa and so is its own view.
// With a coupled sweep it draws that instead (coupledDragPolarPlot).
func dragPolarPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	if cr, failed, ok := coupledDragRows(sc); ok {
		return coupledDragPolarPlot(sc, th, cr, failed)
	}
	rows := dragRows(sc)
	if len(rows) == 0 {
		return nil, noData(ViewDragPolar, "no drag estimate in the sweep")
	}
	best, bestLD := 0, math.Inf(-1)
	xys := make(plotter.XYs, len(rows))
	for i, r := range rows {
		xys[i] = plotter.XY{X: r[2], Y: r[1]}
		if ld := math.Abs(r[1] / r[2]); ld > bestLD {
			best, bestLD = i, ld
		}
	}
	p := newPlot(th, fmt.Sprintf("Drag polar: best |Cl/Cd| %.1f at α = %s°", bestLD, formatTick(rows[best][0], 2)), "Cd (boundary-layer estimate)"+cutOff(sc, len(rows)), "Cl")
	sty := lineStyle(th.upper, widthNormal, nil)
	p.Add(newLine(xys, sty), newScatter(xys, th.upper, glyphSmall, draw.CircleGlyph{}))
	b := plotter.XYs{xys[best]}
	p.Add(newScatter(b, th.accent, glyphMarker, draw.RingGlyph{}))
	p.Add(&note{x: b[0].X, y: b[0].Y, dx: vg.Points(6), text: fmt.Sprintf("α = %s°", formatTick(rows[best][0], 2)), style: noteStyle(th, th.accent, 8, text.XLeft, text.YCenter)})
	p.X.Min = math.Min(p.X.Min, 0)
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.04)
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.06)
	return p, nil
}

// cutOff says, for the axis label, how many sweep angles a drag figure
// leaves out because the estimate gives no drag there; "" for none.
func cutOff(sc *Scene, drawn int) string {
	n := min(len(sc.Sweep), len(sc.SweepViscous))
	if drawn >= n {
		return ""
	}
	return fmt.Sprintf("; cut off: %d of %d angles left out, no drag where the flow separates", n-drawn, n)
}

// liftToDragPlot draws Cl/Cd against α with the current angle marked.
// With a coupled sweep it draws that instead (coupledLiftToDragPlot).
func liftToDragPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	if cr, failed, ok := coupledDragRows(sc); ok {
		return coupledLiftToDragPlot(sc, th, cr, failed)
	}
	rows := dragRows(sc)
	if len(rows) == 0 {
		return nil, noData(ViewLiftToDrag, "no drag estimate in the sweep")
	}
	xys := make(plotter.XYs, len(rows))
	for i, r := range rows {
		xys[i] = plotter.XY{X: r[0], Y: r[1] / r[2]}
	}
	p := newPlot(th, "Lift-to-drag ratio against α", "α, degrees"+cutOff(sc, len(rows)), "Cl/Cd")
	p.Add(newLine(xys, lineStyle(th.upper, widthNormal, nil)), newScatter(xys, th.upper, glyphSmall, draw.CircleGlyph{}))
	p.Add(alphaMark(th, sc.AlphaDeg))
	p.Add(&refLine{value: 0, style: lineStyle(th.faint, widthThin, nil)})
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.03)
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.06)
	return p, nil
}
