package model

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strconv"
	"strings"
)

// Limits on a Kármán–Trefftz section (project choices: beyond them the
// shape stops looking like a wing section, or the map degenerates).
const (
	// MaxKTCenter bounds |CenterX| and |CenterY|.
	MaxKTCenter = 1.0
	// MaxKTTEAngleDeg bounds the trailing-edge angle. The map exponent
	// n = 2 − τ/π must stay above 1.
	MaxKTTEAngleDeg = 90.0
	// MinKTTEAngleDeg is the smallest trailing-edge angle of a section of
	// the family. τ = 0 is Joukowski's cusp, whose two surfaces meet
	// tangentially: the edge has no thickness to make, and a panel
	// method's Cp on its last panels grows without bound as panels are
	// added (the two surface sheets end up closer than a panel length:
	// −1.1e4, −1.7e5, −2.1e6, −2.8e7 at 80, 160, 320, 640 cosine panels on
	// μ = (−0.1, 0.1) at 4°). From 1° that spike stays bounded as panels
	// are added, and the solver flags edges thinner than their panels
	// (below about 4.6°) and keeps them out of the suction peak. The
	// project's validation against the exact solution covers τ ≥ 5°
	// (solver/validation_test.go). The map and Exact remain defined down
	// to τ = 0 for checks of the theory.
	MinKTTEAngleDeg = 1.0
)

// ErrKTCircle reports a mapping circle that does not enclose ζ = −1.
var ErrKTCircle = errors.New("circle through ζ = 1 must enclose ζ = −1 (centre x < 0)")

// ErrKTThinEdge reports a trailing-edge angle below MinKTTEAngleDeg.
var ErrKTThinEdge = errors.New("trailing edge too thin for a panel method (cusped or nearly so)")

// KarmanTrefftz is a Kármán–Trefftz section: the image of a circle through
// ζ = b = 1 with centre μ = (CenterX, CenterY) under the map
//
//	(z − nb)/(z + nb) = ((ζ − b)/(ζ + b))ⁿ,   n = 2 − τ/π,
//
// τ = TEAngleDeg the trailing-edge angle (Milne-Thomson, Theoretical
// Hydrodynamics, Kármán–Trefftz profiles; Katz & Plotkin, Low-Speed
// Aerodynamics, 2nd ed., sec. 6.7). τ = 0 gives the Joukowski map
// z = ζ + b²/ζ. The circle has radius a = |b − μ| and b − μ = a e^(−iβ).
// The power is taken on the principal branch, which is continuous on the
// whole exterior of the circle because the cut, the segment (−b, b), lies
// inside it.
//
// At infinity z = ζ + b²(n² − 1)/(3ζ) + O(ζ⁻³), so a freestream has the
// same speed and direction in both planes.
type KarmanTrefftz struct {
	CenterX, CenterY float64 // circle centre μ in the mapping plane
	TEAngleDeg       float64 // trailing-edge angle τ, degrees
}

// Validate checks the parameters: finite, the circle enclosing ζ = −1
// (which holds exactly when CenterX < 0, since the circle passes through
// ζ = 1), |centre| components at most MaxKTCenter and MinKTTEAngleDeg ≤ τ ≤
// MaxKTTEAngleDeg. It returns a *FieldError naming "kt.cx", "kt.cy" or
// "kt.tau"; an angle below the minimum wraps ErrKTThinEdge.
func (k KarmanTrefftz) Validate() error {
	if err := k.validateMap(); err != nil {
		return err
	}
	if k.TEAngleDeg < MinKTTEAngleDeg {
		return &FieldError{Field: "kt.tau", Err: fmt.Errorf("%g° is below %g°: %w", k.TEAngleDeg, MinKTTEAngleDeg, ErrKTThinEdge)}
	}
	return nil
}

// validateMap checks what the map and its exact solution need: Validate's
// conditions with τ down to 0 (the Joukowski cusp).
func (k KarmanTrefftz) validateMap() error {
	for _, f := range []struct {
		name string
		v    float64
	}{{"kt.cx", k.CenterX}, {"kt.cy", k.CenterY}, {"kt.tau", k.TEAngleDeg}} {
		if !finite(f.v) {
			return &FieldError{Field: f.name, Err: errNotFinite}
		}
	}
	if k.CenterX >= 0 {
		return &FieldError{Field: "kt.cx", Err: fmt.Errorf("%g: %w", k.CenterX, ErrKTCircle)}
	}
	if k.CenterX < -MaxKTCenter {
		return &FieldError{Field: "kt.cx", Err: fmt.Errorf("%g is below −%g", k.CenterX, MaxKTCenter)}
	}
	if math.Abs(k.CenterY) > MaxKTCenter {
		return &FieldError{Field: "kt.cy", Err: fmt.Errorf("%g is outside ±%g", k.CenterY, MaxKTCenter)}
	}
	if k.TEAngleDeg < 0 || k.TEAngleDeg > MaxKTTEAngleDeg {
		return &FieldError{Field: "kt.tau", Err: fmt.Errorf("%g° is outside 0..%g°", k.TEAngleDeg, MaxKTTEAngleDeg)}
	}
	return nil
}

// ParseKT parses the text after "kt:" in a section spec: "cx,cy,tau", the
// circle centre and the trailing-edge angle in degrees, e.g.
// "-0.1,0.1,10". Errors are *FieldError naming the field; the result is
// validated.
func ParseKT(spec string) (KarmanTrefftz, error) {
	parts := strings.Split(spec, ",")
	if len(parts) != 3 {
		return KarmanTrefftz{}, &FieldError{Field: "kt", Err: fmt.Errorf("%q has %d fields, want cx,cy,tau (e.g. -0.1,0.1,10)", spec, len(parts))}
	}
	names := [3]string{"kt.cx", "kt.cy", "kt.tau"}
	var v [3]float64
	for i, p := range parts {
		f, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil {
			return KarmanTrefftz{}, &FieldError{Field: names[i], Err: fmt.Errorf("%q is not a number", strings.TrimSpace(p))}
		}
		v[i] = f
	}
	k := KarmanTrefftz{CenterX: v[0], CenterY: v[1], TEAngleDeg: v[2]}
	if err := k.Validate(); err != nil {
		return KarmanTrefftz{}, err
	}
	return k, nil
}

// String returns the spec form "cx,cy,tau" that ParseKT reads.
func (k KarmanTrefftz) String() string {
	return fmt.Sprintf("%g,%g,%g", k.CenterX, k.CenterY, k.TEAngleDeg)
}

// Name returns the section name, e.g. "KT c=(-0.1,0.1) τ=10°".
func (k KarmanTrefftz) Name() string {
	return fmt.Sprintf("KT c=(%g,%g) τ=%g°", k.CenterX, k.CenterY, k.TEAngleDeg)
}

// ktMap holds the derived geometry of a valid KarmanTrefftz.
type ktMap struct {
	n, b  float64
	mu    complex128
	a     float64 // circle radius
	beta  float64 // b − μ = a e^(−iβ)
	phiTE float64 // circle angle of ζ = b: −β
	phiLE float64 // circle angle of the leading edge, in (phiTE, phiTE + 2π)
	zTE   complex128
	zLE   complex128
	chord float64
	gamma float64 // chord angle: arg(zTE − zLE)
}

// ktDense is the number of circle angles sampled to locate the leading
// edge and the nearest surface point before local refinement.
const ktDense = 2048

func (k KarmanTrefftz) geometry() *ktMap {
	if err := k.validateMap(); err != nil {
		panic("model: invalid Kármán–Trefftz section: " + err.Error())
	}
	m := &ktMap{n: 2 - k.TEAngleDeg/180, b: 1, mu: complex(k.CenterX, k.CenterY)}
	d := complex(m.b, 0) - m.mu
	m.a = cmplx.Abs(d)
	m.beta = -cmplx.Phase(d)
	m.phiTE = -m.beta
	m.zTE = complex(m.n*m.b, 0)
	dist := func(phi float64) float64 { return cmplx.Abs(m.z(m.zeta(phi)) - m.zTE) }
	best, bestD := 0, -1.0
	for i := 1; i < ktDense; i++ {
		if d := dist(m.phiTE + 2*math.Pi*float64(i)/ktDense); d > bestD {
			best, bestD = i, d
		}
	}
	h := 2 * math.Pi / ktDense
	// Refine by bisection on the stationarity of |z − z_TE|²,
	// g(φ) = Re[conj(z − z_TE) · dz/dζ · dζ/dφ], positive before the
	// maximum and negative after it; this finds φ_LE to rounding where a
	// search on the flat distance itself would stop at √ε.
	g := func(phi float64) float64 {
		zeta := m.zeta(phi)
		dzeta := complex(0, m.a) * cmplx.Exp(complex(0, phi))
		return real(cmplx.Conj(m.z(zeta)-m.zTE) * m.dz(zeta) * dzeta)
	}
	lo, hi := m.phiTE+h*float64(best-1), m.phiTE+h*float64(best+1)
	for range 200 {
		mid := 0.5 * (lo + hi)
		if mid <= lo || mid >= hi {
			break
		}
		if g(mid) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	m.phiLE = 0.5 * (lo + hi)
	m.zLE = m.z(m.zeta(m.phiLE))
	m.chord = cmplx.Abs(m.zTE - m.zLE)
	m.gamma = cmplx.Phase(m.zTE - m.zLE)
	return m
}

// zeta returns the circle point of angle phi.
func (m *ktMap) zeta(phi float64) complex128 {
	return m.mu + complex(m.a, 0)*cmplx.Exp(complex(0, phi))
}

// w returns ((ζ − b)/(ζ + b))ⁿ on the principal branch.
func (m *ktMap) w(zeta complex128) complex128 {
	b := complex(m.b, 0)
	r := (zeta - b) / (zeta + b)
	if r == 0 {
		return 0
	}
	return cmplx.Exp(complex(m.n, 0) * cmplx.Log(r))
}

// z maps ζ to the section plane: z = nb (1 + w)/(1 − w).
func (m *ktMap) z(zeta complex128) complex128 {
	w := m.w(zeta)
	return complex(m.n*m.b, 0) * (1 + w) / (1 - w)
}

// dz returns dz/dζ = 4n²b² w / ((1 − w)² (ζ² − b²)).
func (m *ktMap) dz(zeta complex128) complex128 {
	w := m.w(zeta)
	nb := complex(m.n*m.b, 0)
	return 4 * nb * nb * w / ((1 - w) * (1 - w) * (zeta*zeta - complex(m.b*m.b, 0)))
}

// normal returns the normalised-frame position of the section point z:
// Z = (z − z_LE) e^(−iγ)/c.
func (m *ktMap) normal(z complex128) Point {
	p := (z - m.zLE) * cmplx.Exp(complex(0, -m.gamma)) / complex(m.chord, 0)
	return Point{real(p), imag(p)}
}

// Section returns n points (n ≥ MinSectionPoints) of the section in the
// normalised frame: trailing edge (1, 0), leading edge (0, 0) — the point
// farthest from the trailing edge — chord along +x, running from the
// trailing edge over the upper surface to the leading edge and back. The
// trailing edge is closed: the first and last points are both (1, 0). The
// points are equally spaced in circle angle on each surface, the upper
// surface taking its share of the n − 1 intervals in proportion to its
// circle arc; the leading edge is a point.
func (k KarmanTrefftz) Section(n int) (*Section, error) {
	if err := k.Validate(); err != nil {
		return nil, err
	}
	if n < MinSectionPoints {
		return nil, fmt.Errorf("Kármán–Trefftz section of %d points, needs at least %d: %w", n, MinSectionPoints, ErrTooFewPoints)
	}
	m := k.geometry()
	pts := make([]Point, n)
	for i, phi := range m.angles(n) {
		pts[i] = m.normal(m.z(m.zeta(phi)))
	}
	pts[0], pts[n-1] = Point{1, 0}, Point{1, 0}
	return NewSection(k.Name(), pts)
}

// angles returns n circle angles from φ_TE to φ_TE + 2π with one at φ_LE.
func (m *ktMap) angles(n int) []float64 {
	intervals := n - 1
	up := int(math.Round(float64(intervals) * (m.phiLE - m.phiTE) / (2 * math.Pi)))
	up = min(max(up, 1), intervals-1)
	phis := make([]float64, n)
	for i := range n {
		if i <= up {
			phis[i] = m.phiTE + (m.phiLE-m.phiTE)*float64(i)/float64(up)
		} else {
			phis[i] = m.phiLE + (m.phiTE+2*math.Pi-m.phiLE)*float64(i-up)/float64(intervals-up)
		}
	}
	phis[up] = m.phiLE
	return phis
}

// ChordAngleDeg returns γ, the angle in degrees of the chord line, from the
// leading edge (the point farthest from the trailing edge) to the trailing
// edge, measured counter-clockwise from +x in the mapping plane. The
// normalised section is the mapped one rotated by −γ, so an angle of attack
// in the mapping plane α_map corresponds to α_section = α_map − γ.
func (k KarmanTrefftz) ChordAngleDeg() float64 {
	return k.geometry().gamma * 180 / math.Pi
}

// KTExact is the exact potential-flow solution about a Kármán–Trefftz
// section at an angle of attack, with the Kutta condition at its trailing
// edge. Lengths are in the normalised frame (unit chord), speeds in units
// of U∞.
//
// In the mapping plane, with α the freestream angle there, the complex
// velocity about the circle is (Milne-Thomson, Theoretical Hydrodynamics;
// Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., ch. 6)
//
//	W(ζ) = U[e^(−iα) − a² e^(iα)/(ζ − μ)²] + iΓ/(2π(ζ − μ)),
//	Γ = 4πUa sin(α + β)   (Kutta condition: W(b) = 0),
//
// and on the section the speed is q = |W/(dz/dζ)|, Cp = 1 − q²/U²,
// c_l = 2Γ/(U c) (Kutta–Joukowski). Cm comes from Blasius' theorem.
type KTExact struct {
	Cl       float64 // lift coefficient on the unit chord
	Cm       float64 // quarter-chord moment coefficient, nose-up positive
	Gamma    float64 // circulation on the unit chord (U = 1), clockwise positive: Cl = 2·Gamma
	AlphaDeg float64 // angle of attack relative to the normalised chord

	// MappingAlphaDeg is the same angle in the mapping plane:
	// AlphaDeg + ChordAngleDeg.
	MappingAlphaDeg float64
	// Stagnation is the forward stagnation point (the rear one is the
	// trailing edge for τ > 0), circle angle φ = π + 2α + β.
	Stagnation Point

	m     *ktMap
	alpha float64 // mapping-plane angle, radians
	gam   float64 // mapping-plane circulation, U = 1
	dense []ktSample
}

// KTPoint is a point of the exact solution's surface.
type KTPoint struct {
	P     Point   // position, normalised frame
	Q     float64 // surface speed q/U∞
	Cp    float64 // 1 − q²
	Upper bool    // on the upper surface (trailing edge to leading edge)
}

type ktSample struct {
	phi float64
	p   Point
}

// Exact returns the exact solution at alphaDeg relative to the normalised
// section's chord line. It accepts trailing-edge angles down to 0 (the
// Joukowski cusp, for checks), below MinKTTEAngleDeg; it panics if k is
// otherwise invalid.
func (k KarmanTrefftz) Exact(alphaDeg float64) *KTExact {
	m := k.geometry()
	e := &KTExact{m: m, AlphaDeg: alphaDeg}
	e.alpha = alphaDeg*math.Pi/180 + m.gamma
	e.MappingAlphaDeg = e.alpha * 180 / math.Pi
	e.gam = 4 * math.Pi * m.a * math.Sin(e.alpha+m.beta)
	e.Gamma = e.gam / m.chord
	e.Cl = 2 * e.Gamma
	e.Stagnation = m.normal(m.z(m.zeta(math.Pi + 2*e.alpha + m.beta)))
	e.Cm = e.blasiusCm()
	e.dense = make([]ktSample, ktDense+1)
	for i := range e.dense {
		phi := m.phiTE + 2*math.Pi*float64(i)/ktDense
		e.dense[i] = ktSample{phi, m.normal(m.z(m.zeta(phi)))}
	}
	return e
}

// complexW returns W(ζ) in the mapping plane, U = 1.
func (e *KTExact) complexW(zeta complex128) complex128 {
	d := zeta - e.m.mu
	a2 := complex(e.m.a*e.m.a, 0)
	return cmplx.Exp(complex(0, -e.alpha)) - a2*cmplx.Exp(complex(0, e.alpha))/(d*d) + complex(0, e.gam/(2*math.Pi))/d
}

// speed returns q at circle angle phi. At the trailing edge itself, where
// W and dz/dζ both vanish, it returns the limit: 0 for τ > 0, and for the
// cusped Joukowski case (n = 2) the mean of the values just either side.
func (e *KTExact) speed(phi float64) float64 {
	const teGuard = 1e-9 // radians of circle angle treated as the trailing edge
	dphi := math.Remainder(phi-e.m.phiTE, 2*math.Pi)
	if math.Abs(dphi) < teGuard {
		if e.m.n < 2 {
			return 0
		}
		const off = 1e-6
		return 0.5 * (e.speed(e.m.phiTE+off) + e.speed(e.m.phiTE-off))
	}
	zeta := e.m.zeta(phi)
	return cmplx.Abs(e.complexW(zeta) / e.m.dz(zeta))
}

// blasiusCm returns the quarter-chord moment, nose-up positive, from
// Blasius' theorem (Milne-Thomson, Theoretical Hydrodynamics; Katz &
// Plotkin 2nd ed. sec. 6.4): with the complex velocity w = dF/dz and
// ρ = U = 1, the force and the counter-clockwise moment about z = 0 are
//
//	X − iY = (i/2) ∮ w² dz,   M₀ = −½ Re ∮ z w² dz.
//
// Both integrals are taken in the mapping plane, ∮ W²/z′ dζ and
// ∮ z W²/z′ dζ, on the circle |ζ − μ| = 2a: the integrands are analytic
// between it and the body circle, so the value is the same, and on the
// larger circle the periodic trapezoid rule converges geometrically.
func (e *KTExact) blasiusCm() float64 {
	const (
		nodes  = 256 // trapezoid nodes; error ~ 2^−256 relative
		radius = 2.0 // in units of a
	)
	m := e.m
	var fInt, mInt complex128
	for i := range nodes {
		th := 2 * math.Pi * float64(i) / nodes
		u := cmplx.Exp(complex(0, th))
		zeta := m.mu + complex(radius*m.a, 0)*u
		dzeta := complex(0, radius*m.a) * u * complex(2*math.Pi/nodes, 0)
		W := e.complexW(zeta)
		g := W * W / m.dz(zeta) * dzeta
		fInt += g
		mInt += m.z(zeta) * g
	}
	xy := complex(0, 0.5) * fInt // X − iY
	fx, fy := real(xy), -imag(xy)
	m0 := -0.5 * real(mInt)
	// Moment about the quarter-chord point in the mapping plane.
	zq := m.zLE + complex(0.25*m.chord, 0)*cmplx.Exp(complex(0, m.gamma))
	mq := m0 - (real(zq)*fy - imag(zq)*fx)
	// Nose-up is clockwise; q∞ = ½.
	return -mq / (0.5 * m.chord * m.chord)
}

// Sample returns n ≥ 2 surface points from the trailing edge over the upper
// surface to the leading edge and back, equally spaced in circle angle on
// each surface with the leading edge as a point (as Section).
func (e *KTExact) Sample(n int) []KTPoint {
	if n < 2 {
		panic(fmt.Sprintf("model: KTExact.Sample(%d): need at least 2 points", n))
	}
	var phis []float64
	if n >= 3 {
		phis = e.m.angles(n)
	} else {
		phis = []float64{e.m.phiTE, e.m.phiTE + 2*math.Pi}
	}
	out := make([]KTPoint, n)
	for i, phi := range phis {
		q := e.speed(phi)
		p := e.m.normal(e.m.z(e.m.zeta(phi)))
		if i == 0 || i == n-1 {
			p = Point{1, 0}
		}
		out[i] = KTPoint{P: p, Q: q, Cp: 1 - q*q, Upper: phi <= e.m.phiLE}
	}
	return out
}

// CpNear returns Cp at the exact surface point nearest p (normalised
// frame): for comparing panel midpoints, which lie just inside the
// surface, with the exact solution.
func (e *KTExact) CpNear(p Point) float64 {
	q := e.speed(e.nearest(p))
	return 1 - q*q
}

// SpeedNear returns q/U∞ at the exact surface point nearest p.
func (e *KTExact) SpeedNear(p Point) float64 { return e.speed(e.nearest(p)) }

// PointNear returns the exact surface point nearest p and whether it is on
// the upper surface.
func (e *KTExact) PointNear(p Point) (Point, bool) {
	phi := e.nearest(p)
	return e.m.normal(e.m.z(e.m.zeta(phi))), phi <= e.m.phiLE
}

// nearest returns the circle angle of the surface point nearest p: the
// nearest of a dense sample, refined by golden-section search on the
// neighbouring intervals.
func (e *KTExact) nearest(p Point) float64 {
	best, bestD := 0, math.Inf(1)
	for i, s := range e.dense {
		if d := s.p.Dist(p); d < bestD {
			best, bestD = i, d
		}
	}
	lo := e.dense[max(best-1, 0)].phi
	hi := e.dense[min(best+1, len(e.dense)-1)].phi
	return goldenSection(func(phi float64) float64 {
		return e.m.normal(e.m.z(e.m.zeta(phi))).Dist(p)
	}, lo, hi)
}

// goldenSection returns a minimiser of f on [a, b], assumed unimodal there,
// to within about 1e-12 of the interval (Kiefer's golden-section search).
func goldenSection(f func(float64) float64, a, b float64) float64 {
	g := (math.Sqrt(5) - 1) / 2
	tol := 1e-12 * math.Max(1, math.Abs(b-a))
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := f(c), f(d)
	for b-a > tol {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = f(d)
		}
	}
	return 0.5 * (a + b)
}
