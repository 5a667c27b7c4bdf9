package model

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestPlaceFlapClosedForms(t *testing.T) {
	const tol = 1e-9
	main := StudyElement{Name: "main", ChordMM: 250}
	for _, tc := range []struct {
		name         string
		prevAngle    float64
		fp           FlapPlacement
		wantX, wantY float64
		wantAngle    float64
	}{
		// Main at 0°: its trailing edge is at (250, 0); the flap's leading
		// edge sits overlap upstream and gap below it.
		{"level main", 0, FlapPlacement{GapMM: 10, OverlapMM: 5, DeflectionDeg: 20}, 245, -10, 20},
		// Main nose-up 90°: the chord points straight down, so the trailing
		// edge is at (0, −250); "below the chord" is then +x... upstream
		// along the chord is +y.
		{"main at 90°", 90, FlapPlacement{GapMM: 10, OverlapMM: 5}, -10, -245, 90},
	} {
		t.Run(tc.name, func(t *testing.T) {
			m := main
			m.AngleDeg = tc.prevAngle
			f := PlaceFlap(m, StudyElement{Name: "flap", ChordMM: 100}, tc.fp)
			if math.Abs(f.XMM-tc.wantX) > tol || math.Abs(f.YMM-tc.wantY) > tol || math.Abs(f.AngleDeg-tc.wantAngle) > tol {
				t.Errorf("flap at (%g, %g) %g°, want (%g, %g) %g°", f.XMM, f.YMM, f.AngleDeg, tc.wantX, tc.wantY, tc.wantAngle)
			}
		})
	}
}

// Property: FlapPlacementOf inverts PlaceFlap for any placement.
func TestFlapPlacementRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for range 200 {
		prev := StudyElement{ChordMM: 100 + 300*rng.Float64(), XMM: 100 * rng.NormFloat64(), YMM: 100 * rng.NormFloat64(), AngleDeg: 40 * rng.NormFloat64()}
		fp := FlapPlacement{GapMM: 30 * rng.Float64(), OverlapMM: 40*rng.Float64() - 10, DeflectionDeg: 50 * rng.Float64()}
		got := FlapPlacementOf(prev, PlaceFlap(prev, StudyElement{ChordMM: 80}, fp))
		if math.Abs(got.GapMM-fp.GapMM) > 1e-9 || math.Abs(got.OverlapMM-fp.OverlapMM) > 1e-9 || math.Abs(got.DeflectionDeg-fp.DeflectionDeg) > 1e-9 {
			t.Fatalf("round trip %+v → %+v", fp, got)
		}
	}
}
