package model_test

import (
	"errors"
	"fmt"

	"sectionbench/model"
)

func ExampleParseNACA() {
	c, err := model.ParseNACA("NACA 23012")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %d-digit, design Cl %.2f, max camber %.4f near x = %.2f, thickness %.2f\n",
		c, c.Family, c.DesignCl, c.MaxCamber, c.CamberPos, c.Thickness)

	_, err = model.ParseNACA("23a12")
	fmt.Println(err)
	var ne *model.NACAError
	if errors.As(err, &ne) {
		fmt.Println("position:", ne.Pos)
	}
	// Output:
	// NACA 23012: 5-digit, design Cl 0.30, max camber 0.0184 near x = 0.15, thickness 0.12
	// NACA "23a12": character 3 must be a digit
	// position: 2
}

func ExampleNACA() {
	s, err := model.NACA("2412", model.NACAOptions{PointsPerSurface: 41})
	if err != nil {
		fmt.Println(err)
		return
	}
	le := s.LeadingEdgeIndex()
	fmt.Println(s.Name(), s.Len(), "points")
	fmt.Printf("first %.5f, leading edge %.5f, last %.5f\n", s.At(0), s.At(le), s.At(s.Len()-1))
	// The open trailing edge: the thickness 2·0.0105t is laid off
	// perpendicular to the mean line, which slopes down there.
	fmt.Printf("trailing-edge gap %.5f\n", s.TrailingEdgeGap())
	// Output:
	// NACA 2412 81 points
	// first {1.00008 0.00126}, leading edge {0.00000 0.00000}, last {0.99992 -0.00126}
	// trailing-edge gap 0.00252
}

func ExampleRepanel() {
	s, err := model.NACA("0012", model.NACAOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := model.Repanel(s, model.Panelling{Panels: 20, Spacing: model.SpacingCosine})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(r.Len(), "nodes")
	for i := 0; i <= 10; i += 2 {
		fmt.Printf("node %2d: x = %.4f\n", i, r.At(i).X)
	}
	_, err = model.Repanel(s, model.Panelling{Panels: 8, Spacing: model.SpacingCosine})
	fmt.Println(err)
	// Output:
	// 21 nodes
	// node  0: x = 1.0000
	// node  2: x = 0.9045
	// node  4: x = 0.6545
	// node  6: x = 0.3455
	// node  8: x = 0.0955
	// node 10: x = 0.0000
	// panelling.panels: 8 is outside 16..2000
}

func ExampleKarmanTrefftz_Exact() {
	k, err := model.ParseKT("-0.1,0.1,10")
	if err != nil {
		fmt.Println(err)
		return
	}
	// 5° in the mapping plane, expressed relative to the section's chord.
	e := k.Exact(5 - k.ChordAngleDeg())
	fmt.Println(k.Name())
	fmt.Printf("α = %.4f° on the chord, Cl = %.4f, Cm,c/4 = %.4f\n", e.AlphaDeg, e.Cl, e.Cm)
	fmt.Printf("Cp at the stagnation point %.6f\n", e.CpNear(e.Stagnation))
	// Output:
	// KT c=(-0.1,0.1) τ=10°
	// α = 5.1019° on the chord, Cl = 1.2514, Cm,c/4 = -0.1573
	// Cp at the stagnation point 1.000000
}
