package figure

import (
	"fmt"
	"math"
	"sectionbench/export/exporttest"
	"testing"

	"sectionbench/model"
)

// TestPanelSizesOfPolygon checks the sizes of a hand-made contour against
// closed forms: a rhombus TE (1,0) → (0.5,0.1) → LE (0,0) → (0.5,−0.1) →
// TE, chord 1, every side √(0.5² + 0.1²), split so that the upper side has
// panels of 0.5 and 0.5 of the side and the lower 0.25 and 0.75.
func TestPanelSizesOfPolygon(t *testing.T) {
	side := math.Hypot(0.5, 0.1)
	nodes := []model.Point{
		{X: 1, Y: 0}, {X: 0.5, Y: 0.1}, {X: 0, Y: 0},
		{X: 0.125, Y: -0.025}, {X: 0.5, Y: -0.1}, {X: 1, Y: 0},
	}
	l := &model.Layout{Elements: []model.PlacedElement{{Name: "rhombus", Nodes: nodes, LE: 2, Chord: 1}}}
	ps, err := PanelSizesOf(l)
	if err != nil {
		t.Fatal(err)
	}
	s := ps[0]
	const tol = 1e-12
	wantLen := []float64{side, side, side / 4, 3 * side / 4, side}
	wantRatio := []float64{1, 4, 3, 4.0 / 3}
	if len(s.Length) != len(wantLen) || len(s.Ratio) != len(wantRatio) {
		t.Fatalf("%d lengths, %d ratios; want %d, %d", len(s.Length), len(s.Ratio), len(wantLen), len(wantRatio))
	}
	for i, w := range wantLen {
		if math.Abs(s.Length[i]-w) > tol {
			t.Errorf("length[%d] = %g, want %g", i, s.Length[i], w)
		}
	}
	for i, w := range wantRatio {
		if math.Abs(s.Ratio[i]-w) > tol {
			t.Errorf("ratio[%d] = %g, want %g", i, s.Ratio[i], w)
		}
	}
	if math.Abs(s.LEPosition-0.5) > tol {
		t.Errorf("leading edge at %g of the contour, want 0.5", s.LEPosition)
	}
	if math.Abs(s.Position[0]-0.125) > tol || math.Abs(s.RatioPosition[0]-0.25) > tol {
		t.Errorf("first midpoint at %g, first node at %g; want 0.125, 0.25", s.Position[0], s.RatioPosition[0])
	}
	// Every ratio of a five-panel contour lies within two of a trailing
	// edge, where the check does not look (model.TrailingEdgeRatiosExempt).
	if got := s.Over(DefaultMaxNeighbourRatio); len(got) != 0 {
		t.Errorf("checked ratios above 1.5 at %v, want none", got)
	}
	if got := s.MaxRatio(); got != 1 {
		t.Errorf("largest checked ratio %g, want 1 (none checked)", got)
	}
}

// TestPanelSizesCheckedRatios: on a longer contour an interior jump is
// reported and the trailing-edge ends are not.
func TestPanelSizesCheckedRatios(t *testing.T) {
	s := PanelSizes{Ratio: []float64{3, 1.67, 1.1, 2.5, 1.2, 1.67, 3}}
	if got := s.Over(DefaultMaxNeighbourRatio); len(got) != 1 || got[0] != 3 {
		t.Errorf("checked ratios above 1.5 at %v, want [3]", got)
	}
	if got := s.MaxRatio(); got != 2.5 {
		t.Errorf("largest checked ratio %g, want 2.5", got)
	}
}

// TestPanelSizesUniformSpacing: equal arc-length steps (SpacingUniform)
// give chords of nearly equal arcs, so every neighbour ratio is close to 1
// and the figure warns of none. Cosine spacing of few panels grows faster
// than 1.5 at a round nose: there x = (1 − cos β)/2 ≈ β²/4 and the arc
// length s ∝ √x ∝ β, so the first panels grow about 1 : 2 : 3 and the
// ratio at the first node is near 2 (a property of the cosine law; Katz &
// Plotkin, Low-Speed Aerodynamics, 2nd ed., sec. 11.1, for the law).
func TestPanelSizesUniformSpacing(t *testing.T) {
	sec, err := model.NACA("0012", model.NACAOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name               string
		p                  model.Panelling
		maxBelow, maxAbove float64
	}{
		{"uniform 160", model.Panelling{Panels: 160, Spacing: model.SpacingUniform}, 1.05, 0},
		{"cosine 20", model.Panelling{Panels: 20, Spacing: model.SpacingCosine}, math.Inf(1), DefaultMaxNeighbourRatio},
	} {
		rp, err := model.Repanel(sec, c.p)
		if err != nil {
			t.Fatal(err)
		}
		l := &model.Layout{Elements: []model.PlacedElement{{Name: "0012", Nodes: rp.Points(), LE: rp.LeadingEdgeIndex(), Chord: 1}}}
		ps, err := PanelSizesOf(l)
		if err != nil {
			t.Fatal(err)
		}
		m := ps[0].MaxRatio()
		if m >= c.maxBelow || m <= c.maxAbove {
			t.Errorf("%s: largest neighbour ratio %g, want in (%g, %g)", c.name, m, c.maxAbove, c.maxBelow)
		}
		if _, err := PanelSizesPlot(ps[0], DefaultMaxNeighbourRatio, false); err != nil {
			t.Errorf("%s: plot: %v", c.name, err)
		}
	}
}

func TestRenderPanelSizes(t *testing.T) {
	ps, err := PanelSizesOf(exporttest.TwoElementLayout(60))
	if err != nil {
		t.Fatal(err)
	}
	if len(ps) != 2 {
		t.Fatalf("%d elements, want 2", len(ps))
	}
	for _, dark := range []bool{false, true} {
		p, err := PanelSizesPlot(ps[1], DefaultMaxNeighbourRatio, dark)
		if err != nil {
			t.Fatal(err)
		}
		f := RenderPlot(p, true, 700, 500, 96)
		if n := distinctColours(f.Image, f.Image.Bounds(), 6); n < 6 {
			t.Errorf("dark=%v: only %d colours", dark, n)
		}
		if _, _, ok := f.DataAt(350, 250); ok {
			t.Error("a composite figure reports data coordinates")
		}
	}
}

// A square contour of side 1 on a chord of 1, with one side split at a
// quarter: panels of 0.25 and 0.75 meet at a ratio of 3, above the
// common-practice limit of 1.5.
func ExamplePanelSizesOf() {
	nodes := []model.Point{{X: 1, Y: 0}, {X: 1, Y: 0.25}, {X: 1, Y: 1}, {X: 0, Y: 1}, {X: 0, Y: 0}, {X: 1, Y: 0}}
	l := &model.Layout{Elements: []model.PlacedElement{{Name: "square", Nodes: nodes, LE: 3, Chord: 1}}}
	ps, err := PanelSizesOf(l)
	if err != nil {
		fmt.Println(err)
		return
	}
	s := ps[0]
	fmt.Println("lengths:", s.Length)
	fmt.Printf("ratios: %.3g\n", s.Ratio)
	fmt.Println("above 1.5 at:", s.Over(DefaultMaxNeighbourRatio))
	fmt.Println("leading edge at:", s.LEPosition)
	// Output:
	// lengths: [0.25 0.75 1 1 1]
	// ratios: [3 1.33 1 1]
	// above 1.5 at: []
	// leading edge at: 0.5
}
