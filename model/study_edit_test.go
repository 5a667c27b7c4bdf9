package model

import (
	"math"
	"testing"
)

// threeElements is a main plane with two flaps hung behind it.
func threeElements() *Study {
	st := NewStudy()
	main := st.Elements[0]
	f1 := NewFlapAfter(main, "flap 1")
	f2 := NewFlapAfter(f1, "flap 2")
	st.Elements = append(st.Elements, f1, f2)
	return st
}

func nearPlacement(a, b FlapPlacement, tol float64) bool {
	return math.Abs(a.GapMM-b.GapMM) <= tol && math.Abs(a.OverlapMM-b.OverlapMM) <= tol && math.Abs(a.DeflectionDeg-b.DeflectionDeg) <= tol
}

func TestNewFlapAfter(t *testing.T) {
	const tol = 1e-9
	for _, c := range []struct {
		name string
		prev StudyElement
	}{
		{"level", StudyElement{Name: "main", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 250}},
		{"set and moved", StudyElement{Name: "main", Section: SectionSource{Spec: "naca:0012"}, ChordMM: 300, XMM: 40, YMM: -20, AngleDeg: 7}},
	} {
		f := NewFlapAfter(c.prev, "flap")
		if f.Name != "flap" || f.Section.String() != c.prev.Section.String() {
			t.Errorf("%s: flap %q with section %q", c.name, f.Name, f.Section)
		}
		if math.Abs(f.ChordMM-NewFlapChordRatio*c.prev.ChordMM) > tol {
			t.Errorf("%s: chord %g mm", c.name, f.ChordMM)
		}
		want := FlapPlacement{GapMM: NewFlapGapRatio * c.prev.ChordMM, OverlapMM: NewFlapOverlapRatio * c.prev.ChordMM, DeflectionDeg: NewFlapDeflectionDeg}
		if got := FlapPlacementOf(c.prev, f); !nearPlacement(got, want, tol) {
			t.Errorf("%s: placed at %+v, want %+v", c.name, got, want)
		}
	}
	// Embedded coordinates are copied, not shared.
	prev := StudyElement{Name: "main", ChordMM: 200, Section: SectionSource{Embedded: &EmbeddedSection{Name: "x", Points: [][2]float64{{1, 0}, {0, 0}, {1, 0}}}}}
	f := NewFlapAfter(prev, "flap")
	f.Section.Embedded.Points[0][1] = 9
	if prev.Section.Embedded.Points[0][1] != 0 {
		t.Error("the flap shares its embedded points with the element before it")
	}
}

// TestNewFlapAfterPlaces: a default flap behind a generated section up to
// 18 % thick places without touching at the default panelling.
func TestNewFlapAfterPlaces(t *testing.T) {
	for _, spec := range []string{"naca:0006", "naca:4412", "naca:2418", "naca:23015"} {
		st := NewStudy()
		st.Elements[0].Section = SectionSource{Spec: spec}
		st.Elements = append(st.Elements, NewFlapAfter(st.Elements[0], "flap"))
		var secs []*Section
		for _, e := range st.Elements {
			sec, _, err := SectionFromSpec(e.Section.Spec, nil)
			if err != nil {
				t.Fatal(err)
			}
			secs = append(secs, sec)
		}
		if _, err := Place(st, secs); err != nil {
			t.Errorf("%s: %v", spec, err)
		}
	}
}

// TestSetElementFlapsFollow moves and turns the main element: both flaps
// keep their gap, overlap and deflection to the element before them; moving
// the middle flap leaves the main element where it was.
func TestSetElementFlapsFollow(t *testing.T) {
	const tol = 1e-9
	for _, c := range []struct {
		name string
		i    int
		edit func(*StudyElement)
	}{
		{"main moved", 0, func(e *StudyElement) { e.XMM += 30; e.YMM -= 12 }},
		{"main turned", 0, func(e *StudyElement) { e.AngleDeg += 9 }},
		{"main longer", 0, func(e *StudyElement) { e.ChordMM *= 1.3 }},
		{"middle flap turned", 1, func(e *StudyElement) { e.AngleDeg -= 5 }},
		{"last flap moved", 2, func(e *StudyElement) { e.YMM += 3 }},
	} {
		st := threeElements()
		before := st.Clone()
		e := st.Elements[c.i]
		c.edit(&e)
		st.SetElement(c.i, e)
		if st.Elements[c.i] != e {
			t.Errorf("%s: element %d is %+v, want %+v", c.name, c.i, st.Elements[c.i], e)
		}
		for j := range c.i {
			if st.Elements[j] != before.Elements[j] {
				t.Errorf("%s: element %d ahead of the edit moved", c.name, j)
			}
		}
		for j := c.i + 1; j < len(st.Elements); j++ {
			got := FlapPlacementOf(st.Elements[j-1], st.Elements[j])
			want := FlapPlacementOf(before.Elements[j-1], before.Elements[j])
			if !nearPlacement(got, want, tol) {
				t.Errorf("%s: element %d at %+v, want %+v", c.name, j, got, want)
			}
		}
	}
}

func TestPlaceFlapAt(t *testing.T) {
	st := threeElements()
	before := st.Clone()
	fp := FlapPlacement{GapMM: 8, OverlapMM: 3, DeflectionDeg: 30}
	st.PlaceFlapAt(1, fp)
	if got := FlapPlacementOf(st.Elements[0], st.Elements[1]); !nearPlacement(got, fp, 1e-9) {
		t.Errorf("flap 1 at %+v, want %+v", got, fp)
	}
	if got, want := FlapPlacementOf(st.Elements[1], st.Elements[2]), FlapPlacementOf(before.Elements[1], before.Elements[2]); !nearPlacement(got, want, 1e-9) {
		t.Errorf("flap 2 at %+v, want %+v", got, want)
	}
	for _, i := range []int{0, 3} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("PlaceFlapAt(%d) did not panic", i)
				}
			}()
			st.PlaceFlapAt(i, fp)
		}()
	}
}
