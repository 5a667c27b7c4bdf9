package liftingline

import (
	"math"
	"testing"
)

// The end-plate correction AR_eff = AR (1 + 1.9 h/b), attributed to Hoerner
// (Fluid-Dynamic Lift, 1985; from memory, see EndPlateFactor), at two
// points of its formula: h/b = 0.1 gives 1.19 AR and h/b = 0.25 gives
// 1.475 AR.
func TestEndPlateAspectRatio(t *testing.T) {
	for _, c := range []struct {
		name                 string
		ar, h, b, wantFactor float64
	}{
		{"h/b 0.1", 4, 0.1, 1, 1.19},
		{"h/b 0.25", 5, 0.3, 1.2, 1.475},
		{"no plates", 5, 0, 1.2, 1},
	} {
		t.Run(c.name, func(t *testing.T) {
			got := EndPlateAspectRatio(c.ar, c.h, c.b)
			if math.Abs(got-c.ar*c.wantFactor) > 1e-12 {
				t.Errorf("%g, want %g", got, c.ar*c.wantFactor)
			}
		})
	}
}
