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

// DefaultMaxNeighbourRatio is the size ratio of adjacent panels above which
// the panel-size figure warns: growth of at most about 1.5 from one panel
// to the next keeps a panel method's discretisation error even (common
// practice; see model.NeighbourRatios).
const DefaultMaxNeighbourRatio = 1.5

// logSpan is the ratio of the longest to the shortest panel from which
// the length axis is logarithmic.
const logSpan = 10

// PanelSizes are the panel lengths of one placed element along its contour.
type PanelSizes struct {
	Element string
	// Position is where each panel's midpoint lies along the contour as a
	// fraction of its length: 0 at the upper trailing edge, through the
	// leading edge at LEPosition, to 1 at the lower trailing edge.
	Position []float64
	Length   []float64 // panel length on the element's chord
	// RatioPosition is the position of each interior node and Ratio the
	// size ratio of the two panels meeting there, max/min ≥ 1
	// (model.NeighbourRatios).
	RatioPosition []float64
	Ratio         []float64
	LEPosition    float64
}

// Over returns the indices into Ratio of the checked ratios above
// maxRatio (model.CheckedRatio: the trailing-edge ends are left out).
func (s PanelSizes) Over(maxRatio float64) []int {
	var out []int
	for i, r := range s.Ratio {
		if r > maxRatio && model.CheckedRatio(i, len(s.Ratio)) {
			out = append(out, i)
		}
	}
	return out
}

// MaxRatio returns the largest checked neighbour ratio
// (model.CheckedRatio), 1 for fewer than two panels.
func (s PanelSizes) MaxRatio() float64 {
	m := 1.0
	for i, r := range s.Ratio {
		if model.CheckedRatio(i, len(s.Ratio)) {
			m = math.Max(m, r)
		}
	}
	return m
}

// PanelSizesOf returns the panel sizes of every element of a placed
// configuration, from model.PanelLengths and model.NeighbourRatios of its
// nodes. An element whose nodes do not form a section (fewer than three)
// returns the model's error.
func PanelSizesOf(l *model.Layout) ([]PanelSizes, error) {
	if l == nil {
		panic("figure: PanelSizesOf of a nil layout")
	}
	out := make([]PanelSizes, 0, len(l.Elements))
	for _, e := range l.Elements {
		sec, err := model.NewSection(e.Name, e.Nodes)
		if err != nil {
			return nil, fmt.Errorf("panel sizes of %s: %w", e.Name, err)
		}
		lengths := model.PanelLengths(sec)
		total := 0.0
		for _, v := range lengths {
			total += v
		}
		ps := PanelSizes{Element: e.Name, Ratio: model.NeighbourRatios(sec)}
		if !(total > 0) || !(e.Chord > 0) {
			return nil, fmt.Errorf("panel sizes of %s: contour of zero length", e.Name)
		}
		s := 0.0
		for i, v := range lengths {
			if i == e.LE {
				ps.LEPosition = s / total
			}
			ps.Position = append(ps.Position, (s+v/2)/total)
			ps.Length = append(ps.Length, v/e.Chord)
			s += v
			if i+1 < len(lengths) {
				ps.RatioPosition = append(ps.RatioPosition, s/total)
			}
		}
		if e.LE >= len(lengths) {
			ps.LEPosition = 1
		}
		out = append(out, ps)
	}
	return out, nil
}

// PanelSizesPlot draws one element's panel sizes in two panels: the panel
// length on the chord (logarithmic) and the neighbour ratio against the
// position along the contour, the leading edge marked, the ratio limit
// drawn and the ratios above it picked out. It panics if maxRatio ≤ 1.
func PanelSizesPlot(s PanelSizes, maxRatio float64, dark bool) (*plot.Plot, error) {
	if !(maxRatio > 1) {
		panic(fmt.Sprintf("figure: PanelSizesPlot: ratio limit %g ≤ 1", maxRatio))
	}
	if len(s.Length) == 0 {
		return nil, noData(ViewPanels, "no panels")
	}
	th := themeFor(dark)
	const xlabel = "position along the contour: upper TE 0 → LE → lower TE 1"

	lp := newPlot(th, "", "", "panel length / chord")
	var xl plotter.XYs
	lmin, lmax := math.Inf(1), 0.0
	for i, v := range s.Length {
		if v > 0 {
			xl = append(xl, plotter.XY{X: s.Position[i], Y: v})
			lmin, lmax = math.Min(lmin, v), math.Max(lmax, v)
		}
	}
	if len(xl) == 0 {
		return nil, noData(ViewPanels, "every panel has zero length")
	}
	lp.Add(newLine(xl, lineStyle(th.upper, widthNormal, nil)), newScatter(xl, th.upper, glyphSmall, draw.CircleGlyph{}))
	// Lengths spanning a decade or more (clustered edges) read best on a
	// logarithmic axis; a narrower spread on a linear one.
	if lmax >= logSpan*lmin {
		lp.Y.Scale = plot.LogScale{}
		lp.Y.Tick.Marker = plot.LogTicks{Prec: -1}
		lp.Y.Min, lp.Y.Max = lmin/1.5, lmax*1.5
	} else {
		lp.Y.Min, lp.Y.Max = padRange(0, lmax, 0.08)
		lp.Y.Min = 0
	}
	lp.X.Min, lp.X.Max = 0, 1

	rp := newPlot(th, "", xlabel, "neighbour ratio")
	var xr, bad plotter.XYs
	rmax := maxRatio
	for i, r := range s.Ratio {
		if math.IsInf(r, 0) || math.IsNaN(r) {
			continue // a zero-length panel: counted by Over, not drawable
		}
		q := plotter.XY{X: s.RatioPosition[i], Y: r}
		xr = append(xr, q)
		if r > maxRatio {
			bad = append(bad, q)
		}
		rmax = math.Max(rmax, r)
	}
	if len(xr) > 0 {
		rp.Add(newLine(xr, lineStyle(th.fg, widthThin, nil)), newScatter(xr, th.fg, glyphSmall, draw.CircleGlyph{}))
	}
	if len(bad) > 0 {
		rp.Add(newScatter(bad, th.accent, glyphMarker, draw.RingGlyph{}))
	}
	rp.Add(&refLine{value: maxRatio, style: lineStyle(th.accent, widthThin, dashRef),
		label: fmt.Sprintf("limit %s", formatTick(maxRatio, 2)), labelSty: noteStyle(th, th.accent, 8, text.XLeft, text.YBottom)})
	rp.X.Min, rp.X.Max = 0, 1
	rp.Y.Min, rp.Y.Max = 1, 1+1.15*(rmax-1)

	for _, q := range []*plot.Plot{lp, rp} {
		q.Add(&refLine{value: s.LEPosition, vertical: true, style: lineStyle(th.faint, widthThin, dashRef),
			label: "LE", labelSty: noteStyle(th, th.faint, 8, text.XLeft, text.YTop)})
	}
	title := fmt.Sprintf("Panel sizes of %s: %d panels, %s–%s of chord", s.Element, len(s.Length), formatTick(100*lmin, 2)+" %", formatTick(100*lmax, 2)+" %")
	if n := len(s.Over(maxRatio)); n > 0 {
		title += fmt.Sprintf("; %d neighbour ratio%s above %s", n, pluralS(n), formatTick(maxRatio, 2))
	}
	return compositePlot(th, title, 2, 1, lp, rp), nil
}

func pluralS(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
