package engine

import (
	"math"
	"slices"
	"testing"

	"sectionbench/solver"
)

// The bank gives the nearest solutions first in its scale (ties: the
// newest), none at the point itself or beyond its reach, keeps the
// newest ones only, and a clone does not see later additions.
func TestSeedBank(t *testing.T) {
	sols := make([]*solver.CoupledSolution, 5)
	for i := range sols {
		sols[i] = &solver.CoupledSolution{AlphaDeg: float64(i)}
	}
	b := newSeedBank([]float64{5, 0.5}, 4, 2.01) // a map's steps: 5 mm, 0.5°
	b.add([]float64{40, 1}, sols[0])
	b.add([]float64{45, 1}, sols[1])
	b.add([]float64{50, 1.5}, sols[2])
	c := b.clone()
	b.add([]float64{50, 0.5}, sols[3])
	b.add(nil, nil) // nothing to keep
	alphas := func(ss []seed) []float64 {
		var a []float64
		for _, s := range ss {
			a = append(a, s.sol.AlphaDeg)
		}
		return a
	}
	for _, tc := range []struct {
		name string
		bank *seedBank
		at   []float64
		n    int
		want []float64
	}{
		{"a step away, the newest first", b, []float64{50, 1}, 4, []float64{3, 2, 1, 0}},
		{"at a seed: not itself", b, []float64{45, 1}, 3, []float64{0, 3, 2}},
		{"out of reach", b, []float64{70, 1}, 3, nil},
		{"clone before the last", c, []float64{50, 1}, 3, []float64{2, 1, 0}},
		{"at most n", b, []float64{50, 1}, 1, []float64{3}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := alphas(tc.bank.nearest(tc.at, tc.n)); !slices.Equal(got, tc.want) {
				t.Errorf("nearest(%v) = %v, want %v", tc.at, got, tc.want)
			}
		})
	}
	b.add([]float64{55, 1}, sols[4]) // the fifth: the first goes
	if got := alphas(b.nearest([]float64{35, 1}, 5)); !slices.Equal(got, []float64{1}) {
		t.Errorf("after the limit: %v, want only the second (the first dropped)", got)
	}
	all := newSeedBank([]float64{1}, 2, math.Inf(1))
	all.add([]float64{0}, sols[0])
	all.add([]float64{100}, sols[1])
	if got := alphas(all.nearest([]float64{60}, 2)); !slices.Equal(got, []float64{1, 0}) {
		t.Errorf("unbounded reach: %v", got)
	}
}

// Rows in order along the second variable; one variable as two halves
// walking outward from the middle; along the angle of attack from the
// angle nearest zero, up then down, whichever axis it is; along the
// clearance, when it varies with another, from the top down.
func TestMapWalkChains(t *testing.T) {
	for _, tc := range []struct {
		name             string
		axes             [][]float64
		alpha, clearance int
		want             [][]int
	}{
		{"one variable", [][]float64{{1, 2, 3, 4, 5}}, -1, -1, [][]int{{2, 3, 4}, {1, 0}}},
		{"one value", [][]float64{{1}}, -1, -1, [][]int{{0}}},
		{"two variables", [][]float64{{1, 2}, {1, 2, 3}}, -1, -1, [][]int{{0, 1, 2}, {3, 4, 5}}},
		{"angle, one variable", [][]float64{{-2, -1, 0, 1}}, 0, -1, [][]int{{2, 3}, {1, 0}}},
		{"angle second", [][]float64{{1, 2}, {-1, 0, 1}}, 1, -1, [][]int{{1, 2, 0}, {4, 5, 3}}},
		{"angle first", [][]float64{{-1, 0, 1}, {1, 2}}, 0, -1, [][]int{{2, 4, 0}, {3, 5, 1}}},
		{"clearance and angle: down from the top", [][]float64{{40, 60, 80}, {0, 1}}, 1, 0, [][]int{{4, 2, 0}, {5, 3, 1}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := newMapWalk(tc.axes, tc.alpha, tc.clearance).chains()
			if !slices.EqualFunc(got, tc.want, slices.Equal) {
				t.Errorf("chains = %v, want %v", got, tc.want)
			}
		})
	}
}

// A map point starts only from neighbours solved before it, nearest
// first: its predecessor on its chain, the chain before's; in one
// variable towards the middle, across it for the down half's first point.
func TestMapSeedsBefore(t *testing.T) {
	for _, tc := range []struct {
		name             string
		axes             [][]float64
		alpha, clearance int
		k                int
		want             []int
	}{
		{"first row, first point", [][]float64{{1, 2}, {1, 2, 3}}, -1, -1, 0, nil},
		{"first row", [][]float64{{1, 2}, {1, 2, 3}}, -1, -1, 2, []int{1, 0}},
		{"second row, first point", [][]float64{{1, 2}, {1, 2, 3}}, -1, -1, 3, []int{0, 1}},
		{"second row, middle", [][]float64{{1, 2}, {1, 2, 3}}, -1, -1, 4, []int{3, 1, 0, 2}},
		{"one variable, the middle", [][]float64{{1, 2, 3, 4, 5}}, -1, -1, 2, nil},
		{"one variable, up", [][]float64{{1, 2, 3, 4, 5}}, -1, -1, 4, []int{3, 2}},
		{"one variable, down from the middle", [][]float64{{1, 2, 3, 4, 5}}, -1, -1, 1, []int{2, 3}},
		{"one variable, down", [][]float64{{1, 2, 3, 4, 5}}, -1, -1, 0, []int{1, 2}},
		{"angle first, second chain's start", [][]float64{{-1, 0, 1}, {1, 2}}, 0, -1, 3, []int{2, 4}},
		{"angle first, second chain, below zero", [][]float64{{-1, 0, 1}, {1, 2}}, 0, -1, 1, []int{3, 0, 2, 5}},
		{"clearance, second chain", [][]float64{{40, 60, 80}, {0, 1}}, 1, 0, 3, []int{5, 2, 4, 0}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := newMapWalk(tc.axes, tc.alpha, tc.clearance).before(tc.k); !slices.Equal(got, tc.want) {
				t.Errorf("before(%d) = %v, want %v", tc.k, got, tc.want)
			}
		})
	}
}

// A map's seeds hold a solution only while a point that may start from it
// is unsolved: walking a long one-variable map or a two-variable one in
// the map's order, never more than a few at once, none at the end.
func TestMapSeedsDrop(t *testing.T) {
	for _, tc := range []struct {
		name    string
		axes    [][]float64
		maxHeld int
	}{
		{"one variable of 201 points", [][]float64{make([]float64, 201)}, 4},
		{"two variables, 20 by 20", [][]float64{make([]float64, 20), make([]float64, 20)}, 2*20 + 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			w := newMapWalk(tc.axes, -1, -1)
			m := newMapSeeds(w)
			most := 0
			for _, chain := range w.chains() { // one chain after another
				for _, k := range chain {
					m.solved(k, &solver.CoupledSolution{})
					most = max(most, m.held())
				}
			}
			if most > tc.maxHeld || m.held() != 0 {
				t.Errorf("held at most %d (want ≤ %d), %d at the end (want 0)", most, tc.maxHeld, m.held())
			}
		})
	}
}
