// Package modeltest provides shapes with known exact potential-flow answers
// for other packages' tests: a circle, ellipses and Kármán–Trefftz
// sections. All are sections in the model package's convention (trailing
// edge at (1, 0), leading edge at (0, 0), counter-clockwise from the
// trailing edge over the upper surface).
//
// The circle and the ellipse have no sharp trailing edge; a panel method
// with a Kutta condition at the node (1, 0) puts the rear stagnation point
// there. The "kutta" solutions below do the same, so that they are the
// answers such a solver should approach. Angles are in degrees, speeds in
// units of U∞.
package modeltest

import (
	"fmt"
	"math"

	"sectionbench/model"
)

// Ellipse returns n ≥ model.MinSectionPoints points of the ellipse with
// semi-axes A = 1/2 along the chord and B = tc/2, centred at (1/2, 0):
// x = (1 + cos η)/2, y = (tc/2) sin η with the eccentric angle η equally
// spaced from 0 (trailing edge) to 2π; the first and last points are both
// (1, 0). For odd n, η = π falls on a node, the leading edge (0, 0). It
// panics if tc is not in (0, 1] or n is too small.
func Ellipse(tc float64, n int) *model.Section {
	if !(tc > 0 && tc <= 1) {
		panic(fmt.Sprintf("modeltest: ellipse thickness %g outside (0, 1]", tc))
	}
	if n < model.MinSectionPoints {
		panic(fmt.Sprintf("modeltest: ellipse of %d points", n))
	}
	pts := make([]model.Point, n)
	for i := range pts {
		eta := 2 * math.Pi * float64(i) / float64(n-1)
		s, c := math.Sincos(eta)
		pts[i] = model.Point{X: 0.5 * (1 + c), Y: 0.5 * tc * s}
	}
	pts[0], pts[n-1] = model.Point{X: 1}, model.Point{X: 1}
	if n%2 == 1 {
		pts[n/2] = model.Point{}
	}
	name := fmt.Sprintf("ellipse t/c=%g", tc)
	if tc == 1 {
		name = "circle"
	}
	s, err := model.NewSection(name, pts)
	if err != nil {
		panic("modeltest: " + err.Error())
	}
	return s
}

// Circle returns Ellipse(1, n): the circle of radius 1/2 centred at
// (1/2, 0), with θ = η the polar angle about the centre.
func Circle(n int) *model.Section { return Ellipse(1, n) }

// EllipseEta returns the eccentric angle η in [0, 2π) of a point p on the
// ellipse of Ellipse(tc, ·): atan2(2y/tc, 2x − 1). For the circle it is the
// polar angle θ about the centre.
func EllipseEta(tc float64, p model.Point) float64 {
	eta := math.Atan2(2*p.Y/tc, 2*p.X-1)
	if eta < 0 {
		eta += 2 * math.Pi
	}
	return eta
}

// EllipseSpeed returns the exact surface speed q/U∞ on the ellipse of
// thickness ratio tc at eccentric angle η (radians), freestream at
// alphaDeg.
//
// The ellipse with semi-axes A, B is the Joukowski image z = ζ + k²/ζ of
// the circle |ζ| = R = (A + B)/2, k² = (A² − B²)/4 (Milne-Thomson,
// Theoretical Hydrodynamics, the elliptic cylinder; Katz & Plotkin,
// Low-Speed Aerodynamics, 2nd ed., ch. 6), so with η = arg ζ
//
//	q = (A + B) |sin(η − α) + g| / √(A² sin²η + B² cos²η),
//
// where g = 0 without circulation and, with kutta, g = sin α: the
// circulation Γ = 4πU R sin α that puts the rear stagnation point at the
// trailing edge η = 0. For the circle (tc = 1) this is q = 2|sin(θ − α)|,
// Cp = 1 − 4 sin²θ at α = 0.
func EllipseSpeed(tc, eta, alphaDeg float64, kutta bool) float64 {
	a, b := 0.5, 0.5*tc
	al := alphaDeg * math.Pi / 180
	g := 0.0
	if kutta {
		g = math.Sin(al)
	}
	s, c := math.Sincos(eta)
	den := math.Sqrt(a*a*s*s + b*b*c*c)
	return (a + b) * math.Abs(math.Sin(eta-al)+g) / den
}

// EllipseCp returns 1 − EllipseSpeed².
func EllipseCp(tc, eta, alphaDeg float64, kutta bool) float64 {
	q := EllipseSpeed(tc, eta, alphaDeg, kutta)
	return 1 - q*q
}

// EllipseCl returns the exact lift coefficient on the unit chord with the
// Kutta circulation of EllipseSpeed: c_l = 2Γ/(U c) = 2π(1 + t/c) sin α
// (Kutta–Joukowski with Γ = 4πU R sin α, R = (1 + t/c)/4). Without
// circulation the lift is zero.
func EllipseCl(tc, alphaDeg float64) float64 {
	return 2 * math.Pi * (1 + tc) * math.Sin(alphaDeg*math.Pi/180)
}

// CircleCp returns the exact Cp on Circle at polar angle θ (radians) at
// alphaDeg with the Kutta circulation: 1 − 4(sin(θ − α) + sin α)², which is
// 1 − 4 sin²θ at α = 0 (Milne-Thomson, Theoretical Hydrodynamics; Katz &
// Plotkin 2nd ed. ch. 3, flow past a cylinder with circulation).
func CircleCp(theta, alphaDeg float64) float64 { return EllipseCp(1, theta, alphaDeg, true) }

// RelErr returns the relative error |got − want| / |want| of a check: the
// one definition the tests of the project share. It is +Inf (or NaN) when
// want is 0; compare with an absolute tolerance there.
func RelErr(got, want float64) float64 { return math.Abs(got-want) / math.Abs(want) }
