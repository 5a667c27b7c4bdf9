package model

import "fmt"

// Proportions of a flap added behind an element (NewFlapAfter), as
// fractions of that element's chord: half its chord, the leading edge 5 %
// of its chord below the previous trailing edge (GapMM) and 4 % upstream of
// it (OverlapMM), turned 20° trailing edge down. They are a starting point
// for the user to adjust, not a recommendation: the slot is wider than
// that of the invented two-element example (testdata/studies/rear-wing.json:
// 120 mm behind 250 mm, gap 5 mm, overlap 2.5 mm, 15°) so that the flap
// places without touching for the generated sections up to 18 % thick at
// the default panelling (TestNewFlapAfterPlaces checks it).
const (
	NewFlapChordRatio    = 0.5
	NewFlapGapRatio      = 0.05
	NewFlapOverlapRatio  = 0.04
	NewFlapDeflectionDeg = 20
)

// NewFlapAfter returns an element named name with prev's section (a copy of
// embedded coordinates) and NewFlapChordRatio of its chord, placed behind
// prev by PlaceFlap at the default gap, overlap and deflection.
func NewFlapAfter(prev StudyElement, name string) StudyElement {
	src := prev.Section
	if src.Embedded != nil {
		em := *src.Embedded
		em.Points = append([][2]float64(nil), em.Points...)
		src.Embedded = &em
	}
	flap := StudyElement{Name: name, Section: src, ChordMM: NewFlapChordRatio * prev.ChordMM}
	return PlaceFlap(prev, flap, FlapPlacement{
		GapMM:         NewFlapGapRatio * prev.ChordMM,
		OverlapMM:     NewFlapOverlapRatio * prev.ChordMM,
		DeflectionDeg: NewFlapDeflectionDeg,
	})
}

// SetElement replaces element i by e and moves every element behind it so
// that each keeps its FlapPlacementOf (gap, overlap and deflection)
// relative to the element before it: a flap follows the element it is
// hung from, and the flaps behind it follow in turn. The elements ahead of
// i stay where they are. It panics if i is out of range.
func (st *Study) SetElement(i int, e StudyElement) {
	els := st.Elements
	if i < 0 || i >= len(els) {
		panic(fmt.Sprintf("model: SetElement: element %d of %d", i, len(els)))
	}
	fps := make([]FlapPlacement, len(els))
	for j := i + 1; j < len(els); j++ {
		fps[j] = FlapPlacementOf(els[j-1], els[j])
	}
	els[i] = e
	for j := i + 1; j < len(els); j++ {
		els[j] = PlaceFlap(els[j-1], els[j], fps[j])
	}
}

// PlaceFlapAt places element i (not the first) at fp relative to element
// i−1, the elements behind it following as in SetElement. It panics if i
// is 0 or out of range.
func (st *Study) PlaceFlapAt(i int, fp FlapPlacement) {
	if i < 1 || i >= len(st.Elements) {
		panic(fmt.Sprintf("model: PlaceFlapAt: element %d of %d has no element before it", i, len(st.Elements)))
	}
	st.SetElement(i, PlaceFlap(st.Elements[i-1], st.Elements[i], fp))
}
