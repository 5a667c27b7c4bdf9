package figure

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
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
// length from the stagnation point, in panels laid out by coupledBLPanels
// for the size drawn at, with transition and separation in a caption.
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
	b := &coupledBLPanels{
		caption:    coupledBLCaption(e),
		captionSty: noteStyle(th, th.fg, blCaptionPt, text.XCenter, text.YTop),
		keySty:     textStyle(th.fg, keyTextPt, text.XLeft, text.YCenter),
		key:        []keyEntry{{"upper surface", legendLine{upSty}}, {"lower surface", legendLine{loSty}}},
	}
	for _, q := range coupledBLQuantities {
		p := newPlot(th, "", "s/c from stagnation", q.label)
		p.Y.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		p.X.Label.TextStyle.Font.Size = vg.Points(blLabelPt)
		var lines []plotter.XYs
		for _, s := range []struct {
			surf solver.CoupledSurface
			sty  draw.LineStyle
		}{{e.Upper, upSty}, {e.Lower, loSty}} {
			if xys := surfaceArcXYs(s.surf, q.get); len(xys) > 1 {
				p.Add(newLine(xys, s.sty))
				lines = append(lines, xys)
			}
		}
		if p.Y.Min > p.Y.Max {
			p.Y.Min, p.Y.Max = 0, 1
		}
		// The stagnation peak (of Cf, say) runs off the top, as in the
		// estimate's figure (blRange).
		peak := ""
		if aft, all := blRange(lines); aft > 0 && all > blPeakRatio*aft {
			p.Y.Max = aft
			peak = fmt.Sprintf("%s peak %.3g at stagnation off scale", q.label, all)
		}
		p.Y.Min = math.Min(p.Y.Min, 0)
		if low := math.Min(aftMin(lines), 0); p.Y.Min < low {
			p.Y.Min = low // a dip at stagnation, likewise
		}
		p.Y.Min, p.Y.Max = padRange(p.Y.Min, p.Y.Max, 0.05)
		b.tiles = append(b.tiles, p)
		b.peaks = append(b.peaks, peak)
	}
	p := compositePlot(th, fmt.Sprintf("Boundary layer on %s, viscous solution: Cd %s", e.Name, formatTick(e.Cd, 4)), 1, 1)
	p.Add(b)
	return p, nil
}

// coupledBLSmall are the panels (indices into coupledBLQuantities) that a
// figure too small for all five draws, side by side: H and Cf, which show
// transition and separation; the thicknesses and ñ are left out and the
// caption says so (coupledBLSmallNote).
var coupledBLSmall = []int{2, 3}

// coupledBLSmallNote ends the caption of a figure drawn with coupledBLSmall.
const coupledBLSmallNote = "θ, δ* and ñ left out: too small a figure for them"

// coupledBLPanels lays out the coupled boundary-layer figure inside the
// data area of a plot without axes: the caption lines, a row naming the
// surfaces' lines (above the panels, where it covers no curve), then the
// five panels in two rows of three; with less than 2 blMinPanelPt of
// height for them (the workbench's view cell), the coupledBLSmall panels
// in one row.
type coupledBLPanels struct {
	caption    []string
	captionSty text.Style
	keySty     text.Style
	key        []keyEntry
	tiles      []*plot.Plot
	peaks      []string // per tile, "" when its curves fit
}

// layout returns the caption lines for a data area of w × h and the
// panels to draw there.
func (b *coupledBLPanels) layout(w, h vg.Length) (lines []string, shown []int) {
	items := func(shown []int, note ...string) []string {
		it := append([]string(nil), b.caption...)
		for _, i := range shown {
			if b.peaks[i] != "" {
				it = append(it, b.peaks[i])
			}
		}
		return append(it, note...)
	}
	all := make([]int, len(b.tiles))
	for i := range all {
		all[i] = i
	}
	lines = packLines(items(all), blCaptionSep, b.captionSty, w)
	if h-captionHeight(b.captionSty, lines)-b.keyHeight() >= 2*vg.Points(blMinPanelPt) {
		return lines, all
	}
	return packLines(items(coupledBLSmall, coupledBLSmallNote), blCaptionSep, b.captionSty, w), coupledBLSmall
}

func (b *coupledBLPanels) keyHeight() vg.Length { return b.keySty.Height("Xg") * 1.4 }

func (b *coupledBLPanels) Plot(c draw.Canvas, _ *plot.Plot) {
	lines, shown := b.layout(c.Max.X-c.Min.X, c.Max.Y-c.Min.Y)
	y := drawCaption(c, b.captionSty, lines)
	mid := (c.Min.X + c.Max.X) / 2
	// The key's entries centred in one row.
	var w vg.Length
	for _, e := range b.key {
		w += keyThumb + keyPad + b.keySty.Width(e.label) + 3*keyPad
	}
	kh := b.keyHeight()
	x, ky := mid-w/2, y-kh/2
	for _, e := range b.key {
		tc := c
		tc.Rectangle = vg.Rectangle{Min: vg.Point{X: x, Y: ky - kh/4}, Max: vg.Point{X: x + keyThumb, Y: ky + kh/4}}
		e.thumb.Thumbnail(&tc)
		x += keyThumb + keyPad
		c.FillText(b.keySty, vg.Point{X: x, Y: ky}, e.label)
		x += b.keySty.Width(e.label) + 3*keyPad
	}
	area := c
	area.Max.Y = y - kh - vg.Points(4) // the top tick label reaches above its panel
	rows, cols := 2, 3
	if len(shown) < len(b.tiles) {
		rows, cols = 1, len(shown)
	}
	ts := draw.Tiles{Rows: rows, Cols: cols, PadX: vg.Points(6), PadY: vg.Points(4)}
	for k, i := range shown {
		b.tiles[i].Draw(ts.At(area, k%cols, k/cols))
	}
}

// coupledBLCaption says where each surface's layer changes, in x/c, an
// item per surface.
func coupledBLCaption(e solver.CoupledElement) []string {
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
	return parts
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
