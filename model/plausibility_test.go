package model

import (
	"math"
	"strings"
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

// A separated coupled solution already carries the separation in its
// forces; the one-way estimate's lift is the inviscid one, which a
// separated wing does not reach. The two messages say so.
func TestPlausibilitySeparatedWording(t *testing.T) {
	for _, tc := range []struct {
		name        string
		coupled     bool
		want, avoid string
	}{
		{"coupled", true, "confirm by test", "not reached"},
		{"one-way estimate", false, "the inviscid one, is not reached", "least certain"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			fl := Plausibility(PointFacts{CpMin: -2, HOverC: math.NaN(), Viscous: &ViscousFacts{Separated: true, Coupled: tc.coupled}})
			if len(fl) != 1 || fl[0].Kind != FlagSeparated {
				t.Fatalf("flags %v, want one %q", fl, FlagSeparated)
			}
			if m := fl[0].Message; !strings.Contains(m, tc.want) || strings.Contains(m, tc.avoid) {
				t.Errorf("message %q: want %q in it, not %q", m, tc.want, tc.avoid)
			}
		})
	}
}
