package engine

import (
	"math"
	"testing"

	"sectionbench/model"
)

// TestPointNearGround: a map's point is marked too near the ground by the
// study's rule (model.Study.NearGround, below model.GroundHOverCMin of
// the main chord) only where it has an answer to doubt.
func TestPointNearGround(t *testing.T) {
	st := model.NewStudy()
	st.Elements = []model.StudyElement{{Name: "main", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 250}}
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 100}
	below := 0.5 * model.GroundHOverCMin * 250 // half the flagged clearance
	above := 2 * model.GroundHOverCMin * 250
	for _, tc := range []struct {
		name string
		p    Point
		want bool
	}{
		{"converged below", Point{Converged: true, ClearanceMM: below}, true},
		{"converged above", Point{Converged: true, ClearanceMM: above}, false},
		{"not converged below", Point{ClearanceMM: below}, false},
		{"error below", Point{Converged: true, Err: "cannot panel", ClearanceMM: below}, false},
		{"clearance unknown", Point{Converged: true, ClearanceMM: math.NaN()}, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.p.NearGround(st); got != tc.want {
				t.Errorf("NearGround = %v, want %v", got, tc.want)
			}
		})
	}
	free := *st
	free.Ground.Enabled = false
	if p := (Point{Converged: true, ClearanceMM: below}); p.NearGround(&free) {
		t.Error("marked near the ground in free air")
	}
}
