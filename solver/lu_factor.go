package solver

import (
	"runtime"
	"sync/atomic"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	lapackgonum "gonum.org/v1/gonum/lapack/gonum"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// solving counts the goroutines in System.SolveCoupled (all of it
// numerics: wakes, sensitivities, marches, Newton iterations), for
// factorise.
var solving atomic.Int32

// factorise LU-factorises the n × n row-major a in place (P A = L U,
// partial pivoting) to the same bits either way: on the calling
// goroutine (luFactor) when at least as many coupled solutions as
// GOMAXPROCS are being solved at once (a map or a search solves two
// points at a time; on a two-core machine that is every map), where
// Getrf's workers would only wait for cores that are busy; otherwise
// through gonum's lapack64.Getrf, whose trailing updates run on all
// cores. ok is false if a is singular.
func factorise(a []float64, n int, ipiv []int) (ok bool) {
	if int(solving.Load()) >= runtime.GOMAXPROCS(0) {
		return luFactor(a, n, n, ipiv)
	}
	return lapack64.Getrf(blas64.General{Rows: n, Cols: n, Stride: n, Data: a}, ipiv)
}

// luBlock is the panel width of luFactor: gonum's Dgetrf's (its Ilaenv
// for DGETRF).
const luBlock = 64

// luFactor factorises the n × n row-major a (row stride lda) in place as
// P A = L U with partial pivoting, as lapack64.Getrf does and to the
// last bit: the same
// blocked right-looking algorithm (Golub & Van Loan, Matrix Computations,
// 4th ed., 2013, Algorithm 3.4.2) through gonum's own Dgetf2, Dlaswp and
// Dtrsm, with the trailing update A22 −= L21 U12 made on the calling
// goroutine, one row at a time in gonum's serial Dgemm's order (each
// element updated by ascending k, a zero multiplier skipped). gonum's
// Dgemm splits that update between goroutines by 64 × 64 blocks; when
// the cores are already busy with other solutions (factorise), the
// workers' start and join cost more than they gain.
// ok is false if a is singular (the factors are still computed).
func luFactor(a []float64, n, lda int, ipiv []int) (ok bool) {
	if lda < n || len(a) < (n-1)*lda+n || len(ipiv) < n {
		panic("solver: luFactor: the matrix or the pivots are too short")
	}
	var impl lapackgonum.Implementation
	bi := blas64.Implementation()
	nb := luBlock
	if n <= nb {
		return impl.Dgetf2(n, n, a, lda, ipiv[:n])
	}
	ok = true
	for j := 0; j < n; j += nb {
		jb := min(n-j, nb)
		if !impl.Dgetf2(n-j, jb, a[j*lda+j:], lda, ipiv[j:j+jb]) {
			ok = false
		}
		for i := j; i < j+jb; i++ {
			ipiv[i] += j
		}
		impl.Dlaswp(j, a, lda, j, j+jb-1, ipiv[:j+jb], 1)
		if j+jb >= n {
			continue
		}
		impl.Dlaswp(n-j-jb, a[j+jb:], lda, j, j+jb-1, ipiv[:j+jb], 1)
		bi.Dtrsm(blas.Left, blas.Lower, blas.NoTrans, blas.Unit,
			jb, n-j-jb, 1, a[j*lda+j:], lda, a[j*lda+j+jb:], lda)
		// A22 −= L21 U12, as gonum's dgemmSerialNotNot with α = −1.
		w := n - j - jb
		for i := j + jb; i < n; i++ {
			c := a[i*lda+j+jb : i*lda+n]
			for l, v := range a[i*lda+j : i*lda+j+jb] {
				if t := -v; t != 0 {
					bi.Daxpy(w, t, a[(j+l)*lda+j+jb:(j+l)*lda+n], 1, c, 1)
				}
			}
		}
	}
	return ok
}
