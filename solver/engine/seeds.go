package engine

import (
	"context"
	"math"
	"slices"
	"sync"

	"sectionbench/solver"
)

// seedBank holds the converged coupled solutions of a search's path by
// their setting, for each solve to start from the nearest
// (pointSolver.solve). It is filled by one goroutine in the
// path's order, so that which neighbour a solve starts from, and so its
// answer, does not depend on how the goroutines ran. Distances are measured in scale units
// per variable (a map's step, a search's bounds' width), so that "nearest"
// means the same on every axis. It keeps the newest limit solutions only:
// each (a StartCopy, what a start reads) holds its stations, and the path moves on,
// so the older ones are mostly the far ones. Safe for concurrent use.
type seedBank struct {
	mu    sync.Mutex
	scale []float64
	limit int
	// within is the largest distance, in scale units, a seed may lie
	// from the point it starts (+Inf: any).
	within float64
	seeds  []seed
}

// seed is a converged solution and the setting (the variables' values)
// it was solved at.
type seed struct {
	at  []float64
	sol *solver.CoupledSolution
}

func newSeedBank(scale []float64, limit int, within float64) *seedBank {
	for _, s := range scale {
		if !(s > 0) {
			panic("engine: newSeedBank: scales must be positive")
		}
	}
	return &seedBank{scale: scale, limit: max(1, limit), within: within}
}

// add keeps sol, the converged solution at values.
func (b *seedBank) add(values []float64, sol *solver.CoupledSolution) {
	if sol == nil {
		return
	}
	b.mu.Lock()
	defer b.mu.Unlock()
	if len(b.seeds) >= b.limit {
		b.seeds = slices.Delete(b.seeds, 0, len(b.seeds)-b.limit+1)
	}
	b.seeds = append(b.seeds, seed{at: append([]float64(nil), values...), sol: sol.StartCopy()})
}

// nearest returns at most n solutions within b.within of values, nearest
// first (ties: the newest first), never one at values itself.
func (b *seedBank) nearest(values []float64, n int) []seed {
	b.mu.Lock()
	defer b.mu.Unlock()
	type cand struct {
		d   float64
		age int
		s   seed
	}
	var cs []cand
	for i, s := range b.seeds {
		d := 0.0
		for a, v := range values {
			x := (v - s.at[a]) / b.scale[a]
			d += x * x
		}
		d = math.Sqrt(d)
		if d == 0 || d > b.within {
			continue
		}
		cs = append(cs, cand{d, -i, s})
	}
	slices.SortFunc(cs, func(x, y cand) int {
		if x.d != y.d {
			if x.d < y.d {
				return -1
			}
			return 1
		}
		return x.age - y.age
	})
	var out []seed
	for _, c := range cs[:min(n, len(cs))] {
		out = append(out, c.s)
	}
	return out
}

// neighbours is nearest for pointSolver.neighbours (nil for a nil bank).
func (b *seedBank) neighbours(_ context.Context, values []float64, n int) []seed {
	if b == nil {
		return nil
	}
	return b.nearest(values, n)
}

// clone returns a bank holding b's solutions now, which later additions
// to either do not reach.
func (b *seedBank) clone() *seedBank {
	if b == nil {
		return nil
	}
	b.mu.Lock()
	defer b.mu.Unlock()
	return &seedBank{scale: b.scale, limit: b.limit, within: b.within, seeds: slices.Clone(b.seeds)}
}
