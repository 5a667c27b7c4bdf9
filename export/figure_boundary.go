package export

import (
	"fmt"
	"image/color"
	"math"

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

// blMarks draws the transition and separation positions of one surface as
// vertical lines in the surface's colour, labelled when label is set.
func blMarks(p *plot.Plot, th *theme, s solver.SurfaceBL, c color.Color, label bool, side string) {
	drop := vg.Length(0)
	for _, m := range []struct {
		x    float64
		name string
		dash []vg.Length
	}{
		{s.TransitionXC, "transition", dashRef},
		{s.LaminarSeparationXC, "laminar separation", dashPin},
		{s.TurbulentSeparationXC, "separation", nil},
	} {
		if math.IsNaN(m.x) || math.IsInf(m.x, 0) {
			continue
		}
		r := &refLine{value: m.x, vertical: true, style: lineStyle(c, widthThin, m.dash)}
		if label {
			r.label = fmt.Sprintf("%s %s %.2f", side, m.name, m.x)
			r.labelSty = noteStyle(th, c, 7, text.XLeft, text.YTop)
			r.drop = drop
			drop += vg.Points(9)
		}
		p.Add(r)
	}
}

// boundaryLayerPlot draws θ, δ*, H and Cf against x/c on the upper and
// lower surface of one element (sc.Element; the first when −1), in four
// panels, with transition and separation marked.
func boundaryLayerPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	vr := sc.Viscous
	if vr == nil || len(vr.Elements) == 0 {
		return nil, noData(ViewBoundaryLayer, "no boundary-layer result")
	}
	i := max(sc.Element, 0)
	if i >= len(vr.Elements) {
		return nil, &ViewError{View: ViewBoundaryLayer, Err: fmt.Errorf("element %d is not in 0..%d", i, len(vr.Elements)-1)}
	}
	eb := vr.Elements[i]
	quantities := []struct {
		label string
		get   func(solver.SurfaceBL) []float64
		scale float64
	}{
		{"θ/c × 1000", func(s solver.SurfaceBL) []float64 { return s.Theta }, blScale},
		{"δ*/c × 1000", func(s solver.SurfaceBL) []float64 { return s.DeltaStar }, blScale},
		{"H = δ*/θ", func(s solver.SurfaceBL) []float64 { return s.H }, 1},
		{"Cf × 1000 (on freestream q)", func(s solver.SurfaceBL) []float64 { return s.Cf }, blScale},
	}
	upSty := lineStyle(th.upper, widthNormal, nil)
	loSty := lineStyle(th.lower, widthNormal, dashLower)
	var subs []*plot.Plot
	for qi, q := range quantities {
		xl := ""
		if qi >= 2 {
			xl = "x/c"
		}
		p := newPlot(th, "", xl, q.label)
		p.Y.Label.TextStyle.Font.Size = vg.Points(9)
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
		blMarks(p, th, eb.Upper, th.upper, qi == 2, "upper")
		blMarks(p, th, eb.Lower, th.lower, qi == 3, "lower")
		if qi == 0 {
			k := newKey(th, keyTopLeft)
			k.keep(lines...)
			k.add("upper surface", legendLine{upSty})
			k.add("lower surface", legendLine{loSty})
			p.Add(k)
		}
		p.X.Min, p.X.Max = 0, 1
		if p.Y.Min > p.Y.Max { // nothing finite to draw
			p.Y.Min, p.Y.Max = 0, 1
		}
		p.Y.Min = math.Min(p.Y.Min, 0)
		_, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.05)
		subs = append(subs, p)
	}
	cd := "Cd not available (turbulent separation)"
	if !math.IsNaN(eb.Cd) {
		cd = fmt.Sprintf("Cd %.5f", eb.Cd)
	}
	title := fmt.Sprintf("Boundary layer on %s: %s", eb.Name, cd)
	return compositePlot(th, title, 2, 2, subs...), nil
}
