package model

import "testing"

// A study that gains its first speed or Reynolds number turns the viscous
// solution on (coupled unless it chose the estimate); one that had a speed
// keeps its choice.
func TestFollowFlow(t *testing.T) {
	for _, tc := range []struct {
		name      string
		prev, cur Flow
		viscous   Viscous
		want      Viscous
	}{
		{"first speed", Flow{}, Flow{SpeedMPS: 20}, Viscous{}, Viscous{Enabled: true, Mode: ViscousCoupled}},
		{"first Reynolds number", Flow{}, Flow{Reynolds: 3e5}, Viscous{}, Viscous{Enabled: true, Mode: ViscousCoupled}},
		{"the estimate chosen", Flow{}, Flow{SpeedMPS: 20}, Viscous{Mode: ViscousEstimate}, Viscous{Enabled: true, Mode: ViscousEstimate}},
		{"speed changed: the choice kept", Flow{SpeedMPS: 10}, Flow{SpeedMPS: 20}, Viscous{}, Viscous{}},
		{"speed removed", Flow{SpeedMPS: 10}, Flow{}, Viscous{}, Viscous{}},
		{"still none", Flow{}, Flow{}, Viscous{}, Viscous{}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st := NewStudy()
			st.Flow, st.Viscous = tc.cur, tc.viscous
			st.FollowFlow(tc.prev)
			if st.Viscous != tc.want {
				t.Errorf("viscous %+v, want %+v", st.Viscous, tc.want)
			}
		})
	}
}
