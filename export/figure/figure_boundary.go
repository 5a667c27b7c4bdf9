package figure

import (
	"fmt"
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/solver"
)

// blScale puts the small non-dimensional thicknesses and the skin friction
// on readable numbers: θ/c, δ*/c and Cf are drawn × 1000.
const blScale = 1000

// tiles is a plotter that draws child plots in a grid filling the data
// area of a plot without axes: a figure made of several panels that is
// still one *plot.Plot.
type tiles struct {
	rows, cols int
	plots      []*plot.Plot
}

func (t *tiles) Plot(c draw.Canvas, _ *plot.Plot) {
	ts := draw.Tiles{Rows: t.rows, Cols: t.cols, PadX: vg.Points(6), PadY: vg.Points(4)}
	for i, p := range t.plots {
		p.Draw(ts.At(c, i%t.cols, i/t.cols))
	}
}

// compositePlot returns a plot with a title and no axes whose data area
// holds sub in a rows × cols grid.
func compositePlot(th *theme, title string, rows, cols int, sub ...*plot.Plot) *plot.Plot {
	p := plot.New()
	p.BackgroundColor = th.bg
	p.Title.Text = title
	p.Title.TextStyle = textStyle(th.fg, 11, text.XCenter, text.YTop)
	p.Title.Padding = vg.Points(4)
	p.HideAxes()
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = 0, 1, 0, 1
	p.Add(&tiles{rows: rows, cols: cols, plots: sub})
	return p
}

// surfaceXYs returns (x/c, scale·v) for the finite values.
func surfaceXYs(xc, v []float64, scale float64) plotter.XYs {
	var xys plotter.XYs
	for i := range xc {
		if i < len(v) && !math.IsNaN(v[i]) && !math.IsInf(v[i], 0) && !math.IsNaN(xc[i]) {
			xys = append(xys, plotter.XY{X: xc[i], Y: scale * v[i]})
		}
	}
	return xys
}

// Layout of the boundary-layer figure.
const (
	// blRangeFromXC: the vertical axes range over the stations aft of this
	// x/c. Just aft of the stagnation point the layer is thinnest while
	// the edge velocity rises fastest towards the suction peak, so the
	// wall shear, τw = μ Ue ℓ(λ)/θ in Thwaites' method (from memory), has
	// a sharp peak there that would squash the rest of the curve into the
	// bottom of the panel. The peak runs off the top and is noted.
	blRangeFromXC = 0.05
	// blPeakRatio: the peak is let run off the top only when it exceeds
	// the range aft of blRangeFromXC by this factor, so that a curve that
	// merely starts a little high is drawn whole.
	blPeakRatio = 1.5
	// Font sizes (points) of the caption under the title and of the axis
	// labels, chosen to read at the workbench's view size (600 × 400 px
	// at 96 dpi) as well as in print.
	blCaptionPt = 8.5
	blLabelPt   = 9
	// blMinPanelPt is the height (points) a panel needs to be read: its
	// axis and tick labels take about a third of it. With less room for
	// two rows of panels (the workbench's view cell at 1280 × 800) the
	// figure shows the Cf panel alone and says so (blSmallNote).
	blMinPanelPt = 105
)

// blSmallNote ends the caption of a figure too small for every panel.
const blSmallNote = "θ and H left out: too small a figure for them"

// blMarkKinds are the positions drawn as vertical lines, each with its
// dash pattern, in the colour of its surface.
var blMarkKinds = []struct {
	name string
	dash []vg.Length
	get  func(solver.SurfaceBL) float64
}{
	{"transition", dashRef, func(s solver.SurfaceBL) float64 { return s.TransitionXC }},
	{"laminar separation", dashPin, func(s solver.SurfaceBL) float64 { return s.LaminarSeparationXC }},
	{"separation", nil, func(s solver.SurfaceBL) float64 { return s.TurbulentSeparationXC }},
}

func finiteXC(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// blMarks draws the transition and separation positions of one surface as
// vertical lines in the surface's colour, unlabelled: blCaption names them.
func blMarks(p *plot.Plot, s solver.SurfaceBL, c color.Color) {
	for _, m := range blMarkKinds {
		if x := m.get(s); finiteXC(x) {
			p.Add(&refLine{value: x, vertical: true, style: lineStyle(c, widthThin, m.dash)})
		}
	}
}

// blCaption says where each surface's boundary layer changes, an item per
// kind of mark that occurs, and how each is drawn; blPanels packs the
// items into lines that fit the figure.
func blCaption(eb solver.ElementBL) []string {
	var lines []string
	for _, m := range blMarkKinds {
		var at []string
		for _, s := range []struct {
			name string
			bl   solver.SurfaceBL
		}{{"upper", eb.Upper}, {"lower", eb.Lower}} {
			if x := m.get(s.bl); finiteXC(x) {
				at = append(at, fmt.Sprintf("%s %.2f", s.name, x))
			}
		}
		if len(at) == 0 {
			continue
		}
		how := "solid line"
		switch {
		case len(m.dash) > 0 && m.name == "transition":
			how = "dashed"
		case len(m.dash) > 0:
			how = "dotted"
		}
		lines = append(lines, fmt.Sprintf("%s (%s) at x/c %s", m.name, how, strings.Join(at, ", ")))
	}
	if len(lines) == 0 {
		lines = append(lines, "no transition or separation on either surface")
	}
	return lines
}

// blPanels is the boundary-layer figure's layout inside the data area of a
// plot without axes: the caption lines at the top, then θ and H side by
// side, then Cf across the full width (the panel read most, given the
// width of two). Below 2 blMinPanelPt of height it draws Cf alone.
type blPanels struct {
	caption    []string
	captionSty text.Style
	theta, h   *plot.Plot
	cf         *plot.Plot
}

// layout returns the caption lines for a data area of w × h, and whether
// it is too small for every panel.
func (b *blPanels) layout(w, h vg.Length) (lines []string, small bool) {
	lines = packLines(b.caption, blCaptionSep, b.captionSty, w)
	if h-captionHeight(b.captionSty, lines) >= 2*vg.Points(blMinPanelPt) {
		return lines, false
	}
	return packLines(append(b.caption[:len(b.caption):len(b.caption)], blSmallNote), blCaptionSep, b.captionSty, w), true
}

func (b *blPanels) Plot(c draw.Canvas, _ *plot.Plot) {
	lines, small := b.layout(c.Max.X-c.Min.X, c.Max.Y-c.Min.Y)
	y := drawCaption(c, b.captionSty, lines)
	area := c
	area.Max.Y = y - vg.Points(2)
	if small {
		b.cf.Draw(area)
		return
	}
	rows := draw.Tiles{Rows: 2, Cols: 1, PadY: vg.Points(4)}
	top := draw.Tiles{Rows: 1, Cols: 2, PadX: vg.Points(6)}
	up := rows.At(area, 0, 0)
	b.theta.Draw(top.At(up, 0, 0))
	b.h.Draw(top.At(up, 1, 0))
	b.cf.Draw(rows.At(area, 0, 1))
}

// captionHeight returns the height of caption lines set in sty.
func captionHeight(sty text.Style, lines []string) vg.Length {
	var h vg.Length
	for _, l := range lines {
		h += sty.Height(l)
	}
	return h
}

// drawCaption draws caption lines centred from the top of c down and
// returns the height below them.
func drawCaption(c draw.Canvas, sty text.Style, lines []string) vg.Length {
	y := c.Max.Y
	mid := (c.Min.X + c.Max.X) / 2
	for _, l := range lines {
		c.FillText(sty, vg.Point{X: mid, Y: y}, l)
		y -= sty.Height(l)
	}
	return y
}

// blCaptionSep separates caption items that share a line.
const blCaptionSep = "  ·  "

// packLines joins items with sep into as few lines as fit width in sty,
// in order; an item wider than width has a line of its own.
func packLines(items []string, sep string, sty text.Style, width vg.Length) []string {
	var lines []string
	for _, it := range items {
		if n := len(lines); n > 0 && sty.Width(lines[n-1]+sep+it) <= width {
			lines[n-1] += sep + it
			continue
		}
		lines = append(lines, it)
	}
	return lines
}

// blRange returns the largest value of lines aft of blRangeFromXC and the
// largest of all (the stagnation peak), −Inf when there is none.
func blRange(lines []plotter.XYs) (aft, all float64) {
	aft, all = math.Inf(-1), math.Inf(-1)
	for _, xys := range lines {
		for _, p := range xys {
			all = math.Max(all, p.Y)
			if p.X >= blRangeFromXC {
				aft = math.Max(aft, p.Y)
			}
		}
	}
	return aft, all
}

// boundaryLayerPlot draws θ, H and Cf against x/c on the upper and lower
// surface of one element (sc.Element; the first when −1), in three
// panels, with transition and separation marked and named in a caption.
// δ* is left out: it is Hθ, from the two panels drawn.
func boundaryLayerPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	if sc.Viscous == nil && coupledDetail(sc) != nil {
		return coupledBoundaryLayerPlot(sc, th)
	}
	b, title, err := boundaryLayerPanels(sc, th)
	if err != nil {
		return nil, err
	}
	p := compositePlot(th, title, 1, 1)
	p.Add(b)
	return p, nil
}

// boundaryLayerPanels returns the panels and title of boundaryLayerPlot.
func boundaryLayerPanels(sc *Scene, th *theme) (*blPanels, string, error) {
	vr := sc.Viscous
	if vr == nil || len(vr.Elements) == 0 {
		return nil, "", noData(ViewBoundaryLayer, "no boundary-layer result")
	}
	i := max(sc.Element, 0)
	if i >= len(vr.Elements) {
		return nil, "", &ViewError{View: ViewBoundaryLayer, Err: fmt.Errorf("element %d is not in 0..%d", i, len(vr.Elements)-1)}
	}
	eb := vr.Elements[i]
	quantities := []struct {
		label  string
		short  string // in the caption
		get    func(solver.SurfaceBL) []float64
		scale  float64
		legend bool // the panel that carries the key of the surfaces
	}{
		{"θ/c × 1000", "θ/c × 1000", func(s solver.SurfaceBL) []float64 { return s.Theta }, blScale, false},
		{"H = δ*/θ", "H", func(s solver.SurfaceBL) []float64 { return s.H }, 1, false},
		{"Cf × 1000, on q∞", "Cf × 1000", func(s solver.SurfaceBL) []float64 { return s.Cf }, blScale, true},
	}
	upSty := lineStyle(th.upper, widthNormal, nil)
	loSty := lineStyle(th.lower, widthNormal, dashLower)
	var subs []*plot.Plot
	var peaks []string
	for _, q := range quantities {
		p := newPlot(th, "", "x/c", q.label)
		p.Y.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		p.X.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		var lines []plotter.XYs
		for _, s := range []struct {
			bl  solver.SurfaceBL
			sty draw.LineStyle
		}{{eb.Upper, upSty}, {eb.Lower, loSty}} {
			if xys := surfaceXYs(s.bl.XC, q.get(s.bl), q.scale); len(xys) > 1 {
				p.Add(newLine(xys, s.sty))
				lines = append(lines, xys)
			}
		}
		blMarks(p, eb.Upper, th.upper)
		blMarks(p, eb.Lower, th.lower)
		k := newKey(th, keyTopLeft)
		k.keep(lines...)
		if q.legend {
			k.add("upper surface", legendLine{upSty})
			k.add("lower surface", legendLine{loSty})
		}
		p.X.Min, p.X.Max = 0, 1
		if p.Y.Min > p.Y.Max { // nothing finite to draw
			p.Y.Min, p.Y.Max = 0, 1
		}
		p.Y.Min = math.Min(p.Y.Min, 0)
		if aft, all := blRange(lines); aft > 0 && all > blPeakRatio*aft {
			p.Y.Max = aft
			peaks = append(peaks, fmt.Sprintf("%s peak %.3g near the leading edge is off scale", q.short, all))
		}
		_, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.05)
		if len(k.entries) > 0 {
			p.Add(k)
		}
		subs = append(subs, p)
	}
	cd := "Cd not available (turbulent separation)"
	if !math.IsNaN(eb.Cd) {
		cd = fmt.Sprintf("Cd %.5f", eb.Cd)
	}
	title := fmt.Sprintf("Boundary layer on %s: %s", eb.Name, cd)
	return &blPanels{
		caption:    append(blCaption(eb), peaks...),
		captionSty: noteStyle(th, th.fg, blCaptionPt, text.XCenter, text.YTop),
		theta:      subs[0], h: subs[1], cf: subs[2],
	}, title, nil
}
