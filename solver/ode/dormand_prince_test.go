package ode

import (
	"fmt"
	"math"
	"testing"
)

// step takes one full step and returns y1 and the error estimate.
func step(f Func, x float64, y []float64, h float64) (y1, e []float64) {
	n := len(y)
	d := NewDormandPrince(n)
	k1, k7 := make([]float64, n), make([]float64, n)
	y1, e = make([]float64, n), make([]float64, n)
	if !f(x, y, k1) || !d.Advance(f, x, y, k1, h, y1) || !f(x+h, y1, k7) {
		panic("step failed")
	}
	d.Error(h, k1, k7, e)
	return y1, e
}

// A quadrature y′ = g(x) is integrated by the fifth-order weights exactly
// when g is a polynomial of degree ≤ 4 (the pair's order 5), and by the
// embedded fourth-order ones when its degree is ≤ 3 (then e = 0).
func TestDormandPrincePolynomials(t *testing.T) {
	for deg := 0; deg <= 4; deg++ {
		t.Run(fmt.Sprintf("degree %d", deg), func(t *testing.T) {
			p := float64(deg + 1)
			f := func(x float64, _, dy []float64) bool { dy[0] = p * math.Pow(x, p-1); return true }
			x0, h := 0.5, 0.75
			y1, e := step(f, x0, []float64{0}, h)
			want := math.Pow(x0+h, p) - math.Pow(x0, p)
			if math.Abs(y1[0]-want) > 1e-14 {
				t.Errorf("y1 = %.17g, want %.17g (∫ of (%g) x^%d)", y1[0], want, p, deg)
			}
			if deg <= 3 && math.Abs(e[0]) > 1e-14 {
				t.Errorf("error estimate %g, want 0 for degree %d", e[0], deg)
			}
			if deg == 4 && e[0] == 0 {
				t.Error("error estimate 0 for degree 4: the fourth-order solution is not exact there")
			}
		})
	}
}

// On y′ = y the local error of the fifth-order solution is O(h⁶) and the
// estimate, the fourth-order solution's error, O(h⁵): halving h divides
// them by about 64 and 32. The exact solution is e^h.
func TestDormandPrinceOrder(t *testing.T) {
	f := func(_ float64, y, dy []float64) bool { dy[0] = y[0]; return true }
	var prevErr, prevEst float64
	for i, h := range []float64{0.4, 0.2, 0.1, 0.05} {
		y1, e := step(f, 0, []float64{1}, h)
		errH := math.Abs(y1[0] - math.Exp(h))
		// The fourth-order solution is y1 − e, so the estimate differs
		// from its error by the fifth-order error, a factor O(h) smaller.
		if err4 := math.Abs(y1[0] - e[0] - math.Exp(h)); math.Abs(err4-math.Abs(e[0])) > h*err4 {
			t.Errorf("h %g: fourth-order error %g, estimate %g", h, err4, e[0])
		}
		if i > 0 {
			if r := prevErr / errH; r < 48 || r > 80 {
				t.Errorf("h %g: error ratio %.1f on halving h, want about 2⁶ = 64", h, r)
			}
			if r := prevEst / math.Abs(e[0]); r < 24 || r > 40 {
				t.Errorf("h %g: estimate ratio %.1f on halving h, want about 2⁵ = 32", h, r)
			}
		}
		prevErr, prevEst = errH, math.Abs(e[0])
	}
}

// An adaptive loop on the harmonic oscillator y″ = −y, y(0) = 1, y′(0) = 0
// (exact solution cos x) returns to its start after one period 2π with an
// error of the order of the tolerance; the loop reuses k₇ as the next k₁.
func TestDormandPrinceAdaptiveCircle(t *testing.T) {
	f := func(_ float64, y, dy []float64) bool { dy[0], dy[1] = y[1], -y[0]; return true }
	for _, tol := range []float64{1e-6, 1e-9} {
		t.Run(fmt.Sprint(tol), func(t *testing.T) {
			d := NewDormandPrince(2)
			y, y1 := []float64{1, 0}, make([]float64, 2)
			k1, k7, e := make([]float64, 2), make([]float64, 2), make([]float64, 2)
			f(0, y, k1)
			x, h, end := 0.0, 0.1, 2*math.Pi
			steps := 0
			for x < end {
				h = math.Min(h, end-x)
				d.Advance(f, x, y, k1, h, y1)
				f(x+h, y1, k7)
				d.Error(h, k1, k7, e)
				ratio := math.Hypot(e[0], e[1]) / tol
				if ratio <= 1 {
					x += h
					copy(y, y1)
					copy(k1, k7)
					steps++
				}
				h *= StepScale(ratio)
			}
			if d := math.Hypot(y[0]-1, y[1]); d > 100*tol {
				t.Errorf("after one period |y − y(0)| = %g in %d steps, want ≲ 100 × tol", d, steps)
			}
		})
	}
}

func TestDormandPrinceStageFails(t *testing.T) {
	calls := 0
	f := func(x float64, _, dy []float64) bool {
		calls++
		dy[0] = 1
		return x < 0.5 // undefined past x = 0.5
	}
	d := NewDormandPrince(1)
	y1 := make([]float64, 1)
	if d.Advance(f, 0, []float64{0}, []float64{1}, 1, y1) {
		t.Error("Advance succeeded though f failed at the stage at x = 0.8")
	}
	if calls != 3 { // stages at 0.2, 0.3, 0.8: stops at the first failure
		t.Errorf("f called %d times, want 3", calls)
	}
}

func TestStepScale(t *testing.T) {
	for _, tc := range []struct {
		name  string
		ratio float64
		want  float64
	}{
		{"no error: largest growth", 0, 5},
		{"tiny error: capped growth", 1e-12, 5},
		{"at tolerance: safety factor", 1, 0.9},
		{"32 × tolerance: halved × 0.9", 32, 0.45},
		{"huge error: largest cut", 1e12, 0.2},
		{"not a number: largest cut", math.NaN(), 0.2},
		{"infinite: largest cut", math.Inf(1), 0.2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := StepScale(tc.ratio); math.Abs(got-tc.want) > 1e-12 {
				t.Errorf("StepScale(%g) = %g, want %g", tc.ratio, got, tc.want)
			}
		})
	}
}

func TestDormandPrincePanicsOnLength(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("no panic for a y of the wrong length")
		}
	}()
	NewDormandPrince(2).Advance(func(float64, []float64, []float64) bool { return true }, 0, []float64{0}, []float64{0, 0}, 1, []float64{0, 0})
}
