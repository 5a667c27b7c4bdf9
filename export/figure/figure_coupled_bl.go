package figure

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/solver"
)

// coupledBLQuantities are the panels of the coupled boundary-layer figure:
// each a station quantity against the arc length from the stagnation
// point, so that a surface's curve runs one way (x/c doubles back round
// the leading edge).
var coupledBLQuantities = []struct {
	label string
	get   func(solver.CoupledStation) float64
}{
	{"θ/c × 1000", func(s solver.CoupledStation) float64 { return blScale * s.Theta }},
	{"δ*/c × 1000", func(s solver.CoupledStation) float64 { return blScale * s.DStar }},
	{"H = δ*/θ", func(s solver.CoupledStation) float64 { return s.H }},
	{"Cf × 1000, on local Ue", func(s solver.CoupledStation) float64 { return blScale * s.Cf }},
	{"ñ, amplification (e^N)", func(s solver.CoupledStation) float64 { return s.N }},
}

// surfaceArcXYs returns (ξ/c, get) at a surface's stations, finite values
// only.
func surfaceArcXYs(s solver.CoupledSurface, get func(solver.CoupledStation) float64) plotter.XYs {
	var xys plotter.XYs
	for _, st := range s.Stations {
		if y := get(st); !math.IsNaN(y) && !math.IsInf(y, 0) && !math.IsNaN(st.Xi) {
			xys = append(xys, plotter.XY{X: st.Xi, Y: y})
		}
	}
	return xys
}

// coupledBoundaryLayerPlot draws the converged coupled solution's boundary
// layer on one element (sc.Element; the first when −1): θ, δ*, H, Cf and
// the amplification ñ of the upper and lower surface against the arc
// length from the stagnation point, in panels, with transition and
// separation in the title's second line.
func coupledBoundaryLayerPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	d := coupledDetail(sc)
	if d == nil || len(d.Elements) == 0 {
		return nil, noData(ViewBoundaryLayer, "no converged viscous solution")
	}
	i := max(sc.Element, 0)
	if i >= len(d.Elements) {
		return nil, &ViewError{View: ViewBoundaryLayer, Err: fmt.Errorf("element %d is not in 0..%d", i, len(d.Elements)-1)}
	}
	e := d.Elements[i]
	upSty := lineStyle(th.upper, widthNormal, nil)
	loSty := lineStyle(th.lower, widthNormal, dashLower)
	var subs []*plot.Plot
	var peaks []string
	for j, q := range coupledBLQuantities {
		p := newPlot(th, "", "s/c from stagnation", q.label)
		p.Y.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		p.X.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		k := newKey(th, keyTopLeft)
		var lines []plotter.XYs
		for _, s := range []struct {
			surf solver.CoupledSurface
			sty  draw.LineStyle
		}{{e.Upper, upSty}, {e.Lower, loSty}} {
			if xys := surfaceArcXYs(s.surf, q.get); len(xys) > 1 {
				p.Add(newLine(xys, s.sty))
				k.keep(xys)
				lines = append(lines, xys)
			}
		}
		if j == 0 {
			k.add("upper surface", legendLine{upSty})
			k.add("lower surface", legendLine{loSty})
			p.Add(k)
		}
		if p.Y.Min > p.Y.Max {
			p.Y.Min, p.Y.Max = 0, 1
		}
		// The stagnation peak (of Cf, say) runs off the top, as in the
		// estimate's figure (blRange).
		if aft, all := blRange(lines); aft > 0 && all > blPeakRatio*aft {
			p.Y.Max = aft
			peaks = append(peaks, fmt.Sprintf("%s peak %.3g at stagnation off scale", q.label, all))
		}
		p.Y.Min = math.Min(p.Y.Min, 0)
		if low := math.Min(aftMin(lines), 0); p.Y.Min < low {
			p.Y.Min = low // a dip at stagnation, likewise
		}
		p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.05)
		subs = append(subs, p)
	}
	title := fmt.Sprintf("Boundary layer on %s, viscous solution: Cd %s\n%s", e.Name, formatTick(e.Cd, 4), coupledBLCaption(e))
	if len(peaks) > 0 {
		title += "\n" + strings.Join(peaks, " · ")
	}
	return compositePlot(th, title, 2, 3, subs...), nil
}

// coupledBLCaption says where each surface's layer changes, in x/c.
func coupledBLCaption(e solver.CoupledElement) string {
	var parts []string
	for _, s := range []struct {
		name string
		surf solver.CoupledSurface
	}{{"upper", e.Upper}, {"lower", e.Lower}} {
		t := s.name + ": "
		switch {
		case s.surf.Tripped:
			t += fmt.Sprintf("tripped at x/c %.2f", s.surf.Transition)
		case finiteXC(s.surf.Transition):
			t += fmt.Sprintf("transition x/c %.2f", s.surf.Transition)
		default:
			t += "laminar to the trailing edge"
		}
		if s.surf.HasBubble {
			t += fmt.Sprintf(", laminar bubble x/c %.2f–%.2f", s.surf.Bubble[0], s.surf.Bubble[1])
		}
		if finiteXC(s.surf.Separation) {
			t += fmt.Sprintf(", separated from x/c %.2f", s.surf.Separation)
		}
		parts = append(parts, t)
	}
	return strings.Join(parts, " · ")
}

// aftMin returns the smallest value of lines aft of blRangeFromXC (in
// s/c here), +Inf when there is none.
func aftMin(lines []plotter.XYs) float64 {
	m := math.Inf(1)
	for _, xys := range lines {
		for _, p := range xys {
			if p.X >= blRangeFromXC {
				m = math.Min(m, p.Y)
			}
		}
	}
	return m
}
