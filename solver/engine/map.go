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
	// CompareWithSolve also solves every point that started from a
	// neighbour as `solve` solves it, and says how the two compare
	// (Point.Single); it costs a start from the march at every point.
	CompareWithSolve bool
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
// Warm starts (the "each point warm-starts from its neighbour"):
// a viscous map walks its grid in chains (mapWalk: along the angle of
// attack when it varies, from the angle nearest zero, as a polar is
// walked; else rows along the second variable, or a one-variable map
// outwards from its middle), and each point starts from its
// predecessor's converged solution (the solver carries the layers over
// to the point's own panel system, pitched, moved or resized, by arc
// length; its own fallbacks end with a start from the march), a chain's
// first point from the chain before's; when that does not converge it
// tries the next converged neighbour solved before it (mapSeeds,
// fromSeeds), one, within rescueIterations Newton iterations an attempt.
// A point
// without a converged neighbour is solved as `solve` solves it. Which
// neighbour a point started from never depends on how the goroutines
// ran. Point.StartedFrom names it, and Point.Single says what is known
// of a single solve of the setting: the point's answer is that of the
// root of the coupled equations its neighbour led to, which is `solve`'s
// within SolveAgreementTolerance where the equations have one root near
// there, and may be another where they have two (DEVELOPERS.md: near a
// slot and past maximum lift). With opt.CompareWithSolve every such
// point is also solved as `solve` solves it and compared (SingleAgrees,
// SingleAnotherRoot with solve's numbers, SingleNoAnswer); a point that
// did not converge from its neighbours takes solve's answer when that
// converges. Every point of an inviscid map is `solve`'s answer exactly.
//
// Chains run on opt.Workers goroutines (rows of a two-variable map; the
// two halves of a one-variable map); a chain's points wait for the
// neighbours they may start from on the chain before, so both cores stay
// busy, the second a point or two behind the first. progress(done,
// total) and each(point) are called after every point, one call at a
// time (never concurrently) from the map's goroutines, in the order the
// points finish; either may be nil. A caller with a window hands the
// point to its UI goroutine.
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

	alpha, clearance := -1, -1
	for a, v := range vars {
		switch v.Kind {
		case model.SetupAlpha:
			alpha = a
		case model.SetupClearance:
			clearance = a
		}
	}
	walk := newMapWalk(axes, alpha, clearance)
	chains := walk.chains()
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
	if !opt.Inviscid {
		seeds = newMapSeeds(walk)
	}
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for chain := range work {
				ps := newPointSolver(st, secs, vars, opt.PointOptions)
				ps.compare = opt.CompareWithSolve
				for _, k := range chain {
					idx := gridIndex(k, axes)
					values := make([]float64, len(axes))
					for a, i := range idx {
						values[a] = axes[a][i]
					}
					if seeds != nil {
						ps.neighbours = func(ctx context.Context, _ []float64, n int) []seed {
							return seeds.neighbours(ctx, k, n)
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

// gridIndex returns the per-axis indices of flat index k (row-major).
func gridIndex(k int, axes [][]float64) []int {
	idx := make([]int, len(axes))
	for a := len(axes) - 1; a >= 0; a-- {
		idx[a] = k % len(axes[a])
		k /= len(axes[a])
	}
	return idx
}

// MapMode returns "coupled" or "inviscid": how Map solves st's points
// under opt with these variables.
func MapMode(st *model.Study, opt PointOptions, vars []model.SetupVariable) string {
	if ViscousFor(st, opt, vars) {
		return string(model.ViscousCoupled)
	}
	return "inviscid"
}
