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
// `solve` of them does not converge. Elsewhere no
// point can start from another: the solver's warm start needs the very
// panel system it started from, which a change of clearance, gap, overlap
// or deflection (or of angle in ground effect, where the wing pitches)
// rebuilds, and a change of speed changes the Reynolds numbers the engine
// keys its warm start on; every point there, and every point of an
// inviscid map, is `solve`'s answer exactly.
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

	chains := mapChains(st, vars, axes)
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
					p, err := ps.solve(ctx, values)
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
// down, so that both workers have one. Otherwise no point can start from
// another and each point is a chain of its own.
func mapChains(st *model.Study, vars []model.SetupVariable, axes [][]float64) [][]int {
	walk := -1
	for a, v := range vars {
		if v.Kind == model.SetupAlpha && !st.Ground.Enabled {
			walk = a
		}
	}
	total := 1
	for _, ax := range axes {
		total *= len(ax)
	}
	if walk < 0 {
		chains := make([][]int, total)
		for k := range chains {
			chains[k] = []int{k}
		}
		return chains
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
