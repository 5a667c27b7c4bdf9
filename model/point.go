package model

import "math"

// Point is a position in the plane. Its unit is set by the context: chord
// lengths in a Section, metres in a Layout.
type Point struct {
	X, Y float64
}

// Add returns p + q.
func (p Point) Add(q Point) Point { return Point{p.X + q.X, p.Y + q.Y} }

// Sub returns p − q.
func (p Point) Sub(q Point) Point { return Point{p.X - q.X, p.Y - q.Y} }

// Scale returns f·p.
func (p Point) Scale(f float64) Point { return Point{f * p.X, f * p.Y} }

// Dot returns the scalar product p·q.
func (p Point) Dot(q Point) float64 { return p.X*q.X + p.Y*q.Y }

// Cross returns the z component of p × q.
func (p Point) Cross(q Point) float64 { return p.X*q.Y - p.Y*q.X }

// Norm returns the Euclidean length |p|.
func (p Point) Norm() float64 { return math.Hypot(p.X, p.Y) }

// Dist returns |p − q|.
func (p Point) Dist(q Point) float64 { return math.Hypot(p.X-q.X, p.Y-q.Y) }

// Rotate returns p rotated by angle rad (counter-clockwise positive) about c.
func (p Point) Rotate(c Point, rad float64) Point {
	s, co := math.Sincos(rad)
	d := p.Sub(c)
	return Point{c.X + co*d.X - s*d.Y, c.Y + s*d.X + co*d.Y}
}

// IsFinite reports whether both coordinates are finite numbers.
func (p Point) IsFinite() bool {
	return !math.IsNaN(p.X) && !math.IsNaN(p.Y) && !math.IsInf(p.X, 0) && !math.IsInf(p.Y, 0)
}
