package main

import (
	"context"
	"math"

	"sectionbench/export/figure"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver/engine"
)

// reportSetupFlags are the report's set-up page options: a map over one
// variable (the ride height, normally), a setting search and the
// finite-span estimate.
type reportSetupFlags struct {
	mapRange   string
	inviscid   bool
	limit      float64
	finiteSpan bool

	search          varyFlag
	searchObjective string
	searchInviscid  bool
	searchMax       int
}

func addReportSetupFlags(fs *flags) *reportSetupFlags {
	f := &reportSetupFlags{}
	fs.StringVar(&f.mapRange, "map", "", "add a set-up page with downforce (or lift) against one variable, `NAME=FROM:TO:STEP` as map's --vary (e.g. clearance_mm=20:200:20), the separation onset marked")
	fs.BoolVar(&f.inviscid, "map-inviscid", false, "solve the --map with the panel method only (default: the coupled viscous solution whenever the study has a speed or a Reynolds number)")
	fs.Float64Var(&f.limit, "separation-limit", 0.9, "mark --map points whose suction side separates ahead of this x/c, and keep every suction side of the --search attached to it")
	fs.BoolVar(&f.finiteSpan, "finite-span", false, "add the finite-span estimate (lifting line over the study's polar; needs flow.span_m) to the set-up page")
	fs.Var(&f.search, "search", "add the best setting a search finds to the set-up page: a variable and its bounds `NAME=LO:HI` as search's --vary (repeat the flag for another variable)")
	fs.StringVar(&f.searchObjective, "search-objective", "downforce", "what the --search optimises: `downforce` (the most), lift-to-drag (the best ratio) or drag (the least, at no less downforce than the start's)")
	fs.BoolVar(&f.searchInviscid, "search-inviscid", false, "solve the --search with the panel method only (then no separation limit)")
	fs.IntVar(&f.searchMax, "search-max-evaluations", engine.DefaultSearchEvaluations, "the most `solves` the --search may make")
	return f
}

// setup runs what the flags ask for st and returns the report's set-up
// page, nil when they ask for nothing. Bad flags are usage errors.
func (f *reportSetupFlags) setup(st *model.Study, secs []*model.Section) (*report.Setup, error) {
	if f.mapRange == "" && !f.finiteSpan && len(f.search) == 0 {
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
		out.CurveNote = report.CurveNote(len(points), how, "report --map "+f.mapRange, failed, f.limit)
	}
	if len(f.search) > 0 {
		if err := f.runSearch(ctx, st, secs, out); err != nil {
			return nil, err
		}
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

// runSearch runs the --search and puts its answer on the page.
func (f *reportSetupFlags) runSearch(ctx context.Context, st *model.Study, secs []*model.Section, out *report.Setup) error {
	obj, err := engine.ParseObjective(f.searchObjective)
	if err != nil {
		return usagef("--search-objective %v", err)
	}
	if f.searchMax < 1 {
		return usagef("--search-max-evaluations %d: at least 1", f.searchMax)
	}
	var bounds []model.SetupRange
	for _, s := range f.search {
		b, err := model.ParseSetupBounds(s)
		if err != nil {
			return usagef("--search %v", err)
		}
		bounds = append(bounds, b)
	}
	if err := st.CheckSetup(bounds); err != nil {
		return usagef("--search %v", err)
	}
	vars := rangeVars(bounds)
	opt := engine.SearchOptions{
		PointOptions: engine.PointOptions{Inviscid: f.searchInviscid, CoupledMaxIterations: coupledMaxIterations},
		Objective:    obj, MaxEvaluations: f.searchMax,
	}
	if engine.ViscousFor(st, opt.PointOptions, vars) {
		opt.AttachedToXC = f.limit
	}
	res, err := engine.Search(ctx, st, secs, bounds, opt, nil)
	if err != nil {
		return setupUsage(err)
	}
	out.Search, out.SearchVars, out.SearchOptions = res, vars, opt
	return nil
}
