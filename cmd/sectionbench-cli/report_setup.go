package main

import (
	"context"
	"fmt"
	"math"

	"sectionbench/export/figure"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// reportSetupFlags are the report's set-up page options: a map over one
// variable (the ride height, normally) and the finite-span estimate.
type reportSetupFlags struct {
	mapRange   string
	inviscid   bool
	limit      float64
	finiteSpan bool
}

func addReportSetupFlags(fs *flags) *reportSetupFlags {
	f := &reportSetupFlags{}
	fs.StringVar(&f.mapRange, "map", "", "add a set-up page with downforce (or lift) against one variable, `NAME=FROM:TO:STEP` as map's --vary (e.g. clearance_mm=20:200:20), the separation onset marked")
	fs.BoolVar(&f.inviscid, "map-inviscid", false, "solve the --map with the panel method only (default: the coupled viscous solution whenever the study has a speed or a Reynolds number)")
	fs.Float64Var(&f.limit, "separation-limit", 0.9, "mark --map points whose suction side separates ahead of this x/c")
	fs.BoolVar(&f.finiteSpan, "finite-span", false, "add the finite-span estimate (lifting line over the study's polar; needs flow.span_m) to the set-up page")
	return f
}

// setup runs what the flags ask for st and returns the report's set-up
// page, nil when they ask for nothing. Bad flags are usage errors.
func (f *reportSetupFlags) setup(st *model.Study, secs []*model.Section) (*report.Setup, error) {
	if f.mapRange == "" && !f.finiteSpan {
		return nil, nil
	}
	if !(f.limit > 0 && f.limit <= 1) {
		return nil, usagef("--separation-limit %g: an x/c above 0 and at most 1", f.limit)
	}
	out := &report.Setup{}
	ctx := context.Background()
	if f.mapRange != "" {
		r, err := model.ParseSetupRange(f.mapRange)
		if err != nil {
			return nil, usagef("--map %v", err)
		}
		if err := st.CheckSetup([]model.SetupRange{r}); err != nil {
			return nil, usagef("--map %v", err)
		}
		opt := engine.PointOptions{Inviscid: f.inviscid, CoupledMaxIterations: coupledMaxIterations}
		points, err := engine.Map(ctx, st, secs, []model.SetupRange{r}, engine.MapOptions{PointOptions: opt}, nil, nil)
		if err != nil {
			return nil, err
		}
		current := math.NaN()
		if len(secs) == len(st.Elements) {
			current = st.SetupValue(r.Var, secs)
		}
		forces := st.Flow.SpeedMPS > 0 || r.Var.Kind == model.SetupSpeed
		out.Curve = figure.MapCurve(st, r.Var, points, engine.QuantityLoad, forces, f.limit, current)
		failed := 0
		for _, p := range points {
			if !p.Converged || p.Err != "" {
				failed++
			}
		}
		how := "with the panel method only (no separation)"
		if engine.ViscousFor(st, opt, []model.SetupVariable{r.Var}) {
			how = "with the coupled viscous solution"
		}
		out.CurveNote = fmt.Sprintf("A map of %d points %s (report --map %s); %d without an answer are crossed on the axis, not drawn; points separating ahead of x/c %g are ringed.",
			len(points), how, f.mapRange, failed, f.limit)
	}
	if f.finiteSpan {
		fs, _, err := engine.NewEngine().FiniteSpan(ctx, engine.Request{Study: st, Sections: secs, CoupledMaxIterations: coupledMaxIterations})
		if err != nil {
			return nil, err
		}
		out.FiniteSpan = fs
	}
	return out, nil
}
