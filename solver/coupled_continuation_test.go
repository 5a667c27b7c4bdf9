package solver

import (
	"context"
	"math"
	"testing"
)

// A long step of the continuation that does not converge puts back all
// it changed, the layout and the edge velocities of the march carried
// onto it included: the continuation then goes on as it would have
// without it, to the last bit.
func TestContinuationLongStepRestores(t *testing.T) {
	sys := mustSystem(t, Config{Elements: []Element{nacaElement(t, "0012", 160)}})
	opt := CoupledOptions{Re: []float64{6e6}, TripUpper: 0.05, TripLower: 0.05}
	ctx := context.Background()
	run := func(detour bool) *coupledState {
		cs, err := newCoupledState(sys.Solve(4), opt)
		if err != nil {
			t.Fatal(err)
		}
		cs.strategy = strategies[0]
		cs.ueMarch = cs.march()
		for _, lam := range []float64{0, 0.1} {
			cs.lam = lam
			if _, _, _, err := cs.iterate(ctx, homotopyMaxIter, 0, homotopyTolerance); err != nil {
				t.Fatal(err)
			}
		}
		if detour {
			var saved stepSave
			cs.saveForStep(&saved)
			cs.lam = 0.9
			if _, _, _, err := cs.iterate(ctx, 2, 0, homotopyTolerance); err != nil {
				t.Fatal(err)
			}
			stag := append([]int(nil), cs.stag...)
			stag[0]++
			cs.relayout(stag)
			cs.restoreForStep(saved)
		}
		cs.lam = 0.2
		if _, _, _, err := cs.iterate(ctx, homotopyMaxIter, 0, homotopyTolerance); err != nil {
			t.Fatal(err)
		}
		return cs
	}
	want, got := run(false), run(true)
	same := func(a, b []float64) bool {
		if len(a) != len(b) {
			return false
		}
		for i := range a {
			if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
				return false
			}
		}
		return true
	}
	for _, c := range []struct {
		name      string
		got, want []float64
	}{
		{"ñ or √Cτ", got.c, want.c},
		{"θ", got.th, want.th},
		{"m", got.m, want.m},
		{"the march's edge velocities", got.ueMarch, want.ueMarch},
	} {
		if !same(c.got, c.want) {
			t.Errorf("%s after a failed long step differ from the continuation's without it", c.name)
		}
	}
	if len(got.st) != len(want.st) || got.stag[0] != want.stag[0] {
		t.Errorf("layout after a failed long step: %d stations, stagnation panel %d; want %d and %d", len(got.st), got.stag[0], len(want.st), want.stag[0])
	}
}
