package geometry

import (
	"fmt"
	"math"
	"strings"

	"sectionbench/model"
)

// The layers of a manufacturing drawing. DXF and SVG carry the same
// layers with the same content (package format draws a Drawing, nothing
// else), so a laser cutter, a router or a CAD user can switch them alike.
const (
	// LayerCut holds what the machine cuts through: the rib (the skin
	// offset when a skin is given, else the section contour) and the holes.
	LayerCut = "CUT"
	// LayerMark holds lines scored onto the part or read off the drawing
	// to set it up: chord lines, leading- and trailing-edge ticks, hole
	// centre crosses (never past the hole's edge).
	LayerMark = "MARK"
	// LayerEngrave holds text engraved onto the part: the element's name
	// and which side is the suction side.
	LayerEngrave = "ENGRAVE"
	// LayerReference holds lines for the reader, not the machine: the
	// section contour round a rib cut under a skin, and in the assembly
	// the ground datum and the pivot.
	LayerReference = "REFERENCE"
	// LayerTitle holds the title block and the scale bar.
	LayerTitle = "TITLE"
)

// Layers lists the drawing's layers in drawing order.
var Layers = []string{LayerReference, LayerCut, LayerMark, LayerEngrave, LayerTitle}

// A Drawing is an outline laid out for manufacturing, in millimetres, every
// coordinate in the positive quadrant (0 ≤ x ≤ Width, 0 ≤ y ≤ Height, y up):
// the parts above a title block whose lower left corner is at
// (DrawingMarginMM, DrawingMarginMM).
type Drawing struct {
	Name          string
	Width, Height float64
	Layers        []DrawingLayer
}

// DrawingLayer is the content of one named layer.
type DrawingLayer struct {
	Name    string
	Paths   []Path
	Circles []Circle
	Texts   []Text
}

// Path is a polyline; Closed joins its last point to its first.
type Path struct {
	Points []model.Point
	Closed bool
}

// Circle is a hole or a mark.
type Circle struct {
	Centre model.Point
	Radius float64
}

// Text is one line of text, its baseline starting at At, Height tall.
// It is plain ASCII so that every reader of R12 DXF shows it.
type Text struct {
	At     model.Point
	Height float64
	Text   string
}

// Layer returns the named layer; it panics for a name not in Layers.
func (d *Drawing) Layer(name string) *DrawingLayer {
	for i := range d.Layers {
		if d.Layers[i].Name == name {
			return &d.Layers[i]
		}
	}
	panic("geometry: no layer " + name)
}

// Drawing layout constants, millimetres.
const (
	DrawingMarginMM = 10  // blank border round the drawing
	titleTextMM     = 3   // text height in the title block
	titleLineMM     = 5   // line pitch in the title block
	titleWidthMM    = 180 // title block width
	partTextMM      = 3   // largest text height on a part
	tickMM          = 4   // leading- and trailing-edge tick length
	tickGapMM       = 1.5 // tick's gap from the contour
	crossFrac       = 0.6 // hole centre cross arm, a fraction of the radius
	partsGapMM      = 15  // between the title block and the parts
)

// Drawing lays the outline out for manufacturing: parts in the positive
// quadrant above the title block, each kind of line on its layer.
func (o *Outline) Drawing() *Drawing {
	title := o.titleLines()
	titleH := float64(len(title)+1)*titleLineMM + titleLineMM // + scale bar row
	lo, hi := o.Bounds()
	shift := model.Point{X: DrawingMarginMM - lo.X, Y: DrawingMarginMM + titleH + partsGapMM - lo.Y}
	if o.HasGround {
		shift.Y = DrawingMarginMM + titleH + partsGapMM + titleLineMM - math.Min(lo.Y, o.Ground)
	}
	mv := func(p model.Point) model.Point { return p.Add(shift) }
	mvAll := func(pts []model.Point) []model.Point {
		out := make([]model.Point, len(pts))
		for i, p := range pts {
			out[i] = mv(p)
		}
		return out
	}
	d := &Drawing{Name: o.Name}
	for _, n := range Layers {
		d.Layers = append(d.Layers, DrawingLayer{Name: n})
	}
	cut, mark, eng, ref, tit := d.Layer(LayerCut), d.Layer(LayerMark), d.Layer(LayerEngrave), d.Layer(LayerReference), d.Layer(LayerTitle)
	for _, e := range o.Elements {
		rib := e.Contour
		if e.Inner != nil {
			rib = e.Inner.Points
			ref.Paths = append(ref.Paths, Path{Points: mvAll(e.Contour), Closed: true})
		}
		cut.Paths = append(cut.Paths, Path{Points: mvAll(rib), Closed: true})
		le, te := mv(e.LE), mv(e.TE)
		u := te.Sub(le).Scale(1 / te.Dist(le))
		if o.ChordLines {
			mark.Paths = append(mark.Paths, Path{Points: []model.Point{le, te}})
		}
		// Ticks on the chord line's extension, clear of the contour.
		mark.Paths = append(mark.Paths,
			Path{Points: []model.Point{le.Sub(u.Scale(tickGapMM)), le.Sub(u.Scale(tickGapMM + tickMM))}},
			Path{Points: []model.Point{te.Add(u.Scale(tickGapMM)), te.Add(u.Scale(tickGapMM + tickMM))}})
		for _, m := range e.Marks {
			c, r := mv(m.Centre), m.DiameterMM/2
			cut.Circles = append(cut.Circles, Circle{Centre: c, Radius: r})
			a := crossFrac * r
			mark.Paths = append(mark.Paths,
				Path{Points: []model.Point{c.Add(u.Scale(-a)), c.Add(u.Scale(a))}},
				Path{Points: []model.Point{c.Add(model.Point{X: -u.Y, Y: u.X}.Scale(-a)), c.Add(model.Point{X: -u.Y, Y: u.X}.Scale(a))}})
		}
		eng.Texts = append(eng.Texts, o.partLabel(e, mvAll(rib), le, u))
	}
	if o.HasGround {
		g := o.Ground + shift.Y
		ref.Paths = append(ref.Paths, Path{Points: []model.Point{{X: DrawingMarginMM, Y: g}, {X: hi.X + shift.X, Y: g}}})
		ref.Texts = append(ref.Texts, Text{At: model.Point{X: DrawingMarginMM, Y: g - titleLineMM}, Height: titleTextMM, Text: "ground datum"})
	}
	if o.Placed {
		p := mv(o.Pivot)
		ref.Circles = append(ref.Circles, Circle{Centre: p, Radius: 1.5})
		ref.Paths = append(ref.Paths, Path{Points: []model.Point{p.Add(model.Point{X: -4}), p.Add(model.Point{X: 4})}},
			Path{Points: []model.Point{p.Add(model.Point{Y: -4}), p.Add(model.Point{Y: 4})}})
		ref.Texts = append(ref.Texts, Text{At: p.Add(model.Point{X: 5, Y: -5}), Height: titleTextMM * 0.8, Text: "pivot"})
	}
	// Title block: a frame, one line of text a row, the scale bar last.
	x0, y0 := float64(DrawingMarginMM), float64(DrawingMarginMM)
	w := math.Max(titleWidthMM, hi.X-lo.X)
	tit.Paths = append(tit.Paths, Path{Closed: true, Points: []model.Point{{X: x0, Y: y0}, {X: x0 + w, Y: y0}, {X: x0 + w, Y: y0 + titleH}, {X: x0, Y: y0 + titleH}}})
	for i, line := range title {
		tit.Texts = append(tit.Texts, Text{At: model.Point{X: x0 + 2, Y: y0 + titleH - float64(i+1)*titleLineMM}, Height: titleTextMM, Text: line})
	}
	bar := scaleBarLength(hi.X - lo.X)
	by := y0 + titleLineMM/2
	tit.Paths = append(tit.Paths, Path{Points: []model.Point{{X: x0 + 2, Y: by + 1.5}, {X: x0 + 2, Y: by}, {X: x0 + 2 + bar, Y: by}, {X: x0 + 2 + bar, Y: by + 1.5}}})
	tit.Texts = append(tit.Texts, Text{At: model.Point{X: x0 + 4 + bar, Y: by}, Height: titleTextMM, Text: fmt.Sprintf("%g mm: check the print scale", bar)})
	d.Width = math.Max(x0+w, hi.X+shift.X) + DrawingMarginMM
	d.Height = hi.Y + shift.Y + DrawingMarginMM
	return d
}

// partLabel places the element's name and its suction side on the part,
// inside the rib, centred at mid-chord or just behind the holes when they
// would be in the way, as tall as the rib allows there up to partTextMM.
// The suction side is the section's upper surface: upwards on a template
// (drawn the right way up), downwards on an inverted assembly.
func (o *Outline) partLabel(e OutlineElement, rib []model.Point, le, u model.Point) Text {
	arrow := "^"
	if o.Inverted && o.Placed {
		arrow = "v"
	}
	text := asciiText(e.Name) + "  suction side " + arrow
	n := model.Point{X: -u.Y, Y: u.X}
	chord := e.TE.Dist(e.LE)
	h := float64(partTextMM)
	length := func(h float64) float64 { return textWidthEm * h * float64(len(text)) }
	// Start so that the text is centred at mid-chord, then move it aft of
	// any hole it would cover (holes come in chord order).
	x0 := 0.5*chord - length(h)/2
	for _, m := range e.Marks {
		cx := m.Centre.Sub(e.LE).Dot(u)
		r := m.DiameterMM/2 + 1
		if cx+r > x0 && cx-r < x0+length(h) {
			x0 = cx + r
		}
	}
	c := le.Add(u.Scale(x0 + length(h)/2))
	if mid, ok := meanLinePoint(rib, c, n); ok {
		c = mid
		// The rib's height there, normal to the chord.
		lo, hi := math.Inf(1), math.Inf(-1)
		for i := range rib {
			a, b := rib[i], rib[(i+1)%len(rib)]
			da, db := n.Cross(a.Sub(c)), n.Cross(b.Sub(c))
			if (da > 0) != (db > 0) && da != db {
				s := a.Add(b.Sub(a).Scale(da / (da - db))).Sub(c).Dot(n)
				lo, hi = math.Min(lo, s), math.Max(hi, s)
			}
		}
		h = math.Max(0.5, math.Min(h, 0.45*(hi-lo)))
	}
	return Text{At: c.Sub(u.Scale(length(h) / 2)).Sub(n.Scale(h / 2)), Height: h, Text: text}
}

// textWidthEm is the width of an average character of a sans-serif font,
// a fraction of its height (common practice for layout estimates).
const textWidthEm = 0.55

// titleLines is the title block's text, top to bottom.
func (o *Outline) titleLines() []string {
	t := o.Title
	kind := "rib templates, one per element, each drawn the right way up"
	if o.Placed {
		kind = "assembly as mounted"
		if o.Inverted {
			kind += " (inverted)"
		}
	}
	lines := []string{"Study: " + asciiText(o.Name)}
	if t.Team != "" {
		lines = append(lines, "Team: "+asciiText(t.Team))
	}
	var els []string
	for _, e := range o.Elements {
		// The study's chord: the distance from the leading-edge node to the
		// trailing edge differs from it where the contour reaches ahead of
		// the chord's origin (a cambered NACA section: x/c −0.0003).
		els = append(els, fmt.Sprintf("%s chord %.1f mm", asciiText(e.Name), e.ChordMM))
	}
	lines = append(lines, "Elements: "+strings.Join(els, "; "), "Drawing: "+kind)
	var mat []string
	if t.MaterialMM > 0 {
		mat = append(mat, fmt.Sprintf("Material %g mm thick", t.MaterialMM))
	}
	for _, e := range o.Elements {
		if e.Inner != nil {
			mat = append(mat, fmt.Sprintf("rib cut %g mm inside the section contour (skin)", e.Inner.Distance))
			break
		}
	}
	if len(mat) > 0 {
		lines = append(lines, strings.Join(mat, "; "))
		lines[len(lines)-1] = strings.ToUpper(lines[len(lines)-1][:1]) + lines[len(lines)-1][1:]
	}
	side := "Suction side: the upper edge of each template"
	if o.Placed {
		side = "Suction side: the side marked on each part"
	}
	if o.Inverted {
		side += "; it faces the ground as mounted"
	}
	lines = append(lines, side)
	if o.Placed {
		a := "Drawn as set (element angles as in the study)"
		switch {
		case o.Pitched:
			a = fmt.Sprintf("Drawn at the attitude solved: pitched %.2f deg (angle of attack) about the pivot marked, above the ground datum", t.AlphaDeg)
		case t.Solved:
			a += fmt.Sprintf("; solved at %.2f deg angle of attack, the freestream turned, the wing not", t.AlphaDeg)
		}
		lines = append(lines, a)
	}
	lines = append(lines, "Scale 1:1, units mm. Layers: CUT, MARK, ENGRAVE; REFERENCE and TITLE are not for the machine")
	stamp := "Sectionbench"
	if t.Version != "" {
		stamp += " " + asciiText(t.Version)
	}
	if t.Date != "" {
		stamp += ", " + asciiText(t.Date)
	}
	lines = append(lines, stamp, "2-D estimate. Structure and mounting follow the competition's rules and qualified review.")
	return lines
}

// asciiText keeps a string to one line of printable ASCII: R12 DXF has no
// Unicode, and the SVG says the same as the DXF.
func asciiText(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r == '\n' || r == '\r' || r == '\t':
			b.WriteByte(' ')
		case r == '°':
			b.WriteString(" deg")
		case r == '—' || r == '–' || r == '−':
			b.WriteByte('-')
		case r >= 0x20 && r < 0x7f:
			b.WriteRune(r)
		default:
			b.WriteByte('?')
		}
	}
	return b.String()
}

// scaleBarLength returns a round length (1, 2 or 5 × 10^k mm) near a
// quarter of width.
func scaleBarLength(width float64) float64 {
	target := width / 4
	if !(target > 0) {
		return 10
	}
	mag := math.Pow(10, math.Floor(math.Log10(target)))
	for _, f := range []float64{5, 2, 1} {
		if f*mag <= target {
			return f * mag
		}
	}
	return mag
}
