package figure

import (
	"fmt"
	"image"
	"image/color"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/palette/moreland"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// The set-up figures: one quantity of a set-up map against one variable
// (SetupCurvePlot), a quantity over two variables (SetupGridPlot), the
// setting search's progress (SearchPlot) and the finite-span estimate's
// spanwise load (SpanLoadPlot). They take plain numbers, so that the app,
// the report and tests can feed them from any source.

// SetupCurve is one quantity against one set-up variable. Points may come
// in any order (a map streams them); they are drawn sorted by X.
type SetupCurve struct {
	Title, XLabel, YLabel string
	X, Y                  []float64 // Y is NaN where the point has no value
	// Separated marks points whose suction side separates ahead of the
	// limit the caller chose; Failed marks points with no answer (not
	// converged, or not solvable): crossed on the x axis, never drawn as
	// values; NotSolve marks points known not to be a single solve's
	// answer (engine.Point.NotSolve: a single solve of the setting
	// reaches another root of the coupled equations, or none): boxed.
	// Any may be nil.
	Separated, Failed, NotSolve []bool
	// NearGround marks points closer to the ground than
	// model.GroundHOverCMin of the main element's chord
	// (model.Study.NearGround), where the workbench flags the study
	// "very close to the ground" (model.GroundCaution). Drawn in a
	// triangle of their own; may be nil. NearGroundLabel says so in
	// words, for captions.
	NearGround      []bool
	NearGroundLabel string
	// Held marks points whose coupled solution converged only with
	// transition held upstream of its e^N position, as if tripped
	// (model.FlagHeld): filled boxes, as the polar draws such rows; may
	// be nil. A held root can be attached between separated neighbours
	// (the two-element example's ride-height map at 40 mm).
	Held []bool
	// Current is the study's own value of the variable (a vertical line),
	// NaN for none; Onset is where separation sets in (a labelled vertical
	// line), NaN for none.
	// Inviscid: the points are the panel method's, which knows nothing of
	// separation (the key does not call them attached).
	Inviscid       bool
	Current, Onset float64
	// OnsetLabel says where separation sets in, in words (for captions);
	// OnsetShort is the figure's label of the line (OnsetLabel when
	// empty).
	OnsetLabel, OnsetShort string
	// XFrom and XTo are the range the variable runs over, drawn whole
	// from the first point on (equal: the points' own range): a map's
	// first point alone had an axis ±1 about it, its tick labels run
	// together, and the axis jumped as points streamed in.
	XFrom, XTo float64
	// AtMostOne: the quantity is at most 1 (separation x/c, 1 attached),
	// and the axis stops just above it (0 to 2 when every point was
	// attached).
	AtMostOne bool
}

// ErrNoSetupData is the set-up figures' error when there is nothing to
// draw yet; it wraps ErrNoData.
var ErrNoSetupData = fmt.Errorf("no points with a value yet: %w", ErrNoData)

// SetupCurvePlot draws a SetupCurve: the points with a value joined in
// order of X, separated points in a hollow marker of their own, points
// that are not a single solve's answer in a box, points without an
// answer as crosses on the x axis (a point with a NaN value
// that is not Failed, a quantity the point does not have, is left out),
// and the study's value and the separation onset as vertical lines.
func SetupCurvePlot(c SetupCurve, dark bool) (*plot.Plot, error) {
	if len(c.Y) != len(c.X) {
		panic("figure: SetupCurvePlot: X and Y of different lengths")
	}
	th := themeFor(dark)
	p := newPlot(th, c.Title, c.XLabel, c.YLabel)
	k := newKey(th, keyTopRight)
	type pt struct {
		x, y                        float64
		sep, fail, from, near, held bool
	}
	var pts []pt
	for i, x := range c.X {
		q := pt{x: x, y: c.Y[i]}
		q.sep = i < len(c.Separated) && c.Separated[i]
		q.fail = i < len(c.Failed) && c.Failed[i]
		q.from = i < len(c.NotSolve) && c.NotSolve[i]
		q.near = i < len(c.NearGround) && c.NearGround[i]
		q.held = i < len(c.Held) && c.Held[i]
		if !q.fail && math.IsNaN(q.y) {
			continue
		}
		pts = append(pts, q)
	}
	sort.Slice(pts, func(i, j int) bool { return pts[i].x < pts[j].x })
	var line, attached, separated, notSolve, near, held plotter.XYs
	var failed []float64
	ext := newExtent()
	for _, q := range pts {
		if q.fail {
			failed = append(failed, q.x)
			ext.x0, ext.x1 = math.Min(ext.x0, q.x), math.Max(ext.x1, q.x)
			continue
		}
		xy := plotter.XY{X: q.x, Y: q.y}
		ext.add(q.x, q.y)
		line = append(line, xy)
		if q.from {
			notSolve = append(notSolve, xy)
		}
		if q.near {
			near = append(near, xy)
		}
		if q.held {
			held = append(held, xy)
		}
		if q.sep {
			separated = append(separated, xy)
		} else {
			attached = append(attached, xy)
		}
	}
	if len(line) == 0 && len(failed) == 0 {
		return nil, ErrNoSetupData
	}
	k.keep(line)
	if len(line) > 1 {
		p.Add(newLine(line, lineStyle(th.upper, widthNormal, nil)))
	}
	if len(attached) > 0 {
		s := newScatter(attached, th.upper, glyphMarker*0.8, draw.CircleGlyph{})
		p.Add(s)
		if c.Inviscid {
			k.add("panel method (no separation)", s)
		} else {
			k.add("attached", s)
		}
	}
	if len(separated) > 0 {
		s := newScatter(separated, th.lower, glyphMarker*1.2, draw.RingGlyph{})
		p.Add(s)
		k.add("suction side separated", s)
	}
	if len(held) > 0 {
		s := newScatter(held, th.lower, glyphMarker*1.5, draw.BoxGlyph{})
		p.Add(s)
		k.add(heldKey, s)
	}
	addNotSolve(p, k, th, notSolve)
	addNearGround(p, k, th, near)
	addNoAnswer(p, k, th, failed, len(pts))
	for _, x := range failed {
		k.keep(plotter.XYs{{X: x, Y: ext.y0}})
	}
	// The lines' labels go below the key's height, so that a key in a top
	// corner does not hide them.
	below := 2*keyPad + k.text.Height("Xg")*1.25*vg.Length(len(k.entries)) + keyMargin
	if !math.IsNaN(c.Onset) {
		label := c.OnsetShort
		if label == "" {
			label = c.OnsetLabel
		}
		r := &refLine{value: c.Onset, vertical: true, style: lineStyle(th.lower, widthNormal, dashRef), label: label, labelSty: noteStyle(th, th.lower, 8, text.XLeft, text.YTop), drop: below}
		p.Add(r)
		ext.x0, ext.x1 = math.Min(ext.x0, c.Onset), math.Max(ext.x1, c.Onset)
	}
	if !math.IsNaN(c.Current) {
		k.keep(plotter.XYs{{X: c.Current, Y: ext.y1}})
		p.Add(&refLine{value: c.Current, vertical: true, style: lineStyle(th.accent, widthThin, nil), label: "study", labelSty: noteStyle(th, th.accent, 8, text.XLeft, text.YTop), drop: below + vg.Points(11)})
	}
	if ext.y0 > ext.y1 { // only crosses
		ext.y0, ext.y1 = 0, 1
	}
	if c.XTo > c.XFrom && !math.IsInf(c.XTo-c.XFrom, 0) {
		ext.x0, ext.x1 = math.Min(ext.x0, c.XFrom), math.Max(ext.x1, c.XTo)
	}
	p.X.Min, p.X.Max = padRange(ext.x0, ext.x1, 0.04)
	p.Y.Min, p.Y.Max = padRange(ext.y0, ext.y1, 0.08)
	if c.AtMostOne && p.Y.Max > 1 {
		p.Y.Max = 1 + 0.05*math.Max(1-p.Y.Min, 0.1)
	}
	if n := len(k.entries); n > 1 {
		// Room above the data for a key of several entries, which would
		// otherwise cover points of a small figure (the app's cells):
		// about a sixth of the axis per entry beyond the first.
		p.Y.Max += (p.Y.Max - p.Y.Min) * keyRoomPerEntry * float64(n-1)
	}
	p.Add(k)
	return p, nil
}

// keyRoomPerEntry is the fraction of a set-up curve's y range added
// above the data for each key entry beyond the first.
const keyRoomPerEntry = 0.16

// addNotSolve boxes the points that are not a single solve's answer,
// with their key entry (none for none).
func addNotSolve(p *plot.Plot, k *key, th *theme, xys plotter.XYs) {
	if len(xys) == 0 {
		return
	}
	s := newScatter(xys, th.accent, glyphMarker*1.6, draw.SquareGlyph{})
	p.Add(s)
	k.add(fmt.Sprintf("a single solve differs (%d)", len(xys)), s)
}

// heldKey is the key entry of the points held (SetupCurve.Held): short
// enough for the set-up window's cells ("… (as if tripped)" ran past
// their edge); the readout and the flags say the rest.
const heldKey = "transition held upstream"

// nearGroundKey is the key entry of the points too near the ground
// (SetupCurve.NearGround, SetupGrid.NearGround): short enough for the
// set-up window's cells.
var nearGroundKey = fmt.Sprintf("too near the ground (h/c < %g)", model.GroundHOverCMin)

// addNearGround puts a triangle round the points too near the ground,
// with their key entry (none for none).
func addNearGround(p *plot.Plot, k *key, th *theme, xys plotter.XYs) {
	if len(xys) == 0 {
		return
	}
	s := newScatter(xys, th.accent, glyphMarker*1.7, draw.TriangleGlyph{})
	p.Add(s)
	k.add(nearGroundKey, s)
}

// addNoAnswer crosses the points without an answer, at xs on the x axis,
// with their key entry (none for none).
func addNoAnswer(p *plot.Plot, k *key, th *theme, xs []float64, total int) {
	if len(xs) == 0 {
		return
	}
	b := &bottomMarks{alphas: xs, glyph: draw.GlyphStyle{Color: th.accent, Radius: glyphMarker, Shape: draw.CrossGlyph{}}}
	p.Add(b)
	k.add(fmt.Sprintf("no answer (%d of %d)", len(xs), total), b)
}

// SetupGrid is one quantity over two set-up variables: Z[i][j] at X[i]
// and Y[j] (NaN where the point has no value). With Z nil it is only the
// plane from X[0] to X[len−1] and Y[0] to Y[len−1], for a search's path.
type SetupGrid struct {
	Title, XLabel, YLabel, ZLabel string
	X, Y                          []float64 // increasing
	Z                             [][]float64
	// Separated, Failed, NotSolve and NearGround mark cells as
	// SetupCurve does; any may be nil.
	Separated, Failed, NotSolve, NearGround [][]bool
	// Path is a search's path in (X, Y), in the order evaluated; Start and
	// Best are marked when not NaN.
	Path        [][2]float64
	Start, Best [2]float64
}

// setupGridXYZ adapts a SetupGrid to plotter.GridXYZ.
type setupGridXYZ struct{ g *SetupGrid }

func (s setupGridXYZ) Dims() (c, r int)   { return len(s.g.X), len(s.g.Y) }
func (s setupGridXYZ) Z(c, r int) float64 { return s.g.Z[c][r] }
func (s setupGridXYZ) X(c int) float64    { return s.g.X[c] }
func (s setupGridXYZ) Y(r int) float64    { return s.g.Y[r] }

// SetupGridPlot draws a SetupGrid as a filled map in a sequential
// palette (Kindlmann's, from gonum/plot) with contour lines when every
// cell has a value, a key of the
// palette's values, separated cells hatched, cells without an answer
// greyed and crossed, cells that are not a single solve's answer with a
// box at their centre, and the search's path, start and best point when
// given.
func SetupGridPlot(g SetupGrid, dark bool) (*plot.Plot, error) {
	if g.Z != nil && len(g.Z) != len(g.X) {
		panic("figure: SetupGridPlot: Z does not match X")
	}
	for _, col := range g.Z {
		if len(col) != len(g.Y) {
			panic("figure: SetupGridPlot: Z does not match Y")
		}
	}
	th := themeFor(dark)
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := range g.Z {
		for j, v := range g.Z[i] {
			if math.IsNaN(v) || (g.Failed != nil && g.Failed[i][j]) {
				continue
			}
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if len(g.X) == 0 || len(g.Y) == 0 {
		return nil, ErrNoSetupData
	}
	p := newPlot(th, g.Title, g.XLabel, g.YLabel)
	k := newKey(th, keyTopRight)
	if g.Z != nil {
		p.Add(&cellFill{g: &g, bg: th.bg})
	}
	if lo <= hi {
		if hi == lo {
			hi = lo + 1e-9*math.Max(1, math.Abs(lo))
		}
		cm := moreland.Kindlmann()
		cm.SetMin(lo)
		cm.SetMax(hi)
		pal := cm.Palette(64)
		data := &SetupGrid{X: g.X, Y: g.Y, Z: make([][]float64, len(g.X))}
		complete := true // every cell has a value
		for i := range g.Z {
			data.Z[i] = make([]float64, len(g.Y))
			for j, v := range g.Z[i] {
				if g.Failed != nil && g.Failed[i][j] {
					v = math.NaN()
				}
				data.Z[i][j] = v
				complete = complete && !math.IsNaN(v)
			}
		}
		hm := plotter.NewHeatMap(setupGridXYZ{data}, pal)
		hm.Min, hm.Max = lo, hi
		hm.NaN = color.Transparent
		p.Add(hm)
		// gonum's contouring runs stray lines through cells without a
		// value (a map still streaming in, or points without an answer):
		// it contours the grid with each such cell given its nearest
		// value instead, and cellMarks then covers those cells, so lines
		// show over cells with a value only.
		if len(g.X) > 1 && len(g.Y) > 1 {
			var levels []float64
			for _, t := range (niceTicks{}).Ticks(lo, hi) {
				if t.Label != "" && t.Value > lo && t.Value < hi {
					levels = append(levels, t.Value)
				}
			}
			if len(levels) > 0 {
				filled := data
				if !complete {
					filled = &SetupGrid{X: g.X, Y: g.Y, Z: nearestFilled(data.Z)}
				}
				ct := plotter.NewContour(setupGridXYZ{filled}, levels, nil)
				ct.LineStyles = []draw.LineStyle{lineStyle(fade(th.fg, 150), widthThin, nil)}
				p.Add(ct)
			}
		}
		const swatches = 3
		for s := range swatches {
			// Clamped: hi − (hi − lo) can round below lo, where the
			// palette refuses (and the key showed the lowest value in the
			// grey of the cells without an answer).
			v := math.Max(lo, math.Min(hi, hi-(hi-lo)*float64(s)/float64(swatches-1)))
			c, err := cm.At(v)
			if err != nil {
				panic("figure: SetupGridPlot: palette: " + err.Error())
			}
			k.add(fmt.Sprintf("%.4g %s", v, g.ZLabel), swatch{c})
		}
	}
	if g.Z != nil {
		p.Add(&cellMarks{g: &g, bg: th.bg, hatch: fade(th.fg, 200), fail: fade(th.faint, 170), cross: th.accent, box: th.accent})
	}
	if anyTrue(g.Separated) {
		k.add("suction side separated (hatched)", hatchThumb{fade(th.fg, 200)})
	}
	if anyTrue(g.Failed) {
		k.add("no answer (grey, crossed)", swatch{fade(th.faint, 170)})
	}
	if anyTrue(g.NotSolve) {
		k.add("a single solve differs (boxed)", boxThumb{lineStyle(th.accent, widthNormal, nil)})
	}
	if anyTrue(g.NearGround) {
		k.add(nearGroundKey, newScatter(nil, th.accent, glyphMarker*1.7, draw.TriangleGlyph{}))
	}
	if len(g.Path) > 0 {
		xys := make(plotter.XYs, len(g.Path))
		for i, q := range g.Path {
			xys[i] = plotter.XY{X: q[0], Y: q[1]}
		}
		sty := lineStyle(th.second, widthNormal, nil)
		p.Add(newLine(xys, sty), newScatter(xys, th.second, glyphSmall*1.5, draw.CircleGlyph{}))
		k.add("search path", legendLine{sty})
	}
	if !math.IsNaN(g.Start[0]) && len(g.Path) > 0 {
		s := newScatter(plotter.XYs{{X: g.Start[0], Y: g.Start[1]}}, th.fg, glyphMarker*1.5, draw.SquareGlyph{})
		p.Add(s)
		k.add("start", s)
	}
	if !math.IsNaN(g.Best[0]) && len(g.Path) > 0 {
		s := newScatter(plotter.XYs{{X: g.Best[0], Y: g.Best[1]}}, th.accent, glyphMarker*1.8, draw.PyramidGlyph{})
		p.Add(s)
		k.add("best", s)
	}
	if g.Z == nil {
		p.X.Min, p.X.Max = g.X[0], g.X[len(g.X)-1]
		p.Y.Min, p.Y.Max = g.Y[0], g.Y[len(g.Y)-1]
	} else {
		x0, x1 := cellEdges(g.X)
		y0, y1 := cellEdges(g.Y)
		p.X.Min, p.X.Max = x0[0], x1[len(x1)-1]
		p.Y.Min, p.Y.Max = y0[0], y1[len(y1)-1]
	}
	p.Add(k)
	return p, nil
}

// anyTrue reports whether any cell is marked.
func anyTrue(cells [][]bool) bool {
	for _, col := range cells {
		for _, b := range col {
			if b {
				return true
			}
		}
	}
	return false
}

// nearestFilled returns z with each NaN replaced by the value of the
// nearest cell that has one (in grid steps; the first found on a tie).
// z must hold at least one value.
func nearestFilled(z [][]float64) [][]float64 {
	out := make([][]float64, len(z))
	for i := range z {
		out[i] = make([]float64, len(z[i]))
		for j, v := range z[i] {
			if !math.IsNaN(v) {
				out[i][j] = v
				continue
			}
			best, bestD := math.NaN(), math.Inf(1)
			for a := range z {
				for b, w := range z[a] {
					if d := float64((a-i)*(a-i) + (b-j)*(b-j)); !math.IsNaN(w) && d < bestD {
						best, bestD = w, d
					}
				}
			}
			out[i][j] = best
		}
	}
	return out
}

// cellEdges returns the lower and upper edge of the cell around each of
// the increasing values v: halfway to the neighbours, and as far outside
// as inside at the ends (half a unit for a single value).
func cellEdges(v []float64) (lo, hi []float64) {
	lo, hi = make([]float64, len(v)), make([]float64, len(v))
	for i, x := range v {
		switch {
		case len(v) == 1:
			lo[i], hi[i] = x-0.5, x+0.5
		case i == 0:
			h := (v[1] - x) / 2
			lo[i], hi[i] = x-h, x+h
		case i == len(v)-1:
			h := (x - v[i-1]) / 2
			lo[i], hi[i] = x-h, x+h
		default:
			lo[i], hi[i] = (v[i-1]+x)/2, (x+v[i+1])/2
		}
	}
	return lo, hi
}

// cellFill paints the grid's area in the background first, so that cells
// without a value read as empty rather than as the page behind.
type cellFill struct {
	g  *SetupGrid
	bg color.Color
}

func (f *cellFill) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	x0, x1 := cellEdges(f.g.X)
	y0, y1 := cellEdges(f.g.Y)
	r := vg.Rectangle{Min: vg.Point{X: trX(x0[0]), Y: trY(y0[0])}, Max: vg.Point{X: trX(x1[len(x1)-1]), Y: trY(y1[len(y1)-1])}}
	c.SetColor(f.bg)
	c.Fill(r.Path())
}

// cellMarks hatches separated cells, greys and crosses cells without an
// answer and boxes the centre of cells that converged only from a
// neighbour.
type cellMarks struct {
	g                           *SetupGrid
	bg, hatch, fail, cross, box color.Color
}

func (m *cellMarks) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	x0, x1 := cellEdges(m.g.X)
	y0, y1 := cellEdges(m.g.Y)
	for i := range m.g.X {
		for j := range m.g.Y {
			r := vg.Rectangle{Min: vg.Point{X: trX(x0[i]), Y: trY(y0[j])}, Max: vg.Point{X: trX(x1[i]), Y: trY(y1[j])}}
			if math.IsNaN(m.g.Z[i][j]) || (m.g.Failed != nil && m.g.Failed[i][j]) {
				c.SetColor(m.bg) // no contour line over a cell without a value
				c.Fill(r.Path())
			}
			switch {
			case m.g.Failed != nil && m.g.Failed[i][j]:
				c.SetColor(m.fail)
				c.Fill(r.Path())
				g := draw.GlyphStyle{Color: m.cross, Radius: vg.Length(math.Min(float64(glyphMarker), float64(r.Size().X)/3)), Shape: draw.CrossGlyph{}}
				c.DrawGlyph(g, vg.Point{X: (r.Min.X + r.Max.X) / 2, Y: (r.Min.Y + r.Max.Y) / 2})
			case m.g.Separated != nil && m.g.Separated[i][j]:
				hatchRect(c, r, lineStyle(m.hatch, widthThin, nil))
			}
			if m.g.NotSolve != nil && m.g.NotSolve[i][j] {
				boxCell(c, r, lineStyle(m.box, widthNormal, nil))
			}
			if m.g.NearGround != nil && m.g.NearGround[i][j] && !(m.g.Failed != nil && m.g.Failed[i][j]) {
				g := draw.GlyphStyle{Color: m.box, Radius: vg.Length(math.Min(float64(glyphMarker*1.7), float64(r.Size().X)/3)), Shape: draw.TriangleGlyph{}}
				c.DrawGlyph(g, vg.Point{X: (r.Min.X + r.Max.X) / 2, Y: (r.Min.Y + r.Max.Y) / 2})
			}
		}
	}
}

// hatchRect draws diagonal lines across r, 4 points apart.
func hatchRect(c draw.Canvas, r vg.Rectangle, sty draw.LineStyle) {
	const gap = vg.Length(4)
	w, h := r.Max.X-r.Min.X, r.Max.Y-r.Min.Y
	for d := vg.Length(0); d < w+h; d += gap {
		// The line x − y = d − h through r, clipped to it.
		ax, ay := r.Min.X+d, r.Min.Y
		if d > w {
			ax, ay = r.Max.X, r.Min.Y+(d-w)
		}
		bx, by := r.Min.X, r.Min.Y+d
		if d > h {
			bx, by = r.Min.X+(d-h), r.Max.Y
		}
		c.StrokeLine2(sty, ax, ay, bx, by)
	}
}

// swatch is a key entry of one colour.
type swatch struct{ c color.Color }

func (s swatch) Thumbnail(c *draw.Canvas) {
	c.SetColor(s.c)
	c.Fill(c.Rectangle.Path())
}

// boxCell outlines cell r inset by a fifth of its size on each side.
func boxCell(c draw.Canvas, r vg.Rectangle, sty draw.LineStyle) {
	dx, dy := (r.Max.X-r.Min.X)/5, (r.Max.Y-r.Min.Y)/5
	c.StrokeLines(sty, []vg.Point{{X: r.Min.X + dx, Y: r.Min.Y + dy}, {X: r.Max.X - dx, Y: r.Min.Y + dy}, {X: r.Max.X - dx, Y: r.Max.Y - dy}, {X: r.Min.X + dx, Y: r.Max.Y - dy}, {X: r.Min.X + dx, Y: r.Min.Y + dy}})
}

// boxThumb is a key entry for boxed cells.
type boxThumb struct{ sty draw.LineStyle }

func (b boxThumb) Thumbnail(c *draw.Canvas) {
	boxCell(*c, c.Rectangle, b.sty)
}

// hatchThumb is a key entry for hatched cells.
type hatchThumb struct{ c color.Color }

func (h hatchThumb) Thumbnail(c *draw.Canvas) {
	hatchRect(*c, c.Rectangle, lineStyle(h.c, widthThin, nil))
}

// SearchStep is one evaluation of a setting search.
type SearchStep struct {
	Objective float64 // NaN when the point has no answer
	Feasible  bool    // converged, attached to the limit, within every constraint
	// NotSolve: the solve is known not to be a single solve's answer
	// (engine.Point.NotSolve).
	NotSolve bool
}

// SearchPlot draws a search's objective against the evaluation number:
// feasible evaluations filled, others hollow, those that are not a single
// solve's answer boxed, those without an answer crossed on the axis,
// the best feasible value so far (the largest when maximise, else the
// smallest) as a step line, and the start as a horizontal reference. Its
// key is in rows above the data, laid out for a 6 × 4 inch figure;
// RenderSearch lays it out for the size drawn at.
func SearchPlot(title, objective string, steps []SearchStep, maximise bool, dark bool) (*plot.Plot, error) {
	p, k, err := searchPlot(title, objective, steps, maximise, dark)
	if err != nil {
		return nil, err
	}
	fitKeys(draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: 6 * vg.Inch, Y: 4 * vg.Inch}}}, k)
	return p, nil
}

// RenderSearch draws SearchPlot into a widthPx × heightPx image at dpi,
// its key's rows fitted to that size. It panics as RenderPlot does.
func RenderSearch(title, objective string, steps []SearchStep, maximise, dark bool, widthPx, heightPx int, dpi float64) (*Figure, error) {
	if widthPx <= 0 || heightPx <= 0 || !(dpi > 0) {
		panic(fmt.Sprintf("figure: bad render size %d×%d at %g dpi", widthPx, heightPx, dpi))
	}
	p, k, err := searchPlot(title, objective, steps, maximise, dark)
	if err != nil {
		return nil, err
	}
	return renderPlot(p, viewInfo{keys: []*key{k}}, image.NewRGBA(image.Rect(0, 0, widthPx, heightPx)), dpi), nil
}

// searchPlot is SearchPlot with its key, which goes in rows above the
// data: once a search has made some fifty solves its points reach every
// corner, where a box would cover them.
func searchPlot(title, objective string, steps []SearchStep, maximise bool, dark bool) (*plot.Plot, *key, error) {
	th := themeFor(dark)
	p := newPlot(th, title, "evaluation", objective)
	k := newKey(th, keyBottomRight)
	k.above = true
	var ok, bad, best, from plotter.XYs
	var failed []float64
	ext := newExtent()
	cur := math.NaN()
	for i, s := range steps {
		if math.IsNaN(s.Objective) {
			failed = append(failed, float64(i+1))
			continue
		}
		xy := plotter.XY{X: float64(i + 1), Y: s.Objective}
		ext.add(xy.X, xy.Y)
		if s.NotSolve {
			from = append(from, xy)
		}
		if s.Feasible {
			ok = append(ok, xy)
			if math.IsNaN(cur) || (maximise && s.Objective > cur) || (!maximise && s.Objective < cur) {
				cur = s.Objective
			}
		} else {
			bad = append(bad, xy)
		}
		if !math.IsNaN(cur) {
			best = append(best, plotter.XY{X: xy.X, Y: cur})
		}
	}
	if ext.empty() && len(failed) == 0 {
		return nil, nil, ErrNoSetupData
	}
	if ext.empty() { // only solves without an answer: crosses on an empty plane
		ext.add(float64(len(steps)), 0)
		ext.add(1, 1)
	}
	if len(best) > 1 {
		sty := lineStyle(th.accent, widthNormal, nil)
		l := newLine(best, sty)
		l.StepStyle = plotter.PostStep
		p.Add(l)
		k.add("best so far", legendLine{sty})
	}
	if len(ok) > 0 {
		s := newScatter(ok, th.upper, glyphMarker*0.8, draw.CircleGlyph{})
		p.Add(s)
		k.add("within the constraints", s)
	}
	if len(bad) > 0 {
		s := newScatter(bad, th.lower, glyphMarker, draw.RingGlyph{})
		p.Add(s)
		k.add("outside a constraint", s)
	}
	addNotSolve(p, k, th, from)
	addNoAnswer(p, k, th, failed, len(steps))
	if len(steps) > 0 && !math.IsNaN(steps[0].Objective) {
		p.Add(&refLine{value: steps[0].Objective, style: lineStyle(th.faint, widthThin, dashRef), label: "start", labelSty: noteStyle(th, th.faint, 8, text.XLeft, text.YBottom)})
	}
	p.X.Min, p.X.Max = 0.5, math.Max(ext.x1, 1)+0.5
	p.Y.Min, p.Y.Max = padRange(ext.y0, ext.y1, 0.08)
	k.keep(ok, bad)
	for _, x := range failed { // the crosses on the axis
		k.keep(plotter.XYs{{X: x, Y: p.Y.Min}})
	}
	p.Add(k)
	return p, k, nil
}

// SpanLoad is the spanwise load of a finite-span estimate over the half
// span, from the centre to the tip.
type SpanLoad struct {
	Title, YLabel string
	SpanM         float64
	YM, Load      []float64 // stations, centre to tip
	// TwoD is the two-dimensional load in the same unit (the section's
	// value at the study's angle), drawn for comparison; NaN for none.
	TwoD float64
}

// SpanLoadOf is the figure's data of a finite-span estimate: the load per
// metre of span when the study has a speed, else the section load
// coefficient, with the two-dimensional per-metre value beside it.
func SpanLoadOf(fs *engine.FiniteSpan) SpanLoad {
	name := "lift"
	if fs.Inverted {
		name = "downforce"
	}
	s := SpanLoad{SpanM: fs.SpanM, TwoD: math.NaN()}
	forces := !math.IsNaN(fs.DynamicPressurePa)
	if forces {
		s.Title = fmt.Sprintf("Spanwise %s, finite-span estimate", name)
		s.YLabel = name + " per metre of span, N/m"
		s.TwoD = fs.Load2DPerSpan
	} else {
		s.Title = fmt.Sprintf("Spanwise %s coefficient, finite-span estimate", name)
		s.YLabel = "section " + name + " coefficient"
	}
	for _, st := range fs.Stations {
		s.YM = append(s.YM, st.YM)
		if forces {
			s.Load = append(s.Load, st.LoadPerSpan)
		} else {
			s.Load = append(s.Load, st.Load)
		}
	}
	return s
}

// SpanLoadPlot draws the load across the whole span (mirrored), falling
// to zero at the tips as the lifting line has it, with the
// two-dimensional value dashed.
func SpanLoadPlot(s SpanLoad, dark bool) (*plot.Plot, error) {
	if len(s.YM) != len(s.Load) {
		panic("figure: SpanLoadPlot: stations and loads of different lengths")
	}
	if len(s.YM) == 0 {
		return nil, ErrNoSetupData
	}
	th := themeFor(dark)
	p := newPlot(th, s.Title, "distance from the centre of the span, m", s.YLabel)
	k := newKey(th, keyBottomRight)
	half := s.SpanM / 2
	xys := plotter.XYs{{X: -half, Y: 0}}
	for i := len(s.YM) - 1; i >= 0; i-- {
		xys = append(xys, plotter.XY{X: -s.YM[i], Y: s.Load[i]})
	}
	for i := range s.YM {
		xys = append(xys, plotter.XY{X: s.YM[i], Y: s.Load[i]})
	}
	xys = append(xys, plotter.XY{X: half, Y: 0})
	ext := newExtent()
	for _, q := range xys {
		ext.add(q.X, q.Y)
	}
	sty := lineStyle(th.upper, widthBold, nil)
	p.Add(newLine(xys, sty))
	k.add("lifting line", legendLine{sty})
	if !math.IsNaN(s.TwoD) {
		r := lineStyle(th.faint, widthNormal, dashRef)
		twoD := plotter.XYs{{X: -half, Y: s.TwoD}, {X: half, Y: s.TwoD}}
		p.Add(newLine(twoD, r))
		k.add("two-dimensional", legendLine{r})
		k.keep(twoD) // the key went over the line's end
		ext.add(0, s.TwoD)
	}
	ext.add(0, 0)
	k.keep(xys)
	p.X.Min, p.X.Max = -half*1.04, half*1.04
	p.Y.Min, p.Y.Max = padRange(ext.y0, ext.y1, 0.06)
	if len(k.entries) > 1 {
		// Room above the two-dimensional line for the key, which
		// otherwise lies over its end.
		p.Y.Max += (p.Y.Max - p.Y.Min) * keyRoomPerEntry * (float64(len(k.entries)) - 0.5)
	}
	p.Add(k)
	return p, nil
}
