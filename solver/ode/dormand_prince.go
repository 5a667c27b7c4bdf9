package ode

import (
	"fmt"
	"math"
)

// Func evaluates the right-hand side of y′ = f(x, y) into dy (len(dy) ==
// len(y)). It returns false where f is not defined (inside a body, a
// non-physical state): the step that asked fails and the caller shrinks it.
type Func func(x float64, y, dy []float64) bool

// DormandPrince takes steps of the explicit Runge–Kutta pair of Dormand and
// Prince (J. R. Dormand and P. J. Prince, "A family of embedded Runge–Kutta
// formulae", J. Comput. Appl. Math. 6(1), 1980, pp. 19–26; coefficients as
// tabulated by E. Hairer, S. P. Nørsett and G. Wanner, Solving Ordinary
// Differential Equations I, 2nd ed., Springer, 1993, sec. II.5, Table 5.2).
//
// Seven stages k₁…k₇ give the fifth-order solution
//
//	y₁ = y₀ + h Σ bᵢ kᵢ,
//
// the seventh stage being f(x₀ + h, y₁) (first same as last: it is the next
// step's k₁), and the difference between the fifth- and the embedded
// fourth-order solution,
//
//	e = h Σ (bᵢ − b̂ᵢ) kᵢ,
//
// estimates the local error of the fourth-order one, O(h⁵). The values of
// a DormandPrince are stages for one system size; it is not safe for
// concurrent use (give each goroutine its own).
type DormandPrince struct {
	k   [5][]float64 // k₂…k₆ (k₁ and k₇ are the caller's)
	tmp []float64
}

// Dormand–Prince 5(4) coefficients (Hairer, Nørsett & Wanner, Table 5.2):
// nodes c, the Runge–Kutta matrix a, the fifth-order weights b (b₂ = b₇ = 0)
// and the error weights e = b − b̂ (fifth minus fourth order).
var (
	dpC = [7]float64{0, 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9, 1, 1}
	dpA = [6][]float64{
		{1.0 / 5},
		{3.0 / 40, 9.0 / 40},
		{44.0 / 45, -56.0 / 15, 32.0 / 9},
		{19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729},
		{9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176, -5103.0 / 18656},
		{35.0 / 384, 0, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84},
	}
	dpE = [7]float64{71.0 / 57600, 0, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525, -1.0 / 40}
)

// NewDormandPrince returns the stages for a system of n equations. It
// panics if n < 1.
func NewDormandPrince(n int) *DormandPrince {
	if n < 1 {
		panic(fmt.Sprintf("ode: NewDormandPrince of %d equations", n))
	}
	d := &DormandPrince{tmp: make([]float64, n)}
	for i := range d.k {
		d.k[i] = make([]float64, n)
	}
	return d
}

// Advance computes stages k₂…k₆ of a step of size h from (x, y), with k1 =
// f(x, y) given, and writes the fifth-order solution at x + h to y1. It
// returns false, with y1 undefined, when f fails at a stage. The step is
// finished by Error (after the caller evaluates k₇ = f(x + h, y1), its
// next k₁) or dropped (when the caller rejects y1 for its own reasons).
// It panics if the lengths differ from the system's.
func (d *DormandPrince) Advance(f Func, x float64, y, k1 []float64, h float64, y1 []float64) bool {
	n := len(d.tmp)
	if len(y) != n || len(k1) != n || len(y1) != n {
		panic(fmt.Sprintf("ode: Advance of a %d-equation system with y %d, k1 %d, y1 %d values", n, len(y), len(k1), len(y1)))
	}
	stage := func(j int) []float64 { // k_{j+1}, j = 0…5
		if j == 0 {
			return k1
		}
		return d.k[j-1]
	}
	for s, row := range dpA {
		out := d.tmp
		if s == len(dpA)-1 {
			out = y1 // the last row holds the weights b
		}
		for c := range n {
			sum := 0.0
			for j, a := range row {
				sum += a * stage(j)[c]
			}
			out[c] = y[c] + h*sum
		}
		if s == len(dpA)-1 {
			return true
		}
		if !f(x+dpC[s+1]*h, out, d.k[s]) {
			return false
		}
	}
	return true
}

// Error writes to e the error estimate h Σ (bᵢ − b̂ᵢ) kᵢ of the step that
// the last Advance took, given k1 (as passed to Advance) and k7 = f(x + h,
// y1). It panics if the lengths differ from the system's.
func (d *DormandPrince) Error(h float64, k1, k7, e []float64) {
	n := len(d.tmp)
	if len(k1) != n || len(k7) != n || len(e) != n {
		panic(fmt.Sprintf("ode: Error of a %d-equation system with k1 %d, k7 %d, e %d values", n, len(k1), len(k7), len(e)))
	}
	for c := range n {
		e[c] = h * (dpE[0]*k1[c] + dpE[2]*d.k[1][c] + dpE[3]*d.k[2][c] + dpE[4]*d.k[3][c] + dpE[5]*d.k[4][c] + dpE[6]*k7[c])
	}
}

// Step-size controller constants (Hairer, Nørsett & Wanner, eq. II.4.13
// and the text after it): the safety factor, the smallest and largest
// change of h per step, and the exponent 1/(q + 1) for the error of the
// fourth-order (q = 4) solution.
const (
	safety   = 0.9
	minScale = 0.2
	maxScale = 5.0
	errExp   = 1.0 / 5
)

// StepScale returns the factor for the next step size after a step whose
// error, measured in units of the tolerance, is ratio (≤ 1 accepted):
//
//	h_new = h · min(5, max(0.2, 0.9 · ratio^(−1/5)))
//
// (Hairer, Nørsett & Wanner, eq. II.4.13). A zero ratio gives the largest
// growth, a non-finite or negative one the largest cut.
func StepScale(ratio float64) float64 {
	switch {
	case ratio == 0:
		return maxScale
	case !(ratio > 0) || math.IsInf(ratio, 1):
		return minScale
	}
	return math.Min(maxScale, math.Max(minScale, safety*math.Pow(ratio, -errExp)))
}
