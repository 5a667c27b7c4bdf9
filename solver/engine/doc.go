// Package engine is Sectionbench's application service: it turns a study
// (model.Study) and its cleaned sections into results. Engine.Run places
// the configuration (model.Place), builds and factorises the panel system
// (solver.NewSystem), keeping the factorisation while only the angle of
// attack changes in free air, solves the study's angle and, as asked, its
// sweep and streamlines, and adds the viscous solution (the coupled
// solution of solver.SolveCoupled, with its convergence state on every
// point and warm starts along a sweep, or the one-way boundary-layer
// estimate), each
// element's Reynolds number and the forces in newtons per metre of span
// from the study's air (model.Air). Engine.Density and DensityStudy run a
// density study: the same study at several panel counts, judged by
// Richardson extrapolation.
//
// The numerics live in package solver; this package holds no numerical
// method of its own beyond the convergence study, and does no file I/O.
//
// # Units and signs
//
// Studies are in millimetres, layouts and forces in metres: Forces are in
// N/m of span (N·m/m for the moment), the dynamic pressure in Pa, density in
// kg/m³ and viscosity in Pa·s. Lift is positive up, away from the ground, as
// in package solver; downforce is −lift (Downforce), positive towards the
// ground. Coefficients keep the solver's conventions (solver/doc.go).
//
// Results are two-dimensional estimates: validate by test, and let the
// design and mounting of a wing follow the competition's rules and
// qualified review.
//
// # Errors
//
// Bad study values return the *model.FieldError of model.Study.Validate or
// of the density options; geometry and solver failures are returned as
// they come (*model.GeometryError, *solver.GeometryError,
// *solver.SingularError); a solution that is not finite wraps
// ErrNonFiniteResult. Cancellation returns ctx.Err(). A coupled viscous
// point that did not converge is not an error: it is a CoupledPoint with
// Converged false and NaN coefficients; one the solver gave up on with an
// error (a wake it cannot trace) carries the reason in Note.
package engine
