package model_test

import (
	"context"
	"errors"
	"math"
	"testing"

	"sectionbench/model"
	"sectionbench/solver/engine"
)

// TestBlendCornersBehave sweeps the corners of every spacing law's
// parameter space (cosine, uniform and curvature have none; blend has
// nose and tail in [0, 1] with tail ≤ BlendTailPerNose × nose) on a
// symmetric and a cambered NACA section with a blunt trailing edge and a
// sharp-edged Kármán–Trefftz section, at 4°, from 40 to 1000 panels. Every
// setting offered keeps the suction peak at the nose (x/c < 0.5) and, from
// 160 panels on, within 15 % of the value cosine spacing converges to at
// 1000 panels (the spread of the offered laws at 160 panels; 40 panels
// leave the nose under-resolved). The corners outside the offered range
// are refused by name. (Nose 0, tail 1 used to give NACA 0012 a Cp min of
// −34.4 at x/c 0.9999 instead of −1.53.)
func TestBlendCornersBehave(t *testing.T) {
	if testing.Short() {
		t.Skip("solves 60 configurations")
	}
	settings := []model.Panelling{
		{Spacing: model.SpacingCosine},
		{Spacing: model.SpacingUniform},
		{Spacing: model.SpacingCurvature},
		{Spacing: model.SpacingBlend, Nose: 0, Tail: 0},
		{Spacing: model.SpacingBlend, Nose: 1, Tail: 0},
		{Spacing: model.SpacingBlend, Nose: 1, Tail: model.BlendTailPerNose},
		{Spacing: model.SpacingBlend, Nose: 0.5, Tail: 0.5 * model.BlendTailPerNose},
	}
	for _, spec := range []string{"naca:0012", "naca:4412", "kt:-0.1,0.1,10"} {
		sec, _, err := model.SectionFromSpec(spec, nil)
		if err != nil {
			t.Fatal(err)
		}
		solve := func(p model.Panelling) (*engine.Result, error) {
			st := model.NewStudy()
			st.Elements[0].Section = model.SectionSource{Spec: spec}
			st.Flow.AlphaDeg = 4
			st.Panelling = p
			return engine.NewEngine().Run(context.Background(), engine.Request{Study: st, Sections: []*model.Section{sec}})
		}
		ref, err := solve(model.Panelling{Panels: 1000, Spacing: model.SpacingCosine})
		if err != nil {
			t.Fatal(err)
		}
		want := ref.Solution.Elements[0].CpMin
		for _, p := range settings {
			for _, n := range []int{40, 160, 1000} {
				p.Panels = n
				res, err := solve(p)
				if err != nil {
					t.Errorf("%s %s nose %g tail %g, %d panels: %v", spec, p.Spacing, p.Nose, p.Tail, n, err)
					continue
				}
				got, x := res.Solution.Elements[0].CpMin, res.Solution.Elements[0].XCpMin
				if x >= 0.5 || n >= 160 && math.Abs(got-want) > 0.15*math.Abs(want) {
					t.Errorf("%s %s nose %g tail %g, %d panels: Cp min %.3f at x/c %.4f, want about %.3f at the nose", spec, p.Spacing, p.Nose, p.Tail, n, got, x, want)
				}
			}
		}
		for _, p := range []model.Panelling{
			{Panels: 160, Spacing: model.SpacingBlend, Nose: 0, Tail: 1},
			{Panels: 160, Spacing: model.SpacingBlend, Nose: 1, Tail: 1},
			{Panels: 160, Spacing: model.SpacingBlend, Nose: 0, Tail: 0.01},
		} {
			_, err := solve(p)
			var fe *model.FieldError
			if !errors.As(err, &fe) || fe.Field != "panelling.tail" {
				t.Errorf("%s blend nose %g tail %g: %v, want refused on panelling.tail", spec, p.Nose, p.Tail, err)
			}
		}
	}
}
