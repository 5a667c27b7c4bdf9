// Package boundarylayer holds the integral boundary-layer equations of the
// coupled viscous solution: the closure relations of the laminar and
// turbulent layers and of wakes, the e^N transition envelope, and the
// discrete residuals of one interval between two stations. It has no state
// and does no I/O; the solver package strings the intervals together and
// couples them to the panel method.
//
// # Units and variables
//
// Lengths are in the caller's length unit and velocities in units of the
// freestream speed U∞; Re is the Reynolds number per unit length, U∞/ν.
// A station is a point on a surface or a wake at arc length ξ from the
// stagnation point (from the trailing edge on a wake) with edge velocity
// Ue > 0, momentum thickness θ, displacement thickness δ* and a third
// variable C: the amplification exponent ñ of the most amplified
// Tollmien–Schlichting wave on a laminar station, √Cτ (the square root of
// the maximum shear-stress coefficient) on a turbulent or wake station.
// H = δ*/θ; the flow is incompressible, so the kinematic shape factor Hk
// equals H.
//
// # Equations
//
// The momentum integral equation and the kinetic-energy (dissipation
// integral) shape-factor equation (Drela & Giles, Viscous–inviscid analysis
// of transonic and low Reynolds number airfoils, AIAA J. 25(10), 1987,
// eqs. 1–2, incompressible):
//
//	dθ/dξ + (2 + H) (θ/Ue) dUe/dξ = Cf/2
//	θ dH*/dξ + H* (1 − H) (θ/Ue) dUe/dξ = 2 CD − H* Cf/2
//
// with H* = θ*/θ the kinetic-energy shape factor and CD the dissipation
// coefficient. Laminar stations add the e^N envelope equation
// dñ/dξ = (dñ/dReθ)(Hk) · ((m + 1)/2) · l / θ (Drela & Giles 1987, eqs.
// 23–27, an envelope fitted to the Falkner–Skan family's Orr–Sommerfeld
// stability results); turbulent and wake stations the shear-stress lag
// equation (Green, Weeks & Brooman, Prediction of turbulent boundary layers
// and wakes in compressible flow by a lag-entrainment method, ARC R&M 3791,
// 1977, in the form of Drela & Giles 1987, eq. 28):
//
//	(δ/Cτ) dCτ/dξ = 5.6 (√Cτ_EQ − √Cτ) + 2δ [ 4/(3δ*) (Cf/2 − ((Hk − 1)/(6.7 Hk))²) − (1/Ue) dUe/dξ ].
//
// The closures are those of Drela & Giles 1987 (laminar: fits to the
// Falkner–Skan profiles, valid through separation, eqs. 14–16; turbulent:
// Swafford's skin friction and the H* fit, eqs. 17–22). Formulas recalled
// from the paper are marked where the code uses them.
//
// The equations are written in logarithmic differences between two
// stations, each source term averaged with a weight that leans downstream
// where H changes fast (upwinding, closures.go), so a station's residual
// is a smooth function of the two stations' variables and edge velocities:
// the solver differentiates it numerically and solves all stations and the
// panel method together by Newton's method.
package boundarylayer
