package ui

// The set-up window's runs off the UI goroutine (each with a panic turned
// into an error), its figures and its default ranges.

import (
	"context"
	"io"
	"math"

	figures "sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/model"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// setupVariables lists the set-up variables st can vary, in the order the
// window offers them: the angle of attack, the clearance (ground on), the
// speed, then each flap's deflection, gap and overlap.
func setupVariables(st *model.Study) []model.SetupVariable {
	vs := []model.SetupVariable{{Kind: model.SetupAlpha}}
	if st.Ground.Enabled {
		vs = append(vs, model.SetupVariable{Kind: model.SetupClearance})
	}
	vs = append(vs, model.SetupVariable{Kind: model.SetupSpeed})
	for k := 1; k < len(st.Elements); k++ {
		for _, kind := range []model.SetupKind{model.SetupDeflection, model.SetupGap, model.SetupOverlap} {
			vs = append(vs, model.SetupVariable{Kind: kind, Element: k})
		}
	}
	return vs
}

// runMap runs a set-up map (engine.Map); a panic becomes an error.
func runMap(ctx context.Context, st *model.Study, secs []*model.Section, ranges []model.SetupRange, opt engine.MapOptions, progress func(done, total int), each func(engine.Point)) (pts []engine.Point, err error) {
	defer func() {
		if r := recover(); r != nil {
			pts, err = nil, session.InternalError("in the set-up map", r)
		}
	}()
	return engine.Map(ctx, st, secs, ranges, opt, progress, each)
}

// runFiniteSpan runs the finite-span estimate of st (engine.FiniteSpan);
// a panic becomes an error.
func runFiniteSpan(ctx context.Context, st *model.Study, secs []*model.Section, progress func(done, total int)) (fs *engine.FiniteSpan, err error) {
	defer func() {
		if r := recover(); r != nil {
			fs, err = nil, session.InternalError("in the finite-span estimate", r)
		}
	}()
	fs, _, err = engine.NewEngine().FiniteSpan(ctx, engine.Request{Study: st, Sections: secs, Progress: progress})
	return fs, err
}

// applySetupValues sets each variable to its value in a copy of st.
func applySetupValues(st *model.Study, vars []model.SetupVariable, values []float64, secs []*model.Section) (*model.Study, error) {
	next := st.Clone()
	if err := next.ApplySetupAll(vars, values, secs); err != nil {
		return nil, err
	}
	return next, nil
}

// writeMapTable writes a map's points as CSV (format.WriteMapTable).
func writeMapTable(w io.Writer, st *model.Study, program string, vars []model.SetupVariable, points []engine.Point) error {
	return format.WriteMapTable(w, format.Metadata{Study: st.Name, AlphaDeg: math.NaN(), Program: program}, st, vars, points)
}

func renderSetupCurve(c figures.SetupCurve, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	p, err := figures.SetupCurvePlot(c, dark)
	if err != nil {
		return nil, err
	}
	return figures.RenderPlot(p, false, w, h, dpi), nil
}

func renderSetupGrid(g figures.SetupGrid, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	p, err := figures.SetupGridPlot(g, dark)
	if err != nil {
		return nil, err
	}
	return figures.RenderPlot(p, false, w, h, dpi), nil
}

func renderSpanLoad(s figures.SpanLoad, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	p, err := figures.SpanLoadPlot(s, dark)
	if err != nil {
		return nil, err
	}
	return figures.RenderPlot(p, false, w, h, dpi), nil
}

func renderSearch(title, objective string, steps []figures.SearchStep, maximise, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	return figures.RenderSearch(title, objective, steps, maximise, dark, w, h, dpi)
}

// parseSetupRange reads a map's range of v from its three numbers
// (model.ParseSetupRange checks them).
func parseSetupRange(v model.SetupVariable, from, to, step float64) (model.SetupRange, error) {
	return model.ParseSetupRange(v.Name() + "=" + entryNum(from) + ":" + entryNum(to) + ":" + entryNum(step))
}

// parseSetupBounds reads a search's bounds of v (model.ParseSetupBounds
// checks them).
func parseSetupBounds(v model.SetupVariable, lo, hi float64) (model.SetupRange, error) {
	return model.ParseSetupBounds(v.Name() + "=" + entryNum(lo) + ":" + entryNum(hi))
}

// setupDefaults suggests a range for v around its value x in st: about
// nine values either side of the setting, within what a study accepts.
func setupDefaults(st *model.Study, v model.SetupVariable, x float64) (from, to, step float64) {
	switch v.Kind {
	case model.SetupAlpha:
		return math.Round(x) - 4, math.Round(x) + 4, 1
	case model.SetupClearance:
		// Ride height from a tenth of the reference chord to twice the
		// setting, in about eight round steps.
		c := st.Elements[0].ChordMM
		if st.ReferenceChordMM > 0 {
			c = st.ReferenceChordMM
		}
		hi := math.Max(2*x, 0.5*c)
		step := roundStep((hi - 0.1*c) / 8)
		lo := math.Max(step, math.Round(0.1*c/step)*step)
		return lo, lo + step*math.Ceil((hi-lo)/step), step
	case model.SetupSpeed:
		return 10, 40, 5
	case model.SetupDeflection:
		return math.Round(x) - 10, math.Round(x) + 10, 2.5
	case model.SetupGap:
		lo := math.Max(1, math.Round(x)-6)
		return lo, lo + 12, 2
	}
	return math.Round(x) - 6, math.Round(x) + 6, 2
}

// roundStep returns the largest step of the form 1, 2 or 5 × 10ⁿ that
// is at most d (d > 0).
func roundStep(d float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(d)))
	step := p
	for _, m := range []float64{2, 5} {
		if m*p <= d {
			step = m * p
		}
	}
	return step
}

// The search's objectives in the window's order.
var searchObjectives = []engine.Objective{engine.ObjectiveDownforce, engine.ObjectiveLiftToDrag, engine.ObjectiveDrag}

// runSearch runs a setting search (engine.Search); a panic becomes an
// error.
func runSearch(ctx context.Context, st *model.Study, secs []*model.Section, bounds []model.SetupRange, opt engine.SearchOptions, each func(engine.Point)) (res *engine.SearchResult, err error) {
	defer func() {
		if r := recover(); r != nil {
			res, err = nil, session.InternalError("in the setting search", r)
		}
	}()
	return engine.Search(ctx, st, secs, bounds, opt, each)
}
