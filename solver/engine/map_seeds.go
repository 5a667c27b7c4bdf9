package engine

import (
	"context"
	"sync"

	"sectionbench/solver"
)

// mapSeeds holds the converged coupled solutions of a viscous map's points
// while their neighbours may need them, for the rescue of a point that
// did not converge from its own start (pointSolver.solve). A point may
// start again only from neighbours that come before it in the map's
// order: in a row the points before it, and the row before (rowChains);
// in a one-variable map the points between it and the middle. It waits
// for such a neighbour to be solved, so that which neighbour rescued a
// point, and so its answer, does not depend on how the goroutines ran.
// Chains are handed out in order and a point never waits for a later
// chain, so the waits end. A solution is dropped as soon as every point
// that may start from it is solved (each holds its panel system, about
// 10 MB for the two-element example), so a map holds a few rows' worth
// at most, however long it is.
type mapSeeds struct {
	axes  [][]float64
	ready []chan struct{} // closed when the point is solved
	mu    sync.Mutex
	sols  []*solver.CoupledSolution // converged ones still needed
	users []int                     // per point, the points not yet solved that may start from it
}

func newMapSeeds(axes [][]float64) *mapSeeds {
	total := 1
	for _, ax := range axes {
		total *= len(ax)
	}
	m := &mapSeeds{axes: axes, ready: make([]chan struct{}, total), sols: make([]*solver.CoupledSolution, total), users: make([]int, total)}
	for k := range m.ready {
		m.ready[k] = make(chan struct{})
		for _, j := range m.before(k) {
			m.users[j]++
		}
	}
	return m
}

// solved records point k's converged solution (nil: none), releases
// whoever waits for it, and drops the solutions no later point needs.
func (m *mapSeeds) solved(k int, sol *solver.CoupledSolution) {
	m.mu.Lock()
	if m.users[k] > 0 {
		m.sols[k] = sol
	}
	for _, j := range m.before(k) {
		if m.users[j]--; m.users[j] == 0 {
			m.sols[j] = nil
		}
	}
	m.mu.Unlock()
	close(m.ready[k])
}

// held returns how many solutions the map holds now (for tests).
func (m *mapSeeds) held() int {
	m.mu.Lock()
	defer m.mu.Unlock()
	n := 0
	for _, s := range m.sols {
		if s != nil {
			n++
		}
	}
	return n
}

// before returns the neighbours point k may start again from, nearest
// first (in grid steps; ties in the order listed): in a row the point
// before it, the row before's point beside it and those diagonal to it,
// the point two before; in a one-variable map the one or two points
// towards the middle.
func (m *mapSeeds) before(k int) []int {
	if len(m.axes) == 1 {
		n := len(m.axes[0])
		mid := n / 2
		step := -1 // the up half [mid, n) walks up from mid
		if k < mid {
			step = 1 // the down half walks down from mid-1, after mid
		}
		var out []int
		for d := 1; d <= 2; d++ {
			j := k + d*step
			if j < 0 || j >= n || (step < 0 && j < mid) {
				break
			}
			out = append(out, j)
		}
		return out
	}
	inner := len(m.axes[1])
	i, j := k/inner, k%inner
	var out []int
	add := func(ii, jj int) {
		if ii >= 0 && jj >= 0 && jj < inner {
			out = append(out, ii*inner+jj)
		}
	}
	add(i, j-1)
	add(i-1, j)
	add(i-1, j-1)
	add(i-1, j+1)
	add(i, j-2)
	return out
}

// neighbours returns the converged solutions of point k's neighbours
// (before) with their settings, nearest first, waiting for each to be
// solved; nil when ctx ends first.
func (m *mapSeeds) neighbours(ctx context.Context, k int) []seed {
	var out []seed
	for _, j := range m.before(k) {
		select {
		case <-m.ready[j]:
		case <-ctx.Done():
			return nil
		}
		m.mu.Lock()
		s := m.sols[j]
		m.mu.Unlock()
		if s != nil {
			at := make([]float64, len(m.axes))
			for a, i := range gridIndex(j, m.axes) {
				at[a] = m.axes[a][i]
			}
			out = append(out, seed{at: at, sol: s})
		}
	}
	return out
}
