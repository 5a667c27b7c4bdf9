package figure

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg/draw"
)

// densityPlot draws a density study: Cl (left axis, solid) and Cp min
// (right axis, dashed) against the panel count on a logarithmic axis, one
// colour per nose clustering, with the extrapolated Cl and the recommended
// count marked.
func densityPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	d := sc.Density
	if d == nil || len(d.Rows) == 0 {
		return nil, noData(ViewDensity, "no density study")
	}
	title := "Density study"
	if d.RecommendedPanels > 0 {
		title = fmt.Sprintf("Density study: %d panels recommended", d.RecommendedPanels)
	}
	if d.Cl.OK {
		title += fmt.Sprintf(", Cl → %s (extrapolated)", formatTick(d.Cl.Value, 4))
	}
	p := newPlot(th, title, "panels per element", "Cl")
	k := newKey(th, keyTopLeft)
	p.X.Scale = plot.LogScale{}
	counts := map[int]bool{}
	cl0, cl1, cp0, cp1 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, r := range d.Rows {
		if !r.Solved() { // skipped: the configuration could not be placed at that count
			continue
		}
		counts[r.Panels] = true
		cl0, cl1 = math.Min(cl0, r.Cl), math.Max(cl1, r.Cl)
		cp0, cp1 = math.Min(cp0, r.CpMin), math.Max(cp1, r.CpMin)
	}
	if d.Cl.OK {
		cl0, cl1 = math.Min(cl0, d.Cl.Value), math.Max(cl1, d.Cl.Value)
	}
	var ticks []plot.Tick
	for n := range counts {
		ticks = append(ticks, plot.Tick{Value: float64(n), Label: strconv.Itoa(n)})
	}
	sort.Slice(ticks, func(i, j int) bool { return ticks[i].Value < ticks[j].Value })
	p.X.Tick.Marker = plot.ConstantTicks(ticks)
	p.X.Min, p.X.Max = ticks[0].Value/1.15, ticks[len(ticks)-1].Value*1.15
	// Headroom above the curves holds the key.
	const headroom = 0.6
	p.Y.Min, p.Y.Max = padRange(cl0, cl1, 0.08)
	p.Y.Max += headroom * (p.Y.Max - p.Y.Min)
	lo, hi := padRange(cp0, cp1, 0.08)
	hi += headroom * (hi - lo)
	tw := &twinAxis{
		min: lo, max: hi, label: "Cp min", color: th.second,
		tickLabel: noteStyle(th, th.fg, 9, text.XLeft, text.YCenter),
		axisLabel: noteStyle(th, th.fg, 10, text.XCenter, text.YCenter),
	}
	// One series per nose clustering, in the order they first appear.
	var noses []float64
	seen := map[float64]bool{}
	for _, r := range d.Rows {
		if !seen[r.Nose] {
			seen[r.Nose] = true
			noses = append(noses, r.Nose)
		}
	}
	for si, nose := range noses {
		c := th.upper
		if si > 0 {
			c = th.pin(si - 1)
		}
		var xl, xc plotter.XYs
		for _, r := range d.Rows {
			if r.Nose == nose && r.Solved() {
				xl = append(xl, plotter.XY{X: float64(r.Panels), Y: r.Cl})
				xc = append(xc, plotter.XY{X: float64(r.Panels), Y: tw.toLeft(p, r.CpMin)})
			}
		}
		k.keep(xl, xc)
		p.Add(newLine(xl, lineStyle(c, widthNormal, nil)), newScatter(xl, c, glyphSmall, draw.CircleGlyph{}))
		p.Add(newLine(xc, lineStyle(c, widthThin, dashLower)), newScatter(xc, c, glyphSmall, draw.SquareGlyph{}))
		k.add(fmt.Sprintf("nose %.2f: Cl", nose), legendLine{lineStyle(c, widthNormal, nil)})
		k.add(fmt.Sprintf("nose %.2f: Cp min (right)", nose), legendLine{lineStyle(c, widthThin, dashLower)})
	}
	if d.Cl.OK {
		p.Add(&refLine{value: d.Cl.Value, style: lineStyle(th.faint, widthThin, dashRef),
			label: fmt.Sprintf("Cl extrapolated %s", formatTick(d.Cl.Value, 4)), labelSty: noteStyle(th, th.faint, 8, text.XLeft, text.YBottom)})
	}
	if d.RecommendedPanels > 0 {
		// Keep the key off the line and its label at the top.
		var line plotter.XYs
		for i := range 11 {
			line = append(line, plotter.XY{X: float64(d.RecommendedPanels), Y: p.Y.Min + float64(i)/10*(p.Y.Max-p.Y.Min)})
		}
		k.keep(line)
		p.Add(&refLine{value: float64(d.RecommendedPanels), vertical: true, style: lineStyle(th.accent, widthThin, dashRef),
			label: "recommended", labelSty: noteStyle(th, th.accent, 8, text.XLeft, text.YTop)})
	}
	p.Add(tw, k)
	return p, nil
}
