package ui

// The density window's and the panel-size chart's work, run off the UI
// goroutine: the density study with each count's solution kept, and their
// figures.

import (
	"context"
	"io"

	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

// densityOutcome is a finished density study: the solver's judgement and
// the solution at every count, kept for the leading-edge overlay.
type densityOutcome struct {
	res    *engine.DensityResult
	curves []figures.DensityCurve
}

// Defaults of the density window, from the solver and export.
var (
	densityDefaultPanels = engine.DefaultDensityPanels
	densityDefaultTolCl  = engine.DefaultTolClPct
	densityDefaultTolCp  = engine.DefaultTolCpMinPct
	defaultMaxRatio      = figures.DefaultMaxNeighbourRatio
)

// runDensity runs the density study of st (its plan, at its angle of
// attack) in one call of solver.(*Engine).DensityEach, keeping each count's
// solution for the leading-edge overlay, so that nothing is solved twice.
// A panic in the solver becomes an error.
func runDensity(ctx context.Context, st *model.Study, secs []*model.Section, progress func(done, total int)) (out *densityOutcome, err error) {
	defer func() {
		if r := recover(); r != nil {
			out, err = nil, session.InternalError("in the density study", r)
		}
	}()
	var curves []figures.DensityCurve
	keep := func(panels int, nose float64, sol *solver.Solution) {
		curves = append(curves, figures.DensityCurve{Panels: panels, Nose: nose, Solution: sol})
	}
	res, err := engine.NewEngine().DensityEach(ctx, st, secs, progress, keep)
	if err != nil {
		return nil, err
	}
	return &densityOutcome{res: res, curves: curves}, nil
}

// renderDensity draws the convergence figure of a density study.
func renderDensity(res *engine.DensityResult, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	return figures.Render(figures.ViewDensity, &figures.Scene{Density: res, Dark: dark, Element: -1}, w, h, dpi)
}

// renderDensityLE draws the leading-edge Cp of every count on element.
func renderDensityLE(curves []figures.DensityCurve, element int, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	p, err := figures.DensityLEPlot(curves, element, figures.DensityLEChord, dark)
	if err != nil {
		return nil, err
	}
	return figures.RenderPlot(p, false, w, h, dpi), nil
}

// placedPanelSizes places the study's elements with their panelling, as
// the solver does, and returns every element's panel sizes.
func placedPanelSizes(st *model.Study, secs []*model.Section) ([]figures.PanelSizes, error) {
	l, err := model.Place(st, secs)
	if err != nil {
		return nil, err
	}
	return figures.PanelSizesOf(l)
}

// renderPanelSizes draws one element's panel sizes.
func renderPanelSizes(ps figures.PanelSizes, maxRatio float64, dark bool, w, h int, dpi float64) (*figures.Figure, error) {
	p, err := figures.PanelSizesPlot(ps, maxRatio, dark)
	if err != nil {
		return nil, err
	}
	return figures.RenderPlot(p, true, w, h, dpi), nil
}

// writeDensityFigure writes the convergence figure of a density study
// (light, for print).
func writeDensityFigure(w io.Writer, res *engine.DensityResult, format string, widthIn, heightIn, dpi float64) error {
	return figures.WriteFigure(w, figures.ViewDensity, &figures.Scene{Density: res, Element: -1}, format, widthIn, heightIn, dpi)
}

// writePanelSizeFigure writes one element's panel-size chart (light, for
// print).
func writePanelSizeFigure(w io.Writer, ps figures.PanelSizes, maxRatio float64, format string, widthIn, heightIn, dpi float64) error {
	p, err := figures.PanelSizesPlot(ps, maxRatio, false)
	if err != nil {
		return err
	}
	return figures.WritePlot(w, p, format, widthIn, heightIn, dpi)
}
