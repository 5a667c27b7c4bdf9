package solver_test

import (
	"fmt"
	"math"

	"sectionbench/model"
	"sectionbench/solver"
)

// element builds a solver element from a generated NACA section with
// cosine-spaced panels.
func element(designation string, panels int) solver.Element {
	sec, err := model.NACA(designation, model.NACAOptions{PointsPerSurface: panels/2 + 1})
	if err != nil {
		panic(err)
	}
	return solver.Element{Name: sec.Name(), Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}
}

// round4 rounds to four decimals, turning −0 into 0 for printing.
func round4(x float64) float64 { return math.Round(x*1e4)/1e4 + 0 }

// A symmetric section at zero angle of attack carries no lift and no
// moment; its stagnation point is the leading edge.
func ExampleNewSystem() {
	sys, err := solver.NewSystem(solver.Config{Elements: []solver.Element{element("0012", 160)}})
	if err != nil {
		fmt.Println(err)
		return
	}
	sol := sys.Solve(0)
	e := sol.Elements[0]
	fmt.Printf("Cl %.4f, Cm %.4f, stagnation at x/c %.4f\n", round4(sol.Cl), round4(e.Cm), round4(e.Stagnation.XC))
	fmt.Println("panels:", len(e.Panels), "unknowns:", sys.Unknowns())
	// Output:
	// Cl 0.0000, Cm 0.0000, stagnation at x/c 0.0000
	// panels: 160 unknowns: 162
}

// A sweep reuses the factorised system: the lift slope of NACA 0012 is a
// little above thin-airfoil theory's 2π per radian, as thickness makes it
// in potential flow (docs/validation.md §1).
func ExampleSystem_Sweep() {
	sys, err := solver.NewSystem(solver.Config{Elements: []solver.Element{element("0012", 160)}})
	if err != nil {
		fmt.Println(err)
		return
	}
	sw := sys.Sweep([]float64{-2, 0, 2, 4})
	slope := (sw[3].Cl - sw[0].Cl) / 6
	fmt.Printf("lift slope %.3f per degree (thin airfoil %.3f)\n", slope, 2*math.Pi*math.Pi/180)
	fmt.Printf("suction peak at 4°: Cp %.2f at x/c %.3f\n", sw[3].CpMin, sw[3].XCpMin)
	// Output:
	// lift slope 0.121 per degree (thin airfoil 0.110)
	// suction peak at 4°: Cp -1.53 at x/c 0.012
}

// Bad geometry comes back as a typed error naming the element and panel.
func ExampleGeometryError() {
	e := element("0012", 40)
	e.Nodes[7] = e.Nodes[6] // a repeated node: a zero-length panel
	_, err := solver.NewSystem(solver.Config{Elements: []solver.Element{e}})
	fmt.Println(err)
	// Output:
	// solver: element 1 ("NACA 0012"), panel/node 7: degenerate panel (zero or tiny length): length 0
}

// In ground mode the wing is placed at its angle and the freestream stays
// at 0°. An inverted section makes more downforce closer to the ground.
func ExampleConfig_ground() {
	up := element("4412", 120)
	// Invert: mirror about y = 0 and reverse the node order so that the
	// contour still runs trailing edge → upper → leading edge → lower.
	n := len(up.Nodes)
	inv := solver.Element{Name: "inverted", LE: n - 1 - up.LE, Nodes: make([]model.Point, n)}
	for i, p := range up.Nodes {
		inv.Nodes[n-1-i] = model.Point{X: p.X, Y: -p.Y}
	}
	low := 0.0
	for _, p := range inv.Nodes {
		low = math.Min(low, p.Y)
	}
	for _, h := range []float64{1, 0.5, 0.2} { // clearance / chord
		sys, err := solver.NewSystem(solver.Config{Elements: []solver.Element{inv}, Ground: true, GroundY: low - h})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("h/c %.1f: Cl %.2f\n", h, sys.Solve(0).Elements[0].ClPressure)
	}
	// Output:
	// h/c 1.0: Cl -0.57
	// h/c 0.5: Cl -0.67
	// h/c 0.2: Cl -1.13
}

// Streamlines start on the upstream edge of the bounds; the last one per
// element is the dividing streamline, ending at the stagnation point.
func ExampleSolution_Streamlines() {
	cfg := solver.Config{Elements: []solver.Element{element("2412", 120)}}
	sys, err := solver.NewSystem(cfg)
	if err != nil {
		fmt.Println(err)
		return
	}
	sol := sys.Solve(4)
	lines := sol.Streamlines(solver.StreamOptions{Bounds: solver.DefaultBounds(cfg), Seeds: 10})
	last := lines[len(lines)-1]
	end := last.Points[len(last.Points)-1]
	st := sol.Elements[0].Stagnation
	fmt.Println(len(lines), "lines; last dividing:", last.Dividing, "ends at the stagnation point:", end == model.Point{X: st.X, Y: st.Y})
	// Output:
	// 11 lines; last dividing: true ends at the stagnation point: true
}
