package solver

import (
	"testing"

	bl "sectionbench/solver/boundarylayer"
)

// branchJump rejects a layer that crosses H0 (the least H*), from above
// to below it or from below to above, within less than its momentum
// thickness where its edge speed does not fall, and nothing else: not the
// same layer where the speed falls (the recovery that reattaches a
// bubble's turbulent layer; the adverse gradient that separates a layer)
// or over a longer interval, nor one that stays on one side, nor a wake. Re 1e6
// on a unit chord, θ 0.006 and Ue 1: Reθ 6000, H0 3.07; the stations
// 0.0004 chord (0.07 θ) apart unless the case says otherwise.
func TestBranchJump(t *testing.T) {
	for _, tc := range []struct {
		name       string
		kind       bl.Kind
		h          [2]float64
		ue         [2]float64
		dxi        float64 // 0: 0.0004
		wantReject bool
	}{
		{"separated to attached at one speed", bl.Turbulent, [2]float64{4.06, 2.31}, [2]float64{0.997, 0.997}, 0, true},
		{"separated to attached, the speed rising", bl.Turbulent, [2]float64{3.9, 2.3}, [2]float64{1.10, 1.11}, 0, true},
		{"near H0 on both sides at one speed", bl.Turbulent, [2]float64{3.13, 2.92}, [2]float64{0.955, 0.955}, 0, true},
		{"separated to attached, the speed falling", bl.Turbulent, [2]float64{4.06, 2.31}, [2]float64{1.0, 0.95}, 0, false},
		{"separated to attached over two θ", bl.Turbulent, [2]float64{4.06, 2.31}, [2]float64{0.997, 0.997}, 0.012, false},
		{"staying separated", bl.Turbulent, [2]float64{4.06, 4.10}, [2]float64{0.997, 0.997}, 0, false},
		{"attached to separated at one speed", bl.Turbulent, [2]float64{2.9, 3.4}, [2]float64{0.997, 0.997}, 0, true},
		{"attached to separated, the speed rising", bl.Turbulent, [2]float64{2.9, 3.4}, [2]float64{0.997, 1.0}, 0, true},
		{"attached to separated, the speed falling", bl.Turbulent, [2]float64{2.9, 3.4}, [2]float64{1.0, 0.95}, 0, false},
		{"attached to separated over two θ", bl.Turbulent, [2]float64{2.9, 3.4}, [2]float64{0.997, 0.997}, 0.012, false},
		{"staying attached", bl.Turbulent, [2]float64{2.3, 2.9}, [2]float64{0.997, 0.997}, 0, false},
		{"laminar, attached to separated at one speed", bl.Laminar, [2]float64{3.0, 5.0}, [2]float64{1, 1}, 0, true},
		{"laminar, separated to attached at one speed", bl.Laminar, [2]float64{5.0, 3.0}, [2]float64{1, 1}, 0, true},
		{"wake", bl.Wake, [2]float64{4.06, 2.31}, [2]float64{0.997, 0.997}, 0, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			const theta = 0.006
			dxi := tc.dxi
			if dxi == 0 {
				dxi = 0.0004
			}
			var sf CoupledSurface
			for k := range 2 {
				sf.Stations = append(sf.Stations, CoupledStation{Xi: 1 + dxi*float64(k), XC: 1 - dxi + dxi*float64(k), Ue: tc.ue[k], Theta: theta, DStar: tc.h[k] * theta, H: tc.h[k], Regime: tc.kind})
			}
			s := &CoupledSolution{state: &coupledState{re: 1e6}, Elements: []CoupledElement{{Name: "main", Chord: 1, Upper: sf}}}
			if got := branchJump(s) != ""; got != tc.wantReject {
				t.Errorf("H %.2f → %.2f, Ue %.3f → %.3f: rejected %v, want %v", tc.h[0], tc.h[1], tc.ue[0], tc.ue[1], got, tc.wantReject)
			}
		})
	}
}
