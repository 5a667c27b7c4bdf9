package figure

import (
	"fmt"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// streamPath is one traced streamline in metres, with the local speed / U∞
// at each point when known.
type streamPath struct {
	x, y     []float64
	speed    []float64 // nil when unknown
	dividing bool
}

// speedBins is the number of colour steps of speed colouring: enough to
// read the gradient, few enough to draw each step as one polyline.
const speedBins = 12

// speedLines draws streamlines coloured by local speed: each segment takes
// the colour of its bin on a blue–grey–orange ramp over [lo, hi], and
// consecutive segments in one bin are drawn as one polyline, which keeps
// the number of stroke calls small.
type speedLines struct {
	paths  []streamPath
	lo, hi float64
	ramp   [speedBins]color.Color
	width  vg.Length
}

func (s *speedLines) bin(v float64) int {
	if math.IsNaN(v) {
		return speedBins / 2
	}
	b := int((v - s.lo) / (s.hi - s.lo) * speedBins)
	return min(max(b, 0), speedBins-1)
}

func (s *speedLines) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	for _, sp := range s.paths {
		n := len(sp.x)
		i := 0
		for i+1 < n {
			b := s.bin(0.5 * (sp.speed[i] + sp.speed[i+1]))
			j := i + 1
			for j+1 < n && s.bin(0.5*(sp.speed[j]+sp.speed[j+1])) == b {
				j++
			}
			// One point of overlap on each side keeps the curve smooth
			// across the colour change.
			lo, hi := max(i-1, 0), min(j+1, n-1)
			pts := make([]vg.Point, 0, hi-lo+1)
			for k := lo; k <= hi; k++ {
				pts = append(pts, vg.Point{X: trX(sp.x[k] * mmPerM), Y: trY(sp.y[k] * mmPerM)})
			}
			pts = smoothPath(pts, i-lo, len(pts)-1-(hi-j))
			c.StrokeLines(lineStyle(s.ramp[b], s.width, nil), c.ClipLinesXY(pts)...)
			i = j
		}
	}
}

// speedRamp interpolates from a cool colour (slow) through a neutral to a
// warm one (fast).
func speedRamp(th *theme) [speedBins]color.Color {
	var r [speedBins]color.Color
	mix := func(a, b color.Color, t float64) color.Color {
		ar, ag, ab, _ := a.RGBA()
		br, bg, bb, _ := b.RGBA()
		f := func(x, y uint32) uint8 { return uint8((float64(x>>8)*(1-t) + float64(y>>8)*t) + 0.5) }
		return color.RGBA{R: f(ar, br), G: f(ag, bg), B: f(ab, bb), A: 255}
	}
	for i := range r {
		t := float64(i) / (speedBins - 1)
		if t < 0.5 {
			r[i] = mix(th.upper, th.faint, 2*t)
		} else {
			r[i] = mix(th.faint, th.lower, 2*t-1)
		}
	}
	return r
}

// streamlinesPlot draws the sections filled, the streamlines (the dividing
// streamline of each element bold), the ground line, at equal aspect.
func streamlinesPlot(sc *Scene, th *theme) (*plot.Plot, error) {
	bs := sceneBodies(sc)
	if len(bs) == 0 {
		return nil, noData(ViewStreamlines, "no elements")
	}
	title := "Streamlines"
	if sc.Solution != nil {
		title = fmt.Sprintf("Streamlines: α = %s°", formatTick(sc.Solution.AlphaDeg, 2))
	}
	paths := sceneStreamlines(sc)
	if sc.SpeedColour && len(paths) > 0 {
		title += ", coloured by local speed"
	}
	p := newPlot(th, title, "x, mm", "y, mm")
	k := newKey(th, keyTopRight)
	e := newExtent()
	var polys []plot.Plotter
	for _, b := range bs {
		xys := outlineXYs(b, true)
		for _, q := range xys {
			e.add(q.X, q.Y)
		}
		poly, err := plotter.NewPolygon(xys)
		if err != nil {
			return nil, &ViewError{View: ViewStreamlines, Err: fmt.Errorf("element %q: %w", b.name, err)}
		}
		// Fill clipped to the data area, outline drawn separately so that
		// the clip edges of a zoomed view are not drawn as if they were
		// the body's.
		poly.Color = th.bodyFill
		poly.LineStyle.Width = 0
		polys = append(polys, poly, &clippedLine{xys: xys, style: lineStyle(th.body, widthNormal, nil)})
		k.keep(xys)
	}
	bodyExt := e
	speedLo, speedHi := math.Inf(1), math.Inf(-1)
	for _, sp := range paths {
		for i := range sp.x {
			e.add(sp.x[i]*mmPerM, sp.y[i]*mmPerM)
		}
		for _, v := range sp.speed {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				speedLo, speedHi = math.Min(speedLo, v), math.Max(speedHi, v)
			}
		}
	}
	coloured := sc.SpeedColour && speedHi > speedLo
	if coloured {
		sl := &speedLines{lo: speedLo, hi: speedHi, ramp: speedRamp(th), width: widthNormal}
		for _, sp := range paths {
			if !sp.dividing && len(sp.speed) == len(sp.x) {
				sl.paths = append(sl.paths, sp)
			}
		}
		p.Add(sl)
		k.add(fmt.Sprintf("slow: V/U∞ %.2f", speedLo), legendLine{lineStyle(sl.ramp[0], widthBold, nil)})
		k.add(fmt.Sprintf("fast: V/U∞ %.2f", speedHi), legendLine{lineStyle(sl.ramp[speedBins-1], widthBold, nil)})
	}
	divSty := lineStyle(th.dividing, widthBold, nil)
	hasDiv := false
	for _, sp := range paths {
		if len(sp.x) < 2 || coloured && !sp.dividing && len(sp.speed) == len(sp.x) {
			continue
		}
		xys := make(plotter.XYs, len(sp.x))
		for i := range sp.x {
			xys[i] = plotter.XY{X: sp.x[i] * mmPerM, Y: sp.y[i] * mmPerM}
		}
		sty := lineStyle(th.stream, widthThin, nil)
		if sp.dividing {
			sty, hasDiv = divSty, true
		}
		p.Add(&clippedLine{xys: xys, style: sty, smooth: true})
		k.keep(xys)
	}
	if hasDiv {
		k.add("dividing streamline", legendLine{divSty})
	}
	p.Add(polys...) // bodies over the streamlines
	if d := coupledDetail(sc); d != nil {
		sty := lineStyle(th.lower, widthNormal, dashLower)
		for _, xys := range displacementPaths(d) {
			p.Add(&clippedLine{xys: xys, style: sty})
		}
		k.add("displacement surface and wake (coupled)", legendLine{sty})
	}
	if sc.Ground {
		p.Add(groundLine(sc, th))
		bodyExt.add(bodyExt.x0, sc.GroundY*mmPerM)
	}
	// Frame on the bodies (streamlines run far up- and downstream) unless a
	// window is set.
	if !bodyExt.empty() {
		d := math.Max(bodyExt.x1-bodyExt.x0, bodyExt.y1-bodyExt.y0)
		bodyExt.x0 -= 0.25 * d
		bodyExt.x1 += 0.25 * d
	}
	frame(p, sc.Window, bodyExt, 0.1)
	p.Add(k)
	return p, nil
}

// clippedLine is a polyline without a data range, clipped to the data
// area, for curves that should not widen the framing.
type clippedLine struct {
	xys    plotter.XYs
	style  draw.LineStyle
	smooth bool // draw a Catmull–Rom curve through the points
}

func (l *clippedLine) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	pts := make([]vg.Point, len(l.xys))
	for i, q := range l.xys {
		pts[i] = vg.Point{X: trX(q.X), Y: trY(q.Y)}
	}
	if l.smooth {
		pts = smoothPath(pts, 0, len(pts)-1)
	}
	c.StrokeLines(l.style, c.ClipLinesXY(pts)...)
}

// smoothSegment is the longest straight piece, in points, that smoothPath
// leaves: below it a polyline reads as a curve.
const smoothSegment = vg.Length(3)

// smoothPath returns the part of pts from index a to b (inclusive) with
// every segment longer than smoothSegment replaced by the uniform
// Catmull–Rom spline through its neighbours, P(t) = ½[2P₁ + (P₂ − P₀)t +
// (2P₀ − 5P₁ + 4P₂ − P₃)t² + (3P₁ − P₀ − 3P₂ + P₃)t³] (Catmull & Rom,
// A class of local interpolating splines, 1974), which passes through the
// traced points. The integrator keeps only its accepted steps, which are
// long where the flow is straight; zoomed in, straight chords between
// them would show as corners.
func smoothPath(pts []vg.Point, a, b int) []vg.Point {
	if b-a < 1 {
		return pts[a : b+1]
	}
	out := make([]vg.Point, 0, b-a+1)
	at := func(i int) vg.Point { return pts[min(max(i, 0), len(pts)-1)] }
	for i := a; i < b; i++ {
		p0, p1, p2, p3 := at(i-1), at(i), at(i+1), at(i+2)
		out = append(out, p1)
		d := math.Hypot(float64(p2.X-p1.X), float64(p2.Y-p1.Y))
		n := int(d / float64(smoothSegment))
		if n > 64 {
			n = 64 // a segment across the whole figure needs no more
		}
		for k := 1; k < n; k++ {
			t := vg.Length(k) / vg.Length(n)
			t2, t3 := t*t, t*t*t
			f := func(a, b, c, d vg.Length) vg.Length {
				return 0.5 * (2*b + (c-a)*t + (2*a-5*b+4*c-d)*t2 + (3*b-a-3*c+d)*t3)
			}
			out = append(out, vg.Point{X: f(p0.X, p1.X, p2.X, p3.X), Y: f(p0.Y, p1.Y, p2.Y, p3.Y)})
		}
	}
	return append(out, pts[b])
}

// sceneStreamlines converts the scene's streamlines to paths; speeds are
// kept only when there is one per point.
func sceneStreamlines(sc *Scene) []streamPath {
	paths := make([]streamPath, 0, len(sc.Streamlines))
	for _, s := range sc.Streamlines {
		sp := streamPath{x: make([]float64, len(s.Points)), y: make([]float64, len(s.Points)), dividing: s.Dividing}
		for i, q := range s.Points {
			sp.x[i], sp.y[i] = q.X, q.Y
		}
		if len(s.Speed) == len(s.Points) {
			sp.speed = s.Speed
		}
		paths = append(paths, sp)
	}
	return paths
}
