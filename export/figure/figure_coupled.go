package figure

import (
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

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
//
// A converged point's title gives the inviscid Cl it is compared with,
// the one the status line and the results give beside the viscous Cl
// (both from the surface pressure), instead of the Cl from circulation:
// they differ in the fourth digit, and the views read 2.8980 against
// 2.897 (ok false: the title keeps its Cl from circulation).
func coupledTitle(c *engine.CoupledPoint, element int) (s string, ok bool) {
	if c == nil {
		return "", false
	}
	if !c.Converged {
		return "; viscous solution not converged", false
	}
	cl, inv := c.Cl, c.ClInviscid
	if element >= 0 && element < len(c.Elements) {
		cl, inv = c.Elements[element].Cl, c.Elements[element].ClInviscid
	}
	return "Cl inviscid " + formatTick(inv, 4) + ", viscous " + formatTick(cl, 4), true
}

// coupledRows returns the converged rows of the scene's coupled sweep as
// (α, Cl) and (α, Cm), split into rows up to maximum lift and rows past
// it (cm in the same order: valid, then past), and the angles of the
// rows that did not converge. All are empty
// unless the coupled sweep matches the sweep.
func coupledRows(sc *Scene) (valid, past plotter.XYs, cm []plotter.XY, failed []float64) {
	if len(sc.SweepCoupled) == 0 || len(sc.SweepCoupled) != len(sc.Sweep) {
		return nil, nil, nil, nil
	}
	var pastCm []plotter.XY
	for _, r := range sc.SweepCoupled {
		switch {
		case !r.Converged:
			failed = append(failed, r.AlphaDeg)
		case r.PastClMax:
			past = append(past, plotter.XY{X: r.AlphaDeg, Y: r.Cl})
			pastCm = append(pastCm, plotter.XY{X: r.AlphaDeg, Y: r.Cm})
		default:
			valid = append(valid, plotter.XY{X: r.AlphaDeg, Y: r.Cl})
			cm = append(cm, plotter.XY{X: r.AlphaDeg, Y: r.Cm})
		}
	}
	return valid, past, append(cm, pastCm...), failed
}

// separatedRows are the converged rows of the coupled sweep whose flow
// separates ahead of engine.SeparatedFromXC (CoupledPoint.Facts), at their
// viscous Cl.
func separatedRows(sc *Scene) plotter.XYs {
	return convergedRowsWhere(sc, func(r *engine.CoupledPoint) bool { return r.Facts().Separated })
}

// heldRows returns the converged coupled rows whose transition is held
// upstream of its e^N position (engine.CoupledPoint.Held): the
// free-transition solution did not converge there, and the row is the
// answer of a wing tripped at that station (the sweep table's
// "transition held upstream" flag). The polar drew them as ordinary rows.
func heldRows(sc *Scene) plotter.XYs {
	return convergedRowsWhere(sc, (*engine.CoupledPoint).Held)
}

// convergedRowsWhere returns the converged rows of the coupled sweep for
// which keep holds, at their viscous Cl (none when the coupled sweep is
// not the sweep's).
func convergedRowsWhere(sc *Scene, keep func(*engine.CoupledPoint) bool) plotter.XYs {
	if len(sc.SweepCoupled) != len(sc.Sweep) {
		return nil
	}
	var out plotter.XYs
	for i := range sc.SweepCoupled {
		if r := &sc.SweepCoupled[i]; r.Converged && keep(r) {
			out = append(out, plotter.XY{X: r.AlphaDeg, Y: r.Cl})
		}
	}
	return out
}

// bottomMarks draws a glyph on the bottom edge of the data area at each
// angle: the angles where the viscous solution gave no answer, marked
// without a value that could be read as one.
type bottomMarks struct {
	alphas []float64
	glyph  draw.GlyphStyle
}

func (b *bottomMarks) Plot(c draw.Canvas, p *plot.Plot) {
	trX, _ := p.Transforms(&c)
	for _, a := range b.alphas {
		pt := vg.Point{X: trX(a), Y: c.Min.Y + 2*b.glyph.Radius}
		if c.Contains(pt) {
			c.DrawGlyph(b.glyph, pt)
		}
	}
}

// Thumbnail draws the glyph in the key.
func (b *bottomMarks) Thumbnail(c *draw.Canvas) { c.DrawGlyph(b.glyph, c.Center()) }

// addCoupledPolar draws the coupled sweep on the polar: the viscous Cl of
// the converged rows as a curve, rows past maximum lift in a marker of
// their own, maximum lift marked and labelled, and the rows that did not
// converge as crosses on the α axis. It reports whether it drew the
// viscous curve.
func addCoupledPolar(p *plot.Plot, k *key, sc *Scene, th *theme) bool {
	valid, past, _, failed := coupledRows(sc)
	if len(valid)+len(past)+len(failed) == 0 {
		return false
	}
	sty := lineStyle(th.lower, widthNormal, nil)
	all := append(append(plotter.XYs{}, valid...), past...)
	sortXYs(all)
	k.keep(all)
	if len(all) > 1 {
		p.Add(newLine(all, sty))
	}
	if len(valid) > 0 {
		p.Add(newScatter(valid, th.lower, glyphSmall, draw.CircleGlyph{}))
	}
	k.add("Cl viscous", legendLine{sty})
	if len(past) > 0 {
		ps := newScatter(past, th.lower, glyphMarker, draw.TriangleGlyph{})
		p.Add(ps)
		k.add("viscous, past maximum lift", ps)
	}
	// Rows whose layers separate well ahead of the trailing edge (the
	// sweep table's "separated" mark): the real wing stalls there.
	if sep := separatedRows(sc); len(sep) > 0 {
		ss := newScatter(sep, th.lower, glyphMarker*1.4, draw.RingGlyph{})
		p.Add(ss)
		k.add(fmt.Sprintf("viscous, separated ahead of x/c %g", engine.SeparatedFromXC), ss)
	}
	if held := heldRows(sc); len(held) > 0 {
		hs := newScatter(held, th.lower, glyphMarker*1.5, draw.BoxGlyph{})
		p.Add(hs)
		k.add("viscous, transition held upstream (as if tripped)", hs)
	}
	if cl, a := sc.ClMax, sc.AlphaClMax; !math.IsNaN(cl) && len(all) > 0 {
		m := newScatter(plotter.XYs{{X: a, Y: cl}}, th.accent, glyphMarker*1.6, draw.PyramidGlyph{})
		p.Add(m)
		name, v := "Cl max", cl
		if sc.Inverted {
			name, v = "most downforce −Cl", -cl
		}
		// Without a converged angle beyond it the maximum is a lower
		// bound: ≥. The value goes in the key, which is placed clear of
		// the data: a note beside the marker, at the curve's end, ran
		// under the key.
		rel, why := " ", ""
		if !sc.ClMaxIsPeak {
			rel, why = " ≥ ", "; none converged beyond"
		}
		k.add(fmt.Sprintf("%s%s%s at %s° (viscous%s)", name, rel, formatTick(v, 3), formatTick(a, 2), why), m)
	}
	if len(failed) > 0 {
		b := &bottomMarks{alphas: failed, glyph: draw.GlyphStyle{Color: th.accent, Radius: glyphMarker, Shape: draw.CrossGlyph{}}}
		for _, a := range failed {
			k.keep(plotter.XYs{{X: a, Y: p.Y.Min}}) // the key leaves the marks visible
		}
		p.Add(b)
		k.add(fmt.Sprintf("viscous not converged (%d of %d angles)", len(failed), len(sc.SweepCoupled)), b)
	}
	return true
}

// sortXYs sorts points by x.
func sortXYs(xys plotter.XYs) {
	sort.Slice(xys, func(i, j int) bool { return xys[i].X < xys[j].X })
}
