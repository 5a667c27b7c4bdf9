package modeltest

import (
	"math"
	"testing"

	"sectionbench/model"
)

func TestEllipseGeometry(t *testing.T) {
	for _, tc := range []float64{0.06, 0.12, 0.5, 1} {
		s := Ellipse(tc, 201)
		if s.At(0) != (model.Point{X: 1}) || s.At(200) != (model.Point{X: 1}) || s.At(100) != (model.Point{}) {
			t.Errorf("t/c=%g: trailing edge %v, %v, leading edge %v", tc, s.At(0), s.At(200), s.At(100))
		}
		for i := range s.Len() {
			p := s.At(i)
			if d := math.Hypot(2*p.X-1, 2*p.Y/tc) - 1; math.Abs(d) > 1e-14 {
				t.Errorf("t/c=%g: point %d off the ellipse by %g", tc, i, d)
			}
			if i > 0 && i < s.Len()-1 {
				if eta := EllipseEta(tc, p); math.Abs(eta-2*math.Pi*float64(i)/200) > 1e-12 {
					t.Errorf("t/c=%g: point %d has η = %g", tc, i, eta)
				}
			}
		}
		// The polygon's area approaches πAB = π tc/4 from below.
		if a, want := s.SignedArea(), math.Pi*tc/4; a > want || a < want*(1-1e-3) {
			t.Errorf("t/c=%g: area %g, want just below %g", tc, a, want)
		}
		if s.LeadingEdgeIndex() != 100 {
			t.Errorf("t/c=%g: leading edge at point %d", tc, s.LeadingEdgeIndex())
		}
	}
	if Circle(11).Name() != "circle" {
		t.Errorf("circle named %q", Circle(11).Name())
	}
}

func TestEllipseSpeedClosedForms(t *testing.T) {
	for th := 0.0; th < 2*math.Pi; th += 0.1 {
		// Circular cylinder without lift: Cp = 1 − 4 sin²θ (Milne-Thomson,
		// Theoretical Hydrodynamics; Anderson, Fundamentals of
		// Aerodynamics, ch. 3).
		if d := CircleCp(th, 0) - (1 - 4*math.Sin(th)*math.Sin(th)); math.Abs(d) > 1e-14 {
			t.Errorf("θ=%g: circle Cp off by %g", th, d)
		}
		// With circulation Γ = 4πUa sin α: q = 2U|sin(θ − α) + sin α|
		// (ibid.).
		al := 7 * math.Pi / 180
		if d := EllipseSpeed(1, th, 7, true) - 2*math.Abs(math.Sin(th-al)+math.Sin(al)); math.Abs(d) > 1e-14 {
			t.Errorf("θ=%g: lifting circle speed off by %g", th, d)
		}
	}
	// Ellipse at zero incidence: the speed peaks at 1 + b/a on the minor
	// axis (Milne-Thomson, the elliptic cylinder).
	for _, tc := range []float64{0.1, 0.3} {
		if q := EllipseSpeed(tc, math.Pi/2, 0, false); math.Abs(q-(1+tc)) > 1e-14 {
			t.Errorf("t/c=%g: peak speed %g, want %g", tc, q, 1+tc)
		}
	}
	// Stagnation points: the trailing edge with the Kutta circulation and
	// η = π + 2α in front.
	for _, alpha := range []float64{-5, 3, 10} {
		al := alpha * math.Pi / 180
		for _, eta := range []float64{0, math.Pi + 2*al} {
			if q := EllipseSpeed(0.12, eta, alpha, true); q > 1e-14 {
				t.Errorf("α=%g: speed %g at η = %g, want 0", alpha, q, eta)
			}
		}
	}
}

func TestEllipsePressureIntegral(t *testing.T) {
	// −∮ Cp n ds on a dense ellipse gives the Kutta–Joukowski lift
	// EllipseCl with the Kutta circulation, zero lift without it, and no
	// drag in either case (d'Alembert).
	const n = 20001
	for _, tc := range []float64{0.12, 0.4, 1} {
		s := Ellipse(tc, n)
		for _, alpha := range []float64{-4, 6} {
			for _, kutta := range []bool{false, true} {
				var cx, cy float64
				for i := 0; i+1 < n; i++ {
					p, q := s.At(i), s.At(i+1)
					eta := 2 * math.Pi * (float64(i) + 0.5) / float64(n-1)
					cp := EllipseCp(tc, eta, alpha, kutta)
					cx -= cp * (q.Y - p.Y)
					cy += cp * (q.X - p.X)
				}
				sn, c := math.Sincos(alpha * math.Pi / 180)
				cl, cd := cy*c-cx*sn, cx*c+cy*sn
				want := 0.0
				if kutta {
					want = EllipseCl(tc, alpha)
				}
				if math.Abs(cl-want) > 1e-5 || math.Abs(cd) > 1e-5 {
					t.Errorf("t/c=%g α=%g kutta=%v: Cl, Cd = %.7f, %.7f, want %.7f, 0", tc, alpha, kutta, cl, cd, want)
				}
			}
		}
	}
}

func TestKTCases(t *testing.T) {
	if len(KTCases) < 3 {
		t.Fatalf("%d cases", len(KTCases))
	}
	for _, c := range KTCases {
		if err := c.KT.Validate(); err != nil {
			t.Errorf("%s: %v", c.Name, err)
			continue
		}
		if c.KT.TEAngleDeg < 5 {
			t.Errorf("%s: trailing-edge angle %g° below 5°", c.Name, c.KT.TEAngleDeg)
		}
		e := c.Exact()
		if math.Abs(e.MappingAlphaDeg-c.MappingAlphaDeg) > 1e-12 {
			t.Errorf("%s: mapping-plane α %g, want %g", c.Name, e.MappingAlphaDeg, c.MappingAlphaDeg)
		}
		if c.RefCl != 0 && math.Abs(e.Cl-c.RefCl) > 1e-4 {
			t.Errorf("%s: Cl %.5f, reference %g (%s)", c.Name, e.Cl, c.RefCl, c.Source)
		}
		if c.Source == "" {
			t.Errorf("%s: no source", c.Name)
		}
	}
}
