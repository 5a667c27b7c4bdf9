package model

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

func TestParseSetupVariable(t *testing.T) {
	for _, tc := range []struct {
		name string
		want SetupVariable
	}{
		{"alpha_deg", SetupVariable{Kind: SetupAlpha}},
		{"clearance_mm", SetupVariable{Kind: SetupClearance}},
		{" speed_mps ", SetupVariable{Kind: SetupSpeed}},
		{"elements[1].deflection_deg", SetupVariable{Kind: SetupDeflection, Element: 1}},
		{"elements[2].gap_mm", SetupVariable{Kind: SetupGap, Element: 2}},
		{"elements[4].overlap_mm", SetupVariable{Kind: SetupOverlap, Element: 4}},
		{"elements[0].gap_mm", SetupVariable{Kind: SetupGap, Element: 0}}, // read; CheckSetup refuses it
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, err := ParseSetupVariable(tc.name)
			if err != nil {
				t.Fatal(err)
			}
			if got != tc.want {
				t.Fatalf("got %+v, want %+v", got, tc.want)
			}
			if got.Name() != strings.TrimSpace(tc.name) {
				t.Errorf("Name() = %q, want %q", got.Name(), strings.TrimSpace(tc.name))
			}
		})
	}
	for _, bad := range []string{"", "alpha", "deflection_deg", "elements[1].chord_mm", "elements[-1].gap_mm", "elements[01].gap_mm", "elements[x].gap_mm", "elements[1]gap_mm", "elements[1].alpha_deg"} {
		t.Run("bad "+bad, func(t *testing.T) {
			_, err := ParseSetupVariable(bad)
			var se *SetupError
			if !errors.As(err, &se) || !errors.Is(err, ErrUnknownVariable) || se.Variable != bad {
				t.Fatalf("err = %v, want a SetupError naming %q wrapping ErrUnknownVariable", err, bad)
			}
		})
	}
}

func TestParseSetupRange(t *testing.T) {
	r, err := ParseSetupRange("alpha_deg=0:1:0.1")
	if err != nil {
		t.Fatal(err)
	}
	if v := r.Values(); len(v) != 11 || v[3] != 0.3 || v[10] != 1 {
		t.Errorf("0:1:0.1 gives %v, want the 11 decimals 0, 0.1, …, 1", v)
	}
	b, err := ParseSetupBounds("elements[1].deflection_deg=10:30")
	if err != nil {
		t.Fatal(err)
	}
	if b.Var != (SetupVariable{Kind: SetupDeflection, Element: 1}) || b.From != 10 || b.To != 30 || b.Step != 0 {
		t.Errorf("bounds %+v", b)
	}
	for _, tc := range []struct {
		spec, variable string
		bounds         bool
		want           error
	}{
		{"alpha_deg", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=0:4", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=0:4:0", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=4:0:1", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=0:x:1", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=0:NaN:1", "alpha_deg", false, ErrSetupRange},
		{"alpha_deg=0:1000:1", "alpha_deg", false, ErrSetupRange},
		{"wing=0:4:1", "wing", false, ErrUnknownVariable},
		{"clearance_mm=40:40", "clearance_mm", true, ErrSetupRange},
		{"clearance_mm=40:60:5", "clearance_mm", true, ErrSetupRange},
	} {
		t.Run(tc.spec, func(t *testing.T) {
			parse := ParseSetupRange
			if tc.bounds {
				parse = ParseSetupBounds
			}
			_, err := parse(tc.spec)
			var se *SetupError
			if !errors.As(err, &se) || !errors.Is(err, tc.want) || se.Variable != tc.variable {
				t.Fatalf("err = %v, want a SetupError naming %q wrapping %v", err, tc.variable, tc.want)
			}
		})
	}
}

// setupStudy is the invented two-element wing of
// testdata/studies/rear-wing.json in ground effect, with its sections.
func setupStudy(t *testing.T) (*Study, []*Section) {
	t.Helper()
	st := NewStudy()
	st.Inverted = true
	st.Ground = Ground{Enabled: true, ClearanceMM: 100}
	st.Elements = []StudyElement{
		{Name: "main", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 250},
		{Name: "flap", Section: SectionSource{Spec: "naca:4412"}, ChordMM: 120},
	}
	secs := []*Section{mustNACA(t, "4412"), mustNACA(t, "4412")}
	if err := st.PlaceSlot(1, secs[1], Slot{GapMM: 10, OverlapMM: 2.5, DeflectionDeg: 15}); err != nil {
		t.Fatal(err)
	}
	return st, secs
}

func TestCheckSetup(t *testing.T) {
	st, _ := setupStudy(t)
	free := st.Clone()
	free.Ground.Enabled = false
	rng := func(spec string) SetupRange {
		r, err := ParseSetupRange(spec)
		if err != nil {
			t.Fatal(err)
		}
		return r
	}
	if err := st.CheckSetup([]SetupRange{rng("alpha_deg=0:4:1"), rng("elements[1].gap_mm=5:20:1")}); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name     string
		st       *Study
		ranges   []SetupRange
		variable string
		want     error
	}{
		{"main element's slot", st, []SetupRange{rng("elements[0].deflection_deg=0:10:1")}, "elements[0].deflection_deg", ErrNotInStudy},
		{"no such element", st, []SetupRange{rng("elements[2].gap_mm=5:10:1")}, "elements[2].gap_mm", ErrNotInStudy},
		{"clearance in free air", free, []SetupRange{rng("clearance_mm=20:100:10")}, "clearance_mm", ErrNotInStudy},
		{"twice", st, []SetupRange{rng("alpha_deg=0:4:1"), rng("alpha_deg=0:2:1")}, "alpha_deg", ErrRepeatedVar},
		{"too many points", st, []SetupRange{rng("alpha_deg=-10:10:0.1"), rng("clearance_mm=20:200:1")}, "clearance_mm", ErrSetupRange},
	} {
		t.Run(tc.name, func(t *testing.T) {
			err := tc.st.CheckSetup(tc.ranges)
			var se *SetupError
			if !errors.As(err, &se) || !errors.Is(err, tc.want) || se.Variable != tc.variable {
				t.Fatalf("err = %v, want a SetupError naming %q wrapping %v", err, tc.variable, tc.want)
			}
		})
	}
}

// TestApplySetup: each variable set through ApplySetup reads back through
// SetupValue (the slot's gap to the bisection's micrometre, common to
// PlaceSlot), and a slot change keeps the slot's other quantities.
func TestApplySetup(t *testing.T) {
	for _, tc := range []struct {
		name  string
		value float64
		tol   float64
	}{
		{"alpha_deg", 6.5, 0},
		{"clearance_mm", 42, 0},
		{"speed_mps", 31, 0},
		{"elements[1].deflection_deg", 22, 1e-9},
		{"elements[1].gap_mm", 7.5, 1e-3},
		{"elements[1].overlap_mm", -3, 1e-9},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st, secs := setupStudy(t)
			before := st.SlotOf(1, secs[1])
			v, err := ParseSetupVariable(tc.name)
			if err != nil {
				t.Fatal(err)
			}
			if err := st.ApplySetup(v, tc.value, secs); err != nil {
				t.Fatal(err)
			}
			if got := st.SetupValue(v, secs); math.Abs(got-tc.value) > tc.tol {
				t.Errorf("%s reads back %g, want %g ± %g", tc.name, got, tc.value, tc.tol)
			}
			after := st.SlotOf(1, secs[1])
			if v.Kind != SetupGap && math.Abs(after.GapMM-before.GapMM) > 1e-3 {
				t.Errorf("gap moved from %g to %g mm", before.GapMM, after.GapMM)
			}
			if v.Kind != SetupDeflection && math.Abs(after.DeflectionDeg-before.DeflectionDeg) > 1e-9 {
				t.Errorf("deflection moved from %g to %g°", before.DeflectionDeg, after.DeflectionDeg)
			}
		})
	}
	st, secs := setupStudy(t)
	for _, tc := range []struct {
		name  string
		value float64
		want  error
	}{
		{"speed_mps", 0, nil},
		{"elements[1].gap_mm", -50, ErrSlotGap},
		{"alpha_deg", math.Inf(1), ErrNonFinite},
	} {
		t.Run(fmt.Sprintf("refused %s=%g", tc.name, tc.value), func(t *testing.T) {
			v, _ := ParseSetupVariable(tc.name)
			before := st.Clone()
			err := st.ApplySetup(v, tc.value, secs)
			var se *SetupError
			if !errors.As(err, &se) || se.Variable != tc.name || (tc.want != nil && !errors.Is(err, tc.want)) {
				t.Fatalf("err = %v, want a SetupError naming %s", err, tc.name)
			}
			a, _ := before.Encode()
			b, _ := st.Encode()
			if string(a) != string(b) {
				t.Error("the study changed")
			}
		})
	}
}

func ExampleParseSetupRange() {
	r, err := ParseSetupRange("elements[1].deflection_deg=10:20:5")
	if err != nil {
		panic(err)
	}
	fmt.Println(r.Var.Name(), r.Values())
	_, err = ParseSetupRange("elements[1].gap_mm=5:1:1")
	fmt.Println(err)
	// Output:
	// elements[1].deflection_deg [10 15 20]
	// elements[1].gap_mm: bad range "5:1:1": 1 is below 5
}

// TestSetupVariableSetting: a setting in words, as pins and labels name
// it: the variable's words, the value to four significant digits with a
// true minus sign, and its unit.
func TestSetupVariableSetting(t *testing.T) {
	st := NewStudy()
	st.Elements = []StudyElement{{Name: "main"}, {Name: "flap"}}
	for _, tc := range []struct {
		name string
		v    SetupVariable
		x    float64
		want string
	}{
		{"flap deflection", SetupVariable{Kind: SetupDeflection, Element: 1}, 15, "flap deflection 15 °"},
		{"search's unrounded clearance", SetupVariable{Kind: SetupClearance}, 21.875000000000004, "ground clearance 21.88 mm"},
		{"negative angle", SetupVariable{Kind: SetupAlpha}, -2.5, "angle of attack −2.5 °"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.v.Setting(st, tc.x); got != tc.want {
				t.Errorf("Setting(%g) = %q, want %q", tc.x, got, tc.want)
			}
		})
	}
}
