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

// A viscous result outside the Reynolds numbers the method is taken on
// trust for says so, once, with the number as a reader writes it.
func TestPlausibilityReynolds(t *testing.T) {
	for _, tc := range []struct {
		name string
		re   []float64
		want string // in the message; "" for no flag
	}{
		{"the team's range", []float64{3.7e5, 1.77e5}, ""},
		{"at the bounds", []float64{ReynoldsMinChecked, ReynoldsMaxChecked}, ""},
		{"a slip of the keyboard", []float64{10}, "Reynolds number 1 × 10¹ is outside 5 × 10⁴ to 5 × 10⁷"},
		{"a flap far below", []float64{3e5, 2.5e4}, "2.5 × 10⁴"},
		{"beyond", []float64{1e8}, "1 × 10⁸"},
		{"rounding up to the next power", []float64{9.9999e3}, "Reynolds number 1 × 10⁴ is outside"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			fl := Plausibility(PointFacts{CpMin: -2, HOverC: math.NaN(), Reynolds: tc.re})
			if tc.want == "" {
				if len(fl) != 0 {
					t.Errorf("flags %v, want none", fl)
				}
				return
			}
			if len(fl) != 1 || fl[0].Kind != FlagReynolds || !strings.Contains(fl[0].Message, tc.want) {
				t.Errorf("flags %v, want one %q saying %q", fl, FlagReynolds, tc.want)
			}
		})
	}
}

// TestGroundFlagSaysTheOneCaution: the flag of a result too near the
// ground gives the model's one near-ground caution (GroundCaution), which
// the app, the maps, the command line and the report give too; the five
// places worded it five ways, two of them wrong for the coupled viscous
// solution ("this model shows only the rise"), which shows the fall in 2-D.
func TestGroundFlagSaysTheOneCaution(t *testing.T) {
	fl := Plausibility(PointFacts{CpMin: -2, HOverC: 0.08})
	if len(fl) != 1 || fl[0].Kind != FlagGround {
		t.Fatalf("flags %+v, want the ground's", fl)
	}
	if !strings.Contains(fl[0].Message, "0.08 chords") || !strings.HasSuffix(fl[0].Message, GroundCaution()) {
		t.Errorf("message %q does not give the clearance and the caution %q", fl[0].Message, GroundCaution())
	}
	for _, words := range []string{"0.1 chords", "Zerihan & Zhang", "potential flow shows only the rise", "coupled viscous solution"} {
		if !strings.Contains(GroundCaution(), words) {
			t.Errorf("caution %q does not say %q", GroundCaution(), words)
		}
	}
	if s := GroundCautionSentence(); !strings.HasPrefix(s, "Real wings") || !strings.HasSuffix(s, "peaks.") {
		t.Errorf("sentence %q", s)
	}
}
