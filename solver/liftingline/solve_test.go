package liftingline

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

const twoPi = 2 * math.Pi

// An untwisted elliptic wing with a straight section curve carries the
// elliptic load: C_Di = C_L²/(π AR) and the lift slope
// a = a₀/(1 + a₀/(π AR)) (Anderson, Fundamentals of Aerodynamics, ch. 5,
// the elliptical lift distribution). Both are exact for the method, so the
// tolerance is round-off.
func TestEllipticLoad(t *testing.T) {
	for _, c := range []struct {
		name       string
		ar, a0, l0 float64
		alpha      float64
	}{
		{"AR 6, thin aerofoil", 6, twoPi, 0, 5},
		{"AR 3, cambered", 3, 0.11 * 180 / math.Pi, -2, 4},
		{"AR 10, negative angle", 10, twoPi, -1, -6},
	} {
		t.Run(c.name, func(t *testing.T) {
			span := 1.2
			root := 4 * span / (math.Pi * c.ar) // AR = b²/S = 4b/(π c₀)
			p := Elliptic(span, root)
			if math.Abs(p.AspectRatio()-c.ar) > 1e-12 {
				t.Fatalf("aspect ratio %g, want %g", p.AspectRatio(), c.ar)
			}
			r, err := Solve(p, Linear{SlopePerRad: c.a0, ZeroLiftDeg: c.l0}, c.alpha, Options{})
			if err != nil {
				t.Fatal(err)
			}
			a := c.a0 / (1 + c.a0/(math.Pi*c.ar))
			wantCL := a * (c.alpha - c.l0) * math.Pi / 180
			if math.Abs(r.CL-wantCL) > 1e-12 {
				t.Errorf("C_L %.12f, want a(α − α_L0) = %.12f", r.CL, wantCL)
			}
			wantCDi := wantCL * wantCL / (math.Pi * c.ar)
			if math.Abs(r.CDi-wantCDi) > 1e-12 {
				t.Errorf("C_Di %.12f, want C_L²/(π AR) = %.12f", r.CDi, wantCDi)
			}
			if math.Abs(r.Delta) > 1e-10 {
				t.Errorf("δ = %g, want 0", r.Delta)
			}
			// Elliptic load: the induced angle is the same at every station,
			// C_L/(π AR) radians.
			for _, s := range r.Stations {
				if math.Abs(s.InducedDeg-wantCL/(math.Pi*c.ar)*180/math.Pi) > 1e-9 {
					t.Fatalf("induced angle %g° at η %.3f, want %g°", s.InducedDeg, s.Eta, wantCL/(math.Pi*c.ar)*180/math.Pi)
				}
			}
		})
	}
}

// Glauert's induced-drag factor δ of an untwisted rectangular wing of
// aspect ratio 6 with a₀ = 2π: about 0.05, read from Anderson,
// Fundamentals of Aerodynamics, ch. 5, the figure of δ against taper ratio
// for aspect ratios 4–10 (the figure's source is Glauert's calculation).
// Recalled from the figure, not re-read for this test (from memory), so the
// tolerance is the width of a curve and a gridline's reading, ±0.015.
// For aspect ratio 4 and 8 the same figure's rectangular end reads about
// 0.03 and 0.07 (also from memory); the trend, δ rising with aspect ratio
// for a rectangular wing, is the check there.
func TestRectangularDelta(t *testing.T) {
	var prev float64
	for _, ar := range []float64{4, 6, 8} {
		r, err := Solve(Rectangular(ar*0.25, 0.25), Linear{SlopePerRad: twoPi}, 5, Options{})
		if err != nil {
			t.Fatal(err)
		}
		t.Logf("rectangular AR %g: δ = %.4f, e = %.4f", ar, r.Delta, r.Efficiency)
		if ar == 6 && math.Abs(r.Delta-0.05) > 0.015 {
			t.Errorf("AR 6: δ = %.4f, want 0.05 ± 0.015 (Anderson's figure)", r.Delta)
		}
		if r.Delta <= prev {
			t.Errorf("AR %g: δ = %.4f does not rise with aspect ratio (previous %.4f)", ar, r.Delta, prev)
		}
		prev = r.Delta
	}
}

// The collocation converges: the rectangular wing's δ and C_L change by
// less than 1e-4 between DefaultStations and twice as many.
func TestRectangularConverges(t *testing.T) {
	p := Rectangular(1.5, 0.25)
	sec := Linear{SlopePerRad: twoPi}
	a, err := Solve(p, sec, 5, Options{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := Solve(p, sec, 5, Options{Stations: 2 * DefaultStations})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(a.Delta-b.Delta) > 1e-4 || math.Abs(a.CL-b.CL) > 1e-4 {
		t.Errorf("%d stations: δ %.6f C_L %.6f; %d: δ %.6f C_L %.6f", DefaultStations, a.Delta, a.CL, 2*DefaultStations, b.Delta, b.CL)
	}
}

// A table through points of a straight curve gives the straight curve's
// answer (Akima's spline reproduces a straight line), found by the
// nonlinear iteration; the profile drag of a constant section drag is that
// drag (the strip integral of a constant over the area).
func TestTableMatchesLinear(t *testing.T) {
	sec := Linear{SlopePerRad: 5.9, ZeroLiftDeg: -3, Cd: 0.012}
	var al, cl, cd []float64
	for a := -10.0; a <= 16; a += 2 {
		l, _, d, _ := sec.At(a)
		al, cl, cd = append(al, a), append(cl, l), append(cd, d)
	}
	tbl, err := NewTable(al, cl, cd)
	if err != nil {
		t.Fatal(err)
	}
	p := Rectangular(1.2, 0.3)
	want, err := Solve(p, sec, 6, Options{})
	if err != nil {
		t.Fatal(err)
	}
	got, err := Solve(p, tbl, 6, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(got.CL-want.CL) > 1e-9 || math.Abs(got.CDi-want.CDi) > 1e-9 {
		t.Errorf("table: C_L %.10f C_Di %.10f; straight curve: %.10f %.10f", got.CL, got.CDi, want.CL, want.CDi)
	}
	if math.Abs(got.CDp-0.012) > 1e-3*0.012 {
		t.Errorf("profile drag %.6f, want the section's 0.012", got.CDp)
	}
	if got.Iterations < 1 || got.PastMaxLoad {
		t.Errorf("iterations %d, past maximum load %v", got.Iterations, got.PastMaxLoad)
	}
}

// A section that stalls: the wing's load stays below the two-dimensional
// maximum, and an angle whose effective angle leaves the table is refused
// with the range in the message.
func TestTableStallAndRange(t *testing.T) {
	al := []float64{-4, -2, 0, 2, 4, 6, 8, 10, 12, 14}
	cl := make([]float64, len(al))
	for i, a := range al {
		cl[i] = 0.1 * (a + 2)
		if a > 10 {
			cl[i] = 1.2 - 0.1*(a-10)
		}
	}
	tbl, err := NewTable(al, cl, nil)
	if err != nil {
		t.Fatal(err)
	}
	r, err := Solve(Rectangular(1, 0.25), tbl, 11.5, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !(r.CL < 1.2) {
		t.Errorf("C_L %.3f not below the section's maximum 1.2", r.CL)
	}
	if !math.IsNaN(r.CDp) {
		t.Errorf("profile drag %g without section drag, want NaN", r.CDp)
	}
	// From 0° the table has no angle below the study's 0.5° minus its
	// induced angle.
	short, err := NewTable(al[2:], cl[2:], nil)
	if err != nil {
		t.Fatal(err)
	}
	_, err = Solve(Rectangular(1, 0.25), short, 0.5, Options{})
	var re *RangeError
	if !errors.As(err, &re) {
		t.Fatalf("error %v, want a RangeError", err)
	}
}

func TestNewTableRefuses(t *testing.T) {
	for _, c := range []struct {
		name   string
		al, cl []float64
	}{
		{"too few", []float64{0, 1}, []float64{0, 0.1}},
		{"not increasing", []float64{0, 2, 1, 3}, []float64{0, 0.1, 0.2, 0.3}},
		{"too few finite", []float64{0, 1, 2, 3}, []float64{0, math.NaN(), 0.2, math.NaN()}},
	} {
		t.Run(c.name, func(t *testing.T) {
			if _, err := NewTable(c.al, c.cl, nil); err == nil {
				t.Error("no error")
			}
		})
	}
}

func ExampleSolve() {
	// An untwisted rectangular wing of span 1.5 m and chord 0.25 m (AR 6)
	// with a thin-aerofoil section at 5°.
	r, err := Solve(Rectangular(1.5, 0.25), Linear{SlopePerRad: 2 * math.Pi}, 5, Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("AR %.0f: C_L %.3f, C_Di %.4f, e %.3f\n", r.AspectRatio, r.CL, r.CDi, r.Efficiency)
	// Output:
	// AR 6: C_L 0.395, C_Di 0.0087, e 0.954
}
