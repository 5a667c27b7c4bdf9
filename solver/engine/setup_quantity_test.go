package engine

import (
	"math"
	"testing"
)

// Each quantity reads its field of a point: N/m with forces, coefficients
// without; NaN where the point has no answer; separation the earliest of
// the elements, 1 when every one stays attached.
func TestQuantityValue(t *testing.T) {
	nan := math.NaN()
	p := Point{Viscous: true, Converged: true, Inverted: true, Cl: -2, Cd: 0.05, Cm: 0.3,
		LiftPerSpan: -600, DownforcePerSpan: 600, DragPerSpan: 15,
		Elements: []PointElement{{SeparationSuction: nan}, {SeparationSuction: 0.8}}}
	for _, c := range []struct {
		name   string
		q      Quantity
		p      Point
		forces bool
		want   float64
	}{
		{"downforce in N/m", QuantityLoad, p, true, 600},
		{"downforce coefficient", QuantityLoad, p, false, 2},
		{"drag in N/m", QuantityDrag, p, true, 15},
		{"drag coefficient", QuantityDrag, p, false, 0.05},
		{"downforce to drag", QuantityLiftToDrag, p, true, 40},
		{"Cm", QuantityCm, p, true, 0.3},
		{"earliest separation", QuantitySeparation, p, true, 0.8},
		{"attached", QuantitySeparation, Point{Viscous: true, Converged: true, Elements: []PointElement{{SeparationSuction: nan}}}, true, 1},
		{"inviscid separation", QuantitySeparation, Point{Converged: true, Elements: []PointElement{{SeparationSuction: nan}}}, true, nan},
		{"not converged", QuantityLoad, Point{Viscous: true, DownforcePerSpan: 600, Inverted: true}, true, nan},
	} {
		t.Run(c.name, func(t *testing.T) {
			got := c.q.Value(&c.p, c.forces)
			if !(got == c.want || math.IsNaN(got) && math.IsNaN(c.want)) {
				t.Errorf("%g, want %g", got, c.want)
			}
		})
	}
}
