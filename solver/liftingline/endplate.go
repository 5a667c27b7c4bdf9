package liftingline

import (
	"fmt"
	"math"
)

// EndPlateFactor is the factor of the end-plate correction
// AR_eff = AR (1 + EndPlateFactor · h/b), h the end plate's height and b
// the span. The form and the factor 1.9 are attributed to Hoerner
// (Fluid-Dynamic Lift, 1985) and quoted in race-car texts; from memory,
// not checked against Hoerner's page. It is an estimate for plates of
// modest height; a taller plate or one that does not reach the trailing
// edge behaves differently.
const EndPlateFactor = 1.9

// EndPlateAspectRatio returns the effective aspect ratio of a wing of
// aspect ratio ar with end plates of height heightM at both tips of a span
// spanM: ar (1 + 1.9 h/b). A height of 0 returns ar.
func EndPlateAspectRatio(ar, heightM, spanM float64) float64 {
	if !(ar > 0) || !(spanM > 0) || !(heightM >= 0) || math.IsInf(heightM, 0) {
		panic(fmt.Sprintf("liftingline: end-plate correction of aspect ratio %g, height %g m, span %g m", ar, heightM, spanM))
	}
	return ar * (1 + EndPlateFactor*heightM/spanM)
}
