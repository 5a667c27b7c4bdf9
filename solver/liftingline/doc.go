// Package liftingline estimates a finite wing from its section's
// two-dimensional polar with Prandtl's lifting-line theory, solved by
// Glauert's Fourier series (Anderson, Fundamentals of Aerodynamics,
// ch. 5: Prandtl's classical lifting-line theory, its general lift
// distribution, and the numerical nonlinear lifting-line method; section
// and equation numbers differ between editions, so none are quoted).
//
// # Method
//
// The circulation of a symmetric wing of span b in a freestream V is the
// series
//
//	Γ(θ) = 2 b V Σ A_n sin nθ,   n = 1, 3, 5, …,   y = −(b/2) cos θ,
//
// the induced angle at a station is α_i(θ) = Σ n A_n sin nθ / sin θ
// (radians) and the section there works at the effective angle
// α_eff = α − α_i. Glauert's method asks the section's own curve to hold at
// N collocation stations:
//
//	4 b Σ A_n sin nθ_k / c(θ_k) = c_l(α − α_i(θ_k)),   k = 1 … N.
//
// With a straight curve c_l = a₀(α − α_L0) this is Anderson's fundamental
// equation of the general lift distribution, a linear system in the A_n. With the section's tabulated curve (Table) it is
// nonlinear and is solved by Newton's method with a halving step (the
// idea of Anderson's numerical nonlinear method, which iterates station
// circulations; here the unknowns are the Fourier coefficients). Past the
// section's maximum lift the solution need not be unique;
// Result.PastMaxLoad says when a station is there.
//
// Stations are θ_k = (2k − 1)π/(4N), the midpoints of N equal intervals of
// θ on the half span, where the matrix sin((2j − 1)θ_k) is orthogonal. From
// the coefficients (Anderson, ch. 5):
//
//	C_L = π AR A₁,   C_Di = π AR Σ n A_n² = C_L²/(π AR) (1 + δ),
//	δ = Σ_{n≥3} n (A_n/A₁)²,   e = 1/(1 + δ),
//
// and the profile drag coefficient is the chord-weighted mean of the
// section drag at each station's effective angle, C_Dp = (1/S) ∫ c c_d dy
// (a strip assumption, common practice), by the midpoint rule in θ.
//
// # Units and signs
//
// Lengths in metres, angles in degrees at the interface (radians inside
// the sums). The "load" coefficient is the section's lift in the sense its
// angle increases it: a caller with an inverted wing passes the downforce
// coefficient −Cl against an angle positive towards more downforce, so the
// induced angle always reduces the loading, as trailing vortices do.
//
// # Limits
//
// Lifting-line theory assumes a straight, unswept wing of moderate to large
// aspect ratio (Weissinger's method is the usual choice below about 4,
// common practice). Near a flat ground (Options.GroundHeightM) the trailing
// vortices get mirror images of opposite strength, which lessen the
// induced angle (imageInfluence); the bound vortex's image is the section
// curve's business (a two-dimensional solution in ground effect), and then
// the induced drag is (2/(V S)) ∫ Γ α_i dy rather than the Trefftz-plane
// sum. End plates enter only through an effective aspect ratio
// (EndPlateAspectRatio). The answer is an estimate that a wind tunnel or
// the track must confirm.
package liftingline
