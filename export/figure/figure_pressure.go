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

// cpStagnation is Cp at a stagnation point, 1 − (0/U∞)².
const cpStagnation = 1

// cpAbscissa maps a panel of element i to the pressure view's x axis: x/c
// on the element's own chord when one element is shown, else x/c_ref from
// the foremost point of the configuration, so that the elements of a
// multi-element wing stand side by side.
type cpAbscissa struct {
	perElement bool
	x0, cref   float64 // configuration frame, metres
}

func (a cpAbscissa) panel(p solver.Panel) float64 {
	if a.perElement {
		return p.XC
	}
	return (p.X - a.x0) / a.cref
}

// pinX maps a pinned curve's x/c on element i to the axis; in the
// configuration abscissa it needs the element's chord line from the
// scene's geometry.
func (a cpAbscissa) pinX(sc *Scene, i int, xc float64) (float64, bool) {
	if a.perElement {
		return xc, true
	}
	bs := sceneBodies(sc)
	if i >= len(bs) || len(bs[i].nodes) < 2 {
		return 0, false
	}
	// The chord line as solved: leading-edge node to the trailing-edge
	// midpoint.
	n := bs[i].nodes
	le := n[bs[i].le]
	te := n[0].Add(n[len(n)-1]).Scale(0.5)
	x := le.X + xc*(te.X-le.X)
	return (x - a.x0) / a.cref, true
}

// pressurePlot draws Cp against x/c, negative up (the trade's convention:
// suction plotted upwards), upper surface solid, lower dashed.
func pressurePlot(sc *Scene, th *theme) (*plot.Plot, *key, error) {
	sol := sc.Solution
	if sol == nil || len(sol.Elements) == 0 {
		return nil, nil, noData(ViewPressure, "no solution")
	}
	if sc.Element < -1 || sc.Element >= len(sol.Elements) {
		return nil, nil, &ViewError{View: ViewPressure, Err: fmt.Errorf("element %d is not in 0..%d", sc.Element, len(sol.Elements)-1)}
	}
	shown := []int{sc.Element}
	if sc.Element < 0 {
		shown = shown[:0]
		for i := range sol.Elements {
			shown = append(shown, i)
		}
	}
	ab := cpAbscissa{perElement: len(shown) == 1}
	xlabel := "x/c"
	if !ab.perElement {
		ab.x0 = math.Inf(1)
		for _, es := range sol.Elements {
			for _, p := range es.Panels {
				ab.x0 = math.Min(ab.x0, p.X)
			}
		}
		ab.cref = sol.RefChord
		if !(ab.cref > 0) {
			ab.cref = 0
			for _, es := range sol.Elements {
				ab.cref += es.Chord
			}
		}
		xlabel = "x/c (reference chord, from the foremost leading edge)"
	}
	elem := -1
	if ab.perElement {
		elem = shown[0]
	}
	on, cl := "Pressure", sol.Cl
	if ab.perElement {
		es := sol.Elements[shown[0]]
		cl = es.Cl
		if len(sol.Elements) > 1 {
			on = "Pressure on " + es.Name
		}
	}
	title := fmt.Sprintf("%s: α = %s°, Cl from circulation %s", on, formatTick(sol.AlphaDeg, 2), formatTick(cl, 4))
	if ct, ok := coupledTitle(sc.Coupled, elem); ok {
		title = fmt.Sprintf("%s: α = %s°, %s", on, formatTick(sol.AlphaDeg, 2), ct)
	} else {
		title += ct
	}
	p := newPlot(th, title, xlabel, "Cp")
	k := newKey(th, keyTopRight)
	// In rows above the data: Cp curves run through every corner (the
	// viscous lower surface ran under the key's box at mid-chord).
	k.above = true
	p.Y.Scale = plot.InvertedScale{Normalizer: plot.LinearScale{}}
	p.Add(&refLine{value: 0, style: lineStyle(th.faint, widthThin, nil)})

	// Pins first, so the live curves draw over them.
	for j, pin := range sc.Pins {
		c := fade(th.pin(j), 150)
		added := false
		for _, pc := range pin.Cp {
			i := elementIndex(sol, pc.Element)
			if i < 0 || !contains(shown, i) || len(pc.Points) < 2 {
				continue
			}
			xys := make(plotter.XYs, 0, len(pc.Points))
			for _, q := range pc.Points {
				x, ok := ab.pinX(sc, i, q[0])
				if !ok {
					break
				}
				xys = append(xys, plotter.XY{X: x, Y: q[1]})
			}
			if len(xys) < 2 {
				continue
			}
			dash := pinDash(j)
			if pc.Side == solver.Lower.String() {
				dash = dashLower
			}
			k.keep(xys)
			l := newLine(xys, lineStyle(c, widthNormal, dash))
			p.Add(l)
			if !added {
				k.add(pinKeyPrefix+pin.Label, legendLine{lineStyle(c, widthNormal, pinDash(j))})
				added = true
			}
		}
	}

	upSty := lineStyle(th.upper, widthNormal, nil)
	loSty := lineStyle(th.lower, widthNormal, dashLower)
	noteSty := noteStyle(th, th.fg, 8, text.XLeft, text.YCenter)
	var mins, stags plotter.XYs
	labels := &noteSet{}
	for _, i := range shown {
		es := sol.Elements[i]
		var up, lo plotter.XYs
		for _, pn := range es.Panels {
			q := plotter.XY{X: ab.panel(pn), Y: pn.Cp}
			if pn.Side == solver.Upper {
				up = append(up, q)
			} else {
				lo = append(lo, q)
			}
		}
		k.keep(up, lo)
		if len(up) > 0 {
			p.Add(newLine(up, upSty))
		}
		if len(lo) > 0 {
			p.Add(newLine(lo, loSty))
		}
		xmin := es.XCpMin
		xst := es.Stagnation.XC
		if !ab.perElement {
			xmin, xst = cpElementX(es, xmin, ab), cpElementX(es, xst, ab)
		}
		mins = append(mins, plotter.XY{X: xmin, Y: es.CpMin})
		stags = append(stags, plotter.XY{X: xst, Y: cpStagnation})
		// On the reference chord's axis the labels name their element and
		// say that their x/c is along its own chord, not the axis's (the
		// flap's peak at x/c 0.231 was drawn at 0.75).
		name, own := "", ""
		if !ab.perElement {
			name, own = es.Name+": ", " (own chord)"
		}
		labels.add(&note{x: xmin, y: es.CpMin, dx: vg.Points(5), text: fmt.Sprintf("%sCp min %s at x/c %.3f%s", name, formatTick(es.CpMin, 3), es.XCpMin, own), style: noteSty})
		labels.add(&note{x: xst, y: cpStagnation, dx: vg.Points(5), dy: vg.Points(-2), text: fmt.Sprintf("stagnation x/c %.4f%s", es.Stagnation.XC, own), style: noteStyle(th, th.faint, 8, text.XLeft, text.YTop)})
	}
	viscous := addViscousCp(p, k, sc, shown, ab, th)
	p.Add(labels)
	ms := newScatter(mins, th.accent, glyphMarker, draw.CircleGlyph{})
	ss := newScatter(stags, th.fg, glyphMarker, draw.TriangleGlyph{})
	p.Add(ms, ss)
	k.keep(mins, stags)
	if viscous {
		k.pinsInviscid()
		k.add("inviscid upper", legendLine{upSty})
		k.add("inviscid lower", legendLine{loSty})
		keyViscousCp(k, th)
	} else {
		k.add("upper surface", legendLine{upSty})
		k.add("lower surface", legendLine{loSty})
	}
	k.add("minimum Cp", ms)
	k.add("stagnation", ss)
	// Leave room above the suction peak for its label and below Cp = 1.
	lo, hi := p.Y.Min, math.Max(p.Y.Max, cpStagnation)
	d := hi - lo
	p.Y.Min, p.Y.Max = lo-0.08*d, hi+0.06*d
	p.X.Min, p.X.Max = padRange(p.X.Min, p.X.Max, 0.02)
	p.Add(k)
	return p, k, nil
}

// cpElementX maps an x/c on element es to the configuration abscissa by
// interpolating between its panels' positions.
func cpElementX(es solver.ElementSolution, xc float64, ab cpAbscissa) float64 {
	best, bd := 0.0, math.Inf(1)
	for _, p := range es.Panels {
		if d := math.Abs(p.XC - xc); d < bd {
			best, bd = ab.panel(p), d
		}
	}
	return best
}

func elementIndex(sol *solver.Solution, name string) int {
	for i, e := range sol.Elements {
		if e.Name == name {
			return i
		}
	}
	return -1
}

func contains(s []int, v int) bool {
	for _, x := range s {
		if x == v {
			return true
		}
	}
	return false
}
