package solver

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"sectionbench/model"
)

// plateElement returns a zero-thickness "element" of the given chord with n
// panels per side: Vt = −1 on the upper side (nodes running from the
// trailing edge to the leading edge) and +1 on the lower side, stagnation
// at the leading edge. Each side is a flat plate (Ue = U∞).
func plateElement(name string, chord float64, n int) ElementSolution {
	h := chord / float64(n)
	e := ElementSolution{Name: name, Chord: chord, Stagnation: Stagnation{S: chord}}
	for i := range 2 * n {
		p := Panel{S: (float64(i) + 0.5) * h, Vt: 1, Side: Lower}
		if i < n {
			p.Vt, p.Side = -1, Upper
			p.XC = 1 - p.S/chord
		} else {
			p.XC = p.S/chord - 1
		}
		e.Panels = append(e.Panels, p)
	}
	return e
}

// TestViscousSplitsAtStagnation runs two plate elements: each surface must
// match Thwaites' closed form θ² = 0.45/Re (s − 5s₀/6) for Ue = 1 behind a
// linear ramp over the first half panel, and the configuration drag must
// be Σ Cd_e c_e / c_ref.
func TestViscousSplitsAtStagnation(t *testing.T) {
	const n, re = 500, 2e5
	sol := &Solution{RefChord: 1, Elements: []ElementSolution{plateElement("main", 1, n), plateElement("flap", 0.4, n)}}
	res, err := sol.Viscous(ViscousOptions{Re: []float64{re, 0.4 * re}})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Elements) != 2 || res.Elements[0].Name != "main" || res.Elements[1].Name != "flap" {
		t.Fatalf("elements %+v", res.Elements)
	}
	sum := 0.0
	for k, e := range res.Elements {
		if !e.Valid {
			t.Fatalf("%s: not valid", e.Name)
		}
		for _, bl := range []SurfaceBL{e.Upper, e.Lower} {
			s0 := bl.S[0]
			if math.Abs(s0-0.5/n) > 1e-12 {
				t.Errorf("%s: first station at s = %g, want half a panel", e.Name, s0)
			}
			for i, s := range bl.S {
				if i > 0 && !(s > bl.S[i-1]) {
					t.Fatalf("%s: s not increasing at %d", e.Name, i)
				}
				if want := math.Sqrt(0.45 / (re * []float64{1, 0.4}[k]) * (s - 5*s0/6)); relErr(bl.Theta[i], want) > 1e-9 {
					t.Fatalf("%s: θ(%g) = %g, want %g", e.Name, s, bl.Theta[i], want)
				}
			}
			if last := bl.XC[len(bl.XC)-1]; last > TrailingEdgeCutXC || last < TrailingEdgeCutXC-2.0/n {
				t.Errorf("%s: last station at x/c %g, want just ahead of %g", e.Name, last, TrailingEdgeCutXC)
			}
		}
		if math.Abs(e.Cd-(e.Upper.Cd+e.Lower.Cd)) > 1e-15 || relErr(e.Upper.Cd, e.Lower.Cd) > 1e-12 {
			t.Errorf("%s: Cd %g, upper %g, lower %g", e.Name, e.Cd, e.Upper.Cd, e.Lower.Cd)
		}
		sum += e.Cd * []float64{1, 0.4}[k]
	}
	if relErr(res.Cd, sum) > 1e-12 {
		t.Errorf("configuration Cd %g, want %g", res.Cd, sum)
	}
	if len(res.Notes) == 0 || !strings.Contains(res.Notes[0], "displacement") {
		t.Errorf("notes %q lack the method caution", res.Notes)
	}
}

func TestViscousErrors(t *testing.T) {
	sol := &Solution{RefChord: 1, Elements: []ElementSolution{plateElement("main", 1, 20)}}
	_, err := sol.Viscous(ViscousOptions{Re: []float64{-1}})
	var be *BLError
	if !errors.As(err, &be) || be.Element != "main" || be.Surface != "upper" || be.Field != "Re" || !errors.Is(err, ErrBLInput) {
		t.Errorf("error %v (%+v), want a BLError on main/upper/Re", err, be)
	}
	defer func() {
		if recover() == nil {
			t.Error("no panic for a Reynolds list of the wrong length")
		}
	}()
	sol.Viscous(ViscousOptions{Re: []float64{1e6, 1e6}})
}

// nacaSystem builds a NACA section repanelled with 200 cosine-spaced panels
// on a unit chord (Kuethe & Chow spacing, docs/validation.md §7).
func nacaSystem(t *testing.T, digits string) *System {
	t.Helper()
	return nacaPanels(t, digits, 200)
}

func nacaPanels(t *testing.T, digits string, panels int) *System {
	t.Helper()
	sys, err := nacaSystemErr(digits, panels)
	if err != nil {
		t.Fatal(err)
	}
	return sys
}

func nacaSystemErr(digits string, panels int) (*System, error) {
	base, err := model.NACA(digits, model.NACAOptions{})
	if err != nil {
		return nil, err
	}
	sec, err := model.Repanel(base, model.Panelling{Panels: panels, Spacing: model.SpacingCosine})
	if err != nil {
		return nil, err
	}
	return NewSystem(Config{
		Elements:  []Element{{Name: "NACA " + digits, Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}},
		RefChord:  1,
		MomentRef: model.Point{X: 0.25},
	})
}

func viscousAt(t *testing.T, sys *System, alpha, re, trip float64) *ViscousResult {
	t.Helper()
	res, err := sys.Solve(alpha).Viscous(ViscousOptions{Re: []float64{re}, TripUpper: trip, TripLower: trip})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// TestViscousTransitionMovesForward: as α rises the suction peak sharpens
// and upper-surface transition moves towards the leading edge (Abbott & von
// Doenhoff 1959, ch. 7: the low-drag range ends when it does).
func TestViscousTransitionMovesForward(t *testing.T) {
	sys := nacaSystem(t, "0012")
	prev := math.Inf(1)
	for _, a := range []float64{0, 2, 4, 6, 8} {
		x := viscousAt(t, sys, a, 6e6, 0).Elements[0].Upper.TransitionXC
		if !(x < prev) {
			t.Errorf("α = %g: upper transition at %.4f is not ahead of %.4f", a, x, prev)
		}
		prev = x
	}
}

// TestViscousCdFallsWithRe: with transition held near the leading edge the
// section drag falls as the Reynolds number rises (Abbott & von Doenhoff
// 1959, App. IV; Schlichting, Boundary-Layer Theory, fig. 21.2).
func TestViscousCdFallsWithRe(t *testing.T) {
	sys := nacaSystem(t, "2412")
	prev := math.Inf(1)
	for _, re := range []float64{5e5, 1e6, 3e6, 9e6} {
		cd := viscousAt(t, sys, 2, re, 0.05).Cd
		if !(cd < prev) {
			t.Errorf("Re = %g: Cd %.5f is not below %.5f", re, cd, prev)
		}
		prev = cd
	}
}

// TestViscousSeparationHighCamber: a highly cambered section at a high
// angle separates turbulently on its suction side well ahead of the
// trailing edge (Abbott & von Doenhoff 1959, App. IV: NACA 6412 stalls from
// the trailing edge), and the estimate refuses a drag number.
func TestViscousSeparationHighCamber(t *testing.T) {
	sys := nacaSystem(t, "6412")
	res := viscousAt(t, sys, 12, 3e6, 0)
	e := res.Elements[0]
	if !e.Upper.Separated || !(e.Upper.TurbulentSeparationXC < 0.95) {
		t.Fatalf("upper surface: separated %v at %g", e.Upper.Separated, e.Upper.TurbulentSeparationXC)
	}
	if e.Lower.Separated {
		t.Errorf("pressure side separated at %g", e.Lower.TurbulentSeparationXC)
	}
	if e.Valid || !math.IsNaN(e.Cd) || !math.IsNaN(res.Cd) {
		t.Errorf("separated element reports Valid %v, Cd %g, configuration %g", e.Valid, e.Cd, res.Cd)
	}
	found := false
	for _, n := range res.Notes {
		found = found || strings.Contains(n, "turbulent separation")
	}
	if !found {
		t.Errorf("no separation note in %q", res.Notes)
	}
	// At a low angle the same section stays attached.
	if low := viscousAt(t, sys, 0, 3e6, 0); !low.Elements[0].Valid {
		t.Errorf("NACA 6412 at 0° separated at %g", low.Elements[0].Upper.TurbulentSeparationXC)
	}
	t.Logf("NACA 6412, Re 3e6, α = 12°: upper separation at x/c = %.3f", e.Upper.TurbulentSeparationXC)
}

// ExampleSolution_Viscous estimates the profile drag of NACA 0012 at 0°
// and Re = 6e6 with free transition; measured smooth-model drag is about
// 0.0055–0.0065 (Abbott & von Doenhoff 1959, App. IV; from memory).
func ExampleSolution_Viscous() {
	base, _ := model.NACA("0012", model.NACAOptions{})
	sec, _ := model.Repanel(base, model.Panelling{Panels: 200, Spacing: model.SpacingCosine})
	sys, err := NewSystem(Config{
		Elements: []Element{{Name: "main", Nodes: sec.Points(), LE: sec.LeadingEdgeIndex()}},
		RefChord: 1, MomentRef: model.Point{X: 0.25},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := sys.Solve(0).Viscous(ViscousOptions{Re: []float64{6e6}})
	if err != nil {
		fmt.Println(err)
		return
	}
	up := res.Elements[0].Upper
	fmt.Printf("Cd = %.4f, upper transition (%s) at x/c = %.2f\n", res.Cd, up.TransitionCause, up.TransitionXC)
	// Output:
	// Cd = 0.0061, upper transition (michel) at x/c = 0.28
}

func BenchmarkViscousNACA0012(b *testing.B) {
	sys, err := nacaSystemErr("0012", 200)
	if err != nil {
		b.Fatal(err)
	}
	sol := sys.Solve(4)
	opt := ViscousOptions{Re: []float64{6e6}}
	for b.Loop() {
		if _, err := sol.Viscous(opt); err != nil {
			b.Fatal(err)
		}
	}
}
