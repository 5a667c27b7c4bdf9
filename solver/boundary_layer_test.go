package solver

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// blStations returns n stations evenly spaced on [a, b] with Ue = u(s) and
// x/c = s.
func blStations(a, b float64, n int, u func(float64) float64) (s, ue, xc []float64) {
	s, ue, xc = make([]float64, n), make([]float64, n), make([]float64, n)
	for i := range n {
		s[i] = a + (b-a)*float64(i)/float64(n-1)
		ue[i], xc[i] = u(s[i]), s[i]
	}
	return s, ue, xc
}

// blAt returns field f linearly interpolated at s = x.
func blAt(bl SurfaceBL, f []float64, x float64) float64 {
	for i := 1; i < len(bl.S); i++ {
		if bl.S[i] >= x {
			t := (x - bl.S[i-1]) / (bl.S[i] - bl.S[i-1])
			return f[i-1] + t*(f[i]-f[i-1])
		}
	}
	return math.NaN()
}

func uniform(float64) float64 { return 1 }

// TestBLFlatPlateLaminar compares Thwaites' method on a flat plate
// (Ue = U∞) with its closed form θ = √(0.45 νx/U) = 0.671 √(νx/U) and with
// Blasius' solution θ = 0.664 √(νx/U), Cf = 0.664/√Re_x, one-side
// C_D = 1.328/√Re_L (Schlichting, Boundary-Layer Theory, ch. 7; White,
// Viscous Fluid Flow, sec. 4-3). H is compared with Blasius' 2.59 only:
// the code's own correlation constant (Cebeci–Bradshaw's 2.61 at λ = 0)
// would be no check.
func TestBLFlatPlateLaminar(t *testing.T) {
	const re = 1e5 // far below Michel's transition on a plate (Re_x ≈ 2.5e6)
	s, ue, xc := blStations(0, 1, 1001, uniform)
	bl, err := SolveSurface(s, ue, xc, BLOptions{Re: re})
	if err != nil {
		t.Fatal(err)
	}
	if bl.TransitionCause != TransitionNone || !math.IsNaN(bl.TransitionXC) {
		t.Fatalf("unexpected transition %q at %g", bl.TransitionCause, bl.TransitionXC)
	}
	for _, x := range []float64{0.05, 0.3, 1} {
		th := blAt(bl, bl.Theta, x)
		rex := re * x
		for _, c := range []struct {
			name      string
			got, want float64
			tol       float64
		}{
			{"θ vs Thwaites closed form 0.671√(νx/U)", th, math.Sqrt(0.45 * x / re), 1e-9},
			{"θ vs Blasius 0.664√(νx/U)", th, 0.664 * math.Sqrt(x/re), 0.015},
			{"Cf vs Blasius 0.664/√Re_x", blAt(bl, bl.Cf, x), 0.664 / math.Sqrt(rex), 0.02},
			{"H vs Blasius 2.59", blAt(bl, bl.H, x), 2.59, 0.01},
		} {
			if e := relErr(c.got, c.want); e > c.tol {
				t.Errorf("x = %g: %s: got %.6g, want %.6g (rel. %.3g > %.3g)", x, c.name, c.got, c.want, e, c.tol)
			}
		}
	}
	// Squire–Young on a plate (Ue = 1): Cd = 2θ_TE, against Blasius'
	// one-side drag 1.328/√Re (Schlichting).
	if e := relErr(bl.Cd, 1.328/math.Sqrt(re)); e > 0.015 {
		t.Errorf("Cd = %.5g, Blasius %.5g (rel. %.3g)", bl.Cd, 1.328/math.Sqrt(re), e)
	}
	recordReadme(t, "blasius", "%.3f, %.3f", blAt(bl, bl.Theta, 0.3)*math.Sqrt(re/0.3), blAt(bl, bl.Cf, 0.3)*math.Sqrt(0.3*re))
	t.Logf("flat plate Re=%g: θ(1)√Re = %.4f (Blasius 0.664), Cf√Re_x(0.3) = %.4f, Cd√Re = %.4f (Blasius 1.328)",
		re, bl.ThetaTE*math.Sqrt(re), blAt(bl, bl.Cf, 0.3)*math.Sqrt(0.3*re), bl.Cd*math.Sqrt(re))
}

// TestBLFlatPlateTurbulent trips the layer at the leading edge and compares
// with the 1/7-power-law plate: Cf = 0.0592 Re_x^(−0.2), one-side
// C_D = 0.074 Re_L^(−0.2) (Schlichting, Boundary-Layer Theory, ch. 21).
// The power law is itself a fit: Schlichting's other plate laws
// (Prandtl–Schlichting 0.455 (log₁₀ Re)^(−2.58), evaluated in the test)
// differ from it by 2 % at Re 10⁷, and the measured plate drag scatters
// about them by a few percent (from memory): 8 % is allowed. It was 15 %,
// which let a tenth off in Ludwieg–Tillmann's constant or Head's
// entrainment law through either way; now a tenth less friction fails
// (the estimate lies 3–6 % below the laws), a tenth more would still pass
// here alone.
func TestBLFlatPlateTurbulent(t *testing.T) {
	const re, turbulentPlateTol = 1e7, 0.08
	s, ue, xc := blStations(0, 1, 1001, uniform)
	bl, err := SolveSurface(s, ue, xc, BLOptions{Re: re, TripXC: 1e-4})
	if err != nil {
		t.Fatal(err)
	}
	if bl.TransitionCause != TransitionTrip || math.Abs(bl.TransitionXC-1e-4) > 1e-12 {
		t.Fatalf("transition %q at %g, want trip at 1e-4", bl.TransitionCause, bl.TransitionXC)
	}
	if bl.Separated {
		t.Fatalf("flat plate separated at %g", bl.TurbulentSeparationXC)
	}
	for _, x := range []float64{0.2, 0.5, 1} {
		want := 0.0592 * math.Pow(re*x, -0.2)
		if got := blAt(bl, bl.Cf, x); relErr(got, want) > turbulentPlateTol {
			t.Errorf("x = %g: Cf = %.5g, power law %.5g", x, got, want)
		}
		if h := blAt(bl, bl.H, x); !(h > 1.2 && h < 1.5) { // common practice: H ≈ 1.3 on a turbulent plate
			t.Errorf("x = %g: H = %.3g, want about 1.3", x, h)
		}
	}
	want := 0.074 * math.Pow(re, -0.2)
	if relErr(bl.Cd, want) > turbulentPlateTol {
		t.Errorf("Cd = %.5g, power law %.5g", bl.Cd, want)
	}
	if ps := 0.455 * math.Pow(math.Log10(re), -2.58); relErr(bl.Cd, ps) > turbulentPlateTol {
		t.Errorf("Cd = %.5g, Prandtl–Schlichting %.5g", bl.Cd, ps)
	}
	t.Logf("turbulent plate Re=%g: Cf(0.5) = %.5f (power law %.5f), H(1) = %.3f, Cd = %.5f (power law %.5f)",
		re, blAt(bl, bl.Cf, 0.5), 0.0592*math.Pow(re*0.5, -0.2), bl.HTE, bl.Cd, want)
}

// TestBLHowarth runs Howarth's linearly retarded flow U = U₀(1 − x/L).
// Thwaites' closed form gives λ = −0.075((1 − x)^−6 − 1), so separation
// (λ = −0.09) at x/L = 1 − 2.2^(−1/6) = 0.1231; the exact solution
// separates at x/L ≈ 0.120 (Howarth, Proc. R. Soc. A 164, 1938; from
// memory, docs/validation.md §4).
func TestBLHowarth(t *testing.T) {
	const re = 1e5
	s, ue, xc := blStations(0, 0.5, 2001, func(x float64) float64 { return 1 - x })
	bl, err := SolveSurface(s, ue, xc, BLOptions{Re: re})
	if err != nil {
		t.Fatal(err)
	}
	if !bl.Bubble || bl.TransitionCause != TransitionLaminarSeparation {
		t.Fatalf("want laminar separation first, got cause %q, bubble %v", bl.TransitionCause, bl.Bubble)
	}
	closed := 1 - math.Pow(2.2, -1.0/6)
	for _, c := range []struct {
		name string
		want float64
		tol  float64
	}{
		{"Thwaites closed form", closed, 0.001}, // half a station spacing plus the derivative estimate
		{"Howarth exact", 0.120, 0.005},
	} {
		if math.Abs(bl.LaminarSeparationXC-c.want) > c.tol {
			t.Errorf("separation x/L = %.4f, %s %.4f ± %g", bl.LaminarSeparationXC, c.name, c.want, c.tol)
		}
	}
	if bl.TransitionXC != bl.LaminarSeparationXC {
		t.Errorf("transition %g is not at laminar separation %g", bl.TransitionXC, bl.LaminarSeparationXC)
	}
	recordReadme(t, "howarth", "%.4f", bl.LaminarSeparationXC)
	t.Logf("Howarth flow: laminar separation at x/L = %.4f (Thwaites closed form %.4f, exact 0.120)", bl.LaminarSeparationXC, closed)
}

// michelPlate returns Re_x at transition on a flat plate: Thwaites gives
// Re_θ = √(0.45 Re_x), set equal to Michel's 1.174 (1 + 22400/Re_x) Re_x^0.46
// (Cebeci & Smith form, docs/validation.md §4) and solved by bisection on log Re_x.
func michelPlate() float64 {
	g := func(rx float64) float64 { return math.Sqrt(0.45*rx) - 1.174*(1+22400/rx)*math.Pow(rx, 0.46) }
	lo, hi := 1e4, 1e9
	for range 200 {
		mid := math.Sqrt(lo * hi)
		if g(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

func TestBLMichelFlatPlate(t *testing.T) {
	rxTr := michelPlate()
	for _, c := range []struct {
		name string
		re   float64
	}{
		{"transition near mid-plate", 2 * rxTr},
		{"transition near the front", 5 * rxTr},
	} {
		s, ue, xc := blStations(0, 1, 2001, uniform)
		bl, err := SolveSurface(s, ue, xc, BLOptions{Re: c.re})
		if err != nil {
			t.Fatal(err)
		}
		want := rxTr / c.re
		if bl.TransitionCause != TransitionMichel {
			t.Errorf("%s: cause %q, want michel", c.name, bl.TransitionCause)
		}
		if math.Abs(bl.TransitionXC-want) > 1e-3 { // two station spacings
			t.Errorf("%s: transition at x = %.5f, criterion gives %.5f", c.name, bl.TransitionXC, want)
		}
		for i := range s {
			if bl.Turbulent[i] != (s[i] > bl.TransitionXC) {
				t.Fatalf("%s: station %d at %g: turbulent = %v with transition at %g", c.name, i, s[i], bl.Turbulent[i], bl.TransitionXC)
			}
		}
		if c.re == 2*rxTr {
			t.Logf("Michel on a plate: Re_x,tr = %.4g; found x = %.4f, want %.4f", rxTr, bl.TransitionXC, want)
		}
	}
}

// TestBLStagnationStart checks Thwaites' start at a stagnation point in
// Hiemenz flow Ue = k s: θ² = 0.075 ν/k everywhere, λ = 0.075 (Thwaites
// 1949; Cebeci & Bradshaw 1977), whether the first station is the
// stagnation point itself or lies behind it.
func TestBLStagnationStart(t *testing.T) {
	const re, k = 1e6, 2.0
	want := math.Sqrt(0.075 / (re * k))
	for _, c := range []struct {
		name string
		a    float64
	}{
		{"first station at the stagnation point", 0},
		{"first station behind it", 0.002},
	} {
		s, ue, xc := blStations(c.a, 0.05, 101, func(x float64) float64 { return k * x })
		bl, err := SolveSurface(s, ue, xc, BLOptions{Re: re})
		if err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		// Cebeci & Bradshaw's H(λ) = 2.61 − 3.75λ + 5.24λ² at λ = 0.075,
		// evaluated here from the published correlation.
		const lam = 0.075
		h := 2.61 - 3.75*lam + 5.24*lam*lam
		for i := range s {
			if relErr(bl.Theta[i], want) > 1e-9 || relErr(bl.H[i], h) > 1e-6 {
				t.Fatalf("%s: station %d: θ = %g, H = %g, want %g, %g", c.name, i, bl.Theta[i], bl.H[i], want, h)
			}
		}
	}
}

// TestBLTurbulentSeparation decelerates a tripped layer strongly: it must
// separate, stop, and mark what follows as outside the method's range. A
// higher threshold H moves separation downstream; once the young layer has
// relaxed from H = 1.4 (by x = 0.3 here), H grows steadily in the adverse
// gradient (Head 1958).
func TestBLTurbulentSeparation(t *testing.T) {
	s, ue, xc := blStations(0, 1, 401, func(x float64) float64 { return 1 - 0.6*x })
	var prev float64
	for _, hs := range []float64{MinTurbulentSeparationH, 0, MaxTurbulentSeparationH} {
		bl, err := SolveSurface(s, ue, xc, BLOptions{Re: 3e6, TripXC: 0.01, TurbulentSeparationH: hs})
		if err != nil {
			t.Fatal(err)
		}
		if !bl.Separated || math.IsNaN(bl.TurbulentSeparationXC) {
			t.Fatalf("H_sep %g: not separated", hs)
		}
		if !math.IsNaN(bl.Cd) || !math.IsNaN(bl.ThetaTE) || !math.IsNaN(bl.Theta[len(s)-1]) {
			t.Errorf("H_sep %g: values past separation are not NaN: Cd %g θ_TE %g", hs, bl.Cd, bl.ThetaTE)
		}
		if !(bl.TurbulentSeparationXC > prev) {
			t.Errorf("H_sep %g: separation at %g is not behind %g", hs, bl.TurbulentSeparationXC, prev)
		}
		for i, x := range s {
			if x < bl.TurbulentSeparationXC && x > 0.3 {
				// Non-decreasing: H₁ values in the gap between the two
				// branches of H₁(H) all map to H = 1.6.
				if !(bl.H[i] <= bl.H[i+1] || math.IsNaN(bl.H[i+1])) {
					t.Errorf("H_sep %g: H falls at station %d", hs, i)
				}
			}
		}
		prev = bl.TurbulentSeparationXC
	}
}

// TestBLCdFallsWithRe checks the trend of every drag chart (Schlichting,
// Boundary-Layer Theory, fig. 21.2): with the transition position held, a
// plate's drag falls as the Reynolds number rises.
func TestBLCdFallsWithRe(t *testing.T) {
	s, ue, xc := blStations(0, 1, 501, uniform)
	for _, trip := range []float64{0.02, 0.3} {
		prev := math.Inf(1)
		for _, re := range []float64{5e5, 1e6, 2e6, 5e6, 1e7} {
			bl, err := SolveSurface(s, ue, xc, BLOptions{Re: re, TripXC: trip})
			if err != nil {
				t.Fatal(err)
			}
			if !(bl.Cd < prev) {
				t.Errorf("trip %g: Cd %g at Re %g is not below %g", trip, bl.Cd, re, prev)
			}
			prev = bl.Cd
		}
	}
}

func TestBLInputErrors(t *testing.T) {
	s, ue, xc := blStations(0, 1, 11, uniform)
	bad := func(f func(s, ue, xc []float64)) ([]float64, []float64, []float64) {
		s2, u2, x2 := append([]float64(nil), s...), append([]float64(nil), ue...), append([]float64(nil), xc...)
		f(s2, u2, x2)
		return s2, u2, x2
	}
	for _, c := range []struct {
		name       string
		s, ue, xc  []float64
		opt        BLOptions
		field      string
		wantAtStat int
	}{
		{"zero Re", s, ue, xc, BLOptions{}, "Re", -1},
		{"NaN Re", s, ue, xc, BLOptions{Re: math.NaN()}, "Re", -1},
		{"trip past TE", s, ue, xc, BLOptions{Re: 1e6, TripXC: 1.5}, "TripXC", -1},
		{"separation H too low", s, ue, xc, BLOptions{Re: 1e6, TurbulentSeparationH: 1.5}, "TurbulentSeparationH", -1},
		{"too few stations", s[:2], ue[:2], xc[:2], BLOptions{Re: 1e6}, "s", -1},
		{"s not increasing", func() []float64 { a, _, _ := bad(func(s, _, _ []float64) { s[4] = s[3] }); return a }(), ue, xc, BLOptions{Re: 1e6}, "s", 4},
		{"negative Ue", s, func() []float64 { _, a, _ := bad(func(_, u, _ []float64) { u[3] = -0.1 }); return a }(), xc, BLOptions{Re: 1e6}, "ue", 3},
		{"zero Ue downstream", s, func() []float64 { _, a, _ := bad(func(_, u, _ []float64) { u[5] = 0 }); return a }(), xc, BLOptions{Re: 1e6}, "ue", 5},
		{"NaN x/c", s, ue, func() []float64 { _, _, a := bad(func(_, _, x []float64) { x[2] = math.NaN() }); return a }(), BLOptions{Re: 1e6}, "s, ue, xc", 2},
	} {
		_, err := SolveSurface(c.s, c.ue, c.xc, c.opt)
		var be *BLError
		if !errors.As(err, &be) || !errors.Is(err, ErrBLInput) {
			t.Errorf("%s: error %v is not a *BLError wrapping ErrBLInput", c.name, err)
			continue
		}
		if be.Field != c.field || be.Index != c.wantAtStat {
			t.Errorf("%s: field %q station %d, want %q %d", c.name, be.Field, be.Index, c.field, c.wantAtStat)
		}
	}
}

func TestSolveSurfaceLengthMismatchPanics(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("no panic")
		}
	}()
	SolveSurface([]float64{0, 1, 2}, []float64{1, 1}, []float64{0, 1, 2}, BLOptions{Re: 1})
}

// TestHeadH1Inverse checks that headH inverts headH1 on each branch.
func TestHeadH1Inverse(t *testing.T) {
	for _, h := range []float64{1.2, 1.3, 1.4, 1.55, 1.7, 2.0, 2.4, 3.0} {
		if got := headH(headH1(h)); math.Abs(got-h) > 1e-12 {
			t.Errorf("headH(headH1(%g)) = %g", h, got)
		}
	}
}

// ExampleSolveSurface runs a laminar flat plate at Re = 1e5: Squire–Young
// gives Cd = 2θ_TE = 1.342/√Re, against Blasius' 1.328/√Re (Schlichting).
func ExampleSolveSurface() {
	n := 201
	s, ue := make([]float64, n), make([]float64, n)
	for i := range s {
		s[i], ue[i] = float64(i)/float64(n-1), 1
	}
	bl, err := SolveSurface(s, ue, s, BLOptions{Re: 1e5})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("θ_TE √Re = %.3f, H = %.2f, Cd = %.5f, transition %s\n", bl.ThetaTE*math.Sqrt(1e5), bl.HTE, bl.Cd, bl.TransitionCause)
	// Output:
	// θ_TE √Re = 0.671, H = 2.61, Cd = 0.00424, transition none
}
