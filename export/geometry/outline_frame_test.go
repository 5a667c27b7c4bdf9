package geometry

import (
	"math"
	"testing"

	"sectionbench/model"
)

// TestOutlineAngleAsLabelled: a wing set at +2° as labelled
// (model.AngleSense) has its leading edge moved the way the label says in
// the exported as-mounted outline: up on an upright wing, down towards
// the ground on an inverted one, by the chord times sin 2° against the
// trailing edge (closed form).
func TestOutlineAngleAsLabelled(t *testing.T) {
	sec, err := model.NACA("4412", model.NACAOptions{})
	if err != nil {
		t.Fatal(err)
	}
	for _, inverted := range []bool{false, true} {
		var rise [2]float64 // leading edge above trailing edge, mm
		for k, angle := range []float64{0, 2} {
			st := model.NewStudy()
			st.Inverted = inverted
			st.Elements[0].AngleDeg = angle
			l, err := model.Place(st, []*model.Section{sec})
			if err != nil {
				t.Fatal(err)
			}
			o, err := NewOutline("frame", l, OutlineOptions{Placed: true})
			if err != nil {
				t.Fatal(err)
			}
			e := o.Elements[0]
			rise[k] = e.LE.Y - e.TE.Y
		}
		// The panelled chord line may lie a small angle φ (≈ 0.2°) off the
		// section's: the rise then changes by c(sin(2° + φ) − sin φ), within
		// 0.01 mm of c sin 2° for φ < 0.5°.
		want := 250 * math.Sin(2*math.Pi/180)
		if inverted {
			want = -want
		}
		if got := rise[1] - rise[0]; math.Abs(got-want) > 0.01 {
			t.Errorf("inverted=%v, %q: +2° moved the leading edge %.3f mm against the trailing edge, want %.3f", inverted, model.AngleSense(inverted), got, want)
		}
	}
}
