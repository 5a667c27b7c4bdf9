package solver

import "math"

// The velocity induced by one linear-strength vortex panel.
//
// Take the panel in its own frame: it runs from P1 at the origin along +x' to
// P2 at (L, 0); +y' points to the left of the direction P1 → P2, which for a
// counter-clockwise contour is into the body. The sheet strength varies
// linearly from γa at P1 to γb at P2,
//
//	γ(ξ) = γa + (γb − γa) ξ/L,  0 ≤ ξ ≤ L,
//
// and is positive clockwise (the convention of Katz & Plotkin, Low-Speed
// Aerodynamics, 2nd ed., 2001, sec. 10.3.2, and of Kuethe & Chow,
// Foundations of Aerodynamics, 5th ed., sec. 5.10): an element γ dξ at (ξ, 0)
// induces at (x', y')
//
//	du' =  γ dξ y'/(2π r²),  dv' = −γ dξ (x' − ξ)/(2π r²),  r² = (x' − ξ)² + y'².
//
// With θ(ξ) = atan2(y', x' − ξ), dθ/dξ = y'/r², and the integrals over the
// panel are elementary. Writing
//
//	Δθ = θ2 − θ1 = atan2(y', x' − L) − atan2(y', x'),  λ = ln(r1/r2),
//
// with r1, r2 the distances from P1 and P2 (the closed forms of Katz &
// Plotkin sec. 10.3.2, derived again here in this package's notation):
//
//	2π u' = γa Δθ + (γb − γa)/L · (x' Δθ − y' λ)
//	2π v' = −γa λ + (γb − γa)/L · (L − x' λ − y' Δθ)
//
// so the coefficients of γa and γb are
//
//	2π ua = Δθ − p,  2π ub = p,  p = (x' Δθ − y' λ)/L,
//	2π va = −λ − q,  2π vb = q,  q = 1 − (x' λ + y' Δθ)/L.
//
// Δθ is the signed angle that the panel subtends at the point, in (−π, π);
// it is computed with one atan2 of the cross and dot products of the vectors
// P1 → point and P2 → point, which is frame independent. On the panel itself
// (y' → 0, 0 < x' < L) Δθ tends to −π from outside the body (y' < 0) and to
// +π from inside; λ is finite there and zero at the midpoint. The normal
// component v' is continuous across the sheet and u' jumps by γ: just outside
// the body the panel's own contribution is u' = −γ/2.

// linearVortex returns the panel-frame velocity coefficients (ua, va) of γa
// and (ub, vb) of γb at panel-frame point (x, y) of a panel of inverse
// length il = 1/L, given the subtended angle dth = Δθ and lam = ln(r1/r2).
func linearVortex(x, y, il, dth, lam float64) (ua, va, ub, vb float64) {
	const inv2pi = 1 / (2 * math.Pi)
	p := (x*dth - y*lam) * il
	q := 1 - (x*lam+y*dth)*il
	return (dth - p) * inv2pi, (-lam - q) * inv2pi, p * inv2pi, q * inv2pi
}

// minDistFrac bounds from below the distance, as a fraction of the panel
// length (of the element's chord in the matrix assembly), at which the
// logarithm ln(r1/r2) is evaluated: a field point on a node would otherwise
// give ln 0. Between two panels the velocity of a continuous linear vortex
// sheet has only a weak (γ times the corner angle) logarithmic singularity at
// a node, and at the open ends of the sheet, the trailing-edge nodes of a
// blunt trailing edge, one of strength γ/(2π) ln r: clamping r at 10⁻⁶ panel
// lengths keeps the field bounded there (|ln 10⁻⁶| ≈ 14) and changes nothing
// farther out.
const minDistFrac = 1e-6

// panelInfluence returns the global velocity (u, v) per unit γa and per unit
// γb that panel pn induces at point (px, py). It is the exact closed form;
// the near-node logarithm is clamped (minDistFrac).
func panelInfluence(pn *panelGeom, px, py float64) (ua, va, ub, vb float64) {
	r1x, r1y := px-pn.x1, py-pn.y1
	r2x, r2y := px-pn.x2, py-pn.y2
	floor := minDistFrac * minDistFrac * pn.l * pn.l
	r1 := math.Max(r1x*r1x+r1y*r1y, floor)
	r2 := math.Max(r2x*r2x+r2y*r2y, floor)
	lam := 0.5 * math.Log(r1/r2)
	dth := math.Atan2(r1x*r2y-r1y*r2x, r1x*r2x+r1y*r2y)
	x := r1x*pn.tx + r1y*pn.ty
	y := -r1x*pn.ty + r1y*pn.tx
	lua, lva, lub, lvb := linearVortex(x, y, pn.il, dth, lam)
	// Back to the global frame: x' along t = (tx, ty), y' along (−ty, tx).
	ua = lua*pn.tx - lva*pn.ty
	va = lua*pn.ty + lva*pn.tx
	ub = lub*pn.tx - lvb*pn.ty
	vb = lub*pn.ty + lvb*pn.tx
	return ua, va, ub, vb
}

// The velocity induced by one constant-strength source panel, which closes
// an open trailing edge (system.go). In the same panel frame as above, a
// source of strength σ per unit length (outflow positive) on 0 ≤ ξ ≤ L
// induces (Katz & Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001, sec.
// 10.2.1, constant-strength source element)
//
//	u' = σ/(4π) ln(r1²/r2²) = σ/(2π) λ,
//	v' = σ/(2π) (θ2 − θ1) = σ/(2π) Δθ,
//
// with the same λ = ln(r1/r2) and subtended angle Δθ as the vortex panel.
// On the panel, from outside the body (y' → 0−, Δθ → −π) the normal
// velocity is σ/2 along the outward normal, from inside −σ/2: the sheet
// emits σ per unit length, half to each side.

// constantSource returns the panel-frame velocity (u', v') per unit σ
// given dth = Δθ and lam = ln(r1/r2).
func constantSource(dth, lam float64) (u, v float64) {
	const inv2pi = 1 / (2 * math.Pi)
	return lam * inv2pi, dth * inv2pi
}

// sourceInfluence returns the global velocity (u, v) per unit σ that the
// constant-strength source panel pn induces at (px, py), with the
// near-node logarithm clamped as in panelInfluence.
func sourceInfluence(pn *panelGeom, px, py float64) (u, v float64) {
	r1x, r1y := px-pn.x1, py-pn.y1
	r2x, r2y := px-pn.x2, py-pn.y2
	floor := minDistFrac * minDistFrac * pn.l * pn.l
	r1 := math.Max(r1x*r1x+r1y*r1y, floor)
	r2 := math.Max(r2x*r2x+r2y*r2y, floor)
	lam := 0.5 * math.Log(r1/r2)
	dth := math.Atan2(r1x*r2y-r1y*r2x, r1x*r2x+r1y*r2y)
	lu, lv := constantSource(dth, lam)
	return lu*pn.tx - lv*pn.ty, lu*pn.ty + lv*pn.tx
}

// subtended returns the subtended angle Δθ = atan2(r1 × r2, r1 · r2) and
// λ = ln(r1/r2) of a panel of length l seen from a point, given the vectors
// r1, r2 from the panel's nodes to the point, their squared lengths s1, s2,
// and x = r1 · t, the point's coordinate along the panel. floor bounds s1
// and s2 from below in the logarithm (minDistFrac).
//
// Most panels of a row are far from its collocation point, where both are
// small, and there they come from odd series with one division between
// them instead of an atan2 and two logarithms:
//
//	Δθ = atan t,  t = (r1 × r2)/(r1 · r2),
//	λ = ½ ln(s1/s2) = atanh w,  w = (s1 − s2)/(s1 + s2) = l (2x − l)/(s1 + s2),
//
// the last form from s1 − s2 = 2 l x − l² (no cancellation). For |t|, |w| <
// seriesMax the series below, truncated after the z⁸ term (z = t² or w²),
// leave a relative error below z⁹/19 < 3e-18, far below rounding; nearer
// panels use math.Atan2 and one math.Log of s1/s2. TestSubtendedSeries checks both
// paths against math.Atan2 and math.Atanh.
func subtended(r1x, r1y, r2x, r2y, s1, s2, x, l, floor float64) (dth, lam float64) {
	cross := r1x*r2y - r1y*r2x
	dot := r1x*r2x + r1y*r2y
	if dot > 0 {
		sum := s1 + s2
		inv := 1 / (dot * sum)
		t := cross * sum * inv
		w := l * (2*x - l) * dot * inv
		if math.Abs(t) < seriesMax && math.Abs(w) < seriesMax {
			return t * oddSeries(t*t, -1), w * oddSeries(w*w, 1)
		}
	}
	return math.Atan2(cross, dot), 0.5 * math.Log(math.Max(s1, floor)/math.Max(s2, floor))
}

// seriesMax is the largest |t| and |w| at which subtended uses the series:
// at 1/8 the truncation error z⁹/19 is 3e-18 of the value.
const seriesMax = 0.125

// oddSeries returns Σ_{k=0}^{8} sgn^k z^k/(2k+1): atan(t)/t for sgn = −1
// and atanh(w)/w for sgn = +1, with z = t² or w² (their Taylor series,
// as in Abramowitz & Stegun, Handbook of Mathematical Functions, 1964,
// ch. 4).
//
// The polynomial is evaluated by Estrin's scheme (D. E. Knuth, The Art of
// Computer Programming, vol. 2, sec. 4.6.4), whose independent parts
// shorten the chain of dependent multiplications of Horner's rule.
func oddSeries(z, sgn float64) float64 {
	y := sgn * z
	y2 := y * y
	y4 := y2 * y2
	lo := (1 + y*(1.0/3)) + y2*(1.0/5+y*(1.0/7))
	hi := (1.0/9 + y*(1.0/11)) + y2*(1.0/13+y*(1.0/15))
	return lo + y4*(hi+y4*(1.0/17))
}
