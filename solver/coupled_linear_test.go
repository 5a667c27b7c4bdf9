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
