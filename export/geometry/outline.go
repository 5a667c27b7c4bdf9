package geometry

import (
	"errors"
	"fmt"
	"math"

	"sectionbench/model"
)

// An Outline is the manufacturing view of a configuration: each element's
// closed contour at true size in millimetres, optionally its inward offset
// for a rib template, its chord line and reference marks (spar holes).
type Outline struct {
	Name       string
	Elements   []OutlineElement
	ChordLines bool // draw each element's chord line
	Inverted   bool // the wing is mounted upside down
	Placed     bool // the assembly as mounted, not rib templates
	// Ground is the ground datum's height (mm) in the assembly; HasGround
	// is false when the study is out of ground effect or not placed.
	Ground    float64
	HasGround bool
	Pivot     model.Point // the point the configuration pitches about, mm (assembly)
	Pitched   bool        // the assembly is drawn pitched to the angle of attack solved
	Title     TitleBlock
}

// OutlineElement is one element of an Outline, in millimetres.
type OutlineElement struct {
	Name    string
	Contour []model.Point // closed loop (the last point joins the first), counter-clockwise
	Inner   *Offset       // inward offset by the skin thickness; nil when not asked for
	LE, TE  model.Point   // chord line ends
	ChordMM float64       // the element's chord as the study sets it
	Marks   []MarkShape
}

// MarkShape is a reference mark placed on an element: a circle.
type MarkShape struct {
	Label      string
	Centre     model.Point // mm
	DiameterMM float64
}

// Mark asks for a hole (a spar or a locating pin) on an element,
// positioned in its chord frame: XC along the chord from the leading edge
// and YC normal to it (towards the upper surface), both as fractions of
// the chord, from the chord line or, with OnMeanLine, from the mean line
// (the midpoint of the section's thickness measured normal to the chord
// at XC), the usual place for a spar in a cambered rib.
type Mark struct {
	Element    int
	Label      string
	XC, YC     float64
	DiameterMM float64
	OnMeanLine bool
}

// OutlineOptions say what to draw.
type OutlineOptions struct {
	// Placed keeps the elements where the study puts them (the assembly
	// drawing, at zero angle of attack); otherwise each element is drawn
	// on its own chord line, leading edge at the origin, trailing edge on
	// +x, one above another with Gap between them (rib templates).
	Placed bool
	// GapMM separates unplaced elements; 0 means DefaultOutlineGapMM.
	GapMM float64
	// SkinMM, when positive, adds each element's inward offset by that
	// thickness (the rib under the skin).
	SkinMM float64
	// ChordLine draws each element's chord line.
	ChordLine bool
	// Marks places holes (spars, locating pins).
	Marks []Mark
	// MinLigamentMM is the least material a hole must leave to the rib's
	// edge: the inward offset when SkinMM is positive, else the contour.
	// A hole that leaves less (or breaks out) is refused with a
	// *HoleError. Zero asks only that the hole stays inside.
	MinLigamentMM float64
	// Title fills the drawing's title block.
	Title TitleBlock
}

// TitleBlock is what a drawing's title block says besides the outline's
// name: who, what material, which program, when. Empty fields are left out.
type TitleBlock struct {
	Team       string
	MaterialMM float64 // sheet thickness; 0 when not given
	Version    string  // program version
	Date       string  // as the caller wants it printed, e.g. 2026-12-04
	AlphaDeg   float64 // the angle of attack solved, for the assembly
	Solved     bool    // AlphaDeg is set
}

// ErrNoElements reports a layout without elements to outline.
var ErrNoElements = errors.New("nothing to outline")

// mmPerM converts the Layout's metres to the outline's millimetres.
const mmPerM = 1000

// DefaultMinLigamentMM is the minimum ligament the CLI and the app ask of
// a spar hole unless told otherwise: a choice of this program, not a rule;
// the material and the competition's rules decide.
const DefaultMinLigamentMM = 2

// DefaultOutlineGapMM is the space between unplaced elements.
const DefaultOutlineGapMM = 20

// NewOutline builds the outline of layout l (metres). It returns a
// *model.FieldError for bad options, an *OffsetError when an element's
// inward offset fails and an error wrapping ErrNoElements for a layout without
// elements.
func NewOutline(name string, l *model.Layout, opt OutlineOptions) (*Outline, error) {
	if l == nil {
		panic("geometry: nil layout")
	}
	if len(l.Elements) == 0 {
		return nil, fmt.Errorf("outline %q: %w: no elements", name, ErrNoElements)
	}
	if opt.SkinMM < 0 || math.IsNaN(opt.SkinMM) || math.IsInf(opt.SkinMM, 0) {
		return nil, &model.FieldError{Field: "outline.skin_mm", Err: fmt.Errorf("%g is not a thickness", opt.SkinMM)}
	}
	gap := opt.GapMM
	if gap == 0 {
		gap = DefaultOutlineGapMM
	}
	if opt.MinLigamentMM < 0 || math.IsNaN(opt.MinLigamentMM) || math.IsInf(opt.MinLigamentMM, 0) {
		return nil, &model.FieldError{Field: "outline.min_ligament_mm", Err: fmt.Errorf("%g is not a length", opt.MinLigamentMM)}
	}
	if gap < 0 || math.IsNaN(gap) {
		return nil, &model.FieldError{Field: "outline.gap_mm", Err: fmt.Errorf("%g is negative", opt.GapMM)}
	}
	for k, m := range opt.Marks {
		if m.Element < 0 || m.Element >= len(l.Elements) {
			return nil, &model.FieldError{Field: fmt.Sprintf("outline.marks[%d].element", k), Err: fmt.Errorf("%d is not in 0..%d", m.Element, len(l.Elements)-1)}
		}
		if !(m.DiameterMM > 0) || math.IsInf(m.DiameterMM, 0) {
			return nil, &model.FieldError{Field: fmt.Sprintf("outline.marks[%d].diameter_mm", k), Err: fmt.Errorf("%g is not a diameter", m.DiameterMM)}
		}
	}
	o := &Outline{Name: name, ChordLines: opt.ChordLine, Inverted: l.Inverted, Placed: opt.Placed, Title: opt.Title}
	var top float64 // unplaced: the next element goes below this y
	// The assembly in ground effect is drawn at the attitude solved: the
	// configuration pitched about PitchRef, the ground ClearanceM below
	// its lowest point (model.Layout.At).
	elems, groundY := l.Elements, 0.0
	attitude := opt.Placed && l.Ground && opt.Title.Solved
	if attitude {
		elems, groundY, _ = l.At(opt.Title.AlphaDeg)
		o.Pitched = true
	}
	for i, e := range elems {
		le, te := e.LeadingEdge.Scale(mmPerM), e.TrailingEdge.Scale(mmPerM)
		pts := make([]model.Point, len(e.Nodes))
		for k, p := range e.Nodes {
			pts[k] = p.Scale(mmPerM)
		}
		if !opt.Placed {
			// Rotate about the leading edge so that the chord lies on +x,
			// then move the leading edge to the origin.
			ang := math.Atan2(te.Y-le.Y, te.X-le.X)
			for k := range pts {
				pts[k] = pts[k].Rotate(le, -ang).Sub(le)
			}
			te = te.Rotate(le, -ang).Sub(le)
			le = model.Point{}
			if l.Inverted { // a template shows the section the right way up
				for k := range pts {
					pts[k].Y = -pts[k].Y
				}
			}
			ymax := math.Inf(-1)
			for _, p := range pts {
				ymax = math.Max(ymax, p.Y)
			}
			shift := model.Point{}
			if i > 0 {
				shift.Y = top - gap - ymax
			}
			ymin := math.Inf(1)
			for k := range pts {
				pts[k] = pts[k].Add(shift)
				ymin = math.Min(ymin, pts[k].Y)
			}
			le, te = le.Add(shift), te.Add(shift)
			top = ymin
		}
		closed := len(pts) > 1 && pts[0].Dist(pts[len(pts)-1]) < 1e-9
		if closed {
			pts = pts[:len(pts)-1] // closed trailing edge: drop the repeat
		}
		if model.PolygonArea(pts) < 0 { // mirrored for inverted mounting
			pts = reverseLoop(pts, closed)
		}
		oe := OutlineElement{Name: e.Name, Contour: pts, LE: le, TE: te, ChordMM: e.Chord * mmPerM}
		if opt.SkinMM > 0 {
			// The offset of a mirrored section is the mirror of the
			// section's offset: compute it the right way up.
			mirrored := l.Inverted && opt.Placed
			src := pts
			if mirrored {
				src = mirrorLoop(pts, closed)
			}
			in, err := InwardOffset(e.Name, src, opt.SkinMM, mirrorY(le, mirrored), mirrorY(te, mirrored))
			if err != nil {
				return nil, err
			}
			if mirrored {
				in.Points = mirrorLoop(in.Points, true)
			}
			oe.Inner = in
		}
		chord := te.Sub(le)
		up := model.Point{X: -chord.Y, Y: chord.X}
		if inverted := l.Inverted && opt.Placed; inverted {
			up = up.Scale(-1) // the section's upper surface faces down
		}
		for k, m := range opt.Marks {
			if m.Element != i {
				continue
			}
			c := le.Add(chord.Scale(m.XC))
			if m.OnMeanLine {
				mid, ok := meanLinePoint(pts, c, up)
				if !ok {
					return nil, &model.FieldError{Field: fmt.Sprintf("outline.marks[%d].xc", k), Err: fmt.Errorf("%g is not on the section of %s", m.XC, e.Name)}
				}
				c = mid
			}
			c = c.Add(up.Scale(m.YC))
			shape := MarkShape{Label: m.Label, Centre: c, DiameterMM: m.DiameterMM}
			if err := checkHole(e.Name, m, shape, oe, opt); err != nil {
				return nil, err
			}
			oe.Marks = append(oe.Marks, shape)
		}
		o.Elements = append(o.Elements, oe)
	}
	if opt.Placed {
		o.Pivot = l.PitchRef.Scale(mmPerM)
		if attitude {
			o.Ground, o.HasGround = groundY*mmPerM, true
		} else if l.Ground {
			lo, _ := o.Bounds()
			o.Ground, o.HasGround = lo.Y-l.ClearanceM*mmPerM, true
		}
	}
	return o, nil
}

// Bounds returns the outline's bounding box in millimetres.
func (o *Outline) Bounds() (lo, hi model.Point) {
	lo = model.Point{X: math.Inf(1), Y: math.Inf(1)}
	hi = model.Point{X: math.Inf(-1), Y: math.Inf(-1)}
	add := func(x, y float64) {
		lo.X, lo.Y = math.Min(lo.X, x), math.Min(lo.Y, y)
		hi.X, hi.Y = math.Max(hi.X, x), math.Max(hi.Y, y)
	}
	for _, el := range o.Elements {
		for _, p := range el.Contour {
			add(p.X, p.Y)
		}
		for _, m := range el.Marks {
			r := m.DiameterMM / 2
			add(m.Centre.X-r, m.Centre.Y-r)
			add(m.Centre.X+r, m.Centre.Y+r)
		}
	}
	return lo, hi
}

// reverseLoop reverses a trailing-edge-first loop and keeps the trailing
// edge first: an open trailing edge has a point at each end, so reversing
// keeps one first; a closed one's single point (its repeat dropped) would
// end up last and is moved to the front.
func reverseLoop(pts []model.Point, closed bool) []model.Point {
	r := make([]model.Point, len(pts))
	for i, p := range pts {
		r[len(pts)-1-i] = p
	}
	if closed {
		r = append(r[len(r)-1:], r[:len(r)-1]...)
	}
	return r
}

// mirrorLoop mirrors a loop about y = 0 and reverses it, so that it stays
// counter-clockwise with its trailing edge first.
func mirrorLoop(pts []model.Point, closed bool) []model.Point {
	m := make([]model.Point, len(pts))
	for i, p := range pts {
		m[i] = model.Point{X: p.X, Y: -p.Y}
	}
	return reverseLoop(m, closed)
}

// mirrorY mirrors p about y = 0 when on is true.
func mirrorY(p model.Point, on bool) model.Point {
	if on {
		p.Y = -p.Y
	}
	return p
}
