package engine

import (
	"context"
	"runtime"
	"sync"

	"sectionbench/model"
)

// MapOptions are the settings of a map.
type MapOptions struct {
	PointOptions
	// Workers is the number of goroutines solving points; 0 means two
	// (the machine the tool is built for has two cores), or fewer when
	// GOMAXPROCS is lower.
	Workers int
}

// Map solves st at every point of the grid its ranges span (one or two
// model.SetupRange from model.ParseSetupRange; the first range is the
// outer one of the returned grid, whose points are in row-major order:
// points[i*len(second)+j] has Values {first[i], second[j]}).
//
// Before solving it checks the ranges against the study
// (model.Study.CheckSetup) and returns that *model.SetupError, and the
// viscous solution's need of a speed when it cannot get one. A point that
// cannot be solved or does not converge is in the grid as such (Point.Err,
// Point.Converged); it is not an error. Cancellation returns ctx.Err()
// and no points.
//
// Warm starts: when the angle of attack varies in free air, the grid is
// walked in chains along it (one per value of the other variable), each
// chain from the angle nearest zero up, then down, as a polar is. Each
// point is first solved as `solve` solves it (the viscous solution from
// the march, and if that fails a walk out from 0°), so that wherever that
// converges the map gives `solve`'s numbers exactly; when it does not
// converge, the point is solved again from the last converged point of
// its chain (Engine.Run's warm start). That second try makes more points
// converge, at the cost of time; those points are the map's own and a
// `solve` of them does not converge. Elsewhere (clearance, gap, overlap,
// deflection, speed, or angle in ground effect, where the wing pitches)
// the grid is walked in rows (rowChains) and each point is first solved
// as `solve` solves it too; one that does not converge is solved again
// from the nearest two converged neighbours solved before it (mapSeeds:
// in its row and the row before, or towards the middle of a one-variable
// map; the solver carries a neighbour's layers over to another panel
// system of as many elements and panels, by arc length), each attempt
// within rescueIterations Newton iterations, so that a hopeless point
// gives up quickly. Every point that converges from its own start, and
// every point of an inviscid map, is `solve`'s answer exactly; the
// rescued ones are the map's own, and which neighbour rescued a point
// never depends on how the goroutines ran.
//
// Chains run on opt.Workers goroutines (rows of a two-variable map; the
// two halves of a one-variable map). progress(done, total) and each(point)
// are called after every point, one call at a time (never concurrently)
// from the map's goroutines, in the order the points finish; either may be
// nil. A caller with a window hands the point to its UI goroutine.
func Map(ctx context.Context, st *model.Study, secs []*model.Section, ranges []model.SetupRange, opt MapOptions, progress func(done, total int), each func(Point)) ([]Point, error) {
	if len(ranges) < 1 || len(ranges) > 2 {
		panic("engine: Map: one or two ranges")
	}
	if len(secs) != len(st.Elements) {
		panic("engine: Map: one section per element")
	}
	if err := st.CheckSetup(ranges); err != nil {
		return nil, err
	}
	vars := make([]model.SetupVariable, len(ranges))
	axes := make([][]float64, len(ranges))
	total := 1
	for i, r := range ranges {
		if r.Step == 0 {
			panic("engine: Map: a range without a step")
		}
		vars[i], axes[i] = r.Var, r.Values()
		total *= len(axes[i])
	}
	if !opt.Inviscid && !ViscousFor(st, opt.PointOptions, vars) {
		// The study cannot have a viscous solution: the map is inviscid,
		// as the study says by having neither speed nor Reynolds number.
		opt.Inviscid = true
	}

	walk := alphaWalk(st, vars)
	chains := mapChains(axes, walk)
	points := make([]Point, total)
	workers := opt.Workers
	if workers <= 0 {
		workers = min(2, runtime.GOMAXPROCS(0))
	}
	workers = min(workers, len(chains))

	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	work := make(chan []int)
	var mu sync.Mutex // serialises each, progress and done
	done := 0
	var firstErr error
	var wg sync.WaitGroup
	var seeds *mapSeeds
	if walk < 0 && !opt.Inviscid { // a walk in α has its own warm start (runColdFirst)
		seeds = newMapSeeds(axes)
	}
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for chain := range work {
				ps := newPointSolver(st, secs, vars, opt.PointOptions)
				for _, k := range chain {
					idx := gridIndex(k, axes)
					values := make([]float64, len(axes))
					for a, i := range idx {
						values[a] = axes[a][i]
					}
					if seeds != nil {
						ps.neighbours = func(ctx context.Context, _ []float64) []seed {
							return seeds.neighbours(ctx, k)
						}
					}
					p, err := ps.solve(ctx, values)
					if seeds != nil && err == nil {
						seeds.solved(k, ps.last)
					}
					if err != nil {
						mu.Lock()
						if firstErr == nil {
							firstErr = err
						}
						mu.Unlock()
						cancel()
						return
					}
					p.Index = idx
					points[k] = p
					mu.Lock()
					done++
					if each != nil {
						each(p)
					}
					if progress != nil {
						progress(done, total)
					}
					mu.Unlock()
				}
			}
		}()
	}
feed:
	for _, c := range chains {
		select {
		case work <- c:
		case <-ctx.Done():
			break feed
		}
	}
	close(work)
	wg.Wait()
	if firstErr != nil {
		return nil, firstErr
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	return points, nil
}

// alphaWalk returns the index of the angle of attack among vars when the
// map walks it as a polar (in free air), -1 otherwise.
func alphaWalk(st *model.Study, vars []model.SetupVariable) int {
	walk := -1
	for a, v := range vars {
		if v.Kind == model.SetupAlpha && !st.Ground.Enabled {
			walk = a
		}
	}
	return walk
}

// gridIndex returns the per-axis indices of flat index k (row-major).
func gridIndex(k int, axes [][]float64) []int {
	idx := make([]int, len(axes))
	for a := len(axes) - 1; a >= 0; a-- {
		idx[a] = k % len(axes[a])
		k /= len(axes[a])
	}
	return idx
}

// mapChains returns the flat grid indices in the chains Map walks. When
// the angle of attack varies in free air, the chains run along it, one
// per value of the other axis, in a polar's order (sweepOrder); a
// one-variable map is split at its start into the walk up and the walk
// down, so that both workers have one. Otherwise the chains are
// rowChains'.
func mapChains(axes [][]float64, walk int) [][]int {
	if walk < 0 {
		return rowChains(axes)
	}
	order := sweepOrder(axes[walk])
	if len(axes) == 1 {
		var up, down []int
		for _, i := range order {
			if i >= order[0] {
				up = append(up, i)
			} else {
				down = append(down, i)
			}
		}
		if len(down) == 0 {
			return [][]int{up}
		}
		return [][]int{up, down}
	}
	other := 1 - walk
	chains := make([][]int, len(axes[other]))
	for j := range axes[other] {
		for _, i := range order {
			idx := [2]int{}
			idx[walk], idx[other] = i, j
			chains[j] = append(chains[j], idx[0]*len(axes[1])+idx[1])
		}
	}
	return chains
}

// MapMode returns "coupled" or "inviscid": how Map solves st's points
// under opt with these variables.
func MapMode(st *model.Study, opt PointOptions, vars []model.SetupVariable) string {
	if ViscousFor(st, opt, vars) {
		return string(model.ViscousCoupled)
	}
	return "inviscid"
}

// rowChains returns the chains of a map whose points cannot start from
// one another's own engine (no angle of attack walked in free air): a
// one-variable map as two halves walking outward from its middle, a
// two-variable map as its rows (along the second variable), in order, so
// that a point that does not converge finds converged neighbours before
// it in its own row and in the row before to start again from
// (mapSeeds).
func rowChains(axes [][]float64) [][]int {
	if len(axes) == 1 {
		n := len(axes[0])
		mid := n / 2
		var up, down []int
		for i := mid; i < n; i++ {
			up = append(up, i)
		}
		for i := mid - 1; i >= 0; i-- {
			down = append(down, i)
		}
		if len(down) == 0 {
			return [][]int{up}
		}
		return [][]int{up, down}
	}
	inner := len(axes[1])
	chains := make([][]int, len(axes[0]))
	for i := range chains {
		for j := range inner {
			chains[i] = append(chains[i], i*inner+j)
		}
	}
	return chains
}
