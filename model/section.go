package model

import (
	"errors"
	"fmt"
	"math"
)

// MinSectionPoints is the fewest points a Section accepts: fewer cannot
// describe an upper surface, a leading edge and a lower surface.
const MinSectionPoints = 5

// Sentinel errors for section data; match them with errors.Is.
var (
	ErrTooFewPoints = errors.New("too few points")
	ErrNonFinite    = errors.New("coordinate is not a finite number")
)

// errNotFinite is ErrNonFinite for a value that is not a coordinate (an
// angle, a Reynolds number, a trip position, a temperature): its message
// says only "not a finite number", so a field's error does not call the
// angle of attack a coordinate, and errors.Is still matches ErrNonFinite.
var errNotFinite error = notFinite{}

type notFinite struct{}

func (notFinite) Error() string        { return "not a finite number" }
func (notFinite) Is(target error) bool { return target == ErrNonFinite }

// PointError reports a problem with one point of a contour.
type PointError struct {
	Index int // zero-based index into the points given
	Err   error
}

func (e *PointError) Error() string {
	return fmt.Sprintf("point %d: %v", e.Index+1, e.Err)
}

func (e *PointError) Unwrap() error { return e.Err }

// Section is an immutable closed contour with a name, in the convention of
// the package documentation: trailing edge, upper surface, leading edge,
// lower surface, trailing edge. NewSection checks only that the points are
// usable numbers; Clean brings a contour from anywhere into the convention.
type Section struct {
	name string
	pts  []Point
}

// NewSection returns a section holding a copy of pts. It rejects fewer than
// MinSectionPoints points and any NaN or infinite coordinate.
func NewSection(name string, pts []Point) (*Section, error) {
	if len(pts) < MinSectionPoints {
		return nil, fmt.Errorf("section %q has %d points, needs at least %d: %w", name, len(pts), MinSectionPoints, ErrTooFewPoints)
	}
	for i, p := range pts {
		if !p.IsFinite() {
			return nil, &PointError{Index: i, Err: ErrNonFinite}
		}
	}
	c := make([]Point, len(pts))
	copy(c, pts)
	return &Section{name: name, pts: c}, nil
}

// Name returns the section's name.
func (s *Section) Name() string { return s.name }

// WithName returns a copy of s with another name.
func (s *Section) WithName(name string) *Section {
	return &Section{name: name, pts: s.pts}
}

// Len returns the number of points.
func (s *Section) Len() int { return len(s.pts) }

// At returns point i; it panics if i is out of range.
func (s *Section) At(i int) Point {
	if i < 0 || i >= len(s.pts) {
		panic(fmt.Sprintf("model: point index %d out of range [0,%d)", i, len(s.pts)))
	}
	return s.pts[i]
}

// Points returns a copy of the points.
func (s *Section) Points() []Point {
	c := make([]Point, len(s.pts))
	copy(c, s.pts)
	return c
}

// TrailingEdgeGap returns the distance between the first and last points.
func (s *Section) TrailingEdgeGap() float64 {
	return s.pts[0].Dist(s.pts[len(s.pts)-1])
}

// LeadingEdgeIndex returns the index of the point farthest from the
// trailing-edge midpoint: for a cleaned section, the leading edge node.
func (s *Section) LeadingEdgeIndex() int {
	te := s.pts[0].Add(s.pts[len(s.pts)-1]).Scale(0.5)
	best, bestD := 0, -1.0
	for i, p := range s.pts {
		if d := p.Dist(te); d > bestD {
			best, bestD = i, d
		}
	}
	return best
}

// SignedArea returns the area enclosed by the contour (closed by the
// trailing-edge gap), positive when the points run counter-clockwise
// (shoelace formula).
func (s *Section) SignedArea() float64 {
	return PolygonArea(s.pts)
}

// MaxThickness returns the largest vertical extent of the contour over a
// station, sampled at the points: a quick measure for display, not a
// substitute for the generator's designation.
func (s *Section) MaxThickness() float64 {
	le := s.LeadingEdgeIndex()
	upper, lower := s.pts[:le+1], s.pts[le:]
	best := 0.0
	for _, p := range upper {
		y, ok := interpAt(lower, p.X)
		if ok {
			best = math.Max(best, p.Y-y)
		}
	}
	return best
}

// interpAt linearly interpolates y at x along a polyline whose x is
// monotone between consecutive points; ok is false if x is outside it.
func interpAt(pl []Point, x float64) (float64, bool) {
	for i := 0; i+1 < len(pl); i++ {
		a, b := pl[i], pl[i+1]
		if (a.X-x)*(b.X-x) <= 0 && a.X != b.X {
			t := (x - a.X) / (b.X - a.X)
			return a.Y + t*(b.Y-a.Y), true
		}
	}
	return 0, false
}
