package solver

import (
	"math"
	"math/rand/v2"
	"sync"
	"testing"

	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

func randomMatrix(n, lda int, seed uint64) []float64 {
	r := rand.New(rand.NewPCG(seed, 1))
	a := make([]float64, (n-1)*lda+n)
	for i := range a {
		a[i] = r.NormFloat64()
	}
	return a
}

// TestLUFactorSameAsGetrf checks luFactor against gonum's
// lapack64.Getrf, which it must reproduce to the last bit (factors,
// pivots and the singular flag): unblocked and blocked sizes, a padded
// row stride, a matrix with exact zeros and a singular one.
func TestLUFactorSameAsGetrf(t *testing.T) {
	cases := []struct {
		name   string
		n, lda int
		edit   func(a []float64, n, lda int)
	}{
		{name: "one", n: 1, lda: 1},
		{name: "unblocked", n: 40, lda: 40},
		{name: "one panel", n: 64, lda: 64},
		{name: "a panel and a column", n: 65, lda: 65},
		{name: "two elements' stations", n: 388, lda: 388},
		{name: "padded stride", n: 150, lda: 161},
		{name: "sparse", n: 200, lda: 200, edit: func(a []float64, n, lda int) {
			for i := range n {
				for j := range n {
					if (i*7+j*3)%5 == 0 {
						a[i*lda+j] = 0
					}
				}
			}
		}},
		{name: "singular", n: 130, lda: 130, edit: func(a []float64, n, lda int) {
			for i := range n {
				a[i*lda+70] = 0
			}
		}},
	}
	for k, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			a := randomMatrix(c.n, c.lda, uint64(k+1))
			if c.edit != nil {
				c.edit(a, c.n, c.lda)
			}
			want := append([]float64(nil), a...)
			wantPiv := make([]int, c.n)
			wantOK := lapack64.Getrf(blas64.General{Rows: c.n, Cols: c.n, Stride: c.lda, Data: want}, wantPiv)
			piv := make([]int, c.n)
			ok := luFactor(a, c.n, c.lda, piv)
			if ok != wantOK {
				t.Fatalf("nonsingular %v, Getrf says %v", ok, wantOK)
			}
			for i := range a {
				if math.Float64bits(a[i]) != math.Float64bits(want[i]) {
					t.Fatalf("element %d is %v, Getrf's %v", i, a[i], want[i])
				}
			}
			for i := range piv {
				if piv[i] != wantPiv[i] {
					t.Fatalf("pivot %d is %d, Getrf's %d", i, piv[i], wantPiv[i])
				}
			}
		})
	}
}

func benchLU(b *testing.B, factor func(a []float64, n int, ipiv []int) bool) {
	const n = 388
	src := randomMatrix(n, n, 7)
	b.ResetTimer()
	var wg sync.WaitGroup
	for range 2 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			a := make([]float64, n*n)
			piv := make([]int, n)
			for range b.N {
				copy(a, src)
				factor(a, n, piv)
			}
		}()
	}
	wg.Wait()
}

// BenchmarkLUGetrfTwoAtOnce and BenchmarkLUFactorTwoAtOnce factorise a
// matrix of the two-element example's Δm system's size (388 stations)
// on two goroutines at once, as a map's two chains do; compare their
// CPU time (user), the wall clock being the other sessions' too.
func BenchmarkLUGetrfTwoAtOnce(b *testing.B) {
	benchLU(b, func(a []float64, n int, ipiv []int) bool {
		return lapack64.Getrf(blas64.General{Rows: n, Cols: n, Stride: n, Data: a}, ipiv)
	})
}

func BenchmarkLUFactorTwoAtOnce(b *testing.B) {
	benchLU(b, func(a []float64, n int, ipiv []int) bool { return luFactor(a, n, n, ipiv) })
}
