package engine

import (
	"context"
	"math"
	"slices"
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

// TestPointFlagsAsSolve: a map's point carries the plausibility flags
// `solve` raises at its setting (Result.Flags), not the ground's alone:
// the two-element example's inviscid suction peak (Cp about −11.6 at
// 100 mm, beyond model.CpMinPlausible) was flagged by solve and a sweep's
// row, and "none" on the map; and a coupled point that converged with
// transition held upstream carries the held flag, as a sweep's row does.
func TestPointFlagsAsSolve(t *testing.T) {
	st, secs := exampleStudy(t, "two-element-ground.json")
	st.Viscous.Enabled = false
	ranges := []model.SetupRange{mustRange(t, "clearance_mm=20:100:80")}
	pts, err := Map(context.Background(), st, secs, ranges, MapOptions{PointOptions: PointOptions{Inviscid: true}}, nil, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range pts {
		one := st.Clone()
		one.Ground.ClearanceMM = p.Values[0]
		want := run(t, NewEngine(), one, secs, false).Flags()
		if !slices.Equal(p.Flags, want) {
			t.Errorf("%g mm: map flags %v, solve's %v", p.Values[0], p.Flags, want)
		}
		if !slices.ContainsFunc(p.Flags, func(f model.Flag) bool { return f.Kind == model.FlagSuction }) {
			t.Errorf("%g mm: flags %v lack the suction peak's", p.Values[0], p.Flags)
		}
	}

	// A converged coupled answer with transition held on the main
	// element's lower surface (made up: a coupled map costs minutes).
	res := run(t, NewEngine(), st, secs, false)
	nan := math.NaN()
	res.Coupled = &CoupledPoint{Converged: true, Cl: -3, Cd: 0.02, Elements: []CoupledElementPoint{
		{Name: "main", Cl: -2, SeparationUpper: nan, SeparationLower: nan, HeldLower: true, CpMin: -5},
		{Name: "flap", Cl: -1, SeparationUpper: nan, SeparationLower: nan, CpMin: -3},
	}}
	var p Point
	p.fill(res, st, secs)
	if !slices.ContainsFunc(p.Flags, func(f model.Flag) bool { return f.Kind == model.FlagHeld }) ||
		slices.ContainsFunc(p.Flags, func(f model.Flag) bool { return f.Kind == model.FlagSuction }) {
		t.Errorf("held coupled point: flags %v, want the held one and no suction (its own peak is −5)", p.Flags)
	}
	p.fill(nil, st, secs)
	if p.Flags != nil {
		t.Errorf("a point without a result keeps flags %v", p.Flags)
	}
}
