package solver

import (
	"encoding/json"
	"math"
	"os"
	"testing"
)

// ladsonGrit is one grit size's polar in testdata/validation/naca0012-ladson.json.
type ladsonGrit struct {
	AlphaDeg []float64 `json:"alpha_deg"`
	Cl       []float64 `json:"cl"`
	Cd       []float64 `json:"cd"`
}

// ladsonPolars reads Ladson's NACA 0012 data (NASA TM-4074, 1988; see
// testdata/validation/README.md) by grit size.
func ladsonPolars(t *testing.T) map[string]ladsonGrit {
	t.Helper()
	b, err := os.ReadFile("../testdata/validation/naca0012-ladson.json")
	if err != nil {
		t.Fatal(err)
	}
	var d map[string]json.RawMessage
	if err := json.Unmarshal(b, &d); err != nil {
		t.Fatal(err)
	}
	out := map[string]ladsonGrit{}
	for _, g := range []string{"grit_80", "grit_120", "grit_180"} {
		var p ladsonGrit
		if err := json.Unmarshal(d[g], &p); err != nil {
			t.Fatalf("%s: %v", g, err)
		}
		out[g] = p
	}
	return out
}

// cdNear returns the measured Cd at the tabulated angle nearest alphaDeg.
func (p ladsonGrit) cdNear(alphaDeg float64) (alpha, cd float64) {
	best := math.Inf(1)
	for i, a := range p.AlphaDeg {
		if d := math.Abs(a - alphaDeg); d < best {
			best, alpha, cd = d, a, p.Cd[i]
		}
	}
	return alpha, cd
}

// TestNACA0012DragTripped: NACA 0012 at Re 6e6, α = 4.04°, the boundary
// layer tripped at 5 % chord on both surfaces (the grit's position is from
// memory), against Ladson's measured Cd 0.00823 with 80 grit (NASA TM-4074,
// 1988; testdata/validation). The tolerance is the source's: the three grit
// sizes near 4° measured 0.00814–0.00879, a spread of ± 4 % about their
// mean, and the trip position is not known better than the grit's; twice
// that spread, ± 8 %, is allowed. A Squire–Young or Head error of a tenth
// (a wrong exponent or skin-friction law) falls outside it.
func TestNACA0012DragTripped(t *testing.T) {
	polars := ladsonPolars(t)
	alpha, want := polars["grit_80"].cdNear(4.04)
	if alpha != 4.04 || want != 0.00823 {
		t.Fatalf("testdata: α %g, Cd %g; NASA TM-4074 tabulates 4.04°, 0.00823", alpha, want)
	}
	lo, hi := math.Inf(1), 0.0
	for _, p := range polars {
		_, cd := p.cdNear(4.04)
		lo, hi = math.Min(lo, cd), math.Max(hi, cd)
	}
	const tol = 0.08
	if spread := (hi - lo) / (hi + lo); math.Abs(2*spread-tol) > 0.005 {
		t.Fatalf("grit spread ± %.1f %%: the tolerance %g is twice it", 100*spread, tol)
	}
	v := viscousAt(t, nacaSystem(t, "0012"), alpha, 6e6, 0.05)
	for _, s := range []SurfaceBL{v.Elements[0].Upper, v.Elements[0].Lower} {
		if s.TransitionCause != TransitionTrip || s.TransitionXC != 0.05 {
			t.Errorf("transition %q at x/c %g, want the trip at 0.05", s.TransitionCause, s.TransitionXC)
		}
	}
	if d := relErr(v.Cd, want); d > tol {
		t.Errorf("Cd %.5f, Ladson %.5f (%.1f %% off, ± %.0f %% allowed)", v.Cd, want, 100*d, 100*tol)
	}
	recordReadme(t, "naca0012-tripped", "Cd %.5f", v.Cd)
}

// TestNACA0012DragFree: the smooth NACA 0012 at Re 6e6 and α = 0 with
// free transition (Michel's criterion). Abbott & von Doenhoff (Theory of
// Wing Sections, 1959, App. IV) give c_d ≈ 0.0055–0.0065 for the smooth
// section at Re 3–9 × 10⁶ (from memory); ± 5 % is added for a tunnel's
// uncertainty in drag (testdata/validation/README.md). Natural transition
// on the smooth section lies in the first half of the chord, aft of the
// suction peak (from memory): x/c 0.2–0.6 is asserted, so a layer tripped
// early, or one that never becomes turbulent, fails here even when its
// drag happens to fall in the band. Both surfaces must agree (symmetry).
func TestNACA0012DragFree(t *testing.T) {
	v := viscousAt(t, nacaSystem(t, "0012"), 0, 6e6, 0)
	e := v.Elements[0]
	if !(v.Cd >= 0.95*0.0055 && v.Cd <= 1.05*0.0065) {
		t.Errorf("Cd %.5f, want 0.0055–0.0065 ± 5 %%", v.Cd)
	}
	for _, s := range []SurfaceBL{e.Upper, e.Lower} {
		if s.TransitionCause == TransitionTrip || !(s.TransitionXC >= 0.2 && s.TransitionXC <= 0.6) {
			t.Errorf("transition %q at x/c %.3f, want natural transition within 0.2–0.6", s.TransitionCause, s.TransitionXC)
		}
	}
	if relErr(e.Upper.Cd, e.Lower.Cd) > 0.01 || math.Abs(e.Upper.TransitionXC-e.Lower.TransitionXC) > 0.01 {
		t.Errorf("α = 0: upper Cd %g, transition %g; lower %g, %g", e.Upper.Cd, e.Upper.TransitionXC, e.Lower.Cd, e.Lower.TransitionXC)
	}
	recordReadme(t, "naca0012-free", "Cd %.5f, transition x/c %.2f", v.Cd, e.Upper.TransitionXC)
}
