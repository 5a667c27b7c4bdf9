package figure

import (
	"errors"
	"sectionbench/export/exporttest"
	"testing"

	"sectionbench/solver"
)

// leSolution is an invented solution with panels at known x/c on both
// surfaces, upper from the trailing edge to the leading edge.
func leSolution(xcs []float64) *solver.Solution {
	es := solver.ElementSolution{Name: "main", Chord: 1}
	for i := len(xcs) - 1; i >= 0; i-- {
		es.Panels = append(es.Panels, solver.Panel{XC: xcs[i], Cp: -xcs[i], Side: solver.Upper})
	}
	for _, x := range xcs {
		es.Panels = append(es.Panels, solver.Panel{XC: x, Cp: x, Side: solver.Lower})
	}
	return &solver.Solution{Elements: []solver.ElementSolution{es}}
}

func TestLeadingEdgeCp(t *testing.T) {
	sol := leSolution([]float64{0.01, 0.05, 0.1, 0.3, 0.9})
	up, lo := leadingEdgeCp(sol.Elements[0], DensityLEChord)
	if len(up) != 3 || len(lo) != 3 {
		t.Fatalf("%d upper and %d lower panels within 10 %% of chord, want 3 and 3", len(up), len(lo))
	}
	for i, want := range []float64{0.01, 0.05, 0.1} {
		if up[i].X != want || lo[i].X != want {
			t.Errorf("point %d at x/c %g (upper), %g (lower), want %g from the leading edge", i, up[i].X, lo[i].X, want)
		}
		if up[i].Y != -want || lo[i].Y != want {
			t.Errorf("point %d: Cp %g, %g; the surfaces were swapped", i, up[i].Y, lo[i].Y)
		}
	}
}

func TestDensityLEPlot(t *testing.T) {
	if _, err := DensityLEPlot(nil, 0, DensityLEChord, false); !errors.Is(err, ErrNoData) {
		t.Errorf("no curves: error %v, want ErrNoData", err)
	}
	if _, err := DensityLEPlot([]DensityCurve{{Panels: 20, Solution: leSolution([]float64{0.2, 0.5})}}, 0, DensityLEChord, false); !errors.Is(err, ErrNoData) {
		t.Errorf("no panels near the nose: error %v, want ErrNoData", err)
	}
	var curves []DensityCurve
	for _, n := range []int{40, 80, 160} {
		curves = append(curves, DensityCurve{Panels: n, Nose: 0.5, Solution: exporttest.Solution(exporttest.TwoElementLayout(n), 4)})
	}
	for _, dark := range []bool{false, true} {
		p, err := DensityLEPlot(curves, 1, DensityLEChord, dark)
		if err != nil {
			t.Fatal(err)
		}
		if p.X.Min != 0 || p.X.Max != DensityLEChord {
			t.Errorf("x range %g..%g, want 0..%g", p.X.Min, p.X.Max, DensityLEChord)
		}
		f := RenderPlot(p, false, 600, 400, 96)
		if n := distinctColours(f.Image, f.Plot, 8); n < 8 {
			t.Errorf("dark=%v: only %d colours in the data area", dark, n)
		}
		if !f.YDown {
			t.Error("Cp is not drawn negative up")
		}
	}
	// The ramp runs from faint to strong.
	th := themeFor(false)
	if ramp(th, 0, 3) == ramp(th, 2, 3) {
		t.Error("coarse and fine curves share a colour")
	}
}
