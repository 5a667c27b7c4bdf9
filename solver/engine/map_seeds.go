package engine

import (
	"context"
	"sync"

	"sectionbench/solver"
)

// mapWalk is the order a map walks its grid in: chains along one axis
// (walk), each from the index start outwards (up to the axis's end, then
// down from start), one chain per value of the other axis, in order; a
// one-variable map has two chains, the walk up from start and the walk
// down from the index below it, so that both cores have one. Each point
// of a viscous map starts from its predecessor on its chain (pred), and
// a chain's first point from the chain before it (mapSeeds.before).
type mapWalk struct {
	axes  [][]float64
	walk  int // the axis the chains run along
	start int // the index along it each chain starts from
}

// newMapWalk returns the walk of a map over axes, given the index among
// them of the angle of attack (alpha) and of the ground clearance
// (clearance), −1 for a variable not varied. A two-variable map with the
// clearance walks along it from the largest clearance down towards the
// ground (a step of the clearance changes the flow least, and the
// layers far from the ground converge most easily: on the two-element
// example at 5°, 5 mm steps took 16 Newton iterations a point above
// 80 mm, where 0.5° steps of α took 7 to 300); otherwise it walks along
// the angle of attack when it varies, from the angle nearest zero, as a
// polar is walked; otherwise a one-variable map from its middle and a
// two-variable map along its second variable from its first value (rows
// in order).
func newMapWalk(axes [][]float64, alpha, clearance int) mapWalk {
	switch {
	case len(axes) == 2 && clearance >= 0:
		return mapWalk{axes: axes, walk: clearance, start: len(axes[clearance]) - 1}
	case alpha >= 0:
		return mapWalk{axes: axes, walk: alpha, start: sweepOrder(axes[alpha])[0]}
	case len(axes) == 1:
		return mapWalk{axes: axes, walk: 0, start: len(axes[0]) / 2}
	default:
		return mapWalk{axes: axes, walk: 1, start: 0}
	}
}

// along returns the indices of the walk axis in a chain's order from
// start: up to the end, then down from start−1.
func (w mapWalk) along() (up, down []int) {
	n := len(w.axes[w.walk])
	for i := w.start; i < n; i++ {
		up = append(up, i)
	}
	for i := w.start - 1; i >= 0; i-- {
		down = append(down, i)
	}
	return up, down
}

// chains returns the flat grid indices (row-major) in the chains the map
// walks, in the order they are handed out.
func (w mapWalk) chains() [][]int {
	up, down := w.along()
	if len(w.axes) == 1 {
		if len(down) == 0 {
			return [][]int{up}
		}
		return [][]int{up, down}
	}
	other := 1 - w.walk
	order := append(up, down...)
	chains := make([][]int, len(w.axes[other]))
	for c := range chains {
		for _, i := range order {
			chains[c] = append(chains[c], w.flat(i, c))
		}
	}
	return chains
}

// flat returns the flat index of the point at index i along the walk
// axis and c along the other.
func (w mapWalk) flat(i, c int) int {
	if len(w.axes) == 1 {
		return i
	}
	idx := [2]int{}
	idx[w.walk], idx[1-w.walk] = i, c
	return idx[0]*len(w.axes[1]) + idx[1]
}

// pred returns the index along the walk axis solved just before i on its
// chain (towards start), −1 for start itself.
func (w mapWalk) pred(i int) int {
	switch {
	case i > w.start:
		return i - 1
	case i < w.start:
		return i + 1
	}
	return -1
}

// succ returns the index along the walk axis solved just after i on its
// chain (away from start), −1 at an end.
func (w mapWalk) succ(i int) int {
	n := len(w.axes[w.walk])
	switch {
	case i >= w.start && i+1 < n:
		return i + 1
	case i < w.start && i > 0:
		return i - 1
	}
	return -1
}

// before returns the points point k may start from, nearest first (in
// grid steps; ties in the order listed), all solved before it in the
// map's order: its predecessor on its chain, the chain before's point
// beside it and the two diagonal to it, its chain's point two before; in
// a one-variable map the one or two points towards start (across start
// for the first point of the walk down).
func (w mapWalk) before(k int) []int {
	idx := gridIndex(k, w.axes)
	i := idx[w.walk]
	p := w.pred(i)
	p2 := -1
	if p >= 0 {
		p2 = w.pred(p)
		if p2 < 0 && i < w.start && w.start+1 < len(w.axes[w.walk]) {
			p2 = w.start + 1 // the walk down's first point: across start
		}
	}
	var out []int
	add := func(i, c int) {
		if i >= 0 && c >= 0 {
			out = append(out, w.flat(i, c))
		}
	}
	if len(w.axes) == 1 {
		add(p, 0)
		add(p2, 0)
		return out
	}
	c := idx[1-w.walk]
	add(p, c)
	add(i, c-1)
	add(p, c-1)
	add(w.succ(i), c-1)
	add(p2, c)
	return out
}

// mapSeeds holds the converged coupled solutions of a viscous map's points
// while the points after them may start from them (pointSolver.solve). A
// point may start only from points solved before it in the map's order
// (mapWalk.before); it waits for them to be solved, so that which
// neighbour a point started from, and so its answer, does not depend on
// how the goroutines ran. Chains are handed out in order and a point
// never waits for a later chain, so the waits end. A solution is dropped
// as soon as every point that may start from it is solved, so a map holds
// a row's worth or two at most, however long it is; and it holds each as
// a StartCopy, what a start from it reads (on the two-element example
// with 160 panels per element well under 1 MB, where the solution with
// its panel system, source responses and sensitivities takes some 7 MB).
type mapSeeds struct {
	walk  mapWalk
	ready []chan struct{} // closed when the point is solved
	mu    sync.Mutex
	sols  []*solver.CoupledSolution // converged ones still needed
	users []int                     // per point, the points not yet solved that may start from it
}

func newMapSeeds(w mapWalk) *mapSeeds {
	total := 1
	for _, ax := range w.axes {
		total *= len(ax)
	}
	m := &mapSeeds{walk: w, ready: make([]chan struct{}, total), sols: make([]*solver.CoupledSolution, total), users: make([]int, total)}
	for k := range m.ready {
		m.ready[k] = make(chan struct{})
		for _, j := range w.before(k) {
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
		m.sols[k] = sol.StartCopy() // what a start reads: a tenth of the solution
	}
	for _, j := range m.walk.before(k) {
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

// neighbours returns at most n converged solutions of point k's
// neighbours (before) with their settings, nearest first, waiting for
// each to be solved only until it has n; nil when ctx ends first.
func (m *mapSeeds) neighbours(ctx context.Context, k, n int) []seed {
	var out []seed
	for _, j := range m.walk.before(k) {
		if len(out) >= n {
			break
		}
		select {
		case <-m.ready[j]:
		case <-ctx.Done():
			return nil
		}
		m.mu.Lock()
		s := m.sols[j]
		m.mu.Unlock()
		if s != nil {
			at := make([]float64, len(m.walk.axes))
			for a, i := range gridIndex(j, m.walk.axes) {
				at[a] = m.walk.axes[a][i]
			}
			out = append(out, seed{at: at, sol: s})
		}
	}
	return out
}
