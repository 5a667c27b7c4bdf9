package figure

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/model"
)

// twinAxis is a second vertical axis on the right of the data area for a
// quantity drawn in the left axis's units through the linear map
// v ↦ lo + (v − min)(hi − lo)/(max − min), [lo, hi] the left axis range.
type twinAxis struct {
	min, max  float64
	label     string
	color     color.Color
	tickLabel text.Style
	axisLabel text.Style
	short     string // the label where the whole one would shrink below twinReadablePt
}

const (
	twinTickLen = vg.Length(4)
	twinGap     = vg.Length(3)
)

// toLeft maps a value on the twin axis to the left axis's data units.
func (t *twinAxis) toLeft(p *plot.Plot, v float64) float64 {
	return p.Y.Min + (v-t.min)*(p.Y.Max-p.Y.Min)/(t.max-t.min)
}

func (t *twinAxis) ticks() []plot.Tick {
	var ts []plot.Tick
	for _, k := range (niceTicks{}).Ticks(t.min, t.max) {
		if k.Value >= t.min && k.Value <= t.max {
			ts = append(ts, k)
		}
	}
	return ts
}

func (t *twinAxis) width() vg.Length {
	w := vg.Length(0)
	for _, k := range t.ticks() {
		w = max(w, t.tickLabel.Width(k.Label))
	}
	return twinTickLen + twinGap + w + twinGap + t.axisLabel.Height(t.label)
}

// twinReadablePt is the smallest size the twin axis's whole label is
// shrunk to before it gives way to its short form.
const twinReadablePt = 8

func (t *twinAxis) Plot(c draw.Canvas, p *plot.Plot) {
	sty := lineStyle(t.color, widthThin, nil)
	x := c.Max.X
	c.StrokeLine2(sty, x, c.Min.Y, x, c.Max.Y)
	tw := vg.Length(0)
	for _, k := range t.ticks() {
		y := c.Min.Y + vg.Length((k.Value-t.min)/(t.max-t.min))*(c.Max.Y-c.Min.Y)
		if k.IsMinor() {
			c.StrokeLine2(sty, x, y, x+twinTickLen/2, y)
			continue
		}
		c.StrokeLine2(sty, x, y, x+twinTickLen, y)
		c.FillText(t.tickLabel, vg.Point{X: x + twinTickLen + twinGap, Y: y}, k.Label)
		tw = max(tw, t.tickLabel.Width(k.Label))
	}
	ls := t.axisLabel
	ls.Rotation = -math.Pi / 2
	// Shrunk to the data area's height, as fitLabels shrinks the others;
	// where that would make it smaller than twinReadablePt (the
	// workbench's small cell drew it at 6 pt beside a 10 pt left axis),
	// the short label instead.
	label := t.label
	if w, room := ls.Width(label), c.Max.Y-c.Min.Y-vg.Points(8); w > room && room > 0 {
		if size := ls.Font.Size * room / w; size < vg.Points(twinReadablePt) && t.short != "" {
			label = t.short
		} else {
			ls.Font.Size = max(size, minLabelPt)
		}
	}
	c.FillText(ls, vg.Point{X: x + twinTickLen + 2*twinGap + tw + t.axisLabel.Height(label)/2, Y: c.Center().Y}, label)
}

// GlyphBoxes reserves the axis's width on the right of the data area.
func (t *twinAxis) GlyphBoxes(*plot.Plot) []plot.GlyphBox {
	return []plot.GlyphBox{{X: 1, Y: 0.5, Rectangle: vg.Rectangle{Min: vg.Point{Y: -1}, Max: vg.Point{X: t.width(), Y: 1}}}}
}

// clSlope returns the least-squares slope of Cl against α in 1/degree over
// the sweep, NaN with fewer than two distinct angles.
func clSlope(alpha, cl []float64) float64 {
	n := float64(len(alpha))
	if n < 2 {
		return math.NaN()
	}
	var sa, sc, saa, sac float64
	for i := range alpha {
		sa += alpha[i]
		sc += cl[i]
		saa += alpha[i] * alpha[i]
		sac += alpha[i] * cl[i]
	}
	den := n*saa - sa*sa
	if den == 0 {
		return math.NaN()
	}
	return (n*sac - sa*sc) / den
}

// polarPlot draws Cl (left axis) and Cm (right axis) against the angle of
// attack for the sweep, the current angle marked and pins as faded dotted
// curves.
func polarPlot(sc *Scene, th *theme) (*plot.Plot, *key, error) {
	if len(sc.Sweep) == 0 {
		return nil, nil, noData(ViewPolar, "no sweep")
	}
	alpha := make([]float64, len(sc.Sweep))
	cl := make([]float64, len(sc.Sweep))
	cl0, cl1, cm0, cm1 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	a0, a1 := math.Inf(1), math.Inf(-1)
	grow := func(a, l, m float64) {
		a0, a1 = math.Min(a0, a), math.Max(a1, a)
		cl0, cl1 = math.Min(cl0, l), math.Max(cl1, l)
		cm0, cm1 = math.Min(cm0, m), math.Max(cm1, m)
	}
	for i, c := range sc.Sweep {
		alpha[i], cl[i] = c.AlphaDeg, c.Cl
		grow(c.AlphaDeg, c.Cl, c.Cm)
	}
	for _, pin := range sc.Pins {
		for _, r := range pin.Polar {
			grow(r[0], r[1], r[2])
		}
	}
	if sc.Solution != nil {
		grow(sc.Solution.AlphaDeg, sc.Solution.Cl, sc.Solution.Cm)
	}
	vValid, vPast, vCm, _ := coupledRows(sc)
	for i, r := range append(append(plotter.XYs{}, vValid...), vPast...) {
		grow(r.X, r.Y, vCm[i].Y)
	}
	title := "Polar: Cl and Cm against α"
	if s := clSlope(alpha, cl); !math.IsNaN(s) {
		title = fmt.Sprintf("Polar: Cl and Cm against α (mean lift slope %s per degree)", formatTick(s, 4))
	}
	ylabel := "Cl"
	if sc.Inverted {
		ylabel = "Cl (negative: downforce)"
	}
	p := newPlot(th, title, "α, degrees", ylabel)
	k := newKey(th, keyTopLeft)
	k.above = true // a sweep's curves can reach every corner
	p.Y.Min, p.Y.Max = padRange(cl0, cl1, 0.06)
	p.X.Min, p.X.Max = padRange(a0, a1, 0.03)
	lo, hi := padRange(cm0, cm1, 0.06)
	tw := &twinAxis{
		min: lo, max: hi, label: "Cm (about the moment reference)", short: "Cm", color: th.second,
		tickLabel: noteStyle(th, th.fg, 9, text.XLeft, text.YCenter),
		axisLabel: noteStyle(th, th.fg, 10, text.XCenter, text.YCenter),
	}
	clSty := lineStyle(th.upper, widthNormal, nil)
	cmSty := lineStyle(th.second, widthNormal, dashLower)
	for j, pin := range sc.Pins {
		if len(pin.Polar) == 0 {
			continue
		}
		c := fade(th.pin(j), 150)
		pl, pm := make(plotter.XYs, len(pin.Polar)), make(plotter.XYs, len(pin.Polar))
		for i, r := range pin.Polar {
			pl[i] = plotter.XY{X: r[0], Y: r[1]}
			pm[i] = plotter.XY{X: r[0], Y: tw.toLeft(p, r[2])}
		}
		k.keep(pl, pm)
		p.Add(newLine(pl, lineStyle(c, widthNormal, pinDash(j))), newLine(pm, lineStyle(c, widthThin, pinDash(j))))
		k.add(pinKeyPrefix+pin.Label, legendLine{lineStyle(c, widthNormal, pinDash(j))})
	}
	xl, xm := make(plotter.XYs, len(sc.Sweep)), make(plotter.XYs, len(sc.Sweep))
	for i, c := range sc.Sweep {
		xl[i] = plotter.XY{X: c.AlphaDeg, Y: c.Cl}
		xm[i] = plotter.XY{X: c.AlphaDeg, Y: tw.toLeft(p, c.Cm)}
	}
	k.keep(xl, xm)
	p.Add(newLine(xl, clSty), newScatter(xl, th.upper, glyphSmall, draw.CircleGlyph{}))
	p.Add(newLine(xm, cmSty), newScatter(xm, th.second, glyphSmall, draw.SquareGlyph{}))
	// The Cl curves read on the left axis, which says Cl; Cm says it
	// reads on the right. Short entries keep the key in its band.
	clName := "Cl from circulation"
	if len(sc.SweepCoupled) > 0 && len(sc.SweepCoupled) == len(sc.Sweep) {
		clName = "Cl inviscid"
	}
	k.add(clName, legendLine{clSty})
	k.add("Cm (right axis)", legendLine{cmSty})
	// Points the plausibility rules flag (model.Plausibility), ringed.
	var flagged plotter.XYs
	var kinds []model.Flag
	hc := math.NaN()
	if sc.Ground {
		hc = sc.Layout.HOverC()
	}
	for i, c := range sc.Sweep {
		if fl := model.Plausibility(model.PointFacts{CpMin: c.CpMin, HOverC: hc}); len(fl) > 0 {
			flagged = append(flagged, xl[i])
			if len(fl) > len(kinds) {
				kinds = fl
			}
		}
	}
	if len(flagged) > 0 {
		fs := newScatter(flagged, th.lower, glyphMarker, draw.RingGlyph{})
		p.Add(fs)
		k.add("not to be trusted: "+model.FlagWords(kinds), fs)
	}
	addCoupledPolar(p, k, sc, th)
	if len(sc.SweepCoupled) > 0 {
		k.pinsInviscid()
	}
	p.Add(alphaMark(th, sc.AlphaDeg))
	if s := sc.Solution; s != nil {
		cur := plotter.XYs{{X: s.AlphaDeg, Y: s.Cl}}
		curM := plotter.XYs{{X: s.AlphaDeg, Y: tw.toLeft(p, s.Cm)}}
		p.Add(newScatter(cur, th.accent, glyphMarker, draw.RingGlyph{}), newScatter(curM, th.accent, glyphMarker, draw.RingGlyph{}))
	}
	p.Add(tw)
	p.Add(k)
	return p, k, nil
}
