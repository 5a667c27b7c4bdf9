package model

import (
	"math"
	"testing"
)

func TestPlausibility(t *testing.T) {
	for _, tc := range []struct {
		name string
		f    PointFacts
		want []FlagKind
	}{
		{"ordinary", PointFacts{CpMin: -3, HOverC: 0.4}, nil},
		{"free air", PointFacts{CpMin: -3, HOverC: math.NaN()}, nil},
		// The 5 mm flapped wing of the issue: min Cp −596 at h/c 0.02.
		{"impossible suction near the ground", PointFacts{CpMin: -596, HOverC: 0.02}, []FlagKind{FlagSuction, FlagGround}},
		{"at the threshold", PointFacts{CpMin: CpMinPlausible, HOverC: GroundHOverCMin}, nil},
		{"viscous states plug in", PointFacts{CpMin: -2, HOverC: math.NaN(), Viscous: &ViscousFacts{PastClMax: true, NotConverged: true, Separated: true}}, []FlagKind{FlagSeparated, FlagPastClMax, FlagNotConverged}},
		{"transition held", PointFacts{CpMin: -2, HOverC: math.NaN(), Viscous: &ViscousFacts{TransitionHeld: true}}, []FlagKind{FlagHeld}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Plausibility(tc.f)
			if len(got) != len(tc.want) {
				t.Fatalf("flags %v, want %v", got, tc.want)
			}
			for i, f := range got {
				if f.Kind != tc.want[i] || f.Message == "" {
					t.Errorf("flag %d = %+v, want kind %q with a message", i, f, tc.want[i])
				}
			}
		})
	}
}
