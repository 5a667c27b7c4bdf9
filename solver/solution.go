package solver

import "sectionbench/model"

// Element is one body as the solver sees it: panel nodes in the
// configuration frame, trailing edge → upper surface → leading edge → lower
// surface → trailing edge. For a closed trailing edge the first and last
// nodes coincide; for an open one they stand apart and the solver closes
// the gap with a base panel carrying a constant source (system.go).
type Element struct {
	Name  string
	Nodes []model.Point
	LE    int // index of the leading-edge node in Nodes
}

// Config is a set of elements in one flow, optionally above a ground plane
// y = GroundY parallel to the freestream (which must then be at 0°).
type Config struct {
	Elements  []Element
	Ground    bool
	GroundY   float64
	RefChord  float64     // chord for the configuration's coefficients; 0 means the sum of element chords
	MomentRef model.Point // reference point of the configuration's Cm
}

// Side tells which surface a panel belongs to.
type Side int

// The surfaces: upper runs from the trailing edge to the leading-edge node,
// lower from the leading-edge node to the trailing edge, in node order.
const (
	Upper Side = iota
	Lower
)

func (s Side) String() string {
	if s == Upper {
		return "upper"
	}
	return "lower"
}

// Panel is the solution at one panel's midpoint.
type Panel struct {
	X, Y float64 // midpoint, configuration frame
	S    float64 // arc length from the first node to the midpoint
	XC   float64 // position along the element's chord line, 0 at the leading edge, 1 at the trailing edge
	Vt   float64 // tangential velocity / U∞, positive along the node ordering
	Cp   float64 // pressure coefficient 1 − Vt²
	Side Side
}

// Stagnation is where the surface velocity changes sign.
type Stagnation struct {
	X, Y float64 // configuration frame
	S    float64 // arc length from the first node
	XC   float64 // along the chord line
}

// ElementSolution is one element's share of a solution. Cl and Cm are on the
// element's own chord; Cm about its own quarter-chord point, nose-up positive.
type ElementSolution struct {
	Name       string
	Chord      float64
	Gamma      []float64 // vortex strength at each node / U∞, clockwise positive (Vt = −γ)
	Panels     []Panel   // in node order: upper surface TE → LE, then lower LE → TE
	Cl         float64   // vortex force (Lagally): 2Γ/(U∞c) alone in free air; with the local velocity of the others and the images otherwise (forces.go)
	ClPressure float64   // from integrating Cp over the panels
	Cm         float64   // about the element's quarter chord, from pressure
	CpMin      float64   // suction peak: lowest Cp over the surface panels, leaving out those of a trailing edge thinner than its panels (see the solution's warnings)
	XCpMin     float64   // x/c of CpMin
	Stagnation Stagnation

	// Circulation is Γ = ∮γ ds / U∞, clockwise positive (lifting), in the
	// configuration's length unit. 2Γ/(U∞c) is the element's lift only
	// when it is alone in free air; Cl is the force in every case.
	Circulation float64
	// CdPressure is the pressure force along the freestream on the
	// element's chord. Potential flow has no drag on a lone body
	// (d'Alembert), so for one element in free air it measures the
	// discretisation error; it is not a drag estimate.
	CdPressure float64
	// BaseSource is σ/U∞, the strength of the constant source on the base
	// panel that closes an open trailing edge (outflow positive; the
	// outflow per unit span is σ times the gap; system.go), 0 for a closed
	// edge. The base panel is not part of Panels: its Cp is not a surface
	// value.
	BaseSource float64
}

// Solution is the flow about a configuration at one freestream angle.
type Solution struct {
	AlphaDeg   float64 // freestream angle to +x used in this solve (a caller may relabel it; the field keeps the solve's own)
	Elements   []ElementSolution
	Cl         float64 // whole configuration, sum of the elements' vortex forces, on Config.RefChord
	ClPressure float64 // whole configuration, from pressure
	Cm         float64 // about Config.MomentRef, nose-up positive, on RefChord²
	RefChord   float64
	Warnings   []string // e.g. an ill-conditioned system, with its condition number

	sys    *System
	g      []float64   // all nodal strengths, element after element
	forces []elemForce // each element's pressure force and moment
	lazy   *lazyField  // velocity field, built on first use
	// The freestream direction of the solve, kept apart from AlphaDeg,
	// which callers may relabel (e.g. with the study's angle when the
	// configuration itself was rotated): the field and CmAbout use these.
	cosA, sinA float64
}

// Coefficients are the integrated results of one angle in a sweep.
type Coefficients struct {
	AlphaDeg   float64
	Cl         float64
	ClPressure float64
	Cm         float64
	CpMin      float64 // smallest Cp over all elements' surface panels, as ElementSolution.CpMin
	XCpMin     float64 // x/c of CpMin on its element
}
