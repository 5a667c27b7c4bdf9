package model

import (
	"math"
	"testing"
)

func TestPolygonArea(t *testing.T) {
	// Regular n-gon of circumradius 1: A = (n/2) sin(2π/n) (closed form).
	ngon := func(n int) []Point {
		pts := make([]Point, n)
		for i := range pts {
			s, c := math.Sincos(2 * math.Pi * float64(i) / float64(n))
			pts[i] = Point{c, s}
		}
		return pts
	}
	for _, tc := range []struct {
		name string
		pts  []Point
		want float64
		tol  float64
	}{
		{"unit square, counter-clockwise", []Point{{0, 0}, {1, 0}, {1, 1}, {0, 1}}, 1, 0},
		{"unit square, clockwise", []Point{{0, 0}, {0, 1}, {1, 1}, {1, 0}}, -1, 0},
		{"right triangle legs 3 and 4", []Point{{0, 0}, {3, 0}, {0, 4}}, 6, 0},
		{"square moved far from the origin", []Point{{1e6, 1e6}, {1e6 + 2, 1e6}, {1e6 + 2, 1e6 + 2}, {1e6, 1e6 + 2}}, 4, 1e-9},
		{"hexagon", ngon(6), 3 * math.Sqrt(3) / 2, 1e-14},
		{"1000-gon, nearly π", ngon(1000), 500 * math.Sin(2*math.Pi/1000), 1e-12},
		{"hexagon clockwise", reversed(ngon(6)), -3 * math.Sqrt(3) / 2, 1e-14},
		{"figure of eight: loops cancel", []Point{{0, 0}, {1, 1}, {1, 0}, {0, 1}}, 0, 0},
		{"two points", []Point{{0, 0}, {1, 1}}, 0, 0},
		{"none", nil, 0, 0},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := PolygonArea(tc.pts); math.Abs(got-tc.want) > tc.tol {
				t.Errorf("PolygonArea = %.17g, want %.17g ± %g", got, tc.want, tc.tol)
			}
		})
	}
}

func TestInPolygon(t *testing.T) {
	// An L shape (concave): the unit square [0,2]² without [1,2]×[1,2].
	ell := []Point{{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}}
	for _, tc := range []struct {
		name string
		p    Point
		want bool
	}{
		{"inside the foot", Point{1.5, 0.5}, true},
		{"inside the stem", Point{0.5, 1.5}, true},
		{"in the notch", Point{1.5, 1.5}, false},
		{"left of it", Point{-1, 0.5}, false},
		{"above it", Point{0.5, 3}, false},
		{"ray through the vertex (1, 1)", Point{0.5, 1}, true},
		{"ray through the vertex (2, 1)", Point{-0.5, 1}, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := InPolygon(tc.p, ell); got != tc.want {
				t.Errorf("InPolygon(%v) = %v, want %v", tc.p, got, tc.want)
			}
			if got := InPolygon(tc.p, reversed(ell)); got != tc.want {
				t.Errorf("InPolygon(%v) on the clockwise polygon = %v, want %v", tc.p, got, tc.want)
			}
		})
	}
}

func TestBox(t *testing.T) {
	b := BoxOf(Point{1, 2}, Point{-1, 5}, Point{0, 3})
	if want := (Box{Point{-1, 2}, Point{1, 5}}); b != want {
		t.Fatalf("BoxOf = %v, want %v", b, want)
	}
	if w, h := b.Size(); w != 2 || h != 3 {
		t.Errorf("Size = %g × %g, want 2 × 3", w, h)
	}
	for _, tc := range []struct {
		name string
		c    Box
		want bool
	}{
		{"same", b, true},
		{"touching the right edge", Box{Point{1, 0}, Point{2, 2}}, true},
		{"apart on x", Box{Point{1.5, 2}, Point{2, 5}}, false},
		{"apart on y", Box{Point{-1, 5.1}, Point{1, 6}}, false},
		{"inside", Box{Point{0, 3}, Point{0.5, 4}}, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := b.Overlaps(tc.c); got != tc.want {
				t.Errorf("Overlaps = %v, want %v", got, tc.want)
			}
			if got := tc.c.Overlaps(b); got != tc.want {
				t.Errorf("Overlaps reversed = %v, want %v", got, tc.want)
			}
		})
	}
	if g := b.Grow(0.5); !g.Contains(Point{1.5, 5.5}) || g.Contains(Point{1.6, 5}) {
		t.Errorf("Grow(0.5) = %v: corner (1.5, 5.5) should be in, (1.6, 5) out", g)
	}
	defer func() {
		if recover() == nil {
			t.Error("BoxOf() did not panic")
		}
	}()
	BoxOf()
}
