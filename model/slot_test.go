package model

import (
	"errors"
	"math"
	"testing"
)

// placedGap measures the gap on the placed geometry: the shortest distance
// from element a's trailing-edge midpoint to element b's panels, mm.
func placedGap(l *Layout, a, b int) float64 {
	te := l.Elements[a].TrailingEdge
	pts := l.Elements[b].Nodes
	d := math.Inf(1)
	for k := range pts {
		d = math.Min(d, segmentDistance(te, pts[k], pts[(k+1)%len(pts)]))
	}
	return d * 1000
}

// TestPlaceSlotGapMeasured: a flap placed at a stated gap (the trade's
// definition, common practice in high-lift work: shortest distance from the
// trailing edge of the element before to the flap's surface) measures that
// gap on the placed, panelled geometry, upright and inverted.
func TestPlaceSlotGapMeasured(t *testing.T) {
	main, flap := mustNACA(t, "4412"), mustNACA(t, "4412")
	for _, tc := range []struct {
		name     string
		inverted bool
		slot     Slot
		// The panels are chords of the contour and lie inside it by
		// their sagitta: at 160 cosine-spaced panels on a 120 mm flap,
		// under 0.02 mm where the gap is measured (panel ≈ 1.5 mm,
		// radius of curvature ≥ 15 mm: 1.5²/(8·15)).
		tol float64
	}{
		{"upright 5 mm", false, Slot{GapMM: 5, OverlapMM: 2.5, DeflectionDeg: 15}, 0.02},
		{"inverted 5 mm", true, Slot{GapMM: 5, OverlapMM: 2.5, DeflectionDeg: 15}, 0.02},
		{"inverted 12 mm, behind the trailing edge", true, Slot{GapMM: 12, OverlapMM: -4, DeflectionDeg: 30}, 0.02},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := NewStudy()
			st.Inverted = tc.inverted
			st.Elements = []StudyElement{
				{Name: "main", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 250, AngleDeg: 3},
				{Name: "flap", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 120},
			}
			if err := st.PlaceSlot(1, flap, tc.slot); err != nil {
				t.Fatal(err)
			}
			l, err := Place(st, []*Section{main, flap})
			if err != nil {
				t.Fatal(err)
			}
			if got := placedGap(l, 0, 1); math.Abs(got-tc.slot.GapMM) > tc.tol {
				t.Errorf("gap on the placed geometry %.4f mm, want %g ± %g", got, tc.slot.GapMM, tc.tol)
			}
			got := st.SlotOf(1, flap)
			if math.Abs(got.GapMM-tc.slot.GapMM) > 1e-3 || math.Abs(got.OverlapMM-tc.slot.OverlapMM) > 1e-9 || math.Abs(got.DeflectionDeg-tc.slot.DeflectionDeg) > 1e-9 {
				t.Errorf("SlotOf = %+v, want %+v", got, tc.slot)
			}
			// The flap hangs on the pressure side of the main element's
			// trailing edge as mounted: below it upright, above it inverted.
			dy := l.Elements[1].LeadingEdge.Y - l.Elements[0].TrailingEdge.Y
			if tc.inverted != (dy > 0) {
				t.Errorf("flap leading edge %.1f mm from the main trailing edge in y; inverted=%v", dy*1000, tc.inverted)
			}
		})
	}
}

// TestPlaceSlotUnreachable: a gap smaller than a flap behind the trailing
// edge allows is refused and leaves the study as it was.
func TestPlaceSlotUnreachable(t *testing.T) {
	flap := mustNACA(t, "4412")
	st := twoElementStudy()
	before := st.Elements[1]
	err := st.PlaceSlot(1, flap, Slot{GapMM: 2, OverlapMM: -10, DeflectionDeg: 10})
	if !errors.Is(err, ErrSlotGap) {
		t.Fatalf("err = %v, want ErrSlotGap", err)
	}
	if st.Elements[1] != before {
		t.Error("a refused slot moved the flap")
	}
}

// TestAngleSenseAsMounted: a positive setting angle moves the leading edge
// the way AngleSense says, in the placed (as-mounted) coordinates.
func TestAngleSenseAsMounted(t *testing.T) {
	sec := mustNACA(t, "4412")
	chordAngle := func(e PlacedElement) float64 {
		return math.Atan2(e.LeadingEdge.Y-e.TrailingEdge.Y, e.TrailingEdge.X-e.LeadingEdge.X) * 180 / math.Pi
	}
	for _, inverted := range []bool{false, true} {
		var rise [2]float64 // leading-edge-up angle of the chord, degrees
		for k, angle := range []float64{0, 2} {
			st := NewStudy()
			st.Inverted = inverted
			st.Elements[0].AngleDeg = angle
			l, err := Place(st, []*Section{sec})
			if err != nil {
				t.Fatal(err)
			}
			rise[k] = chordAngle(l.Elements[0])
		}
		want := 2.0
		if inverted {
			want = -want
		}
		if got := rise[1] - rise[0]; math.Abs(got-want) > 1e-9 {
			t.Errorf("inverted=%v (%s): +2° raised the leading edge by %.4f°, want %g°", inverted, AngleSense(inverted), got, want)
		}
	}
}
