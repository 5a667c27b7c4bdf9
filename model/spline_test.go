package model

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

// arcPoints returns n points on the circle of centre c and radius r, at
// angles from a0 to a1 inclusive, equally spaced.
func arcPoints(c Point, r, a0, a1 float64, n int) []Point {
	pts := make([]Point, n)
	for i := range pts {
		a := a0 + (a1-a0)*float64(i)/float64(n-1)
		pts[i] = Point{c.X + r*math.Cos(a), c.Y + r*math.Sin(a)}
	}
	return pts
}

func TestNotAKnotExactOnCubics(t *testing.T) {
	// A not-a-knot cubic spline reproduces any cubic polynomial exactly
	// (de Boor, A Practical Guide to Splines, 1978, ch. IV): the cubic
	// itself satisfies every interpolation, continuity and end condition.
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{4, 5, 9, 40} {
		knots := make([]float64, n)
		for i := 1; i < n; i++ {
			knots[i] = knots[i-1] + 0.05 + rng.Float64()
		}
		p := func(x float64) float64 { return 0.3 - 1.2*x + 0.7*x*x - 0.25*x*x*x }
		dp := func(x float64) float64 { return -1.2 + 1.4*x - 0.75*x*x }
		d2p := func(x float64) float64 { return 1.4 - 1.5*x }
		ys := make([]float64, n)
		for i, x := range knots {
			ys[i] = p(x)
		}
		s := fitNotAKnot(knots, ys)
		const tol = 1e-9
		for i := 0; i+1 < n; i++ {
			for _, f := range []float64{0, 0.21, 0.5, 0.93} {
				x := knots[i] + f*(knots[i+1]-knots[i])
				scale := 1 + math.Abs(x*x*x)
				if d := math.Abs(s.eval(i, x) - p(x)); d > tol*scale {
					t.Errorf("n=%d: S(%g) off by %g", n, x, d)
				}
				if d := math.Abs(s.deriv(i, x) - dp(x)); d > tol*scale {
					t.Errorf("n=%d: S'(%g) off by %g", n, x, d)
				}
				if d := math.Abs(s.deriv2(i, x) - d2p(x)); d > tol*scale {
					t.Errorf("n=%d: S''(%g) off by %g", n, x, d)
				}
			}
		}
	}
}

func TestContourSplineCircle(t *testing.T) {
	// A circle of radius r has curvature 1/r everywhere, positive for a
	// counter-clockwise traversal (a geometric identity).
	const r = 0.5
	c := Point{0.5, 0}
	cases := []struct {
		name           string
		n              int
		tolR, tolK     float64
		tolLE, tolArcL float64
	}{
		{"coarse", 41, 2e-5, 2e-2, 1e-4, 1e-5},
		{"fine", 201, 2e-8, 5e-4, 1e-7, 1e-8},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			// From just above the TE round to just below it, so that the
			// contour is open and the point opposite the TE midpoint is
			// the leading edge (0, 0).
			a0, a1 := 0.1, 2*math.Pi-0.1
			pts := arcPoints(c, r, a0, a1, tc.n)
			s, err := NewContourSpline(pts)
			if err != nil {
				t.Fatal(err)
			}
			for i, k := range s.Knots() {
				if d := s.At(k).Dist(pts[i]); d > 1e-12 {
					t.Fatalf("At(knot %d) misses the point by %g", i, d)
				}
			}
			// Stay away from the ends where the not-a-knot condition is
			// least accurate for a curve that is not a cubic.
			for j := 1; j < 400; j++ {
				tt := s.Length() * float64(j) / 400
				if d := math.Abs(s.At(tt).Dist(c) - r); d > tc.tolR {
					t.Errorf("t=%g: radius off by %g", tt, d)
				}
				if j > 20 && j < 380 {
					if d := math.Abs(s.Curvature(tt) - 1/r); d > tc.tolK/r {
						t.Errorf("t=%g: curvature %g, want %g", tt, s.Curvature(tt), 1/r)
					}
				}
				if v := s.Deriv(tt).Norm(); math.Abs(v-1) > 0.01 {
					t.Errorf("t=%g: |P'| = %g, want ≈ 1 for a chord-length parameter", tt, v)
				}
			}
			_, le := s.LeadingEdge()
			if d := le.Dist(Point{0, 0}); d > tc.tolLE {
				t.Errorf("leading edge %v, want (0, 0) within %g", le, tc.tolLE)
			}
			wantL := r * (a1 - a0)
			if d := math.Abs(s.TotalArcLength() - wantL); d > tc.tolArcL {
				t.Errorf("arc length %g, want %g", s.TotalArcLength(), wantL)
			}
			for _, f := range []float64{0, 0.013, 0.37, 0.5, 0.999, 1} {
				sl := f * s.TotalArcLength()
				tt := s.ParamAtArcLength(sl)
				if d := math.Abs(s.ArcLength(tt) - sl); d > 1e-12 {
					t.Errorf("ArcLength(ParamAtArcLength(%g)) off by %g", sl, d)
				}
			}
		})
	}
}

func TestContourSplineStraightLine(t *testing.T) {
	// Points on a line with uneven spacing: the chord-length parameter is
	// exact arc length, x(t) and y(t) are linear, and the spline is exact
	// with zero curvature.
	dir := Point{0.6, -0.8}
	ts := []float64{0, 0.1, 0.15, 0.6, 0.61, 1.3}
	pts := make([]Point, len(ts))
	for i, v := range ts {
		pts[i] = Point{1, 2}.Add(dir.Scale(v))
	}
	s, err := NewContourSpline(pts)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(s.Length()-1.3) > 1e-14 {
		t.Errorf("Length = %g, want 1.3", s.Length())
	}
	for _, v := range []float64{0.05, 0.33, 0.9, 1.29} {
		if d := s.At(v).Dist(Point{1, 2}.Add(dir.Scale(v))); d > 1e-12 {
			t.Errorf("At(%g) off by %g", v, d)
		}
		if d := s.Deriv(v).Dist(dir); d > 1e-12 {
			t.Errorf("Deriv(%g) off by %g", v, d)
		}
		if k := s.Curvature(v); math.Abs(k) > 1e-9 {
			t.Errorf("Curvature(%g) = %g, want 0", v, k)
		}
	}
}

func TestContourSplineLeadingEdgeBetweenPoints(t *testing.T) {
	// An ellipse x = 0.5 + 0.5 cos θ, y = 0.06 sin θ sampled so that no
	// point falls on θ = π: the farthest point from the TE midpoint (1, 0)
	// is the vertex (0, 0), which the solve must find between knots.
	const n = 200
	pts := make([]Point, n)
	for i := range pts {
		th := 0.05 + (2*math.Pi-0.1)*(float64(i)+0.37*float64(i%2))/float64(n-1)
		if i == n-1 {
			th = 2*math.Pi - 0.05
		}
		pts[i] = Point{0.5 + 0.5*math.Cos(th), 0.06 * math.Sin(th)}
	}
	s, err := NewContourSpline(pts)
	if err != nil {
		t.Fatal(err)
	}
	tle, le := s.LeadingEdge()
	if d := le.Dist(Point{0, 0}); d > 1e-5 {
		t.Errorf("leading edge %v, want (0, 0)", le)
	}
	// Stationarity of the distance at the returned parameter.
	te := pts[0].Add(pts[n-1]).Scale(0.5)
	if g := le.Sub(te).Dot(s.Deriv(tle)); math.Abs(g) > 1e-10 {
		t.Errorf("(P − TE)·P' = %g at the leading edge, want 0", g)
	}
	// The leading edge is farther than every input point.
	for i, p := range pts {
		if p.Dist(te) > le.Dist(te)+1e-15 {
			t.Errorf("point %d is farther from the TE than the leading edge", i)
		}
	}
}

func TestNewContourSplineErrors(t *testing.T) {
	good := arcPoints(Point{}, 1, 0, 3, 6)
	dup := append([]Point(nil), good...)
	dup[3] = dup[2]
	nan := append([]Point(nil), good...)
	nan[4].Y = math.NaN()
	cases := []struct {
		name  string
		pts   []Point
		want  error
		index int // -1: no PointError expected
	}{
		{"too few", good[:3], ErrTooFewPoints, -1},
		{"empty", nil, ErrTooFewPoints, -1},
		{"duplicate", dup, ErrDuplicatePoint, 3},
		{"nan", nan, ErrNonFinite, 4},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := NewContourSpline(tc.pts)
			if !errors.Is(err, tc.want) {
				t.Fatalf("error %v, want %v", err, tc.want)
			}
			var pe *PointError
			if tc.index >= 0 {
				if !errors.As(err, &pe) || pe.Index != tc.index {
					t.Errorf("error %v, want a PointError at index %d", err, tc.index)
				}
			}
		})
	}
}

func BenchmarkNewContourSpline(b *testing.B) {
	pts := arcPoints(Point{0.5, 0}, 0.5, 0.01, 2*math.Pi-0.01, 400)
	for b.Loop() {
		if _, err := NewContourSpline(pts); err != nil {
			b.Fatal(err)
		}
	}
}
