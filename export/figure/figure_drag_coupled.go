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

// This file draws the drag polar and the lift-to-drag ratio from the
// coupled sweep (Scene.SweepCoupled) when the scene has one: only the rows
// that converged are drawn as values, rows past maximum lift have a
// marker of their own, and the rows that did not converge are counted in
// the key (and crossed on the α axis of the lift-to-drag view).

// dragRow is one converged coupled row with a usable drag: angle of
// attack in degrees, Cl, Cd, and whether it lies past maximum lift.
type dragRow struct {
	alpha, cl, cd float64
	past          bool
}

// coupledDragRows returns the converged rows of the coupled sweep that
// have a finite, positive Cd, in sweep order, and the angles of the rows
// that did not converge. ok is false when the scene has no coupled sweep
// matching its sweep (the estimate's views apply then).
func coupledDragRows(sc *Scene) (rows []dragRow, failed []float64, ok bool) {
	if len(sc.SweepCoupled) == 0 || len(sc.SweepCoupled) != len(sc.Sweep) {
		return nil, nil, false
	}
	for _, r := range sc.SweepCoupled {
		switch {
		case !r.Converged:
			failed = append(failed, r.AlphaDeg)
		case !math.IsNaN(r.Cd) && !math.IsInf(r.Cd, 0) && r.Cd > 0 && !math.IsNaN(r.Cl):
			rows = append(rows, dragRow{alpha: r.AlphaDeg, cl: r.Cl, cd: r.Cd, past: r.PastClMax})
		}
	}
	return rows, failed, true
}

// liftSign is +1, or −1 on an inverted wing, whose figures give −Cl so
// that more downforce reads as more (as the polar's "most downforce −Cl").
func liftSign(sc *Scene) (float64, string) {
	if sc.Inverted {
		return -1, "−Cl"
	}
	return 1, "Cl"
}

// addDragRows draws xys (one per row, in row order) as a curve with a
// circle at each row up to maximum lift and a triangle past it, and the
// count of rows that did not converge in the key (with crosses on the α
// axis when alphaAxis). It returns the key, to be added last.
func addDragRows(p *plot.Plot, sc *Scene, th *theme, rows []dragRow, xys plotter.XYs, failed []float64, alphaAxis bool, name string) *key {
	k := newKey(th, keyTopLeft)
	sty := lineStyle(th.lower, widthNormal, nil)
	var valid, past plotter.XYs
	for i, r := range rows {
		if r.past {
			past = append(past, xys[i])
		} else {
			valid = append(valid, xys[i])
		}
	}
	k.keep(xys)
	if len(xys) > 1 {
		p.Add(newLine(xys, sty))
	}
	if len(valid) > 0 {
		p.Add(newScatter(valid, th.lower, glyphSmall, draw.CircleGlyph{}))
	}
	k.add(name, legendLine{sty})
	if len(past) > 0 {
		ps := newScatter(past, th.lower, glyphMarker, draw.TriangleGlyph{})
		p.Add(ps)
		k.add("viscous, past maximum lift", ps)
	}
	if len(failed) > 0 {
		b := &bottomMarks{glyph: draw.GlyphStyle{Color: th.accent, Radius: glyphMarker, Shape: draw.CrossGlyph{}}}
		if alphaAxis {
			b.alphas = failed
			for _, a := range failed {
				k.keep(plotter.XYs{{X: a, Y: p.Y.Min}})
			}
		}
		p.Add(b)
		k.add(fmt.Sprintf("viscous not converged (%d of %d angles), not drawn", len(failed), len(sc.SweepCoupled)), b)
	}
	return k
}

// coupledDragPolarPlot draws the coupled sweep's Cl (−Cl inverted)
// against Cd with the angle of best |Cl/Cd| ringed.
func coupledDragPolarPlot(sc *Scene, th *theme, rows []dragRow, failed []float64) (*plot.Plot, error) {
	if len(rows) == 0 {
		return nil, noData(ViewDragPolar, fmt.Sprintf("no converged viscous row in the sweep (%d of %d angles did not converge)", len(failed), len(sc.SweepCoupled)))
	}
	sign, cl := liftSign(sc)
	best, bestLD := 0, math.Inf(-1)
	xys := make(plotter.XYs, len(rows))
	for i, r := range rows {
		xys[i] = plotter.XY{X: r.cd, Y: sign * r.cl}
		if ld := math.Abs(r.cl / r.cd); ld > bestLD {
			best, bestLD = i, ld
		}
	}
	title := fmt.Sprintf("Drag polar, viscous (coupled): best |Cl/Cd| %.1f at α = %s°", bestLD, formatTick(rows[best].alpha, 2))
	p := newPlot(th, title, "Cd (viscous, coupled)", cl)
	k := addDragRows(p, sc, th, rows, xys, failed, false, cl+" against Cd, viscous (coupled)")
	b := plotter.XYs{xys[best]}
	p.Add(newScatter(b, th.accent, glyphMarker, draw.RingGlyph{}))
	p.Add(&note{x: b[0].X, y: b[0].Y, dx: vg.Points(6), text: fmt.Sprintf("α = %s°", formatTick(rows[best].alpha, 2)), style: noteStyle(th, th.accent, 8, text.XLeft, text.YCenter)})
	p.X.Min = math.Min(p.X.Min, 0)
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.04)
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.06)
	p.Add(k)
	return p, nil
}

// coupledLiftToDragPlot draws the coupled sweep's Cl/Cd (−Cl/Cd inverted)
// against α with the current angle marked.
func coupledLiftToDragPlot(sc *Scene, th *theme, rows []dragRow, failed []float64) (*plot.Plot, error) {
	if len(rows) == 0 {
		return nil, noData(ViewLiftToDrag, fmt.Sprintf("no converged viscous row in the sweep (%d of %d angles did not converge)", len(failed), len(sc.SweepCoupled)))
	}
	sign, cl := liftSign(sc)
	xys := make(plotter.XYs, len(rows))
	for i, r := range rows {
		xys[i] = plotter.XY{X: r.alpha, Y: sign * r.cl / r.cd}
	}
	p := newPlot(th, "Lift-to-drag ratio against α, viscous (coupled)", "α, degrees", cl+"/Cd")
	k := addDragRows(p, sc, th, rows, xys, failed, true, cl+"/Cd, viscous (coupled)")
	p.Add(alphaMark(th, sc.AlphaDeg))
	p.Add(&refLine{value: 0, style: lineStyle(th.faint, widthThin, nil)})
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.03)
	p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.06)
	p.Add(k)
	return p, nil
}
