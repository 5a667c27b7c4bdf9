package ui

// This file is the only place where package ui reaches into model, solver
// and export for work: every call the widgets make goes through one of the
// functions below, so that the wiring stays free of numerics.

import (
	"context"
	"errors"
	"image"
	"image/color"
	"io"

	"sectionbench/export"
	figures "sectionbench/export/figure"
	"sectionbench/export/format"
	"sectionbench/export/report"
	"sectionbench/model"
	"sectionbench/solver"
	"sectionbench/solver/engine"
	"sectionbench/ui/session"
)

type (
	engineRequest = engine.Request
	engineResult  = engine.Result
)

type (
	viewWindow = figures.Window
	scene      = figures.Scene
	figure     = figures.Figure
)

// exportViews maps the workbench's views to export's.
var exportViews = [numViews]figures.View{figures.ViewPanels, figures.ViewPressure, figures.ViewStreamlines, figures.ViewPolar}

func renderView(v viewKind, sc *scene, w, h int, dpi float64) (*figure, error) {
	return figures.Render(exportViews[v], sc, w, h, dpi)
}

// figureWindow returns the data ranges of a figure's data area.
func figureWindow(f *figure) (viewWindow, bool) {
	w := viewWindow{XMin: min(f.X[0], f.X[1]), XMax: max(f.X[0], f.X[1]), YMin: min(f.Y[0], f.Y[1]), YMax: max(f.Y[0], f.Y[1])}
	return w, w.XMax > w.XMin && w.YMax > w.YMin
}

// leWindow returns the close-up window about an element's leading edge,
// sized in chords.
func leWindow(l *model.Layout, element int, chords float64) viewWindow {
	return figures.LEWindow(l, element, chords*l.Elements[element].Chord*mmPerM)
}

// mmPerM converts the layout's metres to the figures' millimetres.
const mmPerM = 1000

func newStudy() *model.Study { return model.NewStudy() }

func decodeStudy(b []byte) (*model.Study, error) { return model.DecodeStudy(b) }

func encodeStudy(st *model.Study) ([]byte, error) { return st.Encode() }

type cleanReport = model.CleanReport

// loadSections returns the cleaned sections of a study's elements, with
// relative file paths resolved against baseDir.
func loadSections(st *model.Study, baseDir string) ([]*model.Section, []*cleanReport, error) {
	return export.LoadSections(st, baseDir)
}

func loadStudy(path string) (*model.Study, error) { return export.LoadStudy(path) }

type openedStudy = export.OpenedStudy

// openStudy reads, validates and loads a study file with its sections
// (export.OpenStudy, as the command line does).
func openStudy(path string) (*openedStudy, error) { return export.OpenStudy(path) }

// writeFile writes a file atomically: it appears whole or not at all.
func writeFile(path string, write func(io.Writer) error) error {
	return export.WriteFileAtomic(path, write)
}

func writeFigure(w io.Writer, v viewKind, sc *scene, format string, widthIn, heightIn, dpi float64) error {
	c := *sc
	c.Dark = false // printed figures are light
	return figures.WriteFigure(w, exportViews[v], &c, format, widthIn, heightIn, dpi)
}

func writeCpTable(w io.Writer, meta format.Metadata, res *engineResult) error {
	return format.WriteCpTable(w, meta, res.Solution)
}

// writeSweepTable writes the sweep, with its boundary-layer estimate when
// viscous is not nil (parallel to sweep).
func writeSweepTable(w io.Writer, meta format.Metadata, sweep []solver.Coefficients, viscous []engine.ViscousPoint) error {
	return format.WriteSweepTable(w, meta, sweep, viscous)
}

// tableMetadata heads a CSV of study st solved as res (nil when unknown).
func tableMetadata(st *model.Study, res *engineResult, version string) format.Metadata {
	return format.StudyMetadata(st, res, "Sectionbench "+version)
}

// writeReport writes the team report of st solved as res from its sections
// and their cleaning reports. Without a density study the report runs one
// (a report always carries its convergence evidence); it takes tens of
// milliseconds inviscid, and this runs off the UI goroutine.
func writeReport(w io.Writer, st *model.Study, res *engineResult, secs []*model.Section, reps []*cleanReport, density *engine.DensityResult, fileName, version string, setup *report.Setup) error {
	if density == nil && len(secs) == len(st.Elements) {
		if d, err := engine.NewEngine().Density(context.Background(), st, secs, nil); err == nil {
			density = d
		}
	}
	var vd []report.ViscousDensityRow
	if len(secs) == len(st.Elements) {
		vd = report.ViscousDensity(context.Background(), st, secs) // nil with the boundary layer off
	}
	return report.Write(w, report.Input{Study: st, Result: res, Density: density, FileName: fileName, AppVersion: version, Sections: secs, CleanReports: reps, ViscousDensity: vd, Setup: setup})
}

// recovered runs f, turning a panic into an error.
func recovered(f func() error) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = session.InternalError("", r)
		}
	}()
	return f()
}

// isNoData reports a view that lacks what it draws (as opposed to a
// failure).
func isNoData(err error) bool { return errors.Is(err, figures.ErrNoData) }

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
func safeRenderFigure(dst *image.RGBA, f figKind, sc *scene, dpi float64) (fig *figure, err error) {
	defer func() {
		if r := recover(); r != nil {
			fig, err = nil, session.InternalError("drawing "+figureViews[f].String(), r)
		}
	}()
	return figures.RenderInto(dst, figureViews[f], sc, dpi)
}

// drawFrameKey lays the panels view's sign-convention key for sc over a
// panels figure drawn without it (figure.DrawFrameKey).
func drawFrameKey(f *figure, sc *scene) { figures.DrawFrameKey(f, sc) }

// Geometry errors, matched with errors.Is.
var (
	errOverlap  = model.ErrOverlap
	errSmallGap = model.ErrSmallGap
)

type (
	modelGeometryError  = model.GeometryError
	solverGeometryError = solver.GeometryError
)

func kmhToMps(v float64) float64 { return model.KmhToMps(v) }
func mpsToKmh(v float64) float64 { return model.MpsToKmh(v) }

// airProperties returns the density (kg/m³), dynamic viscosity (Pa·s) and
// kinematic viscosity (m²/s) of air at tc °C and p Pa.
func airProperties(tc, p float64) (rho, mu, nu float64, err error) {
	a, err := model.AirFromCelsius(tc, p)
	if err != nil {
		return 0, 0, 0, err
	}
	return a.Density(), a.Viscosity(), a.KinematicViscosity(), nil
}

// downforceOf returns −lift (engine.Downforce): the downforce of an
// inverted configuration, positive pushing the car down.
func downforceOf(lift float64) float64 { return engine.Downforce(lift) }

// refChordMM returns the reference chord the result's coefficients are
// on, in millimetres.
func refChordMM(res *engineResult) float64 { return res.Layout.RefChordM * mmPerM }

// elementChordMM returns a placed element's chord in millimetres.
func elementChordMM(res *engineResult, i int) float64 { return res.Layout.Elements[i].Chord * mmPerM }

// resultFlags returns the plausibility flags of a result at the study's
// angle (engine.Result.Flags).
func resultFlags(res *engineResult) []model.Flag {
	if res == nil {
		return nil
	}
	return res.Flags()
}

// pinColour is the colour the views draw pin i in (figure.PinColour).
func pinColour(i int, dark bool) color.Color { return figures.PinColour(i, dark) }
