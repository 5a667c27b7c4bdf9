package model

import "math"

// Plane polygons and boxes shared by the model, the solver and the export
// geometry. A polygon is a slice of its vertices, closed from the last back
// to the first (a section's trailing-edge gap becomes an edge).

// PolygonArea returns the signed area enclosed by the closed polygon pts,
// positive when the vertices run counter-clockwise (the body on the left),
// by the shoelace formula
//
//	A = ½ Σᵢ (xᵢ yᵢ₊₁ − xᵢ₊₁ yᵢ),  i + 1 taken modulo n,
//
// (Green's theorem applied to ∮ x dy − y dx; exact for straight edges). A
// self-crossing polygon gives the sum of its loops' areas with their
// orientation's sign. Fewer than three points give 0.
func PolygonArea(pts []Point) float64 {
	a := 0.0
	for i := range pts {
		a += pts[i].Cross(pts[(i+1)%len(pts)])
	}
	return a / 2
}

// InPolygon reports whether p lies inside the closed polygon pts by the
// even–odd rule: a ray from p towards +x crosses the edges an odd number
// of times (the crossing-number test; J. O'Rourke, Computational Geometry
// in C, 2nd ed., 1998, sec. 7.4). Each edge counts over the half-open
// range of y between its ends, so a ray through a vertex counts once.
// Points on an edge may fall either way.
func InPolygon(p Point, pts []Point) bool {
	in := false
	n := len(pts)
	for i, j := 0, n-1; i < n; j, i = i, i+1 {
		a, b := pts[i], pts[j]
		if (a.Y > p.Y) != (b.Y > p.Y) && p.X < a.X+(p.Y-a.Y)*(b.X-a.X)/(b.Y-a.Y) {
			in = !in
		}
	}
	return in
}

// Box is an axis-aligned bounding box, Min ≤ Max in both coordinates.
// Comparing boxes first prunes the pairs of segments or points that a
// search must test exactly: what lies outside a box grown by a distance
// d is farther than d from everything inside it.
type Box struct{ Min, Max Point }

// BoxOf returns the smallest box holding pts. It panics if pts is empty.
func BoxOf(pts ...Point) Box {
	if len(pts) == 0 {
		panic("model: BoxOf no points")
	}
	b := Box{pts[0], pts[0]}
	for _, p := range pts[1:] {
		b.Min = Point{math.Min(b.Min.X, p.X), math.Min(b.Min.Y, p.Y)}
		b.Max = Point{math.Max(b.Max.X, p.X), math.Max(b.Max.Y, p.Y)}
	}
	return b
}

// Grow returns b with each side moved out by d.
func (b Box) Grow(d float64) Box {
	return Box{Point{b.Min.X - d, b.Min.Y - d}, Point{b.Max.X + d, b.Max.Y + d}}
}

// Contains reports whether p lies in b, its edges included.
func (b Box) Contains(p Point) bool {
	return p.X >= b.Min.X && p.X <= b.Max.X && p.Y >= b.Min.Y && p.Y <= b.Max.Y
}

// Overlaps reports whether b and c share a point, touching edges included.
func (b Box) Overlaps(c Box) bool {
	return b.Min.X <= c.Max.X && c.Min.X <= b.Max.X && b.Min.Y <= c.Max.Y && c.Min.Y <= b.Max.Y
}

// Size returns the box's width and height.
func (b Box) Size() (w, h float64) { return b.Max.X - b.Min.X, b.Max.Y - b.Min.Y }
