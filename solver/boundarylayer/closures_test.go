package boundarylayer

import (
	"math"
	"testing"
)

// The laminar closures against the Blasius flat-plate layer (H = 2.591;
// δ*, θ and the energy thickness 1.7208, 0.6641 and 1.0444 times √(νx/U);
// White, Viscous Fluid Flow, 3rd ed., 2006, sec. 4-3.1 and Table 4-1;
// the energy thickness from memory). Derived from them:
// H* = 1.0444/0.6641 = 1.5727; Reθ Cf/2 = 0.6641 · 0.332 = 0.2205; the
// flat-plate kinetic-energy balance dθ*/dx = 2 CD gives
// Reθ CD = 0.6641 · 1.0444/4 = 0.1734. Tolerance 2 %: the closures are
// fits to the Falkner–Skan family, which Drela & Giles (1987) state to a
// few percent (from memory).
func TestLaminarClosuresBlasius(t *testing.T) {
	const h, rt = 2.591, 1000.0
	c := Eval(Laminar, Station{Ue: 1, Theta: rt / 1e6, DStar: h * rt / 1e6}, 1e6)
	for _, tc := range []struct {
		name      string
		got, want float64
	}{
		{"H*", c.Hs, 1.5727},
		{"Reθ Cf/2", c.RTheta * c.Cf / 2, 0.2205},
		{"Reθ CD", c.RTheta * c.CD, 0.1734},
	} {
		if rel := math.Abs(tc.got/tc.want - 1); rel > 0.02 {
			t.Errorf("%s = %.4f, want %.4f (Blasius) within 2 %%: off by %.2f %%", tc.name, tc.got, tc.want, 100*rel)
		}
	}
}

// Laminar separation: Cf = 0 where the closure's H is near Falkner–Skan's
// separating profile, H = 4.03 (White 2006, Table 4-1). Tolerance 0.15
// (4 %): the fit reaches Cf = 0 at 4.14, within the few percent the
// closure is accurate to; a sign or coefficient error moves it by far more.
func TestLaminarSeparationShape(t *testing.T) {
	lo, hi := 3.0, 6.0
	for range 60 {
		mid := 0.5 * (lo + hi)
		c := Eval(Laminar, Station{Ue: 1, Theta: 1e-3, DStar: mid * 1e-3}, 1e6)
		if c.Cf > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	if math.Abs(lo-4.03) > 0.15 {
		t.Errorf("laminar Cf = 0 at H = %.3f, want 4.03 ± 0.15 (Falkner–Skan separation profile)", lo)
	}
}

// marchFlatPlate integrates a layer of kind k on a flat plate (Ue = 1) at
// unit Reynolds number re from x0 with state st to x1 in n geometric steps
// (marchEdge) and returns the last station.
func marchFlatPlate(t *testing.T, k Kind, st Station, re, x1 float64, n int) Station {
	t.Helper()
	ratio := math.Pow(x1/st.Xi, 1/float64(n))
	xs := make([]float64, n)
	x := st.Xi
	for i := range xs {
		x *= ratio
		xs[i] = x
	}
	last, ok := marchEdge(k, st, re, func(float64) float64 { return 1 }, xs, nil)
	if !ok {
		t.Fatalf("flat plate: no convergence at x = %g", last.Xi)
	}
	return last
}

// marchEdge integrates a layer of kind k at unit Reynolds number re from
// station st through the stations at xs (increasing, beyond st.Xi) with
// the prescribed edge velocity ue(x), solving each interval's residuals
// by Newton's method with a finite-difference Jacobian (the direct mode:
// θ, δ* and C unknown, Ue given). each, if not nil, sees every station
// solved and stops the march by returning false. It returns the last
// station solved and false if Newton's method failed at the next, as the
// direct mode does where the layer approaches separation (the shape
// equation's dH*/dH changes sign there).
func marchEdge(k Kind, st Station, re float64, ue func(float64) float64, xs []float64, each func(Station) bool) (Station, bool) {
	for _, xb := range xs {
		b := st
		b.Xi, b.Ue = xb, ue(xb)
		for it := 0; ; it++ {
			x := [3]float64{b.C, b.Theta, b.DStar}
			f := func(x [3]float64) Residuals {
				s := b
				s.C, s.Theta, s.DStar = x[0], x[1], x[2]
				return Interval(k, st, s, re)
			}
			r0 := f(x)
			var j [3][3]float64
			for v := range 3 {
				h := 1e-7*math.Abs(x[v]) + 1e-12
				xp := x
				xp[v] += h
				r1 := f(xp)
				for e := range 3 {
					j[e][v] = (r1[e] - r0[e]) / h
				}
			}
			dx := solve3x3(j, [3]float64{-r0[0], -r0[1], -r0[2]})
			for v := range 3 {
				x[v] += dx[v]
			}
			b.C, b.Theta, b.DStar = x[0], x[1], x[2]
			if math.Abs(dx[1]/x[1])+math.Abs(dx[2]/x[2]) < 1e-12 {
				break
			}
			if it > 50 || !(b.Theta > 0 && b.DStar > 0) {
				return st, false
			}
		}
		st = b
		if each != nil && !each(st) {
			break
		}
	}
	return st, true
}

func solve3x3(a [3][3]float64, b [3]float64) [3]float64 {
	det := func(m [3][3]float64) float64 {
		return m[0][0]*(m[1][1]*m[2][2]-m[1][2]*m[2][1]) - m[0][1]*(m[1][0]*m[2][2]-m[1][2]*m[2][0]) + m[0][2]*(m[1][0]*m[2][1]-m[1][1]*m[2][0])
	}
	d := det(a)
	var x [3]float64
	for c := range 3 {
		m := a
		for r := range 3 {
			m[r][c] = b[r]
		}
		x[c] = det(m) / d
	}
	return x
}

// The discrete laminar equations on a flat plate approach the Blasius
// layer: θ √(U/(νx)) = 0.664, H = 2.59, Cf √Rex = 0.664 (White 2006, sec.
// 4-3.1). Tolerance 3 %: the closure's 2 % and the start from a guessed
// profile, forgotten over 3 decades of x.
func TestFlatPlateLaminar(t *testing.T) {
	const re = 1e6
	x0 := 1e-3
	th0 := 0.664 * math.Sqrt(x0/re)
	st := marchFlatPlate(t, Laminar, Station{Xi: x0, Ue: 1, Theta: th0, DStar: 2.6 * th0}, re, 1, 120)
	c := Eval(Laminar, st, re)
	rex := re * st.Xi
	for _, tc := range []struct {
		name      string
		got, want float64
	}{
		{"θ √(Re_x)/x", st.Theta * math.Sqrt(rex) / st.Xi, 0.664},
		{"H", st.DStar / st.Theta, 2.591},
		{"Cf √(Re_x)", c.Cf * math.Sqrt(rex), 0.664},
	} {
		if rel := math.Abs(tc.got/tc.want - 1); rel > 0.03 {
			t.Errorf("%s = %.4f, want %.4f (Blasius) within 3 %%", tc.name, tc.got, tc.want)
		}
	}
	if st.C <= 0 {
		t.Errorf("ñ = %g at Re_x = 1e6: the Blasius layer is unstable above Re_x ≈ 9e4 and ñ must grow", st.C)
	}
}

// The turbulent equations on a flat plate against the skin-friction law
// Cf = 0.0592 Re_x^(−1/5) (Schlichting, Boundary-Layer Theory, 7th ed.,
// 1979, eq. 21.12; the 1/7-power law, good for 5e5 < Re_x < 1e7).
// Tolerance 10 %: the power law itself departs from measurements by a few
// percent and the closure (Swafford's fit) by as much again.
func TestFlatPlateTurbulent(t *testing.T) {
	const re = 1e7
	x0 := 0.05
	// Start from the power law's θ = 0.036 x Re_x^(−1/5) with H = 1.4 and
	// √Cτ from memory (0.04); the lag equation forgets it downstream.
	th0 := 0.036 * x0 * math.Pow(re*x0, -0.2)
	st := marchFlatPlate(t, Turbulent, Station{Xi: x0, Ue: 1, Theta: th0, DStar: 1.4 * th0, C: 0.04}, re, 1, 100)
	c := Eval(Turbulent, st, re)
	want := 0.0592 * math.Pow(re*st.Xi, -0.2)
	if rel := math.Abs(c.Cf/want - 1); rel > 0.10 {
		t.Errorf("turbulent Cf at Re_x = %.3g: %.5f, want %.5f (1/7-power law) within 10 %%", re*st.Xi, c.Cf, want)
	}
	if h := st.DStar / st.Theta; h < 1.25 || h > 1.5 {
		t.Errorf("turbulent H = %.3f, want 1.3–1.4 on a flat plate at Re_x = 1e7 (White 2006, sec. 6-6; from memory, ± 0.1)", h)
	}
}

// Squire–Young in closed form: 2 θ Ue^((H + 5)/2).
func TestSquireYoung(t *testing.T) {
	got := SquireYoung(Station{Ue: 0.9, Theta: 0.003, DStar: 0.0045})
	want := 2 * 0.003 * math.Pow(0.9, 3.25)
	if math.Abs(got-want) > 1e-15 {
		t.Errorf("SquireYoung = %g, want %g", got, want)
	}
}

// The stagnation station's θ holds the momentum equation in equilibrium
// for Ue = a ξ: Cf/2 = (2 + H) θ a/Ue.
func TestStagnationTheta(t *testing.T) {
	const re, a, xi = 1e6, 50.0, 1e-3
	th := StagnationTheta(xi, a*xi, re)
	c := Eval(Laminar, Station{Xi: xi, Ue: a * xi, Theta: th, DStar: stagnationH * th}, re)
	lhs, rhs := c.Cf/2, (2+stagnationH)*th/xi
	if math.Abs(lhs/rhs-1) > 1e-9 {
		t.Errorf("Cf/2 = %g, (2 + H) θ/ξ = %g", lhs, rhs)
	}
	// Against the exact Hiemenz value θ² a/ν = 0.0854 (White 2006, Table
	// 4-1: θ √(a/ν) = 0.2923), within the closure's 3 %.
	if k := th * th * a * re; math.Abs(k/0.0854-1) > 0.05 {
		t.Errorf("θ² a/ν = %.4f, want 0.0854 (Hiemenz) within 5 %%", k)
	}
}

// ShapeMinimum is where H* is least: on either side of it, at every
// Reynolds number, H* is larger (a property of the closures' fits,
// checked at shape factors from 0.01 to 1 away from it).
func TestShapeMinimum(t *testing.T) {
	for _, tc := range []struct {
		name   string
		k      Kind
		rTheta float64
	}{
		{"laminar", Laminar, 300},
		{"turbulent below Reθ 400", Turbulent, 350},
		{"turbulent at Reθ 2000", Turbulent, 2000},
		{"turbulent at Reθ 10⁴", Turbulent, 1e4},
		{"wake at Reθ 5000", Wake, 5000},
	} {
		t.Run(tc.name, func(t *testing.T) {
			const ue, theta = 1.0, 1e-3
			re := tc.rTheta / (ue * theta)
			hs := func(h float64) float64 {
				return Eval(tc.k, Station{Ue: ue, Theta: theta, DStar: h * theta, C: 0.03}, re).Hs
			}
			h0 := ShapeMinimum(tc.k, tc.rTheta)
			least := hs(h0)
			for _, d := range []float64{0.01, 0.1, 0.5, 1} {
				if lo, hi := hs(h0-d), hs(h0+d); !(lo > least && hi > least) {
					t.Errorf("H* %.5f at H0 %.3f, %.5f at H0 − %g and %.5f at H0 + %g: want both larger", least, h0, lo, d, hi, d)
				}
			}
		})
	}
}
