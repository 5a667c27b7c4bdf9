// Package ode holds the explicit Runge–Kutta pair that Sectionbench's
// integrations share: the Dormand–Prince 5(4) step with its embedded error
// estimate, and the usual step-size controller. The streamlines (package
// solver, arc length along a line) and the turbulent boundary layer (Head's
// equations, arc length along a surface) each drive it in their own loop,
// because they stop for different reasons (entering a body, leaving a
// frame; separation).
//
// A system is y′ = f(x, y) with y a vector of any length n; the
// independent variable x is whatever the caller integrates along, in the
// caller's units. Nothing here allocates per step: a DormandPrince holds
// its stages.
package ode
