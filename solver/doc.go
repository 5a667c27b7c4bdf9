// Package solver holds Sectionbench's numerics: the linear-strength vortex
// panel method for one or several elements, optionally above a ground plane,
// the integrated forces, the velocity field and streamlines, the one-way
// integral boundary-layer estimate and the coupled viscous solution
// (boundary layers and wakes acting back on the panel method, coupled*.go,
// with the closures in solver/boundarylayer). It imports model for
// geometry; it has no GUI and does no file I/O. Turning a study into
// results (air, forces in newtons, density studies, sweeps, caching) is
// package solver/engine's job.
//
// Results are two-dimensional estimates. The panel method alone leaves out
// separation and the layers' displacement, so it overstates lift near and
// beyond stall; the coupled solution adds them for attached flow and
// trailing-edge separation but not leading-edge stall or large separated
// regions, and its lift still runs a few percent above wind-tunnel data.
// Nothing here says anything about structural loads: validate by test, and
// let the design and mounting of a wing follow the competition's rules and
// qualified review.
//
// # Frames, units and signs
//
// Lengths are in whatever unit the geometry comes in (chord lengths for a
// lone section, metres for a placed configuration); coefficients are made
// non-dimensional with Config.RefChord in the same unit. Velocities are in
// units of the freestream speed U∞ = 1.
//
// The freestream comes from the left at angle α above +x: V∞ = (cos α, sin α).
// Each element's panel nodes run from the trailing edge over the upper
// surface to the leading edge and back along the lower surface
// (counter-clockwise, the body on the left). The vortex strength γ is given
// at nodes, varies linearly along each panel and is continuous at nodes; it
// is positive clockwise, so a lifting element has positive circulation.
// Panel.Vt, the surface velocity just outside the body, is signed positive
// along the node ordering and equals −γ (forces.go), so it is negative on
// the upper surface of a lifting section and changes sign at the stagnation
// point.
//
// Lift is positive perpendicular to the freestream, 90° counter-clockwise
// from it (up for α = 0); the lift coefficient is Cl = L/(½ρU∞²c). Pitching
// moment is positive nose-up (the leading edge rises: clockwise in the x–y
// plane with x downstream), Cm = M/(½ρU∞²c²), about the quarter chord unless
// a reference point is given. Cp = 1 − (V/U∞)².
//
// ElementSolution.Cl is the vortex force on the element (Lagally's theorem:
// Kutta–Joukowski on each piece of its vortex sheet in the velocity that
// the freestream, the other elements and the images induce there; forces.go),
// 2Γ/(U∞c) for a lone element in free air; ClPressure integrates Cp. The two
// agree within the discretisation error (0.5% from 100 panels) for every
// element, alone, among several or above the ground, and so do the
// configuration's totals. ElementSolution.Circulation keeps Γ.
//
// # The method
//
// influence.go gives the closed-form velocity of a linear-strength vortex
// panel (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001, sec.
// 10.3.2) and of the constant-strength source panel that closes an open
// trailing edge (sec. 10.2.1); system.go assembles flow tangency at the
// panel midpoints and the Kutta condition per element into one square
// system (Katz & Plotkin sec. 11.4; Kuethe & Chow, Foundations of
// Aerodynamics, 5th ed., sec. 5.10), factorises it once and solves for the
// freestreams at 0° and 90°, so any angle is a superposition; ground effect
// uses mirror images (vortices of opposite sign, base sources of the same
// sign). forces.go turns γ into surface velocity, pressure, forces and
// sweeps; field.go evaluates the velocity anywhere, with multipole
// expansions for distant panels; streamline.go integrates streamlines with
// an adaptive Runge–Kutta pair; MeasureStages (stages.go) times the stages
// for benchmarks.
//
// # Trailing edges
//
// The Kutta condition sets the strengths at the first and last nodes equal
// and opposite. A closed trailing edge has those nodes coincide. An open
// (blunt) one has its gap closed by a straight base panel carrying an
// unknown constant source σ, fixed by zero normal flow just inside the
// base at its midpoint (system.go): the source is the outflow into the
// dead-air region behind the base, and it keeps the flow from passing
// through the gap, so the Cp of the last panels stays bounded however fine
// the panelling (it rises towards stagnation at the two corners). The base
// panel adds no circulation and its Cp is not a surface value; Panels,
// CpMin and the forces cover the surface panels only, and
// ElementSolution.BaseSource reports σ. A Solution warns when the gap is
// wider than MaxTEGapFraction of chord, where a thin base model is
// doubtful.
//
// In ground mode the freestream must be parallel to the ground: Solve and
// Sweep accept only α = 0 there, and the configuration itself is placed at
// its angle of attack.
//
// # Errors
//
// Programmer mistakes panic with a "solver: " prefix. Bad geometry (too few
// panels, wrong orientation, degenerate panels, nodes below the ground,
// non-finite coordinates) returns a *GeometryError naming the element and
// panel, wrapping a sentinel such as ErrClockwise; a singular system returns
// a *SingularError wrapping ErrSingular. An ill-conditioned system or a
// wide open trailing edge is solved with a warning in Solution.Warnings.
package solver
