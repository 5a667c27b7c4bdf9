package figure

import (
	"fmt"
	"image"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/solver"
)

// DensityLEChord is the share of the chord the leading-edge overlay of a
// density study shows: the first 10 %, where nose clustering acts and the
// suction peak of a working section sits.
const DensityLEChord = 0.1

// DensityCurve is the solution of one row of a density study, kept for
// the leading-edge overlay.
type DensityCurve struct {
	Panels   int
	Nose     float64
	Solution *solver.Solution
}

// DensityLEPlot draws Cp (negative up) against x/c over the first xcMax of
// the chord of element for each curve, coarse counts faint and fine counts
// strong, upper surface solid and lower dashed, with a dot at every panel's
// control point so that the spacing shows. It returns a *ViewError wrapping
// ErrNoData when no curve has panels there, and panics if xcMax is not in
// (0, 1] or element is negative.
func DensityLEPlot(curves []DensityCurve, element int, xcMax float64, dark bool) (*plot.Plot, error) {
	if !(xcMax > 0 && xcMax <= 1) {
		panic(fmt.Sprintf("figure: DensityLEPlot: chord share %g outside (0, 1]", xcMax))
	}
	if element < 0 {
		panic(fmt.Sprintf("figure: DensityLEPlot: element %d", element))
	}
	th := themeFor(dark)
	name, nose := "", math.NaN()
	var used []DensityCurve
	for _, c := range curves {
		if c.Solution != nil && element < len(c.Solution.Elements) {
			used = append(used, c)
			if name == "" {
				name, nose = c.Solution.Elements[element].Name, c.Nose
			}
		}
	}
	if len(used) == 0 {
		return nil, noData(ViewDensity, "no density-study solutions")
	}
	title := fmt.Sprintf("Leading edge: Cp over the first %s %% of chord", formatTick(100*xcMax, 0))
	if len(used[0].Solution.Elements) > 1 {
		title += " of " + name
	}
	if sameNose(used) {
		title += fmt.Sprintf(", nose %.2f", nose)
	}
	p := newPlot(th, title, "x/c", "Cp")
	p.Y.Scale = plot.InvertedScale{Normalizer: plot.LinearScale{}}
	p.Add(&refLine{value: 0, style: lineStyle(th.faint, widthThin, nil)})
	k := newKey(th, keyBottomRight)
	ext := newExtent()
	for i, c := range used {
		col := ramp(th, i, len(used))
		up, lo := leadingEdgeCp(c.Solution.Elements[element], xcMax)
		for _, s := range []struct {
			xys  plotter.XYs
			dash bool
		}{{up, false}, {lo, true}} {
			if len(s.xys) == 0 {
				continue
			}
			for _, q := range s.xys {
				ext.add(q.X, q.Y)
			}
			var dash = dashLower
			if !s.dash {
				dash = nil
			}
			k.keep(s.xys)
			p.Add(newLine(s.xys, lineStyle(col, widthNormal, dash)), newScatter(s.xys, col, glyphSmall, draw.CircleGlyph{}))
		}
		label := fmt.Sprintf("%d panels", c.Panels)
		if !sameNose(used) {
			label += fmt.Sprintf(", nose %.2f", c.Nose)
		}
		k.add(label, legendLine{lineStyle(col, widthNormal, nil)})
	}
	if ext.empty() {
		return nil, noData(ViewDensity, "no panels near the leading edge")
	}
	k.add("upper surface solid, lower dashed", legendLine{lineStyle(th.faint, widthThin, dashLower)})
	p.X.Min, p.X.Max = 0, xcMax
	p.Y.Min, p.Y.Max = padRange(ext.y0, ext.y1, 0.06)
	p.Add(k)
	return p, nil
}

// sameNose reports whether every curve has the first curve's nose value.
func sameNose(cs []DensityCurve) bool {
	for _, c := range cs {
		if c.Nose != cs[0].Nose {
			return false
		}
	}
	return true
}

// leadingEdgeCp returns (x/c, Cp) of the panels with x/c ≤ xcMax on each
// surface, in chordwise order from the leading edge.
func leadingEdgeCp(es solver.ElementSolution, xcMax float64) (upper, lower plotter.XYs) {
	for _, p := range es.Panels {
		if p.XC > xcMax {
			continue
		}
		q := plotter.XY{X: p.XC, Y: p.Cp}
		if p.Side == solver.Upper {
			upper = append(upper, q)
		} else {
			lower = append(lower, q)
		}
	}
	// The upper surface runs from the trailing edge to the leading edge.
	for i, j := 0, len(upper)-1; i < j; i, j = i+1, j-1 {
		upper[i], upper[j] = upper[j], upper[i]
	}
	return upper, lower
}

// ramp returns the colour of curve i of n: from a pale tint of the
// theme's upper-surface colour (coarsest) to the full colour (finest),
// linear in RGB between the background and that colour.
func ramp(th *theme, i, n int) color.Color {
	f := 1.0
	if n > 1 {
		f = float64(i) / float64(n-1)
	}
	// Keep the coarsest curve visible: start a quarter of the way along.
	const start = 0.25
	f = start + (1-start)*f
	r0, g0, b0, _ := th.bg.RGBA()
	r1, g1, b1, _ := th.upper.RGBA()
	mix := func(a, b uint32) uint8 { return uint8(math.Round((float64(a)*(1-f) + float64(b)*f) / 257)) }
	return color.RGBA{R: mix(r0, r1), G: mix(g0, g1), B: mix(b0, b1), A: 255}
}

// RenderPlot draws a plot built by DensityLEPlot or PanelSizesPlot into a
// widthPx × heightPx image at dpi, as Render does for the views. composite
// marks a figure of several panels, on which DataAt reports nothing. It
// panics if a size or the dpi is not positive.
func RenderPlot(p *plot.Plot, composite bool, widthPx, heightPx int, dpi float64) *Figure {
	if widthPx <= 0 || heightPx <= 0 || !(dpi > 0) {
		panic(fmt.Sprintf("figure: bad render size %d×%d at %g dpi", widthPx, heightPx, dpi))
	}
	return renderPlot(p, viewInfo{composite: composite}, image.NewRGBA(image.Rect(0, 0, widthPx, heightPx)), dpi)
}
