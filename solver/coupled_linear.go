package solver

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
)

// The Newton step's mass-defect system M Δm = b (newtonStep) is dense,
// one row per station, and its LU factorisation costs O(n³): a third of a
// single element's solution time and more than half of two elements'.
// Between consecutive Newton iterations M changes little (the closures'
// derivatives move with the state; D does not move at all), so the
// factors of an earlier M are a good preconditioner for the current one:
// dmSolver solves M Δm = b by GMRES (Saad & Schultz, SIAM J. Sci. Stat.
// Comput. 7(3), 1986) right-preconditioned with those factors, each
// iteration one product with M and one substitution through the factors,
// O(n²), and factorises M afresh only when GMRES does not reach
// dmTolerance within dmMaxKrylov iterations (after a new layout,
// transition moving, the coupling strength changing in the
// continuation). The step then solves the same equations to a residual
// below dmTolerance × ‖b‖, where the LU's own is of order n ε ‖M‖ ‖Δm‖
// (the Newton iterations converge to 1e-5 of the variables).
type dmSolver struct {
	n     int
	lu    []float64 // LU factors of an earlier M (factorise, as lapack64.Getrf), row-major
	ipiv  []int
	fresh bool // lu holds no factors yet
	// GMRES's workspace: the Krylov basis v (dmMaxKrylov+1 rows of n),
	// the preconditioned directions z (dmMaxKrylov rows), the Hessenberg
	// matrix h in rotated form, the rotations and the residual vector g.
	v, z   []float64
	h      []float64
	cs, sn []float64
	g      []float64
	w, x   []float64
	// Counts, for tests.
	factorisations, krylovSolves, krylovIterations int
}

// GMRES's bounds: a step is accepted when the residual has fallen to
// dmTolerance of ‖b‖ (a few orders above the rounding of a direct solve
// in double precision, and far below what the Newton iterations need,
// which stop at relative changes of 1e-5), within dmMaxKrylov
// iterations; otherwise M is factorised. dmSlowKrylov iterations or more
// mean the factors have aged: the next step factorises directly rather
// than spend them again. An iteration costs about a fiftieth of a
// factorisation at 200 stations, a hundredth at 350 (measured with
// gonum's Getrf on this project's machine).
const (
	dmTolerance  = 1e-11
	dmMaxKrylov  = 20
	dmSlowKrylov = 15
)

func (s *dmSolver) size(n int) {
	if s.n == n {
		return
	}
	k := dmMaxKrylov
	*s = dmSolver{
		n: n, lu: make([]float64, n*n), ipiv: make([]int, n), fresh: true,
		v: make([]float64, (k+1)*n), z: make([]float64, k*n), h: make([]float64, (k+1)*k),
		cs: make([]float64, k), sn: make([]float64, k), g: make([]float64, k+1),
		w: make([]float64, n), x: make([]float64, n),
		factorisations: s.factorisations, krylovSolves: s.krylovSolves, krylovIterations: s.krylovIterations,
	}
}

// linearSystem is the matrix M of a system M x = b: its product with a
// vector (y = M x), and M itself (n × n, row-major) when it is to be
// factorised.
type linearSystem interface {
	mul(x, y []float64)
	dense() []float64
}

// denseSystem is a linearSystem held as its matrix.
type denseSystem struct {
	m []float64
	n int
}

func (d denseSystem) mul(x, y []float64) {
	blas64.Gemv(blas.NoTrans, 1, blas64.General{Rows: d.n, Cols: d.n, Stride: d.n, Data: d.m},
		blas64.Vector{N: d.n, Inc: 1, Data: x}, 0, blas64.Vector{N: d.n, Inc: 1, Data: y})
}

func (d denseSystem) dense() []float64 { return d.m }

// solve solves m x = b (m n×n row-major, kept) in place in b; ok is false
// if m is singular.
func (s *dmSolver) solve(m []float64, n int, b []float64) (ok bool) {
	return s.solveSystem(denseSystem{m, n}, n, b)
}

// solveSystem solves M x = b (n unknowns) in place in b: by GMRES
// through the kept factors, or, failing that, by factorising M (whose
// matrix it asks for only then); ok is false if M is singular.
func (s *dmSolver) solveSystem(sys linearSystem, n int, b []float64) (ok bool) {
	s.size(n)
	if !s.fresh {
		if it, conv := s.krylov(sys, b); conv {
			s.krylovSolves++
			s.krylovIterations += it
			counts.krylovSolves.Add(1)
			if it >= dmSlowKrylov {
				s.fresh = true
			}
			copy(b, s.x)
			return true
		}
	}
	copy(s.lu, sys.dense())
	s.factorisations++
	counts.factorisations.Add(1)
	if !factorise(s.lu, n, s.ipiv) {
		s.fresh = true
		return false
	}
	s.fresh = false
	luSolve(s.lu, n, s.ipiv, b)
	return true
}

// krylov runs GMRES on M x = b from x = 0, right-preconditioned by the
// kept factors, leaving x in s.x; conv reports whether the residual fell
// below dmTolerance ‖b‖, checked on the true residual b − m x.
func (s *dmSolver) krylov(sys linearSystem, b []float64) (iters int, conv bool) {
	n := s.n
	beta := math.Sqrt(dot(b, b))
	if !(beta > 0) || math.IsInf(beta, 0) {
		return 0, false
	}
	k := dmMaxKrylov
	v, z, h, g := s.v, s.z, s.h, s.g
	for i, bi := range b {
		v[i] = bi / beta
	}
	clear(g)
	g[0] = beta
	target := dmTolerance * beta
	j := 0
	for ; j < k; j++ {
		vj := v[j*n : (j+1)*n]
		zj := z[j*n : (j+1)*n]
		copy(zj, vj)
		s.precondition(zj)
		w := v[(j+1)*n : (j+2)*n]
		sys.mul(zj, w)
		// Modified Gram–Schmidt, twice (the basis stays orthogonal
		// to rounding even as the residual falls by eleven orders).
		hj := h[j*(k+1) : (j+1)*(k+1)] // column j of H
		clear(hj)
		for pass := 0; pass < 2; pass++ {
			for i := 0; i <= j; i++ {
				vi := v[i*n : (i+1)*n]
				c := dot(w, vi)
				hj[i] += c
				axpy(-c, vi, w)
			}
		}
		hn := math.Sqrt(dot(w, w))
		hj[j+1] = hn
		if hn > 0 {
			for i := range w {
				w[i] /= hn
			}
		}
		// Apply the earlier rotations to the new column, then make
		// its own.
		for i := 0; i < j; i++ {
			a0, a1 := hj[i], hj[i+1]
			hj[i] = s.cs[i]*a0 + s.sn[i]*a1
			hj[i+1] = -s.sn[i]*a0 + s.cs[i]*a1
		}
		r := math.Hypot(hj[j], hj[j+1])
		if !(r > 0) {
			return j, false
		}
		s.cs[j], s.sn[j] = hj[j]/r, hj[j+1]/r
		hj[j], hj[j+1] = r, 0
		g[j+1] = -s.sn[j] * g[j]
		g[j] = s.cs[j] * g[j]
		if math.Abs(g[j+1]) <= target || hn == 0 {
			j++
			break
		}
	}
	// y from the triangular H, x = Z y.
	y := g[:j]
	for i := j - 1; i >= 0; i-- {
		t := y[i]
		for c := i + 1; c < j; c++ {
			t -= h[c*(k+1)+i] * y[c]
		}
		y[i] = t / h[i*(k+1)+i]
	}
	x := s.x
	clear(x)
	for i := 0; i < j; i++ {
		axpy(y[i], z[i*n:(i+1)*n], x)
	}
	// The true residual.
	sys.mul(x, s.w)
	for i, bi := range b {
		s.w[i] = bi - s.w[i]
	}
	rn := math.Sqrt(dot(s.w, s.w))
	return j, rn <= target && !math.IsNaN(rn)
}

// precondition solves L U x = P b in place through the kept factors
// (the substitutions of BLAS's triangular solves; luSolve keeps
// lapack64.Getrs's order of operations, which a preconditioner need not,
// and is several times slower).
func (s *dmSolver) precondition(b []float64) {
	n := s.n
	for i, p := range s.ipiv[:n] {
		if p != i {
			b[i], b[p] = b[p], b[i]
		}
	}
	lu := s.lu
	for i := 1; i < n; i++ {
		b[i] -= dot(lu[i*n:i*n+i], b[:i])
	}
	for i := n - 1; i >= 0; i-- {
		b[i] = (b[i] - dot(lu[i*n+i+1:i*n+n], b[i+1:n])) / lu[i*n+i]
	}
}

func dot(a, b []float64) float64 {
	return blas64.Dot(blas64.Vector{N: len(a), Inc: 1, Data: a}, blas64.Vector{N: len(b), Inc: 1, Data: b})
}

func axpy(alpha float64, x, y []float64) {
	blas64.Axpy(alpha, blas64.Vector{N: len(x), Inc: 1, Data: x}, blas64.Vector{N: len(y), Inc: 1, Data: y})
}
