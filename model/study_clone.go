package model

import "slices"

// Clone returns a deep copy of st: nothing the copy holds (elements,
// embedded coordinates, the density plan's lists, pins) is shared with st,
// and empty and absent lists stay as they were. A nil study gives nil.
// It allocates only for the lists, so the workbench can call it on every
// edit. TestCloneSharesNothing fills every field by reflection, so a field
// added to Study that Clone would share fails it.
func (st *Study) Clone() *Study {
	if st == nil {
		return nil
	}
	c := *st
	c.Elements = cloneEach(st.Elements, StudyElement.clone)
	c.Density.Panels = slices.Clone(st.Density.Panels)
	c.Density.Nose = slices.Clone(st.Density.Nose)
	c.Pins = cloneEach(st.Pins, Pin.clone)
	return &c
}

func (e StudyElement) clone() StudyElement {
	if e.Section.Embedded != nil {
		emb := *e.Section.Embedded
		emb.Points = slices.Clone(emb.Points)
		e.Section.Embedded = &emb
	}
	return e
}

func (p Pin) clone() Pin {
	p.Cp = cloneEach(p.Cp, func(c PinCurve) PinCurve {
		c.Points = slices.Clone(c.Points)
		return c
	})
	p.Polar = slices.Clone(p.Polar)
	return p
}

// cloneEach returns a new slice of copy applied to each item of s, nil
// when s is nil.
func cloneEach[T any](s []T, copy func(T) T) []T {
	if s == nil {
		return nil
	}
	out := make([]T, len(s))
	for i, x := range s {
		out[i] = copy(x)
	}
	return out
}
