package model

import (
	"errors"
	"math"
	"math/cmplx"
	"testing"
)

// referenceKT is the sample of docs/validation.md §2: μ = (−0.1, 0.1), b = 1,
// τ = 10°.
var referenceKT = KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 10}

func TestKarmanTrefftzReferenceCl(t *testing.T) {
	// μ = (−0.1, 0.1), b = 1, τ = 10°, α = 5° in the mapping plane, chord =
	// the largest distance from the trailing edge: c_l = 1.2514 [derived
	// from the exact solution, docs/validation.md §2; Milne-Thomson, Theoretical
	// Hydrodynamics; Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., ch. 6].
	e := referenceKT.Exact(5 - referenceKT.ChordAngleDeg())
	if math.Abs(e.MappingAlphaDeg-5) > 1e-12 {
		t.Errorf("mapping-plane α = %g°, want 5°", e.MappingAlphaDeg)
	}
	if math.Abs(e.Cl-1.2514) > 1e-4 {
		t.Errorf("Cl = %.5f, want 1.2514", e.Cl)
	}
	if math.Abs(e.Cl-2*e.Gamma) > 1e-15 {
		t.Errorf("Cl = %g, 2Γ = %g", e.Cl, 2*e.Gamma)
	}
	// Closed form, Kutta–Joukowski: Γ = 4πUa sin(α + β), a = |b − μ|,
	// β = atan(0.1/1.1) here, so c = 2Γ/Cl recovers the chord.
	a := math.Hypot(1.1, 0.1)
	beta := math.Atan2(0.1, 1.1)
	gamma := 4 * math.Pi * a * math.Sin(5*math.Pi/180+beta)
	if c := referenceKT.geometry().chord; math.Abs(2*gamma/c-e.Cl) > 1e-12 {
		t.Errorf("2Γ/c = %g, Cl = %g", 2*gamma/c, e.Cl)
	}
}

func TestKarmanTrefftzJoukowskiLimit(t *testing.T) {
	// With τ = 0 the map is Joukowski's, z = ζ + b²/ζ (Milne-Thomson,
	// Theoretical Hydrodynamics; Katz & Plotkin 2nd ed. sec. 6.5).
	m := KarmanTrefftz{CenterX: -0.08, CenterY: 0.05}.geometry()
	for _, zeta := range []complex128{2, -1.3 + 0.4i, 0.2 - 1.5i, 1.1 + 0.01i, -1.2 - 0.1i} {
		if d := cmplx.Abs(m.z(zeta) - (zeta + 1/zeta)); d > 1e-13 {
			t.Errorf("z(%v) off the Joukowski map by %g", zeta, d)
		}
		// The derivative formula against the closed form 1 − b²/ζ².
		if d := cmplx.Abs(m.dz(zeta) - (1 - 1/(zeta*zeta))); d > 1e-13 {
			t.Errorf("dz/dζ(%v) off by %g", zeta, d)
		}
	}
	// Far field: z = ζ + b²(n² − 1)/(3ζ) + O(ζ⁻³) for any n (series of
	// the map at infinity).
	mk := referenceKT.geometry()
	zeta := complex(0, 1e3)
	want := zeta + complex((mk.n*mk.n-1)/3, 0)/zeta
	if d := cmplx.Abs(mk.z(zeta) - want); d > 1e-8 {
		t.Errorf("far field off by %g", d)
	}
}

func TestKarmanTrefftzSymmetric(t *testing.T) {
	// A centre on the real axis gives a section symmetric about its chord
	// (the map commutes with complex conjugation): the upper and lower
	// points mirror each other, the chord angle is zero, and at α = 0
	// there is no lift and no moment.
	for _, k := range []KarmanTrefftz{{CenterX: -0.1, TEAngleDeg: MinKTTEAngleDeg}, {CenterX: -0.05, TEAngleDeg: 12}} {
		t.Run(k.Name(), func(t *testing.T) {
			const n = 101
			s, err := k.Section(n)
			if err != nil {
				t.Fatal(err)
			}
			for i := range n / 2 {
				p, q := s.At(i), s.At(n-1-i)
				if math.Abs(p.X-q.X) > 1e-9 || math.Abs(p.Y+q.Y) > 1e-9 {
					t.Errorf("points %d, %d: %v and %v are not mirror images", i, n-1-i, p, q)
				}
			}
			if g := k.ChordAngleDeg(); math.Abs(g) > 1e-6 {
				t.Errorf("chord angle %g°, want 0", g)
			}
			e := k.Exact(0)
			if math.Abs(e.Cl) > 1e-6 || math.Abs(e.Cm) > 1e-6 {
				t.Errorf("Cl, Cm = %g, %g at α = 0, want 0", e.Cl, e.Cm)
			}
		})
	}
}

func TestKarmanTrefftzSection(t *testing.T) {
	cases := []struct {
		k KarmanTrefftz
		n int
	}{
		{referenceKT, 5},
		{referenceKT, 161},
		{KarmanTrefftz{CenterX: -0.05, CenterY: 0.08, TEAngleDeg: 5}, 200},
		{KarmanTrefftz{CenterX: -0.2, CenterY: -0.1, TEAngleDeg: 30}, 81},
		{KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: MinKTTEAngleDeg}, 64},
	}
	for _, tc := range cases {
		t.Run(tc.k.Name(), func(t *testing.T) {
			s, err := tc.k.Section(tc.n)
			if err != nil {
				t.Fatal(err)
			}
			if s.Len() != tc.n || s.Name() != tc.k.Name() {
				t.Fatalf("%d points named %q", s.Len(), s.Name())
			}
			if s.At(0) != (Point{1, 0}) || s.At(tc.n-1) != (Point{1, 0}) {
				t.Errorf("trailing edge %v, %v, want (1, 0)", s.At(0), s.At(tc.n-1))
			}
			le := s.LeadingEdgeIndex()
			if d := s.At(le).Norm(); d > 1e-12 {
				t.Errorf("leading-edge node %v, want (0, 0)", s.At(le))
			}
			// The leading edge is the point farthest from the trailing
			// edge: no point of a dense sample lies farther than 1.
			for _, p := range tc.k.Exact(0).Sample(2001) {
				if d := p.P.Dist(Point{1, 0}); d > 1+1e-12 {
					t.Fatalf("%v lies %g from the trailing edge, beyond the chord", p.P, d)
				}
			}
			if s.SignedArea() <= 0 {
				t.Errorf("signed area %g, want counter-clockwise", s.SignedArea())
			}
			if s.At(1).Y <= s.At(tc.n-2).Y {
				t.Errorf("second point %v not above the second-to-last %v: want the upper surface first", s.At(1), s.At(tc.n-2))
			}
		})
	}
	if _, err := referenceKT.Section(4); !errors.Is(err, ErrTooFewPoints) {
		t.Errorf("Section(4): error %v, want ErrTooFewPoints", err)
	}
}

func TestKarmanTrefftzStagnation(t *testing.T) {
	// Cp = 1 − q² = 1 exactly where the flow stops: the forward
	// stagnation point φ = π + 2α + β on the circle and, for τ > 0, the
	// trailing edge, where dz/dζ vanishes more slowly than W (Katz &
	// Plotkin 2nd ed. sec. 6.7).
	for _, k := range kTTestCases {
		for _, alpha := range []float64{-4, 0, 3, 8} {
			e := k.Exact(alpha)
			if cp := e.CpNear(e.Stagnation); math.Abs(cp-1) > 1e-6 {
				t.Errorf("%s α=%g: Cp at the forward stagnation point %g, want 1", k.Name(), alpha, cp)
			}
			smp := e.Sample(101)
			if smp[0].Cp != 1 || smp[100].Cp != 1 {
				t.Errorf("%s α=%g: trailing-edge Cp %g, %g, want 1", k.Name(), alpha, smp[0].Cp, smp[100].Cp)
			}
			for _, p := range smp {
				if p.Cp > 1+1e-12 {
					t.Errorf("%s α=%g: Cp %g > 1 at %v", k.Name(), alpha, p.Cp, p.P)
				}
			}
		}
	}
}

// kTTestCases are finite-angle sections for property checks.
var kTTestCases = []KarmanTrefftz{
	referenceKT,
	{CenterX: -0.05, CenterY: 0.08, TEAngleDeg: 5},
	{CenterX: -0.15, CenterY: -0.05, TEAngleDeg: 20},
}

func TestKarmanTrefftzSurfaceIntegral(t *testing.T) {
	// Integrating the exact Cp over the surface, F = −∮ Cp n ds, must give
	// the Kutta–Joukowski lift c_l = 2Γ/(Uc), no drag (d'Alembert), and the
	// Blasius-theorem moment (Milne-Thomson, Theoretical Hydrodynamics;
	// Katz & Plotkin 2nd ed. ch. 3 and 6). Midpoint rule on a dense sample;
	// the tolerance covers its error near the trailing edge.
	const n, tol = 8001, 2e-5
	for _, k := range kTTestCases {
		for _, alpha := range []float64{-3, 2, 6} {
			e := k.Exact(alpha)
			smp := e.Sample(n)
			var cx, cy, cm float64
			for i := 0; i+1 < n; i++ {
				p, q := smp[i].P, smp[i+1].P
				cp := 0.5 * (smp[i].Cp + smp[i+1].Cp)
				d := q.Sub(p)
				// Outward normal of a counter-clockwise contour times ds:
				// (dy, −dx); the force on the body is −Cp n ds.
				fx, fy := -cp*d.Y, cp*d.X
				m := p.Add(q).Scale(0.5)
				cx += fx
				cy += fy
				cm -= (m.X-0.25)*fy - m.Y*fx // nose-up is clockwise
			}
			s, c := math.Sincos(alpha * math.Pi / 180)
			cl := cy*c - cx*s
			cd := cx*c + cy*s
			if math.Abs(cl-e.Cl) > tol || math.Abs(cd) > tol || math.Abs(cm-e.Cm) > tol {
				t.Errorf("%s α=%g: surface integral Cl, Cd, Cm = %.6f, %.6f, %.6f; exact Cl %.6f, Cm %.6f", k.Name(), alpha, cl, cd, cm, e.Cl, e.Cm)
			}
		}
	}
}

func TestKarmanTrefftzCircularArcMoment(t *testing.T) {
	// A nearly thin Joukowski section on a centre (−ε, h), ε ≪ h ≪ 1, is a
	// circular-arc camber line of camber ratio f/c ≈ h/2; thin airfoil
	// theory gives α_L0 = −2f/c and c_m,c/4 = −πf/c for it (Anderson,
	// Fundamentals of Aerodynamics, ch. 4, parabolic camber). The tolerance
	// covers thickness and second-order camber effects.
	k := KarmanTrefftz{CenterX: -0.001, CenterY: 0.04}
	e := k.Exact(0)
	const f = 0.02
	if math.Abs(e.Cm-(-math.Pi*f)) > 0.02*math.Pi*f {
		t.Errorf("Cm = %.5f, want ≈ %.5f", e.Cm, -math.Pi*f)
	}
	// c_l = 2π(α − α_L0) at α = 0.
	if want := 2 * math.Pi * 2 * f; math.Abs(e.Cl-want) > 0.02*want {
		t.Errorf("Cl = %.5f, want ≈ %.5f", e.Cl, want)
	}
}

func TestKTExactNear(t *testing.T) {
	e := referenceKT.Exact(4)
	smp := e.Sample(301)
	for i, p := range smp {
		if p.P.X > 0.98 {
			continue // the finite-angle trailing edge, where q varies fastest
		}
		if d := math.Abs(e.CpNear(p.P) - p.Cp); d > 1e-7 {
			t.Errorf("point %d %v: CpNear %g, sample %g", i, p.P, e.CpNear(p.P), p.Cp)
		}
		if d := math.Abs(e.SpeedNear(p.P) - p.Q); d > 1e-7 {
			t.Errorf("point %d: SpeedNear %g, sample %g", i, e.SpeedNear(p.P), p.Q)
		}
		// A point pushed slightly inside the body finds the same surface
		// point.
		if i > 0 && i < len(smp)-1 {
			tan := smp[i+1].P.Sub(smp[i-1].P)
			in := Point{-tan.Y, tan.X}.Scale(1e-4 / tan.Norm())
			q, up := e.PointNear(p.P.Add(in))
			if q.Dist(p.P) > 1e-6 || up != p.Upper {
				t.Errorf("point %d: nearest to an inside point is %v (upper %v), want %v (upper %v)", i, q, up, p.P, p.Upper)
			}
		}
	}
	upper := 0
	for _, p := range smp {
		if p.Upper {
			upper++
		}
	}
	if upper < 100 || upper > 200 {
		t.Errorf("%d of 301 points on the upper surface", upper)
	}
}

func TestKarmanTrefftzValidate(t *testing.T) {
	cases := []struct {
		name  string
		k     KarmanTrefftz
		field string // "" for valid
		is    error
	}{
		{"reference", referenceKT, "", nil},
		{"thinnest edge", KarmanTrefftz{CenterX: -0.1, TEAngleDeg: MinKTTEAngleDeg}, "", nil},
		{"joukowski cusp", KarmanTrefftz{CenterX: -0.1}, "kt.tau", ErrKTThinEdge},
		{"nearly cusped", KarmanTrefftz{CenterX: -0.1, CenterY: 0.1, TEAngleDeg: 0.5}, "kt.tau", ErrKTThinEdge},
		{"centre on axis", KarmanTrefftz{CenterX: 0, CenterY: 0.1, TEAngleDeg: 10}, "kt.cx", ErrKTCircle},
		{"circle misses -1", KarmanTrefftz{CenterX: 0.1, TEAngleDeg: 10}, "kt.cx", ErrKTCircle},
		{"far left", KarmanTrefftz{CenterX: -1.5, TEAngleDeg: 10}, "kt.cx", nil},
		{"high", KarmanTrefftz{CenterX: -0.1, CenterY: 2, TEAngleDeg: 10}, "kt.cy", nil},
		{"nan", KarmanTrefftz{CenterX: -0.1, CenterY: math.NaN()}, "kt.cy", ErrNonFinite},
		{"negative angle", KarmanTrefftz{CenterX: -0.1, TEAngleDeg: -1}, "kt.tau", nil},
		{"blunt", KarmanTrefftz{CenterX: -0.1, TEAngleDeg: 120}, "kt.tau", nil},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			err := tc.k.Validate()
			if tc.field == "" {
				if err != nil {
					t.Fatal(err)
				}
				return
			}
			var fe *FieldError
			if !errors.As(err, &fe) || fe.Field != tc.field {
				t.Fatalf("error %v, want a FieldError on %s", err, tc.field)
			}
			if tc.is != nil && !errors.Is(err, tc.is) {
				t.Errorf("error %v does not wrap %v", err, tc.is)
			}
			if _, err := tc.k.Section(50); err == nil {
				t.Error("Section accepted an invalid section")
			}
		})
	}
}

func TestParseKT(t *testing.T) {
	cases := []struct {
		in    string
		want  KarmanTrefftz
		field string
	}{
		{"-0.1,0.1,10", referenceKT, ""},
		{" -0.1 , 0.1 , 10 ", referenceKT, ""},
		{"-5e-2,0,1", KarmanTrefftz{CenterX: -0.05, TEAngleDeg: 1}, ""},
		{"-5e-2,0,0", KarmanTrefftz{}, "kt.tau"},
		{"-0.1,0.1", KarmanTrefftz{}, "kt"},
		{"-0.1,0.1,10,3", KarmanTrefftz{}, "kt"},
		{"x,0.1,10", KarmanTrefftz{}, "kt.cx"},
		{"-0.1,,10", KarmanTrefftz{}, "kt.cy"},
		{"-0.1,0.1,ten", KarmanTrefftz{}, "kt.tau"},
		{"0.1,0.1,10", KarmanTrefftz{}, "kt.cx"},
		{"-0.1,0.1,NaN", KarmanTrefftz{}, "kt.tau"},
	}
	for _, tc := range cases {
		t.Run(tc.in, func(t *testing.T) {
			k, err := ParseKT(tc.in)
			if tc.field == "" {
				if err != nil || k != tc.want {
					t.Fatalf("got %+v, %v; want %+v", k, err, tc.want)
				}
				if back, err := ParseKT(k.String()); err != nil || back != k {
					t.Errorf("String round trip: %q → %+v, %v", k.String(), back, err)
				}
				return
			}
			var fe *FieldError
			if !errors.As(err, &fe) || fe.Field != tc.field {
				t.Errorf("error %v, want a FieldError on %s", err, tc.field)
			}
		})
	}
}

func BenchmarkKarmanTrefftzExact(b *testing.B) {
	for b.Loop() {
		e := referenceKT.Exact(5)
		_ = e.CpNear(Point{0.5, 0.1})
	}
}
