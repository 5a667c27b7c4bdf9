package boundarylayer

import "testing"

// IntervalMemo and WithC are shortcuts of a finite-difference Jacobian:
// they must give IntervalOf's and Eval's numbers to the last bit (the
// coupled solution's roots near a slot move with rounding). Each
// variable of either station is moved in turn, as the Jacobian moves it,
// on a laminar, a turbulent and a wake interval.
func TestMemoSameAsDirect(t *testing.T) {
	const re = 2e6
	for _, tc := range []struct {
		name string
		k    Kind
		a, b Station
	}{
		{"laminar", Laminar, Station{Xi: 0.02, Ue: 1.3, Theta: 4e-5, DStar: 1.1e-4, C: 2.5}, Station{Xi: 0.025, Ue: 1.28, Theta: 4.6e-5, DStar: 1.3e-4, C: 3.1}},
		{"turbulent", Turbulent, Station{Xi: 0.5, Ue: 1.1, Theta: 1e-3, DStar: 1.5e-3, C: 0.03}, Station{Xi: 0.52, Ue: 1.09, Theta: 1.05e-3, DStar: 1.6e-3, C: 0.032}},
		{"wake", Wake, Station{Xi: 0.01, Ue: 0.9, Theta: 2e-3, DStar: 4e-3, C: 0.04}, Station{Xi: 0.02, Ue: 0.92, Theta: 2e-3, DStar: 3.8e-3, C: 0.039}},
	} {
		move := func(st Station, v int) Station {
			switch v {
			case 0:
				st.C += 1e-7
			case 1:
				st.Theta *= 1 + 1e-7
			case 2:
				st.DStar *= 1 + 1e-7
			default:
				st.Ue *= 1 + 1e-7
				st.DStar /= 1 + 1e-7
			}
			return st
		}
		ca, cb := Eval(tc.k, tc.a, re), Eval(tc.k, tc.b, re)
		var m IntervalMemo
		if got, want := m.IntervalOf(tc.k, tc.a, tc.b, ca, cb), IntervalOf(tc.k, tc.a, tc.b, ca, cb); got != want {
			t.Errorf("%s: memo %v, direct %v", tc.name, got, want)
		}
		for v := range 4 {
			ap, bp := move(tc.a, v), move(tc.b, v)
			cap, cbp := Eval(tc.k, ap, re), Eval(tc.k, bp, re)
			if v == 0 {
				if w := WithC(tc.k, cb, bp.C); w != cbp {
					t.Errorf("%s: WithC %+v, Eval %+v", tc.name, w, cbp)
				}
			}
			if got, want := m.IntervalOf(tc.k, tc.a, bp, ca, cbp), IntervalOf(tc.k, tc.a, bp, ca, cbp); got != want {
				t.Errorf("%s, variable %d of b moved: memo %v, direct %v", tc.name, v, got, want)
			}
			if got, want := m.IntervalOf(tc.k, ap, tc.b, cap, cb), IntervalOf(tc.k, ap, tc.b, cap, cb); got != want {
				t.Errorf("%s, variable %d of a moved: memo %v, direct %v", tc.name, v, got, want)
			}
		}
	}
}
