package solver

import "math"

// Downforce returns the downforce of a lift, force or coefficient: −lift,
// positive towards the ground. Lift is positive up (away from the ground)
// throughout the package; a wing mounted upside down on a car makes
// downforce, and its results are read with this sign (Forces.DownforcePerSpan
// is Downforce(LiftPerSpan)).
func Downforce(lift float64) float64 { return -lift }

// SpanTotal returns a per-metre force or moment over the span SpanM:
// perSpan × span. This is the two-dimensional value taken as constant
// along the span, with no tip losses or other end effects, so it is an
// upper estimate of what a finite wing makes. It is NaN when no span was
// given (SpanM is 0).
func (f *Forces) SpanTotal(perSpan float64) float64 {
	if !(f.SpanM > 0) {
		return math.NaN()
	}
	return perSpan * f.SpanM
}

// LiftToDrag returns the configuration's Cl/Cd at the study's angle of
// attack, with Cl inviscid and Cd from the boundary-layer estimate. It is
// NaN without that estimate, or when the estimate gives no drag (a surface
// separated, ViscousResult.Cd is NaN).
func (r *Result) LiftToDrag() float64 {
	if r.Solution == nil || r.Viscous == nil {
		return math.NaN()
	}
	return r.Solution.Cl / r.Viscous.Cd
}
