package liftingline

import (
	"math"
	"testing"
)

// The images' upwash at the centre of an elliptic load (A₁ only) has a
// closed form (derived here from the kernel; the integral of
// c²/(c² + k²) over θ from 0 to π is π(1 − k/√(1 + k²)) with c = cos θ):
// G = 1 − k/√(1 + k²), k = 2d/b, d the image's distance. So at the centre
// the induced angle falls from A₁ in free air to A₁ k/√(1 + k²).
func TestImageInfluenceCentre(t *testing.T) {
	for _, c := range []struct {
		name string
		b, d float64
	}{
		{"d = b/10", 1, 0.1},
		{"d = b/2", 1.2, 0.6},
		{"d = 2b", 0.8, 1.6},
	} {
		t.Run(c.name, func(t *testing.T) {
			g := imageInfluence(c.b, c.d, []float64{math.Pi / 2})
			k := 2 * c.d / c.b
			if want := 1 - k/math.Sqrt(1+k*k); math.Abs(g.At(0, 0)-want) > 1e-6 {
				t.Errorf("G = %.8f, want %.8f", g.At(0, 0), want)
			}
		})
	}
}

// Far from the ground the images vanish: the free-air answer to 1e-6.
// Nearer the ground the load rises and the induced drag for a given load,
// C_Di/C_L², falls; its ratio to free air's follows Wieselsberger's
// ground-effect factor 1 − σ, σ = (1 − 1.32 h/b)/(1.05 + 7.4 h/b) for
// h/b from about 0.03 to 0.25 (as reproduced in McCormick, Aerodynamics,
// Aeronautics and Flight Mechanics, 1979; from memory), within ± 0.08:
// the formula is for an elliptic load and is itself a fit, and the value is
// recalled, not re-read.
func TestGroundEffectTrend(t *testing.T) {
	p := Rectangular(1.5, 0.25)
	sec := Linear{SlopePerRad: twoPi}
	free, err := Solve(p, sec, 5, Options{})
	if err != nil {
		t.Fatal(err)
	}
	far, err := Solve(p, sec, 5, Options{GroundHeightM: 1e4})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(far.CL-free.CL) > 1e-6 || math.Abs(far.CDi-free.CDi) > 1e-6 {
		t.Errorf("far from the ground: C_L %.8f C_Di %.8f; free air %.8f %.8f", far.CL, far.CDi, free.CL, free.CDi)
	}
	factor := func(r *Result) float64 { return r.CDi / (r.CL * r.CL) }
	prevF, prevCL := factor(free), free.CL
	for _, h := range []float64{1.5, 0.6, 0.3, 0.15, 0.05} {
		r, err := Solve(p, sec, 5, Options{GroundHeightM: h})
		if err != nil {
			t.Fatal(err)
		}
		hb := h / p.SpanM
		ratio := factor(r) / factor(free)
		t.Logf("h/b %.3f: C_L %.4f, C_Di %.5f, C_Di/C_L² over free air's %.3f", hb, r.CL, r.CDi, ratio)
		if !(factor(r) < prevF && r.CL > prevCL) {
			t.Errorf("h = %g m: C_Di/C_L² %.6f not below %.6f or C_L %.5f not above %.5f", h, factor(r), prevF, r.CL, prevCL)
		}
		if hb >= 0.03 && hb <= 0.25 {
			sigma := (1 - 1.32*hb) / (1.05 + 7.4*hb)
			if math.Abs(ratio-(1-sigma)) > 0.08 {
				t.Errorf("h/b %.3f: ratio %.3f, Wieselsberger 1 − σ = %.3f", hb, ratio, 1-sigma)
			}
		}
		prevF, prevCL = factor(r), r.CL
	}
}
