package model

import (
	"fmt"
	"strings"
)

// A coordinate file as a supplier might send it: millimetres, commas,
// comments, the lower surface first. The section is invented for the
// example (a NACA 0012 at 200 mm chord, sampled coarsely).
func ExampleParseCoordinates() {
	const file = `Demo flap, 200 mm (invented)
# x [mm], y [mm]; from the trailing edge along the lower surface
210.00, 0.00
150.00, -7.27
90.00, -11.60
50.00, -11.47
30.00, -9.37
18.00, -6.46
12.00, -3.41
10.00, 0.00
12.00, 3.41
18.00, 6.46
30.00, 9.37
50.00, 11.47
90.00, 11.60
150.00, 7.27
210.00, 0.00
`
	p, err := ParseCoordinates(strings.NewReader(file), "flap.dat")
	if err != nil {
		fmt.Println(err)
		return
	}
	sec, rep, err := p.Clean(DefaultCleanOptions)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Print(rep)
	fmt.Printf("first point %.4f, leading edge %.4f, max thickness %.4f\n", sec.At(0), sec.At(sec.LeadingEdgeIndex()), sec.MaxThickness())
	// Output:
	// Section "Demo flap, 200 mm (invented)" from flap.dat: 15 points in, 15 out
	// Detected:
	//   - name line 1: "Demo flap, 200 mm (invented)"
	//   - 1 comment line skipped
	//   - values separated by spaces, commas
	//   - one loop of 15 points, taken in the order listed
	//   - trailing edge: the corner at point 1 on line 3 (turning by 166°)
	//   - leading edge: point 8 on line 10, the farthest point of the spline
	// Changes:
	//   - reversed the point order: the contour ran clockwise (lower surface first); the package runs counter-clockwise, upper surface first
	//   - moved the leading edge from (10, 0) to the origin
	//   - scaled by 1/200 to unit chord (the chord was 200)
	// Warnings:
	//   - sparse-nose: 3 points within 2% of the chord from the leading edge, fewer than 5: the nose shape and the suction peak are poorly defined
	// Trailing-edge gap: 0% of the chord
	// first point {1.0000 0.0000}, leading edge {0.0000 0.0000}, max thickness 0.1160
}
