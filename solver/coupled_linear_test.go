package solver

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// dmSolver against a dense direct solve (gonum's mat.Dense.Solve): the
// first system is factorised, a nearby one is solved by GMRES through
// the first one's factors, a distant one is factorised again; each
// solution to within what its residual bound allows.
func TestDMSolver(t *testing.T) {
	const n = 120
	rng := rand.New(rand.NewPCG(3, 11))
	// A diagonally weighted random matrix (condition number of order
	// 10², as the Δm systems' rows are dominated by their own station).
	base := make([]float64, n*n)
	for i := range n {
		for j := range n {
			base[i*n+j] = rng.NormFloat64() / math.Sqrt(n)
		}
		base[i*n+i] += 4
	}
	perturbed := func(eps float64) []float64 {
		m := append([]float64(nil), base...)
		for i := range m {
			m[i] += eps * rng.NormFloat64() / math.Sqrt(n)
		}
		return m
	}
	rhs := make([]float64, n)
	for i := range rhs {
		rhs[i] = rng.NormFloat64()
	}
	var s dmSolver
	cases := []struct {
		name               string
		m                  []float64
		wantFactorisations int
		wantKrylovSolves   int
	}{
		{"first system: factorised", base, 1, 0},
		{"a change of 1 %: GMRES through the kept factors", perturbed(0.01), 1, 1},
		{"another change of 1 %: GMRES again", perturbed(0.01), 1, 2},
		{"a change of 300 %: factorised again", perturbed(3), 2, 2},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := append([]float64(nil), c.m...)
			b := append([]float64(nil), rhs...)
			if !s.solve(m, n, b) {
				t.Fatal("reported singular")
			}
			for i := range m {
				if m[i] != c.m[i] {
					t.Fatal("the matrix was changed")
				}
			}
			var want mat.VecDense
			if err := want.SolveVec(mat.NewDense(n, n, c.m), mat.NewVecDense(n, rhs)); err != nil {
				t.Fatal(err)
			}
			// ‖x − x*‖ ≤ cond · dmTolerance · ‖x*‖ with cond ≲ 10;
			// 1e-9 relative leaves room for the direct solve's own
			// rounding.
			d, w := 0.0, 0.0
			for i := range n {
				d = math.Max(d, math.Abs(b[i]-want.AtVec(i)))
				w = math.Max(w, math.Abs(want.AtVec(i)))
			}
			if d > 1e-9*w {
				t.Errorf("largest difference %.3g of %.3g", d, w)
			}
			if s.factorisations != c.wantFactorisations || s.krylovSolves != c.wantKrylovSolves {
				t.Errorf("%d factorisations and %d GMRES solves, want %d and %d", s.factorisations, s.krylovSolves, c.wantFactorisations, c.wantKrylovSolves)
			}
		})
	}
}

// The reduced Δm system of a Newton step applied without forming it
// (mulReduced) against the matrix formed row by row (formReduced), and
// the back-substitution's Q Δm against Q's formed rows: on main element
// and flap at 4° (Re 1e6 and 0.35e6, tripped), from the march, coupled
// (λ = 1), the two are the same operator, so they agree to rounding: a
// few ε times the sum of the terms' magnitudes.
func TestReducedSystemProduct(t *testing.T) {
	sys, err := NewSystem(mainAndFlap(t))
	if err != nil {
		t.Fatal(err)
	}
	cs, err := newCoupledState(sys.Solve(4), CoupledOptions{Re: []float64{1e6, 0.35e6}, TripUpper: 0.05, TripLower: 0.05})
	if err != nil {
		t.Fatal(err)
	}
	cs.march()
	if _, _, _, ok := cs.newtonStep(); !ok {
		t.Fatal("Newton step failed")
	}
	n := len(cs.st)
	m := append([]float64(nil), cs.formReduced()...)
	q := cs.work.q
	rng := rand.New(rand.NewPCG(5, 7))
	for trial := range 3 {
		x := make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64() * cs.m[i]
		}
		y := make([]float64, n)
		cs.mulReduced(x, y)
		for i := range n {
			want, scale := 0.0, 0.0
			for j, xj := range x {
				want += m[i*n+j] * xj
				scale += math.Abs(m[i*n+j] * xj)
			}
			if d := math.Abs(y[i] - want); d > 1e-12*scale {
				t.Fatalf("trial %d, row %d: M x %.15g without forming M, %.15g formed (terms' magnitudes %.3g)", trial, i, y[i], want, scale)
			}
			for r := range 2 {
				want, scale = 0, 0
				for j, xj := range x {
					want += q[(2*i+r)*n+j] * xj
					scale += math.Abs(q[(2*i+r)*n+j] * xj)
				}
				if d := math.Abs(cs.work.qx[i][r] - want); d > 1e-12*scale {
					t.Fatalf("trial %d, station %d: (Q x)_%d %.15g without forming Q, %.15g formed", trial, i, r, cs.work.qx[i][r], want)
				}
			}
		}
	}
}
