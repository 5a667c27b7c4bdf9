package model

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// ErrNoLeadingEdge reports a contour whose leading edge, the point farthest
// from the trailing-edge midpoint, falls at one of its ends, so that it has
// no upper and lower surface to panel.
var ErrNoLeadingEdge = errors.New("leading edge is not between the trailing-edge points")

// curvatureWeight is the share of nodes the curvature law places in
// proportion to √|κ|; the rest are spread evenly in arc length so that flat
// stretches keep panels. A project choice.
const curvatureWeight = 0.5

// samplesPerPanel sets how finely the cumulative node-density functions
// of the cosine and curvature laws are tabulated: per panel of the
// surface, and at least minSamples per surface.
const (
	samplesPerPanel = 16
	minSamples      = 2048
)

// Repanel returns a new section with p.Panels panels (p.Panels + 1 nodes)
// laid on a ContourSpline through s's points. s should be a cleaned
// section in the package convention (leading edge near (0, 0), trailing
// edge near (1, 0)).
//
// Node 0 is s's first point (trailing edge, upper side), node N = p.Panels
// its last point, and node ceil(N/2) is the spline's leading edge exactly
// (ContourSpline.LeadingEdge): the upper surface gets ceil(N/2) panels, the
// lower surface the rest. On each surface nodes are placed by a
// distribution u ↦ position, with u = i/n the node fraction from the
// leading edge (u = 0) to the trailing edge (u = 1) of a surface with n
// panels, S the surface's arc length and s the arc length from the
// leading edge:
//
//   - SpacingCosine: the chordwise coordinate ξ = (P − LE)·(TE − LE)/|TE − LE|²
//     (0 at the spline's leading edge, 1 at the trailing-edge midpoint) is
//     ξ = ξ_end (1 − cos πu)/2, ξ_end being ξ of the surface's trailing-edge
//     point (1 for a cleaned section), so that nodes sit at x = (1 − cos β)/2
//     with β uniform on [0, π] (Kuethe & Chow, Foundations of Aerodynamics;
//     Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., sec. 11.1). Each node
//     is found on the spline by solving ξ(P(t)) = target for the parameter
//     t. If ξ is not monotone along a surface (a hooked contour), that
//     surface falls back to s/S = (1 − cos πu)/2.
//   - SpacingUniform: s/S = u.
//   - SpacingBlend: s/S = h_T(h_N(u)), a composition of two monotone maps,
//     h_N(u) = (1 − Nose) u + Nose (1 − cos(πu/2)) clustering at the leading
//     edge and h_T(v) = (1 − Tail) v + Tail sin(πv/2) clustering at the
//     trailing edge. Nose = Tail = 0 is uniform; the map is smooth and
//     strictly increasing for all Nose, Tail in [0, 1]; at Nose = Tail = 1
//     the first panels shrink as 1/n² at both edges, at least as strongly
//     as cosine spacing on a round nose.
//   - SpacingCurvature: node density per unit arc length
//     ρ(s) ∝ (1 − w)/S + w √|κ(s)| / ∫√|κ| ds with w = 0.5, so panels
//     shrink where the contour bends; √|κ| equalises the gap h²|κ|/8
//     between a panel of length h and the arc it replaces.
//
// Nose and Tail shape only the blend law. Repanel returns the error of
// p.Validate, a *PointError from the spline fit (for example repeated
// points), or an error wrapping ErrNoLeadingEdge.
func Repanel(s *Section, p Panelling) (*Section, error) {
	if s == nil {
		panic("model: Repanel of a nil section")
	}
	if err := p.Validate(); err != nil {
		return nil, err
	}
	sp, err := NewContourSpline(s.pts)
	if err != nil {
		return nil, fmt.Errorf("repanelling %q: %w", s.name, err)
	}
	ts, err := repanelParams(sp, p)
	if err != nil {
		return nil, fmt.Errorf("repanelling %q: %w", s.name, err)
	}
	n := p.Panels
	nodes := make([]Point, n+1)
	for i, t := range ts {
		nodes[i] = sp.At(t)
	}
	_, le := sp.LeadingEdge()
	nodes[0], nodes[n] = s.pts[0], s.pts[len(s.pts)-1]
	nodes[(n+1)/2] = le
	return NewSection(s.name, nodes)
}

// repanelParams returns the p.Panels + 1 spline parameters of the nodes.
func repanelParams(sp *ContourSpline, p Panelling) ([]float64, error) {
	tLE, _ := sp.LeadingEdge()
	L := sp.Length()
	if !(tLE > 0 && tLE < L) {
		return nil, ErrNoLeadingEdge
	}
	n := p.Panels
	nu := (n + 1) / 2
	nl := n - nu
	ts := make([]float64, n+1)
	// Lower surface: from the leading edge (u = 0) to the trailing edge.
	lower := surfaceParams(sp, p, tLE, L, nl)
	// Upper surface, placed from the leading edge backwards to the
	// trailing edge, then reversed into node order.
	upper := surfaceParams(sp, p, tLE, 0, nu)
	for i := range nu + 1 {
		ts[i] = upper[nu-i]
	}
	copy(ts[nu:], lower)
	ts[0], ts[nu], ts[n] = 0, tLE, L
	return ts, nil
}

// surfaceParams returns n + 1 parameters from tLE (u = 0) to tEnd (u = 1)
// along one surface by the law of p.
func surfaceParams(sp *ContourSpline, p Panelling, tLE, tEnd float64, n int) []float64 {
	out := make([]float64, n+1)
	sLE, sEnd := sp.ArcLength(tLE), sp.ArcLength(tEnd)
	byArc := func(f func(u float64) float64) {
		for i := range out {
			out[i] = sp.ParamAtArcLength(sLE + (sEnd-sLE)*f(float64(i)/float64(n)))
		}
	}
	switch p.Spacing {
	case SpacingUniform:
		byArc(func(u float64) float64 { return u })
	case SpacingBlend:
		byArc(func(u float64) float64 { return blendMap(u, p.Nose, p.Tail) })
	case SpacingCosine:
		if !cosineParams(sp, tLE, tEnd, out) {
			byArc(func(u float64) float64 { return (1 - math.Cos(math.Pi*u)) / 2 })
		}
	case SpacingCurvature:
		curvatureParams(sp, tLE, tEnd, out)
	default:
		panic("model: unknown spacing law " + string(p.Spacing)) // Validate excludes it
	}
	out[0], out[n] = tLE, tEnd
	return out
}

// blendMap is the blend law's s/S as a function of u (see Repanel).
func blendMap(u, nose, tail float64) float64 {
	v := (1-nose)*u + nose*(1-math.Cos(math.Pi*u/2))
	return (1-tail)*v + tail*math.Sin(math.Pi*v/2)
}

// surfaceSamples returns m + 1 parameters equally spaced from a to b
// (either order), m chosen from the panel count and the knots in between.
func surfaceSamples(sp *ContourSpline, a, b float64, panels int) []float64 {
	knotsBetween := 0
	lo, hi := math.Min(a, b), math.Max(a, b)
	for _, k := range sp.t {
		if k > lo && k < hi {
			knotsBetween++
		}
	}
	m := max(minSamples, samplesPerPanel*panels, samplesPerPanel*knotsBetween)
	ts := make([]float64, m+1)
	for i := range ts {
		ts[i] = a + (b-a)*float64(i)/float64(m)
	}
	ts[m] = b
	return ts
}

// cosineParams fills out with the cosine law's parameters on the surface
// from tLE to tEnd, solving ξ(P(t)) = ξ_end (1 − cos πu)/2 by bisection
// inside the bracketing interval of a dense table of ξ. It reports false,
// leaving out unspecified, when ξ is not strictly increasing along the
// table.
func cosineParams(sp *ContourSpline, tLE, tEnd float64, out []float64) bool {
	_, le := sp.LeadingEdge()
	te := sp.first.Add(sp.last).Scale(0.5)
	chord := te.Sub(le)
	c2 := chord.Dot(chord)
	xi := func(t float64) float64 { return sp.At(t).Sub(le).Dot(chord) / c2 }
	n := len(out) - 1
	ts := surfaceSamples(sp, tLE, tEnd, n)
	xs := make([]float64, len(ts))
	for i, t := range ts {
		xs[i] = xi(t)
		if i > 0 && !(xs[i] > xs[i-1]) {
			return false
		}
	}
	xEnd := xs[len(xs)-1]
	for i := range out {
		target := xEnd * (1 - math.Cos(math.Pi*float64(i)/float64(n))) / 2
		j := sort.SearchFloat64s(xs, target) // xs[j-1] < target ≤ xs[j]
		if j == 0 {
			out[i] = ts[0]
			continue
		}
		if j >= len(xs) {
			out[i] = ts[len(ts)-1]
			continue
		}
		a, b := ts[j-1], ts[j]
		fa := xs[j-1] - target
		for range 100 {
			m := 0.5 * (a + b)
			if m == a || m == b {
				break
			}
			fm := xi(m) - target
			if (fm > 0) == (fa > 0) {
				a, fa = m, fm
			} else {
				b = m
			}
		}
		out[i] = 0.5 * (a + b)
	}
	return true
}

// curvatureParams fills out with the curvature law's parameters on the
// surface from tLE to tEnd: the cumulative node density Φ(s) =
// ∫ρ ds / ∫₀^S ρ ds is tabulated by the trapezoid rule and inverted by
// linear interpolation at Φ = i/n, then mapped to parameters through arc
// length.
func curvatureParams(sp *ContourSpline, tLE, tEnd float64, out []float64) {
	n := len(out) - 1
	ts := surfaceSamples(sp, tLE, tEnd, n)
	m := len(ts) - 1
	ss := make([]float64, m+1) // arc length from the leading edge
	rk := make([]float64, m+1) // √|κ|
	sLE := sp.ArcLength(tLE)
	for i, t := range ts {
		ss[i] = math.Abs(sp.ArcLength(t) - sLE)
		rk[i] = math.Sqrt(math.Abs(sp.Curvature(t)))
	}
	S := ss[m]
	var K float64
	for i := 1; i <= m; i++ {
		K += 0.5 * (rk[i] + rk[i-1]) * (ss[i] - ss[i-1])
	}
	rho := func(i int) float64 {
		if K == 0 {
			return 1 / S
		}
		return (1-curvatureWeight)/S + curvatureWeight*rk[i]/K
	}
	phi := make([]float64, m+1)
	for i := 1; i <= m; i++ {
		phi[i] = phi[i-1] + 0.5*(rho(i)+rho(i-1))*(ss[i]-ss[i-1])
	}
	total := phi[m]
	sign := 1.0
	if tEnd < tLE {
		sign = -1
	}
	for i := range out {
		target := total * float64(i) / float64(n)
		j := sort.SearchFloat64s(phi, target)
		var s float64
		switch {
		case j == 0:
			s = 0
		case j > m:
			s = S
		default:
			f := (target - phi[j-1]) / (phi[j] - phi[j-1])
			s = ss[j-1] + f*(ss[j]-ss[j-1])
		}
		out[i] = sp.ParamAtArcLength(sLE + sign*s)
	}
}

// PanelLengths returns the lengths of the panels of s, |P_{i+1} − P_i|,
// in node order: s.Len() − 1 values.
func PanelLengths(s *Section) []float64 {
	l := make([]float64, len(s.pts)-1)
	for i := range l {
		l[i] = s.pts[i+1].Dist(s.pts[i])
	}
	return l
}

// TrailingEdgeRatiosExempt is how many neighbour ratios at each trailing
// edge (the first and last of NeighbourRatios) the neighbour-ratio check
// leaves out. Cosine clustering grows its end panels as 1 : 3 : 5 : …
// from each trailing edge by construction (the lengths go as sin of an
// evenly spaced angle), ratios of 3 and 1.67 that no smooth law avoids;
// the linear-vortex method still converges at second order with it
// (docs/validation.md §7), so those two ratios are not a panelling fault.
const TrailingEdgeRatiosExempt = 2

// CheckedRatio reports whether neighbour ratio i of n (NeighbourRatios)
// counts in the neighbour-ratio check (TrailingEdgeRatiosExempt).
func CheckedRatio(i, n int) bool {
	return i >= TrailingEdgeRatiosExempt && i < n-TrailingEdgeRatiosExempt
}

// NeighbourRatios returns, for each pair of adjacent panels, the size ratio
// max(l_i, l_{i+1})/min(l_i, l_{i+1}) ≥ 1: s.Len() − 2 values. A zero-length
// panel next to another gives +Inf. Ratios well above about 1.5 are where panel methods
// lose accuracy (common practice).
func NeighbourRatios(s *Section) []float64 {
	l := PanelLengths(s)
	if len(l) < 2 {
		return nil
	}
	r := make([]float64, len(l)-1)
	for i := range r {
		lo, hi := math.Min(l[i], l[i+1]), math.Max(l[i], l[i+1])
		if lo == 0 {
			r[i] = math.Inf(1)
			continue
		}
		r[i] = hi / lo
	}
	return r
}
