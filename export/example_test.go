package export_test

import (
	"fmt"
	"os"

	"sectionbench/export"
	"sectionbench/model"
	"sectionbench/solver"
)

// ExampleWriteCoordinates writes a coarse NACA 0012 at a 200 mm chord, as a
// workshop would receive it. At x = 50 mm (x/c = 0.25) the half thickness
// 11.881 mm is 200 × 0.6 × 0.099012 from the thickness formula of Abbott &
// von Doenhoff, Theory of Wing Sections (1959), eq. 6.2.
func ExampleWriteCoordinates() {
	sec, err := model.NACA("0012", model.NACAOptions{PointsPerSurface: 4, ClosedTE: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := export.WriteCoordinates(os.Stdout, sec, export.CoordOptions{ChordMM: 200}); err != nil {
		fmt.Println(err)
	}
	// Output:
	// NACA 0012 (chord 200 mm, coordinates in mm)
	// 200.000   0.000
	// 150.000   6.241
	//  50.000  11.881
	//   0.000   0.000
	//  50.000 -11.881
	// 150.000  -6.241
	// 200.000   0.000
}

// ExampleWriteSweepTable writes two angles of a sweep as CSV.
func ExampleWriteSweepTable() {
	sweep := []solver.Coefficients{
		{AlphaDeg: 0, Cl: 0.2512, ClPressure: 0.2498, Cm: -0.0541, CpMin: -0.612, XCpMin: 0.152},
		{AlphaDeg: 2, Cl: 0.4845, ClPressure: 0.4822, Cm: -0.0563, CpMin: -1.107, XCpMin: 0.021},
	}
	if err := export.WriteSweepTable(os.Stdout, sweep, nil); err != nil {
		fmt.Println(err)
	}
	// Output:
	// alpha_deg,cl,cl_pressure,cm,cp_min,x_cp_min
	// 0,0.2512,0.2498,-0.0541,-0.612,0.152
	// 2,0.4845,0.4822,-0.0563,-1.107,0.021
}

// ExampleLEWindow frames a 20 mm close-up of a 250 mm element's nose.
func ExampleLEWindow() {
	l := &model.Layout{Elements: []model.PlacedElement{{
		Name: "main", Chord: 0.25,
		LeadingEdge: model.Point{X: 0, Y: 0}, TrailingEdge: model.Point{X: 0.25, Y: 0},
	}}}
	w := export.LEWindow(l, 0, 20)
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
	sc := &export.Scene{Solution: &solver.Solution{AlphaDeg: 4, Elements: []solver.ElementSolution{es}}, Element: 0}
	f, err := export.Render(export.ViewPressure, sc, 600, 400, 96)
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
