package model

import "fmt"

// Proportions of a flap added behind an element (NewFlapAfter), as
// fractions of that element's chord: half its chord, the leading edge 5 %
// of its chord below the previous trailing edge (GapMM) and 4 % upstream of
// it (OverlapMM), turned 20° trailing edge down. They are a starting point
// for the user to adjust, not a recommendation: the slot is wider than
// that of the invented two-element example (testdata/studies/rear-wing.json:
// 120 mm behind 250 mm, leading edge 5 mm below the trailing edge (a gap of 2.2 mm to the flap's surface), overlap 2.5 mm, 15°) so that the flap
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
		fps[j] = st.FlapPlacementOf(j)
	}
	els[i] = e
	for j := i + 1; j < len(els); j++ {
		st.placeFlap(j, fps[j])
	}
}

// FlapPlacementOf returns where element i (not the first) sits relative to
// element i−1 (FlapPlacementOf in the design frame, so that the same
// numbers mean the same slot whether the wing is mounted upright or
// inverted). It panics if i is 0 or out of range.
func (st *Study) FlapPlacementOf(i int) FlapPlacement {
	if i < 1 || i >= len(st.Elements) {
		panic(fmt.Sprintf("model: FlapPlacementOf: element %d of %d has no element before it", i, len(st.Elements)))
	}
	return FlapPlacementOf(DesignElement(st.Elements[i-1], st.Inverted), DesignElement(st.Elements[i], st.Inverted))
}

// placeFlap places element i at fp behind element i−1, alone.
func (st *Study) placeFlap(i int, fp FlapPlacement) {
	inv := st.Inverted
	st.Elements[i] = DesignElement(PlaceFlap(DesignElement(st.Elements[i-1], inv), DesignElement(st.Elements[i], inv), fp), inv)
}

// AppendFlap adds an element named name behind the last one with the
// default proportions (NewFlapAfter), mounted like the rest.
func (st *Study) AppendFlap(name string) {
	n := len(st.Elements)
	f := NewFlapAfter(DesignElement(st.Elements[n-1], st.Inverted), name)
	st.Elements = append(st.Elements, DesignElement(f, st.Inverted))
}

// PlaceFlapAt places element i (not the first) at fp relative to element
// i−1, the elements behind it following as in SetElement. It panics if i
// is 0 or out of range.
func (st *Study) PlaceFlapAt(i int, fp FlapPlacement) {
	if i < 1 || i >= len(st.Elements) {
		panic(fmt.Sprintf("model: PlaceFlapAt: element %d of %d has no element before it", i, len(st.Elements)))
	}
	inv := st.Inverted
	st.SetElement(i, DesignElement(PlaceFlap(DesignElement(st.Elements[i-1], inv), DesignElement(st.Elements[i], inv), fp), inv))
}

// SetInverted mounts the wing upside down (on) or upright. The positions
// are as mounted, so turning the wing over mirrors them about y = 0: the
// elements keep their slots and setting angles, now in the new mounting's
// sense (AngleSense).
func (st *Study) SetInverted(on bool) {
	if st.Inverted == on {
		return
	}
	st.Inverted = on
	for i := range st.Elements {
		st.Elements[i].YMM = -st.Elements[i].YMM
	}
}
