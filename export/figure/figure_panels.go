package figure

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/model"
)

// mmPerM converts the Layout's metres to the figures' millimetres.
const mmPerM = 1000

// body is one element's panel nodes as the figures draw them, in metres.
type body struct {
	name  string
	nodes []model.Point
	le    int
}

// sceneBodies returns the geometry to draw: the solved Config when there is
// one, else the Layout.
func sceneBodies(sc *Scene) []body {
	var bs []body
	switch {
	case sc.Config != nil && len(sc.Config.Elements) > 0:
		for _, e := range sc.Config.Elements {
			bs = append(bs, body{name: e.Name, nodes: e.Nodes, le: e.LE})
		}
	case sc.Layout != nil:
		for _, e := range sc.Layout.Elements {
			bs = append(bs, body{name: e.Name, nodes: e.Nodes, le: e.LE})
		}
	}
	return bs
}

// outlineXYs returns b's nodes in millimetres, closed across an open
// trailing edge when closeGap is set.
func outlineXYs(b body, closeGap bool) plotter.XYs {
	n := len(b.nodes)
	xys := make(plotter.XYs, n, n+1)
	for i, p := range b.nodes {
		xys[i] = plotter.XY{X: p.X * mmPerM, Y: p.Y * mmPerM}
	}
	if closeGap && n > 1 && b.nodes[0] != b.nodes[n-1] {
		xys = append(xys, xys[0])
	}
	return xys
}

// panelStats returns the number of panels and the shortest and longest
// panel length in metres.
func panelStats(bs []body) (n int, lmin, lmax float64) {
	lmin, lmax = math.Inf(1), 0
	for _, b := range bs {
		for i := 0; i+1 < len(b.nodes); i++ {
			l := b.nodes[i].Dist(b.nodes[i+1])
			lmin, lmax = math.Min(lmin, l), math.Max(lmax, l)
			n++
		}
	}
	return n, lmin, lmax
}

// LEWindow returns a square window of side size millimetres on element's
// leading edge, the nose a quarter of the way in from the window's
// upstream edge along the chord line: a close-up of the nose panelling.
// It panics if element is out of range or size is not positive.
func LEWindow(l *model.Layout, element int, size float64) Window {
	if l == nil || element < 0 || element >= len(l.Elements) {
		panic(fmt.Sprintf("figure: LEWindow element %d out of range", element))
	}
	if !(size > 0) {
		panic(fmt.Sprintf("figure: LEWindow size %g", size))
	}
	e := l.Elements[element]
	le := e.LeadingEdge.Scale(mmPerM)
	d := e.TrailingEdge.Sub(e.LeadingEdge)
	if n := d.Norm(); n > 0 {
		d = d.Scale(1 / n)
	} else {
		d = model.Point{X: 1}
	}
	// Centre a quarter of the window downstream of the nose along the
	// chord, so the window holds the nose and the first part of both
	// surfaces.
	c := le.Add(d.Scale(size / 4))
	return Window{XMin: c.X - size/2, XMax: c.X + size/2, YMin: c.Y - size/2, YMax: c.Y + size/2}
}

// frame sets p's ranges to w when it is valid, else to e padded.
func frame(p *plot.Plot, w Window, e extent, pad float64) {
	if w.valid() {
		p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = w.XMin, w.XMax, w.YMin, w.YMax
		return
	}
	if e.empty() {
		return
	}
	d := math.Max(e.x1-e.x0, e.y1-e.y0)
	p.X.Min, p.X.Max = e.x0-pad*d, e.x1+pad*d
	p.Y.Min, p.Y.Max = e.y0-pad*d, e.y1+pad*d
}

// groundLine returns the ground plane as a reference line in millimetres.
func groundLine(sc *Scene, th *theme) *refLine {
	return &refLine{
		value: sc.GroundY * mmPerM, style: lineStyle(th.ground, widthBold, nil),
		label: "ground", labelSty: noteStyle(th, th.ground, 8, text.XLeft, text.YBottom),
	}
}

// panelsPlot draws each element's outline with its panel nodes and control
// points (panel midpoints, where the solver imposes flow tangency).
func panelsPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	bs := sceneBodies(sc)
	if len(bs) == 0 {
		return nil, noData(ViewPanels, "no elements")
	}
	n, lmin, lmax := panelStats(bs)
	title := fmt.Sprintf("Panels: %d, length %.3g to %.3g mm", n, lmin*mmPerM, lmax*mmPerM)
	if len(bs) > 1 {
		title = fmt.Sprintf("Panels: %d on %d elements, length %.3g to %.3g mm", n, len(bs), lmin*mmPerM, lmax*mmPerM)
	}
	p := newPlot(th, title, "x, mm", "y, mm")
	k := newKey(th, keyTopRight)
	e := newExtent()
	var nodes, ctrl plotter.XYs
	for _, b := range bs {
		xys := outlineXYs(b, false)
		for _, q := range xys {
			e.add(q.X, q.Y)
		}
		p.Add(newLine(xys, lineStyle(th.body, widthThin, nil)))
		if m := len(b.nodes); m > 1 && b.nodes[0] != b.nodes[m-1] {
			gap := plotter.XYs{xys[m-1], xys[0]}
			p.Add(newLine(gap, lineStyle(th.faint, widthThin, dashRef)))
		}
		nodes = append(nodes, xys...)
		for i := 0; i+1 < len(xys); i++ {
			ctrl = append(ctrl, plotter.XY{X: (xys[i].X + xys[i+1].X) / 2, Y: (xys[i].Y + xys[i+1].Y) / 2})
		}
	}
	ns := newScatter(nodes, th.node, glyphSmall, draw.CircleGlyph{})
	cs := newScatter(ctrl, th.control, glyphSmall, draw.CrossGlyph{})
	p.Add(unpadded{ns}, unpadded{cs})
	k.keep(nodes)
	k.add("nodes", ns)
	k.add("control points", cs)
	if sc.Ground {
		p.Add(groundLine(sc, th))
		e.add(e.x0, sc.GroundY*mmPerM)
	}
	frame(p, sc.Window, e, 0.04)
	p.Add(k)
	if !sc.OmitFrameKey {
		p.Add(newFrameKey(sc, th))
	}
	return p, nil
}

// unpadded draws a plotter without its glyph boxes, so that the data area
// does not shrink by a marker's radius when a marker lies on its edge:
// in a zoomed view which nodes lie there changes with every step, and the
// area's size (and so the window shown) would change with it.
type unpadded struct{ p plot.Plotter }

// Plot is part of plot.Plotter.
func (u unpadded) Plot(c draw.Canvas, p *plot.Plot) { u.p.Plot(c, p) }
