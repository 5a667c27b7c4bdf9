package model

import "math"

// Mack's correlation between the critical amplification exponent N of the
// e^N transition criterion and the free-stream turbulence level Tu (a
// fraction, not percent):
//
//	N = −8.43 − 2.4 ln Tu
//
// (Mack, L. M., Transition and laminar instability, JPL Publication 77-15,
// 1977). It was fitted for Tu between about 0.0007 and 0.03; outside that
// range it is an extrapolation.
const (
	mackOffset = -8.43
	mackSlope  = -2.4
)

// TurbulenceForN returns the free-stream turbulence level Tu (a fraction)
// that Mack's correlation pairs with the critical amplification exponent
// n: Tu = exp((n + 8.43)/(−2.4)). N = 9 gives Tu ≈ 0.0007 (0.07 %, a quiet
// wind tunnel).
func TurbulenceForN(n float64) float64 {
	return math.Exp((n - mackOffset) / mackSlope)
}
