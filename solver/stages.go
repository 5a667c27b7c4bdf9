package solver

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"sectionbench/model"
)

// StageTimes are the median wall-clock durations of the solver's stages
// over the repeats of MeasureStages.
type StageTimes struct {
	Assembly      time.Duration // influence matrix, right-hand sides and 1-norm
	Factorization time.Duration // LU factorisation and condition estimate
	Solve         time.Duration // the unit solutions, the sweep forms and one Solve at the first angle
	Sweep         time.Duration // Sweep over every angle, on the factorised system
	Field         time.Duration // velocity on the nx×ny grid, including the field's cluster tree
	Unknowns      int           // size of the linear system
	Points        int           // grid points of the field stage
	Repeats       int
}

// ErrBadMeasure reports unusable arguments of MeasureStages.
var ErrBadMeasure = errors.New("bad stage-timing request")

// MeasureStages times the stages of one solve of cfg, repeats times, and
// returns their medians: assembly of the influence system, its
// factorisation (with the condition estimate), the unit solutions with one
// Solve at alphas[0], a Sweep over alphas, and Solution.Velocity on an
// nx × ny grid spanning grid (corners included). Validation of the geometry
// is done once, outside the timings. Each repeat starts from the geometry,
// so nothing is cached between repeats; the stages run one after the other
// as in NewSystem, except that the condition estimate is timed with the
// factorisation here rather than beside the unit solves.
//
// The medians are robust to a few slow repeats on a shared machine but not
// to a machine that stays busy: report the load beside them. Geometry
// problems return the *GeometryError of NewSystem and a singular matrix a
// *SingularError; repeats < 1, nx or ny < 2, an empty grid, no angles, a
// non-finite angle or, in ground mode, an angle other than 0 return an
// error wrapping ErrBadMeasure.
func MeasureStages(cfg Config, alphas []float64, grid Rect, nx, ny, repeats int) (StageTimes, error) {
	bad := func(format string, a ...any) (StageTimes, error) {
		return StageTimes{}, fmt.Errorf("solver: MeasureStages: %w: %s", ErrBadMeasure, fmt.Sprintf(format, a...))
	}
	switch {
	case repeats < 1:
		return bad("repeats %d < 1", repeats)
	case nx < 2 || ny < 2:
		return bad("grid of %d × %d points, need at least 2 × 2", nx, ny)
	case !(grid.Max.X > grid.Min.X && grid.Max.Y > grid.Min.Y):
		return bad("empty grid %v", grid)
	case len(alphas) == 0:
		return bad("no angles")
	}
	for _, a := range alphas {
		if math.IsNaN(a) || math.IsInf(a, 0) || (cfg.Ground && a != 0) {
			return bad("angle %g (ground mode takes 0 only)", a)
		}
	}
	g, err := newGeometry(cfg)
	if err != nil {
		return StageTimes{}, err
	}
	pts := fieldGrid(grid, nx, ny)
	u, v := make([]float64, len(pts)), make([]float64, len(pts))
	var asm, fac, sol, swp, fld []time.Duration
	for range repeats {
		t0 := time.Now()
		a, b, anorm := g.assemble(context.Background())
		t1 := time.Now()
		s := &System{geo: g}
		if err := s.factorize(a, anorm); err != nil {
			return StageTimes{}, err
		}
		t2 := time.Now()
		if err := s.solveUnit(b); err != nil {
			return StageTimes{}, err
		}
		s.prepare()
		first := s.Solve(alphas[0])
		t3 := time.Now()
		s.Sweep(alphas)
		t4 := time.Now()
		first.Velocity(pts, u, v, nil)
		t5 := time.Now()
		asm, fac, sol = append(asm, t1.Sub(t0)), append(fac, t2.Sub(t1)), append(sol, t3.Sub(t2))
		swp, fld = append(swp, t4.Sub(t3)), append(fld, t5.Sub(t4))
	}
	return StageTimes{
		Assembly: median(asm), Factorization: median(fac), Solve: median(sol),
		Sweep: median(swp), Field: median(fld),
		Unknowns: g.n, Points: len(pts), Repeats: repeats,
	}, nil
}

// median returns the middle value of d (the mean of the two middle ones
// for an even count); it reorders d.
func median(d []time.Duration) time.Duration {
	slices.Sort(d)
	n := len(d)
	if n%2 == 1 {
		return d[n/2]
	}
	return (d[n/2-1] + d[n/2]) / 2
}

// fieldGrid returns an nx × ny grid of points over r, corners included,
// row after row from the bottom; nx, ny ≥ 2.
func fieldGrid(r Rect, nx, ny int) []model.Point {
	pts := make([]model.Point, 0, nx*ny)
	for j := range ny {
		for i := range nx {
			pts = append(pts, model.Point{
				X: r.Min.X + (r.Max.X-r.Min.X)*float64(i)/float64(nx-1),
				Y: r.Min.Y + (r.Max.Y-r.Min.Y)*float64(j)/float64(ny-1),
			})
		}
	}
	return pts
}
