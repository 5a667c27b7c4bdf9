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
