package figure_test

import (
	"fmt"

	"sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
)

// ExampleLEWindow frames a 20 mm close-up of a 250 mm element's nose.
func ExampleLEWindow() {
	l := &model.Layout{Elements: []model.PlacedElement{{
		Name: "main", Chord: 0.25,
		LeadingEdge: model.Point{X: 0, Y: 0}, TrailingEdge: model.Point{X: 0.25, Y: 0},
	}}}
	w := figure.LEWindow(l, 0, 20)
	fmt.Printf("x %.0f to %.0f mm, y %.0f to %.0f mm\n", w.XMin, w.XMax, w.YMin, w.YMax)
	// Output:
	// x -5 to 15 mm, y -10 to 10 mm
}

// ExampleRender draws the pressure view of a hand-built solution, as the
// desktop app does off its UI thread, and reads the data under a pixel.
func ExampleRender() {
	es := solver.ElementSolution{Name: "main", Chord: 0.25, CpMin: -1.2, XCpMin: 0.05}
	for i := 0; i <= 20; i++ { // an invented, smooth Cp on both surfaces
		x := float64(i) / 20
		es.Panels = append(es.Panels,
			solver.Panel{XC: x, Cp: -1.2 + 1.3*x, Side: solver.Upper},
			solver.Panel{XC: x, Cp: 0.4 - 0.3*x, Side: solver.Lower})
	}
	sc := &figure.Scene{Solution: &solver.Solution{AlphaDeg: 4, Elements: []solver.ElementSolution{es}}, Element: 0}
	f, err := figure.Render(figure.ViewPressure, sc, 600, 400, 96)
	if err != nil {
		fmt.Println(err)
		return
	}
	cx, cy := (f.Plot.Min.X+f.Plot.Max.X)/2, f.Plot.Min.Y+1
	x, cp, ok := f.DataAt(cx, cy)
	fmt.Printf("%d×%d px, Cp grows downwards: %v\n", f.Image.Bounds().Dx(), f.Image.Bounds().Dy(), f.YDown)
	fmt.Printf("top middle of the data area: x/c %.1f, Cp below %.1f: %v %v\n", x, es.CpMin, cp < es.CpMin, ok)
	// Output:
	// 600×400 px, Cp grows downwards: true
	// top middle of the data area: x/c 0.5, Cp below -1.2: true true
}
