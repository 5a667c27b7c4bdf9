package model

import (
	"errors"
	"fmt"
	"math"
)

// Slot places a flap behind the element before it by the trade's
// definitions (common practice in high-lift work; SlotText):
//
//   - GapMM is the shortest distance from the trailing edge of the element
//     before (the midpoint of its trailing edge) to this element's surface;
//     negative when that trailing edge lies inside this element.
//   - OverlapMM is the distance along the chord of the element before from
//     its trailing edge to this element's leading edge, positive when the
//     leading edge lies ahead of the trailing edge.
//   - DeflectionDeg is this element's chord angle relative to the element
//     before, positive in the sense of AngleSense (more load).
//
// The gap depends on the section's shape, so the functions that use it take
// the element's unit-chord section.
type Slot struct {
	GapMM         float64 `json:"gap_mm"`
	OverlapMM     float64 `json:"overlap_mm"`
	DeflectionDeg float64 `json:"deflection_deg"`
}

// ErrSlotGap reports a gap that the flap cannot reach at the overlap and
// deflection asked for.
var ErrSlotGap = errors.New("gap cannot be reached")

// SlotOf returns the slot of element i (not the first) behind element i−1;
// sec is element i's cleaned unit-chord section. It panics if i is 0 or out
// of range.
func (st *Study) SlotOf(i int, sec *Section) Slot {
	fp := st.FlapPlacementOf(i)
	prev := DesignElement(st.Elements[i-1], st.Inverted)
	flap := DesignElement(st.Elements[i], st.Inverted)
	return Slot{GapMM: slotGap(prev, flap, sec), OverlapMM: fp.OverlapMM, DeflectionDeg: fp.DeflectionDeg}
}

// PlaceSlot places element i (not the first) at s behind element i−1; the
// elements behind it follow as in SetElement. sec is element i's cleaned
// unit-chord section. The gap fixes how far below the previous trailing
// edge (towards the pressure side of the element before, in the design
// frame) the flap sits: of the two positions at a given gap the one with
// the flap on that side is taken, as on every slotted flap. When no
// position gives the gap (a gap smaller than the overlap and deflection
// allow) it returns an error wrapping ErrSlotGap and leaves st unchanged.
func (st *Study) PlaceSlot(i int, sec *Section, s Slot) error {
	if i < 1 || i >= len(st.Elements) {
		panic(fmt.Sprintf("model: PlaceSlot: element %d of %d has no element before it", i, len(st.Elements)))
	}
	prev := DesignElement(st.Elements[i-1], st.Inverted)
	flap := DesignElement(st.Elements[i], st.Inverted)
	gapAt := func(drop float64) float64 {
		f := PlaceFlap(prev, flap, FlapPlacement{GapMM: drop, OverlapMM: s.OverlapMM, DeflectionDeg: s.DeflectionDeg})
		return slotGap(prev, f, sec)
	}
	// The gap as a function of the leading-edge drop falls while the flap
	// comes down over the trailing edge and rises once it is below: scan
	// for the smallest gap, then bisect on the rising side.
	reach := flap.ChordMM + math.Abs(s.OverlapMM) + math.Abs(s.GapMM)
	const samples = 400
	step := 2 * reach / samples
	lo, glo := -reach, gapAt(-reach)
	for k := 1; k <= samples; k++ {
		d := -reach + float64(k)*step
		if g := gapAt(d); g < glo {
			lo, glo = d, g
		}
	}
	if s.GapMM < glo {
		return fmt.Errorf("%w: at %s mm overlap and %s° deflection the gap is at least %.2f mm", ErrSlotGap, trimNum(s.OverlapMM), trimNum(s.DeflectionDeg), glo)
	}
	hi := lo
	for gapAt(hi) < s.GapMM {
		hi += step
	}
	// Bisection to a micrometre: far below what a slot is made to.
	for hi-lo > 1e-4 {
		mid := 0.5 * (lo + hi)
		if gapAt(mid) < s.GapMM {
			lo = mid
		} else {
			hi = mid
		}
	}
	st.PlaceFlapAt(i, FlapPlacement{GapMM: 0.5 * (lo + hi), OverlapMM: s.OverlapMM, DeflectionDeg: s.DeflectionDeg})
	return nil
}

// slotGap returns the signed shortest distance from prev's trailing edge
// to flap's contour (mm, design frame): negative inside the contour.
func slotGap(prev, flap StudyElement, sec *Section) float64 {
	te, _, _ := chordFrame(prev)
	pts := contourMM(flap, sec)
	d := math.Inf(1)
	n := len(pts)
	for k := range n {
		d = math.Min(d, segmentDistance(te, pts[k], pts[(k+1)%n]))
	}
	if InPolygon(te, pts) {
		return -d
	}
	return d
}

// contourMM returns e's section scaled, turned and moved to e's place, in
// millimetres in the design frame.
func contourMM(e StudyElement, sec *Section) []Point {
	_, along, up := chordFrame(e)
	le := Point{e.XMM, e.YMM}
	pts := make([]Point, sec.Len())
	for k := range pts {
		p := sec.At(k).Scale(e.ChordMM)
		pts[k] = le.Add(along.Scale(p.X)).Add(up.Scale(p.Y))
	}
	return pts
}

// trimNum formats x with up to two decimals.
func trimNum(x float64) string {
	return fmt.Sprintf("%.4g", math.Round(x*100)/100)
}
