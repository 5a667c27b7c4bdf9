package boundarylayer

import (
	"math"
	"testing"
)

// The turbulent closures and the lag equation alone, on prescribed edge
// velocities, in an adverse pressure gradient: a flat-plate run to x0 = 1
// (from x = 0.05 with the 1/7-power law's θ), then a linear pressure rise
// Cp = a (x − x0), Ue = √(1 − a (x − x0)). How far into the rise the
// layer's shape factor reaches 2.6 (turbulent separation: H ≈ 2.2–3 in
// the usual criteria; the direct march also stops where it cannot go on,
// near H 2.6–3) is bracketed by two published methods:
//
//   - Stratford's criterion for the separation of a turbulent layer
//     after a flat-plate run, Cp (x dCp/dx)^½ (10⁻⁶ Re_x)^(−1/10) = S, x from
//     the layer's origin, S = 0.35 or 0.39 by the sign of d²p/dx²
//     (Stratford, The prediction of separation of the turbulent boundary
//     layer, J. Fluid Mech. 5(1), 1959; constants from memory), earlier:
//     the smaller S, 0.35, is the bracket's near end;
//   - Head's entrainment method with the Ludwieg–Tillmann skin friction
//     (Head, Entrainment in the turbulent boundary layer, ARC R&M 3152,
//     1958; Ludwieg & Tillmann, NACA TM 1285, 1950; the correlations from
//     memory, as widely reproduced), integrated here on the same edge
//     velocity from the same start, its H reaching 2.6: the far end.
//
// The two published methods differ by a factor 1.5–2.5 in the length of
// the rise, which is the tolerance: a sign or coefficient error in the
// closures (Cτ_EQ, the G–β locus, the lag constant, the dissipation) moves
// the shape factor's growth by far more. Measured (DEVELOPERS.md): the
// closures reach H 2.6 1.4–1.6 times as far into the rise as Stratford's
// S = 0.35 and 0.8–0.9 times as far as Head's method, a turbulent layer
// that stands a strong adverse gradient longer than Stratford's criterion
// says, as integral methods of this kind do.
func TestTurbulentAdverseGradient(t *testing.T) {
	const x0, hSep = 1.0, 2.6
	for _, tc := range []struct {
		name  string
		re, a float64 // Reynolds number per unit length, dCp/dx
	}{
		{"Re 1e6, dCp/dx 1", 1e6, 1},
		{"Re 1e6, dCp/dx 2", 1e6, 2},
		{"Re 1e7, dCp/dx 1", 1e7, 1},
		{"Re 1e7, dCp/dx 2", 1e7, 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ue := func(x float64) float64 {
				if x <= x0 {
					return 1
				}
				return math.Sqrt(math.Max(1-tc.a*(x-x0), 1e-9))
			}
			const xStart = 0.05
			th := 0.036 * xStart * math.Pow(tc.re*xStart, -0.2)
			var xs []float64
			for x := xStart * 1.05; x < x0; x *= 1.05 {
				xs = append(xs, x)
			}
			for s := 0.002 / tc.a; s < 1/tc.a; s += 0.002 / tc.a {
				xs = append(xs, x0+s)
			}
			sep := math.NaN()
			last, _ := marchEdge(Turbulent, Station{Xi: xStart, Ue: 1, Theta: th, DStar: 1.4 * th, C: 0.04}, tc.re, ue, xs, func(s Station) bool {
				if s.Xi > x0 && s.DStar/s.Theta >= hSep {
					sep = s.Xi - x0
					return false
				}
				return true
			})
			if math.IsNaN(sep) {
				// The direct march stopped first, short of H 2.6.
				sep = last.Xi - x0
			}
			strat := stratfordSeparation(tc.re, tc.a, x0, 0.35)
			head := headSeparation(tc.re, tc.a, x0, xStart, hSep)
			t.Logf("H %.1f at %.4f into the rise (Cp %.3f); Stratford (S 0.35) %.4f, (S 0.39) %.4f; Head %.4f: %.2f and %.2f times theirs",
				hSep, sep, tc.a*sep, strat, stratfordSeparation(tc.re, tc.a, x0, 0.39), head, sep/strat, sep/head)
			if !(sep >= strat && sep <= head) {
				t.Errorf("the layer reaches H %.1f %.4f into the pressure rise; want it between Stratford's criterion (%.4f) and Head's method (%.4f)", hSep, sep, strat, head)
			}
		})
	}
}

// stratfordSeparation returns how far into a linear rise Cp = a (x − x0)
// after a flat-plate run from x = 0 Stratford's criterion puts separation:
// Cp √(x dCp/dx) (10⁻⁶ re x)^(−1/10) = s (bisection; Cp stays below 4/7
// in the cases above).
func stratfordSeparation(re, a, x0, s float64) float64 {
	lo, hi := 0.0, 1/a
	for range 80 {
		m := 0.5 * (lo + hi)
		x := x0 + m
		if a*m*math.Sqrt(a*x)*math.Pow(1e-6*re*x, -0.1) < s {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// headSeparation integrates Head's entrainment method on the edge velocity
// of TestTurbulentAdverseGradient (explicit Euler in steps of 10⁻⁴) and
// returns how far into the rise its H reaches hSep:
//
//	dθ/dx = Cf/2 − (H + 2) (θ/Ue) dUe/dx
//	d(Ue θ H1)/dx = Ue 0.0306 (H1 − 3)^(−0.6169)
//	H1 = 0.8234 (H − 1.1)^(−1.287) + 3.3 (H ≤ 1.6), 1.5501 (H − 0.6778)^(−3.064) + 3.3
//	Cf = 0.246 · 10^(−0.678 H) Reθ^(−0.268)
func headSeparation(re, a, x0, xStart, hSep float64) float64 {
	hOf := func(h1 float64) float64 {
		if h1 >= 0.8234*math.Pow(0.5, -1.287)+3.3 {
			return 1.1 + math.Pow((h1-3.3)/0.8234, -1/1.287)
		}
		return 0.6778 + math.Pow((h1-3.3)/1.5501, -1/3.064)
	}
	h1Of := func(h float64) float64 {
		if h <= 1.6 {
			return 0.8234*math.Pow(h-1.1, -1.287) + 3.3
		}
		return 1.5501*math.Pow(h-0.6778, -3.064) + 3.3
	}
	const dx = 1e-4
	x := xStart
	th := 0.036 * x * math.Pow(re*x, -0.2)
	y := th * h1Of(1.4) // Ue θ H1 with Ue = 1
	for x < x0+1/a {
		u, du := 1.0, 0.0
		if x > x0 {
			u = math.Sqrt(1 - a*(x-x0))
			du = -a / (2 * u)
		}
		h1 := y / (u * th)
		h := hOf(h1)
		if x > x0 && h >= hSep {
			return x - x0
		}
		cf := 0.246 * math.Pow(10, -0.678*h) * math.Pow(re*u*th, -0.268)
		dth := cf/2 - (h+2)*th/u*du
		y += dx * u * 0.0306 * math.Pow(h1-3, -0.6169)
		th += dx * dth
		x += dx
	}
	return math.NaN()
}
