// Package solver holds Sectionbench's numerics: the linear-strength vortex
// panel method for one or several elements, optionally above a ground plane,
// the integrated forces, the velocity field and streamlines, the integral
// boundary-layer estimate and the panel-density study. It imports model for
// geometry; it has no GUI and does no file I/O.
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
// at nodes, varies linearly along each panel and is continuous at nodes;
// Panel.Vt, the surface velocity just outside the body, is signed positive
// along the node ordering, so it is negative on the upper surface of a
// lifting section and changes sign at the stagnation point.
//
// Lift is positive perpendicular to the freestream, 90° counter-clockwise
// from it (up for α = 0); the lift coefficient is Cl = L/(½ρU∞²c). Pitching
// moment is positive nose-up (the leading edge rises: clockwise in the x–y
// plane with x downstream), Cm = M/(½ρU∞²c²), about the quarter chord unless
// a reference point is given. Cp = 1 − (V/U∞)².
//
// # Errors
//
// Programmer mistakes panic with a "solver: " prefix. Bad geometry (too few
// nodes, wrong orientation, degenerate panels, a singular system) returns a
// typed error.
package solver
