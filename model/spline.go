package model

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"gonum.org/v1/gonum/integrate/quad"
)

// MinSplinePoints is the fewest points NewContourSpline accepts: the
// not-a-knot end condition needs at least three intervals.
const MinSplinePoints = 4

// ErrDuplicatePoint reports two consecutive points that coincide, which
// leave the chord-length parameter without an interval. Match it with
// errors.Is through the *PointError that carries it.
var ErrDuplicatePoint = errors.New("point repeats the previous point")

// ContourSpline is a parametric cubic spline P(t) = (x(t), y(t)) through the
// points of a contour, in their order. The parameter is the cumulative chord
// length: t₀ = 0, tᵢ₊₁ = tᵢ + |Pᵢ₊₁ − Pᵢ|, so t approximates arc length and
// runs over [0, Length()].
//
// Each coordinate is an interpolating cubic spline in t with continuous
// first and second derivatives and the not-a-knot end condition (the third
// derivative is also continuous at the second and the second-to-last knot),
// so a coordinate that is a cubic polynomial of t is reproduced exactly
// (de Boor, A Practical Guide to Splines, 1978, ch. IV). Unlike a natural
// spline it imposes no zero curvature at the ends, which matters at a
// trailing edge.
//
// A ContourSpline is immutable and safe for concurrent use.
type ContourSpline struct {
	t      []float64 // knots, t[0] = 0, strictly increasing
	x, y   cubic1D
	s      []float64 // arc length at each knot, by Gauss–Legendre quadrature
	first  Point     // first and last input point
	last   Point
	maxIdx int // index of the input point farthest from the TE midpoint
}

// NewContourSpline fits a spline through pts. It needs at least
// MinSplinePoints finite points with no two consecutive points equal; it
// returns a *PointError wrapping ErrDuplicatePoint or ErrNonFinite, or an
// error wrapping ErrTooFewPoints. pts is not retained.
func NewContourSpline(pts []Point) (*ContourSpline, error) {
	if len(pts) < MinSplinePoints {
		return nil, fmt.Errorf("spline through %d points, needs at least %d: %w", len(pts), MinSplinePoints, ErrTooFewPoints)
	}
	n := len(pts)
	t := make([]float64, n)
	xs := make([]float64, n)
	ys := make([]float64, n)
	for i, p := range pts {
		if !p.IsFinite() {
			return nil, &PointError{Index: i, Err: ErrNonFinite}
		}
		xs[i], ys[i] = p.X, p.Y
		if i > 0 {
			d := p.Dist(pts[i-1])
			if !(d > 0) {
				return nil, &PointError{Index: i, Err: ErrDuplicatePoint}
			}
			t[i] = t[i-1] + d
		}
	}
	c := &ContourSpline{t: t, first: pts[0], last: pts[n-1]}
	c.x = fitNotAKnot(t, xs)
	c.y = fitNotAKnot(t, ys)

	// Arc length per interval by Gauss–Legendre quadrature of |P'(t)|.
	c.s = make([]float64, n)
	for i := 0; i+1 < n; i++ {
		c.s[i+1] = c.s[i] + c.arcLengthOn(i, t[i], t[i+1])
	}

	te := c.first.Add(c.last).Scale(0.5)
	best := -1.0
	for i, p := range pts {
		if d := p.Dist(te); d > best {
			best, c.maxIdx = d, i
		}
	}
	return c, nil
}

// Length returns the parameter range end: the total chord length of the
// input polygon. The parameter runs over [0, Length()].
func (c *ContourSpline) Length() float64 { return c.t[len(c.t)-1] }

// Knots returns a copy of the parameter values of the input points.
func (c *ContourSpline) Knots() []float64 {
	k := make([]float64, len(c.t))
	copy(k, c.t)
	return k
}

// At returns P(t). Outside [0, Length()] the end cubics are extended.
func (c *ContourSpline) At(t float64) Point {
	i := c.interval(t)
	return Point{c.x.eval(i, t), c.y.eval(i, t)}
}

// Deriv returns dP/dt. Because t approximates arc length, |dP/dt| ≈ 1.
func (c *ContourSpline) Deriv(t float64) Point {
	i := c.interval(t)
	return Point{c.x.deriv(i, t), c.y.deriv(i, t)}
}

// Deriv2 returns d²P/dt².
func (c *ContourSpline) Deriv2(t float64) Point {
	i := c.interval(t)
	return Point{c.x.deriv2(i, t), c.y.deriv2(i, t)}
}

// Curvature returns the signed curvature κ = (x′y″ − y′x″)/|P′|³ at t:
// positive where the contour turns left (counter-clockwise), as it does
// everywhere on a convex section in the package convention. |κ| is the
// inverse of the radius of curvature.
func (c *ContourSpline) Curvature(t float64) float64 {
	d1, d2 := c.Deriv(t), c.Deriv2(t)
	v := d1.Norm()
	if v == 0 {
		return math.Inf(1)
	}
	return d1.Cross(d2) / (v * v * v)
}

// ArcLength returns the arc length of the spline from parameter 0 to t,
// for t in [0, Length()] (clamped), integrating |P′| with Gauss–Legendre
// quadrature on each interval.
func (c *ContourSpline) ArcLength(t float64) float64 {
	n := len(c.t)
	if t <= 0 {
		return 0
	}
	if t >= c.t[n-1] {
		return c.s[n-1]
	}
	i := c.interval(t)
	return c.s[i] + c.arcLengthOn(i, c.t[i], t)
}

// TotalArcLength returns the arc length of the whole spline.
func (c *ContourSpline) TotalArcLength() float64 { return c.s[len(c.s)-1] }

// ParamAtArcLength returns the parameter t at which ArcLength(t) = s, for s
// in [0, TotalArcLength()] (clamped). It solves by safeguarded Newton
// iteration (ds/dt = |P′|) inside the knot interval that holds s.
func (c *ContourSpline) ParamAtArcLength(s float64) float64 {
	n := len(c.t)
	if s <= 0 {
		return 0
	}
	if s >= c.s[n-1] {
		return c.t[n-1]
	}
	i := sort.SearchFloat64s(c.s, s) - 1
	if i < 0 {
		i = 0
	}
	if i > n-2 {
		i = n - 2
	}
	lo, hi := c.t[i], c.t[i+1]
	// Linear first guess within the interval.
	t := lo + (hi-lo)*(s-c.s[i])/(c.s[i+1]-c.s[i])
	for range 60 {
		f := c.s[i] + c.arcLengthOn(i, c.t[i], t) - s
		if f > 0 {
			hi = t
		} else {
			lo = t
		}
		if math.Abs(f) <= 1e-15*c.s[n-1] {
			return t
		}
		v := Point{c.x.deriv(i, t), c.y.deriv(i, t)}.Norm()
		nt := t - f/v
		if !(nt > lo && nt < hi) {
			nt = 0.5 * (lo + hi)
		}
		if nt == t {
			return t
		}
		t = nt
	}
	return t
}

// LeadingEdge returns the parameter and position of the leading edge: the
// point of the spline farthest from the trailing-edge midpoint
// TE = (P₀ + Pₙ₋₁)/2. It solves (P(t) − TE)·P′(t) = 0, the stationarity of
// |P(t) − TE|², by bisection on the intervals next to the input point
// farthest from TE, where the product changes sign from positive to
// negative, and keeps the farthest root found.
func (c *ContourSpline) LeadingEdge() (float64, Point) {
	te := c.first.Add(c.last).Scale(0.5)
	g := func(t float64) float64 { return c.At(t).Sub(te).Dot(c.Deriv(t)) }
	n := len(c.t)
	lo := max(c.maxIdx-2, 0)
	hi := min(c.maxIdx+2, n-1)
	bestT := c.t[c.maxIdx]
	bestD := c.At(bestT).Dist(te)
	// Sub-sample each interval so that a sign change inside it is not
	// missed when the polygon's corner point is not the spline's maximum.
	const sub = 8
	for i := lo; i < hi; i++ {
		for j := range sub {
			a := c.t[i] + (c.t[i+1]-c.t[i])*float64(j)/sub
			b := c.t[i] + (c.t[i+1]-c.t[i])*float64(j+1)/sub
			ga, gb := g(a), g(b)
			if !(ga >= 0 && gb <= 0) {
				continue
			}
			for range 100 {
				m := 0.5 * (a + b)
				if m <= a || m >= b {
					break
				}
				if g(m) >= 0 {
					a = m
				} else {
					b = m
				}
			}
			r := 0.5 * (a + b)
			if d := c.At(r).Dist(te); d > bestD {
				bestT, bestD = r, d
			}
		}
	}
	return bestT, c.At(bestT)
}

// interval returns the index i of the knot interval [t_i, t_{i+1}] that
// holds t, clamped to the first and last interval.
func (c *ContourSpline) interval(t float64) int {
	n := len(c.t)
	i := sort.SearchFloat64s(c.t, t) - 1
	if i < 0 {
		return 0
	}
	if i > n-2 {
		return n - 2
	}
	return i
}

// arcLengthOn integrates |P′| over [a, b] inside interval i.
func (c *ContourSpline) arcLengthOn(i int, a, b float64) float64 {
	if b <= a {
		return 0
	}
	h := 0.5 * (b - a)
	m := 0.5 * (a + b)
	sum := 0.0
	for k, u := range glNodes {
		t := m + h*u
		sum += glWeights[k] * math.Hypot(c.x.deriv(i, t), c.y.deriv(i, t))
	}
	return h * sum
}

// glOrder is the number of Gauss–Legendre points per interval for arc
// length: |P′| is the square root of a quartic, smooth on each interval,
// and 8 points integrate it to near rounding for any reasonable contour.
const glOrder = 8

var glNodes, glWeights = func() ([]float64, []float64) {
	x := make([]float64, glOrder)
	w := make([]float64, glOrder)
	quad.Legendre{}.FixedLocations(x, w, -1, 1)
	return x, w
}()

// cubic1D is a piecewise cubic on knots t with second derivatives m at the
// knots: on [t_i, t_{i+1}], with h = t_{i+1} − t_i and u = t − t_i,
//
//	S(t) = y_i + b_i u + m_i u²/2 + (m_{i+1} − m_i) u³/(6h),
//	b_i  = (y_{i+1} − y_i)/h − h(2m_i + m_{i+1})/6.
type cubic1D struct {
	t, y, m []float64
}

func (s *cubic1D) coef(i int) (h, b float64) {
	h = s.t[i+1] - s.t[i]
	b = (s.y[i+1]-s.y[i])/h - h*(2*s.m[i]+s.m[i+1])/6
	return h, b
}

func (s *cubic1D) eval(i int, t float64) float64 {
	h, b := s.coef(i)
	u := t - s.t[i]
	return s.y[i] + u*(b+u*(s.m[i]/2+u*(s.m[i+1]-s.m[i])/(6*h)))
}

func (s *cubic1D) deriv(i int, t float64) float64 {
	h, b := s.coef(i)
	u := t - s.t[i]
	return b + u*(s.m[i]+u*(s.m[i+1]-s.m[i])/(2*h))
}

func (s *cubic1D) deriv2(i int, t float64) float64 {
	h := s.t[i+1] - s.t[i]
	u := t - s.t[i]
	return s.m[i] + u*(s.m[i+1]-s.m[i])/h
}

// fitNotAKnot returns the not-a-knot cubic spline through (t_i, y_i),
// len(t) ≥ 4, t strictly increasing. The second derivatives m solve the
// continuity equations at interior knots,
//
//	h_{i−1} m_{i−1} + 2(h_{i−1} + h_i) m_i + h_i m_{i+1} = 6(δ_i − δ_{i−1}),
//
// δ_i = (y_{i+1} − y_i)/h_i, with the end conditions h₁m₀ − (h₀ + h₁)m₁ +
// h₀m₂ = 0 (and its mirror at the far end). The end conditions are
// eliminated into the first and last interior rows, leaving a tridiagonal
// system solved by the Thomas algorithm.
func fitNotAKnot(t, y []float64) cubic1D {
	n := len(t)
	if n < MinSplinePoints {
		panic("model: not-a-knot spline needs at least 4 knots")
	}
	h := make([]float64, n-1)
	d := make([]float64, n-1)
	for i := range h {
		h[i] = t[i+1] - t[i]
		d[i] = (y[i+1] - y[i]) / h[i]
	}
	// Unknowns m_1 .. m_{n−2}, k = n − 2 of them.
	k := n - 2
	sub := make([]float64, k)  // coefficient of m_{i−1}
	diag := make([]float64, k) // coefficient of m_i
	sup := make([]float64, k)  // coefficient of m_{i+1}
	rhs := make([]float64, k)
	for j := range k {
		i := j + 1
		sub[j] = h[i-1]
		diag[j] = 2 * (h[i-1] + h[i])
		sup[j] = h[i]
		rhs[j] = 6 * (d[i] - d[i-1])
	}
	// m_0 = ((h0+h1) m_1 − h0 m_2)/h1 substituted into row 1.
	h0, h1 := h[0], h[1]
	diag[0] = (h0 + h1) * (h0 + 2*h1) / h1
	sup[0] = (h1*h1 - h0*h0) / h1
	// m_{n−1} = ((ha+hb) m_{n−2} − hb m_{n−3})/ha, ha = h_{n−3}, hb = h_{n−2}.
	ha, hb := h[n-3], h[n-2]
	diag[k-1] += hb * (ha + hb) / ha
	sub[k-1] = (ha*ha - hb*hb) / ha
	// Thomas algorithm. sub[0] and sup[k−1] are unused.
	cp := make([]float64, k)
	dp := make([]float64, k)
	cp[0] = sup[0] / diag[0]
	dp[0] = rhs[0] / diag[0]
	for j := 1; j < k; j++ {
		den := diag[j] - sub[j]*cp[j-1]
		if j < k-1 {
			cp[j] = sup[j] / den
		}
		dp[j] = (rhs[j] - sub[j]*dp[j-1]) / den
	}
	m := make([]float64, n)
	m[k] = dp[k-1]
	for j := k - 2; j >= 0; j-- {
		m[j+1] = dp[j] - cp[j]*m[j+2]
	}
	m[0] = ((h0+h1)*m[1] - h0*m[2]) / h1
	m[n-1] = ((ha+hb)*m[n-2] - hb*m[n-3]) / ha
	yc := make([]float64, n)
	copy(yc, y)
	return cubic1D{t: t, y: yc, m: m}
}
