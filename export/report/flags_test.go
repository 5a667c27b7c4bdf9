package report

import (
	"math"
	"strings"
	"testing"

	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
)

// TestReportFlagsSeparation: a wing whose boundary layer separates ahead
// of engine.SeparatedFromXC is flagged separated at the angle solved and
// in the sweep's marks, whether the one-way estimate says so (the lift
// shown is then the inviscid one) or the coupled solution does; the
// report states the flag in words on page 1 and under Warnings.
func TestReportFlagsSeparation(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Ground.ClearanceMM = 150 // clear of the ground flag
	res := solve(t, st)
	nan := math.NaN()

	t.Run("one-way estimate", func(t *testing.T) {
		r := *res
		v := &solver.ViscousResult{Cd: nan, Elements: make([]solver.ElementBL, len(res.Solution.Elements))}
		for i := range v.Elements {
			v.Elements[i].Upper.TurbulentSeparationXC, v.Elements[i].Lower.TurbulentSeparationXC = nan, nan
		}
		v.Elements[1].Upper.TurbulentSeparationXC = 0.6 // the flap's suction side
		r.Viscous = v
		r.SweepViscous = make([]engine.ViscousPoint, len(r.Sweep))
		for i := range r.SweepViscous {
			r.SweepViscous[i] = engine.ViscousPoint{Valid: true, Cd: 0.02, Separated: i == len(r.Sweep)-1}
		}
		w := &writer{in: Input{Study: st, Result: &r}}
		if words := model.FlagWords(w.flags()); !strings.Contains(words, string(model.FlagSeparated)) {
			t.Errorf("flags at the angle solved %q lack %q", words, model.FlagSeparated)
		}
		last := len(r.Sweep) - 1
		first, lastWords := model.FlagWords(w.sweepFlags(0)), model.FlagWords(w.sweepFlags(last))
		if !strings.Contains(lastWords, string(model.FlagSeparated)) || strings.Contains(first, string(model.FlagSeparated)) {
			t.Errorf("sweep marks: first row %q, last row %q; want separated on the last only", first, lastWords)
		}
		text := pdfText(t, Input{Study: st, Result: &r})
		for _, want := range []string{"plausibility (separated)", "separates well ahead of the trailing edge", "separated ahead of x/c 0.9"} {
			if !strings.Contains(text, want) {
				t.Errorf("report lacks %q", want)
			}
		}
	})

	t.Run("coupled", func(t *testing.T) {
		r := *res
		el := []engine.CoupledElementPoint{{SeparationUpper: nan, SeparationLower: nan}, {SeparationUpper: 0.6, SeparationLower: nan}}
		r.Coupled = &engine.CoupledPoint{Converged: true, Cl: res.Solution.Cl * 0.8, Cd: 0.03, Cm: res.Solution.Cm, Elements: el}
		c := CoupledFrom(st, &r)
		if !c.PointSeparated {
			t.Fatal("CoupledFrom: the point is not marked separated")
		}
		w := &writer{in: Input{Study: st, Result: &r, Coupled: c}}
		if words := model.FlagWords(w.flags()); !strings.Contains(words, string(model.FlagSeparated)) {
			t.Errorf("flags at the angle solved %q lack %q", words, model.FlagSeparated)
		}
	})
}

// A Reynolds number outside the range the boundary layers are taken on
// trust for is flagged on the report, with the coupled solution as with
// the one-way estimate (model.ReynoldsMinChecked).
func TestReportFlagsReynolds(t *testing.T) {
	st := demoStudy()
	st.Viscous.Enabled = false
	st.Ground.ClearanceMM = 150 // clear of the ground flag
	res := solve(t, st)
	for _, tc := range []struct {
		name    string
		re      float64
		coupled bool
		want    bool
	}{
		{"coupled, 2e4", 2e4, true, true},
		{"coupled, 3e5", 3e5, true, false},
		{"estimate, 2e4", 2e4, false, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := *res
			r.Reynolds = make([]float64, len(res.Solution.Elements))
			for i := range r.Reynolds {
				r.Reynolds[i] = tc.re
			}
			in := Input{Study: st, Result: &r}
			if tc.coupled {
				in.Coupled = &Coupled{Converged: true, Iterations: 9, Cl: res.Solution.Cl, Cd: 0.02, ClMax: math.NaN(), AlphaClMaxDeg: math.NaN(), PointCpMin: math.NaN()}
			} else {
				r.Viscous = &solver.ViscousResult{Cd: 0.02, Elements: make([]solver.ElementBL, len(res.Solution.Elements))}
				for i := range r.Viscous.Elements {
					r.Viscous.Elements[i].Upper.TurbulentSeparationXC, r.Viscous.Elements[i].Lower.TurbulentSeparationXC = math.NaN(), math.NaN()
				}
			}
			w := &writer{in: in}
			if got := strings.Contains(model.FlagWords(w.flags()), string(model.FlagReynolds)); got != tc.want {
				t.Errorf("flags %q: %q present %v, want %v", model.FlagWords(w.flags()), model.FlagReynolds, got, tc.want)
			}
		})
	}
}

// TestGroundWordsAreTheModels: the report's footnote for a row too near
// the ground gives the model's one near-ground caution
// (model.GroundCaution), as the app, the maps and the command line do; it
// said "potential flow shows only the rise" also of the coupled solution.
func TestGroundWordsAreTheModels(t *testing.T) {
	if m := flagMeaning[model.FlagGround]; !strings.Contains(m, model.GroundCaution()) {
		t.Errorf("footnote %q does not give %q", m, model.GroundCaution())
	}
}
