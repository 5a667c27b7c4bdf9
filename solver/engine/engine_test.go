package engine

import (
	"context"
	"errors"
	"math"
	"testing"

	"sectionbench/model"
)

func engineStudy(t testing.TB, code string) (*model.Study, []*model.Section) {
	t.Helper()
	st := model.NewStudy()
	st.Elements[0].Section = model.SectionSource{Spec: "naca:" + code}
	sec, _, err := model.SectionFromSpec("naca:"+code, nil)
	if err != nil {
		t.Fatal(err)
	}
	return st, []*model.Section{sec}
}

func run(t *testing.T, e *Engine, st *model.Study, secs []*model.Section, sweep bool) *Result {
	t.Helper()
	res, err := e.Run(context.Background(), Request{Study: st, Sections: secs, Sweep: sweep})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// Only the angle changed: the engine keeps its factorised system.
func TestEngineReusesFactorisation(t *testing.T) {
	st, secs := engineStudy(t, "2412")
	e := NewEngine()
	run(t, e, st, secs, false)
	sys := e.sys
	st.Flow.AlphaDeg = 7
	r := run(t, e, st, secs, false)
	if e.sys != sys {
		t.Error("a new system was factorised for an angle change")
	}
	if r.Solution.AlphaDeg != 7 {
		t.Errorf("solution at %g°, want 7°", r.Solution.AlphaDeg)
	}
	st.Panelling.Panels = 100
	run(t, e, st, secs, false)
	if e.sys == sys {
		t.Error("the panel count changed but the old system was kept")
	}
}

// The sweep by superposition equals one solve per angle.
func TestEngineSweepMatchesSolves(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	st.Sweep = model.SweepRange{FromDeg: -4, ToDeg: 8, StepDeg: 4}
	e := NewEngine()
	r := run(t, e, st, secs, true)
	if len(r.Sweep) != 4 {
		t.Fatalf("%d rows, want 4", len(r.Sweep))
	}
	for _, row := range r.Sweep {
		st.Flow.AlphaDeg = row.AlphaDeg
		one := run(t, NewEngine(), st, secs, false).Solution
		if math.Abs(one.Cl-row.Cl) > 1e-12 || math.Abs(one.Cm-row.Cm) > 1e-12 {
			t.Errorf("α = %g: sweep Cl %.12f Cm %.12f, solve Cl %.12f Cm %.12f", row.AlphaDeg, row.Cl, row.Cm, one.Cl, one.Cm)
		}
	}
}

// Inverted mounting is the mirror image: Cl and Cm change sign exactly
// (in free air, where nothing breaks the mirror symmetry).
func TestEngineInvertedMirror(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	up := run(t, NewEngine(), st, secs, false).Solution
	st.Inverted = true
	inv := run(t, NewEngine(), st, secs, false).Solution
	if math.Abs(up.Cl+inv.Cl) > 1e-10 || math.Abs(up.Cm+inv.Cm) > 1e-10 {
		t.Errorf("upright Cl %g Cm %g, inverted Cl %g Cm %g: want opposite signs", up.Cl, up.Cm, inv.Cl, inv.Cm)
	}
	if up.Elements[0].CpMin-inv.Elements[0].CpMin > 1e-10 {
		t.Errorf("min Cp %g upright, %g inverted", up.Elements[0].CpMin, inv.Elements[0].CpMin)
	}
}

// Forces follow L' = ½ρV² c Cl with the US Standard Atmosphere 1976 sea
// level density 1.2250 kg/m³ (closed form).
func TestEngineForces(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	st.Elements[0].ChordMM = 250
	st.Flow.SpeedMPS = 100 / 3.6 // 100 km/h
	st.Inverted = true
	r := run(t, NewEngine(), st, secs, false)
	f := r.Forces
	if f == nil {
		t.Fatal("no forces with a speed")
	}
	q := 0.5 * 1.2250 * st.Flow.SpeedMPS * st.Flow.SpeedMPS
	if math.Abs(f.DynamicPressurePa-q)/q > 1e-4 {
		t.Errorf("q = %g Pa, want %g", f.DynamicPressurePa, q)
	}
	want := q * 0.25 * r.Solution.Cl
	if math.Abs(f.LiftPerSpan-want) > 1e-3*math.Abs(want) || f.DownforcePerSpan != -f.LiftPerSpan {
		t.Errorf("lift %g N/m, downforce %g N/m, want lift %g", f.LiftPerSpan, f.DownforcePerSpan, want)
	}
	if f.DownforcePerSpan <= 0 {
		t.Errorf("an inverted cambered section at +4° gives downforce %g N/m, want positive", f.DownforcePerSpan)
	}
	// Re = ρVc/μ with μ = 1.7894e-5 Pa·s (US Standard Atmosphere 1976).
	wantRe := 1.2250 * st.Flow.SpeedMPS * 0.25 / 1.7894e-5
	if math.Abs(r.Reynolds[0]-wantRe)/wantRe > 1e-3 {
		t.Errorf("Re = %g, want %g", r.Reynolds[0], wantRe)
	}
}

// In ground effect the engine solves the pitched configuration over the
// ground; a large clearance tends to free air.
func TestEngineGroundTendsToFreeAir(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	st.Inverted = true
	free := run(t, NewEngine(), st, secs, false).Solution.Cl
	prev := 0.0
	for _, h := range []float64{25, 50, 100, 250, 1000, 10000} {
		st.Ground = model.Ground{Enabled: true, ClearanceMM: h}
		cl := run(t, NewEngine(), st, secs, false).Solution.Cl
		// Downforce (−Cl) rises monotonically as clearance falls (common
		// practice; Zerihan & Zhang, J. Aircraft 37(6), 2000, show the rise
		// in experiments down to about h/c = 0.1).
		if prev != 0 && -cl > -prev {
			t.Errorf("h = %g mm: downforce %g rose above %g at a lower height", h, -cl, -prev)
		}
		prev = cl
	}
	// The force (pressure or vortex force) tends to free air as 1/h: the
	// image vortex adds Γ/(4πh) to the onset speed, a relative change of
	// about |Cl| c/(4πh) in lift (0.2% at 40 chords; derived).
	if d := math.Abs(prev-free) / math.Abs(free); d > 0.003 {
		t.Errorf("at h = 40 chords Cl = %g, free air %g (%.2f %% apart)", prev, free, 100*d)
	}
}

func TestEngineErrors(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	st.Viscous.Enabled = true // no speed, no Reynolds number
	_, err := NewEngine().Run(context.Background(), Request{Study: st, Sections: secs})
	var fe *model.FieldError
	if !errors.As(err, &fe) || fe.Field != "flow.speed_mps" {
		t.Errorf("boundary layer without a speed: %v, want a FieldError on flow.speed_mps", err)
	}
	st, secs = engineStudy(t, "4412")
	st.Ground = model.Ground{Enabled: true, ClearanceMM: 50}
	st.Viscous = model.Viscous{Enabled: true}
	st.Flow.Reynolds = 5e5
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := NewEngine().Run(ctx, Request{Study: st, Sections: secs, Sweep: true}); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled sweep: %v, want context.Canceled", err)
	}
}

func TestCheckFinite(t *testing.T) {
	st, secs := engineStudy(t, "0012")
	sol := run(t, NewEngine(), st, secs, false).Solution
	if err := checkFinite(sol); err != nil {
		t.Fatalf("a good solution: %v", err)
	}
	sol.Elements[0].Panels[7].Cp = math.NaN()
	if err := checkFinite(sol); !errors.Is(err, ErrNonFiniteResult) {
		t.Errorf("NaN Cp: %v, want ErrNonFiniteResult", err)
	}
}

// A main element and flap (the invented rear-wing example's geometry, in
// free air and in ground effect) converge with panel count at about second
// order, as a lone section does (docs/validation.md §7, derived: linear-vortex
// panels clustered at both edges).
func TestTwoElementConvergence(t *testing.T) {
	st := model.NewStudy()
	st.Elements = []model.StudyElement{
		{Name: "main", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 250},
		{Name: "flap", Section: model.SectionSource{Spec: "naca:4412"}, ChordMM: 120},
	}
	st.Elements[1] = model.PlaceFlap(st.Elements[0], st.Elements[1], model.FlapPlacement{GapMM: 5, OverlapMM: 2.5, DeflectionDeg: 15})
	sec, _, err := model.SectionFromSpec("naca:4412", nil)
	if err != nil {
		t.Fatal(err)
	}
	secs := []*model.Section{sec, sec}
	for _, tc := range []struct {
		name     string
		ground   bool
		minOrder float64
	}{
		{"free air", false, 1.5},
		{"inverted over the ground", true, 1.5},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st.SetInverted(tc.ground) // positions are as mounted: turning the wing over mirrors them
			st.Ground = model.Ground{Enabled: tc.ground, ClearanceMM: 150}
			var cl []float64
			for _, n := range []int{80, 160, 320} {
				st.Panelling = model.Panelling{Panels: n, Spacing: model.SpacingCosine}
				cl = append(cl, run(t, NewEngine(), st, secs, false).Solution.Cl)
			}
			p, ok := ObservedOrder(cl[0], cl[1], cl[2], 2)
			t.Logf("Cl at 80, 160, 320 panels: %.6f %.6f %.6f; observed order %.2f", cl[0], cl[1], cl[2], p)
			if !ok || p < tc.minOrder {
				t.Errorf("observed order %.2f (ok %v), want ≥ %.1f", p, ok, tc.minOrder)
			}
		})
	}
}

// BenchmarkDensityStudyDefault: the default density study (20 to 640
// panels) of NACA 2412 at 4°, the whole job the density window runs.
func BenchmarkDensityStudyDefault(b *testing.B) {
	st := model.NewStudy()
	st.Elements[0].Section = model.SectionSource{Spec: "naca:2412"}
	sec, _, err := model.SectionFromSpec("naca:2412", nil)
	if err != nil {
		b.Fatal(err)
	}
	secs := []*model.Section{sec}
	for b.Loop() {
		if _, err := NewEngine().Density(context.Background(), st, secs, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// A new section under an unchanged study is a new geometry: the engine
// compares sections by identity and holds the ones it placed.
func TestEngineNewSectionSameStudy(t *testing.T) {
	st, secs := engineStudy(t, "0012")
	e := NewEngine()
	a := run(t, e, st, secs, false).Solution.Cl
	other, _, err := model.SectionFromSpec("naca:4412", nil)
	if err != nil {
		t.Fatal(err)
	}
	b := run(t, e, st, []*model.Section{other}, false).Solution.Cl
	if a == b {
		t.Errorf("Cl %g for both sections: the cached geometry was reused", a)
	}
}

// The study's separation threshold reaches the boundary layer: a more
// permissive H moves turbulent separation aft or removes it.
func TestEngineSeparationThreshold(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	st.Flow.Reynolds = 3e5
	st.Flow.AlphaDeg = 8
	st.Viscous.Enabled, st.Viscous.Mode = true, model.ViscousEstimate
	sepAt := func(h float64) float64 {
		st.Viscous.SeparationH = h
		v := run(t, NewEngine(), st, secs, false).Viscous
		x := v.Elements[0].Upper.TurbulentSeparationXC
		if math.IsNaN(x) {
			return 1
		}
		return x
	}
	strict, lax := sepAt(2.0), sepAt(3.0)
	if !(lax > strict) {
		t.Errorf("separation at x/c %g with H = 2.0 and %g with H = 3.0: want it later with the larger threshold", strict, lax)
	}
}

// A cancelled context stops a run before its factorisation, and the
// engine still answers the next run (its cache stays consistent).
func TestEngineCancelledRun(t *testing.T) {
	st, secs := engineStudy(t, "4412")
	e := NewEngine()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := e.Run(ctx, Request{Study: st, Sections: secs}); !errors.Is(err, context.Canceled) {
		t.Fatalf("cancelled run: %v, want context.Canceled", err)
	}
	if r := run(t, e, st, secs, false); r.Solution == nil {
		t.Fatal("no solution after a cancelled run")
	}
}
