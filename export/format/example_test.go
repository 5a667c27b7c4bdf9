package format_test

import (
	"fmt"
	"math"
	"os"

	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
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
	if err := format.WriteCoordinates(os.Stdout, sec, format.CoordOptions{ChordMM: 200}); err != nil {
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

// ExampleWriteSweepTable writes three angles of a sweep as CSV after its
// metadata; the last one's suction peak is beyond what real flows sustain,
// and its flags say so (invented values).
func ExampleWriteSweepTable() {
	sweep := []solver.Coefficients{
		{AlphaDeg: 0, Cl: 0.2512, ClPressure: 0.2498, Cm: -0.0541, CpMin: -0.612, XCpMin: 0.152},
		{AlphaDeg: 2, Cl: 0.4845, ClPressure: 0.4822, Cm: -0.0563, CpMin: -1.107, XCpMin: 0.021},
		{AlphaDeg: 16, Cl: 2.0514, ClPressure: 2.0377, Cm: -0.0811, CpMin: -9.315, XCpMin: 0.004},
	}
	meta := format.Metadata{Study: "demo section (invented)", Reynolds: 3e5, Program: "Sectionbench"}
	if err := format.WriteSweepTable(os.Stdout, meta, sweep, nil); err != nil {
		fmt.Println(err)
	}
	// Output:
	// # study: demo section (invented)
	// # reynolds number: 3e+05 on the element's own chord
	// # units: alpha_deg in degrees; coefficients without units on the reference chord, cl positive away from the ground (standard sense), cm nose-up positive; flags: the row's plausibility cautions in words, separated by semicolons, none when there is none
	// # x/c: along the main element's own chord from its leading edge; empty: none found or outside the method's range
	// # program: Sectionbench
	// alpha_deg,cl,cl_pressure,cm,cp_min,cp_min_xc,flags
	// 0,0.2512,0.2498,-0.0541,-0.612,0.152,none
	// 2,0.4845,0.4822,-0.0563,-1.107,0.021,none
	// 16,2.0514,2.0377,-0.0811,-9.315,0.004,suction beyond real flows
}

// ExampleWriteCoupledSweepTable writes a sweep with the coupled viscous
// solution as CSV: the second angle did not converge, so its viscous
// columns stay empty and it says "no" (invented values).
func ExampleWriteCoupledSweepTable() {
	nan := math.NaN()
	sweep := []solver.Coefficients{
		{AlphaDeg: 0, Cl: 0.2512, Cm: -0.0541},
		{AlphaDeg: 2, Cl: 0.4845, Cm: -0.0563},
	}
	el := func(tu, tl float64) []engine.CoupledElementPoint {
		return []engine.CoupledElementPoint{{TransitionUpper: tu, TransitionLower: tl, SeparationUpper: nan, SeparationLower: nan}}
	}
	coupled := []engine.CoupledPoint{
		{AlphaDeg: 0, Cl: 0.2301, Cd: 0.0091, Cm: -0.0502, Converged: true, Iterations: 31, Residual: 4e-6, Elements: el(0.52, 0.61)},
		{AlphaDeg: 2, Cl: nan, Cd: nan, Cm: nan, Iterations: 60, Residual: 0.3, Elements: el(nan, nan)},
	}
	meta := format.Metadata{Study: "demo section (invented)", Reynolds: 3e5, Program: "Sectionbench"}
	if err := format.WriteCoupledSweepTable(os.Stdout, meta, sweep, coupled); err != nil {
		fmt.Println(err)
	}
	// Output:
	// # study: demo section (invented)
	// # reynolds number: 3e+05 on the element's own chord
	// # units: alpha_deg in degrees; coefficients without units on the reference chord, cl positive away from the ground (standard sense), cm nose-up positive; cl, cd and cm from the coupled viscous solution, empty where it did not converge; flags: the row's plausibility cautions in words, separated by semicolons, none when there is none
	// # x/c: along the main element's own chord from its leading edge; empty: none found, or the row did not converge
	// # program: Sectionbench
	// alpha_deg,cl,cd,cm,cl_inviscid,cm_inviscid,converged,past_cl_max,iterations,residual,transition_upper_xc,transition_lower_xc,separation_upper_xc,separation_lower_xc,flags
	// 0,0.2301,0.0091,-0.0502,0.2512,-0.0541,yes,no,31,4e-06,0.52,0.61,,,none
	// 2,,,,0.4845,-0.0563,no,no,60,0.3,,,,,viscous solution not converged
}
