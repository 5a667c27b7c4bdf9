package ui

import (
	"errors"
	"image"
	"io"

	figures "sectionbench/export/figure"
	"sectionbench/model"
	"sectionbench/ui/session"
)

// The views' figures: which figure of export/figure each view cell draws,
// drawing one with a panic turned into an error, the data window of a
// drawn figure, and the printed copy of a view.

// exportViews maps the workbench's views to export's.
var exportViews = [numViews]figures.View{figures.ViewPanels, figures.ViewPressure, figures.ViewStreamlines, figures.ViewPolar}

func renderView(v viewKind, sc *figures.Scene, w, h int, dpi float64) (*figures.Figure, error) {
	return figures.Render(exportViews[v], sc, w, h, dpi)
}

// figureWindow returns the data ranges of a figure's data area.
func figureWindow(f *figures.Figure) (figures.Window, bool) {
	w := figures.Window{XMin: min(f.X[0], f.X[1]), XMax: max(f.X[0], f.X[1]), YMin: min(f.Y[0], f.Y[1]), YMax: max(f.Y[0], f.Y[1])}
	return w, w.XMax > w.XMin && w.YMax > w.YMin
}

// leWindow returns the close-up window about an element's leading edge,
// sized in chords.
func leWindow(l *model.Layout, element int, chords float64) figures.Window {
	return figures.LEWindow(l, element, chords*l.Elements[element].Chord*mmPerM)
}

// mmPerM converts the layout's metres to the figures' millimetres.
const mmPerM = 1000

// figKind is what a view cell draws: its own figure or one of the
// boundary-layer figures it can switch to.
type figKind int

const (
	figPanels figKind = iota
	figPressure
	figStreamlines
	figPolar
	figDragPolar
	figBoundaryLayer
	figLiftToDrag
)

var figureViews = [...]figures.View{figures.ViewPanels, figures.ViewPressure, figures.ViewStreamlines, figures.ViewPolar,
	figures.ViewDragPolar, figures.ViewBoundaryLayer, figures.ViewLiftToDrag}

// figureOf returns the figure a view cell draws by default.
func figureOf(v viewKind) figKind { return figKind(v) }

// safeRenderFigure renders a figure into dst, which it returns as the
// figure's image (figure.RenderInto), turning a panic into an error.
func safeRenderFigure(dst *image.RGBA, f figKind, sc *figures.Scene, dpi float64) (fig *figures.Figure, err error) {
	defer func() {
		if r := recover(); r != nil {
			fig, err = nil, session.InternalError("drawing "+figureViews[f].String(), r)
		}
	}()
	return figures.RenderInto(dst, figureViews[f], sc, dpi)
}

func writeFigure(w io.Writer, v viewKind, sc *figures.Scene, format string, widthIn, heightIn, dpi float64) error {
	c := *sc
	c.Dark = false // printed figures are light
	return figures.WriteFigure(w, exportViews[v], &c, format, widthIn, heightIn, dpi)
}

// isNoData reports a view that lacks what it draws (as opposed to a
// failure).
func isNoData(err error) bool { return errors.Is(err, figures.ErrNoData) }

// recovered runs f, turning a panic into an error.
func recovered(f func() error) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = session.InternalError("", r)
		}
	}()
	return f()
}
