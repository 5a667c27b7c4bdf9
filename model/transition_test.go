package model

import (
	"fmt"
	"math"
	"testing"
)

// TestTurbulenceForN checks Mack's correlation N = −8.43 − 2.4 ln Tu (Mack,
// JPL Publication 77-15, 1977) at the values commonly quoted with it
// (common practice): N = 9 for a quiet tunnel at Tu ≈ 0.07 %, and back.
func TestTurbulenceForN(t *testing.T) {
	cases := []struct {
		name   string
		n, tu  float64
		relTol float64
	}{
		{"quiet wind tunnel, N 9", 9, 0.00070, 0.02}, // Tu 0.070 % to two figures
		{"N 4", 4, 0.0056, 0.02},
		{"N 1", 1, 0.0197, 0.02},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := TurbulenceForN(c.n)
			if math.Abs(got-c.tu) > c.relTol*c.tu {
				t.Errorf("Tu(%g) = %.5f, want %.5f ± %.0f %%", c.n, got, c.tu, 100*c.relTol)
			}
			if back := -8.43 - 2.4*math.Log(got); math.Abs(back-c.n) > 1e-12 {
				t.Errorf("N from Tu = %g, want %g", back, c.n)
			}
		})
	}
}

func ExampleTurbulenceForN() {
	fmt.Printf("%.2f %%\n", 100*TurbulenceForN(DefaultTransitionN))
	// Output: 0.07 %
}
