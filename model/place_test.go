package model

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

func mustNACA(t *testing.T, code string) *Section {
	t.Helper()
	s, err := NACA(code, NACAOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func twoElementStudy() *Study {
	st := NewStudy()
	st.Elements = []StudyElement{
		{Name: "main", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 250},
		{Name: "flap", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 100},
	}
	st.Elements[1] = PlaceFlap(st.Elements[0], st.Elements[1], FlapPlacement{GapMM: 12, OverlapMM: 8, DeflectionDeg: 25})
	return st
}

func TestPlaceSingleElement(t *testing.T) {
	st := NewStudy()
	st.Elements[0].ChordMM, st.Elements[0].XMM, st.Elements[0].YMM, st.Elements[0].AngleDeg = 200, 30, -40, 10
	sec := mustNACA(t, "0012")
	l, err := Place(st, []*Section{sec})
	if err != nil {
		t.Fatal(err)
	}
	e := l.Elements[0]
	const tol = 1e-12
	if got := e.LeadingEdge; got.Dist(Point{0.03, -0.04}) > tol {
		t.Errorf("leading edge at %v, want (0.03, -0.04) m", got)
	}
	// Nose-up 10°: the trailing edge drops below the leading edge by
	// c sin 10° and lies c cos 10° downstream (closed form).
	th := 10 * math.Pi / 180
	want := Point{0.03 + 0.2*math.Cos(th), -0.04 - 0.2*math.Sin(th)}
	if e.TrailingEdge.Dist(want) > 1e-6 { // the open NACA TE: midpoint of the two TE nodes
		t.Errorf("trailing edge at %v, want %v", e.TrailingEdge, want)
	}
	if len(e.Nodes) != st.Panelling.Panels+1 {
		t.Errorf("%d nodes, want %d", len(e.Nodes), st.Panelling.Panels+1)
	}
	if math.Abs(e.Chord-0.2) > tol || math.Abs(l.RefChordM-0.2) > tol {
		t.Errorf("chord %g, reference %g, want 0.2 m", e.Chord, l.RefChordM)
	}
	// Quarter chord: the pitch and moment reference.
	q := e.LeadingEdge.Add(e.TrailingEdge.Sub(e.LeadingEdge).Scale(0.25))
	if l.PitchRef.Dist(q) > tol || l.MomentRef.Dist(q) > tol {
		t.Errorf("pitch ref %v, want the quarter chord %v", l.PitchRef, q)
	}
}

// Inverted mounting mirrors about y = 0 and keeps the contour
// counter-clockwise with the leading edge where it was in x.
func TestPlaceInverted(t *testing.T) {
	st := NewStudy()
	sec := mustNACA(t, "4412")
	up, err := Place(st, []*Section{sec})
	if err != nil {
		t.Fatal(err)
	}
	st.Inverted = true
	inv, err := Place(st, []*Section{sec})
	if err != nil {
		t.Fatal(err)
	}
	a, b := up.Elements[0], inv.Elements[0]
	n := len(a.Nodes)
	for i := range a.Nodes {
		m := a.Nodes[n-1-i]
		if p := b.Nodes[i]; math.Abs(p.X-m.X) > 1e-15 || math.Abs(p.Y+m.Y) > 1e-15 {
			t.Fatalf("node %d = %v, want the mirror of %v", i, p, m)
		}
	}
	if b.LE != n-1-a.LE || b.Nodes[b.LE] != b.LeadingEdge {
		t.Errorf("leading-edge index %d, want %d", b.LE, n-1-a.LE)
	}
	if area(b.Nodes) <= 0 {
		t.Error("inverted contour is not counter-clockwise")
	}
	// The cambered section's upper (suction) surface, about 7 % of the
	// chord above it at mid-chord, now faces down and comes second in the
	// node order.
	if y := b.Nodes[n-1-n/4].Y / a.Chord; y > -0.05 {
		t.Errorf("after mirroring, node %d at y/c = %g should be the former suction side", n-1-n/4, y)
	}
}

func area(p []Point) float64 {
	a := 0.0
	for i := range p {
		a += p[i].Cross(p[(i+1)%len(p)])
	}
	return a / 2
}

func TestLayoutAt(t *testing.T) {
	sec := mustNACA(t, "4412")
	for _, tc := range []struct {
		name     string
		inverted bool
		ground   bool
		alpha    float64
		wantFS   float64
	}{
		{"free air turns the freestream", false, false, 5, 5},
		{"free air inverted mirrors the angle", true, false, 5, -5},
		{"ground keeps the freestream level", false, true, 5, 0},
		{"ground inverted", true, true, 5, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := NewStudy()
			st.Inverted = tc.inverted
			st.Ground = Ground{Enabled: tc.ground, ClearanceMM: 40}
			l, err := Place(st, []*Section{sec})
			if err != nil {
				t.Fatal(err)
			}
			elems, groundY, fs := l.At(tc.alpha)
			if fs != tc.wantFS {
				t.Errorf("freestream %g°, want %g°", fs, tc.wantFS)
			}
			if !tc.ground {
				return
			}
			low := math.Inf(1)
			for _, p := range elems[0].Nodes {
				low = math.Min(low, p.Y)
			}
			if math.Abs(low-groundY-0.04) > 1e-12 {
				t.Errorf("clearance %g m, want 0.04", low-groundY)
			}
			// Nose-up pitch (upright) turns the chord clockwise by α;
			// inverted, the mirrored nose goes down (counter-clockwise).
			e := elems[0]
			chordAngle := func(le, te Point) float64 { return math.Atan2(te.Y-le.Y, te.X-le.X) * 180 / math.Pi }
			turn := chordAngle(e.LeadingEdge, e.TrailingEdge) - chordAngle(l.Elements[0].LeadingEdge, l.Elements[0].TrailingEdge)
			want := -tc.alpha
			if tc.inverted {
				want = tc.alpha
			}
			if math.Abs(turn-want) > 1e-9 {
				t.Errorf("chord turned by %g°, want %g°", turn, want)
			}
			if d := e.LeadingEdge.Dist(e.TrailingEdge); math.Abs(d-l.Elements[0].LeadingEdge.Dist(l.Elements[0].TrailingEdge)) > 1e-12 {
				t.Error("pitching changed the chord")
			}
		})
	}
}

func TestPlaceGeometryErrors(t *testing.T) {
	sec := mustNACA(t, "4412")
	for _, tc := range []struct {
		name string
		fp   FlapPlacement
		want error
	}{
		{"flap inside the main element", FlapPlacement{GapMM: -5, OverlapMM: 60}, ErrOverlap},
		{"slot narrower than a panel", FlapPlacement{GapMM: 1.2, OverlapMM: -1, DeflectionDeg: 0}, ErrSmallGap},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := twoElementStudy()
			// Uniform spacing: panels of about 8 mm on the main element's
			// trailing edge, far longer than a 1.2 mm slot.
			st.Panelling = Panelling{Panels: 60, Spacing: SpacingUniform}
			st.Elements[1] = PlaceFlap(st.Elements[0], st.Elements[1], tc.fp)
			_, err := Place(st, []*Section{sec, sec})
			var ge *GeometryError
			if !errors.Is(err, tc.want) || !errors.As(err, &ge) {
				t.Fatalf("error %v, want %v as a *GeometryError", err, tc.want)
			}
			if ge.Elements != [2]int{0, 1} || ge.Names != [2]string{"main", "flap"} {
				t.Errorf("error names %v %v, want both elements", ge.Elements, ge.Names)
			}
		})
	}
	st := twoElementStudy()
	if _, err := Place(st, []*Section{sec, sec}); err != nil {
		t.Errorf("a 12 mm slot is fine: %v", err)
	}
}

func BenchmarkPlaceTwoElements(b *testing.B) {
	sec, _ := NACA("4412", NACAOptions{})
	for _, n := range []int{160, 1000} {
		b.Run(fmt.Sprintf("N=%d", n), func(b *testing.B) {
			st := twoElementStudy()
			st.Panelling.Panels = n
			for b.Loop() {
				if _, err := Place(st, []*Section{sec, sec}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
