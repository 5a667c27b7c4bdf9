package model

import "math"

// FlapPlacement places an element relative to the one before it by its
// leading edge, in the previous element's chord frame in the design frame
// (DesignElement). The trade's gap, measured to the flap's surface, is Slot;
// FlapPlacement is the rigid offset that SetElement keeps:
// origin at its trailing edge, x along its chord towards the trailing edge,
// y perpendicular to it towards its upper surface (the upright
// configuration, before any inverted mounting).
//
//   - OverlapMM is how far the flap's leading edge lies upstream of the
//     previous trailing edge, along the previous chord (positive: the flap
//     tucks under the element before it).
//   - GapMM is how far the flap's leading edge lies below the previous
//     trailing edge, perpendicular to the previous chord (the leading-edge
//     drop; not the trade's gap, which Slot measures).
//   - DeflectionDeg is the flap's chord angle relative to the previous
//     chord, trailing edge down positive (more camber, more lift; more
//     downforce once inverted). Trailing edge down is nose-up, so the
//     flap's setting angle is the previous one plus the deflection.
//
// These are the leading-edge offsets; the narrowest distance across the
// slot, which depends on the section shapes, is what Layout checks against
// the panel size.
type FlapPlacement struct {
	GapMM         float64 `json:"gap_mm"`
	OverlapMM     float64 `json:"overlap_mm"`
	DeflectionDeg float64 `json:"deflection_deg"`
}

// chordFrame returns an element's trailing edge (mm) and the unit vectors
// along its chord and perpendicular to it (towards the upper surface). A
// nose-up setting angle θ turns the chord clockwise: along = (cos θ, −sin θ).
func chordFrame(e StudyElement) (te, along, up Point) {
	th := e.AngleDeg * math.Pi / 180
	along = Point{math.Cos(th), -math.Sin(th)}
	up = Point{math.Sin(th), math.Cos(th)}
	te = Point{e.XMM, e.YMM}.Add(along.Scale(e.ChordMM))
	return te, along, up
}

// PlaceFlap returns flap moved and turned so that it sits at fp relative
// to prev. The flap keeps its name, section and chord.
func PlaceFlap(prev, flap StudyElement, fp FlapPlacement) StudyElement {
	te, along, up := chordFrame(prev)
	le := te.Sub(along.Scale(fp.OverlapMM)).Sub(up.Scale(fp.GapMM))
	flap.XMM, flap.YMM = le.X, le.Y
	flap.AngleDeg = prev.AngleDeg + fp.DeflectionDeg
	return flap
}

// FlapPlacementOf returns where flap sits relative to prev: the inverse of
// PlaceFlap.
func FlapPlacementOf(prev, flap StudyElement) FlapPlacement {
	te, along, up := chordFrame(prev)
	d := Point{flap.XMM, flap.YMM}.Sub(te)
	return FlapPlacement{
		OverlapMM:     -d.Dot(along),
		GapMM:         -d.Dot(up),
		DeflectionDeg: flap.AngleDeg - prev.AngleDeg,
	}
}
